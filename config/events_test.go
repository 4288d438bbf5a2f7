package config

import (
	"strings"
	"testing"
)

// eventsBase derives the events from series, so that [events] is in force.
const eventsBase = `
[inputs]
events = ""
series = ["series.csv"]
attributes = "a.csv"
[[indicator]]
name = "heat"
measure = "magnitude"
variables = ["water_temperature"]
weight = 1
`

func TestEventsDefaultsValidate(t *testing.T) {
	cfg, errs := Decode(eventsBase, "c.toml")
	if len(errs) == 0 {
		errs = cfg.Validate()
	}
	if len(errs) > 0 || cfg.Events == nil || !cfg.DeriveEvents() {
		t.Fatalf("errors %v, events %+v", errs, cfg.Events)
	}
}

func TestEventsErrors(t *testing.T) {
	tests := []struct {
		name  string
		extra string
		want  []string // substrings of the errors
	}{
		// events.Climate reads a half-width of 0 as its default of 5 days and
		// refuses more than 60: neither may pass the check.
		{"half window 0", "[events]\nhalf_window_days = 0\n",
			[]string{`c.toml:12:20: events.half_window_days: want days from 1 to 60, got 0`}},
		{"half window 61", "[events]\nhalf_window_days = 61\n",
			[]string{`events.half_window_days: want days from 1 to 60, got 61`}},
		{"smooth even", "[events]\nsmooth_days = 30\n",
			[]string{`c.toml:12:15: events.smooth_days: want an odd number of days from 1 to 365, got 30`}},
		{"smooth too long", "[events]\nsmooth_days = 367\n",
			[]string{`events.smooth_days: want an odd number of days from 1 to 365, got 367`}},
		{"negative reference years", "[events]\nreference_first_year = -2000\nreference_last_year = -1\n",
			[]string{`events.reference_first_year: want a year, or 0 for the first year of record, got -2000`,
				`events.reference_last_year: want a year, or 0 for the last year of record, got -1`}},
		{"reference years reversed", "[events]\nreference_first_year = 2010\nreference_last_year = 2000\n",
			[]string{`events.reference_last_year: 2000 is before reference_first_year 2010`}},
		{"min years", "[events]\nmin_years = 0\n", []string{`events.min_years: want >= 1, got 0`}},
		{"percentile", "[events.heatwave]\npercentile = 100\n",
			[]string{`events.heatwave.percentile: want a percentile strictly between 0 and 100, got 100`}},
		{"drought", "[events.drought]\nthreshold = \"dialy\"\nmin_days = 0\npool_days = -1\nmin_deficit_fraction = 1\n",
			[]string{`events.drought.threshold`, `events.drought.min_days: want >= 1, got 0`,
				`events.drought.pool_days: want >= 0, got -1`, `events.drought.min_deficit_fraction: want a fraction in [0, 1), got 1`}},
		{"flood", "[events.flood]\nseparation_days = 0\ntrough = 0\n",
			[]string{`events.flood.separation_days: want >= 1, got 0`, `events.flood.trough: want a fraction in (0, 1], got 0`}},
		{"recovery", "[events.recovery]\nlag_days = -1\nrun_days = 0\ntolerance_sd = 0\nmax_gap_days = -1\n",
			[]string{`events.recovery.lag_days: want >= 0, got -1`, `events.recovery.run_days: want >= 1, got 0`,
				`events.recovery.tolerance_sd: want > 0, got 0`, `events.recovery.max_gap_days: want >= 0, got -1`}},
		{"dryness", "[events.dryness]\ndays = 0\nmin_coverage = 1.5\n",
			[]string{`events.dryness.days: want >= 1, got 0`, `events.dryness.min_coverage: want a fraction in (0, 1], got 1.5`}},
		{"season", "[events.heatwave]\nmonths = [6, 7, 13, 7]\n",
			[]string{`c.toml:12:10: events.heatwave.months: element 3: want a month 1-12, got 13`, `events.heatwave.months: element 4: month 7 is listed twice`}},
		{"severity limits", "[events.flood]\nseverity_return_periods = [10.0, 2.0, 50.0]\nfit_min_years = 3\n[events.drought]\nseverity_probabilities = [0.5, 0.8]\npool_volume_ratio = -1\n",
			[]string{`events.flood.severity_return_periods: want three increasing return periods in years, above 1 (the limits of strong, severe and extreme), got [10 2 50]`,
				`events.flood.fit_min_years: want at least 5 annual maxima for a GEV fit by L-moments, got 3`,
				`events.drought.severity_probabilities: want three increasing probabilities strictly between 0 and 1 (the limits of strong, severe and extreme), got [0.5 0.8]`,
				`events.drought.pool_volume_ratio: want a ratio >= 0 (0 = time criterion only), got -1`}},
		{"censoring", "[events.recovery]\ncensor_by = \"same-kind\"\ncensor_min_severity = 5\n",
			[]string{`events.recovery.censor_by: want one of "same_kind_or_severe", "any", "same_kind", "severe", got "same-kind" (did you mean "same_kind"?)`,
				`events.recovery.censor_min_severity: want a severity class 1-4 (moderate, strong, severe, extreme), got 5`}},
		{"indicator severity", "[[indicator]]\nname = \"slope\"\nmeasure = \"response_slope\"\nvariables = [\"water_temperature\"]\nmin_severity = 0\nevent_weights = \"class\"\nweight = 1\n",
			[]string{`indicator[2].kinds: measure "response_slope" divides by the driver's intensity`,
				`indicator[2].min_severity: want a severity class 1-4 (1 moderate = every event, 2 strong, 3 severe, 4 extreme), got 0`,
				`indicator[2].event_weights: want one of "none", "severity", got "class"`}},
		{"dryness scale", "[events.dryness]\nmeasure = \"index\"\n",
			[]string{`memory.dryness: the derived antecedent dryness is "index"`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			cfg, errs := Decode(eventsBase+tc.extra, "c.toml")
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
