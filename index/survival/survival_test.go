package survival

import (
	"math"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// Remission times in weeks of the 6-MP group of Freireich et al. (1963),
// Blood 21:699–716, the textbook Kaplan–Meier example (reproduced e.g. in
// Kleinbaum & Klein, Survival Analysis: A Self-Learning Text). false marks a
// censored time.
var sixMP = struct {
	t   []float64
	obs []bool
}{
	t: []float64{6, 6, 6, 6, 7, 9, 10, 10, 11, 13, 16, 17, 19, 20, 22, 23, 25, 32, 32, 34, 35},
	obs: []bool{true, true, true, false, true, false, true, false, false, true, true, false, false,
		false, true, true, false, false, false, false, false},
}

func TestKaplanMeierSixMP(t *testing.T) {
	c := KaplanMeier(sixMP.t, sixMP.obs)
	// Product-limit values at the event times, worked by hand:
	// 18/21, ·16/17, ·14/15, ·11/12, ·10/11, ·6/7, ·5/6. They match the
	// textbook table (0.857, 0.807, 0.753, 0.690, 0.627, 0.538, 0.448).
	want := []struct {
		t, s   float64
		atRisk int
	}{
		{6, 18.0 / 21, 21},
		{7, 18.0 / 21 * 16 / 17, 17},
		{10, 18.0 / 21 * 16 / 17 * 14 / 15, 15},
		{13, 18.0 / 21 * 16 / 17 * 14 / 15 * 11 / 12, 12},
		{16, 18.0 / 21 * 16 / 17 * 14 / 15 * 11 / 12 * 10 / 11, 11},
		{22, 18.0 / 21 * 16 / 17 * 14 / 15 * 11 / 12 * 10 / 11 * 6 / 7, 7},
		{23, 18.0 / 21 * 16 / 17 * 14 / 15 * 11 / 12 * 10 / 11 * 6 / 7 * 5 / 6, 6},
	}
	if len(c.Times) != len(want) {
		t.Fatalf("times %v", c.Times)
	}
	for i, w := range want {
		if c.Times[i] != w.t || !scalar.EqualWithinAbs(c.S[i], w.s, 1e-12) || c.AtRisk[i] != w.atRisk {
			t.Errorf("step %d: t=%v S=%v n=%d, want t=%v S=%v n=%d", i, c.Times[i], c.S[i], c.AtRisk[i], w.t, w.s, w.atRisk)
		}
	}
	for _, tc := range []struct{ t, s float64 }{{0, 1}, {5.9, 1}, {6, 0.857142857142857}, {8, 0.8067226890756302}, {40, 0.4481792717086834}} {
		if got := c.At(tc.t); !scalar.EqualWithinAbs(got, tc.s, 1e-12) {
			t.Errorf("S(%v) = %v, want %v", tc.t, got, tc.s)
		}
	}
	// Median remission time 23 weeks: the textbook value.
	if m, ok := c.Median(); !ok || m != 23 {
		t.Errorf("median = %v, %v; want 23", m, ok)
	}
	// RMST to the last follow-up (35 weeks), by hand as the sum of
	// S × interval: 6 + 0.857143 + 3(0.806723 + 0.752941 + 0.690196)
	// + 6(0.627451) + 0.537815 + 12(0.448179) = 23.287395.
	if got := c.RMST(35); !scalar.EqualWithinAbs(got, 23.287395, 1e-6) {
		t.Errorf("RMST(35) = %v, want 23.287395", got)
	}
	if c.MaxTime != 35 || c.N != 21 {
		t.Errorf("MaxTime %v N %d", c.MaxTime, c.N)
	}
}

func TestMedianUndefined(t *testing.T) {
	// Three of four still impaired: S never reaches 0.5 (S = 3/4 after t = 2).
	c := KaplanMeier([]float64{2, 5, 9, 12}, []bool{true, false, false, false})
	if _, ok := c.Median(); ok {
		t.Fatal("median should be undefined")
	}
	// Analytic: 2·1 + (12 − 2)·0.75 = 9.5.
	if got := c.RMST(c.MaxTime); got != 9.5 {
		t.Errorf("RMST = %v, want 9.5", got)
	}
}

func TestNoCensoring(t *testing.T) {
	// Without censoring the KM curve is the empirical survival function and
	// the RMST to beyond the largest time is the sample mean (analytic).
	times := []float64{3, 1, 4, 1, 5, 9, 2, 6}
	obs := make([]bool, len(times))
	for i := range obs {
		obs[i] = true
	}
	c := KaplanMeier(times, obs)
	if got := c.RMST(100); !scalar.EqualWithinAbs(got, 31.0/8, 1e-12) {
		t.Errorf("RMST = %v, want mean 3.875", got)
	}
	// Sorted: 1 1 2 3 4 5 6 9; S(3) = 4/8, so the median is 3.
	if m, _ := c.Median(); m != 3 {
		t.Errorf("median %v, want 3", m)
	}
	if got := KaplanMeier(nil, nil); got.N != 0 || !math.IsNaN(must(got.Median())) {
		t.Error("empty curve")
	}
}

func must(x float64, _ bool) float64 { return x }

func BenchmarkKaplanMeier(b *testing.B) {
	for _, n := range []int{10, 100, 1000} {
		times := make([]float64, n)
		obs := make([]bool, n)
		for i := range times {
			times[i] = float64((i * 7919) % 97)
			obs[i] = i%3 != 0
		}
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				KaplanMeier(times, obs)
			}
		})
	}
}
