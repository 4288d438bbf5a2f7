package view_test

import (
	"math"
	"slices"
	"testing"

	"rebound/clustering"
	"rebound/cmd/rebound/internal/testrun"
	"rebound/cmd/rebound/internal/view"
)

// TestOf checks the adapter on the demo run, which clusters its stations
// and analyses the weights: every station gets an interval and a label,
// consistent with the pipeline's own results.
func TestOf(t *testing.T) {
	r, _ := testrun.Demo(t)
	e := view.Of(r)
	n := len(r.Attrs.Stations)
	if s := e.Sensitivity; s == nil {
		t.Error("no sensitivity view although the demo runs the analysis")
	} else {
		if len(s.Low) != n || len(s.Swings) != len(r.Raw.Indicators) {
			t.Errorf("%d intervals, %d swings", len(s.Low), len(s.Swings))
		}
		for i := range n {
			if s.Low[i] > r.Result.Rank[i] && s.High[i] < r.Result.Rank[i] || s.Low[i] > s.High[i] {
				t.Errorf("station %d: interval %d–%d", i, s.Low[i], s.High[i])
			}
		}
	}
	c := e.Clusters
	if c == nil {
		t.Fatal("no cluster view although the demo clusters")
	}
	sizes := make([]int, c.K)
	for i, l := range c.Labels {
		if l < 0 {
			continue
		}
		sizes[l]++
		if got, ok := r.Clusters.Label(r.Attrs.Stations[i].ID); !ok || got != l {
			t.Errorf("station %s: label %d, pipeline says %d", r.Attrs.Stations[i].ID, l, got)
		}
	}
	for k, p := range c.Profiles {
		if p.Size != sizes[k] {
			t.Errorf("cluster %d: profile size %d, %d labels", k+1, p.Size, sizes[k])
		}
	}
}

func TestLeading(t *testing.T) {
	c := &view.Clusters{Features: []string{"a", "b", "c"}, Profiles: []clustering.Profile{
		{Centroid: []float64{0.1, -1, 2}}, {Centroid: []float64{0, 1, -0.5}},
	}}
	// Spreads: a 0.1, b 2, c 2.5.
	if a, b := c.Leading(); a != 2 || b != 1 {
		t.Errorf("Leading = %d, %d, want 2, 1", a, b)
	}
}

// Every output lists the one-at-a-time results in the order of
// SortSwings: the largest change in either direction first, then the two
// directions added up, then the mean change, then indicator order. (Before
// this order was shared, the memo named a different leading weight than
// the terminal and the tornado chart when two weights tied.)
func TestSortSwings(t *testing.T) {
	nan := math.NaN()
	swings := []view.Swing{
		{Indicator: "a", Down: 3, Up: 4, MeanDown: 0.2, MeanUp: 0.6},
		{Indicator: "b", Down: 4, Up: 3, MeanDown: 0.6, MeanUp: 0.2},
		{Indicator: "c", Down: 5, Up: 0},
		{Indicator: "d", Down: 2, Up: 5},
		{Indicator: "e", Down: nan, Up: 1, MeanDown: nan},
		{Indicator: "f", Down: 4, Up: 3, MeanDown: 0.7, MeanUp: 0.1},
	}
	view.SortSwings(swings)
	var got []string
	for _, s := range swings {
		got = append(got, s.Indicator)
	}
	if want := []string{"d", "c", "f", "a", "b", "e"}; !slices.Equal(got, want) {
		t.Errorf("order %v, want %v", got, want)
	}
}

// A station without a score has no rank interval: the deliverables print
// none for it, and its class is "unranked".
func TestOfUnscoredStation(t *testing.T) {
	r, _ := testrun.Load(t, map[string]string{
		"s.toml": `[inputs]
attributes = "stations.csv"
[[indicator]]
name = "forest"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 1
[sensitivity]
samples = 50
[sensitivity.sobol]
enabled = false
`,
		"stations.csv": "station,name,latitude,longitude,forest_pct\nA,Alpha,40,-30,50\nB,Beta,41,-30,\nC,Gamma,42,-30,70\n",
	}, "s.toml")
	s := view.Of(r).Sensitivity
	if s == nil {
		t.Fatal("no sensitivity view")
	}
	const beta = 1 // stations in input order
	if s.Low[beta] != 0 || s.Median[beta] != 0 || s.High[beta] != 0 || s.Stability[beta] != "unranked" {
		t.Errorf("unscored station: interval %d–%d (median %d), %q", s.Low[beta], s.High[beta], s.Median[beta], s.Stability[beta])
	}
	if s.Low[0] == 0 || s.Low[2] == 0 {
		t.Errorf("scored stations without an interval: %v", s.Low)
	}
}
