package events

import (
	"math"
	"slices"
)

// percentile returns the p-th percentile (0 <= p <= 100) of the values of
// x by linear interpolation between order statistics, type 7 of Hyndman &
// Fan (1996), "Sample quantiles in statistical packages", The American
// Statistician 50(4):361–365, the default of numpy.percentile and R's
// quantile: with the values sorted, h = (n−1)·p/100 and the result is
// x[⌊h⌋] + (h−⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]). The arithmetic is numpy's (1.24),
// so that results agree to the last bit: p/100 first, and for a fraction
// t >= 0.5 the interpolation runs down from the upper value,
// x[⌊h⌋+1] − (1−t)·(x[⌊h⌋+1] − x[⌊h⌋]).
//
// percentile reorders x instead of sorting it, by selection (Hoare's
// quickselect with a median-of-three pivot, falling back to sorting after
// 64 rounds), in time linear in len(x). It returns NaN when x is empty; x
// must hold no NaN.
func percentile(x []float64, p float64) float64 {
	if !(p >= 0 && p <= 100) {
		panic("events: percentile out of range")
	}
	n := len(x)
	if n == 0 {
		return math.NaN()
	}
	h := float64(n-1) * (p / 100)
	lo := min(int(h), n-1)
	selectKth(x, lo)
	t := h - float64(lo)
	if lo == n-1 || t == 0 {
		return x[lo]
	}
	a, b := x[lo], x[lo+1]
	for _, v := range x[lo+2:] {
		b = min(b, v)
	}
	if t >= 0.5 {
		return b - (b-a)*(1-t)
	}
	return a + (b-a)*t
}

// selectKth reorders x so that x[k] is the value a sort would put there,
// with no larger value before it and no smaller value after it.
func selectKth(x []float64, k int) {
	lo, hi := 0, len(x)-1
	for rounds := 0; hi > lo; rounds++ {
		if rounds == 64 {
			slices.Sort(x[lo : hi+1])
			return
		}
		mid := lo + (hi-lo)/2
		a, b, c := x[lo], x[mid], x[hi]
		pivot := max(min(a, b), min(max(a, b), c)) // the median of three
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
		// Now x[lo..j] <= pivot <= x[i..hi] and x[j+1..i-1] == pivot.
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
