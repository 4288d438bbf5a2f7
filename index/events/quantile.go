package events

import "math"

// Percentile returns the p-th percentile (0 <= p <= 100) of the sorted
// values x by linear interpolation between order statistics, type 7 of
// Hyndman & Fan (1996), "Sample quantiles in statistical packages", The
// American Statistician 50(4):361–365, the default of numpy.percentile and
// of R's quantile: with h = (n−1)·p/100, the result is
// x[⌊h⌋] + (h−⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]).
//
// Percentile returns NaN when x is empty. x must be sorted in increasing
// order and hold no NaN; Percentile panics if p is outside [0, 100].
func Percentile(x []float64, p float64) float64 {
	if !(p >= 0 && p <= 100) {
		panic("events: percentile out of range")
	}
	if len(x) == 0 {
		return math.NaN()
	}
	h := float64(len(x)-1) * p / 100
	lo := int(h)
	if lo >= len(x)-1 {
		return x[len(x)-1]
	}
	return x[lo] + (h-float64(lo))*(x[lo+1]-x[lo])
}
