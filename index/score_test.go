package index

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"

	"rebound/config"
)

// handbook is the worked composite-indicator example (invented units A–D):
// peak departure °C (lower is better), recovery days (lower is better),
// baseflow index (higher is better); weights 0.5/0.3/0.2. Expected values
// are worked by hand and with numpy 1.24.2, following the normalisation and
// aggregation definitions of the OECD/JRC Handbook on Constructing
// Composite Indicators (Nardo et al. 2008).
func handbook() *Raw {
	raw := &Raw{
		Stations: []string{"A", "B", "C", "D"},
		Names:    []string{"A", "B", "C", "D"},
		Groups:   make([]string, 4),
		Indicators: []config.Indicator{
			{Name: "peak", Measure: config.Magnitude, Better: config.Lower},
			{Name: "recovery", Measure: config.Recovery, Better: config.Lower},
			{Name: "bfi", Measure: config.Attribute, Better: config.Higher},
		},
		Values: [][]float64{{2.0, 12, 0.60}, {1.5, 45, 0.55}, {3.0, 20, 0.45}, {6.0, 40, 0.20}},
		Events: []int{10, 10, 10, 10},
	}
	raw.Notes = make([][]string, 4)
	raw.Fallback = make([][]bool, 4)
	for i := range raw.Notes {
		raw.Notes[i] = make([]string, 3)
		raw.Fallback[i] = make([]bool, 3)
	}
	return raw
}

func handbookSpec(norm config.NormMethod, agg config.AggMethod) Spec {
	raw := handbook()
	s := Spec{Weights: []float64{0.5, 0.3, 0.2}, Aggregation: agg, Floor: 0.1, Missing: config.Renormalize}
	for _, ind := range raw.Indicators {
		s.Methods = append(s.Methods, Method{Norm: norm, Better: ind.Better})
	}
	return s
}

func TestScoreHandbookExample(t *testing.T) {
	tests := []struct {
		name       string
		norm       config.NormMethod
		agg        config.AggMethod
		normalized [][]float64 // nil: not checked
		composite  []float64
		ranks      []int
	}{
		{
			name: "minmax arithmetic", norm: config.MinMax, agg: config.Arithmetic,
			// hand + numpy: A (0.8888888889, 1, 1), B (1, 0, 0.875), ...
			normalized: [][]float64{{0.8888888889, 1, 1}, {1, 0, 0.875}, {0.6666666667, 0.7575757576, 0.625}, {0, 0.1515151515, 0}},
			composite:  []float64{0.9444444444, 0.6750000000, 0.6856060606, 0.0454545455},
			ranks:      []int{1, 3, 2, 4}, // A > C > B > D
		},
		{
			name: "zscore arithmetic", norm: config.ZScore, agg: config.Arithmetic,
			// population sd; B and C swap compared with min–max (hand + numpy)
			composite: []float64{0.8956674795, 0.2494365139, 0.2389036131, -1.3840076065},
			ranks:     []int{1, 2, 3, 4},
		},
		{
			name: "minmax geometric", norm: config.MinMax, agg: config.Geometric,
			// Handbook-style 1–10 rescaling (1 + 9x) then weighted product:
			// A 9.4868329805, B 4.8936586483, C 7.1567842711, D 1.2944169726
			// (hand + numpy). floor 0.1 gives the same product divided by 10.
			composite: []float64{0.94868329805, 0.48936586483, 0.71567842711, 0.12944169726},
			ranks:     []int{1, 3, 2, 4},
		},
		{
			name: "rank arithmetic", norm: config.Rank, agg: config.Arithmetic,
			// Ranks (1 = least resilient) departure (3,4,2,1), recovery
			// (4,1,3,2), bfi (4,3,2,1); weighted rank scores A 3.5, B 2.9,
			// C 2.3, D 1.3 (hand). Percentile rank is (r − 1)/(n − 1), so the
			// composite is (score − 1)/3.
			composite: []float64{2.5 / 3, 1.9 / 3, 1.3 / 3, 0.3 / 3},
			ranks:     []int{1, 2, 3, 4},
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			res, err := Score(handbook(), handbookSpec(tc.norm, tc.agg))
			if err != nil {
				t.Fatal(err)
			}
			for i := range tc.normalized {
				if !floats.EqualApprox(res.Normalized[i], tc.normalized[i], 1e-9) {
					t.Errorf("normalized[%d] = %v, want %v", i, res.Normalized[i], tc.normalized[i])
				}
			}
			if !floats.EqualApprox(res.Composite, tc.composite, 1e-9) {
				t.Errorf("composite = %v, want %v", res.Composite, tc.composite)
			}
			for i, r := range tc.ranks {
				if res.Rank[i] != r {
					t.Errorf("ranks = %v, want %v", res.Rank, tc.ranks)
					break
				}
			}
		})
	}
}

func TestScoreScaling(t *testing.T) {
	// Arithmetic on bounded values: score = 100·C, and contributions add up
	// to the score.
	res, _ := Score(handbook(), handbookSpec(config.MinMax, config.Arithmetic))
	for i := range res.Score {
		if !scalar.EqualWithinAbs(res.Score[i], 100*res.Composite[i], 1e-9) {
			t.Errorf("score %v, composite %v", res.Score[i], res.Composite[i])
		}
		if !scalar.EqualWithinAbs(floats.Sum(res.Contribution[i]), res.Score[i], 1e-9) {
			t.Errorf("contributions %v do not sum to %v", res.Contribution[i], res.Score[i])
		}
	}
	// Geometric: score = 100(C − floor)/(1 − floor), and the factors
	// multiply to C.
	res, _ = Score(handbook(), handbookSpec(config.MinMax, config.Geometric))
	for i := range res.Score {
		if want := 100 * (res.Composite[i] - 0.1) / 0.9; !scalar.EqualWithinAbs(res.Score[i], want, 1e-9) {
			t.Errorf("geometric score %v, want %v", res.Score[i], want)
		}
		if !scalar.EqualWithinAbs(floats.Prod(res.Contribution[i]), res.Composite[i], 1e-12) {
			t.Errorf("factors %v do not multiply to %v", res.Contribution[i], res.Composite[i])
		}
	}
	// A zero Floor means the default 0.1 throughout: composite, factors
	// and score (Spec's contract).
	zero := handbookSpec(config.MinMax, config.Geometric)
	zero.Floor = 0
	res0, err := Score(handbook(), zero)
	if err != nil {
		t.Fatal(err)
	}
	for i := range res.Score {
		if res0.Composite[i] != res.Composite[i] || res0.Score[i] != res.Score[i] || !floats.Equal(res0.Contribution[i], res.Contribution[i]) {
			t.Errorf("station %d with Floor 0: composite %v score %v factors %v; with 0.1: %v %v %v", i,
				res0.Composite[i], res0.Score[i], res0.Contribution[i], res.Composite[i], res.Score[i], res.Contribution[i])
		}
	}
	// z-scores: rescaled over the stations, best 100, worst 0.
	res, _ = Score(handbook(), handbookSpec(config.ZScore, config.Arithmetic))
	if res.Score[0] != 100 || res.Score[3] != 0 {
		t.Errorf("zscore scores %v", res.Score)
	}
}

func TestMissingPolicies(t *testing.T) {
	raw := handbook()
	raw.Values[1][1] = math.NaN() // B's recovery unknown
	raw.Notes[1][1] = "no events"

	spec := handbookSpec(config.MinMax, config.Arithmetic)
	res, err := Score(raw, spec)
	if err != nil {
		t.Fatal(err)
	}
	// Renormalise: min–max over A, C, D only (recovery 12, 20, 40), then B
	// keeps 0.5/(0.5+0.2) and 0.2/(0.5+0.2) of its peak (1) and bfi (0.875).
	if want := 100 * (0.5*1 + 0.2*0.875) / 0.7; !scalar.EqualWithinAbs(res.Score[1], want, 1e-9) {
		t.Errorf("renormalized B = %v, want %v", res.Score[1], want)
	}
	if got := res.Flags[1]; len(got) != 1 || got[0] != "missing:recovery" {
		t.Errorf("flags %v", got)
	}

	spec.Missing = config.Impute
	res, err = Score(raw, spec)
	if err != nil {
		t.Fatal(err)
	}
	// Impute the median of the observed 12, 20, 40 = 20: B then equals C on
	// recovery, (40 − 20)/(40 − 12).
	if got, want := res.Normalized[1][1], 20.0/28; !scalar.EqualWithinAbs(got, want, 1e-12) || !res.Imputed[1][1] {
		t.Errorf("imputed normalized %v, want %v", got, want)
	}

	spec.Missing = config.ErrorPolicy
	if _, err := Score(raw, spec); err == nil {
		t.Error("error policy: want an error")
	}

	// Imputation takes the median of the station's own normalisation
	// group: A, B and C form a group, whose observed recoveries 12 and 20
	// give B 16 and so (20 − 16)/(20 − 12) = 0.5 within the group (by
	// hand). The median over all stations, 20, would give 0.
	spec.Missing = config.Impute
	spec.Groups = []string{"g1", "g1", "g1", "g2"}
	res, err = Score(raw, spec)
	if err != nil {
		t.Fatal(err)
	}
	if got := res.Normalized[1][1]; !scalar.EqualWithinAbs(got, 0.5, 1e-12) || !res.Imputed[1][1] {
		t.Errorf("imputed within group: normalized %v, want 0.5", got)
	}
}

func TestGroupScope(t *testing.T) {
	raw := handbook()
	spec := handbookSpec(config.MinMax, config.Arithmetic)
	spec.Groups = []string{"g1", "g1", "g2", "g2"}
	res, err := Score(raw, spec)
	if err != nil {
		t.Fatal(err)
	}
	// Within each pair, min–max gives 1 and 0: A beats B on recovery and
	// bfi, B beats A on peak.
	want := [][]float64{{0, 1, 1}, {1, 0, 0}, {1, 1, 1}, {0, 0, 0}}
	for i := range want {
		if !floats.EqualApprox(res.Normalized[i], want[i], 1e-12) {
			t.Errorf("group normalized[%d] = %v, want %v", i, res.Normalized[i], want[i])
		}
	}
}

func TestRankTies(t *testing.T) {
	// Competition ranking (1, 2, 2, 4), NaN last and sharing a rank; the
	// listing breaks ties by station identifier (common practice).
	composite := []float64{0.5, 0.8, 0.5, math.NaN(), 0.8, 0.1}
	id := []string{"e", "b", "a", "z", "c", "f"}
	rank, order := rankComposites(composite, id)
	wantRank := []int{3, 1, 3, 6, 1, 5}
	wantOrder := []int{1, 4, 2, 0, 5, 3} // b, c (tie at 0.8), a, e (tie at 0.5), f, z
	for i := range wantRank {
		if rank[i] != wantRank[i] || order[i] != wantOrder[i] {
			t.Fatalf("rank %v order %v; want %v %v", rank, order, wantRank, wantOrder)
		}
	}
}

func TestNormalizeTarget(t *testing.T) {
	// d = max(0, |x − 50| − 5): 0, 0, 15, 30 → 1, 1, 1 − 15/30, 0 (analytic).
	got, ok := Normalize(nil, []float64{50, 54, 70, 15}, Method{Norm: config.TargetN, Target: 50, Tolerance: 5})
	want := []float64{1, 1, 0.5, 0}
	if !ok || !floats.EqualApprox(got, want, 1e-12) {
		t.Errorf("target = %v, want %v", got, want)
	}
}

func TestNormalizeNoSpread(t *testing.T) {
	// A column that does not tell stations apart gets the documented
	// value of each method and ok = false (by definition, Normalize's
	// contract); NaN stays NaN. Within the target's tolerance everyone
	// scores 1 and, when the values differ, that is information (ok).
	nan := math.NaN()
	target := func(tol float64) Method { return Method{Norm: config.TargetN, Target: 50, Tolerance: tol} }
	for _, tc := range []struct {
		name string
		x    []float64
		m    Method
		want float64
		ok   bool
	}{
		{"minmax equal", []float64{3, 3, nan}, Method{Norm: config.MinMax}, 0.5, false},
		{"rank equal", []float64{3, 3, nan}, Method{Norm: config.Rank}, 0.5, false},
		{"zscore equal", []float64{3, 3, nan}, Method{Norm: config.ZScore}, 0, false},
		{"minmax one station", []float64{nan, 7}, Method{Norm: config.MinMax, Better: config.Lower}, 0.5, false},
		{"target equal, off target", []float64{70, 70, nan}, target(5), 1, false},
		{"target one station, off target", []float64{nan, 15}, target(5), 1, false},
		{"target equal, on target", []float64{52, 52}, target(5), 1, false},
		{"target all within tolerance", []float64{46, 54, nan}, target(5), 1, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got, ok := Normalize(nil, tc.x, tc.m)
			if ok != tc.ok {
				t.Errorf("ok = %v, want %v", ok, tc.ok)
			}
			for i, v := range got {
				if want := tc.want; math.IsNaN(tc.x[i]) {
					if !math.IsNaN(v) {
						t.Errorf("x[%d] missing: got %v, want NaN", i, v)
					}
				} else if v != want {
					t.Errorf("x[%d] = %v: got %v, want %v", i, tc.x[i], v, want)
				}
			}
		})
	}
}

func TestNormalizeRankWithTies(t *testing.T) {
	// Mid-ranks of x = 1,2,2,3,4,5,5,5,6,7 are 1, 2.5, 2.5, 4, 5, 7, 7, 7,
	// 9, 10 (scipy.stats.rankdata 'average', 1.10.1).
	x := []float64{1, 2, 2, 3, 4, 5, 5, 5, 6, 7}
	got, _ := Normalize(nil, x, Method{Norm: config.Rank, Better: config.Higher})
	mid := []float64{1, 2.5, 2.5, 4, 5, 7, 7, 7, 9, 10}
	for i := range mid {
		if want := (mid[i] - 1) / 9; !scalar.EqualWithinAbs(got[i], want, 1e-12) {
			t.Fatalf("rank[%d] = %v, want %v", i, got[i], want)
		}
	}
	// No spread: every station gets 0.5 and ok is false.
	if got, ok := Normalize(nil, []float64{3, 3, math.NaN()}, Method{Norm: config.MinMax}); ok || got[0] != 0.5 || !math.IsNaN(got[2]) {
		t.Errorf("constant column: %v %v", got, ok)
	}
}

func TestAHP(t *testing.T) {
	// numpy.linalg.eig 1.24.2 (R eigen() agrees), tolerance 1e-8; random
	// index 0.90 for n = 4 and 0.58 for n = 3 (Saaty 1980).
	tests := []struct {
		name      string
		a         [][]float64
		w         []float64
		lambda    float64
		ci, cr    float64
		tolerance float64
	}{
		{"4x4", [][]float64{{1, 3, 5, 7}, {1.0 / 3, 1, 3, 5}, {1.0 / 5, 1.0 / 3, 1, 3}, {1.0 / 7, 1.0 / 5, 1.0 / 3, 1}},
			[]float64{0.5650090538, 0.2622012056, 0.1175042500, 0.0552854906}, 4.1169824434, 0.0389941478, 0.0433268309, 1e-8},
		{"3x3 consistent", [][]float64{{1, 2, 4}, {0.5, 1, 2}, {0.25, 0.5, 1}},
			[]float64{4.0 / 7, 2.0 / 7, 1.0 / 7}, 3, 0, 0, 1e-12},
		{"3x3 inconsistent", [][]float64{{1, 3, 0.5}, {1.0 / 3, 1, 0.25}, {2, 4, 1}},
			[]float64{0.3196182639, 0.1219571930, 0.5584245431}, 3.0182947073, 0.0091473536, 0.0157712994, 1e-8},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r, err := AHP(tc.a)
			if err != nil {
				t.Fatal(err)
			}
			if !floats.EqualApprox(r.Weights, tc.w, tc.tolerance) {
				t.Errorf("weights %v, want %v", r.Weights, tc.w)
			}
			if !scalar.EqualWithinAbs(r.LambdaMax, tc.lambda, tc.tolerance) ||
				!scalar.EqualWithinAbs(r.CI, tc.ci, tc.tolerance) || !scalar.EqualWithinAbs(r.CR, tc.cr, tc.tolerance) {
				t.Errorf("λ %v CI %v CR %v; want %v %v %v", r.LambdaMax, r.CI, r.CR, tc.lambda, tc.ci, tc.cr)
			}
		})
	}
	if _, err := AHP([][]float64{{1, -2}, {0.5, 1}}); err == nil {
		t.Error("negative entry accepted")
	}
}

func TestResolveWeights(t *testing.T) {
	w := func(x float64) *config.Weight { v := config.Weight(x); return &v }
	cfg := config.Default()
	cfg.Indicators = []config.Indicator{{Name: "a", Weight: w(2)}, {Name: "b", Weight: w(6)}}
	got, err := ResolveWeights(cfg)
	if err != nil || !floats.Equal(got.W, []float64{0.25, 0.75}) {
		t.Fatalf("explicit %v %v", got, err)
	}
	cfg.Weighting.Method = config.Equal
	got, _ = ResolveWeights(cfg)
	if !floats.Equal(got.W, []float64{0.5, 0.5}) {
		t.Fatalf("equal %v", got.W)
	}
	// AHP: the order may differ from the indicator order.
	cfg.Weighting.Method = config.AHPW
	cfg.Weighting.AHP.Order = []string{"b", "a"}
	cfg.Weighting.AHP.Matrix = [][]config.Judgement{{1, 3}, {1.0 / 3, 1}}
	got, err = ResolveWeights(cfg)
	if err != nil || !floats.EqualApprox(got.W, []float64{0.25, 0.75}, 1e-12) {
		t.Fatalf("ahp %v %v", got, err)
	}
	// An inconsistent matrix is refused unless accepted.
	cfg.Indicators = append(cfg.Indicators, config.Indicator{Name: "c"})
	cfg.Weighting.AHP.Order = []string{"a", "b", "c"}
	cfg.Weighting.AHP.Matrix = [][]config.Judgement{{1, 9, 1.0 / 9}, {1.0 / 9, 1, 9}, {9, 1.0 / 9, 1}}
	if _, err := ResolveWeights(cfg); err == nil {
		t.Fatal("inconsistent matrix accepted")
	}
	cfg.Weighting.AHP.AcceptInconsistent = true
	if got, err := ResolveWeights(cfg); err != nil || len(got.Warnings) != 1 {
		t.Fatalf("accept_inconsistent: %v %v", got, err)
	}
}
