package rankstat

import (
	"math"

	"gonum.org/v1/gonum/stat"
)

// MidRanks returns the ascending midranks of x: the smallest value has rank
// 1, and tied values share the mean of the ranks they span (1, 2.5, 2.5, 4),
// as scipy.stats.rankdata's "average" method. NaN values get NaN and the
// other values are ranked among themselves. If dst is nil a new slice is
// allocated; otherwise MidRanks panics unless len(dst) == len(x).
func MidRanks(dst, x []float64) []float64 {
	n := len(x)
	if dst == nil {
		dst = make([]float64, n)
	} else if len(dst) != n {
		panic("rankstat: slice length mismatch")
	}
	var r Ranker
	ranks := r.Ranks(nil, x)
	order := r.Order()
	finite := 0
	for _, v := range x {
		if !math.IsNaN(v) {
			finite++
		}
	}
	// order lists x from the largest value down; a group of ties at
	// positions [i, j) has descending midrank (i+1+j)/2, which counts
	// finite+1−(i+1+j)/2 from the bottom.
	for i := 0; i < n; {
		j := i + 1
		for j < n && ranks[order[j]] == ranks[order[i]] {
			j++
		}
		m := float64(finite+1) - float64(i+1+j)/2
		for _, s := range order[i:j] {
			if math.IsNaN(x[s]) {
				dst[s] = math.NaN()
			} else {
				dst[s] = m
			}
		}
		i = j
	}
	return dst
}

// Spearman returns Spearman's rank correlation of x and y: the Pearson
// correlation of their midranks, which is correct with ties. It returns NaN
// if either slice holds a NaN, has fewer than two values or is constant.
// Spearman panics if len(x) != len(y).
func Spearman(x, y []float64) float64 {
	if len(x) != len(y) {
		panic("rankstat: slice length mismatch")
	}
	if len(x) < 2 || hasNaN(x) || hasNaN(y) {
		return math.NaN()
	}
	// Rounding can carry the correlation a last bit past ±1.
	return max(-1, min(1, stat.Correlation(MidRanks(nil, x), MidRanks(nil, y), nil)))
}

func hasNaN(x []float64) bool {
	for _, v := range x {
		if math.IsNaN(v) {
			return true
		}
	}
	return false
}
