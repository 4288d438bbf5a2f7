package features

import (
	"encoding/csv"
	"math"
	"math/rand/v2"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	gstat "gonum.org/v1/gonum/stat"

	"rebound/index/calendar"
)

var nan = math.NaN()

// flow10 is an invented 10-day flow series (m³/s).
var flow10 = []float64{10, 12, 30, 22, 15, 11, 10, 25, 18, 12}

// readColumn reads column col of a CSV file in testdata, after its header.
func readColumn(t testing.TB, name string, col int) []float64 {
	t.Helper()
	f, err := os.Open("testdata/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	var out []float64
	for _, r := range recs[1:] {
		x, err := strconv.ParseFloat(r[col], 64)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, x)
	}
	return out
}

func near(got, want, tol float64) bool {
	return scalar.EqualWithinAbsOrRel(got, want, tol, tol)
}

func TestFlashiness(t *testing.T) {
	flow60 := readColumn(t, "flow60.csv", 1)
	tests := []struct {
		name string
		q    []float64
		want float64
		tol  float64
	}{
		// Baker et al. (2004) index with the first day out of the
		// denominator: 68/155, numpy 1.24.2 (reference script).
		{"flow10", flow10, 0.4387096774, 1e-10},
		// Path length 120.0 and flows of days 2..60 summing to 451.6 (numpy
		// 1.24.2): 120/451.6.
		{"flow60", flow60, 120 / 451.6, 1e-12},
		// A gap removes the pairs on either side: |12−10| / 12 (by hand).
		{"gap", []float64{10, 12, nan, 30}, 2.0 / 12, 1e-15},
		{"no pairs", []float64{1, nan, 2}, nan, 0},
		{"zero flow", []float64{0, 0, 0}, nan, 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := Flashiness(tc.q)
			if math.IsNaN(tc.want) != math.IsNaN(got) || !math.IsNaN(got) && !near(got, tc.want, tc.tol) {
				t.Errorf("Flashiness = %.12g, want %.12g", got, tc.want)
			}
		})
	}
}

func TestLag1(t *testing.T) {
	flow60 := readColumn(t, "flow60.csv", 1)
	tests := []struct {
		name string
		x    []float64
		want float64
	}{
		// Pearson correlation of x[:-1] with x[1:], numpy 1.24.2 corrcoef.
		{"flow10", flow10, 0.0634772654},
		{"flow60", flow60, 0.8067257209},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := Lag1(tc.x); !near(got, tc.want, 1e-9) {
				t.Errorf("Lag1 = %.10f, want %.10f", got, tc.want)
			}
		})
	}
	// Pairs that span a missing day are skipped: with day 3 missing, the
	// pairs are (10,12), (22,15), (15,11), ..., the same as numpy corrcoef
	// of those pairs (gonum gstat.Correlation here).
	x := append([]float64(nil), flow10...)
	x[2] = nan
	a := []float64{10, 22, 15, 11, 10, 25, 18}
	b := []float64{12, 15, 11, 10, 25, 18, 12}
	if got, want := Lag1(x), gstat.Correlation(a, b, nil); !near(got, want, 1e-12) {
		t.Errorf("Lag1 with a gap = %v, want %v", got, want)
	}
}

func TestMoments(t *testing.T) {
	flow60 := readColumn(t, "flow60.csv", 1)
	tests := []struct {
		name           string
		x              []float64
		mean, sd, skew float64
	}{
		// pandas 1.5.3 Series.mean/std/skew (scipy 1.10.1 stats.skew with
		// bias=False gives the same skewness for flow10).
		{"flow10", flow10, 16.5, 7.027722880769338, 0.9375531738798732},
		{"flow60", flow60, 7.61, 7.340639144573684, 2.9772344537205733},
		// By hand: n = 2 has no skewness; constant data none either.
		{"two", []float64{1, nan, 3}, 2, math.Sqrt2, nan},
		{"constant", []float64{4, 4, 4, 4}, 4, 0, nan},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m, s, g, _ := Moments(tc.x)
			if !near(m, tc.mean, 1e-12) || !near(s, tc.sd, 1e-12) {
				t.Errorf("mean, sd = %v, %v, want %v, %v", m, s, tc.mean, tc.sd)
			}
			if math.IsNaN(tc.skew) != math.IsNaN(g) || !math.IsNaN(g) && !near(g, tc.skew, 1e-12) {
				t.Errorf("skew = %v, want %v", g, tc.skew)
			}
		})
	}
	// gonum gstat.Skew is the same estimator (n/((n−1)(n−2)) Σ z³).
	rng := rand.New(rand.NewPCG(1, 2))
	x := make([]float64, 500)
	for i := range x {
		x[i] = math.Exp(rng.NormFloat64())
	}
	if _, _, g, _ := Moments(x); !near(g, gstat.Skew(x, nil), 1e-12) {
		t.Errorf("skew %v, gonum %v", g, gstat.Skew(x, nil))
	}
}

func TestQuantile(t *testing.T) {
	lowflow := readColumn(t, "lowflow40.csv", 1)
	flow60 := readColumn(t, "flow60.csv", 1)
	tests := []struct {
		name string
		p    float64
		x    []float64
		want float64
	}{
		// numpy 1.24.2 numpy.percentile, method "linear" (Hyndman & Fan type 7).
		{"lowflow40 Q90", 0.10, lowflow, 6.95},
		{"lowflow40 Q80", 0.20, lowflow, 7.90},
		{"lowflow40 median", 0.50, lowflow, 10.75},
		{"flow60 p10", 0.10, flow60, 3.8},
		{"flow60 p50", 0.50, flow60, 4.65},
		{"flow60 p90", 0.90, flow60, 13.95},
		{"flow10 p10", 0.10, flow10, 10},
		{"flow10 p90", 0.90, flow10, 25.5},
		// By hand: ends, a single value, NaN skipped.
		{"min", 0, flow10, 10},
		{"max", 1, flow10, 30},
		{"one", 0.3, []float64{nan, 7}, 7},
		{"none", 0.5, []float64{nan}, nan},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := Quantile(tc.p, tc.x)
			if math.IsNaN(tc.want) != math.IsNaN(got) || !math.IsNaN(got) && !near(got, tc.want, 1e-12) {
				t.Errorf("Quantile(%v) = %v, want %v", tc.p, got, tc.want)
			}
		})
	}
	// Selection agrees with sorting (gonum stat.Quantile with sorted input
	// is not type 7, so compare with the formula on a sorted copy).
	rng := rand.New(rand.NewPCG(3, 4))
	for range 200 {
		n := 1 + rng.IntN(60)
		x := make([]float64, n)
		for i := range x {
			x[i] = float64(rng.IntN(10)) // many ties
		}
		s := append([]float64(nil), x...)
		sortFloats(s)
		p := rng.Float64()
		h := float64(n-1) * p
		lo := int(h)
		want := s[lo]
		if lo+1 < n {
			want += (h - float64(lo)) * (s[lo+1] - s[lo])
		}
		if got := Quantile(p, x); !near(got, want, 1e-12) {
			t.Fatalf("Quantile(%v, %v) = %v, want %v", p, x, got, want)
		}
	}
}

func sortFloats(x []float64) {
	for i := 1; i < len(x); i++ {
		for j := i; j > 0 && x[j] < x[j-1]; j-- {
			x[j], x[j-1] = x[j-1], x[j]
		}
	}
}

func TestFitHarmonic(t *testing.T) {
	// Noise-free: y = 12 + 8 cos(ω(t − 200)), t = 0..1095 (analytic; numpy
	// 1.24.2 lstsq gives a = −7.6453064432, b = −2.3556929743).
	var tt, y []float64
	for i := range 1096 {
		tt = append(tt, float64(i))
		y = append(y, 12+8*math.Cos(Omega*(float64(i)-200)))
	}
	h, ok := FitHarmonic(tt, y)
	if !ok || !near(h.Mean, 12, 1e-9) || !near(h.Amplitude(), 8, 1e-9) || !near(h.PeakDay(), 200, 1e-9) ||
		!near(h.Cos, -7.6453064432, 1e-9) || !near(h.Sin, -2.3556929743, 1e-9) {
		t.Errorf("noise-free fit %+v, amplitude %v, peak %v", h, h.Amplitude(), h.PeakDay())
	}
	// The daily fit with the 1461-day table agrees.
	hd, ok := fitDaily(0, y)
	if !ok || !near(hd.Mean, h.Mean, 1e-12) || !near(hd.Cos, h.Cos, 1e-12) || !near(hd.Sin, h.Sin, 1e-12) {
		t.Errorf("daily fit %+v, want %+v", hd, h)
	}

	// harmonic12.csv, 12 irregular days: numpy 1.24.2 numpy.linalg.lstsq.
	t12 := readColumn(t, "harmonic12.csv", 0)
	y12 := readColumn(t, "harmonic12.csv", 1)
	h, ok = FitHarmonic(t12, y12)
	const tol = 1e-8
	if !ok || !near(h.Mean, 12.0001960476, tol) || !near(h.Cos, -7.6315695956, tol) || !near(h.Sin, -2.3987724385, tol) ||
		!near(h.Amplitude(), 7.9996852253, tol) || !near(h.PeakDay(), 200.3285616745, tol) {
		t.Errorf("harmonic12 fit %+v, amplitude %.10f, peak %.10f", h, h.Amplitude(), h.PeakDay())
	}
	if _, ok := FitHarmonic([]float64{1, 2}, []float64{1, 2}); ok {
		t.Error("two points: ok")
	}
	if _, ok := FitHarmonic([]float64{5, 5 + 1461, 5 + 2*1461}, []float64{1, 2, 3}); ok {
		t.Error("one day of the cycle: ok")
	}
}

// The table-based daily fit matches FitHarmonic at dates far from 1970 and
// before it.
func TestFitDaily(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, start := range []calendar.Date{calendar.New(1991, 1, 1), calendar.New(1950, 3, 7), calendar.New(2023, 12, 31)} {
		y := make([]float64, 900)
		tt := make([]float64, 900)
		for i := range y {
			tt[i] = float64(int(start) + i)
			y[i] = 10 + 5*math.Sin(Omega*tt[i]+1) + rng.NormFloat64()
			if rng.IntN(5) == 0 {
				y[i] = nan
			}
		}
		want, _ := FitHarmonic(tt, y)
		got, _ := fitDaily(start, y)
		if !near(got.Mean, want.Mean, 1e-10) || !near(got.Cos, want.Cos, 1e-10) || !near(got.Sin, want.Sin, 1e-10) {
			t.Errorf("start %v: daily %+v, want %+v", start, got, want)
		}
		a := anomalies(make([]float64, len(y)), start, y, got)
		for i, v := range y {
			if w := v - got.At(tt[i]); math.IsNaN(v) != math.IsNaN(a[i]) || !math.IsNaN(v) && !near(a[i], w, 1e-10) {
				t.Fatalf("anomaly %d = %v, want %v", i, a[i], w)
			}
		}
	}
}

func TestLyneHollick(t *testing.T) {
	q := readColumn(t, "flow60.csv", 1)
	bfi := func(b []float64) float64 { return sum(b) / sum(q) }
	// Check values from an independent numpy 1.24.2 implementation of each
	// start-up (Ladson et al. 2013 reflection recipe, cross-checked with an
	// R 4.2.2 port); days are 1-based.
	tests := []struct {
		name string
		lh   LyneHollick
		bfi  float64
		days []int
		want []float64
	}{
		{"reflect 30, 3 passes", LyneHollick{}, 0.5599900997,
			[]int{1, 2, 3, 4, 29, 30, 31, 32},
			[]float64{3.708369, 3.797741, 3.865410, 3.916755, 4.420481, 4.522751, 4.663705, 4.834972}},
		{"no reflection, 3 passes", LyneHollick{Reflect: -1}, 0.5719903893,
			[]int{9, 10, 11, 12}, []float64{4.722757, 4.778533, 4.864248, 4.936837}},
		// One forward pass from zero quickflow, checkable by hand.
		{"one pass", LyneHollick{Reflect: -1, Passes: 1}, 0.7168703209,
			[]int{1, 8, 9, 10, 11, 12}, []float64{5.0, 4.0, 4.985790, 5.999355, 7.161904, 7.768511}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			b := tc.lh.Baseflow(make([]float64, len(q)), q)
			if got := bfi(b); !near(got, tc.bfi, 1e-9) {
				t.Errorf("BFI = %.10f, want %.10f", got, tc.bfi)
			}
			for i, d := range tc.days {
				if !near(b[d-1], tc.want[i], 1e-6) {
					t.Errorf("baseflow day %d = %.6f, want %.6f", d, b[d-1], tc.want[i])
				}
			}
			for i := range b {
				if b[i] < 0 || b[i] > q[i]+1e-12 {
					t.Errorf("baseflow day %d = %v outside [0, %v]", i+1, b[i], q[i])
				}
			}
		})
	}
	// A record shorter than the reflection is mirrored as far as it goes.
	short := LyneHollick{}.Baseflow(make([]float64, 5), q[:5])
	if math.IsNaN(sum(short)) {
		t.Error("short record: NaN")
	}
}

func sum(x []float64) float64 {
	s := 0.0
	for _, v := range x {
		s += v
	}
	return s
}

func TestThermalSensitivity(t *testing.T) {
	// Water = 4 + 0.65·air on every day gives weekly means on the same line,
	// slope 0.65 exactly (analytic), whatever days are missing.
	rng := rand.New(rand.NewPCG(7, 8))
	air := make([]float64, 700)
	water := make([]float64, 700)
	for i := range air {
		air[i] = 10 + 10*math.Sin(Omega*float64(i)) + 3*rng.NormFloat64()
		water[i] = 4 + 0.65*air[i]
		if rng.IntN(4) == 0 {
			water[i] = nan
		}
		if rng.IntN(6) == 0 {
			air[i] = nan
		}
	}
	if got := ThermalSensitivity(water, air); !near(got, 0.65, 1e-12) {
		t.Errorf("slope %v, want 0.65", got)
	}
	// Three weeks by hand, air means 1, 2, 4 and water means 1, 3, 4; a
	// fourth week has 4 paired days only and is ignored.
	w := []float64{}
	a := []float64{}
	for k, p := range [][2]float64{{1, 1}, {2, 3}, {4, 4}, {100, -100}} {
		for d := range 7 {
			wa, aa := p[1], p[0]
			if k == 3 && d >= 4 {
				wa = nan
			}
			w = append(w, wa)
			a = append(a, aa)
		}
	}
	// x̄ = 7/3, ȳ = 8/3; Σdx·dy = (−4/3)(−5/3) + (−1/3)(1/3) + (5/3)(4/3) = 39/9;
	// Σdx² = 16/9 + 1/9 + 25/9 = 42/9; slope = 39/42.
	if got := ThermalSensitivity(w, a); !near(got, 39.0/42, 1e-12) {
		t.Errorf("hand case %v, want %v", got, 39.0/42)
	}
	if got := ThermalSensitivity(w[:14], a[:14]); !math.IsNaN(got) {
		t.Errorf("two weeks: %v, want NaN", got)
	}
}

func TestLagOfMaxCorrelation(t *testing.T) {
	// y[t] = x[t−4] exactly: correlation 1 at lag 4 (analytic).
	rng := rand.New(rand.NewPCG(9, 10))
	x := make([]float64, 400)
	for i := range x {
		x[i] = rng.NormFloat64()
		if i > 0 {
			x[i] += 0.7 * x[i-1]
		}
	}
	y := make([]float64, len(x))
	for i := range y {
		y[i] = nan
		if i >= 4 {
			y[i] = x[i-4]
		}
	}
	x[100], y[250] = nan, nan
	lag, r := LagOfMaxCorrelation(x, y, 10)
	if lag != 4 || !near(r, 1, 1e-12) {
		t.Errorf("lag %d r %v, want 4, 1", lag, r)
	}
	if lag, r := LagOfMaxCorrelation(x, y, 3); lag == 4 || r >= 1 {
		t.Errorf("max lag 3: lag %d r %v", lag, r)
	}
	if lag, _ := LagOfMaxCorrelation([]float64{nan, 1}, []float64{1, nan}, 2); lag != -1 {
		t.Errorf("no pairs: lag %d, want -1", lag)
	}
	// A series that alternates 1, −1 correlates exactly 1 with itself at
	// lags 0 and 2 (analytic, and exact in floating point: the sums are
	// integers): the tie goes to the smaller lag.
	alt := make([]float64, 20)
	for i := range alt {
		alt[i] = float64(1 - 2*(i%2))
	}
	if lag, r := LagOfMaxCorrelation(alt, alt, 3); lag != 0 || r != 1 {
		t.Errorf("tie at lags 0 and 2: lag %d r %v, want 0, 1", lag, r)
	}
}
