package pipeline_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"strings"
	"testing"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/testrun"
	"rebound/index/rankstat"
	"rebound/index/sensitivity"
)

// sensConfig scores 22 invented stations on three attribute indicators.
// Station TOP is the best on every indicator, S05 lacks "b" (its weight is
// redistributed) and NONE has no value at all (no score).
const sensConfig = `title = "sensitivity test"
seed = 7
[inputs]
attributes = "stations.csv"
[[indicator]]
name = "a"
measure = "attribute"
attribute = "x1"
better = "higher"
weight = 0.5
[[indicator]]
name = "b"
measure = "attribute"
attribute = "x2"
better = "lower"
weight = 0.3
[[indicator]]
name = "c"
measure = "attribute"
attribute = "x3"
better = "higher"
weight = 0.2
`

const sensSection = `[sensitivity]
samples = 400
deltas = [0.2, 0.5]
%s
[sensitivity.sobol]
base_samples = 128
bootstrap = 50
`

func sensStations(group bool) string {
	var b strings.Builder
	b.WriteString("station,name,latitude,longitude,x1,x2,x3")
	if group {
		b.WriteString(",group")
	}
	b.WriteString("\n")
	rnd := rand.New(rand.NewPCG(1, 2))
	row := func(id string, i int, x1, x2, x3 string) {
		fmt.Fprintf(&b, "%s,Station %s,%.2f,-30.5,%s,%s,%s", id, id, 40+float64(i)/10, x1, x2, x3)
		if group {
			fmt.Fprintf(&b, ",g%d", i%2)
		}
		b.WriteString("\n")
	}
	for i := range 20 {
		x2 := fmt.Sprintf("%.3f", 10+80*rnd.Float64())
		if i == 4 {
			x2 = ""
		}
		row(fmt.Sprintf("S%02d", i+1), i, fmt.Sprintf("%.3f", 10+80*rnd.Float64()), x2, fmt.Sprintf("%.3f", 10+80*rnd.Float64()))
	}
	row("TOP", 20, "95", "5", "95")
	row("NONE", 21, "", "", "")
	return b.String()
}

// sensRun loads and scores the test stations with the [sensitivity]
// section given extra keys.
func sensRun(t *testing.T, extra string, group bool) *pipeline.Run {
	t.Helper()
	r, _ := testrun.Load(t, map[string]string{
		"s.toml":       sensConfig + fmt.Sprintf(sensSection, extra),
		"stations.csv": sensStations(group),
	}, "s.toml")
	if r.Sensitivity == nil {
		t.Fatal("the analysis did not run")
	}
	return r
}

func station(t *testing.T, r *pipeline.Run, id string) int {
	t.Helper()
	i := slices.Index(r.Raw.Stations, id)
	if i < 0 {
		t.Fatalf("no station %s", id)
	}
	return i
}

// The analyses start from exactly the ranking the run reports.
func TestSensitivityBaseRanking(t *testing.T) {
	r := sensRun(t, "", false)
	s := r.Sensitivity
	for i, want := range r.Result.Rank {
		if got := s.MonteCarlo.Stations[i].Base; int(got) != want {
			t.Errorf("station %s: Monte Carlo base rank %d, run rank %d", r.Raw.Stations[i], got, want)
		}
		if got := s.OAT.Base[i]; int(got) != want {
			t.Errorf("station %s: one-at-a-time base rank %d, run rank %d", r.Raw.Stations[i], got, want)
		}
		if got := s.Structural.Ranks[0][i]; int(got) != want {
			t.Errorf("station %s: structural reference rank %d, run rank %d", r.Raw.Stations[i], got, want)
		}
	}
	// And the run's ranks are rankstat's ranks of its composites.
	want := rankstat.Ranks(nil, r.Result.Composite)
	for i := range want {
		if int(want[i]) != r.Result.Rank[i] {
			t.Fatalf("run ranks %v, rankstat ranks of the composites %v", r.Result.Rank, want)
		}
	}
	if got := s.MonteCarlo.Stations[station(t, r, "NONE")].Stability; got != sensitivity.Unranked {
		t.Errorf("station without a score: stability %v, want unranked", got)
	}
}

// The same seed gives the same results at 1 and 2 workers, and another
// seed gives other samples.
func TestSensitivityDeterministic(t *testing.T) {
	one := sensRun(t, "workers = 1", false).Sensitivity
	two := sensRun(t, "workers = 2", false).Sensitivity
	one.Settings.Workers, two.Settings.Workers = 0, 0
	// NaN marks the intervals not computed; make it comparable.
	for _, s := range []*sensitivity.SobolResult{one.Sobol, two.Sobol} {
		for _, x := range [][]float64{s.Mean, s.Variance, s.First, s.Total, s.FirstLo, s.FirstHi, s.TotalLo, s.TotalHi} {
			for i := range x {
				if math.IsNaN(x[i]) {
					x[i] = -1
				}
			}
		}
	}
	if !reflect.DeepEqual(one, two) {
		t.Error("results differ between 1 and 2 workers")
	}
	r := sensRun(t, "workers = 2", false)
	r.Config.Seed = 8
	if err := r.Score(); err != nil {
		t.Fatal(err)
	}
	if slices.Equal(r.Sensitivity.MonteCarlo.SpearmanSamples, one.MonteCarlo.SpearmanSamples) {
		t.Error("seeds 7 and 8 drew the same samples")
	}
}

// With a huge Dirichlet concentration every sample is the base weights, so
// every interval collapses to the base rank (analytic: the variance of a
// weight is w(1−w)/(c+1)).
func TestSensitivityCollapse(t *testing.T) {
	r := sensRun(t, "concentration = 1e12", false)
	// The collapse needs composites that no 1e-6 change of the weights
	// reorders.
	c := slices.Clone(r.Result.Composite)
	c = slices.DeleteFunc(c, math.IsNaN)
	slices.Sort(c)
	for i := 1; i < len(c); i++ {
		if c[i]-c[i-1] < 1e-4 {
			t.Fatalf("composites %g and %g too close for the test", c[i-1], c[i])
		}
	}
	for i, st := range r.Sensitivity.MonteCarlo.Stations {
		if st.Stability == sensitivity.Unranked {
			continue
		}
		if st.Low != st.Base || st.High != st.Base || st.Median != st.Base || st.Best != st.Base || st.Worst != st.Base {
			t.Errorf("station %s: interval [%d, %d], best %d, worst %d; want all %d", r.Raw.Stations[i], st.Low, st.High, st.Best, st.Worst, st.Base)
		}
	}
	if sp := r.Sensitivity.MonteCarlo.Spearman; sp.Min != 1 {
		t.Errorf("Spearman's rho %+v; want 1 in every sample", sp)
	}
}

// A station that is best on every indicator is rank 1 under any weights,
// even weights drawn uniformly from the whole simplex.
func TestSensitivityDominant(t *testing.T) {
	r := sensRun(t, `sampling = "uniform"`, false)
	i := station(t, r, "TOP")
	st := r.Sensitivity.MonteCarlo.Stations[i]
	if st.Best != 1 || st.Worst != 1 || st.Top != 1 || st.Stability != sensitivity.RobustTop {
		t.Errorf("dominant station: %+v; want rank 1 in every sample, robust-top", st)
	}
	if r.Sensitivity.OAT.StationMax[i] != 0 {
		t.Errorf("dominant station moves %d ranks one at a time", r.Sensitivity.OAT.StationMax[i])
	}
	for s, ranks := range r.Sensitivity.Structural.Ranks {
		if ranks[i] != 1 {
			t.Errorf("dominant station ranks %d under %s", ranks[i], r.Sensitivity.Structural.Names[s])
		}
	}
}

func TestSensitivityStructural(t *testing.T) {
	names := func(r *pipeline.Run) []string {
		var out []string
		for _, sc := range r.Sensitivity.Scenarios {
			out = append(out, sc.Name())
		}
		return out
	}
	tests := []struct {
		name    string
		extra   string
		group   bool
		want    []string
		skipped []string // prefixes of the skipped combinations
		warns   int      // warnings about skipped combinations
	}{
		{"defaults", "", false,
			[]string{"minmax/arithmetic/all", "minmax/geometric/all", "zscore/arithmetic/all", "rank/arithmetic/all", "rank/geometric/all"},
			[]string{"zscore/geometric/all: z-scores can be negative"}, 0},
		{"group scope without a group column", `scopes = ["all", "group"]
normalizations = ["minmax"]
aggregations = ["arithmetic"]`, false,
			[]string{"minmax/arithmetic/all"},
			[]string{`minmax/arithmetic/group: scope "group" needs a group column`}, 1},
		{"group scope", `scopes = ["all", "group"]
normalizations = ["minmax"]
aggregations = ["arithmetic"]`, true,
			[]string{"minmax/arithmetic/all", "minmax/arithmetic/group"}, nil, 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r := sensRun(t, tc.extra, tc.group)
			s := r.Sensitivity
			if got := names(r); !slices.Equal(got, tc.want) {
				t.Errorf("scenarios %v, want %v", got, tc.want)
			}
			if len(s.Skipped) != len(tc.skipped) {
				t.Fatalf("skipped %q, want %d", s.Skipped, len(tc.skipped))
			}
			for q, p := range tc.skipped {
				if !strings.HasPrefix(s.Skipped[q].String(), p) {
					t.Errorf("skipped %q, want %q...", s.Skipped[q], p)
				}
			}
			warns := 0
			for _, w := range r.Warnings {
				if strings.Contains(w.Error(), "structural alternative") {
					warns++
				}
			}
			if warns != tc.warns {
				t.Errorf("%d warnings about skipped alternatives, want %d: %v", warns, tc.warns, r.Warnings)
			}
			if len(tc.want) == 1 && s.Structural != nil {
				t.Error("a structural result without alternatives")
			}
			if sr := s.Structural; sr != nil {
				for i := range r.Raw.Stations {
					if sr.Min[i] > int32(r.Result.Rank[i]) || sr.Max[i] < int32(r.Result.Rank[i]) {
						t.Errorf("station %s: rank range [%d, %d] misses the base rank %d", r.Raw.Stations[i], sr.Min[i], sr.Max[i], r.Result.Rank[i])
					}
				}
			}
		})
	}
}

func TestSensitivitySettings(t *testing.T) {
	r := sensRun(t, "bounds = { a = [0.3, 0.45] }\ntop_n = 3", false)
	s := r.Sensitivity
	if s.MonteCarlo.TopN != 3 || s.Settings.Seed != 7 || s.Settings.Samples != 400 {
		t.Errorf("settings %+v, top_n %d", s.Settings, s.MonteCarlo.TopN)
	}
	if want := []sensitivity.Bound{{Lo: 0.3, Hi: 0.45}, {Lo: 0, Hi: 1}, {Lo: 0, Hi: 1}}; !slices.Equal(s.Settings.Bounds, want) {
		t.Errorf("bounds %v, want %v", s.Settings.Bounds, want)
	}
	// The configured weight of a (0.5) is outside its bounds: a warning.
	if !slices.ContainsFunc(s.Warnings, func(err error) bool { return strings.Contains(err.Error(), "lies outside its bounds") }) {
		t.Errorf("no warning about the weight outside its bounds: %v", s.Warnings)
	}
	if s.Sobol == nil || s.Sobol.N != 128 || s.Sobol.Bootstrap != 50 {
		t.Errorf("Sobol %+v", s.Sobol)
	}

	r = sensRun(t, "", false)
	r.Config.Sensitivity.Sobol.Enabled = false
	r.Config.Sensitivity.Sobol.Bootstrap = 0
	if err := r.Score(); err != nil {
		t.Fatal(err)
	}
	if r.Sensitivity.Sobol != nil {
		t.Error("Sobol indices computed with sobol.enabled = false")
	}
	r.Config.Sensitivity = nil
	if err := r.Score(); err != nil {
		t.Fatal(err)
	}
	if r.Sensitivity != nil {
		t.Error("a sensitivity result without a [sensitivity] section")
	}
}

// More stations than the rank histograms can hold: an error that says
// what to do, before any sample is drawn.
func TestSensitivityTooManyStations(t *testing.T) {
	var b strings.Builder
	b.WriteString("station,name,latitude,longitude,x1,x2,x3\n")
	for i := range 23171 { // √(2^30/2) = 23170.5
		fmt.Fprintf(&b, "S%05d,,40,-30,%d,%d,%d\n", i, i%97, i%89, i%83)
	}
	dir := t.TempDir()
	for name, text := range map[string]string{"s.toml": sensConfig + "[sensitivity]\n", "stations.csv": b.String()} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	r, errs := pipeline.Load(filepath.Join(dir, "s.toml"))
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	err := r.Score()
	if err == nil || !strings.Contains(err.Error(), "23171 stations are too many for the Monte Carlo analysis: its rank histograms hold n² counters of 2 bytes in at most 1024 MiB, enough for 23170 stations") {
		t.Errorf("error %v", err)
	}
}
