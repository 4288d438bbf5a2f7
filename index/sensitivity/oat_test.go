package sensitivity

import (
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"
)

func TestOneAtATime(t *testing.T) {
	// The worked example (base ranks A 1, B 3, C 2, D 4), by hand.
	// Indicator 0 up 20 %: w = (0.6, 0.3·0.8, 0.2·0.8) = (0.6, 0.24, 0.16);
	// composites A 0.93333, B 0.74, C 0.68182, D 0.03636, so B and C swap.
	// Indicator 0 down 20 %: w = (0.4, 0.36, 0.24); composites A 0.95556,
	// B 0.61, C 0.68939, D 0.05455: the base ranking.
	m := Model{Values: workedValues, Weights: workedWeights}
	res, err := OneAtATime(m, Settings{Deltas: []float64{0.2}})
	if err != nil {
		t.Fatal(err)
	}
	if want := []int32{1, 3, 2, 4}; !slices.Equal(res.Base, want) {
		t.Fatalf("base ranks %v, want %v", res.Base, want)
	}
	if len(res.Runs) != 6 {
		t.Fatalf("%d runs, want 2 per indicator", len(res.Runs))
	}
	for _, test := range []struct {
		run       int
		indicator int
		delta     float64
		weights   []float64
		ranks     []int32
		max       int32
		mean      float64
	}{
		{0, 0, -0.2, []float64{0.4, 0.36, 0.24}, []int32{1, 3, 2, 4}, 0, 0},
		{1, 0, 0.2, []float64{0.6, 0.24, 0.16}, []int32{1, 2, 3, 4}, 1, 0.5},
	} {
		r := res.Runs[test.run]
		if r.Indicator != test.indicator || r.Delta != test.delta {
			t.Errorf("run %d: indicator %d delta %g, want %d %g", test.run, r.Indicator, r.Delta, test.indicator, test.delta)
		}
		if !floats.EqualApprox(r.Weights, test.weights, 1e-15) {
			t.Errorf("run %d: weights %v, want %v", test.run, r.Weights, test.weights)
		}
		if !slices.Equal(r.Ranks, test.ranks) || r.MaxShift != test.max || r.MeanShift != test.mean {
			t.Errorf("run %d: ranks %v max %d mean %g, want %v %d %g", test.run, r.Ranks, r.MaxShift, r.MeanShift, test.ranks, test.max, test.mean)
		}
	}
	for i, r := range res.Runs {
		if sum := floats.Sum(r.Weights); !scalar.EqualWithinAbs(sum, 1, 1e-15) {
			t.Errorf("run %d: weights sum to %v", i, sum)
		}
		for st, x := range r.Ranks {
			if shift := abs32(x - res.Base[st]); shift > res.StationMax[st] {
				t.Errorf("run %d, station %d: shift %d above StationMax %d", i, st, shift, res.StationMax[st])
			}
		}
	}
}

func TestOneAtATimeEdges(t *testing.T) {
	// A zero weight stays zero: its runs repeat the base ranking. A weight
	// of 1 has nothing to rescale against: no runs, one warning. A step of
	// 1.5 clips the lowered weight at 0.
	v := invented(2, 30, 3, 0, 0)
	res, err := OneAtATime(Model{Values: v, Weights: []float64{0.7, 0.3, 0}}, Settings{Deltas: []float64{1.5}})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range res.Runs {
		if r.Indicator == 2 && (r.MaxShift != 0 || r.Weights[2] != 0) {
			t.Errorf("zero weight moved: %+v", r)
		}
		if r.Indicator == 0 && r.Delta == -1.5 && r.Weights[0] != 0 {
			t.Errorf("weight 0 lowered by 150%% is %g, want 0", r.Weights[0])
		}
	}
	res, err = OneAtATime(Model{Values: v, Weights: []float64{0, 2, 0}}, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Warnings) != 1 || len(res.Runs) != 8 {
		t.Errorf("%d warnings and %d runs, want 1 and 8", len(res.Warnings), len(res.Runs))
	}
	if _, err := OneAtATime(Model{Values: v, Weights: []float64{1, 1, 1}}, Settings{Deltas: []float64{0}}); err == nil {
		t.Error("no error for a zero step")
	}
}
