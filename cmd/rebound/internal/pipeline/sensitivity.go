package pipeline

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"rebound/config"
	"rebound/index"
	"rebound/index/sensitivity"
)

// SensitivityResult holds the robustness analysis of the ranking
// ([sensitivity]). Per-station slices of the results are indexed like
// Raw.Stations; indicator indices follow Raw.Indicators.
type SensitivityResult struct {
	// Settings are the settings the analyses ran with, seed included.
	Settings sensitivity.Settings
	// OAT moves one weight at a time by each step in Settings.Deltas.
	OAT *sensitivity.OATResult
	// MonteCarlo is every station's rank distribution over
	// Settings.Samples random weight vectors.
	MonteCarlo *sensitivity.MonteCarloResult
	// Scenarios are the ways of building the index that the structural
	// analysis scored; Scenarios[0] is the configured one. Structural
	// ranks the stations under each (nil when there is no alternative).
	Scenarios  []Scenario
	Structural *sensitivity.StructuralResult
	// Skipped lists the combinations of the structural analysis that were
	// not scored, each with the reason.
	Skipped []Skipped
	// Sobol holds the Sobol indices of the weights: output s < n is the
	// composite of station s, output n (RankShift) the mean absolute rank
	// shift from the base ranking. Nil when sensitivity.sobol.enabled is
	// false.
	Sobol *sensitivity.SobolResult
	// Warnings are the analysis's warnings (also in Run.Warnings).
	Warnings []error
}

// RankShift returns the index of the ranking-wide Sobol output, the mean
// absolute rank shift: the number of stations.
func (s *SensitivityResult) RankShift() int { return len(s.MonteCarlo.Stations) }

// Scenario is one way of building the index in the structural analysis.
type Scenario struct {
	Normalization config.NormMethod // replaces normalization.method
	Aggregation   config.AggMethod
	Scope         config.Scope
	// MinSeverity, when not 0, replaces the min_severity of every event
	// indicator but the slopes.
	MinSeverity int
}

// Skipped is a combination the structural analysis did not score.
type Skipped struct {
	Scenario
	Reason string
}

func (s Skipped) String() string { return s.Name() + ": " + s.Reason }

// Name names the scenario as "normalisation/aggregation/scope", e.g.
// "minmax/arithmetic/all".
func (s Scenario) Name() string {
	n := string(s.Normalization) + "/" + string(s.Aggregation) + "/" + string(s.Scope)
	if s.MinSeverity > 0 {
		n += fmt.Sprintf("/severity>=%d", s.MinSeverity)
	}
	return n
}

// analyzeSensitivity runs the [sensitivity] analyses after scoring, when
// the configuration has that section: one-at-a-time, Monte Carlo,
// structural and, when enabled, the Sobol indices, all on the model of the
// base result (index.Result.Model), so that they start from exactly the
// ranking the run reports.
func (r *Run) analyzeSensitivity() error {
	r.Sensitivity, r.SensitivitySkipped = nil, ""
	cs := r.Config.Sensitivity
	if cs == nil {
		return nil
	}
	scored := 0
	for _, c := range r.Result.Composite {
		if !math.IsNaN(c) {
			scored++
		}
	}
	if scored < 2 {
		r.SensitivitySkipped = fmt.Sprintf("%s a score, so there is no ranking to test", countHave(scored, "station"))
		r.Warnings = append(r.Warnings, &index.Warning{Msg: "sensitivity: skipped: " + r.SensitivitySkipped})
		return nil
	}
	res := &SensitivityResult{}
	set, err := r.sensitivitySettings(res)
	if err != nil {
		return err
	}
	res.Settings = set
	model := r.Result.Model()
	fail := func(what string, err error) error {
		return fmt.Errorf("sensitivity: %s: %s", what, strings.TrimPrefix(err.Error(), "sensitivity: "))
	}

	if res.OAT, err = sensitivity.OneAtATime(model, set); err != nil {
		return fail("one-at-a-time", err)
	}
	for j, w := range r.Weights.W {
		if w == 1 {
			res.Warnings = append(res.Warnings, &index.Warning{Indicator: r.Raw.Indicators[j].Name,
				Msg: "sensitivity: this indicator carries all the weight, so moving it one at a time leaves no other weight to rescale; its one-at-a-time runs are left out"})
		}
	}
	n := len(r.Raw.Stations)
	counter := int64(2)
	if cs.Samples > math.MaxUint16 {
		counter = 4
	}
	if limit := min(int(math.Sqrt(float64(maxHistogramBytes/counter))), math.MaxUint16); n > limit {
		return fmt.Errorf("sensitivity: %d stations are too many for the Monte Carlo analysis: its rank histograms hold n² counters of %d bytes in at most %d MiB, enough for %d stations; run it on a subset of the stations",
			n, counter, maxHistogramBytes>>20, limit)
	}
	set.MaxMemory = maxHistogramBytes
	if res.MonteCarlo, err = sensitivity.MonteCarlo(model, set); err != nil {
		return fail("Monte Carlo", err)
	}
	if top := res.MonteCarlo.TopN; 2*top > n {
		res.Warnings = append(res.Warnings, &index.Warning{Msg: fmt.Sprintf(
			"sensitivity: the top and bottom groups of %s overlap (%s in all); lower sensitivity.top_n", countStations(top), countStations(n))})
	}
	if err := r.structural(res); err != nil {
		return fail("structural", err)
	}
	if cs.Sobol.Enabled {
		if res.Sobol, err = sensitivity.WeightIndices(model, set); err != nil {
			return fail("Sobol indices", err)
		}
		r.checkSobol(res)
	}
	r.Sensitivity = res
	r.Warnings = append(r.Warnings, res.Warnings...)
	return nil
}

// maxHistogramBytes bounds the Monte Carlo rank histograms (the library's
// default).
const maxHistogramBytes = 1 << 30

// sensitivitySettings translates [sensitivity] into the settings of the
// analyses, with the run's seed. Weights used outside their bounds are
// warned of in res.
func (r *Run) sensitivitySettings(res *SensitivityResult) (sensitivity.Settings, error) {
	cs := r.Config.Sensitivity
	set := sensitivity.Settings{
		Deltas:           cs.Deltas,
		Samples:          cs.Samples,
		Concentration:    cs.Concentration,
		TopN:             cs.TopN,
		Spread:           cs.Sobol.Spread,
		BaseSamples:      cs.Sobol.BaseSamples,
		Bootstrap:        cs.Sobol.Bootstrap,
		Level:            cs.Sobol.Level,
		StationIntervals: cs.Sobol.StationIntervals,
		Seed:             r.Config.Seed,
		Workers:          cs.Workers,
	}
	if cs.Sampling == config.UniformSimplex {
		set.Sampling = sensitivity.UniformSimplex
	}
	if set.Bootstrap == 0 {
		set.Bootstrap = -1 // the configuration's 0 means no intervals
	}
	if len(cs.Bounds) == 0 {
		return set, nil
	}
	set.Bounds = make([]sensitivity.Bound, len(r.Raw.Indicators))
	for j, ind := range r.Raw.Indicators {
		set.Bounds[j] = sensitivity.Bound{Lo: 0, Hi: 1}
		b, ok := cs.Bounds[ind.Name]
		if !ok {
			continue
		}
		set.Bounds[j] = sensitivity.Bound{Lo: b[0], Hi: b[1]}
		w := r.Weights.W[j]
		if w == 0 && b[0] > 0 {
			return set, fmt.Errorf("sensitivity.bounds.%s: the weight of %q is 0 and stays 0 in every sample, but its lower bound is %g", ind.Name, ind.Name, b[0])
		}
		if w < b[0] || w > b[1] {
			res.Warnings = append(res.Warnings, &index.Warning{Indicator: ind.Name, Msg: fmt.Sprintf(
				"sensitivity: the weight used, %.4g, lies outside its bounds [%g, %g]; the samples centre on it but only those within the bounds are kept", w, b[0], b[1])})
		}
	}
	return set, nil
}

// structural scores every combination of the configured alternatives
// (normalisation × aggregation × scope) with index.Score and compares
// their rankings with the configured one. Combinations that cannot be
// built are skipped, each with the reason; those the user should know
// about (a scope the inputs cannot supply, a failed score) also become
// warnings.
func (r *Run) structural(res *SensitivityResult) error {
	cfg := r.Config
	ref := Scenario{Normalization: cfg.Normalization.Method, Aggregation: cfg.Aggregation.Method, Scope: cfg.Normalization.Scope}
	res.Scenarios = []Scenario{ref}
	scenarios := []sensitivity.Scenario{{Name: ref.Name(), Scores: r.Result.Composite}}
	specs := []index.Spec{r.Result.Spec}
	skip := func(sc Scenario, warn bool, format string, args ...any) {
		s := Skipped{sc, fmt.Sprintf(format, args...)}
		res.Skipped = append(res.Skipped, s)
		if warn {
			res.Warnings = append(res.Warnings, &index.Warning{Msg: "sensitivity: structural alternative " + s.String()})
		}
	}
	for _, norm := range cfg.SensitivityNormalizations() {
		for _, agg := range cfg.SensitivityAggregations() {
			for _, scope := range cfg.SensitivityScopes() {
				sc := Scenario{Normalization: norm, Aggregation: agg, Scope: scope}
				if sc == ref {
					continue
				}
				groups, why := r.scopeGroups(scope)
				if why != "" {
					skip(sc, true, "%s", why)
					continue
				}
				variant := *cfg
				variant.Normalization.Method, variant.Normalization.Scope = norm, scope
				variant.Aggregation.Method = agg
				spec := index.SpecFrom(&variant, r.Weights, groups)
				if agg == config.Geometric && !spec.Bounded() {
					skip(sc, false, "z-scores can be negative, so they cannot enter a geometric aggregation")
					continue
				}
				if agg == config.Geometric && !(spec.Floor > 0 && spec.Floor < 1) {
					skip(sc, false, "geometric aggregation needs aggregation.floor strictly between 0 and 1, got %g", spec.Floor)
					continue
				}
				if i := slices.IndexFunc(specs, func(s index.Spec) bool { return sameSpec(s, spec) }); i >= 0 {
					skip(sc, false, "the same index as %s (every indicator has a normalize of its own, or every station is in one group)", res.Scenarios[i].Name())
					continue
				}
				out, err := index.Score(r.Raw, spec)
				if err != nil {
					skip(sc, true, "%v", err)
					continue
				}
				res.Scenarios = append(res.Scenarios, sc)
				scenarios = append(scenarios, sensitivity.Scenario{Name: sc.Name(), Scores: out.Composite})
				specs = append(specs, spec)
			}
		}
	}
	if cfg.Sensitivity != nil && r.Events != nil {
		for _, floor := range cfg.Sensitivity.Severities {
			sc := ref
			sc.MinSeverity = floor
			if !r.Raw.SeverityKnown {
				skip(sc, true, "the events table has no severity column")
				continue
			}
			variant := *cfg
			variant.Indicators = slices.Clone(cfg.Indicators)
			for j := range variant.Indicators {
				in := &variant.Indicators[j]
				if in.Measure.FromEvents() && in.Measure != config.MemoryM && in.Measure != config.ResponseSlope {
					f := floor
					in.MinSeverity = &f
				}
			}
			raw, errs := index.Compute(r.Events, r.Attrs, &variant, r.Series)
			if len(errs) > 0 {
				skip(sc, true, "%v", errs[0])
				continue
			}
			out, err := index.Score(raw, r.Result.Spec)
			if err != nil {
				skip(sc, true, "%v", err)
				continue
			}
			res.Scenarios = append(res.Scenarios, sc)
			scenarios = append(scenarios, sensitivity.Scenario{Name: sc.Name(), Scores: out.Composite})
		}
	}
	if len(scenarios) < 2 {
		return nil
	}
	var err error
	res.Structural, err = sensitivity.Structural(scenarios)
	return err
}

// scopeGroups returns the normalisation groups of scope, or why the run
// cannot supply them.
func (r *Run) scopeGroups(scope config.Scope) (groups []string, why string) {
	switch scope {
	case config.ScopeGroup:
		if r.Attrs == nil || !r.Attrs.HasGroup {
			return nil, "scope \"group\" needs a group column in the attribute table"
		}
		return r.Raw.Groups, ""
	case config.ScopeCluster:
		if r.Clusters == nil {
			return nil, "scope \"cluster\" needs the clusters of a [clustering] section"
		}
		return r.Clusters.Groups(r.Raw.Stations), ""
	}
	return nil, ""
}

// sameSpec reports whether a and b build the same index.
func sameSpec(a, b index.Spec) bool {
	oneGroup := func(g []string) bool {
		return g == nil || !slices.ContainsFunc(g, func(x string) bool { return x != g[0] })
	}
	sameGroups := slices.Equal(a.Groups, b.Groups) || (oneGroup(a.Groups) && oneGroup(b.Groups))
	return slices.Equal(a.Methods, b.Methods) && a.Aggregation == b.Aggregation &&
		(a.Aggregation != config.Geometric || a.Floor == b.Floor) && sameGroups
}

// checkSobol warns when the Sobol indices of the ranking are too uncertain
// to rank the weights: an interval of a total index wider than 0.2.
func (r *Run) checkSobol(res *SensitivityResult) {
	s := res.Sobol
	o := res.RankShift()
	var wide []string
	for j, ind := range r.Raw.Indicators {
		i := o*s.Inputs + j
		if s.TotalHi[i]-s.TotalLo[i] > 0.2 {
			wide = append(wide, fmt.Sprintf("%s [%.2f, %.2f]", ind.Name, s.TotalLo[i], s.TotalHi[i]))
		}
	}
	if len(wide) > 0 {
		res.Warnings = append(res.Warnings, &index.Warning{Msg: fmt.Sprintf(
			"sensitivity: the %g%% intervals of the total Sobol indices of the rank shift are wide (%s); raise sensitivity.sobol.base_samples for firmer estimates",
			100*s.Level, strings.Join(wide, ", "))})
	}
}

// countHave is "1 station has", "0 stations have".
func countHave(n int, noun string) string {
	if n == 1 {
		return "1 " + noun + " has"
	}
	return fmt.Sprintf("%d %ss have", n, noun)
}

// countStations is "1 station", "2 stations".
func countStations(n int) string {
	if n == 1 {
		return "1 station"
	}
	return fmt.Sprintf("%d stations", n)
}
