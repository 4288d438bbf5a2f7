package report_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"io"
	"slices"
	"strings"
	"testing"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/cmd/rebound/internal/testrun"
)

// sensRun scores eight invented stations on two attributes with the
// sensitivity analysis on. TOP is best on both indicators; NONE has no
// value.
func sensRun(t *testing.T, sobol string) (*pipeline.Run, *report.Manifest) {
	t.Helper()
	return testrun.Load(t, map[string]string{
		"s.toml": `seed = 3
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
[sensitivity]
samples = 300
top_n = 2
deltas = [0.5]
[sensitivity.sobol]
base_samples = 64
bootstrap = 20
` + sobol,
		"stations.csv": `station,name,latitude,longitude,forest_pct,impervious_pct
TOP,Top,40,-30,90,1
A,Alpha,40.1,-30,70,30
B,Beta,40.2,-30,40,5
C,Gamma,40.3,-30,55,12
D,Delta,40.4,-30,20,25
E,Epsilon,40.5,-30,35,40
F,Phi,40.6,-30,10,60
NONE,Nothing,40.7,-30,,
`,
	}, "s.toml")
}

func readCSV(t *testing.T, write func(io.Writer, *pipeline.Run) error, r *pipeline.Run) [][]string {
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

func TestSensitivityTables(t *testing.T) {
	r, _ := sensRun(t, "")
	n, k := len(r.Raw.Stations), len(r.Raw.Indicators)
	tests := []struct {
		name   string
		write  func(io.Writer, *pipeline.Run) error
		header []string
		rows   int
	}{
		{"sensitivity.csv", report.WriteSensitivity, report.SensitivityColumns, n},
		// One run per indicator and signed step (deltas = [0.5]), each
		// with every station.
		{"sensitivity_oat.csv", report.WriteOAT, report.OATColumns, 2 * k * n},
		// The ranking-wide output, then every station.
		{"sensitivity_sobol.csv", report.WriteSobol, report.SobolColumns, (n + 1) * k},
		{"sensitivity_structural.csv", report.WriteStructural,
			[]string{"station", "name", "minmax/arithmetic/all", "minmax/geometric/all", "zscore/arithmetic/all", "rank/arithmetic/all", "rank/geometric/all"}, n},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			rows := readCSV(t, tc.write, r)
			if !slices.Equal(rows[0], tc.header) {
				t.Errorf("header %q, want %q", rows[0], tc.header)
			}
			if len(rows)-1 != tc.rows {
				t.Errorf("%d rows, want %d", len(rows)-1, tc.rows)
			}
		})
	}
	if got := report.SensitivityOutputs(r); !slices.Equal(got, []string{"sensitivity.csv", "sensitivity_oat.csv", "sensitivity_structural.csv", "sensitivity_sobol.csv"}) {
		t.Errorf("outputs %q", got)
	}

	// sensitivity.csv: stations in rank order; the dominant station is
	// rank 1 in every sample; the station without a score is unranked,
	// its statistics blank.
	rows := readCSV(t, report.WriteSensitivity, r)
	col := func(name string) int { return slices.Index(report.SensitivityColumns, name) }
	top := rows[1]
	if top[0] != "TOP" || top[col("rank_p5")] != "1" || top[col("rank_p95")] != "1" || top[col("p_top")] != "1" || top[col("stability")] != "robust-top" {
		t.Errorf("first row %q", top)
	}
	last := rows[len(rows)-1]
	if last[0] != "NONE" || last[col("stability")] != "unranked" || last[col("rank_median")] != "" || last[col("p_top")] != "" {
		t.Errorf("last row %q", last)
	}

	// ranking.csv gains the interval and the stability after the flags.
	rank := readCSV(t, report.WriteRanking, r)
	if want := append(slices.Clone(report.RankingColumns), "rank_p5", "rank_median", "rank_p95", "stability"); !slices.Equal(rank[0], want) {
		t.Errorf("ranking.csv header %q, want %q", rank[0], want)
	}
	if got := rank[1][len(rank[1])-4:]; !slices.Equal(got, []string{"1", "1", "1", "robust-top"}) {
		t.Errorf("ranking.csv TOP %q", got)
	}
}

func TestSensitivityManifest(t *testing.T) {
	// Within ±1e-9 of each weight the ranking never changes: the Sobol
	// indices of the rank shift are undefined, written as null.
	r, man := sensRun(t, "spread = 1e-9\n")
	var buf bytes.Buffer
	if err := report.WriteManifest(&buf, man); err != nil {
		t.Fatal(err)
	}
	var got struct {
		Sensitivity struct {
			Seed      uint64         `json:"seed"`
			Samples   int            `json:"samples"`
			TopN      int            `json:"top_n"`
			RobustTop []string       `json:"robust_top"`
			Stability map[string]int `json:"stability"`
			OAT       []struct {
				Indicator string  `json:"indicator"`
				Step      float64 `json:"step"`
			} `json:"one_at_a_time"`
			Structural []struct {
				Name string `json:"name"`
			} `json:"structural"`
			Skipped []string `json:"structural_skipped"`
			Sobol   struct {
				Indices []struct {
					Indicator string   `json:"indicator"`
					ST        *float64 `json:"st"`
				} `json:"indices"`
			} `json:"sobol"`
			Outputs []string `json:"outputs"`
		} `json:"sensitivity"`
	}
	if err := json.Unmarshal(buf.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	s := got.Sensitivity
	if s.Seed != 3 || s.Samples != 300 || s.TopN != 2 || !slices.Contains(s.RobustTop, "TOP") || s.Stability["unranked"] != 1 {
		t.Errorf("sensitivity section %+v", s)
	}
	if len(s.OAT) != 4 || s.OAT[0].Indicator != "forest" || s.OAT[0].Step != -0.5 {
		t.Errorf("one-at-a-time %+v", s.OAT)
	}
	if len(s.Structural) != 5 || s.Structural[0].Name != "minmax/arithmetic/all" || len(s.Skipped) != 1 {
		t.Errorf("structural %+v, skipped %q", s.Structural, s.Skipped)
	}
	if len(s.Sobol.Indices) != 2 || s.Sobol.Indices[0].ST != nil {
		t.Errorf("Sobol indices of a constant output: %+v, want null", s.Sobol.Indices)
	}
	if !slices.Equal(s.Outputs, report.SensitivityOutputs(r)) {
		t.Errorf("outputs %q", s.Outputs)
	}
	// The summary says so rather than naming a weight.
	if sum := strings.Join(report.SensitivitySummary(r), "\n"); !strings.Contains(sum, "the ranking never changes") {
		t.Errorf("summary:\n%s", sum)
	}
}

func TestSensitivitySummary(t *testing.T) {
	r, _ := sensRun(t, "")
	paras := report.SensitivitySummary(r)
	text := strings.Join(paras, "\n")
	for _, want := range []string{
		"The 8 stations were ranked again under 300 sets of weights drawn around the configured weights from a Dirichlet distribution with concentration 50 (seed 3).",
		"Robustly in the top 2 (there in at least 95% of the samples): TOP (Top",
		"The weights that matter most for the ranking (total Sobol index of the mean rank shift, each weight varied by ±50%): ",
		"Moving one weight at a time by ±50% (the others rescaled), ",
		"Other normalisations and aggregations (4 alternatives to the configured minmax/arithmetic/all",
		"Not scored: zscore/geometric/all, because z-scores can be negative, so they cannot enter a geometric aggregation.",
		"Agreement with the configured ranking over the samples: Spearman's rho averages",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("summary lacks %q:\n%s", want, text)
		}
	}
	var buf bytes.Buffer
	report.PrintSensitivity(&buf, r, 60)
	for _, line := range strings.Split(strings.TrimSpace(buf.String()), "\n") {
		if len([]rune(line)) > 60 && strings.Contains(line, " ") {
			t.Errorf("line longer than 60 columns: %q", line)
		}
	}
}

// One station with a score: there is no ranking to test, so the analysis
// is skipped with the reason, rather than reporting intervals and undefined
// correlations.
func TestSensitivityOneStationSkipped(t *testing.T) {
	r, _ := testrun.Load(t, map[string]string{
		"s.toml": `[inputs]
attributes = "stations.csv"
[[indicator]]
name = "forest"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 1
[sensitivity]
samples = 50
[sensitivity.sobol]
base_samples = 16
bootstrap = 10
`,
		"stations.csv": "station,name,latitude,longitude,forest_pct\nA,Alpha,40,-30,50\nB,Beta,41,-30,\n",
	}, "s.toml")
	if r.Sensitivity != nil || len(report.SensitivitySummary(r)) != 0 {
		t.Fatal("the sensitivity analysis ran on one scored station")
	}
	if want := "1 station has a score, so there is no ranking to test"; r.SensitivitySkipped != want {
		t.Errorf("SensitivitySkipped = %q, want %q", r.SensitivitySkipped, want)
	}
	if !slices.ContainsFunc(r.Warnings, func(e error) bool { return strings.Contains(e.Error(), "sensitivity: skipped") }) {
		t.Errorf("no warning says the analysis was skipped: %v", r.Warnings)
	}
	if names := report.SensitivityOutputs(r); len(names) != 0 {
		t.Errorf("outputs %v for a skipped analysis", names)
	}
}
