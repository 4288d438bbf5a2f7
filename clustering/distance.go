package clustering

import "gonum.org/v1/gonum/mat"

// Condensed holds the pairwise distances of N items: a symmetric matrix with
// a zero diagonal, stored as its upper triangle row by row. The distance
// between items i < j is D[N*i - i*(i+1)/2 + j - i - 1], the order that
// scipy.spatial.distance.pdist uses; len(D) is N*(N-1)/2.
type Condensed struct {
	N int
	D []float64
}

// NewCondensed returns a zero Condensed for n items.
func NewCondensed(n int) Condensed {
	if n < 0 {
		panic("clustering: negative item count")
	}
	d := make([]float64, n*(n-1)/2)
	adviseHugePages(d)
	return Condensed{N: n, D: d}
}

// Index returns the position in D of the distance between items i and j,
// which must differ.
func (c Condensed) Index(i, j int) int {
	if i > j {
		i, j = j, i
	}
	if i == j || i < 0 || j >= c.N {
		panic("clustering: condensed index out of range")
	}
	return c.N*i - i*(i+1)/2 + j - i - 1
}

// At returns the distance between items i and j; it is 0 when i == j.
func (c Condensed) At(i, j int) float64 {
	if i == j {
		return 0
	}
	return c.D[c.Index(i, j)]
}

// rowStarts returns s with s[i] + j the position in a condensed slice of the
// pair i < j of n items.
func rowStarts(n int) []int {
	s := make([]int, n)
	for i := range n {
		s[i] = n*i - i*(i+1)/2 - i - 1
	}
	return s
}

// Pairwise returns the Euclidean distances (not squared) between the rows
// of x. A NaN in x gives NaN distances for its row. The work is spread over
// GOMAXPROCS goroutines; every distance is computed the same way whatever
// their number.
//
// The result takes 4·n·(n−1) bytes: 1.6 GB for 20,000 rows.
func Pairwise(x mat.Matrix) Condensed {
	data, n, d := rowMajor(x)
	c := NewCondensed(n)
	rs := rowStarts(n)
	// Rows near the top have the most pairs, so hand out small pieces.
	chunks(n, 16, workerCount(0), func(_, lo, hi int) {
		for i := lo; i < hi; i++ {
			distances(c.D[rs[i]+i+1:rs[i]+n], data[i*d:(i+1)*d], data[(i+1)*d:])
		}
	})
	return c
}
