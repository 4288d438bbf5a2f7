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
	"cmp"
	"math"
	"slices"

	"rebound/clustering"
	"rebound/cmd/rebound/internal/pipeline"
	"rebound/index/sensitivity"
)

// Extras are the optional results of a run.
type Extras struct {
	Sensitivity *Sensitivity
	Clusters    *Clusters
}

// Of returns the optional results a run holds.
func Of(r *pipeline.Run) Extras {
	return Extras{Sensitivity: sensitivityOf(r), Clusters: clustersOf(r)}
}

// Sensitivity is the robustness of the ranking to the weights. Per-station
// slices are indexed like the run's stations (Raw.Stations).
type Sensitivity struct {
	// Samples is the number of weight vectors drawn; Interval describes
	// the interval (for example "5th–95th percentile").
	Samples  int
	Interval string
	// Low, Median and High are each station's better-end, median and
	// worse-end rank over the samples; 0 for a station without a score
	// (stability "unranked"), which has no rank interval.
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
	// the largest rank change of any station per indicator, the indicator
	// that moves the ranking most first (see SwingOrder); nil when the
	// one-at-a-time analysis did not run.
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
	// Medoids names each cluster's most typical station ("" when none).
	Medoids []string
	// Tree is the hierarchical tree of the clustered stations (nil when
	// none was built); TreeStations maps its items to station indices (nil
	// when the items are groups of stations), and Linkage names its
	// linkage.
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

func sensitivityOf(r *pipeline.Run) *Sensitivity {
	sr := r.Sensitivity
	if sr == nil || sr.MonteCarlo == nil {
		return nil
	}
	mc := sr.MonteCarlo
	n := len(r.Raw.Stations)
	if len(mc.Stations) != n {
		return nil
	}
	s := &Sensitivity{Samples: mc.Samples, Interval: "5th–95th percentile", TopN: mc.TopN, Spearman: mc.Spearman.Mean,
		Low: make([]int, n), Median: make([]int, n), High: make([]int, n), Stability: make([]string, n)}
	for i, st := range mc.Stations {
		s.Stability[i] = st.Stability.String()
		if st.Stability != sensitivity.Unranked {
			s.Low[i], s.Median[i], s.High[i] = int(st.Low), int(st.Median), int(st.High)
		}
	}
	if oat := sr.OAT; oat != nil && len(oat.Runs) > 0 {
		// The largest step shows the effects most clearly.
		for _, run := range oat.Runs {
			s.Step = max(s.Step, math.Abs(run.Delta))
		}
		for j, ind := range r.Raw.Indicators {
			sw := Swing{Indicator: ind.Name, Down: math.NaN(), Up: math.NaN(), MeanDown: math.NaN(), MeanUp: math.NaN()}
			for _, run := range oat.Runs {
				if run.Indicator != j || math.Abs(math.Abs(run.Delta)-s.Step) > 1e-12 {
					continue
				}
				if run.Delta < 0 {
					sw.Down, sw.MeanDown = float64(run.MaxShift), run.MeanShift
				} else {
					sw.Up, sw.MeanUp = float64(run.MaxShift), run.MeanShift
				}
			}
			s.Swings = append(s.Swings, sw)
		}
		SortSwings(s.Swings)
	}
	if sob := sr.Sobol; sob != nil && sob.Inputs == len(r.Raw.Indicators) && sob.Outputs > n {
		first, total := sob.FirstOrder(n), sob.TotalOrder(n)
		at := func(x []float64, j int) float64 {
			if k := n*sob.Inputs + j; k < len(x) {
				return x[k]
			}
			return math.NaN()
		}
		for j, ind := range r.Raw.Indicators {
			s.Sobol = append(s.Sobol, SobolIndex{Indicator: ind.Name, First: first[j], Total: total[j],
				FirstLo: at(sob.FirstLo, j), FirstHi: at(sob.FirstHi, j), TotalLo: at(sob.TotalLo, j), TotalHi: at(sob.TotalHi, j)})
		}
	}
	return s
}

// SortSwings orders one-at-a-time results the way every output lists
// them: by the largest rank change of any station in either direction, then
// by the two directions' largest changes added up, then by the mean
// absolute change, ties kept in the order given (indicator order). A NaN
// (a run not made) counts as no change.
func SortSwings(swings []Swing) {
	slices.SortStableFunc(swings, func(a, b Swing) int {
		return cmp.Or(
			cmp.Compare(max(nz(b.Down), nz(b.Up)), max(nz(a.Down), nz(a.Up))),
			cmp.Compare(nz(b.Down)+nz(b.Up), nz(a.Down)+nz(a.Up)),
			cmp.Compare(max(nz(b.MeanDown), nz(b.MeanUp)), max(nz(a.MeanDown), nz(a.MeanUp))))
	})
}

func nz(x float64) float64 {
	if math.IsNaN(x) {
		return 0
	}
	return x
}

func clustersOf(r *pipeline.Run) *Clusters {
	cr := r.Clusters
	if cr == nil {
		return nil
	}
	used := cr.Used()
	if used == nil || cr.Values == nil {
		return nil
	}
	n := len(r.Attrs.Stations)
	c := &Clusters{Method: methodName(cr.Method), K: cr.K, Labels: make([]int, n), Reasons: make([]string, n),
		Values: make([][]float64, n), Profiles: cr.Profiles, Medoids: cr.Medoids, Silhouette: used.Score.Silhouette}
	for j, f := range cr.Features {
		if j < len(cr.Units) && cr.Units[j] != "" {
			f += " (" + cr.Units[j] + ")"
		}
		c.Features = append(c.Features, f)
	}
	row := map[string]int{}
	for q, id := range cr.Stations {
		row[id] = q
	}
	reason := map[string]string{}
	for _, e := range cr.Excluded {
		reason[e.Station] = e.Reason
	}
	station := make([]int, len(cr.Stations)) // clustered row → station index
	for i := range station {
		station[i] = -1
	}
	for i, st := range r.Attrs.Stations {
		q, ok := row[st.ID]
		if !ok {
			c.Labels[i] = -1
			c.Reasons[i] = reason[st.ID]
			if c.Reasons[i] == "" {
				c.Reasons[i] = "not clustered"
			}
			continue
		}
		station[q] = i
		c.Labels[i] = used.Labels[q]
		c.Values[i] = cr.Values.RawRowView(q)
	}
	if t := cr.Table(); t != nil {
		c.Choice = t.Scores
	}
	// The dendrogram: the tree of the partition used, else Ward's.
	tree := used
	if tree.Tree == nil {
		for k := range cr.Partitions {
			if p := &cr.Partitions[k]; p.Tree != nil && (tree.Tree == nil || p.Method == "ward") {
				tree = p
			}
		}
	}
	if tree.Tree != nil && tree.Tree.Dendrogram != nil {
		c.Tree, c.Linkage = tree.Tree.Dendrogram, methodName(tree.Method)
		if !tree.Tree.TwoStage && !slices.Contains(station, -1) {
			c.TreeStations = station
		}
	}
	return c
}

// methodName names a partition method for readers.
func methodName(m string) string {
	switch m {
	case "kmeans":
		return "k-means"
	case "ward":
		return "Ward linkage"
	case "average":
		return "average linkage"
	case "complete":
		return "complete linkage"
	case "single":
		return "single linkage"
	}
	return m
}
