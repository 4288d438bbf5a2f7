package workbook

import (
	"cmp"
	"fmt"
	"maps"
	"math"
	"slices"
	"strings"

	"github.com/xuri/excelize/v2"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/cmd/rebound/internal/view"
	"rebound/config"
	"rebound/index"
	"rebound/index/calendar"
)

// Sheet names, in workbook order. A sheet whose data the run lacks is left
// out.
const (
	SheetSummary     = "Summary"
	SheetRanking     = "Ranking"
	SheetIndicators  = "Indicators"
	SheetWeights     = "Weights"
	SheetEvents      = "Events"
	SheetSeverity    = "Severity"
	SheetCriteria    = "Criteria"
	SheetClusters    = "Clusters"
	SheetProfiles    = "Cluster profiles"
	SheetSensitivity = "Sensitivity"
	SheetMethod      = "Method"
	SheetInputs      = "Inputs"
	SheetWarnings    = "Warnings"
)

// MaxEventRows is the most event rows the Events sheet holds; a larger
// table is cut there, with a note (a sheet holds at most 1,048,576 rows,
// and a planner's workbook should open quickly).
const MaxEventRows = 100000

// Render returns the workbook of a finished run and its manifest.
func Render(r *pipeline.Run, man *report.Manifest) ([]byte, error) {
	return render(r, man, view.Of(r))
}

func render(r *pipeline.Run, man *report.Manifest, e view.Extras) ([]byte, error) {
	b, err := newBook()
	if err != nil {
		return nil, err
	}
	defer b.f.Close()
	w := &writer{book: b, r: r, man: man, e: e}
	sheets := []struct {
		name string
		fill func()
		ok   bool
	}{
		{SheetSummary, w.summary, true},
		{SheetRanking, w.ranking, true},
		{SheetIndicators, w.indicators, true},
		{SheetWeights, w.weights, true},
		{SheetEvents, w.events, r.Events != nil && len(r.Events.Events) > 0},
		{SheetSeverity, w.severity, r.Events != nil && r.Raw.SeverityKnown},
		{SheetCriteria, w.criteria, hasCriteria(r)},
		{SheetClusters, w.clusters, e.Clusters != nil},
		{SheetProfiles, w.profiles, e.Clusters != nil},
		{SheetSensitivity, w.sensitivity, e.Sensitivity != nil},
		{SheetMethod, w.method, true},
		{SheetInputs, w.inputs, true},
		{SheetWarnings, w.warnings, len(r.Warnings) > 0},
	}
	for _, s := range sheets {
		if !s.ok {
			continue
		}
		w.present = append(w.present, s.name)
		if s.name == SheetSummary {
			b.set(b.f.SetSheetName("Sheet1", s.name))
		} else {
			_, err := b.f.NewSheet(s.name)
			b.set(err)
		}
	}
	for _, s := range sheets {
		if s.ok {
			s.fill()
		}
	}
	w.charts()
	for _, name := range w.present {
		w.printSetup(name)
	}
	b.f.SetActiveSheet(0)
	date := man.RunDate + "T00:00:00Z"
	title := r.Config.Title
	if title == "" {
		title = "Resilience ranking"
	}
	b.set(b.f.SetDocProps(&excelize.DocProperties{
		Created: date, Modified: date, Creator: "rebound " + man.Version, LastModifiedBy: "rebound " + man.Version,
		Title: title, Subject: "Resilience screening of river water quality", Description: report.Caution,
		Language: "en", Revision: "1",
	}))
	b.set(b.f.SetAppProps(&excelize.AppProperties{Application: "rebound", AppVersion: "1.0000"}))
	if b.err != nil {
		return nil, b.err
	}
	buf, err := b.f.WriteToBuffer()
	if err != nil {
		return nil, err
	}
	return canonical(buf.Bytes())
}

type writer struct {
	*book
	r       *pipeline.Run
	man     *report.Manifest
	e       view.Extras
	present []string
	// rankingCols records where the ranking columns landed, for its chart.
	rankCol map[string]int
	// tornadoRows and profile ranges, for the charts.
	tornadoRows int
	// intervalTop is the header row of the rank-interval table on the
	// Sensitivity sheet, intervalRows its number of rows.
	intervalTop, intervalRows int
	scatter                   []scatterSeries
}

type scatterSeries struct {
	name               string
	r0, r1, cx, cy, cn int
	xLabel, yLabelXY   string
}

// printSetup prints a sheet landscape, one page wide, repeating its
// header row on every page. The print area is the sheet's cells, so the
// charts beside a table stay on screen without shrinking the printed table
// to an unreadable size.
func (w *writer) printSetup(sheet string) {
	w.set(w.f.SetSheetProps(sheet, &excelize.SheetPropsOptions{FitToPage: ptr(true)}))
	w.set(w.f.SetPageLayout(sheet, &excelize.PageLayoutOptions{Orientation: ptr("landscape"), FitToWidth: ptr(1), FitToHeight: ptr(0)}))
	if sheet != SheetSummary {
		w.set(w.f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Titles", RefersTo: fmt.Sprintf("'%s'!$1:$1", sheet), Scope: sheet}))
	}
	rows, err := w.f.GetRows(sheet)
	if err != nil || len(rows) == 0 {
		return
	}
	cols := 0
	for _, r := range rows {
		cols = max(cols, len(r))
	}
	if cols > 0 {
		w.set(w.f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Area",
			RefersTo: fmt.Sprintf("'%s'!$A$1:$%s$%d", sheet, colName(cols), len(rows)), Scope: sheet}))
	}
}

func hasCriteria(r *pipeline.Run) bool {
	for _, s := range r.Stations {
		if s.Criteria != nil && len(s.Criteria.Criteria) > 0 {
			return true
		}
	}
	return false
}

func (w *writer) title() string {
	if t := w.r.Config.Title; t != "" {
		return t
	}
	return "Resilience ranking"
}

func (w *writer) summary() {
	const s = SheetSummary
	r, man, f := w.r, w.man, w.f
	for col, width := range []float64{24, 12, 40, 14, 30} {
		b := colName(col + 1)
		w.set(f.SetColWidth(s, b, b, width))
	}
	w.str(s, "A1", w.title())
	w.style(s, "A1", "A1", w.book.title)
	w.str(s, "A2", report.Caution)
	w.set(f.MergeCell(s, "A2", "E2"))
	w.style(s, "A2", "E2", w.wrap)
	w.set(f.SetRowHeight(s, 2, 48))

	row := 4
	kv := func(k string, v any) {
		w.str(s, cell(1, row), k)
		w.style(s, cell(1, row), cell(1, row), w.bold)
		w.value(s, cell(2, row), v)
		w.set(f.MergeCell(s, cell(2, row), cell(5, row)))
		w.style(s, cell(2, row), cell(5, row), w.wrap)
		// The merged cell is about 100 characters wide: give wrapped text
		// the lines it needs.
		if text, ok := v.(string); ok && len(text) > 95 {
			w.set(f.SetRowHeight(s, row, float64(15*(1+len(text)/95))))
		}
		row++
	}
	kv("Tool", "rebound "+man.Version+" ("+man.Go+")")
	kv("Run date", man.RunDate)
	kv("Configuration file", man.ConfigFile)
	kv("Seed", fmt.Sprint(man.Seed))
	kv("Stations", fmt.Sprintf("%d in the attribute table, %d with a score", man.Stations, man.Scored))
	names := make([]string, len(r.Raw.Indicators))
	for j, ind := range r.Raw.Indicators {
		names[j] = ind.Name
	}
	kv("Indicators", fmt.Sprintf("%d: %s", len(names), strings.Join(names, ", ")))
	kv("Weighting", weightingText(r))
	kv("Normalisation", fmt.Sprintf("%s, over %s", normText(r.Config), scopeText(r.Config.Normalization.Scope)))
	kv("Aggregation", aggText(r.Config))
	kv("Missing values", missingText(r.Config.Missing.Policy))
	if sv := w.e.Sensitivity; sv != nil {
		agree := ""
		if !math.IsNaN(sv.Spearman) {
			agree = fmt.Sprintf("; mean Spearman correlation with the base ranking %.3f", sv.Spearman)
		}
		kv("Weight sensitivity", fmt.Sprintf("%d weight samples; rank interval = %s%s", sv.Samples, sv.Interval, agree))
	} else if r.SensitivitySkipped != "" {
		kv("Weight sensitivity", "skipped: "+r.SensitivitySkipped)
	} else {
		kv("Weight sensitivity", "not run")
	}
	if c := w.e.Clusters; c != nil {
		kv("Clustering", fmt.Sprintf("%d clusters, %s, on %d features", c.K, c.Method, len(c.Features)))
	} else {
		kv("Clustering", "not run")
	}
	kv("Warnings", fmt.Sprintf("%d (see the %s sheet)", len(r.Warnings), SheetWarnings))

	// Top and bottom stations.
	order := r.Result.Order
	scored := 0
	for _, i := range order {
		if !math.IsNaN(r.Result.Score[i]) {
			scored++
		}
	}
	k := min(5, (scored+1)/2)
	cols := []column{{"Rank", 24, fmtInt}, {"Station", 12, fmtText}, {"Name", 40, fmtText}, {"Score (0–100)", 14, fmtScore}}
	if w.e.Sensitivity != nil {
		cols = append(cols, column{"Rank interval (" + w.e.Sensitivity.Interval + ")", 30, fmtText})
	}
	block := func(heading string, idx []int) {
		row++
		w.str(s, cell(1, row), heading)
		w.style(s, cell(1, row), cell(1, row), w.bold)
		row++
		var rows [][]any
		for _, i := range idx {
			st := r.Attrs.Stations[i]
			rr := []any{r.Result.Rank[i], st.ID, st.Name, nanBlank(r.Result.Score[i])}
			if sv := w.e.Sensitivity; sv != nil {
				rr = append(rr, fmt.Sprintf("%d–%d (%s)", sv.Low[i], sv.High[i], sv.Stability[i]))
			}
			rows = append(rows, rr)
		}
		w.tableAt(s, row, cols, rows, false)
		row += len(rows) + 1
	}
	if k > 0 {
		block(fmt.Sprintf("Most resilient %d", k), order[:k])
		block(fmt.Sprintf("Least resilient %d", k), reverse(order[scored-k:scored]))
	}
	// The summary's widths are set above; tableAt changed them.
	for col, width := range []float64{24, 12, 40, 14, 30} {
		b := colName(col + 1)
		w.set(f.SetColWidth(s, b, b, width))
	}

	row++
	w.str(s, cell(1, row), "Cautions")
	w.style(s, cell(1, row), cell(1, row), w.bold)
	cautions := []string{report.Caution,
		"Scores rank stations against each other within this run; they are not measures of absolute condition, and they change when stations, indicators or weights change."}
	if w.e.Sensitivity == nil {
		cautions = append(cautions, "No weight sensitivity analysis was run: how far the ranking depends on the chosen weights is not known.")
	}
	for i, wa := range r.Warnings {
		if i == 10 {
			cautions = append(cautions, fmt.Sprintf("… and %d more warnings on the %s sheet.", len(r.Warnings)-10, SheetWarnings))
			break
		}
		cautions = append(cautions, "Warning: "+wa.Error())
	}
	for _, c := range cautions {
		row++
		w.str(s, cell(1, row), c)
		w.set(f.MergeCell(s, cell(1, row), cell(5, row)))
		w.style(s, cell(1, row), cell(5, row), w.wrap)
		w.set(f.SetRowHeight(s, row, float64(15*(1+len(c)/110))))
	}

	row += 2
	w.str(s, cell(1, row), "Sheets")
	w.style(s, cell(1, row), cell(1, row), w.bold)
	about := map[string]string{
		SheetRanking:     "every station by rank, with its score, flags and (when computed) rank interval and cluster",
		SheetIndicators:  "raw value, normalised value, weight and contribution of each indicator at each station",
		SheetWeights:     "the indicators and the weights actually used",
		SheetEvents:      "the disturbance events and each variable's departure and recovery",
		SheetCriteria:    "performance against each temperature criterion",
		SheetClusters:    "each station's cluster and features",
		SheetProfiles:    "each cluster's feature means and description",
		SheetSensitivity: "how the ranking responds to the weights",
		SheetMethod:      "every step of the method, with the values this run used",
		SheetInputs:      "every input file with its SHA-256 digest and rows read",
		SheetWarnings:    "every warning of the run",
	}
	for _, name := range w.present[1:] {
		row++
		w.str(s, cell(1, row), name)
		w.str(s, cell(2, row), about[name])
		w.set(f.MergeCell(s, cell(2, row), cell(5, row)))
	}
	w.set(f.SetPanes(s, &excelize.Panes{}))
}

func reverse(xs []int) []int {
	out := slices.Clone(xs)
	slices.Reverse(out)
	return out
}

func (w *writer) ranking() {
	const s = SheetRanking
	r, res, sv, cl := w.r, w.r.Result, w.e.Sensitivity, w.e.Clusters
	cols := []column{{"Rank", 7, fmtInt}, {"Station", 11, fmtText}, {"Name", 34, fmtText}, {"Group", 12, fmtText},
		{"Score (0–100, higher = more resilient)", 14, fmtScore}}
	w.rankCol = map[string]int{"rank": 1, "station": 2, "score": 5}
	if sv != nil {
		w.rankCol["low"], w.rankCol["median"], w.rankCol["high"] = len(cols)+1, len(cols)+2, len(cols)+3
		cols = append(cols, column{"Best rank, " + sv.Interval, 11, fmtInt}, column{"Median rank", 9, fmtInt},
			column{"Worst rank, " + sv.Interval, 11, fmtInt}, column{"Stability under varied weights", 17, fmtText})
	}
	if cl != nil {
		cols = append(cols, column{"Cluster", 8, fmtInt}, column{"Cluster profile", 28, fmtText})
	}
	cols = append(cols, column{"Events", 8, fmtInt}, column{"Latitude (° N)", 10, fmt4}, column{"Longitude (° E)", 10, fmt4}, column{"Flags", 30, fmtText})
	var rows [][]any
	for _, i := range res.Order {
		st := r.Attrs.Stations[i]
		row := []any{res.Rank[i], st.ID, st.Name, st.Group, nanBlank(res.Score[i])}
		if sv != nil {
			if sv.Low[i] > 0 {
				row = append(row, sv.Low[i], sv.Median[i], sv.High[i], sv.Stability[i])
			} else {
				row = append(row, blank{}, blank{}, blank{}, sv.Stability[i])
			}
		}
		if cl != nil {
			if l := cl.Labels[i]; l >= 0 {
				row = append(row, l+1, cl.Profiles[l].Description)
			} else {
				row = append(row, blank{}, "left out: "+cl.Reasons[i])
			}
		}
		row = append(row, r.Raw.Events[i], st.Latitude, st.Longitude, strings.Join(res.Flags[i], "; "))
		rows = append(rows, row)
	}
	w.table(s, cols, rows)
	n := len(rows)
	if n > 0 {
		sc := colName(5)
		w.set(w.f.SetConditionalFormat(s, fmt.Sprintf("%s2:%s%d", sc, sc, n+1), []excelize.ConditionalFormatOptions{{
			Type: "3_color_scale", Criteria: "=", MinType: "min", MidType: "percentile", MidValue: "50", MaxType: "max",
			MinColor: scaleLow, MidColor: scaleMid, MaxColor: scaleHigh,
		}}))
	}
	w.rankCol["ncols"] = len(cols)
}

func (w *writer) indicators() {
	const s = SheetIndicators
	r, res := w.r, w.r.Result
	contrib := "Contribution (score points)"
	if r.Config.Aggregation.Method == config.Geometric {
		contrib = "Contribution (factor of the composite)"
	}
	cols := []column{{"Station", 11, fmtText}, {"Name", 30, fmtText}, {"Rank", 7, fmtInt}, {"Indicator", 18, fmtText},
		{"Label (units of the raw value)", 40, fmtText}, {"Raw value", 11, fmtGen}, {"Normalised (0–1, higher = more resilient)", 14, fmt3},
		{"Weight used (sum 1)", 10, fmtWeight}, {contrib, 14, fmt2}, {"Status", 10, fmtText}, {"Note", 50, fmtText}}
	if !res.Spec.Bounded() {
		cols[6] = column{"Normalised (z-score, higher = more resilient)", 14, fmt3}
	}
	var rows [][]any
	for _, i := range res.Order {
		st := r.Attrs.Stations[i]
		for j, ind := range r.Raw.Indicators {
			status := report.IndicatorStatus(r, i, j)
			rows = append(rows, []any{st.ID, st.Name, res.Rank[i], ind.Name, labelOf(ind), nanBlank(r.Raw.Values[i][j]),
				nanBlank(res.Normalized[i][j]), r.Weights.W[j], nanBlank(res.Contribution[i][j]), status, r.Raw.Notes[i][j]})
		}
	}
	w.table(s, cols, rows)
}

func labelOf(ind config.Indicator) string {
	if ind.Label != "" {
		return ind.Label
	}
	return string(ind.Measure)
}

func (w *writer) weights() {
	const s = SheetWeights
	r := w.r
	cols := []column{{"Indicator", 18, fmtText}, {"Label (units)", 44, fmtText}, {"Measure", 11, fmtText},
		{"Events used (kinds; variables)", 30, fmtText}, {"Higher raw value means", 16, fmtText}, {"Normalisation", 13, fmtText},
		{"Configured weight", 11, fmtWeight}, {"Weight used (sum 1)", 11, fmtWeight}}
	var rows [][]any
	for j, ind := range r.Raw.Indicators {
		conf := any(blank{})
		if ind.Weight != nil && r.Weights.Method == config.Explicit {
			conf = float64(*ind.Weight)
		}
		rows = append(rows, []any{ind.Name, labelOf(ind), string(ind.Measure), eventsUsed(ind), betterText(ind),
			string(r.Config.NormMethod(j)), conf, r.Weights.W[j]})
	}
	w.table(s, cols, rows)
	row := len(rows) + 3
	w.str(s, cell(1, row), "Weighting: "+weightingText(r))
	w.style(s, cell(1, row), cell(1, row), w.bold)
	if a := r.Weights.AHP; a != nil {
		row += 2
		w.str(s, cell(1, row), "AHP consistency (Saaty 1980)")
		w.style(s, cell(1, row), cell(1, row), w.bold)
		for _, kv := range []struct {
			k string
			v float64
		}{{"λmax (principal eigenvalue)", a.LambdaMax}, {"CI = (λmax − n)/(n − 1)", a.CI}, {"RI (random index for n)", a.RI},
			{"CR = CI/RI", a.CR}, {"Largest CR accepted (max_cr)", r.Config.Weighting.AHP.MaxCR}} {
			row++
			w.str(s, cell(1, row), kv.k)
			w.value(s, cell(2, row), kv.v)
			w.style(s, cell(2, row), cell(2, row), w.num[fmt4])
		}
		row += 2
		w.str(s, cell(1, row), "Pairwise comparison matrix (row indicator compared with column indicator, Saaty's 1–9 scale)")
		w.style(s, cell(1, row), cell(1, row), w.bold)
		order := r.Config.Weighting.AHP.Order
		row++
		for j, name := range order {
			w.str(s, cell(j+2, row), name)
		}
		w.style(s, cell(2, row), cell(len(order)+1, row), w.header)
		for i, name := range order {
			row++
			w.str(s, cell(1, row), name)
			w.style(s, cell(1, row), cell(1, row), w.header)
			for j, x := range r.Config.Weighting.AHP.Matrix[i] {
				w.value(s, cell(j+2, row), float64(x))
			}
			w.style(s, cell(2, row), cell(len(order)+1, row), w.num[fmt3])
			w.value(s, cell(len(order)+3, row), a.Weights[i])
		}
	}
}

func eventsUsed(ind config.Indicator) string {
	if !ind.Measure.FromEvents() {
		return ""
	}
	k, v := "all kinds", "all variables"
	if len(ind.Kinds) > 0 {
		k = strings.Join(ind.Kinds, ", ")
	}
	if len(ind.Variables) > 0 {
		v = strings.Join(ind.Variables, ", ")
	}
	return k + "; " + v
}

func betterText(ind config.Indicator) string {
	b := ind.Better
	if b == "" {
		if ind.Measure.FromEvents() {
			b = config.Lower
		} else {
			b = config.Higher
		}
	}
	if ind.Normalize == config.TargetN {
		return "closer to the target is better"
	}
	if b == config.Lower {
		return "less resilient"
	}
	return "more resilient"
}

// excelDate is the spreadsheet serial day of d (days since 1899-12-30).
func excelDate(d calendar.Date) float64 { return float64(d) + 25569 }

func (w *writer) events() {
	const s = SheetEvents
	r := w.r
	units := map[string]string{}
	for _, v := range r.Config.Variables {
		units[v.Name] = v.CanonicalUnits()
	}
	evs := r.Events.Events
	idx := make([]int, len(evs))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int {
		ea, eb := &evs[a], &evs[b]
		return cmp.Or(strings.Compare(ea.Station, eb.Station), cmp.Compare(ea.Start, eb.Start),
			strings.Compare(ea.ID, eb.ID), strings.Compare(ea.Variable, eb.Variable))
	})
	cols := []column{{"Station", 11, fmtText}, {"Event", 16, fmtText}, {"Kind", 10, fmtText}, {"Variable", 22, fmtText},
		{"Start", 11, fmtDate}, {"End", 11, fmtDate}, {"Peak departure (variable units)", 13, fmt2}, {"Units", 8, fmtText},
		{"Recovery (days after the end)", 12, fmtInt}, {"Recovered", 10, fmtText}, {"Antecedent dryness", 11, fmt3},
		{"Severity class (0 unrated, 1 moderate – 4 extreme)", 12, fmtInt}, {"Severity", 10, fmtText},
		{"Driver intensity", 10, fmt3}, {"Censored by", 12, fmtText}}
	var rows [][]any
	for _, k := range idx[:min(len(idx), MaxEventRows)] {
		e := &evs[k]
		rec := "yes"
		if !e.Recovered {
			rec = "no (censored)"
		}
		rows = append(rows, []any{e.Station, e.ID, e.Kind, e.Variable, excelDate(e.Start), excelDate(e.End),
			nanBlank(e.PeakDeparture), units[e.Variable], nanBlank(e.RecoveryDays), rec, nanBlank(e.Dryness),
			e.Severity, index.SeverityNames[min(max(e.Severity, 0), 4)], nanBlank(e.DriverIntensity), e.Censor})
	}
	w.table(s, cols, rows)
	if len(evs) > MaxEventRows {
		note := fmt.Sprintf("The table has %d rows; the first %d (by station and start) are shown. The whole table is in %s.", len(evs), MaxEventRows, r.Events.File)
		w.str(s, cell(len(cols)+2, 1), note)
	}
}

// severity lists every station's events by kind and class, and how many
// events each event indicator counted.
func (w *writer) severity() {
	const s = SheetSeverity
	r := w.r
	cols := []column{{"Station", 11, fmtText}}
	for _, k := range report.SeverityKinds {
		for _, c := range index.SeverityNames[1:] {
			cols = append(cols, column{k + " " + c, 9, fmtInt})
		}
		cols = append(cols, column{k + " unrated", 9, fmtInt})
	}
	var js []int
	for j, ind := range r.Raw.Indicators {
		if ind.Measure.FromEvents() {
			js = append(js, j)
			cols = append(cols, column{ind.Name + ": events counted (" + report.FloorText(r, j) + ")", 14, fmtInt})
		}
	}
	cols = append(cols, column{"Recoveries censored: end of record", 11, fmtInt}, column{"censored: data gap", 11, fmtInt},
		column{"censored: next event", 11, fmtInt})
	var rows [][]any
	for _, i := range r.Result.Order {
		row := []any{r.Raw.Stations[i]}
		for _, k := range report.SeverityKinds {
			c := r.Raw.BySeverity[i][k]
			row = append(row, c[1], c[2], c[3], c[4], c[0])
		}
		for _, j := range js {
			row = append(row, r.Raw.Used[i][j])
		}
		cens := r.Raw.Censored[i]
		row = append(row, cens["record_end"], cens["gap"], cens["next_event"])
		rows = append(rows, row)
	}
	w.table(s, cols, rows)
}

func (w *writer) criteria() {
	const s = SheetCriteria
	r := w.r
	name := map[string]string{}
	for _, st := range r.Attrs.Stations {
		name[st.ID] = st.Name
	}
	cols := []column{{"Station", 11, fmtText}, {"Name", 30, fmtText}, {"Criterion", 22, fmtText}, {"Limit (°C)", 9, fmt2},
		{"Weekly statistic", 22, fmtText}, {"Days with a weekly value", 11, fmtInt}, {"Days above the limit", 10, fmtInt},
		{"Exceedance events", 11, fmtInt}, {"Reliability (share of days at or below)", 13, fmt3},
		{"Resilience (recoveries per day above)", 13, fmt3}, {"Vulnerability (mean event peak excess, °C)", 14, fmt2},
		{"Largest excess (°C)", 10, fmt2}, {"Highest weekly value (°C)", 11, fmt2}, {"Week ending", 11, fmtDate}}
	var rows [][]any
	for _, st := range r.Stations {
		c := st.Criteria
		if c == nil {
			continue
		}
		for _, p := range c.Criteria {
			maxDate := any(blank{})
			if !math.IsNaN(c.Max) {
				maxDate = excelDate(c.MaxDate)
			}
			rows = append(rows, []any{st.ID, name[st.ID], p.Name, p.Limit, string(c.Basis), p.Days, p.DaysAbove, p.Events,
				nanBlank(p.Reliability), nanBlank(p.Resilience), nanBlank(p.Vulnerability), nanBlank(p.MaxExcess), nanBlank(c.Max), maxDate})
		}
	}
	w.table(s, cols, rows)
}

func (w *writer) inputs() {
	const s = SheetInputs
	cols := []column{{"Role", 22, fmtText}, {"Path", 50, fmtText}, {"SHA-256", 66, fmtText}, {"Bytes", 12, fmtInt},
		{"Rows read", 10, fmtInt}, {"Rows rejected", 10, fmtInt}, {"Notes", 50, fmtText}}
	var rows [][]any
	for _, in := range w.r.Inputs {
		rows = append(rows, []any{in.Role, in.Path, in.SHA256, int(in.Bytes), in.Rows, in.Rejected, strings.Join(in.Notes, "; ")})
	}
	w.table(s, cols, rows)
	if sum := w.r.SeriesSummary; sum != nil {
		row := len(rows) + 3
		w.str(s, cell(1, row), "Daily records")
		w.style(s, cell(1, row), cell(1, row), w.bold)
		row++
		w.str(s, cell(1, row), fmt.Sprintf("%d rows of %d stations read from %d files", sum.Rows, sum.Stations, len(sum.Files)))
		for _, v := range slices.Sorted(maps.Keys(sum.Skipped)) {
			row++
			w.str(s, cell(1, row), fmt.Sprintf("%d rows of variable %q skipped: no [[variable]] table names it", sum.Skipped[v], v))
		}
		for _, id := range sum.Unknown {
			row++
			w.str(s, cell(1, row), fmt.Sprintf("station %s is in the daily records but not in the attribute table; skipped", id))
		}
	}
}

func (w *writer) warnings() {
	cols := []column{{"#", 6, fmtInt}, {"Warning", 120, fmtText}}
	var rows [][]any
	for i, e := range w.r.Warnings {
		rows = append(rows, []any{i + 1, e.Error()})
	}
	w.table(SheetWarnings, cols, rows)
}
