package workbook

import (
	"archive/zip"
	"bytes"
	"encoding/csv"
	"flag"
	"fmt"
	"html"
	"io"
	"maps"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/cmd/rebound/internal/testrun"
	"rebound/cmd/rebound/internal/view"
)

var update = flag.Bool("update", false, "rewrite golden files")

func open(t *testing.T, data []byte) *excelize.File {
	t.Helper()
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { f.Close() })
	return f
}

func csvRows(t *testing.T, write func(io.Writer, *pipeline.Run) error, r *pipeline.Run) [][]string {
	t.Helper()
	var buf bytes.Buffer
	if err := write(&buf, r); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows
}

// sameNumber compares a cell read back with a CSV field: both blank, or
// numbers equal to 1e-12 relative (the CSV keeps 12 significant digits).
func sameNumber(cellText, field string) bool {
	if cellText == "" || field == "" {
		return cellText == field
	}
	a, err1 := strconv.ParseFloat(cellText, 64)
	b, err2 := strconv.ParseFloat(field, 64)
	return err1 == nil && err2 == nil && math.Abs(a-b) <= 1e-11*math.Max(1, math.Abs(b))
}

// raw reads a cell's stored value, not its formatted text.
func raw(t *testing.T, f *excelize.File, sheet, ref string) string {
	t.Helper()
	v, err := f.GetCellValue(sheet, ref, excelize.Options{RawCellValue: true})
	if err != nil {
		t.Fatal(err)
	}
	return v
}

func header(t *testing.T, f *excelize.File, sheet string) map[string]int {
	t.Helper()
	rows, err := f.GetRows(sheet)
	if err != nil || len(rows) == 0 {
		t.Fatalf("%s: %v", sheet, err)
	}
	h := map[string]int{}
	for j, name := range rows[0] {
		h[name] = j + 1
	}
	return h
}

func TestDemoMatchesCSV(t *testing.T) {
	r, man := testrun.Demo(t)
	e := view.Of(r)
	data, err := render(r, man, e)
	if err != nil {
		t.Fatal(err)
	}
	f := open(t, data)

	want := []string{SheetSummary, SheetRanking, SheetIndicators, SheetWeights, SheetEvents, SheetSeverity, SheetCriteria,
		SheetClusters, SheetProfiles, SheetSensitivity, SheetMethod, SheetInputs, SheetWarnings}
	if !hasCriteria(r) {
		want = slices.DeleteFunc(want, func(s string) bool { return s == SheetCriteria })
	}
	if got := f.GetSheetList(); !slices.Equal(got, want) {
		t.Errorf("sheets %q, want %q", got, want)
	}
	// The Severity sheet's heat-wave counts of the first station agree with
	// the distinct heat waves of the events table.
	sevRows, err := f.GetRows(SheetSeverity)
	if err != nil || len(sevRows) < 2 {
		t.Fatalf("Severity sheet: %v, %d rows", err, len(sevRows))
	}
	st := sevRows[1][0]
	ids := map[string]bool{}
	for _, e := range r.Events.Events {
		if e.Station == st && e.Kind == "heatwave" {
			ids[e.ID] = true
		}
	}
	sum := 0
	for _, c := range sevRows[1][1:6] {
		n, _ := strconv.Atoi(c)
		sum += n
	}
	if sum != len(ids) || sum == 0 {
		t.Errorf("Severity sheet: %s has %d heat waves by class, the events table %d", st, sum, len(ids))
	}

	// Ranking: the same rows as ranking.csv.
	rk := csvRows(t, report.WriteRanking, r)
	h := header(t, f, SheetRanking)
	cols := map[string]string{"rank": "Rank", "station": "Station", "name": "Name", "group": "Group",
		"score": "Score (0–100, higher = more resilient)", "events": "Events", "latitude": "Latitude (° N)", "longitude": "Longitude (° E)"}
	for k, row := range rk[1:] {
		for c, name := range rk[0] {
			head, ok := cols[name]
			if !ok {
				continue
			}
			got := raw(t, f, SheetRanking, cell(h[head], k+2))
			if name == "station" || name == "name" || name == "group" {
				if got != row[c] {
					t.Errorf("Ranking row %d %s = %q, ranking.csv has %q", k+2, name, got, row[c])
				}
			} else if !sameNumber(got, row[c]) {
				t.Errorf("Ranking row %d %s = %q, ranking.csv has %q", k+2, name, got, row[c])
			}
		}
		flags := raw(t, f, SheetRanking, cell(h["Flags"], k+2))
		if strings.ReplaceAll(flags, "; ", ";") != row[8] {
			t.Errorf("Ranking row %d flags %q, ranking.csv has %q", k+2, flags, row[8])
		}
	}
	if got := raw(t, f, SheetRanking, cell(h["Median rank"], 2)); got == "" {
		t.Error("Ranking has no median rank although sensitivity ran")
	}

	// Indicators: the same rows as indicators.csv.
	ic := csvRows(t, report.WriteIndicators, r)
	h = header(t, f, SheetIndicators)
	icols := map[string]string{"raw": "Raw value", "normalized": "Normalised (0–1, higher = more resilient)",
		"weight": "Weight used (sum 1)", "contribution": "Contribution (score points)"}
	for k, row := range ic[1:] {
		if got := raw(t, f, SheetIndicators, cell(h["Station"], k+2)); got != row[0] {
			t.Fatalf("Indicators row %d station %q, indicators.csv has %q", k+2, got, row[0])
		}
		if got := raw(t, f, SheetIndicators, cell(h["Indicator"], k+2)); got != row[1] {
			t.Errorf("Indicators row %d indicator %q, indicators.csv has %q", k+2, got, row[1])
		}
		for c, name := range ic[0] {
			if head, ok := icols[name]; ok {
				if got := raw(t, f, SheetIndicators, cell(h[head], k+2)); !sameNumber(got, row[c]) {
					t.Errorf("Indicators row %d %s = %q, indicators.csv has %q", k+2, name, got, row[c])
				}
			}
		}
		if got := raw(t, f, SheetIndicators, cell(h["Status"], k+2)); got != row[7] {
			t.Errorf("Indicators row %d status %q, indicators.csv has %q", k+2, got, row[7])
		}
	}

	// Inputs: every input with its digest.
	for k, in := range r.Inputs {
		if got := raw(t, f, SheetInputs, cell(3, k+2)); got != in.SHA256 {
			t.Errorf("Inputs row %d: SHA-256 %q, want %q", k+2, got, in.SHA256)
		}
	}

	// Charts: score bars, rank intervals, tornado and cluster scatter,
	// each pointing at its data.
	charts := chartRefs(t, data)
	if len(charts) != 4 {
		t.Fatalf("%d charts, want 4: %v", len(charts), charts)
	}
	for _, want := range []string{"'Ranking'!$E$2:$E$33", "'Sensitivity'!$F$27:$F$58", "'Sensitivity'!$G$2:$G$11", "'Clusters'!"} {
		found := false
		for _, refs := range charts {
			for _, rf := range refs {
				found = found || strings.HasPrefix(rf, want)
			}
		}
		if !found {
			t.Errorf("no chart series refers to %s: %v", want, charts)
		}
	}
	noFormulas(t, f)
}

// chartRefs returns the cell ranges each chart part of the package refers
// to, by chart file name.
func chartRefs(t *testing.T, data []byte) map[string][]string {
	t.Helper()
	z, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatal(err)
	}
	re := regexp.MustCompile(`<(?:c:)?f>([^<]*)</(?:c:)?f>`)
	out := map[string][]string{}
	for _, zf := range z.File {
		if !strings.HasPrefix(zf.Name, "xl/charts/chart") {
			continue
		}
		rc, err := zf.Open()
		if err != nil {
			t.Fatal(err)
		}
		b, _ := io.ReadAll(rc)
		rc.Close()
		for _, m := range re.FindAllSubmatch(b, -1) {
			out[zf.Name] = append(out[zf.Name], html.UnescapeString(string(m[1])))
		}
	}
	return out
}

// noFormulas checks that no cell of the workbook holds a formula: every
// value the writer puts down is data or text.
func noFormulas(t *testing.T, f *excelize.File) {
	t.Helper()
	for _, sheet := range f.GetSheetList() {
		rows, err := f.GetRows(sheet)
		if err != nil {
			t.Fatal(err)
		}
		for i, row := range rows {
			for j := range row {
				ref := cell(j+1, i+1)
				if fm, _ := f.GetCellFormula(sheet, ref); fm != "" {
					t.Errorf("%s!%s holds the formula %q", sheet, ref, fm)
				}
			}
		}
	}
}

// TestUserTextStaysText renders a run whose station identifiers, names
// and groups begin with "=", "+", "-" and "@" and checks that each is a
// text cell holding exactly what was given.
func TestUserTextStaysText(t *testing.T) {
	r, man := testrun.TwoStations(t)
	data, err := Render(r, man)
	if err != nil {
		t.Fatal(err)
	}
	f := open(t, data)
	noFormulas(t, f)
	for k, i := range r.Result.Order {
		st := r.Attrs.Stations[i]
		for c, want := range map[int]string{2: st.ID, 3: st.Name, 4: st.Group} {
			ref := cell(c, k+2)
			if got := raw(t, f, SheetRanking, ref); got != want {
				t.Errorf("Ranking!%s = %q, want %q", ref, got, want)
			}
			if want == "" {
				continue
			}
			if typ, _ := f.GetCellType(SheetRanking, ref); typ != excelize.CellTypeSharedString && typ != excelize.CellTypeInlineString {
				t.Errorf("Ranking!%s has type %v, want a string", ref, typ)
			}
		}
	}
	// A small run has no events, clusters or sensitivity sheets and no
	// charts but the ranking's.
	if got := f.GetSheetList(); slices.Contains(got, SheetEvents) || slices.Contains(got, SheetSensitivity) || slices.Contains(got, SheetClusters) {
		t.Errorf("sheets %q", got)
	}
	if n := len(chartRefs(t, data)); n != 1 {
		t.Errorf("%d charts, want 1", n)
	}
}

func TestDeterministic(t *testing.T) {
	r, man := testrun.Demo(t)
	e := view.Of(r)
	a, err := render(r, man, e)
	if err != nil {
		t.Fatal(err)
	}
	b, err := render(r, man, e)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a, b) {
		t.Error("two renders of the same run differ")
	}
	z, _ := zip.NewReader(bytes.NewReader(a), int64(len(a)))
	for _, zf := range z.File {
		if zf.Name != "docProps/core.xml" {
			continue
		}
		rc, _ := zf.Open()
		core, _ := io.ReadAll(rc)
		rc.Close()
		if !bytes.Contains(core, []byte(man.RunDate+"T00:00:00Z")) {
			t.Errorf("core properties do not carry the run date:\n%s", core)
		}
	}
}

// dump renders the content of a workbook as text: each sheet's non-empty
// cells (stored values), its merged ranges, panes and autofilter, and each
// chart's series ranges.
func dump(t *testing.T, data []byte) string {
	t.Helper()
	f := open(t, data)
	var b strings.Builder
	for _, sheet := range f.GetSheetList() {
		fmt.Fprintf(&b, "== %s\n", sheet)
		rows, err := f.GetRows(sheet, excelize.Options{RawCellValue: true})
		if err != nil {
			t.Fatal(err)
		}
		for i, row := range rows {
			for j, v := range row {
				if v == "" {
					continue
				}
				if sheet == SheetSummary && strings.HasPrefix(v, "rebound ") {
					v = "rebound (version)" // the Go version varies
				}
				fmt.Fprintf(&b, "%s\t%s\n", cell(j+1, i+1), v)
			}
		}
	}
	charts := chartRefs(t, data)
	for _, name := range slices.Sorted(maps.Keys(charts)) {
		fmt.Fprintf(&b, "== %s\n%s\n", name, strings.Join(charts[name], "\n"))
	}
	return b.String()
}

func TestGolden(t *testing.T) {
	r, man := testrun.TwoStations(t)
	data, err := Render(r, man)
	if err != nil {
		t.Fatal(err)
	}
	got := dump(t, data)
	got = strings.ReplaceAll(got, filepath.Dir(r.Config.File), "DIR")
	path := filepath.Join("testdata", "two_stations.txt")
	if *update {
		os.MkdirAll("testdata", 0o755)
		os.WriteFile(path, []byte(got), 0o644)
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (go test -update creates it)", err)
	}
	if got != string(want) {
		os.WriteFile(path+".got", []byte(got), 0o644)
		t.Errorf("workbook content differs from %s; see %s.got (go test -update accepts it)", path, path)
	}
}

func BenchmarkRender(b *testing.B) {
	r, man := testrun.Demo(b)
	for _, tc := range []struct {
		name string
		e    view.Extras
	}{{"demo", view.Extras{}}, {"demo+extras", view.Of(r)}} {
		b.Run(tc.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := render(r, man, tc.e); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
