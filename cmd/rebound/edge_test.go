package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"rebound/cmd/rebound/internal/report"
)

// TestSmallStudies runs the command on small, odd studies: each either
// works and says what it did, or fails with a one-line error, exit status
// 1 and no output.
func TestSmallStudies(t *testing.T) {
	const sens = "[sensitivity]\nsamples = 200\n[sensitivity.sobol]\nbase_samples = 64\nbootstrap = 20\n"
	oneStation := "station,name,latitude,longitude,group\nA,Alpha,45,-70,g\n"
	oneEvent := "station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness\n" +
		"A,E1,heatwave,water_temperature,2020-07-01,2020-07-05,1.5,4,true,0.2\n"
	for _, tc := range []struct {
		name     string
		args     []string
		files    map[string]string
		status   int
		stdout   []string // each must appear
		stderr   string   // must appear
		noOutput bool     // nothing may be written
	}{
		{"one station: run skips the sensitivity analysis", []string{"run"},
			map[string]string{"rebound.toml": smallConfig + sens, "stations.csv": oneStation, "events.csv": oneEvent}, 0,
			[]string{"Resilience ranking: 1 station,", "The sensitivity analysis was skipped: 1 station has a score, so there is no ranking to test.", report.Caution}, "", false},
		{"one station: sensitivity fails", []string{"sensitivity"},
			map[string]string{"rebound.toml": smallConfig + sens, "stations.csv": oneStation, "events.csv": oneEvent}, 1,
			nil, "rebound: sensitivity: 1 station has a score, so there is no ranking to test\n", true},
		{"two stations: sensitivity states the caution", []string{"sensitivity"},
			map[string]string{"rebound.toml": smallConfig + sens, "stations.csv": smallStations, "events.csv": smallEvents}, 0,
			[]string{"How robust is the ranking? The 2 stations", "changes no station's rank", report.Caution}, "", false},
		{"one indicator", []string{"run"},
			map[string]string{"rebound.toml": "[inputs]\nevents = \"events.csv\"\nattributes = \"stations.csv\"\n[[indicator]]\nname = \"heat\"\nmeasure = \"magnitude\"\nvariables = [\"water_temperature\"]\nweight = 1\n" + sens,
				"stations.csv": smallStations, "events.csv": smallEvents}, 0,
			[]string{"With a single indicator,"}, "", false},
		{"check counts one problem", []string{"check"},
			map[string]string{"rebound.toml": smallConfig, "stations.csv": smallStations + "C,Gamma,95,-70,g\n", "events.csv": smallEvents}, 1,
			nil, "1 problem found\n", true},
		{"missing attribute table names its key", []string{"check"},
			map[string]string{"rebound.toml": smallConfig, "events.csv": smallEvents}, 1,
			nil, "rebound.toml: inputs.attributes: cannot open stations.csv: no such file or directory\n1 problem found\n", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			writeFiles(t, dir, tc.files)
			stdout, stderr, status := rebound(t, dir, append(tc.args, "-config", "rebound.toml")...)
			if status != tc.status {
				t.Fatalf("status %d, want %d\nstdout: %s\nstderr: %s", status, tc.status, stdout, stderr)
			}
			for _, w := range tc.stdout {
				if !strings.Contains(stdout, w) {
					t.Errorf("stdout lacks %q:\n%s", w, stdout)
				}
			}
			if !strings.Contains(stderr, tc.stderr) {
				t.Errorf("stderr %q, want it to hold %q", stderr, tc.stderr)
			}
			for _, bad := range []string{"NaN", "panic", "0 ranks", "1 stations"} {
				if strings.Contains(stdout+stderr, bad) {
					t.Errorf("output has %q:\n%s%s", bad, stdout, stderr)
				}
			}
			_, err := os.Stat(filepath.Join(dir, "out"))
			if tc.noOutput && err == nil {
				t.Error("a failed command wrote outputs")
			}
		})
	}
}
