package rankstat

import (
	"math"
	"slices"
)

// Ranks returns the competition ranks of scores, highest score first: rank
// 1 is the highest score, tied scores share the lowest rank number of their
// group (1, 2, 2, 4), −0 ties with +0, and NaN scores rank after every
// number and share one rank (one more than the number of non-NaN scores).
//
// If dst is nil a new slice is allocated; otherwise Ranks panics unless
// len(dst) == len(scores). Ranks allocates scratch space on each call;
// use a Ranker to rank many vectors.
func Ranks(dst []int32, scores []float64) []int32 {
	var r Ranker
	return r.Ranks(dst, scores)
}

// Order returns the indices of scores from the highest score to the lowest,
// tied scores in index order and NaN scores last (the order in which
// Ranks hands out ranks). If dst is nil a new slice is allocated; otherwise
// Order panics unless len(dst) == len(scores).
func Order(dst []int32, scores []float64) []int32 {
	var r Ranker
	r.Ranks(nil, scores)
	if dst == nil {
		return r.order
	}
	if len(dst) != len(scores) {
		panic("rankstat: slice length mismatch")
	}
	copy(dst, r.order)
	return dst
}

// A Ranker ranks score vectors like Ranks and keeps its scratch space, so
// that ranking many vectors of the same length allocates nothing. The zero
// value is ready to use. A Ranker must not be used by more than one
// goroutine at a time.
type Ranker struct {
	a, b          []item
	order         []int32
	bucket, start []int32
	count         *[radixPasses][radixSize]uint32
}

// item is a sort key with the index of its score.
type item struct {
	key uint64
	idx int32
}

const (
	radixBits   = 11
	radixSize   = 1 << radixBits
	radixPasses = (64 + radixBits - 1) / radixBits
	// Below this length a comparison sort beats clearing the radix counts.
	smallSort = 256
)

// Ranks returns the competition ranks of scores, as the function Ranks
// does, and leaves the order of the scores for Order.
func (r *Ranker) Ranks(dst []int32, scores []float64) []int32 {
	n := len(scores)
	if dst == nil {
		dst = make([]int32, n)
	} else if len(dst) != n {
		panic("rankstat: slice length mismatch")
	}
	if n > math.MaxInt32 {
		panic("rankstat: too many scores")
	}
	items := r.sort(scores)
	r.order = grow(r.order, n)
	var rank int32
	for i, it := range items {
		if i == 0 || it.key != items[i-1].key {
			rank = int32(i + 1)
		}
		dst[it.idx] = rank
		r.order[i] = it.idx
	}
	return dst
}

// Order returns the indices of the scores last passed to Ranks from the
// highest score to the lowest, ties in index order and NaN last. The slice
// belongs to the Ranker and is overwritten by the next call to Ranks.
func (r *Ranker) Order() []int32 { return r.order }

// descKey maps x to a key whose ascending order is the descending order of
// the scores, with −0 equal to +0 and every NaN after every number.
func descKey(x float64) uint64 {
	if math.IsNaN(x) {
		return math.MaxUint64
	}
	if x == 0 {
		x = 0 // −0 ties with +0
	}
	b := math.Float64bits(x)
	if b>>63 == 1 {
		b = ^b // negative numbers: flipping all bits reverses their order
	} else {
		b |= 1 << 63 // non-negative numbers sort above all negative ones
	}
	return ^b
}

// sort returns the scores' keys in ascending key order; equal keys stay in
// index order.
func (r *Ranker) sort(scores []float64) []item {
	n := len(scores)
	r.a = grow(r.a, n)
	if n < smallSort {
		a := r.a
		for i, x := range scores {
			a[i] = item{descKey(x), int32(i)}
		}
		slices.SortFunc(a, compareItems)
		return a
	}
	if a, ok := r.bucketSort(scores); ok {
		return a
	}
	return r.radixSort(scores)
}

func compareItems(x, y item) int {
	if x.key != y.key {
		if x.key < y.key {
			return -1
		}
		return 1
	}
	return int(x.idx - y.idx)
}

// bucketSort distributes the finite scores over about n buckets by value,
// highest first, through b(x) = ⌊(max − x)·scale⌋. Floating-point
// subtraction, multiplication and truncation are monotone, so x > y implies
// b(x) ≤ b(y), and sorting each bucket by key orders the whole. The
// distribution is stable and insertion sort is stable, so ties stay in
// index order; NaN scores follow in index order. It reports false if a
// score is infinite, the range of the scores overflows, or a bucket is
// crowded.
func (r *Ranker) bucketSort(scores []float64) ([]item, bool) {
	n := len(scores)
	lo, hi := math.Inf(1), math.Inf(-1)
	nan := 0
	for _, x := range scores {
		if x != x {
			nan++
			continue
		}
		lo = min(lo, x)
		hi = max(hi, x)
	}
	span := hi - lo
	if nan == n || !(span <= math.MaxFloat64) { // an infinite score, or overflow
		return nil, false
	}
	finite := n - nan
	nb := finite
	scale := 0.0
	if span > 0 {
		scale = float64(nb-1) / span
	}
	r.bucket = grow(r.bucket, n)
	r.start = grow(r.start, nb+1)
	clear(r.start)
	for i, x := range scores {
		if x != x {
			r.bucket[i] = int32(nb) // NaN: after every bucket
			continue
		}
		b := int32(min((hi-x)*scale, float64(nb-1)))
		r.bucket[i] = b
		r.start[b+1]++
	}
	for b := range nb {
		r.start[b+1] += r.start[b]
	}
	a := r.a
	fill := r.start[:nb]
	nanPos := finite
	for i, x := range scores {
		b := r.bucket[i]
		if b == int32(nb) {
			a[nanPos] = item{math.MaxUint64, int32(i)}
			nanPos++
			continue
		}
		a[fill[b]] = item{descKey(x), int32(i)}
		fill[b]++
	}
	// fill[b] is now the end of bucket b, and the start of bucket b+1.
	begin := int32(0)
	for b := range nb {
		end := fill[b]
		if end-begin > maxBucket {
			return nil, false
		}
		insertionSort(a[begin:end])
		begin = end
	}
	return a, true
}

// maxBucket is the most scores a bucket may hold before bucketSort gives
// way to the radix sort, which does not depend on how the scores spread.
const maxBucket = 64

// insertionSort sorts a by key, keeping equal keys in their order.
func insertionSort(a []item) {
	for i := 1; i < len(a); i++ {
		v := a[i]
		j := i
		for j > 0 && a[j-1].key > v.key {
			a[j] = a[j-1]
			j--
		}
		a[j] = v
	}
}

// radixSort sorts by a least-significant-digit radix sort, which is stable,
// so equal keys keep index order. All digit counts are taken in one read,
// and a pass whose digit is the same for every key is skipped.
func (r *Ranker) radixSort(scores []float64) []item {
	n := len(scores)
	a := r.a
	b := grow(r.b, n)
	r.b = b
	if r.count == nil {
		r.count = new([radixPasses][radixSize]uint32)
	}
	count := r.count
	*count = [radixPasses][radixSize]uint32{}
	for i, x := range scores {
		k := descKey(x)
		a[i] = item{k, int32(i)}
		for p := range radixPasses {
			count[p][(k>>(p*radixBits))&(radixSize-1)]++
		}
	}
	for p := range radixPasses {
		shift := p * radixBits
		c := &count[p]
		if c[(a[0].key>>shift)&(radixSize-1)] == uint32(n) {
			continue
		}
		var sum uint32
		for d, v := range c {
			c[d] = sum
			sum += v
		}
		for _, it := range a {
			d := (it.key >> shift) & (radixSize - 1)
			b[c[d]] = it
			c[d]++
		}
		a, b = b, a
	}
	return a
}

func grow[T any](s []T, n int) []T { return slices.Grow(s[:0], n)[:n] }
