package series

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"rebound/index/calendar"
)

var nan = math.NaN()

func optWQ(units ...string) Options {
	o := Options{Vars: []Var{{Name: WaterTemperature}, {Name: Discharge}}}
	for i, u := range units {
		o.Vars[i].Units = u
	}
	return o
}

func sameFloats(a, b []float64, tol float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.IsNaN(a[i]) != math.IsNaN(b[i]) {
			return false
		}
		if !math.IsNaN(a[i]) && !scalar.EqualWithinAbsOrRel(a[i], b[i], tol, tol) {
			return false
		}
	}
	return true
}

func TestReadLong(t *testing.T) {
	type want struct {
		id    string
		start string
		vars  map[string][]float64
		count map[string]Counts
	}
	tests := []struct {
		name string
		in   string
		opt  Options
		want []want
		skip map[string]int
	}{
		{
			name: "dates and variables in any order",
			in: "station,date,variable,value\n" +
				"S1,2001-01-03,water_temperature,3.5\n" +
				"S1,2001-01-01,discharge,10\n" +
				"S1,2001-01-01,water_temperature,1.5\n" +
				"S1,2001-01-02,turbidity,7\n" +
				"S2,2000-12-31,water_temperature,\n" +
				"S2,2001-01-01,water_temperature,NA\n" +
				"S2,2001-01-02,water_temperature,2\n",
			opt: optWQ(),
			want: []want{
				{"S1", "2001-01-01", map[string][]float64{
					WaterTemperature: {1.5, nan, 3.5}, Discharge: {10, nan, nan}},
					map[string]Counts{WaterTemperature: {Rows: 2, Kept: 2}, Discharge: {Rows: 1, Kept: 1}}},
				{"S2", "2000-12-31", map[string][]float64{WaterTemperature: {nan, nan, 2}},
					map[string]Counts{WaterTemperature: {Rows: 3, Kept: 1, Blank: 2}}},
			},
			skip: map[string]int{"turbidity": 1},
		},
		{
			// °F to °C by (F−32)·5/9 and ft³/s to m³/s by 0.3048³, both exact
			// by definition (common practice).
			name: "units converted",
			in: "variable,value,station,date\n" +
				"water_temperature,212,A,2020-06-01\n" +
				"water_temperature,32,A,2020-06-02\n" +
				"discharge,1,A,2020-06-01\n" +
				"discharge,35.31466672148859,A,2020-06-02\n",
			opt: optWQ("°F", "cfs"),
			want: []want{{"A", "2020-06-01", map[string][]float64{
				WaterTemperature: {100, 0}, Discharge: {0.028316846592, 1}},
				map[string]Counts{WaterTemperature: {Rows: 2, Kept: 2, Converted: 2}, Discharge: {Rows: 2, Kept: 2, Converted: 2}}}},
		},
		{
			name: "qualifiers and range",
			in: "station,date,variable,value,qualifier\n" +
				"A,2020-06-01,water_temperature,12,\n" +
				"A,2020-06-02,water_temperature,13,P\n" +
				"A,2020-06-03,water_temperature,14,A E\n" +
				"A,2020-06-04,water_temperature,-9999,\n" +
				"A,2020-06-05,water_temperature,,P\n" +
				"A,2020-06-06,water_temperature,15,A\n",
			opt: Options{Vars: []Var{{Name: WaterTemperature, Range: Range{-5, 45}}}, Exclude: []string{"P", "E"}},
			want: []want{{"A", "2020-06-01", map[string][]float64{WaterTemperature: {12, nan, nan, nan, nan, 15}},
				map[string]Counts{WaterTemperature: {Rows: 6, Kept: 2, Blank: 1, Excluded: 2, OutOfRange: 1}}}},
		},
		{
			name: "quoted fields, CRLF, BOM, ignored column",
			in: "\xef\xbb\xbf\"station\",date,variable,value,note\r\n" +
				"\"Mill Creek, upper\",2020-06-01,water_temperature,12,\"a \"\"quoted\"\"\r\nnote\"\r\n" +
				"Mill Creek, upper,2020-06-02,water_temperature,13,\r\n" + // not the same station
				"\r\n",
			opt: Options{Vars: []Var{{Name: WaterTemperature}}, Ignore: []string{"note"}, MaxErrors: -1},
			want: []want{{"Mill Creek, upper", "2020-06-01", map[string][]float64{WaterTemperature: {12}},
				map[string]Counts{WaterTemperature: {Rows: 1, Kept: 1}}},
				{"Mill Creek", "", map[string][]float64{}, map[string]Counts{}}},
		},
		{
			name: "source names",
			in:   "station,date,variable,value\nA,2020-01-01,TW,3\n",
			opt:  Options{Vars: []Var{{Name: WaterTemperature, Source: "TW"}}},
			want: []want{{"A", "2020-01-01", map[string][]float64{WaterTemperature: {3}},
				map[string]Counts{WaterTemperature: {Rows: 1, Kept: 1}}}},
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			for _, workers := range []int{1, 3} {
				var got []*Station
				sum, err := Map(strings.NewReader(tc.in), "in.csv", tc.opt, workers,
					func(s *Station) (*Station, error) { return s, nil },
					func(s *Station) error { got = append(got, s); return nil })
				if tc.opt.MaxErrors == 0 && err != nil {
					t.Fatal(err)
				}
				if len(got) != len(tc.want) {
					t.Fatalf("got %d stations, want %d (err %v)", len(got), len(tc.want), err)
				}
				for i, w := range tc.want {
					s := got[i]
					if s.ID != w.id {
						t.Errorf("station %d: ID %q, want %q", i, s.ID, w.id)
					}
					if w.start != "" && s.Start.String() != w.start {
						t.Errorf("%s: Start %v, want %s", s.ID, s.Start, w.start)
					}
					if len(s.Vars) != len(w.vars) {
						t.Errorf("%s: %d variables, want %d", s.ID, len(s.Vars), len(w.vars))
					}
					for name, x := range w.vars {
						if !sameFloats(s.Vars[name], x, 1e-12) || s.Days != len(x) {
							t.Errorf("%s %s = %v (Days %d), want %v", s.ID, name, s.Vars[name], s.Days, x)
						}
						if c := s.Counts[name]; c == nil || *c != w.count[name] {
							t.Errorf("%s %s counts = %+v, want %+v", s.ID, name, c, w.count[name])
						}
					}
				}
				if tc.skip != nil && fmt.Sprint(sum.Skipped) != fmt.Sprint(tc.skip) {
					t.Errorf("skipped = %v, want %v", sum.Skipped, tc.skip)
				}
				if sum.Stations != len(tc.want) {
					t.Errorf("Summary.Stations = %d, want %d", sum.Stations, len(tc.want))
				}
			}
		})
	}
}

func TestLongErrors(t *testing.T) {
	h := "station,date,variable,value\n"
	tests := []struct {
		name string
		in   string
		opt  Options
		want string
		kind error
	}{
		{"empty file", "", optWQ(), `f.csv:1:1: want a header line station,date,variable,value, got an empty file`, ErrHeader},
		{"unknown column", "station,date,variable,value,unit\n", optWQ(),
			`f.csv:1:29: want station, date, variable, value, qualifier or a column listed to ignore, got "unit"`, ErrHeader},
		{"missing column", "station,date,value\n", optWQ(),
			`f.csv:1:1: want columns station, date, variable and value, got "station,date,value" without variable`, ErrHeader},
		{"repeated column", "station,date,variable,value,date\n", optWQ(),
			`f.csv:1:29: want each column once, got "date" again (first in column 2)`, ErrHeader},
		{"lone CR", "station,date,variable,value\rA,2020-01-01,discharge,1\r", optWQ(),
			`f.csv:1:28: want LF or CRLF line ends, got a lone CR`, ErrHeader},
		{"bad date", h + "A,2020-01-01,discharge,1\nA,2020-1-02,discharge,1\n", optWQ(),
			`f.csv:3:3: date: want an ISO 8601 date YYYY-MM-DD, got "2020-1-02"`, ErrDate},
		{"no such day", h + "A,2023-02-29,discharge,1\n", optWQ(),
			`f.csv:2:3: date: want a calendar day that exists, got "2023-02-29"`, ErrDate},
		{"mistyped year", h + "A,2020-05-01,discharge,1\nA,0202-05-02,discharge,1\n", optWQ(),
			`f.csv:3:3: date: want a date from 1800-01-01 to 2199-12-31, got "0202-05-02"`, ErrDate},
		{"extra field", h + "A,2020-01-01,discharge,1,5\n", optWQ(),
			`f.csv:2:26: want 4 fields, got 5`, ErrFieldCount},
		{"decimal comma", h + "A,2020-01-01,discharge,\"1,5\"\n", optWQ(),
			`f.csv:2:24: value: want a finite decimal number, or empty, NA or NaN if missing, got "1,5"`, ErrValue},
		{"too few fields", h + "A,2020-01-01,discharge\n", optWQ(),
			`f.csv:2:23: want 4 fields, got 3`, ErrFieldCount},
		{"infinite", h + "A,2020-01-01,discharge,Inf\n", optWQ(),
			`f.csv:2:24: value: want a finite decimal number, or empty, NA or NaN if missing, got "Inf"`, ErrValue},
		{"duplicate", h + "A,2020-01-01,discharge,1\nA,2020-01-02,discharge,1\nA,2020-01-01,discharge,2\n", optWQ(),
			`f.csv:4:3: date: want one row per station, date and variable, got a second row for "A", 2020-01-01, discharge (first on line 2)`, ErrDuplicate},
		{"unsorted", h + "A,2020-01-01,discharge,1\nB,2020-01-01,discharge,1\nA,2020-01-02,discharge,2\n", optWQ(),
			`f.csv:4:1: station: want the rows of each station together (sort the file by station), got "A" again after "B" (first on line 2)`, ErrUnsorted},
		{"bare quote", h + "A,2020-01-01,disc\"harge,1\n", optWQ(),
			`f.csv:2:14: variable: want quotes around the whole field, got "disc\"harge"`, ErrQuote},
		{"text after quote", h + "A,\"2020-01-01\"x,discharge,1\n", optWQ(),
			`f.csv:2:3: date: want a comma or the line end after a closing quote, got "\"2020-01-01\"x"`, ErrQuote},
		{"unterminated quote", h + "A,2020-01-01,discharge,\"1\n", optWQ(),
			`f.csv:2:24: value: want a closing quote, got "\"1\n"`, ErrQuote},
		{"empty station", h + ",2020-01-01,discharge,1\n", optWQ(),
			`f.csv:2:1: station: want a station ID, got ""`, ErrField},
		{"empty variable", h + "A,2020-01-01,,1\n", optWQ(),
			`f.csv:2:14: variable: want a variable name, got ""`, ErrField},
		{"error after quoted line break", h + "A,2020-01-01,\"dis\ncharge\",x\n", Options{Vars: []Var{{Name: "dis\ncharge"}}},
			`f.csv:3:9: value: want a finite decimal number, or empty, NA or NaN if missing, got "x"`, ErrValue},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, _, err := ReadAll(strings.NewReader(tc.in), "f.csv", tc.opt)
			if err == nil {
				t.Fatalf("no error, want %s", tc.want)
			}
			if err.Error() != tc.want {
				t.Errorf("error\n %s\nwant\n %s", err, tc.want)
			}
			if !errors.Is(err, tc.kind) {
				t.Errorf("error is not %v", tc.kind)
			}
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Errorf("error is not a *ParseError")
			}
		})
	}
}

func TestOptionsValidate(t *testing.T) {
	tests := []struct {
		opt  Options
		want string
	}{
		{Options{Vars: []Var{{Name: Discharge, Units: "degC"}}}, `series: variable "discharge": units: want a discharge (m3/s or ft3/s), got "degC"`},
		{Options{Vars: []Var{{Name: WaterTemperature, Units: "cfs"}}}, `series: variable "water_temperature": units: want a temperature (degC or degF), got "cfs"`},
		{Options{Vars: []Var{{Name: "x", Range: Range{2, 1}}}}, `series: variable "x": range: want min <= max, got 2..1`},
		{Options{Vars: []Var{{Name: "x"}, {Name: "x"}}}, "series: variable \"x\" listed twice\nseries: source variable \"x\" listed twice"},
		{Options{Vars: []Var{{}}}, "series: variable 1 has no name"},
	}
	for _, tc := range tests {
		err := tc.opt.Validate()
		if err == nil || err.Error() != tc.want {
			t.Errorf("Validate(%+v) = %v, want %s", tc.opt, err, tc.want)
		}
	}
	if err := optWQ("F", "ft³/s").Validate(); err != nil {
		t.Errorf("valid options: %v", err)
	}
}

func TestMaxErrors(t *testing.T) {
	in := "station,date,variable,value\n" +
		"A,2020-01-01,discharge,1\n" +
		"A,2020-01-02,discharge,x\n" +
		"A,2020-01-03,discharge,3\n" +
		"A,2020-01-01,discharge,4\n" +
		"B,2020-13-01,discharge,1\n" +
		"B,2020-01-01,discharge,2\n" +
		"A,2020-01-05,discharge,3\n" +
		"C,2020-01-01,discharge,y\n"
	wantAll := []string{
		`f:3:24: value: want a finite decimal number, or empty, NA or NaN if missing, got "x"`,
		`f:5:3: date: want one row per station, date and variable, got a second row for "A", 2020-01-01, discharge (first on line 2)`,
		`f:6:3: date: want a calendar day that exists, got "2020-13-01"`,
		`f:8:1: station: want the rows of each station together (sort the file by station), got "A" again after "B" (first on line 2)`,
		`f:9:24: value: want a finite decimal number, or empty, NA or NaN if missing, got "y"`,
	}
	for _, tc := range []struct {
		max  int
		want []string
		ids  []string
	}{
		{-1, wantAll, []string{"A", "B", "C"}},
		{5, wantAll, []string{"A", "B", "C"}},
		{2, append(slices.Clone(wantAll[:2]), "f: too many problems: stopped after 2"), []string{"A"}},
	} {
		t.Run(fmt.Sprint(tc.max), func(t *testing.T) {
			opt := optWQ()
			opt.MaxErrors = tc.max
			st, sum, err := ReadAll(strings.NewReader(in), "f", opt)
			if err == nil {
				t.Fatal("no error")
			}
			if got := strings.Split(err.Error(), "\n"); !slices.Equal(got, tc.want) {
				t.Errorf("errors:\n%s\nwant:\n%s", err, strings.Join(tc.want, "\n"))
			}
			var ids []string
			for _, s := range st {
				ids = append(ids, s.ID)
			}
			if !slices.Equal(ids, tc.ids) {
				t.Errorf("stations %v, want %v", ids, tc.ids)
			}
			if tc.max < 0 {
				if sum.Rows != 8 || sum.BadRows != 5 {
					t.Errorf("Rows, BadRows = %d, %d, want 8, 5", sum.Rows, sum.BadRows)
				}
				if c := st[0].Counts[Discharge]; c.Kept != 2 || !sameFloats(st[0].Vars[Discharge], []float64{1, nan, 3}, 0) {
					t.Errorf("A: %v %+v", st[0].Vars[Discharge], c)
				}
			}
			if tc.max < 0 && errors.Is(err, ErrTooMany) {
				t.Error("no limit, but ErrTooMany")
			}
		})
	}
}

// synthLong writes a long file of n stations with daily water temperature
// and discharge over the given years, a few rows missing or blank.
func synthLong(n, years int) []byte {
	var b bytes.Buffer
	b.WriteString("station,date,variable,value\n")
	start := calendar.New(1991, 1, 1)
	days := int(calendar.New(1991+years, 1, 1) - start)
	for s := range n {
		for i := range days {
			d := start + calendar.Date(i)
			if (i*7+s*13)%101 == 0 {
				continue // missing row
			}
			w := 10 + 8*math.Cos(2*math.Pi*float64(i-200+s)/365.25) + float64((i*31+s)%17)/10
			fmt.Fprintf(&b, "ST%04d,%s,water_temperature,%.2f\n", s+1, d, w)
			if (i+s)%499 == 0 {
				fmt.Fprintf(&b, "ST%04d,%s,discharge,\n", s+1, d)
				continue
			}
			fmt.Fprintf(&b, "ST%04d,%s,discharge,%.3f\n", s+1, d, 5+float64((i*i+s)%97)/7)
		}
	}
	return b.Bytes()
}

// The output of Map does not depend on the number of workers.
func TestMapDeterministic(t *testing.T) {
	data := synthLong(13, 1)
	run := func(workers int) string {
		var out []string
		_, err := Map(bytes.NewReader(data), "synth", optWQ(), workers,
			func(s *Station) (string, error) {
				return fmt.Sprintf("%s %v %d %.6f %.6f", s.ID, s.Start, s.Days,
					sum(s.Vars[WaterTemperature]), sum(s.Vars[Discharge])), nil
			},
			func(s string) error { out = append(out, s); return nil })
		if err != nil {
			t.Fatal(err)
		}
		return strings.Join(out, "\n")
	}
	want := run(1)
	if strings.Count(want, "\n") != 12 {
		t.Fatalf("want 13 stations, got\n%s", want)
	}
	for _, w := range []int{2, 5, 16} {
		if got := run(w); got != want {
			t.Errorf("workers=%d differs from workers=1", w)
		}
	}
}

func sum(x []float64) float64 {
	s := 0.0
	for _, v := range x {
		if !math.IsNaN(v) {
			s += v
		}
	}
	return s
}

// Errors from f and emit stop Map and come back as they are.
func TestMapStops(t *testing.T) {
	data := synthLong(40, 1)
	boom := errors.New("boom")
	n := 0
	_, err := Map(bytes.NewReader(data), "synth", optWQ(), 4,
		func(s *Station) (string, error) {
			if s.ID == "ST0007" {
				return "", boom
			}
			return s.ID, nil
		},
		func(string) error { n++; return nil })
	if err != boom || n != 6 {
		t.Errorf("f error: err %v after %d stations, want boom after 6", err, n)
	}
	n = 0
	_, err = Map(bytes.NewReader(data), "synth", optWQ(), 4,
		func(s *Station) (string, error) { return s.ID, nil },
		func(id string) error {
			n++
			if id == "ST0003" {
				return boom
			}
			return nil
		})
	if err != boom || n != 3 {
		t.Errorf("emit error: err %v after %d stations, want boom after 3", err, n)
	}
}

// A small read buffer moves station blocks across refills and copies.
type oneByteReader struct{ b []byte }

func (r *oneByteReader) Read(p []byte) (int, error) {
	if len(r.b) == 0 {
		return 0, errEOF
	}
	n := copy(p[:min(len(p), 7)], r.b)
	r.b = r.b[n:]
	return n, nil
}

var errEOF = fmt.Errorf("wrapped: %w", errors.New("not io.EOF"))

func TestReadError(t *testing.T) {
	data := "station,date,variable,value\nA,2020-01-01,discharge,1\n"
	_, _, err := ReadAll(&oneByteReader{[]byte(data)}, "r", optWQ())
	if err == nil || !errors.Is(err, errEOF) || !strings.HasPrefix(err.Error(), "r: line 3: ") {
		t.Errorf("err = %v, want the read error with its place", err)
	}
}

func TestLongBlocksAcrossReads(t *testing.T) {
	data := synthLong(3, 2)
	want, _, err := ReadAll(bytes.NewReader(data), "a", optWQ())
	if err != nil {
		t.Fatal(err)
	}
	got, _, err := ReadAll(&smallReader{data, 4093}, "b", optWQ())
	if err != nil {
		t.Fatal(err)
	}
	if len(got) != len(want) {
		t.Fatalf("%d stations, want %d", len(got), len(want))
	}
	for i := range want {
		for name, x := range want[i].Vars {
			if !sameFloats(got[i].Vars[name], x, 0) {
				t.Errorf("%s %s differs", want[i].ID, name)
			}
		}
	}
}

type smallReader struct {
	b []byte
	n int
}

func (r *smallReader) Read(p []byte) (int, error) {
	if len(r.b) == 0 {
		return 0, io.EOF
	}
	n := copy(p[:min(len(p), r.n)], r.b)
	r.b = r.b[n:]
	return n, nil
}

func TestTooLong(t *testing.T) {
	in := "station,date,variable,value\n" + strings.Repeat("x", maxRecord+10)
	_, _, err := ReadAll(strings.NewReader(in), "big", optWQ())
	if !errors.Is(err, ErrTooLong) || !strings.HasPrefix(err.Error(), "big:2:1: ") {
		t.Errorf("err = %v", err)
	}
}
