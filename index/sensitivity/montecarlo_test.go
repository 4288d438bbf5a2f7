package sensitivity

import (
	"math"
	"math/rand/v2"
	"reflect"
	"runtime"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat"

	"rebound/index/rankstat"
)

// invented returns n stations × k invented indicator values in [0, 1],
// with ties (values on a grid of the given number of levels, 0 meaning
// continuous) and a missing value in every missingEvery-th cell (0 for
// none).
func invented(seed uint64, n, k, levels, missingEvery int) []float64 {
	rnd := rand.New(rand.NewPCG(seed, 0))
	v := make([]float64, n*k)
	for i := range v {
		if levels > 0 {
			v[i] = float64(rnd.IntN(levels)) / float64(levels-1)
		} else {
			v[i] = rnd.Float64()
		}
		if missingEvery > 0 && i%missingEvery == missingEvery-1 {
			v[i] = nan
		}
	}
	return v
}

func TestMonteCarloAgainstStoredRanks(t *testing.T) {
	// The streamed histograms against the plain method: store every
	// sample's ranks (redrawn from the same streams) and take percentiles
	// with gonum stat.Quantile (Empirical, type 1), rank correlations with
	// rankstat.Spearman and rankstat.KendallTauB.
	const n, k, samples = 40, 4, 301
	v := invented(11, n, k, 4, 9)
	// Station 5 has no values: unranked, outside the correlations.
	for j := range k {
		v[5*k+j] = nan
	}
	w := []float64{0.4, 0.3, 0.2, 0.1}
	for _, agg := range []Aggregation{Arithmetic, Geometric} {
		t.Run(agg.String(), func(t *testing.T) {
			m := Model{Values: v, Weights: w, Aggregation: agg}
			s := Settings{Samples: samples, Concentration: 20, KendallSamples: -1, TopN: 6, Seed: 99, Workers: 2}
			got, err := MonteCarlo(m, s)
			if err != nil {
				t.Fatal(err)
			}

			p, _ := m.prepare()
			ws, _ := newWeightSampler(p.w, s)
			ranks := make([][]float64, n) // per station, over samples
			weights := make([]float64, k)
			var pcg rand.PCG
			var included []int
			for st := range n {
				if p.baseFinite[st] {
					included = append(included, st)
				}
			}
			base := pick(p.base, included)
			for i := range samples {
				pcg.Seed(s.Seed, uint64(i))
				ws.draw(weights, &pcg)
				scores := Composite(nil, v, weights, agg, 0)
				r := rankstat.Ranks(nil, scores)
				for st, x := range r {
					ranks[st] = append(ranks[st], float64(x))
				}
				sub := pick(scores, included)
				if want := rankstat.Spearman(base, sub); !scalar.EqualWithinAbs(got.SpearmanSamples[i], want, 1e-12) {
					t.Fatalf("sample %d: Spearman %v, want %v", i, got.SpearmanSamples[i], want)
				}
				if want := rankstat.KendallTauB(base, sub); !scalar.EqualWithinAbs(got.KendallSamples[i], want, 1e-12) {
					t.Fatalf("sample %d: Kendall %v, want %v", i, got.KendallSamples[i], want)
				}
			}
			for st, r := range ranks {
				slices.Sort(r)
				q := func(p float64) int32 { return int32(stat.Quantile(p, stat.Empirical, r, nil)) }
				var top, bottom float64
				for _, x := range r {
					if x <= 6 {
						top++
					}
					if x > float64(len(included))-6 { // the bottom 6 of the scored stations
						bottom++
					}
				}
				want := StationRanks{
					Base: p.baseRanks[st], Median: q(0.5), Low: q(0.05), High: q(0.95),
					Best: int32(r[0]), Worst: int32(r[len(r)-1]), Mean: stat.Mean(r, nil),
					Top: top / samples, Bottom: bottom / samples,
				}
				g := got.Stations[st]
				g.Stability = 0
				if !scalar.EqualWithinAbs(g.Mean, want.Mean, 1e-9) {
					t.Errorf("station %d: mean rank %v, want %v", st, g.Mean, want.Mean)
				}
				g.Mean = want.Mean
				if g != want {
					t.Errorf("station %d:\n got %+v\nwant %+v", st, g, want)
				}
			}
			if got.Stations[5].Stability != Unranked {
				t.Errorf("station without values: %v, want unranked", got.Stations[5].Stability)
			}
			sorted := slices.Clone(got.SpearmanSamples)
			slices.Sort(sorted)
			if want := stat.Quantile(0.05, stat.Empirical, sorted, nil); got.Spearman.P05 != want || got.Spearman.Min != sorted[0] {
				t.Errorf("Spearman summary %+v, want P05 %v, min %v", got.Spearman, want, sorted[0])
			}
		})
	}
}

func pick(x []float64, idx []int) []float64 {
	out := make([]float64, len(idx))
	for i, j := range idx {
		out[i] = x[j]
	}
	return out
}

func TestMonteCarloNoSpread(t *testing.T) {
	// With c = 1e14 the weights stay within about 1e-7 of the base weights,
	// far less than it takes to swap any two of these stations, so every
	// interval collapses to the base rank and both correlations are 1.
	v := invented(5, 60, 5, 0, 0)
	m := Model{Values: v, Weights: []float64{0.3, 0.25, 0.2, 0.15, 0.1}}
	res, err := MonteCarlo(m, Settings{Samples: 200, Concentration: 1e14, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	for st, r := range res.Stations {
		b := r.Base
		if r.Median != b || r.Low != b || r.High != b || r.Best != b || r.Worst != b || r.Mean != float64(b) {
			t.Errorf("station %d: %+v, want every rank %d", st, r, b)
		}
	}
	if res.Spearman != (Agreement{1, 1, 1}) || res.Kendall != (Agreement{1, 1, 1}) {
		t.Errorf("agreement %+v, %+v, want all 1", res.Spearman, res.Kendall)
	}
}

func TestMonteCarloDominantStation(t *testing.T) {
	// A station at least as good as every other on every indicator, and
	// better on one, ranks 1 under any positive weights: even uniform
	// sampling over the simplex cannot move it.
	v := invented(6, 50, 4, 0, 0)
	for j := range 4 {
		v[17*4+j] = 1
	}
	m := Model{Values: v, Weights: []float64{0.25, 0.25, 0.25, 0.25}}
	res, err := MonteCarlo(m, Settings{Samples: 500, Sampling: UniformSimplex, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	r := res.Stations[17]
	if r.Worst != 1 || r.Top != 1 || r.Stability != RobustTop {
		t.Errorf("dominant station: %+v, want rank 1 in every sample", r)
	}
}

func TestMonteCarloDeterministic(t *testing.T) {
	// Same seed, same results at GOMAXPROCS 1 and 2 and at any Workers; and
	// scaling the base weights changes nothing.
	v := invented(8, 300, 6, 6, 13)
	w := []float64{3, 1, 2, 1, 2, 1}
	m := Model{Values: v, Weights: w, Aggregation: Geometric}
	s := Settings{Samples: 700, Seed: 42}
	run := func(m Model, s Settings) *MonteCarloResult {
		t.Helper()
		res, err := MonteCarlo(m, s)
		if err != nil {
			t.Fatal(err)
		}
		return res
	}
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(1))
	want := run(m, s)
	runtime.GOMAXPROCS(2)
	if got := run(m, s); !reflect.DeepEqual(got, want) {
		t.Error("GOMAXPROCS 1 and 2 differ")
	}
	for _, workers := range []int{1, 3, 8} {
		s := s
		s.Workers = workers
		if got := run(m, s); !reflect.DeepEqual(got, want) {
			t.Errorf("Workers = %d differs", workers)
		}
	}
	scaled := m
	scaled.Weights = make([]float64, len(w))
	for j, x := range w {
		scaled.Weights[j] = 3 * x
	}
	if got := run(scaled, s); !reflect.DeepEqual(got.Stations, want.Stations) {
		t.Error("scaling the base weights by 3 changes the rank statistics")
	}
}

func TestStability(t *testing.T) {
	// By hand, n = 10 stations, TopN = 2, 20 samples (type 1 percentiles
	// are the 1st, 10th and 19th smallest of the 20 ranks).
	for _, test := range []struct {
		name    string
		ranks   map[int32]int // rank: samples
		defined bool
		want    Stability
		low     int32
		high    int32
	}{
		{"robust top", map[int32]int{1: 18, 2: 1, 5: 1}, true, RobustTop, 1, 2},
		{"top band missed in 3 of 20", map[int32]int{1: 17, 5: 3}, true, WeightDependent, 1, 5},
		{"robust bottom", map[int32]int{9: 6, 10: 14}, true, RobustBottom, 9, 10},
		{"bottom band missed once", map[int32]int{8: 1, 9: 5, 10: 14}, true, Stable, 8, 10},
		{"stable middle", map[int32]int{4: 3, 5: 14, 6: 3}, true, Stable, 4, 6},
		{"weight-dependent", map[int32]int{2: 4, 5: 12, 8: 4}, true, WeightDependent, 2, 8},
		{"unranked", map[int32]int{10: 20}, false, Unranked, 10, 10},
	} {
		t.Run(test.name, func(t *testing.T) {
			count := make([]uint16, 10)
			for r, c := range test.ranks {
				count[r-1] = uint16(c)
			}
			got := summarize(count, 20, 2, 10, 1, test.defined)
			if got.Stability != test.want || got.Low != test.low || got.High != test.high {
				t.Errorf("got %v [%d, %d], want %v [%d, %d]", got.Stability, got.Low, got.High, test.want, test.low, test.high)
			}
		})
	}
	// With the 10th station unscored, the bottom band of 2 is ranks 8–9:
	// a station always at 8 or 9 is robustly at the bottom (hand).
	count := make([]uint16, 10)
	count[7], count[8] = 10, 10
	if got := summarize(count, 20, 2, 9, 8, true); got.Stability != RobustBottom || got.Bottom != 1 {
		t.Errorf("bottom band with an unscored station: %v, P(bottom) %v", got.Stability, got.Bottom)
	}
}

func TestMonteCarloErrors(t *testing.T) {
	m := Model{Values: invented(1, 100, 2, 0, 0), Weights: []float64{1, 1}}
	for _, test := range []struct {
		name string
		s    Settings
		want string
	}{
		{"samples", Settings{Samples: -5}, "sensitivity: -5 Monte Carlo samples; want at least 1"},
		{"memory", Settings{MaxMemory: 1000}, "sensitivity: 100 stations need 20000 bytes of rank histograms, more than the 1000 bytes allowed (MaxMemory)"},
		{"sampling", Settings{Sampling: 7}, "sensitivity: unknown sampling Sampling(?)"},
		{"top band", Settings{TopN: -1}, "sensitivity: top and bottom bands of -1 stations; want at least 1"},
	} {
		t.Run(test.name, func(t *testing.T) {
			_, err := MonteCarlo(m, test.s)
			if err == nil || !strings.HasPrefix(err.Error(), test.want) {
				t.Errorf("error %v, want %q", err, test.want)
			}
		})
	}
	big := Model{Values: make([]float64, 65536), Weights: []float64{1}}
	want := "sensitivity: 65536 stations; the Monte Carlo analysis ranks at most 65535"
	if _, err := MonteCarlo(big, Settings{}); err == nil || err.Error() != want {
		t.Errorf("error %v, want %q", err, want)
	}
}

func TestMonteCarloUint32Counters(t *testing.T) {
	// More than 65535 samples switch the histograms to 4-byte counters;
	// a tiny model keeps this fast.
	m := Model{Values: []float64{1, 0, 0, 1, 0.5, 0.5}, Weights: []float64{0.5, 0.5}}
	res, err := MonteCarlo(m, Settings{Samples: 70000, KendallSamples: 10, Seed: 2})
	if err != nil {
		t.Fatal(err)
	}
	// By symmetry (weights exchangeable around 0.5/0.5) stations 0 and 1
	// each come first about half the time; station 2 (0.5, 0.5) scores 0.5
	// always and ranks 2 whenever the others differ.
	for st, r := range res.Stations[:2] {
		if math.Abs(r.Top-0.5) > 0.02 {
			t.Errorf("station %d: P(top) %v, want about 0.5", st, r.Top)
		}
	}
	if r := res.Stations[2]; r.Median != 2 {
		t.Errorf("station 2: median rank %d, want 2", r.Median)
	}
}
