package series

import (
	"bytes"
	"errors"
	"strings"
	"testing"
)

func TestReadWide(t *testing.T) {
	in := "\xef\xbb\xbfdate,A,\"B, lower\",C\r\n" +
		"2020-01-03,3,,\r\n" +
		"2020-01-01,1,NA,\r\n" +
		"2020-01-02,,50,\r\n" +
		"2020-01-04,99,60,\r\n"
	v := Var{Name: WaterTemperature, Units: "degF", Range: Range{-5, 45}}
	st, sum, err := ReadWide(strings.NewReader(in), "w.csv", v, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(st) != 3 || st[0].ID != "A" || st[1].ID != "B, lower" || st[2].ID != "C" {
		t.Fatalf("stations %v", st)
	}
	// (F − 32)·5/9 (common practice): 1 °F and 3 °F are below −5 °C and
	// dropped; 99 °F = 335/9 °C is kept.
	a := st[0]
	if a.Start.String() != "2020-01-01" || !sameFloats(a.Vars[WaterTemperature], []float64{nan, nan, nan, 335.0 / 9}, 1e-12) {
		t.Errorf("A: %v %v", a.Start, a.Vars[WaterTemperature])
	}
	if c := *a.Counts[WaterTemperature]; c != (Counts{Rows: 4, Kept: 1, Blank: 1, OutOfRange: 2, Converted: 3}) {
		t.Errorf("A counts %+v", c)
	}
	b := st[1]
	if b.Start.String() != "2020-01-02" || !sameFloats(b.Vars[WaterTemperature], []float64{10, nan, 140.0 / 9}, 1e-12) {
		t.Errorf("B: %v %v", b.Start, b.Vars[WaterTemperature])
	}
	if st[2].Days != 0 || len(st[2].Vars) != 0 {
		t.Errorf("C: %+v", st[2])
	}
	if sum.Rows != 4 || sum.Stations != 3 {
		t.Errorf("summary %+v", sum)
	}
}

func TestReadWideErrors(t *testing.T) {
	v := Var{Name: Discharge}
	tests := []struct {
		name, in, want string
		kind           error
	}{
		{"empty", "", "w:1:1: want a header line date,<station>,..., got an empty file", ErrHeader},
		{"first column", "day,A\n", `w:1:1: want "date" as the first column, got "day"`, ErrHeader},
		{"repeated station", "date,A,B,A\n", `w:1:10: want each station once, got "A" again (first in column 2)`, ErrHeader},
		{"empty station", "date,A,,B\n", `w:1:8: want a station ID, got ""`, ErrHeader},
		{"bad date", "date,A\n2020-01-01,1\n01/02/2020,2\n", `w:3:1: date: want an ISO 8601 date YYYY-MM-DD, got "01/02/2020"`, ErrDate},
		{"mistyped year", "date,A\n2020-01-01,1\n2200-01-02,2\n", `w:3:1: date: want a date from 1800-01-01 to 2199-12-31, got "2200-01-02"`, ErrDate},
		{"repeated date", "date,A\n2020-01-01,1\n2020-01-02,1\n2020-01-01,2\n", `w:4:1: date: want one row per date, got 2020-01-01 again (first on line 2)`, ErrDuplicate},
		{"bad value", "date,A,B\n2020-01-01,1,1..5\n", `w:2:14: B: want a finite decimal number, or empty, NA or NaN if missing, got "1..5"`, ErrValue},
		{"field count", "date,A,B\n2020-01-01,1\n", `w:2:1: want 3 fields, got 2`, ErrFieldCount},
		{"bare quote", "date,A\n2020-01-01,1\"\n", `w:2:13: want RFC 4180 quoting, got bare " in non-quoted-field`, ErrQuote},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, _, err := ReadWide(strings.NewReader(tc.in), "w", v, Options{})
			if err == nil || err.Error() != tc.want {
				t.Errorf("err\n %v\nwant\n %s", err, tc.want)
			}
			if !errors.Is(err, tc.kind) {
				t.Errorf("err is not %v", tc.kind)
			}
		})
	}
}

func TestReadWideMaxErrors(t *testing.T) {
	in := "date,A,B\n2020-01-01,x,1\n2020-01-02,2,y\n2020-01-03,3,3\n2020-01-0x,4,4\n"
	st, sum, err := ReadWide(strings.NewReader(in), "w", Var{Name: Discharge}, Options{MaxErrors: -1})
	want := `w:2:12: A: want a finite decimal number, or empty, NA or NaN if missing, got "x"` + "\n" +
		`w:3:14: B: want a finite decimal number, or empty, NA or NaN if missing, got "y"` + "\n" +
		`w:5:1: date: want an ISO 8601 date YYYY-MM-DD, got "2020-01-0x"`
	if err == nil || err.Error() != want {
		t.Errorf("err\n%v\nwant\n%s", err, want)
	}
	if sum.BadRows != 3 || !sameFloats(st[0].Vars[Discharge], []float64{2, 3}, 0) || !sameFloats(st[1].Vars[Discharge], []float64{1, nan, 3}, 0) {
		t.Errorf("got %v %v, summary %+v", st[0].Vars, st[1].Vars, sum)
	}
	_, _, err = ReadWide(strings.NewReader(in), "w", Var{Name: Discharge}, Options{MaxErrors: 1})
	if !errors.Is(err, ErrTooMany) || strings.Count(err.Error(), "\n") != 1 {
		t.Errorf("MaxErrors 1: %v", err)
	}
}

// FuzzWide: no panic, errors print with their place, and a written-then-read
// round trip keeps the values.
func FuzzWide(f *testing.F) {
	f.Add([]byte("date,A,B\n2020-01-01,1,\n2020-01-03,,2.5\n"))
	f.Add([]byte("\xef\xbb\xbfdate,\"A,\"\"x\"\"\",B\r\n2020-02-29,NA,1e3\r\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		v := Var{Name: Discharge, Units: "cfs"}
		st, _, err := ReadWide(bytes.NewReader(data), "fuzz", v, Options{MaxErrors: -1})
		if err != nil && !strings.HasPrefix(err.Error(), "fuzz:") {
			t.Fatalf("error without place: %v", err)
		}
		var buf bytes.Buffer
		if err := WriteWide(&buf, st, Discharge); err != nil {
			t.Fatal(err)
		}
		again, _, err := ReadWide(&buf, "again", Var{Name: Discharge}, Options{})
		if err != nil {
			if len(st) == 0 {
				return // nothing to write: no header
			}
			t.Fatalf("reading what was written: %v\n%q", err, buf.Bytes())
		}
		checkSameValues(t, st, again)
	})
}

func TestMerge(t *testing.T) {
	in := "station,date,variable,value\nA,2020-01-02,water_temperature,2\nA,2020-01-03,water_temperature,3\n"
	a, _, err := ReadAll(strings.NewReader(in), "l", Options{Vars: []Var{{Name: WaterTemperature}}})
	if err != nil {
		t.Fatal(err)
	}
	w, _, err := ReadWide(strings.NewReader("date,A\n2020-01-01,10\n2020-01-02,20\n"), "w", Var{Name: Discharge}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	m, err := Merge(a[0], w[0])
	if err != nil {
		t.Fatal(err)
	}
	if m.Start.String() != "2020-01-01" || m.Days != 3 ||
		!sameFloats(m.Vars[WaterTemperature], []float64{nan, 2, 3}, 0) ||
		!sameFloats(m.Vars[Discharge], []float64{10, 20, nan}, 0) || m.Counts[Discharge].Kept != 2 {
		t.Errorf("merged %v %d %v", m.Start, m.Days, m.Vars)
	}
	if _, err := Merge(m, w[0]); err == nil {
		t.Error("merging a variable twice: no error")
	}
	w[0].ID = "B"
	if _, err := Merge(m, w[0]); err == nil {
		t.Error("merging two stations: no error")
	}
}

func TestMapStations(t *testing.T) {
	var st []*Station
	for i := range 50 {
		st = append(st, &Station{ID: string(rune('A' + i))})
	}
	for _, w := range []int{1, 3, 8} {
		var got []string
		err := MapStations(st, w, func(s *Station) (string, error) { return s.ID + s.ID, nil },
			func(s string) error { got = append(got, s); return nil })
		if err != nil || len(got) != 50 || got[0] != "AA" || got[49] != string(rune('A'+49))+string(rune('A'+49)) {
			t.Errorf("workers %d: %v %v", w, err, got)
		}
	}
	boom := errors.New("boom")
	n := 0
	err := MapStations(st, 4, func(s *Station) (int, error) {
		if s.ID == "K" {
			return 0, boom
		}
		return 1, nil
	}, func(int) error { n++; return nil })
	if err != boom || n != 10 {
		t.Errorf("err %v after %d", err, n)
	}
}
