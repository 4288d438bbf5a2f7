//go:build !linux

package clustering

// adviseHugePages does nothing outside Linux.
func adviseHugePages([]float64) {}
