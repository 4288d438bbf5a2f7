package features

import (
	"bytes"
	"fmt"
	"os"
	"sync"
	"testing"

	"rebound/index/series"
)

var benchFiles sync.Map

func benchFile(n int) []byte {
	if b, ok := benchFiles.Load(n); ok {
		return b.([]byte)
	}
	b, _ := synthFile(n, 30)
	benchFiles.Store(n, b)
	return b
}

var benchOpt = series.Options{Vars: []series.Var{{Name: series.WaterTemperature}, {Name: series.AirTemperature}, {Name: series.Discharge}}}

// BenchmarkFromLong reads a synthetic long file of n stations x 30 years
// (three variables, about 1% of rows missing) and computes the default
// features.
func BenchmarkFromLong(b *testing.B) {
	e, err := New(Config{FillGaps: 2})
	if err != nil {
		b.Fatal(err)
	}
	for _, n := range []int{5, 20} {
		for _, workers := range []int{1, 2} {
			b.Run(fmt.Sprintf("stations=%d/workers=%d", n, workers), func(b *testing.B) {
				data := benchFile(n)
				b.SetBytes(int64(len(data)))
				b.ReportAllocs()
				for b.Loop() {
					if _, _, err := e.FromLong(bytes.NewReader(data), "bench", benchOpt, workers); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkExtract computes the default features of one station of 30
// years.
func BenchmarkExtract(b *testing.B) {
	_, st := synthFile(2, 30) // the last station has no water temperature
	e, _ := New(Config{})
	b.ReportAllocs()
	var dst []float64
	for b.Loop() {
		dst, _ = e.Extract(dst, st[0])
	}
}

func BenchmarkQuantile(b *testing.B) {
	for _, n := range []int{1000, 10000, 100000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			x := make([]float64, n)
			for i := range x {
				x[i] = float64((i * 7919) % 1000)
			}
			b.ReportAllocs()
			for b.Loop() {
				Quantile(0.9, x)
			}
		})
	}
}

// BenchmarkFromLongFile computes the default features of every station of
// the long file named by REBOUND_SERIES_FILE (for measuring a large input
// by hand, e.g. 1,000 stations x 30 years).
func BenchmarkFromLongFile(b *testing.B) {
	path := os.Getenv("REBOUND_SERIES_FILE")
	if path == "" {
		b.Skip("REBOUND_SERIES_FILE not set")
	}
	e, err := New(Config{FillGaps: 2})
	if err != nil {
		b.Fatal(err)
	}
	for _, workers := range []int{1, 2} {
		b.Run(fmt.Sprintf("workers=%d", workers), func(b *testing.B) {
			st, err := os.Stat(path)
			if err != nil {
				b.Fatal(err)
			}
			b.SetBytes(st.Size())
			b.ReportAllocs()
			for b.Loop() {
				f, err := os.Open(path)
				if err != nil {
					b.Fatal(err)
				}
				tab, _, err := e.FromLong(f, path, benchOpt, workers)
				f.Close()
				if err != nil {
					b.Fatal(err)
				}
				b.ReportMetric(float64(len(tab.Stations)), "stations")
			}
		})
	}
}
