package events

import (
	"math"
	"slices"
)

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

// percentileInPlace returns Percentile(sorted x, p) without sorting x: it
// reorders x by selection (Hoare's quickselect with a median-of-three
// pivot, falling back to sorting after too many rounds), which takes time
// linear in len(x) instead of n·log n. x must hold no NaN.
func percentileInPlace(x []float64, p float64) float64 {
	if !(p >= 0 && p <= 100) {
		panic("events: percentile out of range")
	}
	n := len(x)
	if n == 0 {
		return math.NaN()
	}
	h := float64(n-1) * p / 100
	lo := int(h)
	if lo >= n-1 {
		lo = n - 1
	}
	selectKth(x, lo)
	if lo == n-1 {
		return x[lo]
	}
	next := x[lo+1]
	for _, v := range x[lo+2:] {
		next = min(next, v)
	}
	return x[lo] + (h-float64(lo))*(next-x[lo])
}

// selectKth reorders x so that x[k] is the value a sort would put there,
// with no larger value before it and no smaller value after it.
func selectKth(x []float64, k int) {
	lo, hi := 0, len(x)-1
	for rounds := 0; hi > lo; rounds++ {
		if rounds > 64 {
			slices.Sort(x[lo : hi+1])
			return
		}
		// Median of three as pivot value.
		mid := lo + (hi-lo)/2
		a, b, c := x[lo], x[mid], x[hi]
		pivot := max(min(a, b), min(max(a, b), c))
		i, j := lo, hi
		for i <= j {
			for x[i] < pivot {
				i++
			}
			for x[j] > pivot {
				j--
			}
			if i <= j {
				x[i], x[j] = x[j], x[i]
				i++
				j--
			}
		}
		// Now x[lo..j] <= pivot <= x[i..hi], and x[j+1..i-1] == pivot.
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return
		}
	}
}
