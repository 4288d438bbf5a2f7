package robust

import (
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"pgregory.net/rapid"
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

// lowflow40 is 40 days of invented discharge (m³/s).
var lowflow40 = []float64{15, 14, 13, 12, 11, 9, 8, 7, 8, 9, 11, 10.5, 9.5, 8, 6, 5, 7, 12, 14, 13, 12, 11, 9, 9.5, 11, 12,
	13, 12, 11, 10.2, 8, 7, 6, 6.5, 7.5, 9, 11, 12, 12, 13}

// flow60 is 60 days of invented discharge (m³/s) with two storms.
var flow60 = []float64{5, 4.8, 4.6, 4.5, 4.3, 4.2, 4.1, 4, 12, 25, 18, 12.5, 9, 7.2, 6.1, 5.5, 5.1, 4.8, 4.6, 4.4, 4.3, 4.2,
	4.1, 4, 3.9, 3.8, 3.8, 3.7, 6.5, 9.8, 30, 42, 28, 19, 13.5, 10.2, 8.4, 7.3, 6.6, 6.1, 5.7, 5.4, 5.2, 5, 4.9, 4.7, 4.6,
	4.5, 4.4, 4.3, 4.2, 4.1, 4.1, 4, 3.9, 3.9, 3.8, 3.7, 3.7, 3.6}

// TestQuantileNumpy checks every way to a quantile against numpy to the
// last bit: the want values are repr(float(numpy.quantile(x, p))), numpy
// 1.24.2, method "linear".
func TestQuantileNumpy(t *testing.T) {
	x8 := []float64{3, 1, 4, 1, 5, 9, 2, 6.5}
	tests := []struct {
		name string
		x    []float64
		p    float64
		want float64
	}{
		{"lowflow40 p0", lowflow40, 0, 5},
		{"lowflow40 p5", lowflow40, 0.05, 6},
		{"lowflow40 Q90", lowflow40, 0.1, 6.95},
		{"lowflow40 Q80", lowflow40, 0.2, 7.9},
		{"lowflow40 p33.3", lowflow40, 0.333, 9},
		{"lowflow40 median", lowflow40, 0.5, 10.75},
		{"lowflow40 p95", lowflow40, 0.95, 14},
		{"lowflow40 p100", lowflow40, 1, 15},
		{"flow60 p10", flow60, 0.1, 3.8},
		{"flow60 p50", flow60, 0.5, 4.65},
		{"flow60 p90", flow60, 0.9, 13.950000000000006},
		{"x8 p25", x8, 0.25, 1.75},
		{"x8 p37.5", x8, 0.375, 2.625},
		{"x8 p62.5", x8, 0.625, 4.375},
		{"x8 p90", x8, 0.9, 7.25},
		{"x8 p99", x8, 0.99, 8.825},
		{"flow10 p10", []float64{10, 12, 30, 22, 15, 11, 10, 25, 18, 12}, 0.1, 10},
		{"flow10 p90", []float64{10, 12, 30, 22, 15, 11, 10, 25, 18, 12}, 0.9, 25.5},
		// Where x(k) + t·(x(k+1) − x(k)) rounds differently (it gives
		// 19.205149999999993, 15.675199999999997, −5.455183999999999,
		// −5.1744, −26.0492 and 0.16999999999999998).
		{"from b, two values", []float64{-17.55, 34}, 0.713, 19.20515},
		{"from b, t 0.596", []float64{-23.78, 42.42}, 0.596, 15.6752},
		{"from b, t 0.6445", []float64{3.748, -22.14}, 0.6445, -5.455184000000002},
		{"from b, five values", []float64{31.8, -30.008, -14, 48.96, -2.8}, 0.447, -5.1743999999999994},
		{"from b, ties", []float64{-34.9, -34.9, -48.8, -24, -35.43}, 0.953, -26.049200000000003},
		{"from b, three values", []float64{0.1, 0.2, 0.3}, 0.35, 0.17},
		{"from a", []float64{0.1, 0.7}, 0.3, 0.28},
		{"one value", []float64{7.25}, 0.37, 7.25},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			x := slices.Clone(tc.x)
			sorted := slices.Sorted(slices.Values(tc.x))
			var sel Selection
			sel.Reset(slices.Clone(tc.x))
			for _, got := range []struct {
				how string
				v   float64
			}{
				{"Quantile", Quantile(x, tc.p)},
				{"SortedQuantile", SortedQuantile(sorted, tc.p)},
				{"SelectQuantile", SelectQuantile(slices.Clone(tc.x), tc.p)},
				{"Selection", sel.Quantile(tc.p)},
			} {
				if got.v != tc.want {
					t.Errorf("%s(%v) = %v, want %v", got.how, tc.p, got.v, tc.want)
				}
			}
			if !slices.Equal(x, tc.x) {
				t.Error("Quantile changed its input")
			}
		})
	}
}

func TestQuantileEdges(t *testing.T) {
	x := []float64{4, -1, 2}
	nan := math.NaN()
	// By definition: nothing or a NaN p gives NaN; p is clamped to [0, 1].
	for _, tc := range []struct {
		name string
		x    []float64
		p    float64
		want float64
	}{
		{"empty", nil, 0.5, nan},
		{"NaN p", x, nan, nan},
		{"p below 0", x, -0.3, -1},
		{"p above 1", x, 1.7, 4},
		{"+Inf p", x, math.Inf(1), 4},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var sel Selection
			sel.Reset(slices.Clone(tc.x))
			for _, got := range []float64{
				Quantile(tc.x, tc.p), SortedQuantile(slices.Sorted(slices.Values(tc.x)), tc.p),
				SelectQuantile(slices.Clone(tc.x), tc.p), sel.Quantile(tc.p),
			} {
				if !(got == tc.want || math.IsNaN(got) && math.IsNaN(tc.want)) {
					t.Errorf("got %v, want %v", got, tc.want)
				}
			}
		})
	}
	var zero Selection
	if !math.IsNaN(zero.Quantile(0.5)) {
		t.Error("zero Selection: want NaN")
	}
}

// sample draws either few distinct values, so many ties, or nearly all
// distinct ones.
func sample(t *rapid.T) []float64 {
	ties := rapid.SliceOfN(rapid.Map(rapid.IntRange(-20, 20), func(v int) float64 { return float64(v) / 4 }), 1, 400)
	distinct := rapid.SliceOfN(rapid.Float64Range(-1e3, 1e3), 1, 400)
	return rapid.OneOf(ties, distinct).Draw(t, "x")
}

// TestSelectProperty: after Select, x is a permutation of its values with
// the sorted k-th value at k, none larger before it and none smaller after.
func TestSelectProperty(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		x := sample(t)
		k := rapid.IntRange(0, len(x)-1).Draw(t, "k")
		sorted := slices.Sorted(slices.Values(x))
		v := Select(x, k)
		if v != sorted[k] || x[k] != v {
			t.Fatalf("Select(%d) = %v, x[k] = %v, want %v", k, v, x[k], sorted[k])
		}
		for i, w := range x {
			if i < k && w > v || i > k && w < v {
				t.Fatalf("x[%d] = %v on the wrong side of x[%d] = %v", i, w, k, v)
			}
		}
		if slices.Sort(x); !slices.Equal(x, sorted) {
			t.Fatal("not a permutation")
		}
	})
}

// TestSelectionProperty: selection gives the quantile of the sorted
// sample to the last bit, in any order of p, with and without reuse.
func TestSelectionProperty(t *testing.T) {
	var sel Selection
	rapid.Check(t, func(t *rapid.T) {
		x := sample(t)
		sorted := slices.Sorted(slices.Values(x))
		sel.Reset(slices.Clone(x))
		ps := rapid.SliceOfN(rapid.Float64Range(0, 1), 1, 8).Draw(t, "p")
		for _, p := range ps {
			want := SortedQuantile(sorted, p)
			if got := sel.Quantile(p); got != want {
				t.Fatalf("Selection.Quantile(%v) = %v, want %v", p, got, want)
			}
			if got := SelectQuantile(slices.Clone(x), p); got != want {
				t.Fatalf("SelectQuantile(%v) = %v, want %v", p, got, want)
			}
		}
	})
}

// TestSelectOrders runs selection on orders that trouble simple pivots.
func TestSelectOrders(t *testing.T) {
	const n = 1001
	orders := map[string]func(i int) float64{
		"ascending":  func(i int) float64 { return float64(i) },
		"descending": func(i int) float64 { return float64(n - i) },
		"equal":      func(i int) float64 { return 3 },
		"organ pipe": func(i int) float64 { return float64(min(i, n-1-i)) },
		"sawtooth":   func(i int) float64 { return float64(i % 17) },
	}
	for name, f := range orders {
		t.Run(name, func(t *testing.T) {
			x := make([]float64, n)
			for i := range x {
				x[i] = f(i)
			}
			sorted := slices.Sorted(slices.Values(x))
			for _, k := range []int{0, 1, n / 10, n / 2, n - 2, n - 1} {
				if got := Select(slices.Clone(x), k); got != sorted[k] {
					t.Errorf("Select(%d) = %v, want %v", k, got, sorted[k])
				}
			}
		})
	}
}

func TestPairwiseSlopes(t *testing.T) {
	// By hand: pairs (0,1), (0,2), (1,2), (1,3) and (2,3); x_0 = x_3, so
	// the pair (0,3) has no slope.
	x := []float64{0, 1, 3, 0}
	y := []float64{1, 3, 2, 4}
	want := []float64{2, 1.0 / 3, -0.5, -1, -2.0 / 3}
	buf := make([]float64, 1, 2)
	got := PairwiseSlopes(buf, x, y)
	if !slices.Equal(got, want) {
		t.Errorf("PairwiseSlopes = %v, want %v", got, want)
	}
	if got := PairwiseSlopes(nil, nil, nil); len(got) != 0 {
		t.Errorf("no pairs: %v", got)
	}
}
