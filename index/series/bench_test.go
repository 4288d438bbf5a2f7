package series

import (
	"bytes"
	"fmt"
	"os"
	"sync"
	"testing"
)

var synthCache sync.Map

func synthCached(n, years int) []byte {
	key := [2]int{n, years}
	if b, ok := synthCache.Load(key); ok {
		return b.([]byte)
	}
	b := synthLong(n, years)
	synthCache.Store(key, b)
	return b
}

// BenchmarkMap parses a long file of n stations x 30 years (two variables)
// into Stations, with a function that does nothing.
func BenchmarkMap(b *testing.B) {
	for _, n := range []int{5, 20} {
		for _, workers := range []int{1, 2} {
			b.Run(fmt.Sprintf("stations=%d/workers=%d", n, workers), func(b *testing.B) {
				data := synthCached(n, 30)
				benchMap(b, func() *bytes.Reader { return bytes.NewReader(data) }, int64(len(data)), workers)
			})
		}
	}
}

func benchMap(b *testing.B, open func() *bytes.Reader, size int64, workers int) {
	b.SetBytes(size)
	b.ReportAllocs()
	for b.Loop() {
		_, err := Map(open(), "bench", optWQ(), workers,
			func(s *Station) (int, error) { return s.Days, nil },
			func(int) error { return nil })
		if err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkMapFile reads the file named by REBOUND_SERIES_FILE, for
// measuring a large input by hand (for example 1,000 stations x 30 years
// with air and water temperature and discharge).
func BenchmarkMapFile(b *testing.B) {
	path := os.Getenv("REBOUND_SERIES_FILE")
	if path == "" {
		b.Skip("REBOUND_SERIES_FILE not set")
	}
	opt := Options{Vars: []Var{{Name: WaterTemperature}, {Name: AirTemperature}, {Name: Discharge}}}
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
				sum, err := Map(f, path, opt, workers,
					func(s *Station) (int, error) { return s.Days, nil },
					func(int) error { return nil })
				f.Close()
				if err != nil {
					b.Fatal(err)
				}
				b.ReportMetric(float64(sum.Rows), "rows")
			}
		})
	}
}

func BenchmarkParseFloat(b *testing.B) {
	for _, s := range []string{"12.34", "1234.567", "0.001234567890123456789"} {
		b.Run(s, func(b *testing.B) {
			in := []byte(s)
			b.ReportAllocs()
			for b.Loop() {
				parseFloat(in)
			}
		})
	}
}
