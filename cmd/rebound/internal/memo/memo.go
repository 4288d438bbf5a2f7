package memo

import (
	"fmt"
	"maps"
	"math"
	"slices"
	"strings"

	"rebound/cmd/rebound/internal/charts"
	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/cmd/rebound/internal/view"
	"rebound/config"
)

// Figure names, relative to the output folder.
const (
	FigScores     = "figures/scores.png"
	FigTornado    = "figures/tornado.png"
	FigDendrogram = "figures/dendrogram.png"
	FigProfiles   = "figures/profiles.png"
	FigDeparture  = "figures/departure.png"
)

// TableMax is the most stations the ranking table lists; with more it
// lists the first and last TableMax/2.
const TableMax = 40

// Render returns the memo of a finished run and its figures, keyed by
// their names relative to the output folder (FigScores, ...).
func Render(r *pipeline.Run, man *report.Manifest) (memo []byte, figures map[string][]byte, err error) {
	return render(r, man, view.Of(r))
}

func render(r *pipeline.Run, man *report.Manifest, e view.Extras) ([]byte, map[string][]byte, error) {
	m := &writer{r: r, man: man, e: e, figs: map[string][]byte{}}
	for _, section := range []func() error{m.head, m.purpose, m.data, m.method, m.ranking, m.severity, m.robustness, m.clusters, m.findings, m.limitations} {
		if err := section(); err != nil {
			return nil, nil, err
		}
	}
	return []byte(m.b.String()), m.figs, nil
}

type writer struct {
	r    *pipeline.Run
	man  *report.Manifest
	e    view.Extras
	b    strings.Builder
	figs map[string][]byte
}

func (m *writer) p(format string, args ...any) {
	fmt.Fprintf(&m.b, format, args...)
}

// para writes a paragraph on one line (a wrapped line could begin with
// text that Markdown reads as a list or heading, such as "32.").
func (m *writer) para(format string, args ...any) {
	m.b.WriteString(fmt.Sprintf(format, args...))
	m.b.WriteString("\n\n")
}

func (m *writer) figure(name, alt string, data []byte, err error) error {
	if err == charts.ErrNoData {
		return nil
	}
	if err != nil {
		return fmt.Errorf("%s: %w", name, err)
	}
	m.figs[name] = data
	m.p("![%s](%s)\n\n", esc(alt), name)
	return nil
}

func (m *writer) title() string {
	if t := m.r.Config.Title; t != "" {
		return t
	}
	return "Resilience screening"
}

func (m *writer) head() error {
	m.p("# %s\n\n", esc(m.title()))
	m.p("Planning memo prepared with rebound %s on %s from the configuration %s (seed %d).\n\n",
		esc(m.man.Version), m.man.RunDate, code(base(m.man.ConfigFile)), m.man.Seed)
	m.p("> **Screening aid, not a regulatory determination.** %s\n\n", esc(strings.TrimPrefix(report.Caution, "Screening aid, not a regulatory determination. ")))
	return nil
}

func (m *writer) purpose() error {
	r := m.r
	m.p("## Purpose\n\n")
	kinds := eventKinds(r)
	if len(kinds) == 0 {
		m.para("This memo ranks %s by indicators of the resilience of their water quality (%s). The ranking compares the stations with each other to help decide where to look first; it is not a measure of absolute condition.",
			count(len(r.Attrs.Stations), "station"), m.indicatorNames())
		return nil
	}
	m.para("This memo ranks %s by the resilience of their water quality to %s: how far it departs from normal, how quickly it recovers, and how much a dry spell beforehand makes things worse, together with any basin attributes chosen as indicators. The ranking compares the stations with each other to help decide where to look first; it is not a measure of absolute condition.",
		count(len(r.Attrs.Stations), "station"), joinAnd(kindWords(kinds)))
	return nil
}

func (m *writer) indicatorNames() string {
	names := make([]string, len(m.r.Raw.Indicators))
	for j, ind := range m.r.Raw.Indicators {
		names[j] = code(ind.Name)
	}
	return joinAnd(names)
}

func (m *writer) data() error {
	r := m.r
	m.p("## Data used\n\n")
	attr := "the attribute table"
	for _, in := range r.Inputs {
		if in.Role == "attributes" {
			attr = code(base(in.Path))
		}
	}
	m.p("- Stations: %s from %s; %d with a score.\n", count(len(r.Attrs.Stations), "station"), attr, m.man.Scored)
	if sum := r.SeriesSummary; sum != nil {
		m.p("- Daily records: %d rows from %s, for %s of the attribute table.\n", sum.Rows, count(len(sum.Files), "file"), count(len(r.Stations), "station"))
	}
	if ev := r.Events; ev != nil && len(ev.Events) > 0 {
		ids := map[string]map[string]bool{}
		first, last := ev.Events[0].Start, ev.Events[0].End
		for _, e := range ev.Events {
			if ids[e.Kind] == nil {
				ids[e.Kind] = map[string]bool{}
			}
			ids[e.Kind][e.ID] = true
			first, last = min(first, e.Start), max(last, e.End)
		}
		var parts []string
		for _, k := range slices.Sorted(maps.Keys(ids)) {
			parts = append(parts, fmt.Sprintf("%d %s", len(ids[k]), plural(len(ids[k]), kindWord(k))))
		}
		source := "the events table " + code(base(ev.File))
		if ev.File == pipeline.DerivedFile {
			source = "events derived from the daily records"
		}
		m.p("- Events: %s of response (one per station, event and variable) from %s, between %s and %s: %s.\n",
			count(len(ev.Events), "row"), source, first, last, strings.Join(parts, ", "))
	} else {
		m.p("- Events: none; the indicators of this run are basin attributes or criteria only.\n")
	}
	m.p("- Every input file, with its SHA-256 digest and the rows read, is listed in `run.json` and on the workbook's Inputs sheet.\n\n")
	return nil
}

func (m *writer) method() error {
	r := m.r
	cfg := r.Config
	m.p("## Method in brief\n\n")
	if r.Result.Spec.Bounded() {
		m.para("Each station gets one value per indicator. The values are rescaled to a common 0–1 scale (%s, over %s) so that higher always means more resilient, weighted (%s), and combined by %s into a score from 0 to 100. Rank 1 is the most resilient station.",
			normWords(cfg), scopeWords(cfg.Normalization.Scope), weightWords(r), aggWords(cfg))
	} else {
		m.para("Each station gets one value per indicator. The values are put on a common scale (%s, over %s) so that higher always means more resilient, weighted (%s), and combined by %s; the results are rescaled so that the best station scores 100 and the worst 0. Rank 1 is the most resilient station.",
			normWords(cfg), scopeWords(cfg.Normalization.Scope), weightWords(r), aggWords(cfg))
	}
	m.p("| Indicator | What it measures | Weight |\n|---|---|---:|\n")
	for j, ind := range r.Raw.Indicators {
		label := ind.Label
		if label == "" {
			label = string(ind.Measure)
		}
		m.p("| %s | %s | %.3f |\n", esc(ind.Name), esc(label), r.Weights.W[j])
	}
	m.p("\n")
	switch cfg.Missing.Policy {
	case config.Impute:
		m.para("A station missing an indicator takes the median of its normalisation group for it (flag `imputed:`).")
	case config.ErrorPolicy:
	default:
		m.para("A station missing an indicator is scored on the others, with their weights rescaled to sum to one (flag `missing:`).")
	}
	if r.Events != nil {
		if cfg.Comparison.Basis == config.BasisShared {
			m.para("Basis of comparison: shared events. Each station is scored only on the disturbances that also reached at least %s of the compared stations on the same days (the regional events: %d found), so every station is measured on the same storms, droughts and heat waves.",
				pct(cfg.Comparison.MinShare), len(r.Raw.Regional))
		} else {
			m.para("Basis of comparison: each station's own events. Stations may have faced disturbances of different strength; the severity floors below, and the per-degree response where it is an indicator, keep the comparison like for like.")
		}
	}
	m.para("The workbook's Method sheet gives every formula with the values this run used.")
	return nil
}

// pct writes a share as a percentage.
func pct(x float64) string { return fmt.Sprintf("%.0f%%", 100*x) }

func (m *writer) ranking() error {
	r, res, sv := m.r, m.r.Result, m.e.Sensitivity
	m.p("## Ranking\n\n")
	var bars []charts.Score
	for _, i := range res.Order {
		s := charts.Score{Label: r.Attrs.Stations[i].ID + " " + r.Attrs.Stations[i].Name, Score: res.Score[i], Rank: res.Rank[i]}
		if sv != nil && sv.Low[i] > 0 {
			s.Low, s.High = sv.Low[i], sv.High[i]
		}
		bars = append(bars, s)
	}
	interval := ""
	if sv != nil {
		interval = sv.Interval
	}
	data, err := charts.Scores(bars, interval)
	alt := "Score of each station in rank order"
	if sv != nil {
		alt += ", with its rank interval under varied weights"
	}
	if err := m.figure(FigScores, alt, data, err); err != nil {
		return err
	}
	order := res.Order
	shown := order
	cut := -1
	if len(order) > TableMax {
		shown = append(slices.Clone(order[:TableMax/2]), order[len(order)-TableMax/2:]...)
		cut = TableMax / 2
	}
	m.p("| Rank | Station | Name | Score |")
	if sv != nil {
		m.p(" Rank interval |")
	}
	if m.e.Clusters != nil {
		m.p(" Cluster |")
	}
	m.p(" Flags |\n|---:|---|---|---:|")
	if sv != nil {
		m.p("---:|")
	}
	if m.e.Clusters != nil {
		m.p("---:|")
	}
	m.p("---|\n")
	for k, i := range shown {
		if k == cut {
			m.p("| … | %d stations not listed | | |", len(order)-TableMax)
			if sv != nil {
				m.p(" |")
			}
			if m.e.Clusters != nil {
				m.p(" |")
			}
			m.p(" |\n")
		}
		st := r.Attrs.Stations[i]
		score := "–"
		if !math.IsNaN(res.Score[i]) {
			score = fmt.Sprintf("%.1f", res.Score[i])
		}
		m.p("| %d | %s | %s | %s |", res.Rank[i], esc(st.ID), esc(st.Name), score)
		if sv != nil {
			if sv.Low[i] > 0 {
				m.p(" %d–%d |", sv.Low[i], sv.High[i])
			} else {
				m.p(" – |")
			}
		}
		if c := m.e.Clusters; c != nil {
			if c.Labels[i] >= 0 {
				m.p(" %d |", c.Labels[i]+1)
			} else {
				m.p(" – |")
			}
		}
		m.p(" %s |\n", esc(strings.Join(res.Flags[i], ", ")))
	}
	m.p("\n")
	if len(order) > TableMax {
		m.para("The full ranking is in `ranking.csv` and on the workbook's Ranking sheet.")
	}
	if flags := flagWords(res.Flags); flags != "" {
		m.para("Flags: %s.", flags)
	}
	return nil
}

// severity says how many events of each class every listed station had
// and which of them each event indicator counted.
func (m *writer) severity() error {
	r := m.r
	if r.Events == nil || !r.Raw.SeverityKnown || r.Config.Events == nil {
		return nil
	}
	var js []int
	for j, ind := range r.Raw.Indicators {
		if ind.Measure.FromEvents() {
			js = append(js, j)
		}
	}
	if len(js) == 0 {
		return nil
	}
	m.p("## Disturbances by severity\n\n")
	m.para("Every derived event has a severity class: heat waves by the category of Hobday et al. (2018), floods by the return period of their peak in a GEV fitted by L-moments to the station's annual maxima (strong from %s years), droughts by the rank of their deficit and duration among the station's droughts (strong from a non-exceedance probability of %s). The counts below are moderate/strong/severe/extreme. The event indicators count:",
		report.Num(r.Config.Events.Flood.SeverityReturnPeriods[0]), report.Num(r.Config.Events.Drought.SeverityProbabilities[0]))
	for _, j := range js {
		m.p("- %s: %s;\n", r.Raw.Indicators[j].Name, report.FloorText(r, j))
	}
	m.p("\n")
	m.p("| Station | Heat waves | Droughts | Floods |")
	for _, j := range js {
		m.p(" %s (events) |", esc(r.Raw.Indicators[j].Name))
	}
	m.p("\n|---|---|---|---|")
	for range js {
		m.p("---:|")
	}
	m.p("\n")
	order := r.Result.Order
	shown := order
	if len(order) > TableMax {
		shown = append(slices.Clone(order[:TableMax/2]), order[len(order)-TableMax/2:]...)
	}
	for _, i := range shown {
		m.p("| %s |", esc(r.Raw.Stations[i]))
		for _, k := range report.SeverityKinds {
			m.p(" %s |", report.SeverityCounts(r, i, k))
		}
		for _, j := range js {
			m.p(" %d |", r.Raw.Used[i][j])
		}
		m.p("\n")
	}
	m.p("\n")
	m.para("The workbook's Severity sheet lists every station; its Events sheet and events.csv give each event's class and the numbers it rests on.")
	return nil
}

func (m *writer) robustness() error {
	r, sv := m.r, m.e.Sensitivity
	m.p("## How far the ranking depends on the weights\n\n")
	if sv == nil && r.SensitivitySkipped != "" {
		m.para("The weight sensitivity analysis was skipped: %s. Read the ranking as a first look only.", esc(r.SensitivitySkipped))
		return nil
	}
	if sv == nil {
		m.para("No weight sensitivity analysis was run, so how far this ranking depends on the chosen weights is not known. Differences of a few score points between neighbouring stations should not be read as real differences; add a `[sensitivity]` section to the configuration to measure it.")
		return nil
	}
	byClass := map[string][]string{}
	for _, i := range r.Result.Order {
		byClass[sv.Stability[i]] = append(byClass[sv.Stability[i]], r.Attrs.Stations[i].ID)
	}
	agree := ""
	if !math.IsNaN(sv.Spearman) {
		agree = fmt.Sprintf("; the rankings agree closely with the configured one when the mean Spearman correlation (here %.3f) is near 1", sv.Spearman)
	}
	m.para("The weights were varied at random around the configured ones (%d weight vectors) and every station ranked under each. The rank interval in the table above runs from the %s%s.",
		sv.Samples, strings.Replace(sv.Interval, "–", " to the ", 1), agree)
	if len(r.Raw.Indicators) == 1 {
		m.para("With a single indicator, whose weight is always 1, the weights cannot change the ranking.")
	}
	top, bottom := byClass["robust-top"], byClass["robust-bottom"]
	among := func(word string) string {
		if sv.TopN == 1 {
			return "the " + word
		}
		return fmt.Sprintf("among the %d %s", sv.TopN, word)
	}
	if len(top) > 0 {
		m.para("Robustly %s, whatever the weights: %s.", among("most resilient"), listIDs(top))
	} else {
		m.para("No station stays %s under every weighting.", among("most resilient"))
	}
	if len(bottom) > 0 {
		m.para("Robustly %s: %s. These are the first candidates for a closer look.", among("least resilient"), listIDs(bottom))
	} else {
		m.para("No station stays %s under every weighting.", among("least resilient"))
	}
	if dep := byClass["weight-dependent"]; len(dep) > 0 {
		m.para("Their place depends on the weighting (the rank interval spans more than %s): %s. Read their ranks as approximate and agree the weights before acting on them.", count(sv.TopN, "rank"), listIDs(dep))
	} else {
		m.para("No station's place depends strongly on the weighting: every rank interval spans at most %s.", count(sv.TopN, "rank"))
	}
	if len(sv.Swings) > 0 {
		var sw []charts.Swing
		for _, s := range sv.Swings {
			sw = append(sw, charts.Swing{Label: s.Indicator, Down: s.Down, Up: s.Up})
		}
		step := fmt.Sprintf("±%g %%", 100*sv.Step)
		data, err := charts.Tornado(sw, step)
		if err := m.figure(FigTornado, "Largest rank change of any station when one weight moves by "+step, data, err); err != nil {
			return err
		}
		lead := sv.Swings[0] // the one that moves the ranking most
		if nz(lead.Down)+nz(lead.Up) == 0 {
			m.para("Moving any one weight by %s changes no station's rank.", step)
		} else {
			m.para("Moving one weight at a time by %s, the ranking is most sensitive to %s: lowering it moves a station by up to %s, raising it by up to %s.",
				step, code(lead.Indicator), count(int(nz(lead.Down)), "rank"), count(int(nz(lead.Up)), "rank"))
		}
	}
	return nil
}

func (m *writer) clusters() error {
	r, c := m.r, m.e.Clusters
	if c == nil {
		return nil
	}
	m.p("## Groups of stations that behave alike\n\n")
	feats := " (" + esc(strings.Join(c.Features, ", ")) + ")"
	if len(c.Features) > 6 {
		feats = " (listed on the workbook's Clusters sheet)"
	}
	m.para("The stations were grouped by %s of their records%s into %d clusters (%s). The groups describe how the stations behave; they are not a second ranking.",
		count(len(c.Features), "feature"), feats, c.K, esc(c.Method))
	for k, p := range c.Profiles {
		members := c.Members(k)
		ids := make([]string, len(members))
		scores := make([]float64, 0, len(members))
		for q, i := range members {
			ids[q] = r.Attrs.Stations[i].ID
			if s := r.Result.Score[i]; !math.IsNaN(s) {
				scores = append(scores, s)
			}
		}
		desc := p.Description
		if desc == "" {
			desc = "no distinctive feature"
		}
		mean := ""
		if len(scores) > 0 {
			sum := 0.0
			for _, s := range scores {
				sum += s
			}
			mean = fmt.Sprintf(" Mean score %.1f.", sum/float64(len(scores)))
		}
		m.p("- **Cluster %d** (%s): %s.%s Stations: %s.\n", k+1, count(p.Size, "station"), esc(desc), mean, listIDs(ids))
	}
	m.p("\n")
	if c.Tree != nil {
		labels := make([]string, c.Tree.N)
		for q := range labels {
			if c.TreeStations != nil {
				labels[q] = r.Attrs.Stations[c.TreeStations[q]].ID
			} else {
				labels[q] = fmt.Sprintf("group %d", q+1) // the items are first-stage groups
			}
		}
		data, err := charts.Dendrogram(c.Tree, labels, c.K, "linkage distance ("+c.Linkage+", scaled features)")
		if err := m.figure(FigDendrogram, "Dendrogram of the stations with the cut into clusters", data, err); err != nil {
			return err
		}
	}
	var profs []charts.Profile
	for k, p := range c.Profiles {
		profs = append(profs, charts.Profile{Label: charts.ProfileLabel(k, p.Size, p.Description), Z: p.Centroid})
	}
	data, err := charts.Profiles(c.Features, profs)
	return m.figure(FigProfiles, "Mean standardised features of each cluster", data, err)
}
