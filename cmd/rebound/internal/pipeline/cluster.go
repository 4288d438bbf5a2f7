package pipeline

import "rebound/index/series"

// ClusterResult holds the clustering of the stations.
type ClusterResult struct{}

// cluster groups the stations after the pass over the series, when the
// configuration has a [clustering] section.
func (r *Run) cluster() error { return nil }

// featureExtractor returns the function that computes a station's
// clustering features during the pass over the series, or nil when the run
// does not cluster.
func (r *Run) featureExtractor() func(*series.Station) ([]float64, string) {
	return nil
}
