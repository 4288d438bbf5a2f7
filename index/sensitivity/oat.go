package sensitivity

import (
	"fmt"
	"math"

	"rebound/index/rankstat"
)

// OATResult is the outcome of the one-at-a-time analysis.
type OATResult struct {
	// Base holds the ranks under the base weights.
	Base []int32
	// Runs holds one run per indicator and signed step, indicator by
	// indicator; for each indicator the steps −δ and +δ for each δ in
	// Deltas order. Together they are a tornado chart's data.
	Runs []OATRun
	// StationMax[s] is the largest absolute rank change of station s over
	// all runs.
	StationMax []int32
	// Warnings name runs that could not be made.
	Warnings []error
}

// OATRun is the ranking with one weight moved.
type OATRun struct {
	Indicator int
	Delta     float64   // signed relative step: the weight became w_i(1+Delta), clipped to [0, 1]
	Weights   []float64 // the perturbed weights, summing to 1
	Ranks     []int32
	// MaxShift and MeanShift are the largest and the mean absolute rank
	// change from the base ranking over all stations.
	MaxShift  int32
	MeanShift float64
}

// OneAtATime moves each weight in turn by each relative step in s.Deltas,
// up and down (w_i' = w_i(1±δ), clipped to [0, 1]), rescales the other
// weights proportionally so that the weights still sum to 1
// (w_j' = w_j(1−w_i')/(1−w_i)), and ranks the stations under each
// perturbed weight vector. A weight of 0 stays 0, so its runs repeat the
// base ranking. An indicator that carries all the weight has nothing to
// rescale against; its runs are left out with a warning.
func OneAtATime(m Model, s Settings) (*OATResult, error) {
	p, err := m.prepare()
	if err != nil {
		return nil, err
	}
	deltas := s.Deltas
	if deltas == nil {
		deltas = DefaultDeltas
	}
	for _, d := range deltas {
		if !(d > 0) || math.IsInf(d, 1) {
			return nil, fmt.Errorf("sensitivity: one-at-a-time step %g; want a finite step > 0", d)
		}
	}
	res := &OATResult{Base: p.baseRanks, StationMax: make([]int32, p.n)}
	scores := make([]float64, p.n)
	var ranker rankstat.Ranker
	for i, wi := range p.w {
		if wi == 1 {
			res.Warnings = append(res.Warnings, fmt.Errorf("indicator %d carries all the weight; one-at-a-time steps have no other weight to rescale", i))
			continue
		}
		for _, d := range deltas {
			for _, delta := range []float64{-d, d} {
				w := make([]float64, p.k)
				wiNew := min(max(wi*(1+delta), 0), 1)
				scale := (1 - wiNew) / (1 - wi)
				for j, x := range p.w {
					w[j] = x * scale
				}
				w[i] = wiNew
				run := OATRun{Indicator: i, Delta: delta, Weights: w}
				run.Ranks = ranker.Ranks(nil, p.composites(scores, w))
				var sum int64
				for st, r := range run.Ranks {
					shift := abs32(r - p.baseRanks[st])
					run.MaxShift = max(run.MaxShift, shift)
					res.StationMax[st] = max(res.StationMax[st], shift)
					sum += int64(shift)
				}
				run.MeanShift = float64(sum) / float64(p.n)
				res.Runs = append(res.Runs, run)
			}
		}
	}
	return res, nil
}

func abs32(x int32) int32 {
	if x < 0 {
		return -x
	}
	return x
}
