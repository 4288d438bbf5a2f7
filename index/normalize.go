package index

import (
	"math"

	"rebound/config"
	"rebound/index/rankstat"
)

// Method says how one indicator is normalised.
type Method struct {
	Norm   config.NormMethod
	Better config.Better // ignored by "target"
	// Target and Tolerance apply to Norm = "target".
	Target, Tolerance float64
}

// Normalize writes the normalised values of x into dst and returns dst
// (allocated when nil). NaN entries of x stay NaN and are ignored by the
// statistics. Every method orients its output so that higher means more
// resilient:
//
//	minmax  (x − min)/(max − min), or (max − x)/(max − min) when lower is better
//	zscore  (x − mean)/sd with the population sd (divisor n), negated when lower is better
//	rank    (r − 1)/(m − 1) with r the mid-rank of x among the m present values,
//	        ranked so that the most resilient gets r = m
//	target  1 − d/dmax with d = max(0, |x − Target| − Tolerance) and dmax the largest d
//
// A column with no spread (max = min, sd = 0, or a single value) carries no
// information: minmax and rank give every station 0.5, zscore 0, target 1.
// ok is false in that case so the caller can say so.
func Normalize(dst, x []float64, m Method) (out []float64, ok bool) {
	if dst == nil {
		dst = make([]float64, len(x))
	}
	if len(dst) != len(x) {
		panic("index: slice length mismatch")
	}
	sign := 1.0
	if m.Better == config.Lower {
		sign = -1
	}
	lo, hi, sum, n := math.Inf(1), math.Inf(-1), 0.0, 0
	for _, v := range x {
		if !math.IsNaN(v) {
			lo, hi, sum, n = math.Min(lo, v), math.Max(hi, v), sum+v, n+1
		}
	}
	fill := func(f func(v float64) float64) {
		for i, v := range x {
			if math.IsNaN(v) {
				dst[i] = v
			} else {
				dst[i] = f(v)
			}
		}
	}
	ok = true
	switch m.Norm {
	case config.ZScore:
		mean := sum / float64(n)
		ss := 0.0
		for _, v := range x {
			if !math.IsNaN(v) {
				ss += (v - mean) * (v - mean)
			}
		}
		sd := math.Sqrt(ss / float64(n))
		if !(sd > 0) {
			ok = false
			fill(func(float64) float64 { return 0 })
			break
		}
		fill(func(v float64) float64 { return sign * (v - mean) / sd })
	case config.Rank:
		if n < 2 || hi == lo {
			ok = false
			fill(func(float64) float64 { return 0.5 })
			break
		}
		// Mid-ranks of the oriented values, so that the most resilient
		// ranks highest.
		oriented := make([]float64, len(x))
		for i, v := range x {
			oriented[i] = sign * v
		}
		r := rankstat.MidRanks(nil, oriented)
		for i, v := range x {
			if math.IsNaN(v) {
				dst[i] = v
			} else {
				dst[i] = (r[i] - 1) / float64(n-1)
			}
		}
	case config.TargetN:
		dmax := 0.0
		dist := func(v float64) float64 { return math.Max(0, math.Abs(v-m.Target)-m.Tolerance) }
		for _, v := range x {
			if !math.IsNaN(v) {
				dmax = math.Max(dmax, dist(v))
			}
		}
		// Without spread every station is its own farthest, d/dmax = 1:
		// that says nothing about the target, so every station gets 1.
		if n < 2 || hi == lo || dmax == 0 {
			ok = n > 1 && hi != lo
			fill(func(float64) float64 { return 1 })
			break
		}
		fill(func(v float64) float64 { return 1 - dist(v)/dmax })
	default: // minmax
		if n < 2 || hi == lo {
			ok = false
			fill(func(float64) float64 { return 0.5 })
			break
		}
		if sign > 0 {
			fill(func(v float64) float64 { return (v - lo) / (hi - lo) })
		} else {
			fill(func(v float64) float64 { return (hi - v) / (hi - lo) })
		}
	}
	return dst, ok
}
