package view_test

import (
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
