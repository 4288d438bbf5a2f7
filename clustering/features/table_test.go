package features

import (
	"bytes"
	"errors"
	"math"
	"strings"
	"testing"

	"rebound/index/series"
)

func TestReadTable(t *testing.T) {
	in := "\xef\xbb\xbfstation,water_temperature.mean,discharge.bfi\r\n" +
		"\"Mill Creek, upper\",12.5,0.61\r\n" +
		"MC-02,,NA\r\n" +
		"MC-03,-1e-3,NaN\r\n"
	tab, err := ReadTable(strings.NewReader(in), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	if len(tab.Names) != 2 || tab.Names[1] != "discharge.bfi" || len(tab.Stations) != 3 || tab.Stations[0] != "Mill Creek, upper" {
		t.Fatalf("table %+v", tab)
	}
	want := []float64{12.5, 0.61, nan, nan, -0.001, nan}
	if !sameData(tab.Data, want) {
		t.Errorf("data %v, want %v", tab.Data, want)
	}
	if r := tab.Row(2); len(r) != 2 || r[0] != -0.001 {
		t.Errorf("row 2 = %v", r)
	}
}

func TestReadTableErrors(t *testing.T) {
	tests := []struct {
		name, in, want string
		kind           error
	}{
		{"empty", "", "t:1:1: want a header line station,<feature>,..., got an empty file", series.ErrHeader},
		{"first column", "id,a\n", `t:1:1: want "station" as the first column, got "id"`, series.ErrHeader},
		{"repeated feature", "station,a,b,a\n", `t:1:13: want each feature once, got "a" again (first in column 2)`, series.ErrHeader},
		{"empty feature", "station,a,\n", `t:1:11: want a feature name, got ""`, series.ErrHeader},
		{"bad number", "station,a,b\nS1,1,2\nS2,3,1;5\n", `t:3:6: b: want a finite decimal number, or empty, NA or NaN if missing, got "1;5"`, series.ErrValue},
		{"infinite", "station,a\nS1,Inf\n", `t:2:4: a: want a finite decimal number, or empty, NA or NaN if missing, got "Inf"`, series.ErrValue},
		{"field count", "station,a,b\nS1,1\n", `t:2:1: want 3 fields, got 2`, series.ErrFieldCount},
		{"repeated station", "station,a\nS1,1\nS2,1\nS1,2\n", `t:4:1: station: want one row per station, got "S1" again (first on line 2)`, series.ErrDuplicate},
		{"empty station", "station,a\n,1\n", `t:2:1: station: want a station ID, got ""`, series.ErrField},
		{"quote", "station,a\nS\"1,1\n", `t:2:2: want RFC 4180 quoting, got bare " in non-quoted-field`, series.ErrQuote},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := ReadTable(strings.NewReader(tc.in), "t")
			if err == nil || err.Error() != tc.want {
				t.Errorf("err\n %v\nwant\n %s", err, tc.want)
			}
			if !errors.Is(err, tc.kind) {
				t.Errorf("err is not %v", tc.kind)
			}
		})
	}
}

// FuzzReadTable: no panic, errors carry their place, and a table read,
// written and read again keeps its values.
func FuzzReadTable(f *testing.F) {
	f.Add("station,a,b\nS1,1.5,\n\"S,2\",NA,-3e2\n")
	f.Add("\xef\xbb\xbfstation\r\nS1\r\n")
	f.Add("station,a\nS1,0x10\n")
	f.Fuzz(func(t *testing.T, in string) {
		tab, err := ReadTable(strings.NewReader(in), "fuzz")
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz:") {
				t.Fatalf("error without place: %v", err)
			}
			return
		}
		var buf bytes.Buffer
		if err := WriteTable(&buf, tab); err != nil {
			t.Fatal(err)
		}
		again, err := ReadTable(&buf, "again")
		if err != nil {
			t.Fatalf("reading what was written: %v\n%q", err, buf.String())
		}
		if len(again.Stations) != len(tab.Stations) || len(again.Names) != len(tab.Names) || !sameData(again.Data, tab.Data) {
			t.Fatalf("round trip: %+v, want %+v", again, tab)
		}
		for i := range tab.Stations {
			if again.Stations[i] != tab.Stations[i] {
				t.Fatalf("station %q read back as %q", tab.Stations[i], again.Stations[i])
			}
		}
		for _, x := range tab.Data {
			if math.IsInf(x, 0) {
				t.Fatal("infinite value accepted")
			}
		}
	})
}
