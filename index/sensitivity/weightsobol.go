package sensitivity

import (
	"fmt"
	"sync"

	"rebound/index/rankstat"
)

// WeightIndices estimates how much of the variation of each station's
// composite, and of the ranking as a whole, each weight accounts for, with
// the estimators of Sobol (Saltelli et al. 2010; Jansen 1999).
//
// The inputs are the k raw weights, independent and uniform in
// [w_j(1−δ), w_j(1+δ)] with δ = s.Spread; the model scales them to sum to
// 1. A weight of 0 stays 0, so its indices are 0. The model has n+1
// outputs: output s < n is the composite of station s, and output n is the
// mean absolute rank shift, (1/n)·Σ_s |rank_s − base rank_s|. Output n
// always gets bootstrap intervals; the station outputs get them only with
// s.StationIntervals. The settings used are Spread, BaseSamples, Bootstrap,
// Level, StationIntervals, Seed and Workers.
func WeightIndices(m Model, s Settings) (*SobolResult, error) {
	p, err := m.prepare()
	if err != nil {
		return nil, err
	}
	delta := s.spread()
	if !(delta > 0 && delta <= 1) {
		return nil, fmt.Errorf("sensitivity: weight spread %g; want a spread in (0, 1]", delta)
	}
	lo := make([]float64, p.k)
	hi := make([]float64, p.k)
	for j, w := range p.w {
		lo[j] = w * (1 - delta)
		hi[j] = w * (1 + delta)
	}
	n := p.n
	type scratch struct {
		w      []float64
		ranks  []int32
		ranker rankstat.Ranker
	}
	pool := sync.Pool{New: func() any {
		return &scratch{w: make([]float64, p.k), ranks: make([]int32, n)}
	}}
	model := func(dst, x []float64) {
		sc := pool.Get().(*scratch)
		defer pool.Put(sc)
		var sum float64
		for _, v := range x {
			sum += v
		}
		for j, v := range x {
			sc.w[j] = v / sum
		}
		p.composites(dst[:n], sc.w)
		sc.ranker.Ranks(sc.ranks, dst[:n])
		var shift int64
		for st, r := range sc.ranks {
			shift += int64(abs32(r - p.baseRanks[st]))
		}
		dst[n] = float64(shift) / float64(n)
	}
	var intervals []int
	if !s.StationIntervals {
		intervals = []int{n}
	}
	return Sobol(model, lo, hi, n+1, SobolSettings{
		N:               s.BaseSamples,
		Bootstrap:       s.Bootstrap,
		Level:           s.Level,
		IntervalOutputs: intervals,
		Seed:            s.Seed,
		Workers:         s.Workers,
	})
}
