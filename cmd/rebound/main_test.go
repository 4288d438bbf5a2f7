package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite golden files")

// TestMain lets the test binary act as the rebound command when
// REBOUND_AS_MAIN is set, so tests can check real exit statuses.
func TestMain(m *testing.M) {
	if os.Getenv("REBOUND_AS_MAIN") == "1" {
		main()
		os.Exit(0)
	}
	os.Setenv("SOURCE_DATE_EPOCH", "1764633600") // 2025-12-02: fixed run date
	os.Exit(m.Run())
}

// rebound runs the command as a separate process and returns its stdout,
// stderr and exit status.
func rebound(t *testing.T, dir string, args ...string) (stdout, stderr string, status int) {
	t.Helper()
	exe, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(exe, args...)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "REBOUND_AS_MAIN=1")
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	err = cmd.Run()
	if ee, ok := err.(*exec.ExitError); ok {
		status = ee.ExitCode()
	} else if err != nil {
		t.Fatal(err)
	}
	return out.String(), errb.String(), status
}

func golden(t *testing.T, name, got string) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test -update to create it)", err)
	}
	if got != string(want) {
		os.WriteFile(path+".got", []byte(got), 0o644)
		t.Errorf("%s differs from the golden file; see %s.got (go test -update accepts it)", name, path)
	}
}

func TestDemoGolden(t *testing.T) {
	dir := t.TempDir()
	stdout, stderr, status := rebound(t, dir, "demo", "-out", "demo")
	if status != 0 {
		t.Fatalf("status %d\n%s", status, stderr)
	}
	golden(t, "demo.stdout", stdout)
	ranking, err := os.ReadFile(filepath.Join(dir, "demo", "out", "ranking.csv"))
	if err != nil {
		t.Fatal(err)
	}
	golden(t, "demo_ranking.csv", string(ranking))

	// The same inputs and seed give byte-identical outputs.
	first := readOutputs(t, filepath.Join(dir, "demo", "out"))
	if _, stderr, status := rebound(t, dir, "demo", "-out", "demo"); status != 0 {
		t.Fatalf("second demo run: %d %s", status, stderr)
	}
	second := readOutputs(t, filepath.Join(dir, "demo", "out"))
	if _, ok := first["figures/scores.png"]; !ok || len(first) != len(second) {
		t.Errorf("outputs: %d files, then %d; figures/scores.png read: %v", len(first), len(second), ok)
	}
	for name, b := range first {
		if !bytes.Equal(b, second[name]) {
			t.Errorf("%s differs between two runs", name)
		}
	}
	checkSeriesSummary(t, first["run.json"])

	// A demo file edited by the user is not overwritten.
	cfg := filepath.Join(dir, "demo", "rebound.toml")
	os.WriteFile(cfg, []byte("# edited\n"), 0o644)
	_, stderr, status = rebound(t, dir, "demo", "-out", "demo")
	if status != 1 || !strings.Contains(stderr, "differs from the demo's version") {
		t.Errorf("edited demo file: status %d, stderr %q", status, stderr)
	}
	if b, _ := os.ReadFile(cfg); string(b) != "# edited\n" {
		t.Error("edited configuration was overwritten")
	}
}

// readOutputs reads every file under dir (figures/ included), keyed by its
// path relative to dir, and fails on a temporary file left behind.
func readOutputs(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	out := map[string][]byte{}
	err := filepath.WalkDir(dir, func(path string, e fs.DirEntry, err error) error {
		if err != nil || e.IsDir() {
			return err
		}
		rel, err := filepath.Rel(dir, path)
		if err != nil {
			return err
		}
		if strings.HasPrefix(e.Name(), ".") {
			t.Errorf("temporary file left behind: %s", rel)
		}
		b, err := os.ReadFile(path)
		out[filepath.ToSlash(rel)] = b
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// checkSeriesSummary checks the series section of the demo's run.json: the
// demo's six wide files hold 32 stations (not 6 × 32), and the totals add
// up the stations' counts, filled days included.
func checkSeriesSummary(t *testing.T, manifest []byte) {
	t.Helper()
	type counts map[string]map[string]int
	var m struct {
		Series struct {
			Stations   int               `json:"stations"`
			Totals     counts            `json:"totals"`
			PerStation map[string]counts `json:"per_station"`
		} `json:"series"`
	}
	if err := json.Unmarshal(manifest, &m); err != nil {
		t.Fatal(err)
	}
	if m.Series.Stations != 32 {
		t.Errorf("run.json: series.stations = %d, want 32", m.Series.Stations)
	}
	for v, tot := range m.Series.Totals {
		sum := map[string]int{}
		for _, st := range m.Series.PerStation {
			for k, n := range st[v] {
				sum[k] += n
			}
		}
		for k, n := range tot {
			if sum[k] != n {
				t.Errorf("run.json: series.totals.%s.%s = %d, the stations add up to %d", v, k, n, sum[k])
			}
		}
		if tot["filled"] == 0 {
			t.Errorf("run.json: series.totals.%s.filled = 0; the demo fills gaps", v)
		}
	}
}

func TestExitStatuses(t *testing.T) {
	dir := t.TempDir()
	tests := []struct {
		name   string
		args   []string
		status int
		stdout string
		stderr string
	}{
		{"no arguments", nil, 2, "", "Usage:"},
		{"unknown command", []string{"frobnicate"}, 2, "", `unknown command "frobnicate"`},
		{"help", []string{"help"}, 0, "Usage:", ""},
		{"help run", []string{"help", "run"}, 0, "ranking.csv", ""},
		{"-h is help, exit 0", []string{"run", "-h"}, 0, "rebound run -config FILE", ""},
		{"double-dash flags", []string{"run", "--h"}, 0, "rebound run -config FILE", ""},
		{"unknown flag", []string{"run", "-bogus"}, 2, "", "flag provided but not defined: -bogus"},
		{"missing -config", []string{"run"}, 2, "", "-config FILE is required"},
		{"bad seed", []string{"run", "-config", "x.toml", "-seed", "abc"}, 2, "", `want a non-negative integer, got "abc"`},
		{"missing config file", []string{"check", "-config", "nope.toml"}, 1, "", "nope.toml"},
		{"version", []string{"version"}, 0, "rebound " + version, ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			stdout, stderr, status := rebound(t, dir, tc.args...)
			if status != tc.status || !strings.Contains(stdout, tc.stdout) || !strings.Contains(stderr, tc.stderr) {
				t.Errorf("status %d (want %d)\nstdout: %s\nstderr: %s", status, tc.status, stdout, stderr)
			}
		})
	}
}

// writeFiles writes name → content into dir.
func writeFiles(t *testing.T, dir string, files map[string]string) {
	t.Helper()
	for name, content := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(content), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

const smallConfig = `
[inputs]
events = "events.csv"
attributes = "stations.csv"
record_years = 10

[[indicator]]
name = "heat"
measure = "magnitude"
variables = ["water_temperature"]
weight = 2

[[indicator]]
name = "recovery"
measure = "recovery"
weight = 1
`

const smallStations = "station,name,latitude,longitude,group\nA,Alpha,45,-70,g\nB,Beta,45.5,-70.5,g\n"
const smallEvents = "station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness\n" +
	"A,E1,heatwave,water_temperature,2020-07-01,2020-07-05,1.5,4,true,0.2\n" +
	"B,E1,heatwave,water_temperature,2020-07-01,2020-07-05,3.0,12,true,0.2\n"

func TestCheckListsAllProblems(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{
		"rebound.toml": smallConfig,
		"stations.csv": smallStations + "A,Again,95,-70,g\n",
		"events.csv":   smallEvents + "A,E2,heatwave,water_temperature,2020-08-05,2020-08-01,x,-1,maybe,\n",
	})
	_, stderr, status := rebound(t, dir, "check", "-config", "rebound.toml")
	if status != 1 {
		t.Fatalf("status %d", status)
	}
	for _, want := range []string{
		`stations.csv:4:1: station: duplicate station "A" (first on line 2)`,
		`stations.csv:4:9: latitude: out of range`,
		`events.csv:4:44: end: end 2020-08-01 is before start 2020-08-05`,
		`events.csv:4:55: peak_departure: want a finite number, got "x"`,
		`events.csv:4:57: recovery_days: want days >= 0, got "-1"`,
		`events.csv:4:60: recovered: want true or false, got "maybe"`,
		"6 problems found",
	} {
		if !strings.Contains(stderr, want) {
			t.Errorf("missing %q in:\n%s", want, stderr)
		}
	}
	// And nothing was written.
	if _, err := os.Stat(filepath.Join(dir, "out")); err == nil {
		t.Error("check wrote an output folder")
	}
}

func TestRunBadInputWritesNothing(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{
		"rebound.toml": smallConfig + "[[indicator]]\nname = \"x\"\nmeasure = \"recovry\"\nweight = 1\n",
		"stations.csv": smallStations,
		"events.csv":   smallEvents,
	})
	_, stderr, status := rebound(t, dir, "run", "-config", "rebound.toml")
	if status != 1 || !strings.Contains(stderr, `rebound.toml:19:11: indicator[3].measure: want one of`) {
		t.Fatalf("status %d stderr %s", status, stderr)
	}
	if _, err := os.Stat(filepath.Join(dir, "out")); err == nil {
		t.Error("a failed run wrote outputs")
	}
}

func TestRunRefusesToOverwriteInput(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{
		"rebound.toml": smallConfig,
		"ranking.csv":  smallStations, // the attribute table, named like an output
		"events.csv":   smallEvents,
	})
	os.WriteFile(filepath.Join(dir, "rebound.toml"), []byte(strings.Replace(smallConfig, "stations.csv", "ranking.csv", 1)), 0o644)
	_, stderr, status := rebound(t, dir, "run", "-config", "rebound.toml", "-out", ".")
	if status != 1 || !strings.Contains(stderr, "is the attributes input") {
		t.Fatalf("status %d stderr %s", status, stderr)
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "ranking.csv")); string(b) != smallStations {
		t.Error("input overwritten")
	}
}

func TestRunSmall(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{"rebound.toml": smallConfig, "stations.csv": smallStations, "events.csv": smallEvents})
	stdout, stderr, status := rebound(t, dir, "run", "-config", "rebound.toml", "-all")
	if status != 0 {
		t.Fatalf("status %d: %s", status, stderr)
	}
	// A is better on both indicators: min–max gives it 1 and B 0.
	if !strings.Contains(stdout, "   1  A        Alpha   100.0       1  few_events") || !strings.Contains(stdout, "   2  B        Beta      0.0       1  few_events") {
		t.Errorf("stdout:\n%s", stdout)
	}
	ranking, _ := os.ReadFile(filepath.Join(dir, "out", "ranking.csv"))
	want := "rank,station,name,group,score,events,latitude,longitude,flags\n1,A,Alpha,g,100,1,45,-70,few_events\n2,B,Beta,g,0,1,45.5,-70.5,few_events\n"
	if string(ranking) != want {
		t.Errorf("ranking.csv:\n%s\nwant:\n%s", ranking, want)
	}
}

func TestInit(t *testing.T) {
	dir := t.TempDir()
	if _, stderr, status := rebound(t, dir, "init"); status != 0 {
		t.Fatalf("init: %d %s", status, stderr)
	}
	_, stderr, status := rebound(t, dir, "init")
	if status != 1 || !strings.Contains(stderr, "rebound.toml exists; not overwriting it") {
		t.Errorf("second init: %d %s", status, stderr)
	}
	if _, stderr, status := rebound(t, dir, "init", "-o", "rebound.toml", "--force"); status != 0 {
		t.Errorf("init -force: %d %s", status, stderr)
	}
}

func TestEventsCommand(t *testing.T) {
	dir := t.TempDir()
	if _, stderr, status := rebound(t, dir, "demo", "-out", "d"); status != 0 {
		t.Fatalf("demo: %s", stderr)
	}
	stdout, stderr, status := rebound(t, dir, "events", "-config", "d/rebound.toml", "-out", "ev")
	if status != 0 {
		t.Fatalf("events: %d %s", status, stderr)
	}
	if !strings.Contains(stdout, "32 stations read") || !strings.Contains(stdout, "drawdown") {
		t.Errorf("stdout: %s", stdout)
	}
	// The derived table reads back as an events table, and equals the one
	// that run wrote.
	a, _ := os.ReadFile(filepath.Join(dir, "ev", "events.csv"))
	b, _ := os.ReadFile(filepath.Join(dir, "d", "out", "events.csv"))
	if len(a) == 0 || !bytes.Equal(a, b) {
		t.Errorf("events.csv from events (%d bytes) and run (%d bytes) differ", len(a), len(b))
	}
	cfg, _ := os.ReadFile(filepath.Join(dir, "d", "rebound.toml"))
	cfg = bytes.Replace(cfg, []byte(`events = ""`), []byte(`events = "../ev/events.csv"`), 1)
	os.WriteFile(filepath.Join(dir, "d", "table.toml"), cfg, 0o644)
	_, stderr, status = rebound(t, dir, "check", "-config", "d/table.toml")
	if status != 0 {
		t.Errorf("the derived events table does not check: %s", stderr)
	}
	// events refuses a configuration with an events table.
	_, stderr, status = rebound(t, dir, "events", "-config", "d/table.toml", "-out", "ev2")
	if status != 1 || !strings.Contains(stderr, "names an events table") {
		t.Errorf("events with a table: %d %s", status, stderr)
	}
}
