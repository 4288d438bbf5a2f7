package robust

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

func benchSample(n int) []float64 {
	rng := rand.New(rand.NewPCG(1, 2))
	x := make([]float64, n)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	return x
}

// BenchmarkSelectQuantile: one quantile of n values, copied first (the
// copy is part of the cost of Quantile too).
func BenchmarkSelectQuantile(b *testing.B) {
	for _, n := range []int{100, 1000, 10_000, 100_000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			x := benchSample(n)
			buf := make([]float64, n)
			b.ReportAllocs()
			for b.Loop() {
				copy(buf, x)
				SelectQuantile(buf, 0.9)
			}
		})
	}
}

// BenchmarkSelection: the 10th, 50th and 90th percentiles of n values.
func BenchmarkSelection(b *testing.B) {
	for _, n := range []int{365, 10_957} { // a year, 30 years of days
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			x := benchSample(n)
			buf := make([]float64, n)
			var s Selection
			b.ReportAllocs()
			for b.Loop() {
				copy(buf, x)
				s.Reset(buf)
				s.Quantile(0.1)
				s.Quantile(0.5)
				s.Quantile(0.9)
			}
		})
	}
}

// BenchmarkTheilSen at the numbers of events a station has.
func BenchmarkTheilSen(b *testing.B) {
	for _, n := range []int{10, 34, 100} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			x, y := benchSample(n), benchSample(n + 1)[1:]
			b.ReportAllocs()
			for b.Loop() {
				TheilSen(x, y)
			}
		})
	}
}
