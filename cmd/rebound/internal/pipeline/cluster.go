package pipeline

import "rebound/index/series"

// featureExtractor returns the function that computes a station's
// clustering features during the pass over the series, or nil when the run
// does not cluster.
func (r *Run) featureExtractor() func(*series.Station) ([]float64, string) {
	return nil
}
