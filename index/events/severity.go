package events

import (
	"math"
	"slices"

	"rebound/index/calendar"
)

// blank sets to NaN the measures that do not apply to an event of kind,
// and those that rating fills in later.
func (e Event) blank(kind string) Event {
	nan := math.NaN()
	e.ReturnPeriod, e.EmpiricalReturnPeriod = nan, nan
	e.DeficitProbability, e.DurationProbability = nan, nan
	if kind != HeatWaveKind {
		e.HeatRatio = nan
	}
	switch kind {
	case HeatWaveKind, DroughtKind, FloodKind:
	default:
		e.DriverPeak, e.MeanIntensity, e.CumIntensity = nan, nan, nan
		e.Deficit, e.DeficitVolume, e.DriverIntensity = nan, nan, nan
		e.Severity = Unrated
	}
	return e
}

// inSeason reports whether day d falls in one of the months ms (every month
// when ms is empty).
func inSeason(ms Months, d calendar.Date) bool {
	_, m, _ := d.Civil()
	return ms.has(m)
}

// relativeDeficit returns 1 − qmin/thr, the drought's lowest flow as a
// shortfall relative to the threshold of that day, in [0, 1] for flows at
// or above zero.
func relativeDeficit(qmin, thr float64) float64 {
	if !(thr > 0) {
		return math.NaN()
	}
	return 1 - qmin/thr
}

// classOf returns the severity class of a value v against three increasing
// class limits: Moderate below lim[0], Strong from lim[0], Severe from
// lim[1] and Extreme from lim[2]; Unrated when v is NaN.
func classOf(v float64, lim [3]float64) int {
	switch {
	case math.IsNaN(v):
		return Unrated
	case v >= lim[2]:
		return Extreme
	case v >= lim[1]:
		return Severe
	case v >= lim[0]:
		return Strong
	}
	return Moderate
}

// Weibull returns the empirical non-exceedance probability of x within
// sample: the number of sample values at or below x divided by n + 1, the
// Weibull plotting position i/(n + 1) with ties given their largest rank
// (scipy.stats.rankdata(method="max")/(n+1) for x in the sample). NaN
// values of sample are left out; NaN when x is NaN or nothing is left.
func Weibull(sample []float64, x float64) float64 {
	if math.IsNaN(x) {
		return math.NaN()
	}
	n, c := 0, 0
	for _, v := range sample {
		if math.IsNaN(v) {
			continue
		}
		n++
		if v <= x {
			c++
		}
	}
	if n == 0 {
		return math.NaN()
	}
	return float64(c) / float64(n+1)
}

// rateDroughts sets the probabilities and class of each drought of evs
// among them all.
func rateDroughts(evs []Event, lim [3]float64) {
	def, dur := make([]float64, len(evs)), make([]float64, len(evs))
	for k, e := range evs {
		def[k], dur[k] = e.Deficit, float64(e.Duration)
	}
	for k := range evs {
		e := &evs[k]
		e.DeficitProbability = Weibull(def, def[k])
		e.DurationProbability = Weibull(dur, dur[k])
		e.Severity = classOf(max(e.DeficitProbability, e.DurationProbability), lim)
	}
}

// censors reports whether event next ends the recovery search of event e
// under the rule of o. User events (severity unknown) always do.
func (o Recovery) censors(e, next *Event) bool {
	user := next.Kind != HeatWaveKind && next.Kind != DroughtKind && next.Kind != FloodKind
	same := next.Kind == e.Kind
	severe := next.Severity >= o.CensorMinSeverity
	switch o.CensorBy {
	case CensorAny:
		return true
	case CensorSameKind:
		return same || user
	case CensorSevere:
		return severe || user
	}
	return same || severe || user
}

// overlapping returns the pairs i < j of events whose peak windows share a
// day. evs are sorted by start, so the windows are too.
func overlapping(evs []Event, win []Span) [][2]int {
	var out [][2]int
	for i := range evs {
		for j := i + 1; j < len(evs) && win[j].Start <= win[i].End; j++ {
			if win[j].End >= win[i].Start {
				out = append(out, [2]int{i, j})
			}
		}
	}
	return out
}

// ceded appends to dst the days of event k's peak window that belong to
// another event under the overlap rule, for a variable driven by kind
// driver, as sorted disjoint spans, and returns dst. A shared day belongs to
// the event of the driver kind when exactly one of the two is of it, and to
// the later-starting one otherwise.
func ceded(dst []Span, k int, driver string, evs []Event, win []Span, pairs [][2]int) []Span {
	for _, p := range pairs {
		var j int
		switch k {
		case p[0]:
			j = p[1]
		case p[1]:
			j = p[0]
		default:
			continue
		}
		kd, jd := driver != "" && evs[k].Kind == driver, driver != "" && evs[j].Kind == driver
		if kd && !jd || kd == jd && j < k {
			continue // k keeps the shared days
		}
		dst = append(dst, Span{max(win[k].Start, win[j].Start), min(win[k].End, win[j].End)})
	}
	if len(dst) < 2 {
		return dst
	}
	slices.SortFunc(dst, func(a, b Span) int { return a.Start - b.Start })
	m := 0
	for _, s := range dst[1:] {
		if s.Start <= dst[m].End+1 {
			dst[m].End = max(dst[m].End, s.End)
		} else {
			m++
			dst[m] = s
		}
	}
	return dst[:m+1]
}
