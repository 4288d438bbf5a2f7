package criteria

import "math"

// RRV is the reliability, resilience and vulnerability of a series against a
// criterion (Hashimoto, Stedinger & Loucks 1982). Failure means a value
// strictly greater than the criterion. Ratios with a zero denominator are
// NaN: resilience and every vulnerability when nothing failed, everything
// when no day has a value.
type RRV struct {
	Days        int // days with a value
	DaysAbove   int // failure days: value > criterion
	Events      int // failure events: maximal runs of consecutive failure days
	Transitions int // F→S transitions between consecutive days

	Reliability float64 // (Days − DaysAbove) / Days
	Resilience  float64 // Transitions / DaysAbove
	// Vulnerability is the mean over failure events of each event's largest
	// excess over the criterion (°C), the form of Hashimoto et al. (1982).
	Vulnerability float64
	// MeanExcess is the mean excess over all failure days (°C).
	MeanExcess float64
	// MaxExcess is the largest excess of any failure day (°C).
	MaxExcess float64
	// MeanEventExcess is the mean over failure events of each event's
	// cumulative excess (°C·d).
	MeanEventExcess float64
}

// Hashimoto returns the performance of x against limit. NaN values of x are
// missing days: they count neither as satisfactory nor as failures, they end
// a failure event, and no transition is counted across them.
func Hashimoto(x []float64, limit float64) RRV {
	var (
		r                   RRV
		sumMax, sumExcess   float64
		eventMax, maxExcess float64
		prevFail            bool // the previous day has a value and failed
	)
	for _, v := range x {
		if math.IsNaN(v) {
			prevFail = false
			continue
		}
		r.Days++
		if v <= limit {
			if prevFail {
				r.Transitions++
			}
			prevFail = false
			continue
		}
		e := v - limit
		r.DaysAbove++
		sumExcess += e
		maxExcess = max(maxExcess, e)
		if !prevFail {
			if r.Events > 0 {
				sumMax += eventMax
			}
			r.Events++
			eventMax = e
		}
		eventMax = max(eventMax, e)
		prevFail = true
	}
	if r.Events > 0 {
		sumMax += eventMax
	}
	r.Reliability = ratio(float64(r.Days-r.DaysAbove), r.Days)
	r.Resilience = ratio(float64(r.Transitions), r.DaysAbove)
	r.Vulnerability = ratio(sumMax, r.Events)
	r.MeanExcess = ratio(sumExcess, r.DaysAbove)
	r.MeanEventExcess = ratio(sumExcess, r.Events)
	r.MaxExcess = math.NaN()
	if r.DaysAbove > 0 {
		r.MaxExcess = maxExcess
	}
	return r
}

func ratio(a float64, b int) float64 {
	if b == 0 {
		return math.NaN()
	}
	return a / float64(b)
}
