package rankstat

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat"
	"pgregory.net/rapid"
)

// The tied example: x = 1,2,2,3,4,5,5,5,6,7 and y = 2,1,3,3,5,4,6,6,8,7.
var (
	pairX = []float64{1, 2, 2, 3, 4, 5, 5, 5, 6, 7}
	pairY = []float64{2, 1, 3, 3, 5, 4, 6, 6, 8, 7}
)

func TestMidRanks(t *testing.T) {
	for _, test := range []struct {
		name string
		x    []float64
		want []float64
	}{
		// scipy.stats.rankdata 1.10.1, method "average".
		{"tied x", pairX, []float64{1, 2.5, 2.5, 4, 5, 7, 7, 7, 9, 10}},
		{"tied y", pairY, []float64{2, 1, 3.5, 3.5, 6, 5, 7.5, 7.5, 10, 9}},
		// By hand: NaN stays NaN, the others rank among themselves.
		{"nan", []float64{0.5, nan, -1, 0.5}, []float64{2.5, nan, 1, 2.5}},
	} {
		t.Run(test.name, func(t *testing.T) {
			got := MidRanks(nil, test.x)
			if !floats.Same(got, test.want) {
				t.Errorf("MidRanks = %v, want %v", got, test.want)
			}
		})
	}
}

func TestCorrelations(t *testing.T) {
	for _, test := range []struct {
		name            string
		x, y            []float64
		spearman, kendb float64
		tol             float64
	}{
		// scipy.stats.spearmanr and kendalltau 1.10.1; R 4.2.2 cor() and a
		// hand count of pairs (C = 37, D = 3, n1 = 4, n2 = 2) agree. The
		// no-ties shortcut 1 − 6Σd²/(n(n²−1)) would give 0.9272727.
		{"tied example", pairX, pairY, 0.9257365249, 0.8097533640, 1e-9},
		// Analytic: identical and reversed orders.
		{"identical", []float64{1, 2, 3, 4}, []float64{10, 20, 30, 40}, 1, 1, 1e-15},
		{"reversed", []float64{1, 2, 3, 4}, []float64{4, 3, 2, 1}, -1, -1, 1e-15},
		// Undefined: constant input, NaN input, fewer than two values.
		{"constant", []float64{1, 1, 1}, []float64{1, 2, 3}, nan, nan, 0},
		{"nan", []float64{1, nan, 3}, []float64{1, 2, 3}, nan, nan, 0},
		{"one", []float64{1}, []float64{2}, nan, nan, 0},
	} {
		t.Run(test.name, func(t *testing.T) {
			if got := Spearman(test.x, test.y); !same(got, test.spearman, test.tol) {
				t.Errorf("Spearman = %.10g, want %.10g", got, test.spearman)
			}
			if got := KendallTauB(test.x, test.y); !same(got, test.kendb, test.tol) {
				t.Errorf("KendallTauB = %.10g, want %.10g", got, test.kendb)
			}
		})
	}
	if got := Spearman(pairX, pairY); scalar.EqualWithinAbs(got, 0.9272727, 1e-6) {
		t.Errorf("Spearman = %.7f is the no-ties shortcut", got)
	}
}

func same(got, want, tol float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	return scalar.EqualWithinAbsOrRel(got, want, tol, tol)
}

// naiveTauB counts concordant, discordant and tied pairs one by one: the
// definition of tau-b.
func naiveTauB(x, y []float64) float64 {
	var c, d, tx, ty float64
	n := len(x)
	for i := range n {
		for j := i + 1; j < n; j++ {
			sx := sign(x[i] - x[j])
			sy := sign(y[i] - y[j])
			switch {
			case sx == 0 && sy == 0:
				tx++
				ty++
			case sx == 0:
				tx++
			case sy == 0:
				ty++
			case sx == sy:
				c++
			default:
				d++
			}
		}
	}
	n0 := float64(n*(n-1)) / 2
	return (c - d) / math.Sqrt((n0-tx)*(n0-ty))
}

func sign(v float64) int {
	switch {
	case v > 0:
		return 1
	case v < 0:
		return -1
	}
	return 0
}

// naiveMidRanks: 1 + (number smaller) + (number equal − 1)/2.
func naiveMidRanks(x []float64) []float64 {
	r := make([]float64, len(x))
	for i, v := range x {
		var less, eq float64
		for _, u := range x {
			if u < v {
				less++
			} else if u == v {
				eq++
			}
		}
		r[i] = 1 + less + (eq-1)/2
	}
	return r
}

func TestCorrelationProperties(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(2, 300).Draw(t, "n")
		levels := rapid.IntRange(1, 2*n).Draw(t, "levels")
		draw := rapid.SliceOfN(rapid.IntRange(0, levels), n, n)
		x := toFloat(draw.Draw(t, "x"))
		y := toFloat(draw.Draw(t, "y"))
		if got, want := KendallTauB(x, y), naiveTauB(x, y); !same(got, want, 1e-12) {
			t.Fatalf("KendallTauB = %v, pair count gives %v", got, want)
		}
		want := stat.Correlation(naiveMidRanks(x), naiveMidRanks(y), nil)
		if got := Spearman(x, y); !same(got, want, 1e-12) {
			t.Fatalf("Spearman = %v, Pearson of midranks gives %v", got, want)
		}
	})
}

func toFloat(v []int) []float64 {
	x := make([]float64, len(v))
	for i, u := range v {
		x[i] = float64(u)
	}
	return x
}

func TestInversions(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		a := rapid.SliceOf(rapid.Int32Range(0, 40)).Draw(t, "a")
		var want int64
		for i := range a {
			for j := i + 1; j < len(a); j++ {
				if a[i] > a[j] {
					want++
				}
			}
		}
		if got := inversions(append([]int32(nil), a...), make([]int32, len(a))); got != want {
			t.Fatalf("inversions = %d, want %d", got, want)
		}
	})
}

func BenchmarkKendall(b *testing.B) {
	for _, n := range []int{1000, 10_000, 100_000} {
		b.Run("n="+strconv.Itoa(n), func(b *testing.B) {
			rnd := rand.New(rand.NewPCG(1, 1))
			x := make([]float64, n)
			y := make([]float64, n)
			for i := range x {
				x[i] = rnd.Float64()
				y[i] = x[i] + 0.1*rnd.NormFloat64()
			}
			rx, ry := Ranks(nil, x), Ranks(nil, y)
			var k Kendall
			b.ReportAllocs()
			for b.Loop() {
				k.TauB(rx, ry)
			}
		})
	}
}

func TestCorrelationBounds(t *testing.T) {
	// Identical rankings correlate exactly 1 (analytic), not 1 plus a
	// rounding error; reversed ones exactly −1.
	for _, n := range []int{7, 100, 1001, 4097} {
		x := make([]float64, n)
		y := make([]float64, n)
		for i := range x {
			x[i] = float64((i * 7919) % n)
			y[i] = -x[i]
		}
		if got := KendallTauB(x, x); got != 1 {
			t.Errorf("n=%d: tau-b(x, x) = %v", n, got)
		}
		if got := Spearman(x, x); got != 1 {
			t.Errorf("n=%d: rho(x, x) = %v", n, got)
		}
		if got := KendallTauB(x, y); got != -1 {
			t.Errorf("n=%d: tau-b(x, −x) = %v", n, got)
		}
	}
}
