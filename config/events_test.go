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
