package clustering

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat"
)

// PCA holds the first components of a principal component analysis.
type PCA struct {
	// Scores holds the centred rows projected on the components, n×c.
	Scores *mat.Dense
	// Loadings holds the unit direction of each component in a column,
	// d×c. Each direction is signed so that its largest element in
	// absolute value is positive (the first of exactly equal ones, which
	// rounding makes rare).
	Loadings *mat.Dense
	// Variance holds the variance of each component's scores (divisor
	// n−1), in decreasing order.
	Variance []float64
	// Explained holds each component's share of the total variance (NaN
	// when all rows are equal).
	Explained []float64
}

// PrincipalComponents returns the first c principal components of the rows
// of x, computed by gonum's stat.PC (a singular value decomposition of the
// centred data; no scaling, so standardise first). c = 0 means all
// min(n, d) components. It returns an error for NaN or ±Inf in x, fewer
// than 2 rows, c out of range, or a failed decomposition.
func PrincipalComponents(x mat.Matrix, c int) (PCA, error) {
	data, n, d := rowMajor(x)
	if err := checkFinite(data, d); err != nil {
		return PCA{}, err
	}
	if n < 2 {
		return PCA{}, fmt.Errorf("clustering: principal components of %d rows: want at least 2", n)
	}
	all := min(n, d)
	if c == 0 {
		c = all
	}
	if c < 1 || c > all {
		return PCA{}, fmt.Errorf("clustering: %d principal components: want 1 to %d", c, all)
	}
	var pc stat.PC
	if !pc.PrincipalComponents(x, nil) {
		return PCA{}, errors.New("clustering: principal components: the decomposition failed")
	}
	vars := pc.VarsTo(nil)
	var total float64
	for _, v := range vars {
		total += v
	}
	var vecs mat.Dense
	pc.VectorsTo(&vecs)
	load := mat.DenseCopyOf(vecs.Slice(0, d, 0, c))
	for j := range c {
		big, sign := 0.0, 1.0
		for i := range d {
			if v := load.At(i, j); math.Abs(v) > big {
				big, sign = math.Abs(v), math.Copysign(1, v)
			}
		}
		if sign < 0 {
			for i := range d {
				load.Set(i, j, -load.At(i, j))
			}
		}
	}
	// Centre the rows and project.
	mean := make([]float64, d)
	for i := range n {
		for j := range d {
			mean[j] += data[i*d+j]
		}
	}
	centred := mat.NewDense(n, d, nil)
	for i := range n {
		for j := range d {
			centred.Set(i, j, data[i*d+j]-mean[j]/float64(n))
		}
	}
	scores := mat.NewDense(n, c, nil)
	scores.Mul(centred, load)
	explained := make([]float64, c)
	for j := range c {
		explained[j] = vars[j] / total
	}
	return PCA{Scores: scores, Loadings: load, Variance: vars[:c], Explained: explained}, nil
}
