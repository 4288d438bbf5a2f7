// Package robust holds order statistics and rank-based estimators that
// resist outliers: the median, sample quantiles (Hyndman & Fan 1996 type 7)
// and the Theil–Sen slope (Theil 1950; Sen 1968).
package robust

import (
	"math"
	"slices"
)

// Median returns the median of x, NaN when x is empty. x is not changed.
// NaN values are not allowed (the caller drops them first).
func Median(x []float64) float64 { return Quantile(x, 0.5) }

// Quantile returns the p-quantile of x by linear interpolation between
// order statistics, Hyndman & Fan (1996) type 7 (numpy's default, R's
// default, Excel's PERCENTILE.INC): with the sorted sample x(1..n) and
// h = (n − 1)p, Q = x(⌊h⌋+1) + (h − ⌊h⌋)(x(⌊h⌋+2) − x(⌊h⌋+1)). It returns NaN
// for an empty x. x is not changed.
func Quantile(x []float64, p float64) float64 {
	if len(x) == 0 {
		return math.NaN()
	}
	s := slices.Clone(x)
	slices.Sort(s)
	return SortedQuantile(s, p)
}

// SortedQuantile is Quantile for an x already sorted ascending.
func SortedQuantile(s []float64, p float64) float64 {
	n := len(s)
	if n == 0 {
		return math.NaN()
	}
	h := float64(n-1) * p
	lo := int(math.Floor(h))
	if lo >= n-1 {
		return s[n-1]
	}
	if lo < 0 {
		return s[0]
	}
	return s[lo] + (h-float64(lo))*(s[lo+1]-s[lo])
}

// TheilSen returns the Theil–Sen estimate of the slope of y on x: the
// median of the slopes (y_j − y_i)/(x_j − x_i) over all pairs i < j with
// x_i ≠ x_j. ok is false when fewer than one such pair exists. It uses
// O(n²) memory and time, which suits the tens of events per station it
// serves. It panics if the slices differ in length.
func TheilSen(x, y []float64) (slope float64, ok bool) {
	if len(x) != len(y) {
		panic("robust: slice length mismatch")
	}
	var slopes []float64
	for i := range x {
		for j := i + 1; j < len(x); j++ {
			if dx := x[j] - x[i]; dx != 0 {
				slopes = append(slopes, (y[j]-y[i])/dx)
			}
		}
	}
	if len(slopes) == 0 {
		return math.NaN(), false
	}
	slices.Sort(slopes)
	return SortedQuantile(slopes, 0.5), true
}
