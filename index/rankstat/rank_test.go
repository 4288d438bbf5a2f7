package rankstat

import (
	"math"
	"math/rand/v2"
	"slices"
	"strconv"
	"testing"

	"pgregory.net/rapid"
)

var nan = math.NaN()

func TestRanks(t *testing.T) {
	// Competition ranking, highest first, NaN last: common practice; each
	// case is worked by hand.
	for _, test := range []struct {
		name   string
		scores []float64
		ranks  []int32
		order  []int32
	}{
		{"empty", nil, []int32{}, []int32{}},
		{"one", []float64{0.3}, []int32{1}, []int32{0}},
		{"competition", []float64{4, 3, 3, 1}, []int32{1, 2, 2, 4}, []int32{0, 1, 2, 3}},
		{"ties listed by index", []float64{1, 3, 4, 3}, []int32{4, 2, 1, 2}, []int32{2, 1, 3, 0}},
		{"nan last and shared", []float64{nan, 0.5, nan, 0.7}, []int32{3, 2, 3, 1}, []int32{3, 1, 0, 2}},
		{"signed zeros tie", []float64{math.Copysign(0, -1), 0, -1}, []int32{1, 1, 3}, []int32{0, 1, 2}},
		{"infinities", []float64{math.Inf(-1), 2, math.Inf(1), -2}, []int32{4, 2, 1, 3}, []int32{2, 1, 3, 0}},
		{"all nan", []float64{nan, nan}, []int32{1, 1}, []int32{0, 1}},
	} {
		t.Run(test.name, func(t *testing.T) {
			got := Ranks(nil, test.scores)
			if !slices.Equal(got, test.ranks) {
				t.Errorf("Ranks = %v, want %v", got, test.ranks)
			}
			if got := Order(nil, test.scores); !slices.Equal(got, test.order) {
				t.Errorf("Order = %v, want %v", got, test.order)
			}
		})
	}
}

// naiveRanks is the definition of competition ranking: one plus the number
// of strictly higher scores, with NaN below every number.
func naiveRanks(x []float64) []int32 {
	r := make([]int32, len(x))
	finite := 0
	for _, v := range x {
		if !math.IsNaN(v) {
			finite++
		}
	}
	for i, v := range x {
		if math.IsNaN(v) {
			r[i] = int32(finite + 1)
			continue
		}
		r[i] = 1
		for _, u := range x {
			if u > v {
				r[i]++
			}
		}
	}
	return r
}

// scores draws score vectors with many ties, signed zeros and NaNs.
func scores(min, max int) *rapid.Generator[[]float64] {
	v := rapid.OneOf(
		rapid.Map(rapid.IntRange(-4, 4), func(i int) float64 { return float64(i) / 4 }),
		rapid.Float64(),
		rapid.Just(math.Copysign(0, -1)),
		rapid.Just(nan),
		rapid.Just(math.Inf(1)),
	)
	return rapid.SliceOfN(v, min, max)
}

func TestRanksProperties(t *testing.T) {
	// Both the comparison sort (short input) and the radix sort (long
	// input) against the definition.
	rapid.Check(t, func(t *rapid.T) {
		x := scores(0, 3*smallSort).Draw(t, "x")
		got := Ranks(nil, x)
		if want := naiveRanks(x); !slices.Equal(got, want) {
			t.Fatalf("Ranks = %v, want %v", got, want)
		}
		order := Order(nil, x)
		for i := 1; i < len(order); i++ {
			a, b := order[i-1], order[i]
			if got[a] > got[b] || got[a] == got[b] && a > b {
				t.Fatalf("Order puts %d (rank %d) before %d (rank %d)", a, got[a], b, got[b])
			}
		}
	})
}

func TestRankerReuse(t *testing.T) {
	// One Ranker over vectors of changing length gives what fresh calls give.
	var r Ranker
	rnd := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1000, 10, 300, 0, 2000} {
		x := make([]float64, n)
		for i := range x {
			x[i] = float64(rnd.IntN(50))
		}
		got := r.Ranks(nil, x)
		if want := naiveRanks(x); !slices.Equal(got, want) {
			t.Fatalf("n=%d: reused Ranker differs from the definition", n)
		}
	}
}

func TestRankerPaths(t *testing.T) {
	// Long inputs go through the bucket sort, or through the radix sort
	// when a score is infinite or the scores crowd into few values; all
	// must agree with the definition.
	rnd := rand.New(rand.NewPCG(5, 6))
	for _, test := range []struct {
		name  string
		score func(i int) float64
	}{
		{"bucket", func(int) float64 { return rnd.NormFloat64() }},
		{"bucket with nan", func(i int) float64 {
			if i%17 == 0 {
				return nan
			}
			return rnd.Float64()
		}},
		{"radix for infinity", func(i int) float64 {
			if i == 500 {
				return math.Inf(-1)
			}
			return rnd.Float64()
		}},
		{"radix for crowded buckets", func(int) float64 { return float64(rnd.IntN(3)) }},
		{"huge span", func(i int) float64 { return math.Copysign(math.MaxFloat64, float64(i%2)-0.5) * rnd.Float64() }},
		{"all nan", func(int) float64 { return nan }},
		{"infinity and nan only", func(i int) float64 { return []float64{math.Inf(1), nan}[i%2] }},
	} {
		t.Run(test.name, func(t *testing.T) {
			x := make([]float64, 3000)
			for i := range x {
				x[i] = test.score(i)
			}
			var r Ranker
			got := r.Ranks(nil, x)
			if want := naiveRanks(x); !slices.Equal(got, want) {
				t.Error("ranks differ from the definition")
			}
			order := r.Order()
			for i := 1; i < len(order); i++ {
				a, b := order[i-1], order[i]
				if got[a] > got[b] || got[a] == got[b] && a > b {
					t.Fatalf("Order puts %d (rank %d) before %d (rank %d)", a, got[a], b, got[b])
				}
			}
		})
	}
}

func TestRanksLengthMismatch(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("no panic for a dst of the wrong length")
		}
	}()
	Ranks(make([]int32, 2), []float64{1, 2, 3})
}

func BenchmarkRanker(b *testing.B) {
	for _, n := range []int{100, 1000, 10_000, 100_000} {
		b.Run("n="+strconv.Itoa(n), func(b *testing.B) {
			rnd := rand.New(rand.NewPCG(1, 1))
			x := make([]float64, n)
			for i := range x {
				x[i] = rnd.Float64()
			}
			dst := make([]int32, n)
			var r Ranker
			b.ReportAllocs()
			for b.Loop() {
				r.Ranks(dst, x)
			}
		})
	}
}
