// Package view collects from a finished pipeline run what the planner
// deliverables (workbook, memo, map layer) show beyond the ranking itself:
// each station's rank interval under varied weights, the tornado data,
// cluster labels and profiles. The writers read these from one place, so
// that the three deliverables always agree.
//
// Every part is optional: a nil part means the run did not compute it, and
// the writers leave the matching sections out.
package view

import (
	"rebound/clustering"
	"rebound/cmd/rebound/internal/pipeline"
)

// Extras are the optional results of a run.
type Extras struct {
	Sensitivity *Sensitivity
	Clusters    *Clusters
}

// Of returns the optional results a run holds.
func Of(r *pipeline.Run) Extras {
	return Extras{}
}

// Sensitivity is the robustness of the ranking to the weights. Per-station
// slices are indexed like the run's stations (Raw.Stations).
type Sensitivity struct {
	// Samples is the number of weight vectors drawn; Interval describes
	// the interval (for example "5th–95th percentile").
	Samples  int
	Interval string
	// Low, Median and High are each station's better-end, median and
	// worse-end rank over the samples; 0 for a station without a score.
	Low, Median, High []int
	// Stability classes each station ("robust-top", "robust-bottom",
	// "stable", "weight-dependent", "unranked"); TopN is the size of the
	// top and bottom bands the classes refer to.
	Stability []string
	TopN      int
	// Spearman is the mean Spearman rank correlation of the sampled
	// rankings with the base ranking.
	Spearman float64
	// Step is the one-at-a-time relative step (0.25 = ±25 %), and Swings
	// the largest rank change of any station per indicator, in indicator
	// order; nil when the one-at-a-time analysis did not run.
	Step   float64
	Swings []Swing
	// Sobol holds first-order and total Sobol indices of the mean absolute
	// rank shift with respect to each weight, in indicator order; nil when
	// not computed.
	Sobol []SobolIndex
}

// Swing is the one-at-a-time result of one indicator.
type Swing struct {
	Indicator string
	// Down and Up are the largest absolute rank change of any station with
	// the weight lowered and raised by Step; NaN when not computed.
	Down, Up float64
	// MeanDown and MeanUp are the mean absolute rank changes.
	MeanDown, MeanUp float64
}

// SobolIndex is one indicator's Sobol indices with their intervals.
type SobolIndex struct {
	Indicator               string
	First, FirstLo, FirstHi float64
	Total, TotalLo, TotalHi float64
}

// Clusters is a clustering of the stations by their features.
type Clusters struct {
	// Method names the partition shown ("k-means", "Ward linkage", ...).
	Method string
	K      int
	// Labels holds each station's cluster (0-based), −1 for a station left
	// out; indexed like the run's stations. Reasons says why a station was
	// left out ("" otherwise).
	Labels  []int
	Reasons []string
	// Features names the features, with units; Values[i][j] is feature j
	// of station i in those units (nil rows for stations left out).
	Features []string
	Values   [][]float64
	// Profiles describes each cluster, in label order.
	Profiles []clustering.Profile
	// Tree is the hierarchical tree of the clustered stations (nil when
	// none was built); TreeStations maps its items to station indices, and
	// Linkage names its linkage.
	Tree         *clustering.Dendrogram
	TreeStations []int
	Linkage      string
	// Silhouette is the mean silhouette width of the partition (NaN when
	// undefined); Choice lists the validity of each k tried.
	Silhouette float64
	Choice     []clustering.KScore
}

// Members returns the station indices of cluster c, in station order.
func (c *Clusters) Members(cl int) []int {
	var out []int
	for i, l := range c.Labels {
		if l == cl {
			out = append(out, i)
		}
	}
	return out
}

// Leading returns the two features that separate the clusters most: the
// largest spread of the cluster centroids (standardised), the lower index
// on a tie. With fewer than two features it returns 0, 0.
func (c *Clusters) Leading() (a, b int) {
	d := len(c.Features)
	if d < 2 {
		return 0, 0
	}
	spread := make([]float64, d)
	for j := range d {
		lo, hi := 0.0, 0.0
		for k, p := range c.Profiles {
			if j >= len(p.Centroid) {
				continue
			}
			v := p.Centroid[j]
			if k == 0 || v < lo {
				lo = v
			}
			if k == 0 || v > hi {
				hi = v
			}
		}
		spread[j] = hi - lo
	}
	a, b = 0, 1
	if spread[1] > spread[0] {
		a, b = 1, 0
	}
	for j := 2; j < d; j++ {
		switch {
		case spread[j] > spread[a]:
			a, b = j, a
		case spread[j] > spread[b]:
			b = j
		}
	}
	return a, b
}
