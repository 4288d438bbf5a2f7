package attributes

import (
	"encoding/csv"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

const good = "station,name,latitude,longitude,drainage_area_km2,forest_pct,group\n" +
	"ALD-01,Aldwater at Fennick Ford,44.512,-71.204,112.5,61,upland\n" +
	"ALD-02,\"Aldwater, lower\",44.401,-71.090,,48.5,upland\n" +
	"KES-01,Kestrel Fork below Dam,43.998,-70.870,305,35,regulated\n"

func TestReadCSV(t *testing.T) {
	for _, variant := range []struct{ name, text string }{
		{"plain", good},
		{"bom+crlf", "\uFEFF" + strings.ReplaceAll(good, "\n", "\r\n")},
	} {
		t.Run(variant.name, func(t *testing.T) {
			tab, errs := ReadCSV(strings.NewReader(variant.text), "stations.csv")
			if len(errs) > 0 {
				t.Fatal(errs)
			}
			if len(tab.Stations) != 3 || tab.Rows != 3 || !tab.HasGroup {
				t.Fatalf("got %+v", tab)
			}
			if got := strings.Join(tab.Columns, ","); got != "drainage_area_km2,forest_pct" {
				t.Errorf("columns %s", got)
			}
			s, ok := tab.Station("ALD-02")
			if !ok || s.Name != "Aldwater, lower" || s.Line != 3 || s.Group != "upland" || s.Longitude != -71.09 {
				t.Errorf("ALD-02 = %+v", s)
			}
			area, _ := tab.Column("drainage_area_km2")
			if !math.IsNaN(area[1]) || area[2] != 305 {
				t.Errorf("area = %v", area)
			}
		})
	}
}

func TestReadCSVErrors(t *testing.T) {
	head := "station,name,latitude,longitude,forest_pct\n"
	tests := []struct {
		name string
		text string
		want []string
	}{
		{"empty file", "", []string{"s.csv: the file is empty"}},
		{"header only", head, []string{"s.csv: the file has a header row but no data rows"}},
		{"missing column", "station,name,latitude\nA,a,1\n", []string{`s.csv:1: required column is missing: "longitude"`}},
		{"duplicate header", "station,name,latitude,longitude,name\nA,a,1,2,b\n", []string{`column "name" appears twice`}},
		{"duplicate station", head + "A,a,1,2,3\nB,b,1,2,3\nA,c,1,2,3\n", []string{`s.csv:4:1: station: duplicate station "A" (first on line 2)`}},
		{"latitude out of range", head + "A,a,91.5,2,3\n", []string{`s.csv:2:5: latitude: out of range: want decimal degrees in [-90, 90], got 91.5`}},
		{"longitude not a number", head + "A,a,1,east,3\n", []string{`s.csv:2:7: longitude: want decimal degrees, got "east"`}},
		{"blank latitude", head + "A,a,,2,3\n", []string{`s.csv:2:5: latitude: want decimal degrees, got a blank cell`}},
		{"NaN attribute", head + "A,a,1,2,NaN\n", []string{`s.csv:2:9: forest_pct: want a finite number, got "NaN"`}},
		{"text in numeric column", head + "A,a,1,2,high\n", []string{`s.csv:2:9: forest_pct: want a finite number, got "high"`}},
		{"too many fields", head + "A,a,1,2,3,4\n", []string{`s.csv:2:11: want 5 fields like the header, got 6`}},
		{"too few fields", head + "A,a,1,2\n", []string{`s.csv:2: want 5 fields like the header, got 4`}},
		{"blank station", head + ",a,1,2,3\n", []string{`s.csv:2:1: station: want a station identifier`}},
		{"bad quoting", head + "A,\"a,1,2,3\n", []string{`s.csv:2:`}},
		{"all problems listed", head + "A,a,95,2,x\nA,a,1,200,3\n", []string{"latitude", "forest_pct", "duplicate station", "longitude"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			tab, errs := ReadCSV(strings.NewReader(tc.text), "s.csv")
			if len(errs) == 0 {
				t.Fatalf("no error; table %+v", tab)
			}
			var all []string
			for _, e := range errs {
				all = append(all, e.Error())
			}
			joined := strings.Join(all, "\n")
			for _, w := range tc.want {
				if !strings.Contains(joined, w) {
					t.Errorf("want %q in:\n%s", w, joined)
				}
			}
		})
	}
}

func TestReadXLSX(t *testing.T) {
	path := filepath.Join(t.TempDir(), "stations.xlsx")
	f := excelize.NewFile()
	recs, _ := csv.NewReader(strings.NewReader(good)).ReadAll()
	for i, rec := range recs {
		for j, v := range rec {
			cell, _ := excelize.CoordinatesToCellName(j+1, i+1)
			if x, _, err := parseNum(v); err == nil && i > 0 && j >= 2 && j <= 5 && v != "" {
				f.SetCellFloat("Sheet1", cell, x, -1, 64)
			} else {
				f.SetCellStr("Sheet1", cell, v)
			}
		}
	}
	// A display format with fewer decimals must not change the value read.
	style, _ := f.NewStyle(&excelize.Style{NumFmt: 2})
	f.SetCellStyle("Sheet1", "C2", "D4", style)
	if err := f.SaveAs(path); err != nil {
		t.Fatal(err)
	}
	tab, errs := Load(path)
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	s, _ := tab.Station("ALD-01")
	if s.Latitude != 44.512 || s.Longitude != -71.204 || s.Values[0] != 112.5 {
		t.Fatalf("ALD-01 = %+v", s)
	}

	// A bad cell is reported by sheet and cell reference.
	f.SetCellStr("Sheet1", "C3", "north")
	if err := f.SaveAs(path); err != nil {
		t.Fatal(err)
	}
	_, errs = Load(path)
	if len(errs) != 1 || !strings.Contains(errs[0].Error(), `stations.xlsx:Sheet1!C3: latitude: want decimal degrees, got "north"`) {
		t.Fatalf("errs = %v", errs)
	}
}

func parseNum(s string) (float64, bool, error) {
	x, err := strconv.ParseFloat(s, 64)
	return x, err == nil, err
}

func FuzzReadCSV(f *testing.F) {
	f.Add(good)
	f.Add("station,name,latitude,longitude\nA,a,1,2\n")
	f.Add("\uFEFFstation,name,latitude,longitude,group\r\nA,\"x\"\"y\",-90,180,g\r\n")
	f.Fuzz(func(t *testing.T, text string) {
		tab, errs := ReadCSV(strings.NewReader(text), "f.csv")
		for _, e := range errs {
			_ = e.Error()
		}
		if len(errs) == 0 {
			// A valid table has unique stations within coordinate ranges.
			seen := map[string]bool{}
			for _, s := range tab.Stations {
				if seen[s.ID] || math.Abs(s.Latitude) > 90 || math.Abs(s.Longitude) > 180 {
					t.Fatalf("invalid station accepted: %+v", s)
				}
				seen[s.ID] = true
			}
		}
	})
}
