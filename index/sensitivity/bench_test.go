package sensitivity

import (
	"fmt"
	"math"
	"testing"
)

// benchWeights are the eight base weights of the performance comparison
// with numpy (0.20, 0.15, 0.15 and five of 0.10), sampled with
// concentration 100.
var benchWeights = []float64{0.20, 0.15, 0.15, 0.10, 0.10, 0.10, 0.10, 0.10}

func BenchmarkComposite(b *testing.B) {
	for _, n := range []int{1000, 10_000} {
		v := invented(1, n, 8, 0, 0)
		dst := make([]float64, n)
		for _, agg := range []Aggregation{Arithmetic, Geometric} {
			b.Run(fmt.Sprintf("%v/n=%d", agg, n), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					Composite(dst, v, benchWeights, agg, 0)
				}
			})
		}
	}
}

// BenchmarkMonteCarlo times composites, ranks, streamed rank histograms and
// percentiles, Spearman on every sample and Kendall on 1000 of them.
func BenchmarkMonteCarlo(b *testing.B) {
	for _, size := range []struct{ n, samples int }{
		{1000, 1000},
		{1000, 10_000},
		{10_000, 10_000},
	} {
		b.Run(fmt.Sprintf("n=%d/samples=%d", size.n, size.samples), func(b *testing.B) {
			m := Model{Values: invented(1, size.n, 8, 0, 0), Weights: benchWeights}
			s := Settings{Samples: size.samples, Concentration: 100, Seed: 1}
			b.ReportAllocs()
			for b.Loop() {
				if _, err := MonteCarlo(m, s); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkOneAtATime(b *testing.B) {
	m := Model{Values: invented(1, 10_000, 8, 0, 0), Weights: benchWeights}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := OneAtATime(m, Settings{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSobol(b *testing.B) {
	lo := []float64{-math.Pi, -math.Pi, -math.Pi}
	hi := []float64{math.Pi, math.Pi, math.Pi}
	for _, n := range []int{1 << 12, 1 << 16} {
		b.Run(fmt.Sprintf("ishigami/N=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Sobol(ishigami, lo, hi, 1, SobolSettings{N: n, Seed: 1}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkWeightIndices times the Sobol indices with the defaults (4096
// base samples, 1000 bootstrap replicates of the ranking-wide output), up
// to the 10,000 stations of the Monte Carlo comparison.
func BenchmarkWeightIndices(b *testing.B) {
	for _, n := range []int{100, 1000, 10_000} {
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			m := Model{Values: invented(1, n, 8, 0, 0), Weights: benchWeights}
			b.ReportAllocs()
			for b.Loop() {
				if _, err := WeightIndices(m, Settings{Seed: 1}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkPreparedComposites(b *testing.B) {
	for _, n := range []int{1000, 10_000} {
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			p, err := Model{Values: invented(1, n, 8, 0, 0), Weights: benchWeights}.prepare()
			if err != nil {
				b.Fatal(err)
			}
			dst := make([]float64, n)
			b.ReportAllocs()
			for b.Loop() {
				p.composites(dst, p.w)
			}
		})
	}
}
