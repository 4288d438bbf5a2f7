package memo

import (
	"bytes"
	"flag"
	"image/png"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"
	"unicode/utf8"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/cmd/rebound/internal/testrun"
	"rebound/cmd/rebound/internal/view"
)

var update = flag.Bool("update", false, "rewrite golden files")

func golden(t *testing.T, name, got string) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		os.MkdirAll("testdata", 0o755)
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (go test -update creates it)", err)
	}
	if got != string(want) {
		os.WriteFile(path+".got", []byte(got), 0o644)
		t.Errorf("%s differs from the golden file; see %s.got (go test -update accepts it)", name, path)
	}
}

// checkFigures decodes every figure, checks its width (6.5 in at the
// charts' resolution) and that the memo links exactly these figures. With
// REBOUND_KEEP=dir set, the memo and figures are written there.
func checkFigures(t *testing.T, memo []byte, figs map[string][]byte) {
	t.Helper()
	links := regexp.MustCompile(`!\[[^\]]*\]\(([^)]+)\)`).FindAllSubmatch(memo, -1)
	var linked []string
	for _, l := range links {
		linked = append(linked, string(l[1]))
	}
	var names []string
	for name, data := range figs {
		names = append(names, name)
		img, err := png.Decode(bytes.NewReader(data))
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		if w := img.Bounds().Dx(); w != 1170 { // 6.5 in at 180 dpi
			t.Errorf("%s: %d px wide", name, w)
		}
	}
	slices.Sort(names)
	slices.Sort(linked)
	if !slices.Equal(names, linked) {
		t.Errorf("figures %v, memo links %v", names, linked)
	}
	if dir := os.Getenv("REBOUND_KEEP"); dir != "" {
		os.MkdirAll(filepath.Join(dir, "figures"), 0o755)
		os.WriteFile(filepath.Join(dir, "memo.md"), memo, 0o644)
		for name, data := range figs {
			os.WriteFile(filepath.Join(dir, name), data, 0o644)
		}
	}
}

// stable replaces what depends on the machine (temporary folders, the Go
// version) in a memo.
func stable(r *pipeline.Run, memo []byte) string {
	return strings.ReplaceAll(string(memo), filepath.Dir(r.Config.File), "DIR")
}

func TestDemoGolden(t *testing.T) {
	r, man := testrun.Demo(t)
	memo, figs, err := Render(r, man)
	if err != nil {
		t.Fatal(err)
	}
	checkFigures(t, memo, figs)
	// The demo configures clustering and sensitivity, so every figure is there.
	for _, want := range []string{FigScores, FigTornado, FigDendrogram, FigProfiles} {
		if figs[want] == nil {
			t.Errorf("no %s", want)
		}
	}
	golden(t, "demo.md", stable(r, memo))
	again, figs2, _ := Render(r, man)
	if !bytes.Equal(memo, again) {
		t.Error("two renders differ")
	}
	for name := range figs {
		if !bytes.Equal(figs[name], figs2[name]) {
			t.Errorf("%s differs between two renders", name)
		}
	}
}

// TestTwoStations renders the memo of a small, odd run (two stations,
// attributes only, names full of Markdown and formula characters).
func TestTwoStations(t *testing.T) {
	r, man := testrun.TwoStations(t)
	memo, figs, err := Render(r, man)
	if err != nil {
		t.Fatal(err)
	}
	checkFigures(t, memo, figs)
	golden(t, "two_stations.md", stable(r, memo))
	if bytes.Contains(memo, []byte("<b>")) {
		t.Error("markup from a station name reached the memo unescaped")
	}
	if !bytes.Contains(memo, []byte(report.Caution)) {
		t.Error("the memo lacks the standing caution")
	}
}

func TestEsc(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"plain name", "plain name"},
		{"a|b", `a\|b`},
		{"<b>*x*</b>", `\<b\>\*x\*\</b\>`},
		{"line\nbreak", "line break"},
	} {
		if got := esc(tc.in); got != tc.want {
			t.Errorf("esc(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

func BenchmarkRender(b *testing.B) {
	r, man := testrun.Demo(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, _, err := render(r, man, view.Extras{}); err != nil {
			b.Fatal(err)
		}
	}
}

func TestNum(t *testing.T) {
	for _, tc := range []struct {
		x    float64
		want string
	}{{40, "40"}, {0.5, "0.5"}, {4.15, "4.15"}, {297.4, "297"}, {-0.124, "-0.124"}, {1e7, "1e+07"}, {2.50, "2.5"}} {
		if got := num(tc.x); got != tc.want {
			t.Errorf("num(%g) = %q, want %q", tc.x, got, tc.want)
		}
	}
}

// TestOddRuns renders memos of small runs that once printed nonsense: NaN,
// a rank interval for a station without a score, a broken character for an
// indicator without a label, a 0–1 scale for z-scores, a garbled sentence
// for geometric aggregation.
func TestOddRuns(t *testing.T) {
	const stations = "station,name,latitude,longitude,forest_pct,baseflow\n" +
		"A,Alpha,40,-30,50,0.4\nB,Beta,41,-30,,\nC,Gamma,42,-30,70,0.6\nD,Delta,43,-30,20,0.3\n"
	indicators := `
[[indicator]]
name = "forest"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 2
[[indicator]]
name = "baseflow"
measure = "attribute"
attribute = "baseflow"
better = "higher"
weight = 1
`
	for _, tc := range []struct {
		name, config, stations string
		want, not              []string
	}{
		{"one scored station", "[inputs]\nattributes = \"s.csv\"\n" + indicators + "[sensitivity]\nsamples = 50\n",
			"station,name,latitude,longitude,forest_pct,baseflow\nA,Alpha,40,-30,50,0.4\nB,Beta,41,-30,,\n",
			[]string{"The weight sensitivity analysis was skipped: 1 station has a score, so there is no ranking to test."},
			[]string{"NaN", "the smallest", "| 2–2 |", "| 1–1 |"}},
		{"unscored station", "[inputs]\nattributes = \"s.csv\"\n" + indicators + "[sensitivity]\nsamples = 50\n[sensitivity.sobol]\nenabled = false\n",
			stations, []string{"| 4 | B | Beta | – | – |"}, []string{"NaN"}},
		{"z-scores", "[inputs]\nattributes = \"s.csv\"\n" + indicators + "[normalization]\nmethod = \"zscore\"\n",
			stations, []string{"put on a common scale (z-scores, over all stations together)", "the best station scores 100 and the worst 0"},
			[]string{"0–1 scale"}},
		{"geometric", "[inputs]\nattributes = \"s.csv\"\n" + indicators + "[aggregation]\nmethod = \"geometric\"\n",
			stations, []string{"a weighted geometric mean (so a poor value is not fully offset by good ones) into a score from 0 to 100"}, nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r, man := testrun.Load(t, map[string]string{"r.toml": tc.config, "s.csv": tc.stations}, "r.toml")
			memo, figs, err := Render(r, man)
			if err != nil {
				t.Fatal(err)
			}
			checkFigures(t, memo, figs)
			if !utf8.Valid(memo) || bytes.ContainsRune(memo, utf8.RuneError) {
				t.Error("the memo has a broken character")
			}
			for _, w := range tc.want {
				if !bytes.Contains(memo, []byte(w)) {
					t.Errorf("memo lacks %q:\n%s", w, memo)
				}
			}
			for _, w := range tc.not {
				if bytes.Contains(memo, []byte(w)) {
					t.Errorf("memo has %q:\n%s", w, memo)
				}
			}
		})
	}
}

// An indicator without a label is named by its name alone, and a single
// station with a value is said to be the only one.
func TestFindingsUnlabelled(t *testing.T) {
	r, man := testrun.Load(t, map[string]string{
		"r.toml": `[inputs]
events = "e.csv"
attributes = "s.csv"
[[indicator]]
name = "heat"
measure = "magnitude"
kinds = ["heatwave"]
variables = ["water_temperature"]
weight = 1
`,
		"s.csv": "station,name,latitude,longitude\nA,Alpha,40,-30\nB,Beta,41,-30\n",
		"e.csv": "station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness\n" +
			"A,E1,heatwave,water_temperature,2020-07-01,2020-07-05,1.5,4,true,\n",
	}, "r.toml")
	memo, _, err := Render(r, man)
	if err != nil {
		t.Fatal(err)
	}
	if want := "Heat waves (indicator `heat`): only A (1.5) has a value."; !bytes.Contains(memo, []byte(want)) {
		t.Errorf("memo lacks %q:\n%s", want, memo)
	}
}
