package config

import (
	"fmt"
	"math"
	"slices"
)

// Sensitivity configures the robustness analysis of the ranking
// ([sensitivity]): how far each station's rank moves when the weights, the
// normalisation, the aggregation or the scope change. Every field has a
// default (DefaultSensitivity); the template documents each.
type Sensitivity struct {
	// Samples is the number of Monte Carlo weight vectors.
	Samples int `toml:"samples"`
	// Sampling is the distribution of the Monte Carlo weight vectors:
	// "dirichlet" (centred on the configured weights) or "uniform"
	// (uniform over every weight vector that sums to 1).
	Sampling Sampling `toml:"sampling"`
	// Concentration is c in the Dirichlet parameters α_j = c·w_j: weight j
	// has mean w_j and variance w_j(1−w_j)/(c+1), so a larger c keeps the
	// samples closer to the configured weights.
	Concentration float64 `toml:"concentration"`
	// Bounds optionally confines an indicator's weight (after the weights
	// are scaled to sum to 1) to [low, high]: Monte Carlo samples outside
	// the bounds are drawn again. Keys are indicator names.
	Bounds map[string][]float64 `toml:"bounds"`
	// TopN is the size of the top group and of the bottom group that
	// P(top), P(bottom) and the stability classes refer to; 0 means a
	// tenth of the stations, rounded up.
	TopN int `toml:"top_n"`
	// Deltas are the relative steps of the one-at-a-time analysis: each
	// weight in turn becomes w(1−δ) and w(1+δ).
	Deltas []float64 `toml:"deltas"`
	// Normalizations, Aggregations and Scopes are the alternatives of the
	// structural analysis; every combination is scored. Empty means the
	// configured choice plus every other that applies (see
	// Config.SensitivityNormalizations and the others). The configured
	// combination is always the reference.
	Normalizations []NormMethod `toml:"normalizations"`
	Aggregations   []AggMethod  `toml:"aggregations"`
	Scopes         []Scope      `toml:"scopes"`
	// Severities are severity floors (1–4) to try as structural
	// alternatives: each recomputes the event indicators (but the slopes)
	// counting the events of that class and above, with the configured
	// normalisation, aggregation and scope. Empty means none.
	Severities []int `toml:"severities"`
	// Sobol configures the variance-based indices of the weights.
	Sobol SobolIndices `toml:"sobol"`
	// Workers is the number of goroutines; 0 means one per core. The
	// results do not depend on it.
	Workers int `toml:"workers"`
}

// SobolIndices configures the first-order and total Sobol indices of the
// weights ([sensitivity.sobol]).
type SobolIndices struct {
	Enabled bool `toml:"enabled"`
	// BaseSamples is N, the rows of each of the two base sample matrices;
	// the composite is computed N·(k+2) times for k weights.
	BaseSamples int `toml:"base_samples"`
	// Bootstrap is the number of bootstrap replicates of the confidence
	// intervals; 0 means no intervals.
	Bootstrap int `toml:"bootstrap"`
	// Level is the confidence level of the intervals.
	Level float64 `toml:"level"`
	// Spread is δ: each weight varies uniformly within ±δ of its
	// configured value (relative), before the weights are scaled to sum
	// to 1.
	Spread float64 `toml:"spread"`
	// StationIntervals asks for bootstrap intervals on every station's
	// indices, not only on the ranking-wide ones.
	StationIntervals bool `toml:"station_intervals"`
}

// Sampling is the distribution of Monte Carlo weight vectors.
type Sampling string

const (
	Dirichlet      Sampling = "dirichlet"
	UniformSimplex Sampling = "uniform"
)

func (s *Sampling) UnmarshalTOML(v any) error {
	t, err := text(v, "sampling")
	*s = Sampling(t)
	return err
}

// DefaultSensitivity returns the sensitivity defaults.
func DefaultSensitivity() *Sensitivity {
	return &Sensitivity{
		Samples:       10000,
		Sampling:      Dirichlet,
		Concentration: 50,
		Deltas:        []float64{0.2, 0.5},
		Sobol: SobolIndices{
			Enabled:     true,
			BaseSamples: 4096,
			Bootstrap:   1000,
			Level:       0.95,
			Spread:      0.5,
		},
	}
}

// SensitivityNormalizations returns the normalisation methods of the
// structural analysis: sensitivity.normalizations when given, else the
// configured method followed by every other that applies ("target" only
// when every indicator without its own normalize has a target).
func (c *Config) SensitivityNormalizations() []NormMethod {
	if s := c.Sensitivity; s != nil && len(s.Normalizations) > 0 {
		return s.Normalizations
	}
	out := []NormMethod{c.Normalization.Method}
	for _, m := range NormMethods {
		if m != c.Normalization.Method && (m != TargetN || c.targetsSet()) {
			out = append(out, m)
		}
	}
	return out
}

// SensitivityAggregations returns the aggregation methods of the
// structural analysis: sensitivity.aggregations when given, else the
// configured method followed by the other.
func (c *Config) SensitivityAggregations() []AggMethod {
	if s := c.Sensitivity; s != nil && len(s.Aggregations) > 0 {
		return s.Aggregations
	}
	out := []AggMethod{c.Aggregation.Method}
	for _, m := range AggMethods {
		if m != c.Aggregation.Method {
			out = append(out, m)
		}
	}
	return out
}

// SensitivityScopes returns the normalisation scopes of the structural
// analysis: sensitivity.scopes when given, else the configured scope, "all"
// (every station together) and, with a [clustering] section, "cluster".
func (c *Config) SensitivityScopes() []Scope {
	if s := c.Sensitivity; s != nil && len(s.Scopes) > 0 {
		return s.Scopes
	}
	out := []Scope{c.Normalization.Scope}
	if !slices.Contains(out, ScopeAll) {
		out = append(out, ScopeAll)
	}
	if c.Clustering != nil && !slices.Contains(out, ScopeCluster) {
		out = append(out, ScopeCluster)
	}
	return out
}

// targetsSet reports whether every indicator that follows the global
// normalisation method has a target, so that method "target" applies.
func (c *Config) targetsSet() bool {
	for _, in := range c.Indicators {
		if in.Normalize == "" && in.Target == nil {
			return false
		}
	}
	return true
}

func (c *Config) validateSensitivity(bad reportFunc) {
	s := c.Sensitivity
	if s == nil {
		return
	}
	if s.Samples < 1 {
		bad("sensitivity.samples", "want at least 1 weight sample, got %d", s.Samples)
	}
	if msg := choiceMsg(string(s.Sampling), []string{string(Dirichlet), string(UniformSimplex)}); msg != "" {
		bad("sensitivity.sampling", "%s", msg)
	}
	if !(s.Concentration > 0) || math.IsInf(s.Concentration, 1) {
		bad("sensitivity.concentration", "want a finite number > 0 (larger keeps the samples closer to the configured weights), got %g", s.Concentration)
	}
	c.validateBounds(bad)
	if s.TopN < 0 {
		bad("sensitivity.top_n", "want stations >= 0 (0 means a tenth of the stations), got %d", s.TopN)
	}
	if len(s.Deltas) == 0 {
		bad("sensitivity.deltas", "want at least one relative step, e.g. [0.2, 0.5]")
	}
	for _, d := range s.Deltas {
		if !(d > 0 && d <= 1) {
			bad("sensitivity.deltas", "want relative steps in (0, 1] (0.2 moves a weight by ±20%%), got %g", d)
		}
	}
	for i, m := range s.Normalizations {
		if msg := choiceMsg(string(m), strs(NormMethods)); msg != "" {
			bad("sensitivity.normalizations", "%s", msg)
		} else if slices.Contains(s.Normalizations[:i], m) {
			bad("sensitivity.normalizations", "%q is listed twice", m)
		} else if m == TargetN && !c.targetsSet() {
			bad("sensitivity.normalizations", "\"target\" needs a target on every indicator that has no normalize of its own")
		}
	}
	for i, m := range s.Aggregations {
		if msg := choiceMsg(string(m), strs(AggMethods)); msg != "" {
			bad("sensitivity.aggregations", "%s", msg)
		} else if slices.Contains(s.Aggregations[:i], m) {
			bad("sensitivity.aggregations", "%q is listed twice", m)
		} else if m == Geometric && !(c.Aggregation.Floor > 0 && c.Aggregation.Floor < 1) {
			bad("sensitivity.aggregations", "\"geometric\" needs aggregation.floor strictly between 0 and 1, got %g", c.Aggregation.Floor)
		}
	}
	for i, v := range s.Severities {
		if v < 1 || v > 4 {
			bad("sensitivity.severities", "element %d: want a severity class 1-4 (1 moderate = every event, 2 strong, 3 severe, 4 extreme), got %d", i+1, v)
		} else if slices.Contains(s.Severities[:i], v) {
			bad("sensitivity.severities", "%d is listed twice", v)
		}
	}
	for i, sc := range s.Scopes {
		if msg := choiceMsg(string(sc), strs(Scopes)); msg != "" {
			bad("sensitivity.scopes", "%s", msg)
		} else if slices.Contains(s.Scopes[:i], sc) {
			bad("sensitivity.scopes", "%q is listed twice", sc)
		} else if sc == ScopeCluster && c.Clustering == nil {
			bad("sensitivity.scopes", "scope \"cluster\" needs a [clustering] section")
		}
	}
	if s.Workers < 0 {
		bad("sensitivity.workers", "want >= 0 (0 means one per core), got %d", s.Workers)
	}
	if !s.Sobol.Enabled {
		return
	}
	if s.Sobol.BaseSamples < 2 {
		bad("sensitivity.sobol.base_samples", "want at least 2 base samples, got %d", s.Sobol.BaseSamples)
	}
	if s.Sobol.Bootstrap < 0 {
		bad("sensitivity.sobol.bootstrap", "want replicates >= 0 (0 means no intervals), got %d", s.Sobol.Bootstrap)
	}
	if !(s.Sobol.Level > 0 && s.Sobol.Level < 1) {
		bad("sensitivity.sobol.level", "want a confidence level strictly between 0 and 1, got %g", s.Sobol.Level)
	}
	if !(s.Sobol.Spread > 0 && s.Sobol.Spread <= 1) {
		bad("sensitivity.sobol.spread", "want a relative spread in (0, 1] (0.5 varies each weight by ±50%%), got %g", s.Sobol.Spread)
	}
}

// validateBounds checks sensitivity.bounds: known indicator names, [low,
// high] within [0, 1], and some weight vector within the bounds.
func (c *Config) validateBounds(bad reportFunc) {
	b := c.Sensitivity.Bounds
	if len(b) == 0 {
		return
	}
	var names []string
	for _, in := range c.Indicators {
		names = append(names, in.Name)
	}
	lo, hi := 0.0, 0.0
	ok := true
	for _, in := range c.Indicators {
		r, given := b[in.Name]
		if !given {
			hi++
			continue
		}
		key := "sensitivity.bounds." + in.Name
		if len(r) != 2 || !(0 <= r[0] && r[0] <= r[1] && r[1] <= 1) {
			bad(key, "want [low, high] with 0 <= low <= high <= 1 (weights sum to 1), got %v", r)
			ok = false
			continue
		}
		if c.Weighting.Method == Explicit && in.Weight != nil && *in.Weight == 0 && r[0] > 0 {
			bad(key, "the weight of %q is 0 and stays 0 in every sample, but its lower bound is %g", in.Name, r[0])
			ok = false
		}
		lo += r[0]
		hi += r[1]
	}
	for _, name := range sortedMapKeys(b) {
		if !slices.Contains(names, name) {
			msg := fmt.Sprintf("%q is not an indicator name", name)
			if near := closest(name, names); near != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", near)
			}
			bad("sensitivity.bounds."+name, "%s", msg)
			ok = false
		}
	}
	if ok && (lo > 1 || hi < 1) {
		bad("sensitivity.bounds", "no weights within the bounds sum to 1: the lower bounds sum to %g and the upper bounds (1 where none is given) to %g", lo, hi)
	}
}

func sortedMapKeys[V any](m map[string]V) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

const templateSensitivity = `
# Sensitivity of the ranking: how far each station's rank moves when the
# weights, the normalisation, the aggregation or the scope change (OECD/JRC
# Handbook on Constructing Composite Indicators, 2008; Saltelli et al.
# 2008). The section's presence turns the analysis on; to skip it, remove
# it together with its sobol table below. "rebound sensitivity" runs the
# analysis alone.
[sensitivity]
# Monte Carlo: this many weight vectors are drawn and the stations ranked
# under each; every station gets its median rank, the 5th-95th percentile
# rank interval and the share of samples that put it in the top and in the
# bottom group.
samples = 10000
# "dirichlet": weights drawn around the configured ones (see concentration);
# "uniform": every weight vector that sums to 1 equally likely.
sampling = "dirichlet"
# Dirichlet concentration c: weight w varies with standard deviation
# sqrt(w(1-w)/(c+1)). Larger = closer to the configured weights; 50 moves a
# weight of 0.2 by about +/-0.056.
concentration = 50.0
# Optional bounds on the sampled weights (after scaling to sum 1), by
# indicator name; samples outside are drawn again. For example:
# bounds = { heat_magnitude = [0.2, 0.4], forest_cover = [0.1, 0.3] }
bounds = {}
# Size of the top and of the bottom group (0 = a tenth of the stations,
# rounded up). A station is robustly in the top when at least 95% of the
# samples put it there; weight-dependent when its 5th-95th percentile
# interval spans more than top_n ranks.
top_n = 0
# One-at-a-time: each weight in turn is moved down and up by each relative
# step (0.2 = +/-20%), the other weights rescaled to keep the sum at 1.
deltas = [0.2, 0.5]
# Structural alternatives: every combination of these normalisation
# methods, aggregation methods and scopes is scored and ranked. Empty lists
# mean the configured choice plus every other that applies: z-scores are
# never combined with geometric aggregation, "target" needs a target on
# every indicator, and scope "cluster" (tried by default when there is a
# clustering section) needs one. Indicators with their own normalize keep
# it.
normalizations = []
aggregations = []
scopes = []
# Severity floors to try instead of each event indicator's min_severity (the
# slopes keep theirs), e.g. [1, 3]: every event, or severe ones and above.
severities = []
# Goroutines for the analysis (0 = one per core); results do not depend
# on it.
workers = 0

[sensitivity.sobol]
# First-order and total Sobol indices of the weights (Saltelli et al. 2010;
# Jansen 1999): the share of the variance of each station's composite, and
# of the mean absolute rank shift, due to each weight alone and with its
# interactions. Each weight varies uniformly within +/-spread of its value
# (relative), and the weights are scaled to sum to 1.
enabled = true
# The composite is computed base_samples x (indicators + 2) times.
base_samples = 4096
# Bootstrap replicates for the confidence intervals (0 = no intervals) and
# their level.
bootstrap = 1000
level = 0.95
spread = 0.5
# Intervals for every station's indices as well (slower: each station costs
# as much as the ranking-wide intervals).
station_intervals = false
`
