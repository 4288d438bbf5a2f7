package sensitivity

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"

	"rebound/index/rankstat"
)

var nan = math.NaN()

// workedValues are the min–max normalised values of the four invented
// units A–D of the composite-indicator worked example (peak departure and
// recovery days, higher = worse; baseflow index, higher = better), every
// column oriented so that higher = more resilient, as Nardo et al. (2008)
// normalise. Weights 0.5/0.3/0.2.
var (
	workedValues = []float64{
		0.8888888889, 1, 1, // A
		1, 0, 0.875, // B
		0.6666666667, 0.7575757576, 0.625, // C
		0, 0.1515151515, 0, // D
	}
	workedWeights = []float64{0.5, 0.3, 0.2}
)

func TestComposite(t *testing.T) {
	for _, test := range []struct {
		name  string
		v, w  []float64
		agg   Aggregation
		floor float64
		want  []float64
		tol   float64
	}{
		// numpy 1.24.2 (v @ w), checked by hand.
		{"worked arithmetic", workedValues, workedWeights, Arithmetic, 0, []float64{0.9444444444, 0.675, 0.6856060606, 0.0454545455}, 1e-9},
		// numpy 1.24.2: the geometric mean of the values rescaled to
		// [1, 10] (1 + 9v), over 10, which is the floor-0.1 form.
		{"worked geometric floor 0.1", workedValues, workedWeights, Geometric, 0.1, []float64{0.94868329805, 0.48936586483, 0.71567842711, 0.12944169726}, 1e-10},
		{"zero floor means 0.1", workedValues, workedWeights, Geometric, 0, []float64{0.94868329805, 0.48936586483, 0.71567842711, 0.12944169726}, 1e-10},
		// By hand: missing cells drop out and the other weights are
		// renormalised: (0.5·0.5 + 0.2·1)/0.7 = 0.45/0.7.
		{"missing cell", []float64{0.5, nan, 1}, workedWeights, Arithmetic, 0, []float64{0.45 / 0.7}, 1e-15},
		{"missing row", []float64{nan, nan, nan, 1, 1, 1}, workedWeights, Arithmetic, 0, []float64{nan, 1}, 0},
		{"missing row geometric", []float64{nan, nan, nan}, workedWeights, Geometric, 0.1, []float64{nan}, 0},
		// By hand: the only present value has weight 0, so no weight is
		// left: undefined.
		{"no weight left", []float64{nan, 0.4}, []float64{1, 0}, Arithmetic, 0, []float64{nan}, 0},
		// By hand: exp((0.5·ln 0.55 + 0.2·ln 1)/0.7) with u = 0.1 + 0.9·0.5.
		{"geometric missing", []float64{0.5, nan, 1}, workedWeights, Geometric, 0.1, []float64{math.Exp(0.5 * math.Log(0.55) / 0.7)}, 1e-15},
		// Scaling the weights changes nothing.
		{"scaled weights", workedValues, []float64{5, 3, 2}, Arithmetic, 0, []float64{0.9444444444, 0.675, 0.6856060606, 0.0454545455}, 1e-9},
	} {
		t.Run(test.name, func(t *testing.T) {
			got := Composite(nil, test.v, test.w, test.agg, test.floor)
			if !floats.EqualFunc(got, test.want, func(a, b float64) bool {
				if math.IsNaN(b) {
					return math.IsNaN(a)
				}
				return scalar.EqualWithinAbsOrRel(a, b, test.tol, test.tol)
			}) {
				t.Errorf("Composite = %.11g, want %.11g", got, test.want)
			}
		})
	}
}

func TestCompositeRanking(t *testing.T) {
	// numpy 1.24.2 and by hand: A > C > B > D under both aggregations, and
	// geometric aggregation penalises B's poor recovery far more than the
	// arithmetic mean does (Nardo et al. 2008, compensability).
	arith := Composite(nil, workedValues, workedWeights, Arithmetic, 0)
	geo := Composite(nil, workedValues, workedWeights, Geometric, 0.1)
	want := []int32{1, 3, 2, 4}
	if got := rankstat.Ranks(nil, arith); !slices.Equal(got, want) {
		t.Errorf("arithmetic ranks = %v, want %v", got, want)
	}
	if got := rankstat.Ranks(nil, geo); !slices.Equal(got, want) {
		t.Errorf("geometric ranks = %v, want %v", got, want)
	}
	if gap := arith[1] - geo[1]; gap < 0.18 {
		t.Errorf("B: arithmetic − geometric = %.4f, want the gap of 0.1856 (0.675 − 0.4894)", gap)
	}
}

func TestBaseRankingMatchesComposite(t *testing.T) {
	// The analyses' base ranking is exactly Ranks(Composite(...)), with and
	// without missing values and under both aggregations.
	rnd := rand.New(rand.NewPCG(3, 4))
	n, k := 500, 6
	v := make([]float64, n*k)
	for i := range v {
		// Few distinct values, so that composites tie.
		v[i] = float64(rnd.IntN(5)) / 4
	}
	w := []float64{0.3, 0.1, 0.2, 0.1, 0.2, 0.1}
	withNaN := slices.Clone(v)
	for i := 0; i < len(withNaN); i += 7 {
		withNaN[i] = nan
	}
	for _, values := range [][]float64{v, withNaN} {
		for _, agg := range []Aggregation{Arithmetic, Geometric} {
			m := Model{Values: values, Weights: w, Aggregation: agg}
			p, err := m.prepare()
			if err != nil {
				t.Fatal(err)
			}
			want := rankstat.Ranks(nil, Composite(nil, values, p.w, agg, 0))
			if !slices.Equal(p.baseRanks, want) {
				t.Errorf("%v: base ranks differ from Ranks(Composite)", agg)
			}
			if !floats.Same(p.base, Composite(nil, values, p.w, agg, 0)) {
				t.Errorf("%v: base composites differ from Composite", agg)
			}
			if c, err := m.Composites(); err != nil || !floats.Same(c, p.base) {
				t.Errorf("%v: Model.Composites differs from the base composites (err %v)", agg, err)
			}
		}
	}
}

func TestModelErrors(t *testing.T) {
	for _, test := range []struct {
		name string
		m    Model
		want string
	}{
		{"no weights", Model{}, "sensitivity: no weights"},
		{"no stations", Model{Weights: []float64{1}}, "sensitivity: no stations"},
		{"negative weight", Model{Values: []float64{1, 1}, Weights: []float64{1, -0.5}}, "sensitivity: weight 1 is -0.5; want a finite weight >= 0"},
		{"zero weights", Model{Values: []float64{1, 1}, Weights: []float64{0, 0}}, "sensitivity: the weights sum to 0; want at least one positive weight"},
		{"infinite value", Model{Values: []float64{1, 1, math.Inf(1), 0}, Weights: []float64{1, 1}}, "sensitivity: station 1, indicator 0: value +Inf; want a finite value or NaN for missing"},
		{"floor", Model{Values: []float64{1}, Weights: []float64{1}, Aggregation: Geometric, Floor: 1.5}, "sensitivity: geometric floor 1.5; want a floor strictly between 0 and 1"},
	} {
		t.Run(test.name, func(t *testing.T) {
			_, err := test.m.prepare()
			if err == nil || err.Error() != test.want {
				t.Errorf("error %v, want %q", err, test.want)
			}
		})
	}
}
