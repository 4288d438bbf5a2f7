package index

import (
	"cmp"
	"fmt"
	"hash/maphash"
	"math"
	"slices"
	"strconv"
	"strings"

	"rebound/attributes"
	"rebound/attributes/tabular"
	"rebound/config"
	"rebound/index/robust"
	"rebound/index/survival"
)

// Raw holds the raw indicator values of every station, before
// normalisation.
type Raw struct {
	// Stations are the station identifiers, in attribute-table order;
	// Names and Groups are their names and peer groups.
	Stations []string
	Names    []string
	Groups   []string
	// Indicators are the definitions, in configuration order.
	Indicators []config.Indicator
	// Values[i][j] is indicator j at station i, NaN when undefined.
	Values [][]float64
	// Notes[i][j] says why a value is undefined, or how it was obtained
	// when that needs saying (a restricted mean instead of a median); ""
	// otherwise.
	Notes [][]string
	// Fallback[i][j] is true when a recovery value is the restricted mean
	// survival time because the Kaplan–Meier median is undefined.
	Fallback [][]bool
	// Events is the number of distinct events per station.
	Events []int
	// Used[i][j] is the number of distinct events indicator j counted at
	// station i (after its kind, variable and severity filters); 0 for
	// indicators not computed from events.
	Used [][]int
	// BySeverity[i] counts station i's distinct events by kind and severity
	// class (index 0 unrated, 1 moderate … 4 extreme).
	BySeverity []map[string][5]int
	// Censored[i] counts station i's event rows whose recovery was
	// censored, by reason ("record_end", "gap", "next_event").
	Censored []map[string]int
	// SeverityKnown is false when the events table has no severity
	// column: every event then counts whatever min_severity says.
	SeverityKnown bool
	// Regional are the regional events when comparison.basis = "shared":
	// the event indicators then count only station events overlapping one.
	Regional []RegionalEvent
	// Warnings are facts the reader of the results should know.
	Warnings []error
}

// Warning is a note about one station and, optionally, one indicator.
type Warning struct {
	Station   string
	Indicator string
	Msg       string
}

func (w *Warning) Error() string {
	switch {
	case w.Station == "" && w.Indicator == "":
		return w.Msg
	case w.Station == "":
		return w.Indicator + ": " + w.Msg
	case w.Indicator == "":
		return "station " + w.Station + ": " + w.Msg
	}
	return "station " + w.Station + ": " + w.Indicator + ": " + w.Msg
}

// CriterionStats is a station's performance against one criterion, from
// its daily record (see package index/criteria).
type CriterionStats struct {
	Reliability   float64 // share of days with a 7-day value that meet the criterion
	Resilience    float64 // F→S transitions per failure day
	Vulnerability float64 // mean of each failure event's largest excess, °C
	DaysAbove     float64 // failure days per year of record
	Note          string  // why the values are undefined, when they are
}

// Series holds what the daily records say about each station, for the
// indicators that need them. Nil when the run has no series.
type Series struct {
	// Criteria maps station → criterion name → performance. A station
	// without an entry has no usable record.
	Criteria map[string]map[string]CriterionStats
	// Missing maps a station with no daily record to the reason.
	Missing map[string]string
}

// Compute derives the raw indicator values for every station of the
// attribute table from the events, the attributes and, for criterion
// indicators, the daily series. It checks what only the tables together can
// show (events for unknown stations, duplicate rows, dryness outside its
// scale) and returns every such problem; the result is usable only when
// there are none. events may be nil when no indicator is computed from
// events, and ser when none needs series.
func Compute(events *EventTable, attrs *attributes.Table, cfg *config.Config, ser *Series) (*Raw, []error) {
	var errs tabular.List
	n := len(attrs.Stations)
	raw := &Raw{
		Stations:   make([]string, n),
		Names:      make([]string, n),
		Groups:     make([]string, n),
		Indicators: cfg.Indicators,
		Values:     make([][]float64, n),
		Notes:      make([][]string, n),
		Fallback:   make([][]bool, n),
		Events:     make([]int, n),
		Used:       make([][]int, n),
		BySeverity: make([]map[string][5]int, n),
		Censored:   make([]map[string]int, n),
	}
	raw.SeverityKnown = events != nil && events.Has["severity"]
	for i, s := range attrs.Stations {
		raw.Stations[i], raw.Names[i], raw.Groups[i] = s.ID, s.Name, s.Group
		raw.Values[i] = make([]float64, len(cfg.Indicators))
		raw.Notes[i] = make([]string, len(cfg.Indicators))
		raw.Fallback[i] = make([]bool, len(cfg.Indicators))
		raw.Used[i] = make([]int, len(cfg.Indicators))
	}

	// Events by station, with cross-table checks.
	byStation := make([][]*Event, n)
	if events != nil {
		unknownVar := groupEvents(byStation, events, attrs, cfg, &errs)
		// Duplicate rows, station by station: sorting a few dozen events
		// is far cheaper than one map over a million rows, and sorting
		// hashes of them cheaper still; only a station whose hashes
		// repeat (a duplicate, or rarely two pairs with the same hash)
		// has its events sorted. That order is total but for rows that
		// agree on event, variable and line, whose reports are the same
		// in any order.
		var d dupFinder
		var sorted []*Event
		for i, evs := range byStation {
			if !d.mayRepeat(evs) {
				continue
			}
			sorted = append(sorted[:0], evs...)
			slices.SortFunc(sorted, func(a, b *Event) int {
				return cmp.Or(strings.Compare(a.ID, b.ID), strings.Compare(a.Variable, b.Variable), a.Line-b.Line)
			})
			dup := false
			for k := 1; k < len(sorted); k++ {
				a, b := sorted[k-1], sorted[k]
				if a.ID == b.ID && a.Variable == b.Variable {
					errs.Add(&tabular.ParseError{File: events.File, Line: b.Line, Column: "event",
						Err: fmt.Errorf("duplicate row for station %q, event %q, variable %q (first on line %d)", b.Station, b.ID, b.Variable, a.Line)})
					dup = true
				}
			}
			if dup {
				byStation[i] = nil
			}
		}
		for _, v := range sortedKeys(unknownVar) {
			raw.Warnings = append(raw.Warnings, &Warning{Msg: fmt.Sprintf("%s: variable %q (%d rows) has no [[variable]] table; only indicators that take every variable use it", events.File, v, unknownVar[v])})
		}
	}

	for j, ind := range cfg.Indicators {
		if ind.Measure == config.Attribute {
			if _, ok := attrs.Column(ind.Attribute); !ok {
				errs.Add(&config.Error{File: cfg.File, Key: fmt.Sprintf("indicator[%d].attribute", j+1),
					Msg: fmt.Sprintf("%s has no numeric column %q; it has %s", attrs.File, ind.Attribute, strings.Join(attrs.Columns, ", "))})
			}
		}
	}
	if events != nil && !raw.SeverityKnown {
		for j, ind := range cfg.Indicators {
			if ind.Measure.FromEvents() && ind.MinSeverity != nil && *ind.MinSeverity > 1 {
				errs.Add(&config.Error{File: cfg.File, Key: fmt.Sprintf("indicator[%d].min_severity", j+1),
					Msg: fmt.Sprintf("%s has no severity column, so events cannot be kept by severity; add the column (classes 1-4, as rebound events writes it) or set min_severity = 1", events.File)})
			}
		}
		raw.Warnings = append(raw.Warnings, &Warning{Msg: fmt.Sprintf("%s has no severity column: every event counts, whatever its strength (indicators' default min_severity taken as 1)", events.File)})
	}
	var recordYears []float64
	if col, ok := attrs.Column(cfg.Inputs.RecordYearsColumn); ok {
		recordYears = col
	}
	if errs.Len() > 0 {
		return nil, errs.Errors()
	}

	attrCols := make([][]float64, len(cfg.Indicators))
	for j, ind := range cfg.Indicators {
		if ind.Measure == config.Attribute {
			attrCols[j], _ = attrs.Column(ind.Attribute)
		}
	}
	var sc scratch
	if cfg.Comparison.Basis == config.BasisShared && events != nil {
		groups := make([]string, n)
		if cfg.Normalization.Scope == config.ScopeGroup {
			copy(groups, raw.Groups)
		}
		raw.Regional = markRegional(byStation, groups, cfg.Comparison.MinShare)
		sc.shared = true
		raw.Warnings = append(raw.Warnings, &Warning{Msg: fmt.Sprintf("comparison.basis = \"shared\": stations are scored only on the events that overlap a regional event (%s), one on which at least %g of the stations were in an event of the kind", describeRegional(raw.Regional), cfg.Comparison.MinShare)})
	}
	for i := range n {
		evs := byStation[i]
		raw.Events[i] = sc.countDistinct(evs)
		raw.BySeverity[i], raw.Censored[i] = tally(evs)
		for j, ind := range cfg.Indicators {
			var v float64
			var note string
			var fb bool
			if ind.Measure == config.CriterionM {
				v, note = criterionValue(ind, ser, raw.Stations[i])
			} else {
				v, note, fb = sc.indicator(ind, evs, attrCols[j], i, recordYears, cfg, raw.SeverityKnown)
				if ind.Measure.FromEvents() {
					raw.Used[i][j] = sc.used
				}
			}
			raw.Values[i][j], raw.Notes[i][j], raw.Fallback[i][j] = v, note, fb
		}
	}
	return raw, nil
}

// groupEvents sets byStation[i] to the events of station i of attrs, in
// file order, and returns the number of rows of each variable that has no
// [[variable]] table. It reports events for unknown stations and dryness
// outside its scale.
func groupEvents(byStation [][]*Event, events *EventTable, attrs *attributes.Table, cfg *config.Config, errs *tabular.List) map[string]int {
	unknownVar := map[string]int{}
	start := make([]int, len(attrs.Stations)+1)
	// Rows come grouped by station, and a handful of variables repeat:
	// remember the last of each.
	st := stationIndex{attrs: attrs}
	lastVar, lastKnown := "", false
	for k := range events.Events {
		e := &events.Events[k]
		i, ok := st.of(e.Station)
		if !ok {
			errs.Add(&tabular.ParseError{File: events.File, Line: e.Line, Column: "station",
				Err: fmt.Errorf("station %q is not in the attribute table %s", e.Station, attrs.File)})
			continue
		}
		if cfg.Memory.Dryness == config.Fraction && !math.IsNaN(e.Dryness) && (e.Dryness < 0 || e.Dryness > 1) {
			errs.Add(&tabular.ParseError{File: events.File, Line: e.Line, Column: "antecedent_dryness",
				Err: fmt.Errorf("want a fraction in [0, 1] (memory.dryness = %q), got %g", cfg.Memory.Dryness, e.Dryness)})
		}
		if k == 0 || e.Variable != lastVar {
			lastVar = e.Variable
			_, lastKnown = cfg.Variable(e.Variable)
		}
		if !lastKnown {
			unknownVar[e.Variable]++
		}
		start[i+1]++
	}
	for i := range attrs.Stations {
		start[i+1] += start[i]
	}
	// One array of pointers, cut into the stations' runs.
	all := make([]*Event, start[len(attrs.Stations)])
	next := slices.Clone(start)
	for k := range events.Events {
		e := &events.Events[k]
		if i, ok := st.of(e.Station); ok {
			all[next[i]] = e
			next[i]++
		}
	}
	for i := range byStation {
		if start[i] < start[i+1] {
			byStation[i] = all[start[i]:start[i+1]:start[i+1]]
		}
	}
	return unknownVar
}

// dupFinder tells whether a station's events may repeat an event and
// variable, from hashes of the pairs. The hash seed differs from run to
// run, which changes at most which stations are sorted, never a result.
type dupFinder struct {
	seed    maphash.Seed
	hashes  []uint64
	lastVar string
	varHash uint64
}

func (d *dupFinder) mayRepeat(evs []*Event) bool {
	if len(evs) < 2 {
		return false
	}
	if d.hashes == nil {
		d.seed = maphash.MakeSeed()
		d.varHash = maphash.String(d.seed, "")
	}
	h := d.hashes[:0]
	for _, e := range evs {
		if e.Variable != d.lastVar {
			d.lastVar, d.varHash = e.Variable, maphash.String(d.seed, e.Variable)
		}
		h = append(h, maphash.String(d.seed, e.ID)*0x9E3779B97F4A7C15^d.varHash)
	}
	d.hashes = h
	slices.Sort(h)
	for k := 1; k < len(h); k++ {
		if h[k] == h[k-1] {
			return true
		}
	}
	return false
}

// stationIndex looks stations up in an attribute table, remembering the
// last one.
type stationIndex struct {
	attrs *attributes.Table
	last  string
	i     int
	ok    bool
	init  bool
}

func (s *stationIndex) of(id string) (int, bool) {
	if !s.init || id != s.last {
		s.init, s.last = true, id
		s.i, s.ok = s.attrs.Index(id)
	}
	return s.i, s.ok
}

// scratch holds buffers that the computation of one station's indicators
// reuses for the next.
type scratch struct {
	ids    []string
	sel    []*Event
	rep    []*Event
	a, b   []float64
	obs    []bool
	slopes []float64
	used   int  // distinct events of the last indicator
	extra  int  // copies added by replicate, per distinct event
	shared bool // only events with a regional event count
}

// indicator computes indicator ind at station i from its events evs.
// attrCol holds the indicator's attribute column for measure "attribute".
// rated says whether the events carry a severity class.
func (sc *scratch) indicator(ind config.Indicator, evs []*Event, attrCol []float64, i int, recordYears []float64, cfg *config.Config, rated bool) (v float64, note string, fallback bool) {
	nan := math.NaN()
	sc.used = 0
	if ind.Measure == config.Attribute {
		return transform(attrCol[i], ind.Transform)
	}
	floor := 1
	if rated {
		floor = ind.SeverityFloor()
	}
	sel := sc.filter(evs, ind, floor)
	sc.used = sc.countDistinct(sel)
	weighted := ind.EventWeights == config.WeightSeverity
	if weighted && len(sel) > 0 {
		sel = sc.replicate(sel)
	}
	switch ind.Measure {
	case config.Frequency:
		years := nan
		if recordYears != nil && recordYears[i] > 0 {
			years = recordYears[i]
		} else if cfg.Inputs.RecordYears > 0 {
			years = cfg.Inputs.RecordYears
		}
		if math.IsNaN(years) {
			return nan, fmt.Sprintf("no length of record (attribute %q blank and inputs.record_years unset)", cfg.Inputs.RecordYearsColumn), false
		}
		if weighted {
			return float64(sc.countDistinct(sel)+sc.extra) / years, "", false
		}
		return float64(sc.used) / years, "", false
	}
	if len(sel) == 0 {
		return nan, "no " + describeFilter(ind, floor) + " events", false
	}
	switch ind.Measure {
	case config.Magnitude:
		sign := harmfulSign(cfg, ind.Variables[0])
		mags := sc.a[:0]
		for _, e := range sel {
			if !math.IsNaN(e.PeakDeparture) {
				mags = append(mags, sign*e.PeakDeparture)
			}
		}
		sc.a = mags
		if len(mags) == 0 {
			return nan, "no " + describeFilter(ind, floor) + " events with a known peak departure", false
		}
		return robust.SelectQuantile(mags, 0.5), "", false // the median
	case config.Recovery:
		times := slices.Grow(sc.a[:0], len(sel))[:len(sel)]
		obs := slices.Grow(sc.obs[:0], len(sel))[:len(sel)]
		sc.a, sc.obs = times, obs
		for k, e := range sel {
			times[k], obs[k] = e.RecoveryDays, e.Recovered
		}
		c := survival.KaplanMeier(times, obs)
		if m, ok := c.Median(); ok {
			return m, "", false
		}
		censored := 0
		for _, o := range obs {
			if !o {
				censored++
			}
		}
		return c.RMST(c.MaxTime), fmt.Sprintf("Kaplan–Meier median undefined (%d of %d events not recovered); restricted mean to %g days used", censored, len(sel), c.MaxTime), true
	case config.MemoryM:
		sign := harmfulSign(cfg, ind.Variables[0])
		x, y := sc.a[:0], sc.b[:0]
		for _, e := range sel {
			if !math.IsNaN(e.Dryness) && !math.IsNaN(e.PeakDeparture) {
				x = append(x, e.Dryness)
				y = append(y, sign*e.PeakDeparture)
			}
		}
		sc.a, sc.b = x, y
		if len(x) < cfg.Memory.MinEvents {
			return nan, fmt.Sprintf("%d events with known antecedent dryness and peak departure, fewer than memory.min_events = %d", len(x), cfg.Memory.MinEvents), false
		}
		// The Theil–Sen slope (robust.TheilSen), its slopes in a reused
		// buffer.
		sc.slopes = robust.PairwiseSlopes(sc.slopes, x, y)
		if len(sc.slopes) == 0 {
			return nan, "antecedent dryness is the same for every event; no slope", false
		}
		return robust.SelectQuantile(sc.slopes, 0.5), "", false
	case config.ResponseSlope:
		sign := harmfulSign(cfg, ind.Variables[0])
		x, y := sc.a[:0], sc.b[:0]
		for _, e := range sel {
			if !math.IsNaN(e.DriverIntensity) && !math.IsNaN(e.PeakDeparture) {
				x = append(x, e.DriverIntensity)
				y = append(y, sign*e.PeakDeparture)
			}
		}
		sc.a, sc.b = x, y
		if n := distinctX(x, &sc.slopes); n < cfg.Memory.MinEvents {
			return nan, fmt.Sprintf("%d events with a known driver intensity and peak departure, fewer than memory.min_events = %d", n, cfg.Memory.MinEvents), false
		}
		sc.slopes = robust.PairwiseSlopes(sc.slopes, x, y)
		if len(sc.slopes) == 0 {
			return nan, "the driver intensity is the same for every event; no slope", false
		}
		return robust.SelectQuantile(sc.slopes, 0.5), "", false
	}
	return nan, "unknown measure " + string(ind.Measure), false
}

func criterionValue(ind config.Indicator, ser *Series, station string) (float64, string) {
	if ser == nil {
		return math.NaN(), "no daily series"
	}
	if why, ok := ser.Missing[station]; ok {
		return math.NaN(), why
	}
	st, ok := ser.Criteria[station][ind.Criterion]
	if !ok {
		return math.NaN(), "no water-temperature record for criterion " + strconv.Quote(ind.Criterion)
	}
	var v float64
	switch ind.Statistic {
	case config.Reliability:
		v = st.Reliability
	case config.Resilience:
		v = st.Resilience
	case config.Vulnerability:
		v = st.Vulnerability
	case config.DaysAbove:
		v = st.DaysAbove
	}
	if math.IsNaN(v) {
		note := st.Note
		if note == "" {
			note = fmt.Sprintf("%s undefined: the 7-day statistic never exceeded %q", ind.Statistic, ind.Criterion)
		}
		return v, note
	}
	return v, ""
}

func transform(x float64, t config.Transform) (float64, string, bool) {
	if math.IsNaN(x) {
		return x, "attribute blank", false
	}
	switch t {
	case config.Log:
		if x <= 0 {
			return math.NaN(), fmt.Sprintf("log transform of %g is undefined", x), false
		}
		return math.Log(x), "", false
	case config.Sqrt:
		if x < 0 {
			return math.NaN(), fmt.Sprintf("square root of %g is undefined", x), false
		}
		return math.Sqrt(x), "", false
	}
	return x, "", false
}

func harmfulSign(cfg *config.Config, variable string) float64 {
	v, _ := cfg.Variable(variable)
	return v.Harmful.Sign()
}

// filter returns the events of evs that ind takes, with a severity class
// of at least floor where the kind is rated, in sc.sel unless it takes
// them all.
func (sc *scratch) filter(evs []*Event, ind config.Indicator, floor int) []*Event {
	if len(ind.Kinds) == 0 && len(ind.Variables) == 0 && floor <= 1 && !sc.shared {
		return evs
	}
	out := sc.sel[:0]
	for _, e := range evs {
		if (!sc.shared || e.Regional != "") && (len(ind.Kinds) == 0 || slices.Contains(ind.Kinds, e.Kind)) &&
			(len(ind.Variables) == 0 || slices.Contains(ind.Variables, e.Variable)) &&
			(floor <= 1 || !Rated(e.Kind) || e.Severity >= floor) {
			out = append(out, e)
		}
	}
	sc.sel = out
	return out
}

// Rated reports whether events of kind carry a severity class: the kinds
// rebound derives. Events of other kinds (the user's) are never dropped by
// severity.
func Rated(kind string) bool { return kind == "heatwave" || kind == "drought" || kind == "flood" }

// weightOf is the number of times an event counts under event_weights =
// "severity": its class, and 1 for unrated events.
func weightOf(e *Event) int { return max(e.Severity, 1) }

// replicate returns sel with each event repeated weightOf times, in
// sc.rep, and sets sc.extra to the number of added copies per distinct
// event summed (for the weighted frequency).
func (sc *scratch) replicate(sel []*Event) []*Event {
	out := sc.rep[:0]
	for _, e := range sel {
		for range weightOf(e) {
			out = append(out, e)
		}
	}
	sc.rep = out
	// Weighted frequency: the sum over distinct events of their weight.
	sc.extra = 0
	seen := map[string]bool{}
	for _, e := range sel {
		if !seen[e.ID] {
			seen[e.ID] = true
			sc.extra += weightOf(e) - 1
		}
	}
	return out
}

// distinctX returns the number of distinct values in x, using buf.
func distinctX(x []float64, buf *[]float64) int {
	b := append((*buf)[:0], x...)
	slices.Sort(b)
	*buf = b
	return len(slices.Compact(b))
}

// tally counts evs' distinct events by kind and severity, and their rows
// censored by reason.
func tally(evs []*Event) (map[string][5]int, map[string]int) {
	bySev, cens := map[string][5]int{}, map[string]int{}
	seen := map[string]bool{}
	for _, e := range evs {
		if e.Censor != "" {
			cens[e.Censor]++
		}
		if seen[e.ID] {
			continue
		}
		seen[e.ID] = true
		c := bySev[e.Kind]
		c[min(max(e.Severity, 0), 4)]++
		bySev[e.Kind] = c
	}
	return bySev, cens
}

func describeFilter(ind config.Indicator, floor int) string {
	var parts []string
	if floor > 1 {
		parts = append(parts, SeverityNames[floor]+" or stronger")
	}
	if len(ind.Kinds) > 0 {
		parts = append(parts, strings.Join(ind.Kinds, "/"))
	}
	if len(ind.Variables) > 0 {
		parts = append(parts, strings.Join(ind.Variables, "/"))
	}
	if len(parts) == 0 {
		return "recorded"
	}
	return strings.Join(parts, " ")
}

// countDistinct counts distinct event identifiers. The rows of an event's
// variables usually follow one another, so repeats of the row before are
// dropped before sorting.
func (sc *scratch) countDistinct(evs []*Event) int {
	ids := sc.ids[:0]
	for _, e := range evs {
		if len(ids) == 0 || ids[len(ids)-1] != e.ID {
			ids = append(ids, e.ID)
		}
	}
	sc.ids = ids
	slices.Sort(ids)
	return len(slices.Compact(ids))
}

func sortedKeys[V any](m map[string]V) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}
