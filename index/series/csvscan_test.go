package series

import (
	"bytes"
	"encoding/csv"
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// records splits data into records and fields with scanRecord and
// fields.split, skipping empty lines as encoding/csv does.
func records(data []byte) ([][]string, bool) {
	var out [][]string
	var fs fields
	for pos := 0; pos < len(data); {
		n, adv, _, more := scanRecord(data[pos:], true)
		if more || adv == 0 {
			return nil, false
		}
		rec := data[pos : pos+n]
		pos += adv
		if len(rec) == 0 {
			continue
		}
		if fs.split(rec) != nil {
			return out, false
		}
		var r []string
		for _, f := range fs.f {
			r = append(r, string(f))
		}
		out = append(out, r)
	}
	return out, true
}

// The record scanner agrees with encoding/csv (Go standard library, RFC
// 4180) on files without carriage returns, which encoding/csv rewrites.
func TestScanAgainstEncodingCSV(t *testing.T) {
	for _, in := range []string{
		"a,b,c\n",
		"a,\"b,c\",d\n",
		"\"a\"\"b\",c\n",
		"\"multi\nline\",x\ny,z",
		"\n\na,b\n\n",
		"a,\"\"\n",
		",,\n",
		"\"\",\"\"\"\"\n",
	} {
		checkAgainstCSV(t, in)
	}
	for _, bad := range []string{"a\"b,c\n", "\"a\"b,c\n", "\"abc\n"} {
		if _, ok := records([]byte(bad)); ok {
			t.Errorf("%q: accepted", bad)
		}
		checkAgainstCSV(t, bad)
	}
}

func checkAgainstCSV(t *testing.T, in string) {
	t.Helper()
	if strings.Contains(in, "\r") {
		return
	}
	cr := csv.NewReader(strings.NewReader(in))
	cr.FieldsPerRecord = -1
	want, err := cr.ReadAll()
	got, ok := records([]byte(in))
	if (err == nil) != ok {
		t.Fatalf("%q: encoding/csv err %v, scanner ok %v", in, err, ok)
	}
	if ok && !slices.EqualFunc(got, want, slices.Equal) {
		t.Fatalf("%q: got %q, encoding/csv %q", in, got, want)
	}
}

func FuzzScan(f *testing.F) {
	for _, s := range []string{"a,b\n", "\"a,\"\"b\"\n\"c\nd\",e", "a\"b\n", "\"x\"y\n,\n"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, in string) {
		checkAgainstCSV(t, in)
	})
}

func TestParseFloat(t *testing.T) {
	good := []string{"0", "-0", "+1", "1.", ".5", "12.34", "-0.001", "1e3", "1E-3", "2.5e+2",
		"123456789012345", "1234567890123456789", "0.30000000000000004", "1e22", "1e23", "1e-22",
		"9007199254740993", "4.9e-324", "1.7976931348623157e308", "000012.5000", "1e-400"}
	for _, s := range good {
		want, err := strconv.ParseFloat(s, 64) // Go standard library: correctly rounded
		got, ok := parseFloat([]byte(s))
		if !ok || got != want || math.Signbit(got) != math.Signbit(want) {
			t.Errorf("parseFloat(%q) = %v, %v; strconv %v, %v", s, got, ok, want, err)
		}
	}
	bad := []string{"", "-", ".", "e5", "1e", "1e+", "1.2.3", " 1", "1 ", "0x10", "1_000", "Inf", "NaN",
		"1,5", "1e400", "--1", "+-1", "1e5.5"}
	for _, s := range bad {
		if x, ok := parseFloat([]byte(s)); ok {
			t.Errorf("parseFloat(%q) = %v, want not ok", s, x)
		}
	}
}

// parseFloat agrees with strconv.ParseFloat on every decimal number it
// accepts and accepts nothing strconv would reject.
func FuzzParseFloat(f *testing.F) {
	for _, s := range []string{"1.5", "-0.25e3", "123456789.123456789", "1e-5"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		got, ok := parseFloat([]byte(s))
		if !ok {
			return
		}
		want, err := strconv.ParseFloat(s, 64)
		if err != nil && !isRangeErr(err) || got != want {
			t.Fatalf("parseFloat(%q) = %v; strconv %v, %v", s, got, want, err)
		}
	})
}

func isRangeErr(err error) bool {
	ne, ok := err.(*strconv.NumError)
	return ok && ne.Err == strconv.ErrRange
}

func TestIsMissing(t *testing.T) {
	for _, s := range []string{"", "NA", "na", "NaN", "nan", "NAN"} {
		if !isMissing([]byte(s)) {
			t.Errorf("%q not missing", s)
		}
	}
	for _, s := range []string{"N", "NAA", "0", "-", "n/a"} {
		if isMissing([]byte(s)) {
			t.Errorf("%q missing", s)
		}
	}
}

// FuzzLong: reading never panics; every error prints with its place; what
// was read, written and read again keeps its values.
func FuzzLong(f *testing.F) {
	f.Add([]byte("station,date,variable,value\nA,2020-01-01,discharge,1\nA,2020-01-03,water_temperature,2.5\n"))
	f.Add([]byte("\xef\xbb\xbfvalue,station,variable,date,qualifier\r\n\"1,5\",\"A\"\"B\",discharge,2020-02-29,P\r\n"))
	f.Add([]byte("station,date,variable,value\n\"A\nB\",2020-01-01,discharge,NA\nA,2020-01-01,discharge,\n"))
	f.Add([]byte("station,date,variable,value\nA,2020-01-01,discharge,1\nB,2020-01-01,discharge,1\nA,2020-01-01,discharge,1\n"))
	opt := Options{Vars: []Var{{Name: Discharge, Units: "cfs"}, {Name: WaterTemperature, Range: Range{-5, 45}}},
		Exclude: []string{"P"}, MaxErrors: -1}
	f.Fuzz(func(t *testing.T, data []byte) {
		st, _, err := ReadAll(bytes.NewReader(data), "fuzz", opt)
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz:") {
				t.Fatalf("error without place: %v", err)
			}
		}
		var buf bytes.Buffer
		if err := WriteLong(&buf, st); err != nil {
			t.Fatal(err)
		}
		again, _, err := ReadAll(&buf, "again", Options{Vars: []Var{{Name: Discharge}, {Name: WaterTemperature}}})
		if err != nil {
			t.Fatalf("reading what was written: %v\n%s", err, buf.Bytes())
		}
		checkSameValues(t, st, again)
	})
}

// checkSameValues checks that b holds the values of a, day by day; b may
// drop leading and trailing days and stations without values.
func checkSameValues(t *testing.T, a, b []*Station) {
	t.Helper()
	byID := map[string]*Station{}
	for _, s := range b {
		byID[s.ID] = s
	}
	for _, s := range a {
		for name, x := range s.Vars {
			o := byID[s.ID]
			for i, v := range x {
				got := math.NaN()
				if o != nil {
					if y := o.Vars[name]; y != nil {
						if j := o.Index(s.Date(i)); j >= 0 && j < len(y) {
							got = y[j]
						}
					}
				}
				if !(got == v || math.IsNaN(got) && math.IsNaN(v)) {
					t.Fatalf("%s %s %v: read back %v, want %v", s.ID, name, s.Date(i), got, v)
				}
			}
		}
	}
}
