package config

import (
	"fmt"
	"math"
	"strings"

	"rebound/index/series"
)

// Events configures how events are derived from daily series. Every field
// has a default (DefaultEvents); the template documents each.
type Events struct {
	// Reference period for the day-of-year normals, in calendar years; 0
	// means the first (last) year of the record.
	ReferenceFirstYear int `toml:"reference_first_year"`
	ReferenceLastYear  int `toml:"reference_last_year"`
	// MinYears is the fewest reference years with data a normal needs.
	MinYears int `toml:"min_years"`
	// HalfWindow is w: values within ±w days of each calendar day are
	// pooled (an 11-day window for w = 5).
	HalfWindow int `toml:"half_window_days"`
	// SmoothDays is the width of the moving average that smooths the
	// normals (odd; 1 = none).
	SmoothDays int `toml:"smooth_days"`

	Heatwave HeatwaveRule `toml:"heatwave"`
	Drought  DroughtRule  `toml:"drought"`
	Flood    FloodRule    `toml:"flood"`
	Recovery RecoveryRule `toml:"recovery"`
	Dryness  DrynessRule  `toml:"dryness"`
	// WaterYear counts coverage by October–September water years.
	WaterYear bool `toml:"water_year"`
}

// HeatwaveRule configures heat-wave detection on air temperature.
type HeatwaveRule struct {
	Enabled    bool    `toml:"enabled"`
	Variable   string  `toml:"variable"`
	Percentile float64 `toml:"percentile"`
	MinDays    int     `toml:"min_days"`
	MaxGapDays int     `toml:"max_gap_days"`
	// Months is the season: heat waves whose hottest day falls in another
	// month are not reported. Empty means every month.
	Months []int `toml:"months"`
}

// DroughtRule configures drought detection on discharge (threshold level
// method).
type DroughtRule struct {
	Enabled            bool    `toml:"enabled"`
	Variable           string  `toml:"variable"`
	Percentile         float64 `toml:"percentile"`
	Threshold          string  `toml:"threshold"`
	MinDays            int     `toml:"min_days"`
	PoolDays           int     `toml:"pool_days"`
	PoolVolumeRatio    float64 `toml:"pool_volume_ratio"`
	MinDeficitFraction float64 `toml:"min_deficit_fraction"`
	Months             []int   `toml:"months"`
	// SeverityProbabilities are the non-exceedance probabilities of deficit
	// or duration that separate moderate, strong, severe and extreme.
	SeverityProbabilities []float64 `toml:"severity_probabilities"`
}

// FloodRule configures flood detection on discharge.
type FloodRule struct {
	Enabled        bool    `toml:"enabled"`
	Variable       string  `toml:"variable"`
	Percentile     float64 `toml:"percentile"`
	SeparationDays int     `toml:"separation_days"`
	Trough         float64 `toml:"trough"`
	Months         []int   `toml:"months"`
	// SeverityReturnPeriods are the return periods in years that separate
	// moderate, strong, severe and extreme floods.
	SeverityReturnPeriods []float64 `toml:"severity_return_periods"`
	// FitMinYears is the fewest annual maxima the GEV fit takes, and
	// FitYearCoverage the share of a year's days with a flow for its
	// maximum to count.
	FitMinYears     int     `toml:"fit_min_years"`
	FitYearCoverage float64 `toml:"fit_year_coverage"`
}

// RecoveryRule configures the response window and the recovery rule.
type RecoveryRule struct {
	LagDays     int     `toml:"lag_days"`
	RunDays     int     `toml:"run_days"`
	ToleranceSD float64 `toml:"tolerance_sd"`
	MaxGapDays  int     `toml:"max_gap_days"`
	// CensorBy says which next event censors a recovery: "any",
	// "same_kind", "severe" or "same_kind_or_severe"; CensorMinSeverity is
	// the class (1-4) that counts as severe.
	CensorBy          string `toml:"censor_by"`
	CensorMinSeverity int    `toml:"censor_min_severity"`
}

// DrynessRule configures antecedent dryness.
type DrynessRule struct {
	Measure     DrynessScale `toml:"measure"`
	Days        int          `toml:"days"`
	MinCoverage float64      `toml:"min_coverage"`
}

// Criterion is a numeric water-temperature criterion for the 7-day
// statistic (7DADM, or the 7-day mean of daily means where no daily maxima
// exist). Criteria are the user's: local standards differ.
type Criterion struct {
	Name  string  `toml:"name"`
	Limit float64 `toml:"limit"`
}

// DefaultEvents returns the event-derivation defaults.
func DefaultEvents() *Events {
	return &Events{
		MinYears: 5, HalfWindow: 5, SmoothDays: 31,
		Heatwave: HeatwaveRule{Enabled: true, Variable: "air_temperature", Percentile: 90, MinDays: 3, MaxGapDays: 2,
			Months: []int{6, 7, 8, 9}},
		Drought: DroughtRule{Enabled: true, Variable: "discharge", Percentile: 20, Threshold: "daily", MinDays: 5, PoolDays: 5,
			PoolVolumeRatio: 0.1, MinDeficitFraction: 0.005, SeverityProbabilities: []float64{0.5, 0.8, 0.95}},
		Flood: FloodRule{Enabled: true, Variable: "discharge", Percentile: 95, SeparationDays: 7, Trough: 0.75,
			SeverityReturnPeriods: []float64{2, 10, 50}, FitMinYears: 10, FitYearCoverage: 0.9},
		Recovery: RecoveryRule{LagDays: 14, RunDays: 7, ToleranceSD: 1, MaxGapDays: 3,
			CensorBy: "same_kind_or_severe", CensorMinSeverity: 2},
		Dryness: DrynessRule{Measure: Fraction, Days: 365, MinCoverage: 0.8},
	}
}

// CensorRules are the values of events.recovery.censor_by, the default
// first.
var CensorRules = []string{"same_kind_or_severe", "any", "same_kind", "severe"}

// DriverOf returns the event kind that drives variable v: its driver key,
// or for the three water-quality variables the configuration knows,
// heatwave for water temperature and dissolved oxygen and drought for
// specific conductance; "" for none.
func (v Variable) DriverOf() string {
	switch v.Driver {
	case "none":
		return ""
	case "":
		switch v.Name {
		case "water_temperature", "dissolved_oxygen":
			return "heatwave"
		case "specific_conductance":
			return "drought"
		}
		return ""
	}
	return v.Driver
}

// DeriveEvents reports whether events come from daily series rather than an
// events table.
func (c *Config) DeriveEvents() bool { return c.Inputs.Events == "" && c.HasSeries() }

// HasSeries reports whether the configuration names daily series.
func (c *Config) HasSeries() bool { return len(c.Inputs.Series) > 0 || len(c.Inputs.Wide) > 0 }

func (c *Config) validateEvents(bad reportFunc) {
	if c.Inputs.FillGapDays < 0 {
		bad("inputs.fill_gap_days", "want days >= 0, got %d", c.Inputs.FillGapDays)
	}
	for i, w := range c.Inputs.Wide {
		key := fmt.Sprintf("inputs.wide[%d]", i+1)
		if w.Path == "" {
			bad(key+".path", "missing")
		}
		if _, ok := c.Variable(w.Variable); !ok {
			bad(key+".variable", "variable %q is not defined in a [[variable]] table", w.Variable)
		}
	}
	for i, v := range c.Variables {
		if len(v.Range) != 0 && (len(v.Range) != 2 || !(v.Range[0] < v.Range[1])) {
			bad(fmt.Sprintf("variable[%d].range", i+1), "want [low, high] with low < high, got %v", v.Range)
		}
		if v.Tolerance < 0 {
			bad(fmt.Sprintf("variable[%d].tolerance", i+1), "want >= 0, got %g", v.Tolerance)
		}
	}
	names := map[string]bool{}
	for i, cr := range c.Criteria {
		key := fmt.Sprintf("criterion[%d]", i+1)
		if cr.Name == "" {
			bad(key+".name", "missing")
		}
		if names[cr.Name] {
			bad(key+".name", "criterion %q is defined twice", cr.Name)
		}
		names[cr.Name] = true
	}
	for i, in := range c.Indicators {
		if in.Measure != CriterionM {
			continue
		}
		key := fmt.Sprintf("indicator[%d]", i+1)
		if !names[in.Criterion] {
			bad(key+".criterion", "no [[criterion]] is named %q", in.Criterion)
		}
		if in.Statistic == "" {
			bad(key+".statistic", "missing: want one of %s", quoteList(strs(Statistics)))
		}
		if !c.HasSeries() {
			bad(key+".measure", "criterion indicators need daily series (inputs.series or inputs.wide)")
		}
	}
	e := c.Events
	if e == nil {
		return
	}
	if e.MinYears < 1 {
		bad("events.min_years", "want >= 1, got %d", e.MinYears)
	}
	// The ranges of events.Climate, which takes a half-width of 0 for its
	// default of 5 days.
	if e.HalfWindow < 1 || e.HalfWindow > 60 {
		bad("events.half_window_days", "want days from 1 to 60, got %d", e.HalfWindow)
	}
	if e.SmoothDays < 1 || e.SmoothDays > 365 || e.SmoothDays%2 == 0 {
		bad("events.smooth_days", "want an odd number of days from 1 to 365, got %d", e.SmoothDays)
	}
	if e.ReferenceFirstYear < 0 {
		bad("events.reference_first_year", "want a year, or 0 for the first year of record, got %d", e.ReferenceFirstYear)
	}
	if e.ReferenceLastYear < 0 {
		bad("events.reference_last_year", "want a year, or 0 for the last year of record, got %d", e.ReferenceLastYear)
	}
	if e.ReferenceFirstYear > 0 && e.ReferenceLastYear > 0 && e.ReferenceLastYear < e.ReferenceFirstYear {
		bad("events.reference_last_year", "%d is before reference_first_year %d", e.ReferenceLastYear, e.ReferenceFirstYear)
	}
	pct := func(key string, p float64) {
		if !(p > 0 && p < 100) {
			bad(key, "want a percentile strictly between 0 and 100, got %g", p)
		}
	}
	pct("events.heatwave.percentile", e.Heatwave.Percentile)
	pct("events.drought.percentile", e.Drought.Percentile)
	pct("events.flood.percentile", e.Flood.Percentile)
	if e.Heatwave.MinDays < 1 {
		bad("events.heatwave.min_days", "want >= 1, got %d", e.Heatwave.MinDays)
	}
	if e.Heatwave.MaxGapDays < 0 {
		bad("events.heatwave.max_gap_days", "want >= 0, got %d", e.Heatwave.MaxGapDays)
	}
	if msg := choiceMsg(e.Drought.Threshold, []string{"fixed", "daily"}); msg != "" {
		bad("events.drought.threshold", "%s", msg)
	}
	if e.Drought.MinDays < 1 {
		bad("events.drought.min_days", "want >= 1, got %d", e.Drought.MinDays)
	}
	if e.Drought.PoolDays < 0 {
		bad("events.drought.pool_days", "want >= 0, got %d", e.Drought.PoolDays)
	}
	if e.Drought.MinDeficitFraction < 0 || e.Drought.MinDeficitFraction >= 1 {
		bad("events.drought.min_deficit_fraction", "want a fraction in [0, 1), got %g", e.Drought.MinDeficitFraction)
	}
	if e.Flood.SeparationDays < 1 {
		bad("events.flood.separation_days", "want >= 1, got %d", e.Flood.SeparationDays)
	}
	if !(e.Flood.Trough > 0 && e.Flood.Trough <= 1) {
		bad("events.flood.trough", "want a fraction in (0, 1], got %g", e.Flood.Trough)
	}
	if e.Recovery.LagDays < 0 {
		bad("events.recovery.lag_days", "want >= 0, got %d", e.Recovery.LagDays)
	}
	if e.Recovery.RunDays < 1 {
		bad("events.recovery.run_days", "want >= 1, got %d", e.Recovery.RunDays)
	}
	if !(e.Recovery.ToleranceSD > 0) {
		bad("events.recovery.tolerance_sd", "want > 0, got %g", e.Recovery.ToleranceSD)
	}
	if e.Recovery.MaxGapDays < 0 {
		bad("events.recovery.max_gap_days", "want >= 0, got %d", e.Recovery.MaxGapDays)
	}
	if msg := choiceMsg(string(e.Dryness.Measure), []string{string(Fraction), string(Index)}); msg != "" {
		bad("events.dryness.measure", "%s", msg)
	}
	if e.Dryness.Days < 1 {
		bad("events.dryness.days", "want >= 1, got %d", e.Dryness.Days)
	}
	if !(e.Dryness.MinCoverage > 0 && e.Dryness.MinCoverage <= 1) {
		bad("events.dryness.min_coverage", "want a fraction in (0, 1], got %g", e.Dryness.MinCoverage)
	}
	months := func(key string, ms []int) {
		seen := map[int]bool{}
		for i, m := range ms {
			switch {
			case m < 1 || m > 12:
				bad(key, "element %d: want a month 1-12, got %d", i+1, m)
			case seen[m]:
				bad(key, "element %d: month %d is listed twice", i+1, m)
			}
			seen[m] = true
		}
	}
	months("events.heatwave.months", e.Heatwave.Months)
	months("events.drought.months", e.Drought.Months)
	months("events.flood.months", e.Flood.Months)
	if !(e.Drought.PoolVolumeRatio >= 0) || math.IsInf(e.Drought.PoolVolumeRatio, 0) {
		bad("events.drought.pool_volume_ratio", "want a ratio >= 0 (0 = time criterion only), got %g", e.Drought.PoolVolumeRatio)
	}
	if p := e.Drought.SeverityProbabilities; len(p) != 3 || !(p[0] > 0 && p[1] > p[0] && p[2] > p[1] && p[2] < 1) {
		bad("events.drought.severity_probabilities", "want three increasing probabilities strictly between 0 and 1 (the limits of strong, severe and extreme), got %v", p)
	}
	if r := e.Flood.SeverityReturnPeriods; len(r) != 3 || !(r[0] > 1 && r[1] > r[0] && r[2] > r[1]) || math.IsInf(r[2], 0) {
		bad("events.flood.severity_return_periods", "want three increasing return periods in years, above 1 (the limits of strong, severe and extreme), got %v", r)
	}
	if e.Flood.FitMinYears < 5 {
		bad("events.flood.fit_min_years", "want at least 5 annual maxima for a GEV fit by L-moments, got %d", e.Flood.FitMinYears)
	}
	if !(e.Flood.FitYearCoverage > 0 && e.Flood.FitYearCoverage <= 1) {
		bad("events.flood.fit_year_coverage", "want a fraction in (0, 1], got %g", e.Flood.FitYearCoverage)
	}
	if msg := choiceMsg(e.Recovery.CensorBy, CensorRules); msg != "" {
		bad("events.recovery.censor_by", "%s", msg)
	}
	if e.Recovery.CensorMinSeverity < 1 || e.Recovery.CensorMinSeverity > 4 {
		bad("events.recovery.censor_min_severity", "want a severity class 1-4 (moderate, strong, severe, extreme), got %d", e.Recovery.CensorMinSeverity)
	}
	for i, v := range c.Variables {
		if v.Driver == "" || v.Driver == "none" {
			continue
		}
		if msg := choiceMsg(v.Driver, []string{"heatwave", "drought", "flood", "none"}); msg != "" {
			bad(fmt.Sprintf("variable[%d].driver", i+1), "%s", msg)
		}
	}
	if c.DeriveEvents() && e.Dryness.Measure != c.Memory.Dryness {
		bad("memory.dryness", "the derived antecedent dryness is %q (events.dryness.measure); set memory.dryness to match", e.Dryness.Measure)
	}
}

// CanonicalUnits returns the units of the variable's values after reading:
// °C for any temperature unit, m³/s for any discharge unit, µS/cm for
// "uS/cm", and the configured units otherwise. Outputs label values with
// these.
func (v Variable) CanonicalUnits() string {
	u := series.LookupUnit(v.Units).Canonical()
	switch strings.ToLower(u) {
	case "us/cm", "µs/cm":
		return "µS/cm"
	case "us/cm@25c", "µs/cm@25c":
		return "µS/cm at 25 °C"
	}
	return u
}
