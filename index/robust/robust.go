package robust

import (
	"math"
	"slices"
)

// Median returns the median of x, NaN when x is empty: the type-7
// quantile at p = 0.5 (see Quantile), which is what numpy.percentile(x, 50)
// returns to the last bit. x is not changed. NaN values are not allowed
// (the caller drops them first).
func Median(x []float64) float64 { return Quantile(x, 0.5) }

// Quantile returns the p-quantile of x by linear interpolation between
// order statistics, Hyndman & Fan (1996) type 7 (numpy's default, R's
// default, Excel's PERCENTILE.INC): with the sorted sample x(1..n) and
// h = (n − 1)p, Q = x(⌊h⌋+1) + (h − ⌊h⌋)(x(⌊h⌋+2) − x(⌊h⌋+1)).
//
// The arithmetic is numpy's (1.24, numpy.quantile with method "linear"),
// so that results agree to the last bit: with t = h − ⌊h⌋, a = x(⌊h⌋+1)
// and b = x(⌊h⌋+2), Q = a + (b − a)·t for t < 0.5 and Q = b − (b − a)·(1 − t)
// for t ≥ 0.5, which is exact at both ends and never leaves [a, b].
//
// Quantile returns NaN for an empty x or a NaN p; p below 0 is taken as 0
// and above 1 as 1. x must hold no NaN; it is not changed. It copies x
// once and selects the order statistics from the copy (see SelectQuantile).
func Quantile(x []float64, p float64) float64 {
	if len(x) == 0 || math.IsNaN(p) {
		return math.NaN()
	}
	return SelectQuantile(slices.Clone(x), p)
}

// SortedQuantile is Quantile for an x already sorted ascending.
func SortedQuantile(s []float64, p float64) float64 {
	n := len(s)
	if n == 0 || math.IsNaN(p) {
		return math.NaN()
	}
	k, t := rank(n, p)
	if t == 0 {
		return s[k]
	}
	return lerp(s[k], s[k+1], t)
}

// SelectQuantile is Quantile without the copy: it reorders x instead,
// selecting the order statistics it needs in time linear in len(x) (see
// Select) rather than sorting.
func SelectQuantile(x []float64, p float64) float64 {
	n := len(x)
	if n == 0 || math.IsNaN(p) {
		return math.NaN()
	}
	k, t := rank(n, p)
	a := Select(x, k)
	if t == 0 {
		return a
	}
	// The next order statistic is the smallest value after x[k].
	b := x[k+1]
	for _, v := range x[k+2:] {
		b = min(b, v)
	}
	return lerp(a, b, t)
}

// Select reorders x so that x[k] holds the value that sorting x would put
// there, with no larger value before it and no smaller value after it, and
// returns x[k]. It is Hoare's FIND (Hoare 1961, Communications of the ACM
// 4(7), Algorithm 65) with the median of the first, middle and last values
// as the pivot; it takes time linear in len(x) on average, and falls back
// to sorting what is left after 64 rounds, which only inputs built to
// defeat the pivot reach, so the worst case is O(n log n). x must hold no
// NaN. It panics if k is not an index of x.
func Select(x []float64, k int) float64 {
	if k < 0 || k >= len(x) {
		panic("robust: index out of range")
	}
	lo, hi := 0, len(x)-1
	for rounds := 0; hi > lo; rounds++ {
		if rounds == 64 {
			slices.Sort(x[lo : hi+1])
			break
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
			return x[k]
		}
	}
	return x[k]
}

// Selection gives several quantiles of one sample by selection. Each
// quantile leaves its order statistic in its sorted place, so that later
// ones search only between the nearest such places: the 10th, 50th and
// 90th percentiles of a year of daily values cost little more than one.
// The zero value holds an empty sample.
type Selection struct {
	x      []float64
	placed []int // indices k of x already in their sorted place (see Select)
}

// Reset makes s a selection over x, which it will reorder, keeping the
// memory s already has. x must hold no NaN.
func (s *Selection) Reset(x []float64) {
	s.x, s.placed = x, s.placed[:0]
}

// Quantile returns the type-7 p-quantile of the sample, as the function
// Quantile does: the same value to the last bit.
func (s *Selection) Quantile(p float64) float64 {
	x := s.x
	n := len(x)
	if n == 0 || math.IsNaN(p) {
		return math.NaN()
	}
	k, t := rank(n, p)
	a := s.at(k)
	if t == 0 {
		return a
	}
	// The next order statistic is the smallest value between k and the
	// next index in place.
	next := n
	for _, q := range s.placed {
		if q > k {
			next = min(next, q)
		}
	}
	b := math.Inf(1)
	if next < n {
		b = x[next]
	}
	for _, v := range x[k+1 : next] {
		b = min(b, v)
	}
	return lerp(a, b, t)
}

// at puts the k-th smallest value in its place and returns it.
func (s *Selection) at(k int) float64 {
	lo, hi := 0, len(s.x)
	for _, q := range s.placed {
		switch {
		case q == k:
			return s.x[k]
		case q < k:
			lo = max(lo, q+1)
		default:
			hi = min(hi, q)
		}
	}
	v := Select(s.x[lo:hi], k-lo)
	s.placed = append(s.placed, k)
	return v
}

// rank returns the 0-based order statistic k and the fraction t of the
// type-7 p-quantile of n > 0 values: Q = x[k] when t is 0, else between
// x[k] and x[k+1]. p is not NaN.
func rank(n int, p float64) (k int, t float64) {
	h := float64(n-1) * p
	switch {
	case !(h > 0):
		return 0, 0
	case h >= float64(n-1):
		return n - 1, 0
	}
	k = int(h)
	return k, h - float64(k)
}

// lerp interpolates between a and b at fraction 0 < t < 1 as numpy does
// (numpy/lib/function_base.py, _lerp): from a below one half, from b
// above.
func lerp(a, b, t float64) float64 {
	if t >= 0.5 {
		return b - (b-a)*(1-t)
	}
	return a + (b-a)*t
}

// TheilSen returns the Theil–Sen estimate of the slope of y on x: the
// median of the slopes (y_j − y_i)/(x_j − x_i) over all pairs i < j with
// x_i ≠ x_j (see PairwiseSlopes). ok is false, and the slope NaN, when no
// such pair exists. It uses O(n²) memory and time, which suits the tens of
// events per station it serves. It panics if the slices differ in length.
func TheilSen(x, y []float64) (slope float64, ok bool) {
	slopes := PairwiseSlopes(nil, x, y)
	if len(slopes) == 0 {
		return math.NaN(), false
	}
	return SelectQuantile(slopes, 0.5), true
}

// PairwiseSlopes sets dst to the slopes (y_j − y_i)/(x_j − x_i) over all
// pairs i < j with x_i ≠ x_j, in the order of i, then j, and returns it;
// dst is grown as needed. The Theil–Sen slope is their median; computing
// it as SelectQuantile(PairwiseSlopes(buf[:0], x, y), 0.5) reuses buf from
// one sample to the next. It panics if x and y differ in length.
func PairwiseSlopes(dst, x, y []float64) []float64 {
	if len(x) != len(y) {
		panic("robust: slice length mismatch")
	}
	dst = slices.Grow(dst[:0], len(x)*(len(x)-1)/2)
	for i := range x {
		for j := i + 1; j < len(x); j++ {
			if dx := x[j] - x[i]; dx != 0 {
				dst = append(dst, (y[j]-y[i])/dx)
			}
		}
	}
	return dst
}
