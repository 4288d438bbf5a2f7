package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// sensFiles are six invented stations scored on two attributes; TOP is the
// best on both.
var sensFiles = map[string]string{
	"stations.csv": `station,name,latitude,longitude,forest_pct,impervious_pct
TOP,Top,40,-30,90,1
A,Alpha,40.1,-30,70,30
B,Beta,40.2,-30,40,5
C,Gamma,40.3,-30,55,12
D,Delta,40.4,-30,20,25
E,Epsilon,40.5,-30,35,40
`,
	"plain.toml": `seed = 5
[inputs]
attributes = "stations.csv"
[[indicator]]
name = "forest"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 2
[[indicator]]
name = "impervious"
measure = "attribute"
attribute = "impervious_pct"
better = "lower"
weight = 1
`,
}

const sensSection = `[sensitivity]
samples = 500
top_n = 1
[sensitivity.sobol]
base_samples = 64
bootstrap = 20
`

var sensOutputs = []string{"sensitivity.csv", "sensitivity_oat.csv", "sensitivity_structural.csv", "sensitivity_sobol.csv"}

func TestSensitivityCommand(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, sensFiles)
	writeFiles(t, dir, map[string]string{"s.toml": sensFiles["plain.toml"] + sensSection})

	stdout, stderr, status := rebound(t, dir, "sensitivity", "-config", "s.toml", "-out", "a", "-samples", "300")
	if status != 0 {
		t.Fatalf("status %d: %s", status, stderr)
	}
	summary := strings.Join(strings.Fields(stdout), " ") // unwrapped
	for _, want := range []string{
		"The 6 stations were ranked again under 300 sets of weights", // -samples overrides samples = 500
		"Robustly first (there in at least 95% of the samples): TOP (Top).",
		"The weights that matter most for the ranking",
		"Wrote sensitivity.csv, sensitivity_oat.csv, sensitivity_structural.csv, sensitivity_sobol.csv to a",
	} {
		if !strings.Contains(summary, want) {
			t.Errorf("stdout lacks %q:\n%s", want, stdout)
		}
	}
	// Only the sensitivity outputs are written.
	got := readOutputs(t, filepath.Join(dir, "a"))
	if len(got) != len(sensOutputs) {
		t.Errorf("wrote %d files, want %d", len(got), len(sensOutputs))
	}
	for _, name := range sensOutputs {
		if len(got[name]) == 0 {
			t.Errorf("%s missing or empty", name)
		}
	}

	// The same seed gives the same bytes; -seed changes the samples.
	if _, stderr, status := rebound(t, dir, "sensitivity", "-config", "s.toml", "-out", "b", "-samples", "300"); status != 0 {
		t.Fatal(stderr)
	}
	again := readOutputs(t, filepath.Join(dir, "b"))
	for _, name := range sensOutputs {
		if !bytes.Equal(got[name], again[name]) {
			t.Errorf("%s differs between two runs with the same seed", name)
		}
	}
	if _, stderr, status := rebound(t, dir, "sensitivity", "-config", "s.toml", "-out", "c", "-samples", "300", "-seed", "6"); status != 0 {
		t.Fatal(stderr)
	}
	if other := readOutputs(t, filepath.Join(dir, "c")); bytes.Equal(got["sensitivity_sobol.csv"], other["sensitivity_sobol.csv"]) {
		t.Error("-seed 6 gave the same Sobol estimates as seed 5")
	}

	// Without a [sensitivity] section the defaults are used, and said so.
	stdout, stderr, status = rebound(t, dir, "sensitivity", "-config", "plain.toml", "-out", "d", "-samples", "200")
	if status != 0 || !strings.Contains(stdout, "plain.toml has no [sensitivity] section: the defaults are used") {
		t.Errorf("no section: status %d\nstdout: %s\nstderr: %s", status, stdout, stderr)
	}
}

func TestRunWithSensitivity(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, sensFiles)
	writeFiles(t, dir, map[string]string{"s.toml": sensFiles["plain.toml"] + sensSection})
	stdout, stderr, status := rebound(t, dir, "run", "-config", "s.toml")
	if status != 0 {
		t.Fatalf("status %d: %s", status, stderr)
	}
	// The ranking shows the rank interval; the summary follows it.
	for _, want := range []string{"rank  p5-p95   station", "   1  1-1      TOP", "p5-p95: the 5th to 95th percentile", "How robust is the ranking?"} {
		if !strings.Contains(stdout, want) {
			t.Errorf("stdout lacks %q:\n%s", want, stdout)
		}
	}
	ranking, err := os.ReadFile(filepath.Join(dir, "out", "ranking.csv"))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(ranking), "\n")
	if !strings.HasSuffix(lines[0], ",flags,rank_p5,rank_median,rank_p95,stability") || !strings.HasSuffix(lines[1], ",1,1,1,robust-top") {
		t.Errorf("ranking.csv:\n%s", ranking)
	}
	for _, name := range append(sensOutputs, "run.json") {
		if _, err := os.Stat(filepath.Join(dir, "out", name)); err != nil {
			t.Error(err)
		}
	}
	man, _ := os.ReadFile(filepath.Join(dir, "out", "run.json"))
	if !bytes.Contains(man, []byte(`"sensitivity": {`)) || !bytes.Contains(man, []byte(`"robust_top": [`)) {
		t.Error("run.json has no sensitivity section")
	}
}

func TestSensitivityUsage(t *testing.T) {
	dir := t.TempDir()
	tests := []struct {
		name   string
		args   []string
		status int
		stdout string
		stderr string
	}{
		{"help", []string{"help", "sensitivity"}, 0, "sensitivity_oat.csv", ""},
		{"-h", []string{"sensitivity", "-h"}, 0, "rebound sensitivity -config FILE", ""},
		{"missing -config", []string{"sensitivity"}, 2, "", "sensitivity: -config FILE is required"},
		{"bad samples", []string{"sensitivity", "-config", "x.toml", "-samples", "0"}, 2, "", `-samples: want a whole number of samples >= 1, got "0"`},
		{"bad seed", []string{"sensitivity", "-config", "x.toml", "-seed", "-1"}, 2, "", `-seed: want a non-negative integer, got "-1"`},
		{"missing file", []string{"sensitivity", "-config", "x.toml"}, 1, "", "x.toml"},
		{"usage lists it", []string{"help"}, 0, "rebound sensitivity -config FILE", ""},
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
