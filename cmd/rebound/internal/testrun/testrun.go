// Package testrun builds finished pipeline runs for the tests of the
// output writers: the invented demo region, and small or odd scenarios
// (two stations, no events, names that look like spreadsheet formulas).
// It is imported by tests only.
package testrun

import (
	"os"
	"path/filepath"
	"sync"
	"testing"

	"rebound/cmd/rebound/internal/demo"
	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
)

// Version and RunDate are the fixed tool version and run date of the
// manifests built here, so that outputs can be compared with golden files.
const (
	Version = "0.0.0-test"
	RunDate = "2025-12-02"
)

var demoRun struct {
	sync.Mutex
	r   *pipeline.Run
	man *report.Manifest
}

// Demo writes the demo region into a temporary folder, loads and scores it,
// and returns the run with its manifest. The run is computed once per test
// binary and shared: callers must not change it.
func Demo(tb testing.TB) (*pipeline.Run, *report.Manifest) {
	tb.Helper()
	demoRun.Lock()
	defer demoRun.Unlock()
	if demoRun.r != nil {
		return demoRun.r, demoRun.man
	}
	files, err := demo.Files()
	if err != nil {
		tb.Fatal(err)
	}
	m := map[string]string{}
	for _, f := range files {
		m[f.Name] = string(f.Data)
	}
	demoRun.r, demoRun.man = Load(tb, m, demo.ConfigName)
	return demoRun.r, demoRun.man
}

// Load writes files (name → content; names may contain "/") into a
// temporary folder, loads the configuration named config from there, scores
// the run and builds its manifest. Any problem fails the test.
func Load(tb testing.TB, files map[string]string, config string) (*pipeline.Run, *report.Manifest) {
	tb.Helper()
	dir := tb.TempDir()
	for name, data := range files {
		p := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			tb.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(data), 0o644); err != nil {
			tb.Fatal(err)
		}
	}
	r, errs := pipeline.Load(filepath.Join(dir, config))
	if len(errs) > 0 {
		for _, e := range errs {
			tb.Error(e)
		}
		tb.FailNow()
	}
	if err := r.Score(); err != nil {
		tb.Fatal(err)
	}
	man, err := report.BuildManifest(r, report.Meta{Version: Version, RunDate: RunDate})
	if err != nil {
		tb.Fatal(err)
	}
	return r, man
}

// TwoStations is a run of two stations scored on attributes only: no
// events, no series, no clustering and no sensitivity analysis. The
// station names begin with "=", "+", "-" and "@" and hold markup, so that
// writers can be checked to treat them as text.
func TwoStations(tb testing.TB) (*pipeline.Run, *report.Manifest) {
	tb.Helper()
	return Load(tb, map[string]string{
		"small.toml": `title = "Two stations"
[inputs]
attributes = "stations.csv"
[[indicator]]
name = "forest_cover"
label = "Forest cover (%)"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 2
[[indicator]]
name = "impervious"
label = "Impervious cover (%)"
measure = "attribute"
attribute = "impervious_pct"
better = "lower"
weight = 1
`,
		"stations.csv": `station,name,latitude,longitude,forest_pct,impervious_pct
=A1,"=HYPERLINK(""http://example.invalid"",""x"")",46.5,-38.25,60,4
+B2,@SUM(A1:A2) | <b>*bold*</b>,-12.25,170.5,,20
`,
	}, "small.toml")
}
