package events

import (
	"bufio"
	"math"
	"os"
	"slices"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"pgregory.net/rapid"

	"rebound/index/calendar"
	"rebound/index/robust"
)

// readCSV reads a CSV file with a header row and numeric or date columns;
// it returns column k (0-based) of every row as float64, dates as day
// numbers.
func readCSV(t testing.TB, name string, k int) []float64 {
	t.Helper()
	f, err := os.Open(name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var x []float64
	sc := bufio.NewScanner(f)
	sc.Scan() // header
	for sc.Scan() {
		fields := strings.Split(sc.Text(), ",")
		if d, err := calendar.Parse(fields[k]); err == nil {
			x = append(x, float64(d))
			continue
		}
		v, err := strconv.ParseFloat(fields[k], 64)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		x = append(x, v)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return x
}

// close reports whether got equals want within tol (absolute or
// relative), NaN matching NaN.
func close(got, want, tol float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	return scalar.EqualWithinAbsOrRel(got, want, tol, tol)
}

func date(s string) calendar.Date {
	d, err := calendar.Parse(s)
	if err != nil {
		panic(err)
	}
	return d
}

func TestPercentile(t *testing.T) {
	lowflow := readCSV(t, "testdata/lowflow40.csv", 1)
	x8 := []float64{3, 1, 4, 1, 5, 9, 2, 6.5}
	for _, tc := range []struct {
		name string
		x    []float64
		p    float64
		want float64
	}{
		// Q80 and Q90 of lowflow40.csv: numpy 1.24.2 np.percentile, method
		// "linear" (Hyndman & Fan type 7).
		{"lowflow40 Q80", lowflow, 20, 7.9},
		{"lowflow40 Q90", lowflow, 10, 6.95},
		// Further values from numpy 1.24.2 np.percentile (linear).
		{"lowflow40 p0", lowflow, 0, 5},
		{"lowflow40 p5", lowflow, 5, 6},
		{"lowflow40 p33.3", lowflow, 33.3, 9},
		{"lowflow40 p50", lowflow, 50, 10.75},
		{"lowflow40 p95", lowflow, 95, 14},
		{"lowflow40 p100", lowflow, 100, 15},
		{"x8 p25", x8, 25, 1.75},
		{"x8 p37.5", x8, 37.5, 2.625},
		{"x8 p62.5", x8, 62.5, 4.375},
		{"x8 p90", x8, 90, 7.25},
		{"x8 p99", x8, 99, 8.825},
		{"one value", []float64{7.25}, 37, 7.25},
		{"empty", nil, 50, math.NaN()},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := percentile(slices.Clone(tc.x), tc.p); !close(got, tc.want, 1e-12) {
				t.Errorf("percentile(%v) = %v, want %v", tc.p, got, tc.want)
			}
		})
	}
}

// TestPercentileProperty checks the selection-based percentile against
// the sort-based type-7 quantile of package robust on random inputs.
func TestPercentileProperty(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		// Either few distinct values, so many ties, or nearly all distinct.
		ties := rapid.SliceOfN(rapid.Map(rapid.IntRange(-20, 20), func(v int) float64 { return float64(v) / 4 }), 1, 400)
		distinct := rapid.SliceOfN(rapid.Float64Range(-1e3, 1e3), 1, 400)
		x := rapid.OneOf(ties, distinct).Draw(t, "x")
		p := rapid.Float64Range(0, 100).Draw(t, "p")
		want := robust.Quantile(x, p/100)
		if got := percentile(slices.Clone(x), p); !close(got, want, 1e-12) {
			t.Fatalf("percentile(%v) = %v, want %v", p, got, want)
		}
	})
}
