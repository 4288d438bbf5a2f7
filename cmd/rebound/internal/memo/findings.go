package memo

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"
	"unicode"
	"unicode/utf8"

	"rebound/cmd/rebound/internal/charts"
	"rebound/cmd/rebound/internal/report"
	"rebound/config"
)

// extremes returns the stations with the n largest and n smallest values
// of indicator j (ties by station identifier), and how many have a value.
func (m *writer) extremes(j, n int) (high, low []int, present int) {
	raw := m.r.Raw
	var idx []int
	for i := range raw.Stations {
		if !math.IsNaN(raw.Values[i][j]) {
			idx = append(idx, i)
		}
	}
	slices.SortStableFunc(idx, func(a, b int) int {
		return cmp.Or(cmp.Compare(raw.Values[b][j], raw.Values[a][j]), cmp.Compare(raw.Stations[a], raw.Stations[b]))
	})
	k := min(n, len(idx)/2)
	if len(idx) == 1 {
		return idx, nil, 1
	}
	high = idx[:k]
	low = reverse(idx[len(idx)-k:])
	return high, low, len(idx)
}

func reverse(xs []int) []int {
	out := slices.Clone(xs)
	slices.Reverse(out)
	return out
}

func (m *writer) valueList(j int, idx []int) string {
	raw := m.r.Raw
	parts := make([]string, len(idx))
	for q, i := range idx {
		parts[q] = fmt.Sprintf("%s (%s)", esc(raw.Stations[i]), num(raw.Values[i][j]))
	}
	return joinAnd(parts)
}

// spread says which stations have the highest and the lowest values of
// indicator j, with format (two %s verbs, for high and low), or which
// station alone has a value.
func (m *writer) spread(j int, high, low []int, format string) string {
	if len(low) == 0 {
		return "only " + m.valueList(j, high) + " has a value"
	}
	return fmt.Sprintf(format, m.valueList(j, high), m.valueList(j, low))
}

// upperFirst raises the first letter of s.
func upperFirst(s string) string {
	r, n := utf8.DecodeRuneInString(s)
	if n == 0 {
		return s
	}
	return string(unicode.ToUpper(r)) + s[n:]
}

// num formats x with three significant digits, without trailing zeros
// after a decimal point.
func num(x float64) string {
	s := fmt.Sprintf("%.3g", x)
	if strings.Contains(s, ".") && !strings.ContainsAny(s, "eE") {
		s = strings.TrimSuffix(strings.TrimRight(s, "0"), ".")
	}
	return s
}

func (m *writer) findings() error {
	r := m.r
	m.p("## Heat waves, droughts and recovery\n\n")
	said := false
	for j, ind := range r.Raw.Indicators {
		// about is "(label, indicator name)", or "(indicator name)"
		// for an indicator without a label.
		about := "(indicator " + code(ind.Name) + ")"
		if ind.Label != "" {
			about = "(" + esc(lowerFirst(ind.Label)) + ", indicator " + code(ind.Name) + ")"
		}
		high, low, n := m.extremes(j, 3)
		if n == 0 {
			continue
		}
		switch {
		case ind.Measure == config.Magnitude && slices.Contains(ind.Kinds, "heatwave"):
			m.para("Heat waves %s: %s.", about, m.spread(j, high, low, "the largest values are at %s; the smallest at %s"))
		case ind.Measure == config.Magnitude && len(ind.Kinds) > 0:
			m.para("%s (indicator %s): %s.", esc(cmp.Or(ind.Label, ind.Name)), code(ind.Name), m.spread(j, high, low, "the largest values are at %s; the smallest at %s"))
		case ind.Measure == config.MemoryM:
			pos := 0
			for i := range r.Raw.Stations {
				if v := r.Raw.Values[i][j]; !math.IsNaN(v) && v > 0 {
					pos++
				}
			}
			m.para("Drought memory %s: at %d of the %s with enough events, a drier spell beforehand made the same kind of disturbance do more harm (a positive slope). %s.",
				about, pos, count(n, "station"), upperFirst(m.spread(j, high, low, "the strongest memory is at %s; the weakest at %s")))
		case ind.Measure == config.Recovery:
			rmst := 0
			for i := range r.Raw.Stations {
				if r.Raw.Fallback[i][j] {
					rmst++
				}
			}
			extra := ""
			if rmst > 0 {
				extra = fmt.Sprintf(" At %s, too many events had not recovered for a median, and the restricted mean is used instead (flag `km_rmst`).", count(rmst, "station"))
			}
			m.para("Recovery %s: %s.%s", about, m.spread(j, high, low, "the slowest are %s; the quickest %s"), extra)
		default:
			continue
		}
		said = true
	}
	if !said {
		m.para("The indicators of this run include no heat-wave, drought or recovery measure, so there are no event findings to report.")
	}
	return m.departure()
}

// departure draws the record of the least resilient station that has one
// around its most harmful event.
func (m *writer) departure() error {
	r := m.r
	byID := map[string]int{}
	for k, s := range r.Stations {
		if s.Focus != nil && len(s.Focus.Observed) > 0 {
			byID[s.ID] = k
		}
	}
	order := r.Result.Order
	for p := len(order) - 1; p >= 0; p-- {
		i := order[p]
		k, ok := byID[r.Attrs.Stations[i].ID]
		if !ok || math.IsNaN(r.Result.Score[i]) {
			continue
		}
		f := r.Stations[k].Focus
		st := r.Attrs.Stations[i]
		units := ""
		if v, ok := r.Config.Variable(f.Variable); ok {
			units = v.CanonicalUnits()
		}
		w := charts.Window{Station: st.ID + " " + st.Name, Variable: strings.ReplaceAll(f.Variable, "_", " "), Units: units,
			Event: kindWord(f.Kind) + " " + f.EventID, First: f.First, Observed: f.Observed, Normal: f.Normal,
			Tolerance: f.Tolerance, Start: f.Start, End: f.End, Recovered: f.Recovered, RecoveryDays: f.RecoveryDays}
		data, err := charts.Departure(w)
		rec := fmt.Sprintf("it was back within normal ± %s %s %s after the event ended", num(f.Tolerance), units, count(f.RecoveryDays, "day"))
		if !f.Recovered {
			rec = fmt.Sprintf("it had not come back within normal ± %s %s %s after the event ended", num(f.Tolerance), units, count(f.RecoveryDays, "day"))
		}
		m.para("The figure shows the least resilient station with daily records, %s (rank %d), around its most harmful event: the %s of %s to %s. Its %s departed from normal by up to %s %s, and %s.",
			esc(st.ID+" "+st.Name), r.Result.Rank[i], kindWord(f.Kind), f.Start, f.End, strings.ReplaceAll(f.Variable, "_", " "), num(math.Abs(f.PeakDeparture)), units, rec)
		return m.figure(FigDeparture, "Daily record around the most harmful event of "+st.ID, data, err)
	}
	return nil
}

func (m *writer) limitations() error {
	r := m.r
	m.p("## Limitations\n\n")
	m.p("- The ranking is relative: it compares these stations with each other under these indicators and weights, and changes when any of them changes.\n")
	if len(eventKinds(r)) > 0 {
		m.p("- Indicators summarise the disturbances in the record; a station with a short record or few events has a less certain value.\n")
	}
	counts := map[string]int{}
	for _, fl := range r.Result.Flags {
		for _, f := range fl {
			kind, _, _ := strings.Cut(f, ":")
			counts[kind]++
		}
	}
	if n := counts["few_events"]; n > 0 {
		m.p("- %s fewer than %d events (flag `few_events`); read their scores with care.\n", countHave(n, "station"), r.Config.Missing.MinEvents)
	}
	if n := counts["missing"] + counts["imputed"]; n > 0 {
		verb := "are"
		if n == 1 {
			verb = "is"
		}
		m.p("- %s %s missing (flags `missing:` and `imputed:`); those stations are scored on fewer indicators or on imputed values.\n", count(n, "indicator value"), verb)
	}
	if m.e.Sensitivity == nil {
		m.p("- The sensitivity of the ranking to the weights was not measured in this run.\n")
	}
	if len(r.Warnings) > 0 {
		m.p("- The run gave %s:\n", count(len(r.Warnings), "warning"))
		for k, w := range r.Warnings {
			if k == 10 {
				m.p("  - … and %d more, listed in `run.json` and on the workbook's Warnings sheet.\n", len(r.Warnings)-10)
				break
			}
			m.p("  - %s\n", esc(w.Error()))
		}
	}
	m.p("\n## Cautions\n\n")
	m.para("%s This memo supports screening and the planning of further study; it does not determine compliance with any standard. Check every station of interest against the water-quality standards that apply locally, and have a licensed professional review the findings before any decision rests on them.", esc(report.Caution))
	return nil
}
