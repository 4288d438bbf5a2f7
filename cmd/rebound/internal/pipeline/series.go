package pipeline

import (
	"errors"
	"fmt"
	"math"
	"os"
	"sync"

	"rebound/config"
	"rebound/index"
	"rebound/index/calendar"
	"rebound/index/criteria"
	"rebound/index/events"
	"rebound/index/series"
)

// StationSeries is what one pass over the daily records keeps of a
// station: never the records themselves, only what the outputs need.
type StationSeries struct {
	ID         string
	Start, End calendar.Date
	Counts     map[string]*series.Counts
	// Rows are the derived events (when events are derived).
	Rows []events.Row
	// Criteria is the performance against each [[criterion]], with the
	// weekly series dropped.
	Criteria *criteria.Result
	// Features are the clustering features (when clustering runs), in the
	// order of the extractor's names; FeatureReason says why the station
	// was left out when Features is nil.
	Features      []float64
	FeatureReason string
	// Focus is the daily record around the station's most harmful event,
	// for the memo's chart; nil when there is none.
	Focus    *Focus
	Warnings []error
}

// Focus is a window of one variable's daily record around one event.
type Focus struct {
	Station, EventID, Kind, Variable string
	Harmful                          float64 // +1 or −1
	Start, End                       calendar.Date
	Recovered                        bool
	RecoveryDays                     int
	PeakDeparture                    float64
	Tolerance                        float64
	First                            calendar.Date // date of Observed[0]
	Observed, Normal                 []float64
}

// SeriesSummary describes the pass over the daily records.
type SeriesSummary struct {
	Files    []string
	Rows     int
	Stations int
	Skipped  map[string]int // rows of variables not configured, by name
	Vars     map[string]*series.Counts
	// Unknown lists stations of the series missing from the attribute
	// table (skipped).
	Unknown []string
}

// seriesOptions maps the configuration onto the series reader's options.
func seriesOptions(cfg *config.Config, maxErrors int) series.Options {
	o := series.Options{Exclude: cfg.Inputs.ExcludeQualifiers, MaxErrors: maxErrors}
	for _, v := range cfg.Variables {
		sv := series.Var{Name: v.Name, Units: v.Units}
		if len(v.Range) == 2 {
			sv.Range = series.Range{Min: v.Range[0], Max: v.Range[1]}
		}
		o.Vars = append(o.Vars, sv)
	}
	return o
}

// eventOptions maps the configuration onto the event analysis options.
func eventOptions(cfg *config.Config) events.Options {
	e := cfg.Events
	o := events.DefaultOptions()
	o.Climate = events.Climate{FirstYear: e.ReferenceFirstYear, LastYear: e.ReferenceLastYear,
		MinYears: e.MinYears, HalfWidth: e.HalfWindow, Smooth: e.SmoothDays}
	o.Heat = events.HeatRule{Off: !e.Heatwave.Enabled, Variable: e.Heatwave.Variable, Percentile: e.Heatwave.Percentile,
		MinDuration: e.Heatwave.MinDays, MaxGap: e.Heatwave.MaxGapDays, Months: e.Heatwave.Months}
	o.Drought = events.DroughtRule{Off: !e.Drought.Enabled, Variable: e.Drought.Variable, Percentile: e.Drought.Percentile,
		Threshold: events.Threshold(e.Drought.Threshold), MinDuration: e.Drought.MinDays, Pool: e.Drought.PoolDays,
		PoolRatio: e.Drought.PoolVolumeRatio, MinDeficitFraction: e.Drought.MinDeficitFraction, Months: e.Drought.Months}
	o.Flood = events.FloodRule{Off: !e.Flood.Enabled, Variable: e.Flood.Variable, Percentile: e.Flood.Percentile,
		Separation: e.Flood.SeparationDays, Trough: e.Flood.Trough, Months: e.Flood.Months}
	o.Recovery = events.Recovery{Lag: e.Recovery.LagDays, Run: e.Recovery.RunDays, ToleranceSD: e.Recovery.ToleranceSD,
		MaxGap: e.Recovery.MaxGapDays, CensorBy: events.CensorRule(e.Recovery.CensorBy), CensorMinSeverity: e.Recovery.CensorMinSeverity}
	o.Antecedent = events.Antecedent{Measure: events.Dryness(e.Dryness.Measure), Days: e.Dryness.Days, MinCoverage: e.Dryness.MinCoverage}
	o.Severity = events.Severity{FitMinYears: e.Flood.FitMinYears, YearCoverage: e.Flood.FitYearCoverage, WaterYear: e.WaterYear}
	copy(o.Severity.ReturnPeriods[:], e.Flood.SeverityReturnPeriods)
	copy(o.Severity.Probabilities[:], e.Drought.SeverityProbabilities)
	o.Responses = nil
	for _, v := range cfg.Variables {
		if v.Harmful != "" {
			o.Responses = append(o.Responses, events.Variable{Name: v.Name, Harmful: int(v.Harmful.Sign()), Tolerance: v.Tolerance,
				Driver: v.DriverOf()})
		}
	}
	return o
}

func criteriaOptions(cfg *config.Config) criteria.Options {
	o := criteria.DefaultOptions()
	for _, c := range cfg.Criteria {
		o.Criteria = append(o.Criteria, criteria.Criterion{Name: c.Name, Limit: c.Limit})
	}
	return o
}

// needsSeries reports whether the run reads the daily records.
func (r *Run) needsSeries() bool {
	cfg := r.Config
	if !cfg.HasSeries() {
		return false
	}
	if cfg.Clustering != nil {
		return true
	}
	return !r.onlyClusters && (cfg.DeriveEvents() || len(cfg.Criteria) > 0)
}

// passSeries reads every series file once, station by station, and keeps
// for each station what the run needs. It fills r.Stations, r.SeriesSummary
// and, when events are derived, r.Events.
func (r *Run) passSeries(maxErrors int) []error {
	cfg := r.Config
	known := map[string]bool{}
	for _, s := range r.Attrs.Stations {
		known[s.ID] = true
	}
	derive := cfg.DeriveEvents() && !r.onlyClusters
	var evOpt events.Options
	var users []events.UserEvent
	if derive {
		evOpt = eventOptions(cfg)
		if err := evOpt.Validate(); err != nil {
			return []error{&config.Error{File: cfg.File, Key: "events", Msg: err.Error()}}
		}
		if cfg.Inputs.UserEvents != "" {
			path := cfg.Path(cfg.Inputs.UserEvents)
			f, err := os.Open(path)
			if err != nil {
				return keyed(cfg, "inputs.user_events", []error{err})
			}
			users, err = events.ReadUserEvents(f, path)
			f.Close()
			if err != nil {
				return []error{err}
			}
			in, err := digest("user events", path)
			if err != nil {
				return []error{err}
			}
			in.Rows = len(users)
			r.Inputs = append(r.Inputs, in)
		}
	}
	crOpt := criteriaOptions(cfg)
	if r.onlyClusters {
		crOpt.Criteria = nil
	}
	extract := r.featureExtractor()
	analyzers := sync.Pool{New: func() any { return new(events.Analyzer) }}

	work := func(st *series.Station) (*StationSeries, error) {
		out := &StationSeries{ID: st.ID, Start: st.Start, End: st.End(), Counts: st.Counts}
		if !known[st.ID] {
			return out, nil
		}
		st.FillGaps(cfg.Inputs.FillGapDays)
		if derive {
			a := analyzers.Get().(*events.Analyzer)
			res, err := a.Analyze(st, users, evOpt)
			analyzers.Put(a)
			if err != nil {
				return nil, err
			}
			out.Rows = res.Rows(nil)
			out.Warnings = append(out.Warnings, res.Warnings...)
			out.Focus = focus(st, res, evOpt)
		}
		if len(crOpt.Criteria) > 0 {
			cr, err := criteria.Evaluate(st, crOpt)
			if err != nil && !errors.Is(err, criteria.ErrNoTemperature) {
				return nil, err
			}
			if err == nil {
				cr.Weekly = nil
				out.Criteria = &cr
				out.Warnings = append(out.Warnings, cr.Warnings...)
			}
		}
		if extract != nil {
			out.Features, out.FeatureReason = extract(st)
		}
		return out, nil
	}

	sum := &SeriesSummary{Skipped: map[string]int{}, Vars: map[string]*series.Counts{}}
	seen := map[string]bool{}
	var errs []error
	emit := func(s *StationSeries) error {
		if !known[s.ID] {
			sum.Unknown = append(sum.Unknown, s.ID)
			return nil
		}
		if seen[s.ID] {
			return fmt.Errorf("station %s appears in more than one series file; keep each station's records in one long file (or use the wide layout)", s.ID)
		}
		seen[s.ID] = true
		r.Stations = append(r.Stations, s)
		if r.progress != nil {
			r.progress(len(r.Stations))
		}
		return nil
	}
	addFile := func(name string, s series.Summary) {
		sum.Files = append(sum.Files, name)
		sum.Rows += s.Rows
		for k, n := range s.Skipped {
			sum.Skipped[k] += n
		}
	}
	addCounts := func(vars map[string]*series.Counts) {
		for k, c := range vars {
			if sum.Vars[k] == nil {
				sum.Vars[k] = &series.Counts{}
			}
			sum.Vars[k].Add(c)
		}
	}
	opt := seriesOptions(cfg, maxErrors)
	for k, p := range cfg.Inputs.Series {
		path := cfg.Path(p)
		f, err := os.Open(path)
		if err != nil {
			errs = append(errs, keyed(cfg, fmt.Sprintf("inputs.series[%d]", k+1), []error{err})...)
			continue
		}
		s, err := series.Map(f, path, opt, 0, work, emit)
		f.Close()
		if err != nil {
			errs = append(errs, splitJoined(err)...)
			continue
		}
		in, err := digest("series", path)
		if err != nil {
			errs = append(errs, err)
		}
		in.Rows = s.Rows
		in.Rejected = s.BadRows
		r.Inputs = append(r.Inputs, in)
		addFile(path, s)
		sum.Stations += s.Stations
		addCounts(s.Vars) // taken after work, so filled days are counted
	}
	if len(cfg.Inputs.Wide) > 0 {
		merged := map[string]*series.Station{}
		var order []string
		for k, w := range cfg.Inputs.Wide {
			path := cfg.Path(w.Path)
			v, _ := cfg.Variable(w.Variable)
			f, err := os.Open(path)
			if err != nil {
				errs = append(errs, keyed(cfg, fmt.Sprintf("inputs.wide[%d].path", k+1), []error{err})...)
				continue
			}
			sv := series.Var{Name: v.Name, Units: v.Units}
			if len(v.Range) == 2 {
				sv.Range = series.Range{Min: v.Range[0], Max: v.Range[1]}
			}
			stations, s, err := series.ReadWide(f, path, sv, opt)
			f.Close()
			if err != nil {
				errs = append(errs, splitJoined(err)...)
				continue
			}
			in, err := digest("series ("+w.Variable+")", path)
			if err != nil {
				errs = append(errs, err)
			}
			in.Rows = s.Rows
			r.Inputs = append(r.Inputs, in)
			addFile(path, s)
			for _, st := range stations {
				if m, ok := merged[st.ID]; ok {
					if _, err := series.Merge(m, st); err != nil {
						errs = append(errs, fmt.Errorf("%s: station %s: %w", path, st.ID, err))
					}
					continue
				}
				merged[st.ID] = st
				order = append(order, st.ID)
			}
		}
		list := make([]*series.Station, len(order))
		for i, id := range order {
			list[i] = merged[id]
		}
		if len(errs) == 0 {
			if err := series.MapStations(list, 0, work, emit); err != nil {
				errs = append(errs, err)
			}
		}
		// A station of several wide files is one station, and its counts
		// are taken after work has filled its gaps, as for long files.
		sum.Stations += len(list)
		for _, st := range list {
			addCounts(st.Counts)
		}
	}
	if len(errs) > 0 {
		return errs
	}
	r.SeriesSummary = sum
	for _, id := range sum.Unknown {
		r.Warnings = append(r.Warnings, &index.Warning{Station: id, Msg: "in the series but not in the attribute table; skipped"})
	}
	for _, s := range r.Stations {
		// The analyses name the station in their warnings already.
		r.Warnings = append(r.Warnings, s.Warnings...)
	}
	r.Series = r.seriesIndicators()
	for _, st := range r.Attrs.Stations {
		if _, ok := r.Series.Missing[st.ID]; ok {
			r.Warnings = append(r.Warnings, &index.Warning{Station: st.ID, Msg: "no daily series in the inputs; indicators from events and criteria are missing"})
		}
	}
	if derive {
		r.Events = derivedTable(r.Stations)
	}
	return nil
}

// splitJoined undoes errors.Join, so that every problem gets its own line.
func splitJoined(err error) []error {
	if j, ok := err.(interface{ Unwrap() []error }); ok {
		return j.Unwrap()
	}
	return []error{err}
}

// DerivedFile names the events table derived from series in messages.
const DerivedFile = "events derived from series"

func derivedTable(stations []*StationSeries) *index.EventTable {
	t := &index.EventTable{File: DerivedFile, Has: map[string]bool{}}
	for _, c := range index.OptionalEventColumns {
		t.Has[c] = true
	}
	for _, s := range stations {
		for _, row := range s.Rows {
			t.Events = append(t.Events, index.Event{
				Station: row.Station, ID: row.EventID, Kind: row.Kind, Variable: row.Variable,
				Start: row.Start, End: row.End, PeakDeparture: row.PeakDeparture,
				RecoveryDays: float64(row.RecoveryDays), Recovered: row.Recovered, Dryness: row.AntecedentDryness,
				Severity: row.Severity, DriverIntensity: row.DriverIntensity, Censor: string(row.Censor),
			})
		}
	}
	return t
}

// seriesIndicators collects what criterion indicators need.
func (r *Run) seriesIndicators() *index.Series {
	ser := &index.Series{Criteria: map[string]map[string]index.CriterionStats{}, Missing: map[string]string{}}
	have := map[string]*StationSeries{}
	for _, s := range r.Stations {
		have[s.ID] = s
	}
	for _, st := range r.Attrs.Stations {
		s, ok := have[st.ID]
		if !ok {
			ser.Missing[st.ID] = "no daily series"
			continue
		}
		if s.Criteria == nil {
			continue
		}
		years := float64(s.End-s.Start+1) / 365.25
		m := map[string]index.CriterionStats{}
		for _, p := range s.Criteria.Criteria {
			cs := index.CriterionStats{Reliability: p.Reliability, Resilience: p.Resilience,
				Vulnerability: p.Vulnerability, DaysAbove: float64(p.DaysAbove) / years}
			if p.DaysAbove == 0 && p.Days > 0 {
				// Never above the criterion: nothing to recover from and no
				// excess, the best possible resilience and vulnerability.
				cs.Resilience, cs.Vulnerability = 1, 0
			}
			if p.Days == 0 {
				cs.Note = "no complete 7-day window"
			}
			m[p.Name] = cs
		}
		ser.Criteria[st.ID] = m
	}
	return ser
}

// focus keeps a window of the record around the station's most harmful
// event, for the memo's chart: the heat wave or drought with the largest
// harmful peak departure, relative to its recovery band, of the first
// response variable the station records (water temperature in the usual
// configuration); any event and variable when there is none.
func focus(st *series.Station, res events.Result, o events.Options) *Focus {
	if f := pickFocus(st, res, o, true); f != nil {
		return f
	}
	return pickFocus(st, res, o, false)
}

func pickFocus(st *series.Station, res events.Result, o events.Options, strict bool) *Focus {
	primary := ""
	for _, v := range o.Responses {
		if st.Var(v.Name) != nil {
			primary = v.Name
			break
		}
	}
	best, bestScore := -1, math.Inf(-1)
	var bestResp events.Response
	var harmful float64
	for k, e := range res.Events {
		if strict && e.Kind != events.HeatWaveKind && e.Kind != events.DroughtKind {
			continue
		}
		for _, rsp := range e.Responses {
			if strict && rsp.Variable != primary {
				continue
			}
			h := 1.0
			for _, v := range o.Responses {
				if v.Name == rsp.Variable {
					h = float64(v.Harmful)
				}
			}
			if math.IsNaN(rsp.PeakDeparture) || !(rsp.Tolerance > 0) {
				continue
			}
			if score := h * rsp.PeakDeparture / rsp.Tolerance; score > bestScore {
				best, bestScore, bestResp, harmful = k, score, rsp, h
			}
		}
	}
	if best < 0 {
		return nil
	}
	e := res.Events[best]
	x := st.Var(bestResp.Variable)
	clim, err := o.Climate.Compute(x, st.Start)
	if err != nil {
		return nil
	}
	first := max(st.Start, e.Start-30)
	last := min(st.End(), e.End+calendar.Date(bestResp.RecoveryDays)+30)
	if last-first > 365 {
		last = first + 365
	}
	f := &Focus{Station: st.ID, EventID: e.ID, Kind: e.Kind, Variable: bestResp.Variable, Harmful: harmful,
		Start: e.Start, End: e.End, Recovered: bestResp.Recovered, RecoveryDays: bestResp.RecoveryDays,
		PeakDeparture: bestResp.PeakDeparture, Tolerance: bestResp.Tolerance, First: first}
	for d := first; d <= last; d++ {
		f.Observed = append(f.Observed, x[st.Index(d)])
		f.Normal = append(f.Normal, clim.At(d))
	}
	return f
}
