package config

// Clustering configures station clustering by time-series features. The
// section's keys are documented in the template.
type Clustering struct{}

// DefaultClustering returns the clustering defaults.
func DefaultClustering() *Clustering { return &Clustering{} }

func (c *Config) validateClustering(bad reportFunc) {}

const templateClustering = ``
