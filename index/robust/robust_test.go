package robust

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestTheilSen(t *testing.T) {
	// Mann–Kendall worked example "A Mann-Kendall Example (By Hand)",
	// J. Little, College of the Holy Cross; slope from scipy.stats.theilslopes
	// 1.10.1: 0.5666666667 (median of the 91 pairwise slopes).
	y := []float64{12.9, 14.8, 13.2, 15.7, 13.8, 15.6, 12.9, 11.0, 17.3, 15.9, 19.0, 18.3, 20.1, 21.7}
	x := make([]float64, len(y))
	for i := range x {
		x[i] = float64(i + 1)
	}
	got, ok := TheilSen(x, y)
	if !ok || !scalar.EqualWithinAbs(got, 0.5666666667, 1e-9) {
		t.Errorf("TheilSen = %v, want 0.5666666667 (scipy)", got)
	}
	// Analytic: a straight line with one wild outlier keeps its slope.
	x2 := []float64{0, 0.1, 0.2, 0.3, 0.5, 0.8, 0.9}
	y2 := []float64{1, 1.2, 1.4, 1.6, 2.0, 100, 2.8}
	if got, _ := TheilSen(x2, y2); !scalar.EqualWithinAbs(got, 2, 1e-12) {
		t.Errorf("outlier: slope %v, want 2", got)
	}
	// Equal x values give no slope.
	if _, ok := TheilSen([]float64{1, 1, 1}, []float64{1, 2, 3}); ok {
		t.Error("all x equal: want ok = false")
	}
}

func TestQuantileType7(t *testing.T) {
	// lowflow40.csv (invented flows), numpy.percentile 'linear' (type 7):
	// 20th percentile 7.90, 10th percentile 6.95 (numpy 1.24.2).
	q := []float64{15, 14, 13, 12, 11, 9, 8, 7, 8, 9, 11, 10.5, 9.5, 8, 6, 5, 7, 12, 14, 13, 12, 11, 9, 9.5, 11, 12, 13,
		12, 11, 10.2, 8, 7, 6, 6.5, 7.5, 9, 11, 12, 12, 13}
	for _, tc := range []struct{ p, want float64 }{{0.2, 7.90}, {0.1, 6.95}, {0, 5.0}, {1, 15.0}} {
		if got := Quantile(q, tc.p); !scalar.EqualWithinAbs(got, tc.want, 1e-9) {
			t.Errorf("Quantile(%v) = %v, want %v", tc.p, got, tc.want)
		}
	}
	if got := Median([]float64{3, 1, 2, 10}); got != 2.5 {
		t.Errorf("median %v", got)
	}
	if !math.IsNaN(Median(nil)) {
		t.Error("median of nothing")
	}
}
