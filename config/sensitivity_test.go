package config

import (
	"reflect"
	"slices"
	"strings"
	"testing"
)

const sensBase = base + `[[indicator]]
name = "heat"
measure = "recovery"
weight = 2

[[indicator]]
name = "forest"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 1
`

func decodeValid(t *testing.T, text string) *Config {
	t.Helper()
	cfg, errs := Decode(text, "c.toml")
	if len(errs) == 0 {
		errs = cfg.Validate()
	}
	for _, e := range errs {
		t.Error(e)
	}
	if len(errs) > 0 {
		t.FailNow()
	}
	return cfg
}

func TestSensitivitySection(t *testing.T) {
	if cfg := decodeValid(t, sensBase); cfg.Sensitivity != nil {
		t.Errorf("no [sensitivity] section: got %+v, want nil", cfg.Sensitivity)
	}
	cfg := decodeValid(t, sensBase+"[sensitivity]\n")
	if !reflect.DeepEqual(cfg.Sensitivity, DefaultSensitivity()) {
		t.Errorf("empty [sensitivity]: got %+v, want the defaults %+v", cfg.Sensitivity, DefaultSensitivity())
	}
	// A sub-table alone turns the analysis on too.
	if cfg := decodeValid(t, sensBase+"[sensitivity.sobol]\nenabled = false\n"); cfg.Sensitivity == nil || cfg.Sensitivity.Sobol.Enabled {
		t.Errorf("[sensitivity.sobol] alone: got %+v", cfg.Sensitivity)
	}

	cfg = decodeValid(t, sensBase+`[sensitivity]
samples = 500
sampling = "uniform"
concentration = 200
bounds = { heat = [0, 1], forest = [0.1, 0.5] }
top_n = 3
deltas = [0.25]
normalizations = ["rank", "minmax"]
aggregations = ["geometric"]
scopes = ["all"]
workers = 2
[sensitivity.sobol]
base_samples = 64
bootstrap = 0
`)
	s := cfg.Sensitivity
	want := &Sensitivity{
		Samples: 500, Sampling: UniformSimplex, Concentration: 200,
		Bounds: map[string][]float64{"heat": {0, 1}, "forest": {0.1, 0.5}},
		TopN:   3, Deltas: []float64{0.25},
		Normalizations: []NormMethod{Rank, MinMax}, Aggregations: []AggMethod{Geometric}, Scopes: []Scope{ScopeAll},
		Workers: 2,
		Sobol:   SobolIndices{Enabled: true, BaseSamples: 64, Bootstrap: 0, Level: 0.95, Spread: 0.5},
	}
	if !reflect.DeepEqual(s, want) {
		t.Errorf("decoded %+v\nwant    %+v", s, want)
	}
}

func TestSensitivityAlternatives(t *testing.T) {
	tests := []struct {
		name   string
		extra  string
		norms  []NormMethod
		aggs   []AggMethod
		scopes []Scope
	}{
		{"defaults: configured first, then the others", "[sensitivity]\n",
			[]NormMethod{MinMax, ZScore, Rank}, []AggMethod{Arithmetic, Geometric}, []Scope{ScopeAll}},
		{"configured rank and geometric, group scope", "[normalization]\nmethod = \"rank\"\nscope = \"group\"\n[aggregation]\nmethod = \"geometric\"\n[sensitivity]\n",
			[]NormMethod{Rank, MinMax, ZScore}, []AggMethod{Geometric, Arithmetic}, []Scope{ScopeGroup, ScopeAll}},
		{"clustering adds the cluster scope", "[clustering]\n[sensitivity]\n",
			[]NormMethod{MinMax, ZScore, Rank}, []AggMethod{Arithmetic, Geometric}, []Scope{ScopeAll, ScopeCluster}},
		{"lists as given", "[sensitivity]\nnormalizations = [\"zscore\"]\naggregations = [\"arithmetic\"]\nscopes = [\"group\"]\n",
			[]NormMethod{ZScore}, []AggMethod{Arithmetic}, []Scope{ScopeGroup}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			cfg := decodeValid(t, sensBase+tc.extra)
			if got := cfg.SensitivityNormalizations(); !slices.Equal(got, tc.norms) {
				t.Errorf("normalizations %v, want %v", got, tc.norms)
			}
			if got := cfg.SensitivityAggregations(); !slices.Equal(got, tc.aggs) {
				t.Errorf("aggregations %v, want %v", got, tc.aggs)
			}
			if got := cfg.SensitivityScopes(); !slices.Equal(got, tc.scopes) {
				t.Errorf("scopes %v, want %v", got, tc.scopes)
			}
		})
	}
	// "target" is offered only when every indicator following the global
	// method has a target.
	cfg := decodeValid(t, strings.ReplaceAll(sensBase, "weight = ", "target = 1.0\nweight = ")+"[sensitivity]\n")
	if got := cfg.SensitivityNormalizations(); !slices.Contains(got, TargetN) {
		t.Errorf("every indicator has a target: normalizations %v lack \"target\"", got)
	}
}

func TestSensitivityErrors(t *testing.T) {
	tests := []struct {
		name  string
		extra string
		want  []string // substrings of the errors
	}{
		{"unknown key", "[sensitivity]\nsample = 10\n",
			[]string{`c.toml:17: sensitivity.sample: unknown key (did you mean "samples"?)`}},
		{"samples", "[sensitivity]\nsamples = 0\n",
			[]string{`c.toml:17:11: sensitivity.samples: want at least 1 weight sample, got 0`}},
		{"sampling", "[sensitivity]\nsampling = \"dirichelt\"\n",
			[]string{`c.toml:17:12: sensitivity.sampling: want one of "dirichlet", "uniform", got "dirichelt" (did you mean "dirichlet"?)`}},
		{"concentration", "[sensitivity]\nconcentration = -1\n",
			[]string{`c.toml:17:17: sensitivity.concentration: want a finite number > 0`}},
		{"bounds out of range", "[sensitivity]\nbounds = { heat = [0.5, 0.2] }\n",
			[]string{`c.toml:17:10: sensitivity.bounds.heat: want [low, high] with 0 <= low <= high <= 1 (weights sum to 1), got [0.5 0.2]`}},
		{"bounds of an unknown indicator", "[sensitivity.bounds]\nhaet = [0.1, 0.2]\n",
			[]string{`c.toml:17:8: sensitivity.bounds.haet: "haet" is not an indicator name (did you mean "heat"?)`}},
		{"bounds that no weights meet", "[sensitivity]\nbounds = { heat = [0.6, 0.9], forest = [0.5, 1] }\n",
			[]string{`sensitivity.bounds: no weights within the bounds sum to 1: the lower bounds sum to 1.1`}},
		{"top_n", "[sensitivity]\ntop_n = -2\n",
			[]string{`c.toml:17:9: sensitivity.top_n: want stations >= 0`}},
		{"deltas", "[sensitivity]\ndeltas = [0.2, 1.5, 0]\n",
			[]string{`sensitivity.deltas: want relative steps in (0, 1] (0.2 moves a weight by ±20%), got 1.5`, `got 0`}},
		{"no deltas", "[sensitivity]\ndeltas = []\n",
			[]string{`sensitivity.deltas: want at least one relative step`}},
		{"normalizations", "[sensitivity]\nnormalizations = [\"minmax\", \"rnak\", \"minmax\", \"target\"]\n",
			[]string{`sensitivity.normalizations: want one of "minmax", "zscore", "rank", "target", got "rnak" (did you mean "rank"?)`,
				`"minmax" is listed twice`, `"target" needs a target on every indicator`}},
		{"aggregations", "[sensitivity]\naggregations = [\"harmonic\"]\n",
			[]string{`sensitivity.aggregations: want one of "arithmetic", "geometric", got "harmonic"`}},
		{"cluster scope without clustering", "[sensitivity]\nscopes = [\"cluster\"]\n",
			[]string{`c.toml:17:10: sensitivity.scopes: scope "cluster" needs a [clustering] section`}},
		{"workers", "[sensitivity]\nworkers = -1\n",
			[]string{`sensitivity.workers: want >= 0`}},
		{"sobol", "[sensitivity.sobol]\nbase_samples = 1\nbootstrap = -5\nlevel = 95\nspread = 2\n",
			[]string{`c.toml:17:16: sensitivity.sobol.base_samples: want at least 2`, `sensitivity.sobol.bootstrap: want replicates >= 0`,
				`sensitivity.sobol.level: want a confidence level strictly between 0 and 1, got 95`, `sensitivity.sobol.spread: want a relative spread in (0, 1]`}},
		{"wrong type", "[sensitivity]\ndeltas = 0.2\n",
			[]string{`c.toml:17:10: sensitivity.deltas: want an array, got a number`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			cfg, errs := Decode(sensBase+tc.extra, "c.toml")
			if len(errs) == 0 {
				errs = cfg.Validate()
			}
			var got []string
			for _, e := range errs {
				got = append(got, e.Error())
			}
			all := strings.Join(got, "\n")
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("missing error %q; got:\n%s", w, all)
				}
			}
		})
	}
}
