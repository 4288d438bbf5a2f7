package testrun

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"

	"rebound/clustering"
	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/view"
	"rebound/config"
	"rebound/index/sensitivity"
)

// Extras computes the optional results of a run with the project's own
// libraries, as the pipeline will: the weight sensitivity of the ranking
// (Monte Carlo with 2000 samples, one-at-a-time steps of ±25 %, Sobol
// indices with 256 base samples) and a Ward clustering into k groups of
// the stations' numeric attributes (standardised). It lets the writers'
// tests cover every section before the pipeline fills them in.
func Extras(tb testing.TB, r *pipeline.Run, k int) view.Extras {
	tb.Helper()
	return view.Extras{Sensitivity: Sensitivity(tb, r), Clusters: Clusters(tb, r, k)}
}

// Sensitivity runs the weight sensitivity analyses on a scored run.
func Sensitivity(tb testing.TB, r *pipeline.Run) *view.Sensitivity {
	tb.Helper()
	res := r.Result
	n, k := len(res.Score), len(r.Weights.W)
	m := sensitivity.Model{Values: make([]float64, 0, n*k), Weights: r.Weights.W}
	for i := range n {
		m.Values = append(m.Values, res.Normalized[i]...)
	}
	if r.Config.Aggregation.Method == config.Geometric {
		m.Aggregation, m.Floor = sensitivity.Geometric, r.Config.Aggregation.Floor
	}
	set := sensitivity.Settings{Samples: 2000, Deltas: []float64{0.25}, BaseSamples: 256, Bootstrap: 100, Seed: r.Config.Seed, Workers: 1}
	mc, err := sensitivity.MonteCarlo(m, set)
	if err != nil {
		tb.Fatal(err)
	}
	s := &view.Sensitivity{Samples: mc.Samples, Interval: "5th–95th percentile", TopN: mc.TopN, Spearman: mc.Spearman.Mean,
		Low: make([]int, n), Median: make([]int, n), High: make([]int, n), Stability: make([]string, n), Step: 0.25}
	for i, st := range mc.Stations {
		s.Low[i], s.Median[i], s.High[i], s.Stability[i] = int(st.Low), int(st.Median), int(st.High), st.Stability.String()
	}
	oat, err := sensitivity.OneAtATime(m, set)
	if err != nil {
		tb.Fatal(err)
	}
	for j, ind := range r.Raw.Indicators {
		sw := view.Swing{Indicator: ind.Name, Down: math.NaN(), Up: math.NaN(), MeanDown: math.NaN(), MeanUp: math.NaN()}
		for _, run := range oat.Runs {
			if run.Indicator != j {
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
	sob, err := sensitivity.WeightIndices(m, set)
	if err != nil {
		tb.Fatal(err)
	}
	first, total := sob.FirstOrder(n), sob.TotalOrder(n)
	for j, ind := range r.Raw.Indicators {
		o := n*k + j
		s.Sobol = append(s.Sobol, view.SobolIndex{Indicator: ind.Name, First: first[j], Total: total[j],
			FirstLo: sob.FirstLo[o], FirstHi: sob.FirstHi[o], TotalLo: sob.TotalLo[o], TotalHi: sob.TotalHi[o]})
	}
	return s
}

// Clusters clusters the stations of a run by their numeric attributes
// (stations with a blank attribute are left out) with Ward linkage, cut
// into k clusters.
func Clusters(tb testing.TB, r *pipeline.Run, k int) *view.Clusters {
	tb.Helper()
	cols := r.Attrs.Columns
	var rows []int
	var data []float64
	c := &view.Clusters{Method: "Ward linkage", Linkage: "Ward linkage", K: k,
		Labels: make([]int, len(r.Attrs.Stations)), Reasons: make([]string, len(r.Attrs.Stations)),
		Values: make([][]float64, len(r.Attrs.Stations))}
	var useCols []int
	for j, name := range cols {
		col, _ := r.Attrs.Column(name)
		ok := true
		for _, v := range col {
			if math.IsNaN(v) {
				ok = false
			}
		}
		if ok {
			useCols = append(useCols, j)
			c.Features = append(c.Features, name)
		}
	}
	for i, s := range r.Attrs.Stations {
		c.Labels[i] = -1
		row := make([]float64, len(useCols))
		for q, j := range useCols {
			row[q] = s.Values[j]
		}
		c.Values[i] = row
		rows = append(rows, i)
		data = append(data, row...)
	}
	x := mat.NewDense(len(rows), len(useCols), data)
	var z mat.Dense
	if _, _, err := clustering.Standardize(&z, x, clustering.ZScore); err != nil {
		tb.Fatal(err)
	}
	tree, err := clustering.Agglomerate(clustering.Pairwise(&z), clustering.Ward)
	if err != nil {
		tb.Fatal(err)
	}
	labels := tree.Cut(nil, k)
	for q, i := range rows {
		c.Labels[i] = labels[q]
	}
	words := make([]clustering.Words, len(c.Features))
	for j, f := range c.Features {
		words[j] = clustering.Words{High: "high " + f, Low: "low " + f}
	}
	c.Profiles, err = clustering.Profiles(x, &z, labels, words)
	if err != nil {
		tb.Fatal(err)
	}
	c.Tree, c.TreeStations = tree, rows
	for _, p := range c.Profiles {
		c.Medoids = append(c.Medoids, r.Attrs.Stations[rows[p.Medoid]].ID)
	}
	c.Silhouette = clustering.Silhouette(&z, labels, nil)
	if len(rows) < 3 {
		tb.Fatal(fmt.Sprintf("%d stations to cluster", len(rows)))
	}
	return c
}
