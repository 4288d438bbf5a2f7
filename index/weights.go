package index

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/mat"

	"rebound/config"
)

// AHPResult is the outcome of Saaty's Analytic Hierarchy Process on one
// pairwise comparison matrix.
type AHPResult struct {
	// Weights is the principal right eigenvector, normalised to sum 1.
	Weights []float64
	// LambdaMax is the principal eigenvalue; it equals n for a perfectly
	// consistent matrix and exceeds n otherwise.
	LambdaMax float64
	// CI = (λmax − n)/(n − 1) is the consistency index, RI the random index
	// for n (Saaty 1980) and CR = CI/RI the consistency ratio (0 for n <= 2).
	CI, RI, CR float64
}

// RandomIndex is Saaty's random consistency index by matrix order n: the
// mean CI of random reciprocal matrices on the 1–9 scale (Saaty 1980, The
// Analytic Hierarchy Process, McGraw-Hill; values for n <= 10 as reproduced
// in textbooks). Values for n = 11..15 are from Saaty's extended table, from
// memory. Index 0 is unused.
var RandomIndex = []float64{0, 0, 0, 0.58, 0.90, 1.12, 1.24, 1.32, 1.41, 1.45, 1.49, 1.51, 1.48, 1.56, 1.57, 1.59}

// AHP derives weights from a positive reciprocal matrix a (a[i][j] ≈
// w_i/w_j) as its principal right eigenvector (Saaty 1980), computed with
// gonum's general eigendecomposition. It reports the consistency ratio but
// does not judge it; the caller applies its limit.
func AHP(a [][]float64) (AHPResult, error) {
	n := len(a)
	if n == 0 {
		return AHPResult{}, errors.New("ahp: empty matrix")
	}
	if n >= len(RandomIndex) {
		return AHPResult{}, fmt.Errorf("ahp: at most %d criteria are supported (the random-index table ends there), got %d", len(RandomIndex)-1, n)
	}
	m := mat.NewDense(n, n, nil)
	for i, row := range a {
		if len(row) != n {
			return AHPResult{}, fmt.Errorf("ahp: row %d has %d entries, want %d", i+1, len(row), n)
		}
		for j, x := range row {
			if !(x > 0) || math.IsInf(x, 0) {
				return AHPResult{}, fmt.Errorf("ahp: entry (%d,%d) = %g, want a positive number", i+1, j+1, x)
			}
			m.Set(i, j, x)
		}
	}
	var eig mat.Eigen
	if !eig.Factorize(m, mat.EigenRight) {
		return AHPResult{}, errors.New("ahp: the eigendecomposition did not converge")
	}
	vals := eig.Values(nil)
	k := 0
	for i, v := range vals {
		if real(v) > real(vals[k]) {
			k = i
		}
	}
	var vecs mat.CDense
	eig.VectorsTo(&vecs)
	w := make([]float64, n)
	sum := 0.0
	for i := range n {
		// The Perron vector of a positive matrix has entries of one sign;
		// take magnitudes to drop the arbitrary sign and phase.
		w[i] = cmplx.Abs(vecs.At(i, k))
		sum += w[i]
	}
	for i := range w {
		w[i] /= sum
	}
	r := AHPResult{Weights: w, LambdaMax: real(vals[k]), RI: RandomIndex[n]}
	if n > 2 {
		r.CI = (r.LambdaMax - float64(n)) / float64(n-1)
		r.CR = r.CI / r.RI
	}
	return r, nil
}

// Weights is the weighting in force for a run.
type Weights struct {
	Method config.WeightMethod
	// W holds one weight per indicator, in configuration order, summing to 1.
	W   []float64
	AHP *AHPResult // set for method "ahp"
	// Warnings note accepted inconsistency.
	Warnings []error
}

// ResolveWeights computes the weights the configuration asks for.
func ResolveWeights(cfg *config.Config) (*Weights, error) {
	k := len(cfg.Indicators)
	out := &Weights{Method: cfg.Weighting.Method, W: make([]float64, k)}
	switch cfg.Weighting.Method {
	case config.Equal:
		for j := range out.W {
			out.W[j] = 1 / float64(k)
		}
	case config.AHPW:
		ahp := cfg.Weighting.AHP
		a := make([][]float64, len(ahp.Matrix))
		for i, row := range ahp.Matrix {
			a[i] = make([]float64, len(row))
			for j, x := range row {
				a[i][j] = float64(x)
			}
		}
		res, err := AHP(a)
		if err != nil {
			return nil, &config.Error{File: cfg.File, Key: "weighting.ahp.matrix", Msg: err.Error()}
		}
		out.AHP = &res
		if res.CR > ahp.MaxCR {
			msg := fmt.Sprintf("consistency ratio %.3f exceeds max_cr = %g (λmax %.4f, CI %.4f, RI %.2f); revise the judgements", res.CR, ahp.MaxCR, res.LambdaMax, res.CI, res.RI)
			if !ahp.AcceptInconsistent {
				return nil, &config.Error{File: cfg.File, Key: "weighting.ahp.matrix", Msg: msg + " or set accept_inconsistent = true"}
			}
			out.Warnings = append(out.Warnings, &Warning{Msg: "AHP " + msg + "; accepted because accept_inconsistent = true"})
		}
		pos := map[string]int{}
		for i, name := range ahp.Order {
			pos[name] = i
		}
		for j, ind := range cfg.Indicators {
			out.W[j] = res.Weights[pos[ind.Name]]
		}
	default:
		sum := 0.0
		for j, ind := range cfg.Indicators {
			if ind.Weight == nil {
				return nil, &config.Error{File: cfg.File, Key: fmt.Sprintf("indicator[%d].weight", j+1), Msg: "missing"}
			}
			out.W[j] = float64(*ind.Weight)
			sum += out.W[j]
		}
		if !(sum > 0) {
			return nil, &config.Error{File: cfg.File, Key: "indicator.weight", Msg: "all weights are zero"}
		}
		for j := range out.W {
			out.W[j] /= sum
		}
	}
	return out, nil
}
