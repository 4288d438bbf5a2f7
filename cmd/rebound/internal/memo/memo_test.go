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

func TestDemoExtrasGolden(t *testing.T) {
	r, man := testrun.Demo(t)
	memo, figs, err := render(r, man, testrun.Extras(t, r, 4))
	if err != nil {
		t.Fatal(err)
	}
	checkFigures(t, memo, figs)
	for _, want := range []string{FigScores, FigTornado, FigDendrogram, FigProfiles} {
		if figs[want] == nil {
			t.Errorf("no %s", want)
		}
	}
	golden(t, "demo_extras.md", stable(r, memo))
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
