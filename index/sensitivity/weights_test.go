package sensitivity

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat"
)

func TestDirichletMoments(t *testing.T) {
	// The Dirichlet distribution with parameters α has marginal means
	// α_j/α0 and variances α_j(α0−α_j)/(α0²(α0+1)), α0 = Σα (Kotz,
	// Balakrishnan & Johnson 2000, Continuous Multivariate Distributions,
	// vol. 1, ch. 49; from memory). With α = c·w that is mean w_j and
	// variance w_j(1−w_j)/(c+1). Sample means and variances must lie within
	// 4 standard errors, the standard error of the variance taken from the
	// sample fourth central moment, sqrt((m4 − s⁴)/N).
	const draws = 20000
	for _, test := range []struct {
		name     string
		w        []float64
		settings Settings
		mean     []float64
		variance []float64
	}{
		{"c=50", []float64{0.5, 0.3, 0.2, 0}, Settings{},
			[]float64{0.5, 0.3, 0.2, 0},
			[]float64{0.5 * 0.5 / 51, 0.3 * 0.7 / 51, 0.2 * 0.8 / 51, 0}},
		// α_j = 2·0.05 = 0.1 is below gonum's 0.2 switch to the
		// small-shape gamma method.
		{"c=2 small shape", []float64{0.05, 0.95}, Settings{Concentration: 2},
			[]float64{0.05, 0.95},
			[]float64{0.05 * 0.95 / 3, 0.05 * 0.95 / 3}},
		// Uniform over the simplex of the three positive weights: Dirichlet
		// (1, 1, 1), mean 1/3 and variance 1·2/(9·4) = 1/18.
		{"uniform simplex", []float64{0.7, 0, 0.2, 0.1}, Settings{Sampling: UniformSimplex},
			[]float64{1.0 / 3, 0, 1.0 / 3, 1.0 / 3},
			[]float64{1.0 / 18, 0, 1.0 / 18, 1.0 / 18}},
	} {
		t.Run(test.name, func(t *testing.T) {
			ws, err := newWeightSampler(test.w, test.settings)
			if err != nil {
				t.Fatal(err)
			}
			k := len(test.w)
			cols := make([][]float64, k)
			w := make([]float64, k)
			var pcg rand.PCG
			for i := range draws {
				pcg.Seed(1, uint64(i))
				if !ws.draw(w, &pcg) {
					t.Fatal("draw failed")
				}
				var sum float64
				for j, x := range w {
					if x < 0 {
						t.Fatalf("draw %d: negative weight %g", i, x)
					}
					if test.w[j] == 0 && x != 0 {
						t.Fatalf("draw %d: weight %d has base 0 but drew %g", i, j, x)
					}
					sum += x
					cols[j] = append(cols[j], x)
				}
				if math.Abs(sum-1) > 1e-12 {
					t.Fatalf("draw %d sums to 1%+g", i, sum-1)
				}
			}
			for j, c := range cols {
				mean, variance := stat.PopMeanVariance(c, nil)
				m4 := stat.Moment(4, c, nil) // central
				seMean := math.Sqrt(test.variance[j] / draws)
				seVar := math.Sqrt(math.Max(m4-variance*variance, 0) / draws)
				if math.Abs(mean-test.mean[j]) > 4*seMean {
					t.Errorf("weight %d: mean %.6f, want %.6f ± %.2g", j, mean, test.mean[j], 4*seMean)
				}
				if math.Abs(variance-test.variance[j]) > 4*seVar {
					t.Errorf("weight %d: variance %.6g, want %.6g ± %.2g", j, variance, test.variance[j], 4*seVar)
				}
			}
		})
	}
}

func TestWeightBounds(t *testing.T) {
	w := []float64{0.5, 0.3, 0.2}
	bounds := []Bound{{0.4, 0.6}, {0.2, 0.4}, {0, 1}}
	ws, err := newWeightSampler(w, Settings{Bounds: bounds})
	if err != nil {
		t.Fatal(err)
	}
	x := make([]float64, 3)
	var pcg rand.PCG
	for i := range 2000 {
		pcg.Seed(7, uint64(i))
		if !ws.draw(x, &pcg) {
			t.Fatal("draw failed")
		}
		for j, b := range bounds {
			if x[j] < b.Lo || x[j] > b.Hi {
				t.Fatalf("draw %d: weight %d = %g outside [%g, %g]", i, j, x[j], b.Lo, b.Hi)
			}
		}
	}

	for _, test := range []struct {
		name   string
		w      []float64
		s      Settings
		prefix string
	}{
		{"count", w, Settings{Bounds: bounds[:2]}, "sensitivity: 2 weight bounds for 3 weights"},
		{"reversed", w, Settings{Bounds: []Bound{{0.6, 0.4}, {0, 1}, {0, 1}}}, "sensitivity: bounds of weight 0 are [0.6, 0.4]; want 0 <= lo <= hi <= 1"},
		{"sum", w, Settings{Bounds: []Bound{{0, 0.3}, {0, 0.3}, {0, 0.3}}}, "sensitivity: no weights within the bounds sum to 1"},
		{"zero base", []float64{0.5, 0.5, 0}, Settings{Bounds: []Bound{{0, 1}, {0, 1}, {0.1, 1}}}, "sensitivity: weight 2 has base weight 0, which stays 0, but its lower bound is 0.1"},
		// Feasible in principle, but c = 50 almost never reaches it.
		{"rare", w, Settings{Bounds: []Bound{{0, 0.05}, {0, 1}, {0, 1}}}, "sensitivity: only 0 of 1000 trial weight vectors fall within the bounds (need 10)"},
		{"concentration", w, Settings{Concentration: -1}, "sensitivity: Dirichlet concentration -1; want a finite value > 0"},
	} {
		t.Run(test.name, func(t *testing.T) {
			_, err := newWeightSampler(test.w, test.s)
			if err == nil || !strings.HasPrefix(err.Error(), test.prefix) {
				t.Errorf("error %v, want %q...", err, test.prefix)
			}
		})
	}
}
