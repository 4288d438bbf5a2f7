package criteria

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"rebound/index/calendar"
	"rebound/index/series"
)

// readColumn reads the second column of a two-column CSV with a header.
func readColumn(t testing.TB, name string) []float64 {
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
		_, v, ok := strings.Cut(sc.Text(), ",")
		if !ok {
			t.Fatalf("%s: line without a comma: %q", name, sc.Text())
		}
		f, err := strconv.ParseFloat(v, 64)
		if err != nil {
			t.Fatal(err)
		}
		x = append(x, f)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return x
}

func same(a, b float64) bool {
	return (math.IsNaN(a) && math.IsNaN(b)) || scalar.EqualWithinAbsOrRel(a, b, 1e-12, 1e-12)
}

func TestHashimoto(t *testing.T) {
	nan := math.NaN()
	for _, tc := range []struct {
		name  string
		x     []float64
		limit float64
		want  RRV
	}{
		{
			// Hand working, confirmed with numpy 1.24.2 (testdata/README.md);
			// failure runs: days 3–4, 7–9, 12, 16–18.
			name:  "rrv_series.csv",
			x:     readColumn(t, "testdata/rrv_series.csv"),
			limit: 20,
			want: RRV{
				Days: 20, DaysAbove: 9, Events: 4, Transitions: 4,
				Reliability:     0.55,     // 11/20
				Resilience:      4.0 / 9,  // 0.4444444444
				Vulnerability:   2.5,      // (2+4+1+3)/4
				MeanExcess:      19.0 / 9, // 2.1111111111
				MaxExcess:       4,        // day 8
				MeanEventExcess: 4.75,     // (3+9+1+6)/4
			},
		},
		{
			// By hand: a NaN ends the failure event 2–3 without a
			// transition; day 5 fails alone and recovers on day 6.
			name:  "missing day ends an event",
			x:     []float64{19, 22, 21, nan, 23, 18},
			limit: 20,
			want: RRV{
				Days: 5, DaysAbove: 3, Events: 2, Transitions: 1,
				Reliability: 2.0 / 5, Resilience: 1.0 / 3, Vulnerability: 2.5,
				MeanExcess: 2, MaxExcess: 3, MeanEventExcess: 3,
			},
		},
		{
			// By hand: nothing fails, so the ratios over failures are undefined.
			name:  "no failure",
			x:     []float64{19, 20, 18},
			limit: 20,
			want: RRV{
				Days: 3, Reliability: 1, Resilience: nan, Vulnerability: nan,
				MeanExcess: nan, MaxExcess: nan, MeanEventExcess: nan,
			},
		},
		{
			name:  "no data",
			x:     []float64{nan, nan},
			limit: 20,
			want: RRV{
				Reliability: nan, Resilience: nan, Vulnerability: nan,
				MeanExcess: nan, MaxExcess: nan, MeanEventExcess: nan,
			},
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := Hashimoto(tc.x, tc.limit)
			if got.Days != tc.want.Days || got.DaysAbove != tc.want.DaysAbove ||
				got.Events != tc.want.Events || got.Transitions != tc.want.Transitions {
				t.Errorf("counts: got %+v, want %+v", got, tc.want)
			}
			for _, f := range []struct {
				name      string
				got, want float64
			}{
				{"Reliability", got.Reliability, tc.want.Reliability},
				{"Resilience", got.Resilience, tc.want.Resilience},
				{"Vulnerability", got.Vulnerability, tc.want.Vulnerability},
				{"MeanExcess", got.MeanExcess, tc.want.MeanExcess},
				{"MaxExcess", got.MaxExcess, tc.want.MaxExcess},
				{"MeanEventExcess", got.MeanEventExcess, tc.want.MeanEventExcess},
			} {
				if !same(f.got, f.want) {
					t.Errorf("%s = %v, want %v", f.name, f.got, f.want)
				}
			}
		})
	}
}

func TestSevenDay(t *testing.T) {
	nan := math.NaN()
	for _, tc := range []struct {
		name string
		x    []float64
		want []float64
		tol  float64
	}{
		{
			// Hand working, confirmed with numpy 1.24.2 (testdata/README.md).
			name: "daily_max10.csv", tol: 1e-10,
			x: readColumn(t, "testdata/daily_max10.csv"),
			want: []float64{nan, nan, nan, nan, nan, nan,
				17.1428571429, 17.5428571429, 17.7, 17.5142857143},
		},
		{
			// By hand: every window that holds the missing day is undefined.
			name: "missing day", tol: 1e-10,
			x: []float64{1, 2, 3, 4, 5, 6, 7, nan, 1, 1, 1, 1, 1, 1, 1, 8},
			want: []float64{nan, nan, nan, nan, nan, nan, 4,
				nan, nan, nan, nan, nan, nan, nan, 1, 2},
		},
		{name: "short", x: []float64{1, 2, 3}, want: []float64{nan, nan, nan}, tol: 1e-10},
		{
			// Invented readings whose mean is exactly 18 (sum 126.00, by
			// hand); a plain left-to-right float64 sum gives
			// 18.000000000000004, which would fail a criterion of 18.
			name: "decimal mean on a criterion",
			x:    []float64{17.26, 17.37, 17.66, 18.23, 18.44, 18.53, 18.51},
			want: []float64{nan, nan, nan, nan, nan, nan, 18},
			tol:  0,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := SevenDay(make([]float64, len(tc.x)), tc.x)
			if !equalNaN(got, tc.want, tc.tol) {
				t.Errorf("got %v, want %v", got, tc.want)
			}
		})
	}
}

// equalNaN reports whether a and b agree within tol, NaN matching NaN.
func equalNaN(a, b []float64, tol float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.IsNaN(a[i]) != math.IsNaN(b[i]) ||
			!math.IsNaN(a[i]) && !scalar.EqualWithinAbsOrRel(a[i], b[i], tol, tol) {
			return false
		}
	}
	return true
}

func TestEvaluate(t *testing.T) {
	tmax := readColumn(t, "testdata/daily_max10.csv")
	tmean := make([]float64, len(tmax))
	for i, v := range tmax {
		tmean[i] = v - 3
	}
	start := calendar.New(2021, 7, 1)
	noMax := nanSlice(len(tmax))
	for _, tc := range []struct {
		name     string
		vars     map[string][]float64
		basis    Basis
		max      float64
		maxDate  calendar.Date
		above    []int
		warnings int
	}{
		{
			// 7DADM values of daily_max10.csv: hand and numpy 1.24.2; the
			// largest is 17.7, for the window of days 3–9.
			name:    "daily maxima",
			vars:    map[string][]float64{"water_temperature_max": tmax, "water_temperature": tmean},
			basis:   DailyMax,
			max:     17.7,
			maxDate: start + 8,
			above:   []int{4, 0}, // 17.14, 17.54, 17.7, 17.51 > 17; none > 18
		},
		{
			// Daily maxima all missing: falls back to the daily means, whose
			// 7-day values are those of daily_max10.csv less 3 (by hand).
			name:    "no daily maxima",
			vars:    map[string][]float64{"water_temperature_max": noMax, "water_temperature": tmean},
			basis:   DailyMean,
			max:     14.7,
			maxDate: start + 8,
			above:   []int{0, 0},
		},
		{
			name:     "no temperature",
			vars:     map[string][]float64{"discharge": tmax},
			max:      math.NaN(),
			above:    []int{0, 0},
			warnings: 1,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := &series.Station{ID: "X1", Start: start, Days: len(tmax), Vars: tc.vars}
			o := DefaultOptions()
			o.Criteria = []Criterion{{"rearing", 17}, {"migration", 18}}
			got, err := Evaluate(s, o)
			if err != nil {
				t.Fatal(err)
			}
			if got.Basis != tc.basis || !same(got.Max, tc.max) || (!math.IsNaN(tc.max) && got.MaxDate != tc.maxDate) {
				t.Errorf("basis %q max %v on %v, want %q %v on %v", got.Basis, got.Max, got.MaxDate, tc.basis, tc.max, tc.maxDate)
			}
			for i, p := range got.Criteria {
				if p.DaysAbove != tc.above[i] {
					t.Errorf("%s: %d days above, want %d", p.Name, p.DaysAbove, tc.above[i])
				}
			}
			if len(got.Warnings) != tc.warnings {
				t.Errorf("warnings %v, want %d", got.Warnings, tc.warnings)
			}
		})
	}
}

func TestEvaluateMaxTie(t *testing.T) {
	// By hand: eight equal daily maxima give two equal 7-day values, on
	// days 7 and 8; the first is reported.
	start := calendar.New(2021, 7, 1)
	x := []float64{15, 15, 15, 15, 15, 15, 15, 15}
	s := &series.Station{ID: "X1", Start: start, Days: len(x), Vars: map[string][]float64{"water_temperature_max": x}}
	got, err := Evaluate(s, DefaultOptions())
	if err != nil {
		t.Fatal(err)
	}
	if got.Max != 15 || got.MaxDate != start+6 {
		t.Errorf("max %v on %v, want 15 on %v", got.Max, got.MaxDate, start+6)
	}
}

func nanSlice(n int) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = math.NaN()
	}
	return x
}

func TestValidate(t *testing.T) {
	for _, tc := range []struct {
		name string
		c    []Criterion
		want string
	}{
		{"ok", []Criterion{{"a", 16}, {"b", 18}}, ""},
		{"unnamed", []Criterion{{"", 16}}, `criteria[0].name: want a name, got ""`},
		{"twice", []Criterion{{"a", 16}, {"a", 18}}, `criteria[1].name: "a" is used twice`},
		{"nan", []Criterion{{"a", math.NaN()}}, "criteria[0].limit: want a finite temperature, got NaN"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			o := DefaultOptions()
			o.Criteria = tc.c
			err := o.Validate()
			if got := errString(err); got != tc.want {
				t.Errorf("got %q, want %q", got, tc.want)
			}
		})
	}
}

func errString(err error) string {
	if err == nil {
		return ""
	}
	return err.Error()
}
