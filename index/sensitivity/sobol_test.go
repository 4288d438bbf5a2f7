package sensitivity

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate/quad"
)

// ishigami is the Ishigami & Homma (1990) test function
// Y = sin X1 + a·sin²X2 + b·X3⁴·sin X1, with a = 7, b = 0.1.
func ishigami(dst, x []float64) {
	const a, b = 7, 0.1
	s2 := math.Sin(x[1])
	dst[0] = math.Sin(x[0]) + a*s2*s2 + b*math.Pow(x[2], 4)*math.Sin(x[0])
}

// gFunction is the Sobol g-function Π (|4x_i − 2| + a_i)/(1 + a_i) with
// the classic eight coefficients (Saltelli et al. 2010, p. 265).
var gCoefficients = []float64{0, 1, 4.5, 9, 99, 99, 99, 99}

func gFunction(dst, x []float64) {
	y := 1.0
	for i, a := range gCoefficients {
		y *= (math.Abs(4*x[i]-2) + a) / (1 + a)
	}
	dst[0] = y
}

func TestTestFunctions(t *testing.T) {
	// Spot values: f(π/2, π/2, 1) = 1 + 7 + 0.1 = 8.1 by hand, and numpy
	// 1.24.2 for the others.
	for _, test := range []struct {
		name string
		f    func(dst, x []float64)
		x    []float64
		want float64
	}{
		{"ishigami origin", ishigami, []float64{0, 0, 0}, 0},
		{"ishigami hand", ishigami, []float64{math.Pi / 2, math.Pi / 2, 1}, 8.1},
		{"ishigami numpy", ishigami, []float64{1, 2, 3}, 13.4451386348},
		{"g numpy", gFunction, []float64{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8}, 1.5688215391},
	} {
		y := make([]float64, 1)
		test.f(y, test.x)
		if !scalar.EqualWithinAbs(y[0], test.want, 1e-9) {
			t.Errorf("%s: %.10f, want %.10f", test.name, y[0], test.want)
		}
	}
}

func TestSobolAnalytic(t *testing.T) {
	// Monte Carlo estimates with N base rows: tolerance 5/√N, about five
	// times the estimators' standard error on these functions.
	pi := math.Pi
	for _, test := range []struct {
		name      string
		f         func(dst, x []float64)
		lo, hi    []float64
		n         int
		first     []float64
		total     []float64
		mean, vol float64
	}{
		// Analytic, Ishigami & Homma (1990) with a = 7, b = 0.1:
		// V = a²/8 + bπ⁴/5 + b²π⁸/18 + 1/2, V1 = (1 + bπ⁴/5)²/2, V2 = a²/8,
		// V13 = 8b²π⁸/225 (formulas as on the OpenTURNS and UQWorld pages).
		{"ishigami", ishigami, []float64{-pi, -pi, -pi}, []float64{pi, pi, pi}, 1 << 15,
			[]float64{0.3139051911, 0.4424111448, 0},
			[]float64{0.5575888552, 0.4424111448, 0.2436836641},
			3.5, 13.8445879407},
		// Analytic: V_i = 1/(3(1+a_i)²), V = Π(1+V_i) − 1, S_i = V_i/V,
		// ST_i = V_i Π_{j≠i}(1+V_j)/V (Saltelli et al. 2010); numbers from
		// numpy 1.24.2.
		{"g-function", gFunction, make([]float64, 8), []float64{1, 1, 1, 1, 1, 1, 1, 1}, 1 << 15,
			[]float64{0.71619217, 0.17904804, 0.023675774, 0.0071619217, 7.1619217e-5, 7.1619217e-5, 7.1619217e-5, 7.1619217e-5},
			[]float64{0.78714413, 0.24219819, 0.03431691, 0.010460387, 1.0494905e-4, 1.0494905e-4, 1.0494905e-4, 1.0494905e-4},
			1, 0.4654244319},
		// By hand: Y = 0.5X1 + 0.3X2 + 0.2X3, X ~ U(0,1): S = ST = w²/Σw²,
		// V = Σw²/12.
		{"additive", func(dst, x []float64) { dst[0] = 0.5*x[0] + 0.3*x[1] + 0.2*x[2] },
			[]float64{0, 0, 0}, []float64{1, 1, 1}, 1 << 14,
			[]float64{0.6578947368, 0.2368421053, 0.1052631579},
			[]float64{0.6578947368, 0.2368421053, 0.1052631579},
			0.5, 0.0316666667},
	} {
		t.Run(test.name, func(t *testing.T) {
			res, err := Sobol(test.f, test.lo, test.hi, 1, SobolSettings{N: test.n, Bootstrap: 200, Level: 0.99, Seed: 2024})
			if err != nil {
				t.Fatal(err)
			}
			tol := 5 / math.Sqrt(float64(test.n))
			for i := range test.first {
				if !scalar.EqualWithinAbs(res.First[i], test.first[i], tol) {
					t.Errorf("S%d = %.4f, want %.4f ± %.3f", i+1, res.First[i], test.first[i], tol)
				}
				if !scalar.EqualWithinAbs(res.Total[i], test.total[i], tol) {
					t.Errorf("ST%d = %.4f, want %.4f ± %.3f", i+1, res.Total[i], test.total[i], tol)
				}
				if !(res.FirstLo[i] <= res.First[i] && res.First[i] <= res.FirstHi[i]) {
					t.Errorf("S%d = %.4f outside its interval [%.4f, %.4f]", i+1, res.First[i], res.FirstLo[i], res.FirstHi[i])
				}
			}
			if !scalar.EqualWithinRel(res.Variance[0], test.vol, tol) || !scalar.EqualWithinAbsOrRel(res.Mean[0], test.mean, tol, tol) {
				t.Errorf("mean %.5f, variance %.5f, want %.5f, %.5f", res.Mean[0], res.Variance[0], test.mean, test.vol)
			}
			if res.Evaluations != 1+test.n*(len(test.lo)+2) {
				t.Errorf("%d model runs, want %d", res.Evaluations, 1+test.n*(len(test.lo)+2))
			}
		})
	}
}

func TestSobolIntervalsCover(t *testing.T) {
	// With this fixed seed, the 99 % bootstrap intervals of the additive
	// model (analytic S = ST = w²/Σw², by hand) cover the true values.
	want := []float64{0.6578947368, 0.2368421053, 0.1052631579}
	res, err := Sobol(func(dst, x []float64) { dst[0] = 0.5*x[0] + 0.3*x[1] + 0.2*x[2] },
		[]float64{0, 0, 0}, []float64{1, 1, 1}, 1, SobolSettings{N: 4096, Level: 0.99, Seed: 5})
	if err != nil {
		t.Fatal(err)
	}
	for i, w := range want {
		if !(res.FirstLo[i] <= w && w <= res.FirstHi[i]) || !(res.TotalLo[i] <= w && w <= res.TotalHi[i]) {
			t.Errorf("input %d: S in [%.4f, %.4f], ST in [%.4f, %.4f], want both to cover %.4f",
				i, res.FirstLo[i], res.FirstHi[i], res.TotalLo[i], res.TotalHi[i], w)
		}
	}
}

func TestSobolDeterministic(t *testing.T) {
	// Same seed, same results at any number of workers, including the
	// bootstrap; two outputs, one of them bootstrapped.
	f := func(dst, x []float64) {
		ishigami(dst, x)
		dst[1] = x[0] * x[1]
	}
	lo, hi := []float64{-1, -1, -1}, []float64{1, 1, 1}
	s := SobolSettings{N: 3000, Bootstrap: 100, IntervalOutputs: []int{1}, Seed: 9, Workers: 1}
	want, err := Sobol(f, lo, hi, 2, s)
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsNaN(want.FirstLo[0]) || math.IsNaN(want.FirstLo[3]) {
		t.Error("intervals on the wrong outputs")
	}
	for _, w := range []int{2, 3, 7} {
		s.Workers = w
		got, err := Sobol(f, lo, hi, 2, s)
		if err != nil {
			t.Fatal(err)
		}
		if fmt.Sprint(got) != fmt.Sprint(want) {
			t.Errorf("Workers = %d differs", w)
		}
	}
}

func TestSobolDegenerate(t *testing.T) {
	// An input fixed to one point has indices exactly 0 and costs no model
	// runs; a constant output has undefined (NaN) indices.
	f := func(dst, x []float64) {
		dst[0] = x[0] + x[1]*x[1]
		dst[1] = 4
	}
	res, err := Sobol(f, []float64{0, 0, 2}, []float64{1, 1, 2}, 2, SobolSettings{N: 500, Bootstrap: -1})
	if err != nil {
		t.Fatal(err)
	}
	if res.First[2] != 0 || res.Total[2] != 0 {
		t.Errorf("fixed input: S = %v, ST = %v, want 0", res.First[2], res.Total[2])
	}
	if res.Evaluations != 1+500*4 {
		t.Errorf("%d model runs, want %d", res.Evaluations, 1+500*4)
	}
	for _, x := range res.FirstOrder(1) {
		if !math.IsNaN(x) {
			t.Errorf("constant output: S = %v, want NaN", res.FirstOrder(1))
		}
	}
	if !math.IsNaN(res.FirstLo[0]) {
		t.Error("intervals without bootstrap")
	}
}

func TestSobolErrors(t *testing.T) {
	f := func(dst, x []float64) { dst[0] = x[0] }
	for _, test := range []struct {
		name   string
		lo, hi []float64
		out    int
		s      SobolSettings
		want   string
	}{
		{"no inputs", nil, nil, 1, SobolSettings{}, "sensitivity: Sobol indices need at least one input"},
		{"outputs", []float64{0}, []float64{1}, 0, SobolSettings{}, "sensitivity: 0 model outputs; want at least 1"},
		{"range", []float64{1}, []float64{0}, 1, SobolSettings{}, "sensitivity: input 0 has range [1, 0]; want finite lo <= hi"},
		{"rows", []float64{0}, []float64{1}, 1, SobolSettings{N: 1}, "sensitivity: 1 base samples; want at least 2"},
		{"level", []float64{0}, []float64{1}, 1, SobolSettings{Level: 1.5}, "sensitivity: confidence level 1.5; want a level strictly between 0 and 1"},
		{"interval output", []float64{0}, []float64{1}, 1, SobolSettings{IntervalOutputs: []int{1}}, "sensitivity: interval output 1 is not one of the 1 outputs"},
	} {
		t.Run(test.name, func(t *testing.T) {
			_, err := Sobol(f, test.lo, test.hi, test.out, test.s)
			if err == nil || err.Error() != test.want {
				t.Errorf("error %v, want %q", err, test.want)
			}
		})
	}
}

func TestWeightIndices(t *testing.T) {
	// Two indicators with base weights 0.5/0.5 and spread 0.5: the raw
	// weights u1, u2 are uniform in [0.25, 0.75]. A station with values
	// (1, 0) has composite Y = u1/(u1+u2). Its indices come from numerical
	// integration (gonum integrate/quad, Gauss–Legendre), independent of
	// the estimator:
	//   E[Y | u1] = 2·u1·ln((u1 + 0.75)/(u1 + 0.25)),
	//   S1 = Var(E[Y|u1]) / Var(Y),  ST1 = E[Var(Y | u2)] / Var(Y),
	// and by symmetry S2 = S1, ST2 = ST1.
	const a, b = 0.25, 0.75
	mean := func(f func(float64) float64) float64 { return quad.Fixed(f, a, b, 60, quad.Legendre{}, 0) / (b - a) }
	y := func(u1, u2 float64) float64 { return u1 / (u1 + u2) }
	ey := mean(func(u1 float64) float64 { return mean(func(u2 float64) float64 { return y(u1, u2) }) })
	vy := mean(func(u1 float64) float64 {
		return mean(func(u2 float64) float64 { return (y(u1, u2) - ey) * (y(u1, u2) - ey) })
	})
	condMean := func(u1 float64) float64 { return 2 * u1 * math.Log((u1+b)/(u1+a)) }
	s1 := mean(func(u1 float64) float64 { return (condMean(u1) - ey) * (condMean(u1) - ey) }) / vy
	st1 := mean(func(u2 float64) float64 {
		m := mean(func(u1 float64) float64 { return y(u1, u2) })
		return mean(func(u1 float64) float64 { return (y(u1, u2) - m) * (y(u1, u2) - m) })
	}) / vy

	m := Model{
		Values: []float64{
			1, 0, // the station above
			0, 1,
			0.95, nan, // one value: constant composite, always first
			0.1, 0.1, // constant composite, always last
		},
		Weights: []float64{0.5, 0.5},
	}
	const n = 8192
	res, err := WeightIndices(m, Settings{BaseSamples: n, Bootstrap: 100, Seed: 4})
	if err != nil {
		t.Fatal(err)
	}
	tol := 5 / math.Sqrt(n)
	for i := range 2 {
		if !scalar.EqualWithinAbs(res.FirstOrder(0)[i], s1, tol) || !scalar.EqualWithinAbs(res.TotalOrder(0)[i], st1, tol) {
			t.Errorf("weight %d: S = %.4f, ST = %.4f, want %.4f, %.4f ± %.3f", i, res.FirstOrder(0)[i], res.TotalOrder(0)[i], s1, st1, tol)
		}
	}
	if !scalar.EqualWithinRel(res.Variance[0], vy, tol) {
		t.Errorf("variance %.6g, want %.6g", res.Variance[0], vy)
	}
	for _, st := range []int{2, 3} {
		if s := res.FirstOrder(st); !math.IsNaN(s[0]) || !math.IsNaN(s[1]) {
			t.Errorf("station %d has a constant composite but indices %v", st, s)
		}
	}
	// Output 4 is the mean absolute rank shift. Stations 0 and 1 tie at
	// rank 2 under the base weights; any other weights put one of them at
	// rank 3, so the output is 1/4 whatever the weights, and its indices
	// are undefined.
	if res.Outputs != 5 || res.Mean[4] != 0.25 || res.Variance[4] != 0 || !math.IsNaN(res.First[4*2]) {
		t.Errorf("rank shift output: %d outputs, mean %v, variance %v, S %v; want 5, 0.25, 0, NaN",
			res.Outputs, res.Mean[4], res.Variance[4], res.FirstOrder(4))
	}
	// Station outputs get intervals only when asked for.
	if !math.IsNaN(res.FirstLo[0]) {
		t.Error("station intervals without StationIntervals")
	}
	res, err = WeightIndices(m, Settings{BaseSamples: 500, Bootstrap: 50, StationIntervals: true})
	if err != nil {
		t.Fatal(err)
	}
	if math.IsNaN(res.FirstLo[0]) || !math.IsNaN(res.FirstLo[2*2]) {
		t.Errorf("station intervals %v, want them on station 0 and NaN on constant station 2", res.FirstLo)
	}
	if _, err := WeightIndices(m, Settings{Spread: 1.5}); err == nil {
		t.Error("no error for a spread of 1.5")
	}
}

func TestWeightIndicesDeterministic(t *testing.T) {
	m := Model{Values: invented(3, 40, 4, 0, 11), Weights: []float64{0.4, 0.3, 0.2, 0.1}, Aggregation: Geometric}
	s := Settings{BaseSamples: 300, Bootstrap: 50, StationIntervals: true, Seed: 1, Workers: 1}
	want, err := WeightIndices(m, s)
	if err != nil {
		t.Fatal(err)
	}
	s.Workers = 3
	got, err := WeightIndices(m, s)
	if err != nil {
		t.Fatal(err)
	}
	if fmt.Sprint(got) != fmt.Sprint(want) {
		t.Error("Workers 1 and 3 differ")
	}
}
