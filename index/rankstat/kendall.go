package rankstat

import (
	"math"
	"slices"
)

// KendallTauB returns Kendall's tau-b of x and y,
//
//	τ_b = (C − D) / √((n0 − n1)(n0 − n2)),
//
// where C and D count the concordant and discordant pairs, n0 = n(n−1)/2,
// and n1 and n2 count the pairs tied on x and on y. It takes O(n log n)
// time (Knight 1966). It returns NaN if either slice holds a NaN, has fewer
// than two values or is constant. KendallTauB panics if len(x) != len(y).
func KendallTauB(x, y []float64) float64 {
	if len(x) != len(y) {
		panic("rankstat: slice length mismatch")
	}
	if len(x) < 2 || hasNaN(x) || hasNaN(y) {
		return math.NaN()
	}
	var r Ranker
	rx := r.Ranks(nil, x)
	ry := r.Ranks(nil, y)
	var k Kendall
	return k.TauB(rx, ry)
}

// Kendall computes Kendall's tau-b of rank vectors and keeps its scratch
// space between calls. The zero value is ready to use. A Kendall must not be
// used by more than one goroutine at a time.
type Kendall struct {
	count, starts []int32
	byY, byXY     []int32
	ys, mergeTemp []int32
}

// TauB returns Kendall's tau-b of x and y, which must hold integers in
// 1..len(x), such as the ranks from Ranks (the direction of ranking does not
// matter as long as x and y share it). It returns NaN if x or y is constant
// or shorter than 2. TauB panics if len(x) != len(y) or a value is out of
// range.
//
// The pairs are put in (x, y) order by two counting sorts, and the
// discordant pairs are then the exchanges a merge sort on y makes
// (Knight 1966).
func (k *Kendall) TauB(x, y []int32) float64 {
	n := len(x)
	if len(y) != n {
		panic("rankstat: slice length mismatch")
	}
	if n < 2 {
		return math.NaN()
	}
	k.count = slices.Grow(k.count[:0], n+1)[:n+1]
	k.starts = slices.Grow(k.starts[:0], n+1)[:n+1]
	k.byY = slices.Grow(k.byY[:0], n)[:n]
	k.byXY = slices.Grow(k.byXY[:0], n)[:n]
	k.ys = slices.Grow(k.ys[:0], n)[:n]
	k.mergeTemp = slices.Grow(k.mergeTemp[:0], n)[:n]

	// Stable counting sort by y, then by x: byXY is in (x, y) order.
	// The y counts give n2, the pairs tied on y.
	countingSort(k.byY, identity(k.byXY), y, k.count, k.starts)
	var n2 int64
	for _, c := range k.count {
		n2 += int64(c) * int64(c-1) / 2
	}
	countingSort(k.byXY, k.byY, x, k.count, k.starts)

	// n1 counts pairs tied on x, n3 pairs tied on both.
	var n1, n3 int64
	for i := 0; i < n; {
		j := i + 1
		for j < n && x[k.byXY[j]] == x[k.byXY[i]] {
			j++
		}
		n1 += int64(j-i) * int64(j-i-1) / 2
		for a := i; a < j; {
			b := a + 1
			for b < j && y[k.byXY[b]] == y[k.byXY[a]] {
				b++
			}
			n3 += int64(b-a) * int64(b-a-1) / 2
			a = b
		}
		i = j
	}

	for i, s := range k.byXY {
		k.ys[i] = y[s]
	}
	d := inversions(k.ys, k.mergeTemp)
	n0 := int64(n) * int64(n-1) / 2
	num := n0 - n1 - n2 + n3 - 2*d // C − D
	den := math.Sqrt(float64(n0-n1)) * math.Sqrt(float64(n0-n2))
	if n1 == n2 {
		den = float64(n0 - n1) // exact, so identical rankings give exactly ±1
	}
	if den == 0 {
		return math.NaN()
	}
	// The two square roots can round the ratio of identical rankings a
	// last bit past 1; tau-b lies in [−1, 1].
	return max(-1, min(1, float64(num)/den))
}

// identity fills p with 0, 1, ..., len(p)−1 and returns it.
func identity(p []int32) []int32 {
	for i := range p {
		p[i] = int32(i)
	}
	return p
}

// countingSort writes the indices in src to dst, stably sorted by
// key[index], which must lie in 1..len(key). On return count[v] is the
// number of keys equal to v; starts is scratch. count and starts have
// len(key)+1 elements.
func countingSort(dst, src, key, count, starts []int32) {
	clear(count)
	for _, v := range key {
		if v < 1 || int(v) > len(key) {
			panic("rankstat: rank out of range")
		}
		count[v]++
	}
	var next int32
	for v, c := range count {
		starts[v] = next
		next += c
	}
	for _, s := range src {
		v := key[s]
		dst[starts[v]] = s
		starts[v]++
	}
}

// inversions returns the number of pairs i < j with a[i] > a[j], sorting a
// (in a or in buf, which must be as long as a).
func inversions(a, buf []int32) int64 {
	n := len(a)
	var inv int64
	const run = 32
	for lo := 0; lo < n; lo += run {
		hi := min(lo+run, n)
		for i := lo + 1; i < hi; i++ {
			v := a[i]
			j := i
			for j > lo && a[j-1] > v {
				a[j] = a[j-1]
				j--
			}
			a[j] = v
			inv += int64(i - j)
		}
	}
	src, dst := a, buf[:n]
	for width := run; width < n; width *= 2 {
		for lo := 0; lo < n; lo += 2 * width {
			mid := min(lo+width, n)
			hi := min(lo+2*width, n)
			if mid >= hi || src[mid-1] <= src[mid] {
				copy(dst[lo:hi], src[lo:hi])
				continue
			}
			// Branch-free merge: t is 1 when the right head is smaller
			// (an exchange over the mid-i elements left), else 0. The
			// values are ranks, so b−a cannot overflow.
			i, j, o := lo, mid, lo
			for i < mid && j < hi {
				a, b := src[i], src[j]
				t := int(uint32(b-a) >> 31)
				dst[o] = a + (b-a)*int32(t)
				inv += int64(t * (mid - i))
				i += 1 - t
				j += t
				o++
			}
			o += copy(dst[o:], src[i:mid])
			copy(dst[o:], src[j:hi])
		}
		src, dst = dst, src
	}
	return inv
}
