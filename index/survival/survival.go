// Package survival estimates survival curves from right-censored times: the
// Kaplan–Meier product-limit estimator (Kaplan & Meier 1958), its median,
// and the restricted mean survival time.
//
// In rebound the "survival" is staying impaired: the time is the number of
// days until a water-quality variable returned to normal, and a time is
// censored when observation stopped before it did.
package survival

import (
	"math"
	"slices"
)

// Curve is a Kaplan–Meier survival curve: S(t) = Π_{t_i <= t} (1 − d_i/n_i)
// over the distinct event times t_i, where d_i events happen among the n_i
// subjects still at risk just before t_i. S is a right-continuous step
// function equal to 1 before the first event time.
type Curve struct {
	Times  []float64 // distinct event (uncensored) times, ascending
	S      []float64 // S(Times[i])
	AtRisk []int     // n_i
	Deaths []int     // d_i
	// N is the number of subjects and MaxTime the largest time observed,
	// censored or not (the end of follow-up).
	N       int
	MaxTime float64
}

// KaplanMeier estimates the survival curve from times and whether each time
// ended in the event (true) or was censored (false). A censored time equal
// to an event time counts as at risk at that time (the usual convention).
// NaN times are ignored. It panics if the slices differ in length.
func KaplanMeier(times []float64, observed []bool) Curve {
	if len(times) != len(observed) {
		panic("survival: slice length mismatch")
	}
	type obs struct {
		t     float64
		event bool
	}
	data := make([]obs, 0, len(times))
	for i, t := range times {
		if !math.IsNaN(t) {
			data = append(data, obs{t, observed[i]})
		}
	}
	slices.SortFunc(data, func(a, b obs) int {
		switch {
		case a.t < b.t:
			return -1
		case a.t > b.t:
			return 1
		}
		return 0
	})
	c := Curve{N: len(data)}
	if len(data) > 0 {
		c.MaxTime = data[len(data)-1].t
	}
	// One allocation for the four curves, sized for the most event times
	// there can be.
	events := 0
	for _, d := range data {
		if d.event {
			events++
		}
	}
	floats := make([]float64, 2*events)
	ints := make([]int, 2*events)
	c.Times, c.S = floats[:0:events], floats[events:events:2*events]
	c.AtRisk, c.Deaths = ints[:0:events], ints[events:events:2*events]
	atRisk := len(data)
	s := 1.0
	for i := 0; i < len(data); {
		t := data[i].t
		deaths, leaving := 0, 0
		for i < len(data) && data[i].t == t {
			if data[i].event {
				deaths++
			}
			leaving++
			i++
		}
		if deaths > 0 {
			s *= 1 - float64(deaths)/float64(atRisk)
			c.Times = append(c.Times, t)
			c.S = append(c.S, s)
			c.AtRisk = append(c.AtRisk, atRisk)
			c.Deaths = append(c.Deaths, deaths)
		}
		atRisk -= leaving
	}
	return c
}

// At returns S(t).
func (c Curve) At(t float64) float64 {
	i, found := slices.BinarySearch(c.Times, t)
	if found {
		return c.S[i]
	}
	if i == 0 {
		return 1
	}
	return c.S[i-1]
}

// Quantile returns the smallest time t with S(t) <= 1 − p, the time by
// which a fraction p has had the event (p = 0.5 gives the median). ok is
// false when the curve never falls that low, i.e. when too many times are
// censored for the quantile to be estimated. This is the convention of
// lifelines' qth_survival_time; R's survival package takes the midpoint
// instead when S equals 1 − p exactly over an interval.
func (c Curve) Quantile(p float64) (t float64, ok bool) {
	for i, s := range c.S {
		if s <= 1-p+1e-12 {
			return c.Times[i], true
		}
	}
	return math.NaN(), false
}

// Median is Quantile(0.5).
func (c Curve) Median() (float64, bool) { return c.Quantile(0.5) }

// RMST returns the restricted mean survival time up to tau: the area under
// the survival curve from 0 to tau, ∫₀^τ S(t) dt (Irwin 1949; Royston &
// Parmar 2013). It is the mean time to the event when no time may exceed
// tau, and it is defined even when the median is not.
func (c Curve) RMST(tau float64) float64 {
	area, prevT, prevS := 0.0, 0.0, 1.0
	for i, t := range c.Times {
		if t >= tau {
			break
		}
		area += prevS * (t - prevT)
		prevT, prevS = t, c.S[i]
	}
	if tau > prevT {
		area += prevS * (tau - prevT)
	}
	return area
}
