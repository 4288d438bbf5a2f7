package clustering

import (
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// Four points ±2u and ±v, with u = (0.8, 0.6) and v = (0.6, −0.8): the
// components are u and v, with score variances 8/3 and 2/3 (divisor n−1)
// and shares 0.8 and 0.2, worked by hand. The sign rule turns v into
// (−0.6, 0.8), so the score of v on it is −1.
func TestPrincipalComponents(t *testing.T) {
	x := mat.NewDense(4, 2, []float64{
		1.6, 1.2,
		-1.6, -1.2,
		0.6, -0.8,
		-0.6, 0.8,
	})
	// Shift the cloud: centring must remove it.
	for i := range 4 {
		x.Set(i, 0, x.At(i, 0)+10)
		x.Set(i, 1, x.At(i, 1)-3)
	}
	p, err := PrincipalComponents(x, 0)
	if err != nil {
		t.Fatal(err)
	}
	if !floats.EqualApprox(p.Variance, []float64{8.0 / 3, 2.0 / 3}, 1e-12) {
		t.Errorf("variance %v", p.Variance)
	}
	if !floats.EqualApprox(p.Explained, []float64{0.8, 0.2}, 1e-12) {
		t.Errorf("explained %v", p.Explained)
	}
	// Signs: the largest loading in absolute value is positive.
	want := mat.NewDense(2, 2, []float64{0.8, -0.6, 0.6, 0.8})
	if !mat.EqualApprox(p.Loadings, want, 1e-12) {
		t.Errorf("loadings %v", mat.Formatted(p.Loadings))
	}
	scores := mat.NewDense(4, 2, []float64{2, 0, -2, 0, 0, -1, 0, 1})
	if !mat.EqualApprox(p.Scores, scores, 1e-12) {
		t.Errorf("scores %v", mat.Formatted(p.Scores))
	}
	one, err := PrincipalComponents(x, 1)
	if err != nil || !mat.EqualApprox(one.Scores, scores.Slice(0, 4, 0, 1), 1e-12) {
		t.Errorf("one component: %v", err)
	}
	if _, err := PrincipalComponents(x, 3); err == nil {
		t.Errorf("3 components of 2 features: no error")
	}
}
