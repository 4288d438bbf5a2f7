package events

import (
	"math"
	"testing"

	"rebound/index/calendar"
)

// gevSample is 30 values drawn once from a GEV (scipy 1.10.1
// stats.genextreme.rvs(c=-0.1, loc=100, scale=30, size=30,
// random_state=numpy.random.default_rng(42)), rounded to 3 decimals).
var gevSample = []float64{143.761, 105.881, 162.082, 132.229, 75.285, 234.397, 141.598, 145.916, 79.154, 106.860,
	100.238, 188.158, 125.649, 153.263, 106.266, 88.432, 116.279, 71.119, 154.350, 124.267,
	141.099, 98.913, 226.371, 173.079, 144.536, 85.579, 108.265, 67.667, 81.814, 130.375}

// TestFitGEV checks the L-moments and the fitted parameters against a numpy
// 1.24.2 computation of the same published formulas (Hosking 1990 unbiased
// PWMs; Hosking, Wallis & Wood 1985 shape approximation), and the fitted
// distribution's quantiles and CDF against scipy 1.10.1
// stats.genextreme.ppf/cdf with those parameters (scipy's c is Hosking's
// k).
func TestFitGEV(t *testing.T) {
	l1, l2, t3 := LMoments(gevSample)
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"l1", l1, 127.09606666666666}, {"l2", l2, 23.58876781609196}, {"t3", t3, 0.15084783052934295},
	} {
		if !close(c.got, c.want, 1e-9*math.Abs(c.want)) {
			t.Errorf("%s = %.12g, want %.12g (numpy)", c.name, c.got, c.want)
		}
	}
	g, err := FitGEV(gevSample)
	if err != nil {
		t.Fatal(err)
	}
	if !close(g.K, 0.030064796619037014, 1e-9) || !close(g.Alpha, 34.96355634954963, 1e-8) || !close(g.Xi, 107.92644866551822, 1e-8) {
		t.Errorf("fit %+v, want k 0.0300648 alpha 34.963556 xi 107.926449 (numpy)", g)
	}
	for _, q := range []struct{ T, want float64 }{
		{2, 120.67069954586141}, {10, 184.004669539744}, {50, 236.65393265774284}, {100, 258.1373921545253},
	} {
		if got := g.Quantile(1 - 1/q.T); !close(got, q.want, 1e-9*q.want) {
			t.Errorf("%g-year flood %.10g, want %.10g (scipy genextreme.ppf)", q.T, got, q.want)
		}
	}
	for _, c := range []struct{ x, want float64 }{{120, 0.49326030142547034}, {200, 0.9376825283734597}, {250, 0.986970092918327}} {
		if got := g.CDF(c.x); !close(got, c.want, 1e-12) {
			t.Errorf("F(%g) = %.15g, want %.15g (scipy genextreme.cdf)", c.x, got, c.want)
		}
	}
	if rp := g.ReturnPeriod(g.Quantile(0.98)); !close(rp, 50, 1e-9) {
		t.Errorf("return period of the 50-year quantile %v, want 50 (analytic)", rp)
	}
}

// TestGEVShapeApproximation checks the shape approximation against the
// exact L-skewness of a GEV, t3 = 2(1 − 3^−k)/(1 − 2^−k) − 3 (Hosking 1990):
// Hosking, Wallis & Wood (1985) state an error below 9×10⁻⁴ for
// −0.5 ≤ k ≤ 0.5 (from memory). The approximation is evaluated at the
// exact t3 of each k.
func TestGEVShapeApproximation(t *testing.T) {
	tau := func(k float64) float64 { return 2*(1-math.Pow(3, -k))/(1-math.Pow(2, -k)) - 3 }
	for k := -0.5; k <= 0.5001; k += 0.05 {
		if math.Abs(k) < 1e-9 {
			continue // t3 = ln 9/ln 2 − 3 in the limit; the formula is 0/0
		}
		t3 := tau(k)
		c := 2/(3+t3) - math.Ln2/math.Log(3)
		approx := 7.8590*c + 2.9554*c*c
		if d := math.Abs(approx - k); d > 9e-4 {
			t.Errorf("k = %.2f (t3 = %.4f): approximation %.6f, error %.2g > 9e-4", k, t3, approx, d)
		}
	}
}

// TestPlottingPositions: Gringorten's (n + 0.12)/(m − 0.44) by definition,
// and Weibull non-exceedance against scipy 1.10.1
// stats.rankdata(d, method="max")/(len(d)+1).
func TestPlottingPositions(t *testing.T) {
	if got := Gringorten(1, 30); !close(got, 30.12/0.56, 1e-12) {
		t.Errorf("Gringorten(1, 30) = %v", got)
	}
	d := []float64{9.0, 14.5, 16.0, 1.5, 14.5, 30.0}
	want := []float64{0.28571429, 0.57142857, 0.71428571, 0.14285714, 0.57142857, 0.85714286}
	for i, x := range d {
		if got := Weibull(d, x); !close(got, want[i], 1e-8) {
			t.Errorf("Weibull(%v) = %v, want %v", x, got, want[i])
		}
	}
}

// TestFitRefusals: the fit says why it cannot be made.
func TestFitRefusals(t *testing.T) {
	if _, err := FitGEV([]float64{1, 2}); err == nil {
		t.Error("two values fitted")
	}
	if _, err := FitGEV([]float64{5, 5, 5, 5}); err == nil {
		t.Error("constant sample fitted")
	}
	q := make([]float64, 5*365)
	for i := range q {
		q[i] = float64(i % 365)
	}
	evs := []Event{{Kind: FloodKind, DriverPeak: 300}}
	err := rateFloods(evs, q, calendar.New(2001, 1, 1), Severity{FitMinYears: 10, YearCoverage: 0.9})
	if err == nil || evs[0].Severity != Unrated || !math.IsNaN(evs[0].ReturnPeriod) {
		t.Errorf("short record: err %v, class %d, T %v; want an error and unrated", err, evs[0].Severity, evs[0].ReturnPeriod)
	}
}

// TestAnnualMaxima: by hand, two full calendar years and a third with 10
// days, skipped for coverage.
func TestAnnualMaxima(t *testing.T) {
	start := calendar.New(2001, 1, 1)
	n := 365 + 365 + 10
	q := make([]float64, n)
	q[100], q[400], q[735] = 7, 9, 50
	am, skipped := AnnualMaxima(q, start, false, 0.9)
	if len(am) != 2 || am[0] != 7 || am[1] != 9 || skipped != 1 {
		t.Errorf("got %v, %d skipped; want [7 9], 1", am, skipped)
	}
}
