package clustering

import (
	"fmt"
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/mat"
)

// A ValueError reports an element of the input that a method cannot use,
// such as NaN or ±Inf. Row and Col are 0-based.
type ValueError struct {
	Row, Col int
	Value    float64
}

func (e *ValueError) Error() string {
	return fmt.Sprintf("clustering: x[%d, %d] = %v: want a finite value", e.Row, e.Col, e.Value)
}

// rowMajor returns the elements of x row by row with no gaps, and the
// dimensions of x. When x is a *mat.Dense (or another mat.RawMatrixer)
// whose rows are contiguous, the slice shares x's storage and must not be
// written.
func rowMajor(x mat.Matrix) (data []float64, n, d int) {
	n, d = x.Dims()
	if n == 0 || d == 0 {
		return nil, n, d
	}
	if rm, ok := x.(mat.RawMatrixer); ok {
		raw := rm.RawMatrix()
		if raw.Stride == d {
			return raw.Data[:n*d], n, d
		}
		data = make([]float64, n*d)
		for i := range n {
			copy(data[i*d:(i+1)*d], raw.Data[i*raw.Stride:i*raw.Stride+d])
		}
		return data, n, d
	}
	data = make([]float64, n*d)
	for i := range n {
		for j := range d {
			data[i*d+j] = x.At(i, j)
		}
	}
	return data, n, d
}

// checkFinite returns a *ValueError for the first element of the n×d
// row-major data that is NaN or infinite.
func checkFinite(data []float64, d int) error {
	for i, v := range data {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return &ValueError{Row: i / d, Col: i % d, Value: v}
		}
	}
	return nil
}

// workerCount turns a Workers setting into a goroutine count: 0 means
// GOMAXPROCS.
func workerCount(w int) int {
	if w <= 0 {
		return runtime.GOMAXPROCS(0)
	}
	return w
}

// chunks splits [0, n) into pieces of size (the last may be shorter) and
// calls f(c, lo, hi) for piece c on up to workers goroutines. The pieces do
// not depend on workers, so results that f stores per piece and the caller
// reduces in piece order are the same for any number of workers.
func chunks(n, size, workers int, f func(c, lo, hi int)) {
	nc := (n + size - 1) / size
	if workers > nc {
		workers = nc
	}
	if workers <= 1 {
		for c := range nc {
			f(c, c*size, min(n, (c+1)*size))
		}
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			for {
				c := int(next.Add(1) - 1)
				if c >= nc {
					return
				}
				f(c, c*size, min(n, (c+1)*size))
			}
		})
	}
	wg.Wait()
}

// countLabels returns the number of label values (the largest label plus
// one) and the number of rows with each. It panics on a negative label.
func countLabels(labels []int) (counts []int) {
	k := 0
	for _, l := range labels {
		if l < 0 {
			panic("clustering: negative label")
		}
		k = max(k, l+1)
	}
	counts = make([]int, k)
	for _, l := range labels {
		counts[l]++
	}
	return counts
}

// nonEmpty returns the number of non-zero counts.
func nonEmpty(counts []int) int {
	m := 0
	for _, c := range counts {
		if c > 0 {
			m++
		}
	}
	return m
}

// firstAppearance renumbers labels in place so that clusters are numbered
// 0, 1, ... in the order of their first row, and returns the mapping from
// old label to new (-1 for labels that do not occur).
func firstAppearance(labels []int, k int) []int {
	to := make([]int, k)
	for i := range to {
		to[i] = -1
	}
	next := 0
	for i, l := range labels {
		if to[l] < 0 {
			to[l] = next
			next++
		}
		labels[i] = to[l]
	}
	return to
}
