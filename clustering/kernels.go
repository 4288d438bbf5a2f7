package clustering

import "math"

// The loops below handle one row against a block of rows stored one after
// another. Each takes two block rows per step, with one accumulator each:
// the two independent chains of additions run about twice as fast as one,
// and a call per row rather than per pair keeps call overhead out of the
// O(n²) loops.

// sqDist returns the squared Euclidean distance between a and b, which
// must have the same length.
func sqDist(a, b []float64) float64 {
	b = b[:len(a)]
	var s float64
	for i, v := range a {
		d := v - b[i]
		s += d * d
	}
	return s
}

// distances sets dst[j] to the Euclidean distance between x and row j of
// block, which holds len(dst) rows of len(x) values.
func distances(dst, x, block []float64) {
	sqDistances(dst, x, block)
	for j, v := range dst {
		dst[j] = math.Sqrt(v)
	}
}

// sqDistances is distances, squared.
func sqDistances(dst, x, block []float64) {
	d := len(x)
	j := 0
	for ; j+1 < len(dst); j += 2 {
		b0 := block[j*d : (j+1)*d]
		b1 := block[(j+1)*d : (j+2)*d]
		b0, b1 = b0[:len(x)], b1[:len(x)]
		var s0, s1 float64
		for i, v := range x {
			d0, d1 := v-b0[i], v-b1[i]
			s0 += d0 * d0
			s1 += d1 * d1
		}
		dst[j], dst[j+1] = s0, s1
	}
	if j < len(dst) {
		dst[j] = sqDist(x, block[j*d:(j+1)*d])
	}
}

// sumDistances returns the sum of the Euclidean distances between x and
// the rows of block.
func sumDistances(x, block []float64) float64 {
	d := len(x)
	var t0, t1 float64
	off := 0
	for ; off+2*d <= len(block); off += 2 * d {
		b0 := block[off : off+d]
		b1 := block[off+d : off+2*d]
		b0, b1 = b0[:len(x)], b1[:len(x)]
		var s0, s1 float64
		for i, v := range x {
			d0, d1 := v-b0[i], v-b1[i]
			s0 += d0 * d0
			s1 += d1 * d1
		}
		t0 += math.Sqrt(s0)
		t1 += math.Sqrt(s1)
	}
	if off < len(block) {
		t0 += math.Sqrt(sqDist(x, block[off:off+d]))
	}
	return t0 + t1
}

// nearest2 returns the row of centres nearest to x (the lowest-numbered on
// a tie), its squared distance d1, and the squared distance d2 to the
// second nearest (+Inf for a single centre).
func nearest2(x, centres []float64) (c int, d1, d2 float64) {
	d := len(x)
	k := len(centres) / d
	d1, d2 = math.Inf(1), math.Inf(1)
	j := 0
	for ; j+1 < k; j += 2 {
		b0 := centres[j*d : (j+1)*d]
		b1 := centres[(j+1)*d : (j+2)*d]
		b0, b1 = b0[:len(x)], b1[:len(x)]
		var s0, s1 float64
		for i, v := range x {
			e0, e1 := v-b0[i], v-b1[i]
			s0 += e0 * e0
			s1 += e1 * e1
		}
		if s0 < d1 {
			c, d1, d2 = j, s0, d1
		} else if s0 < d2 {
			d2 = s0
		}
		if s1 < d1 {
			c, d1, d2 = j+1, s1, d1
		} else if s1 < d2 {
			d2 = s1
		}
	}
	if j < k {
		s0 := sqDist(x, centres[j*d:(j+1)*d])
		if s0 < d1 {
			c, d1, d2 = j, s0, d1
		} else if s0 < d2 {
			d2 = s0
		}
	}
	return c, d1, d2
}
