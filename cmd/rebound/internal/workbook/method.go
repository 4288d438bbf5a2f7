package workbook

import (
	"fmt"
	"math"
	"strings"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/config"
)

func weightingText(r *pipeline.Run) string {
	switch r.Weights.Method {
	case config.Equal:
		return fmt.Sprintf("equal: each of the %d indicators weighs 1/%d", len(r.Weights.W), len(r.Weights.W))
	case config.AHPW:
		a := r.Weights.AHP
		return fmt.Sprintf("AHP: principal eigenvector of the pairwise comparison matrix (Saaty 1980); consistency ratio %.3f (limit %g)", a.CR, r.Config.Weighting.AHP.MaxCR)
	}
	return "explicit: the configured weights divided by their sum"
}

func normText(cfg *config.Config) string {
	methods := map[config.NormMethod]bool{}
	for j := range cfg.Indicators {
		methods[cfg.NormMethod(j)] = true
	}
	if len(methods) > 1 {
		return "per indicator (see the Weights sheet)"
	}
	return string(cfg.Normalization.Method)
}

func scopeText(s config.Scope) string {
	switch s {
	case config.ScopeGroup:
		return "each peer group of the attribute table separately"
	case config.ScopeCluster:
		return "each cluster separately"
	}
	return "all stations together"
}

func aggText(cfg *config.Config) string {
	if cfg.Aggregation.Method == config.Geometric {
		return fmt.Sprintf("geometric: weighted product of (floor + (1 − floor)·v), floor = %g", cfg.Aggregation.Floor)
	}
	return "arithmetic: weighted mean of the normalised values"
}

func missingText(p config.MissingPolicy) string {
	switch p {
	case config.Impute:
		return "impute: a missing value takes the median of the station's normalisation group (flag imputed:<indicator>)"
	case config.ErrorPolicy:
		return "error: any missing value stops the run"
	}
	return "renormalize: a missing indicator is left out at that station and its remaining weights are rescaled to sum 1 (flag missing:<indicator>)"
}

// normFormula is the formula of a normalisation method.
func normFormula(m config.NormMethod) string {
	switch m {
	case config.ZScore:
		return "v = (x − mean)/sd, with the population sd (divisor n); negated when lower is better. No spread: v = 0."
	case config.Rank:
		return "v = (r − 1)/(m − 1), r the mid-rank of x among the m stations with a value, the most resilient ranked m. No spread: v = 0.5."
	case config.TargetN:
		return "v = 1 − d/dmax, d = max(0, |x − target| − tolerance), dmax the largest d. Every d = 0: v = 1."
	}
	return "v = (x − min)/(max − min), or (max − x)/(max − min) when lower is better. No spread: v = 0.5."
}

// measureText says how an indicator's raw value is computed.
func measureText(ind config.Indicator, cfg *config.Config) string {
	sel := eventsUsed(ind)
	switch ind.Measure {
	case config.Magnitude:
		return "median over the station's events (" + sel + ") of s·peak departure, s = +1 when an increase of the variable is harmful and −1 when a decrease is"
	case config.Recovery:
		return "Kaplan–Meier median (Kaplan & Meier 1958) of the days from the end of each event (" + sel + ") to recovery, events not recovered counted as right-censored; when the median is undefined, the restricted mean survival time up to the longest time observed (flag km_rmst)"
	case config.MemoryM:
		return fmt.Sprintf("Theil–Sen slope (Theil 1950; Sen 1968) of s·peak departure against antecedent dryness (%s) over the events (%s) with a known dryness; at least memory.min_events = %d events", cfg.Memory.Dryness, sel, cfg.Memory.MinEvents)
	case config.Frequency:
		return "distinct events (" + sel + ") per year of record (attribute " + cfg.Inputs.RecordYearsColumn + ", or inputs.record_years)"
	case config.Attribute:
		t := ""
		if ind.Transform != "" && ind.Transform != config.NoTransform {
			t = ", " + string(ind.Transform) + "-transformed"
		}
		return "attribute column " + ind.Attribute + t
	case config.CriterionM:
		return "statistic " + string(ind.Statistic) + " of the weekly water temperature against criterion " + ind.Criterion + " (Hashimoto, Stedinger & Loucks 1982)"
	}
	return string(ind.Measure)
}

func (w *writer) method() {
	const s = SheetMethod
	r, cfg, res := w.r, w.r.Config, w.r.Result
	cols := []column{{"Step", 20, fmtText}, {"What was done (formula)", 90, fmtText}, {"Values this run used", 60, fmtText}}
	var rows [][]any
	add := func(step, what, values string) { rows = append(rows, []any{step, what, values}) }

	inputs := make([]string, len(r.Inputs))
	for i, in := range r.Inputs {
		inputs[i] = in.Role + ": " + in.Path
	}
	add("1. Inputs", "Every input file is read and checked; a run with a bad row stops and names the file, line and column. Digests are on the Inputs sheet.", strings.Join(inputs, "\n"))
	switch {
	case cfg.DeriveEvents():
		add("2. Events", "Events are derived from the daily records: a day-of-year normal (climatology) per station and variable, heat waves, droughts and floods found by percentile thresholds of their drivers, and each water-quality variable's peak departure from normal and days to recover into the band normal ± tolerance.", eventRules(cfg))
	case r.Events != nil:
		add("2. Events", "Events are read from the events table: one row per station, event and variable, with the peak departure from normal, days to recovery (censored when not recovered) and antecedent dryness.", fmt.Sprintf("%d rows from %s", len(r.Events.Events), r.Events.File))
	default:
		add("2. Events", "No indicator needs events.", "")
	}
	for j, ind := range r.Raw.Indicators {
		lo, hi, n := math.Inf(1), math.Inf(-1), 0
		for i := range r.Raw.Values {
			if v := r.Raw.Values[i][j]; !math.IsNaN(v) {
				lo, hi, n = math.Min(lo, v), math.Max(hi, v), n+1
			}
		}
		vals := fmt.Sprintf("%d stations with a value", n)
		if n > 0 {
			vals += fmt.Sprintf("; raw range %.4g to %.4g", lo, hi)
		}
		add(fmt.Sprintf("3.%d Indicator %s", j+1, ind.Name), measureText(ind, cfg), vals)
	}
	methods := map[config.NormMethod]bool{}
	for j := range cfg.Indicators {
		methods[cfg.NormMethod(j)] = true
	}
	var forms []string
	for _, m := range config.NormMethods {
		if methods[m] {
			forms = append(forms, string(m)+": "+normFormula(m))
		}
	}
	add("4. Normalisation", "Each indicator is rescaled so that higher means more resilient, over "+scopeText(cfg.Normalization.Scope)+".\n"+strings.Join(forms, "\n"),
		"method "+normText(cfg)+"; the min and max are the raw ranges in step 3 (scope all)")
	add("5. Missing values", missingText(cfg.Missing.Policy), fmt.Sprintf("stations with fewer than missing.min_events = %d events are flagged few_events", cfg.Missing.MinEvents))
	wt := make([]string, len(r.Raw.Indicators))
	for j, ind := range r.Raw.Indicators {
		wt[j] = fmt.Sprintf("%s %.3f", ind.Name, r.Weights.W[j])
	}
	add("6. Weighting", weightingText(r), strings.Join(wt, "; "))
	if cfg.Aggregation.Method == config.Geometric {
		add("7. Aggregation", "C = Π u_j^w'_j over the indicators present, u_j = floor + (1 − floor)·v_j, w'_j = w_j / Σ w_k (present); score = 100·(C − floor)/(1 − floor).", fmt.Sprintf("floor = %g", cfg.Aggregation.Floor))
	} else if res.Spec.Bounded() {
		add("7. Aggregation", "C = Σ w'_j v_j over the indicators present, w'_j = w_j / Σ w_k (present); score = 100·C. A contribution is 100·w'_j·v_j; a station's contributions add up to its score.", "")
	} else {
		add("7. Aggregation", "C = Σ w'_j v_j over the indicators present, w'_j = w_j / Σ w_k (present); with z-scores the score is 100·(C − min C)/(max C − min C) over the stations.", "")
	}
	add("8. Ranking", "Stations are ranked by score, highest first (rank 1 = most resilient); scores within 1e-9 tie and share the better rank (1, 2, 2, 4); stations without a score come last. Ties are listed by station identifier.",
		fmt.Sprintf("%d stations, %d with a score", len(res.Score), w.man.Scored))
	if sv := w.e.Sensitivity; sv != nil {
		add("9. Weight sensitivity", "Monte Carlo: weight vectors drawn from a Dirichlet distribution centred on the weights used; each station's rank interval is the 5th to 95th percentile of its ranks. One at a time: each weight moved by the step, the others rescaled to keep the sum 1. Sobol indices: first-order (Saltelli et al. 2010) and total (Jansen 1999) of the mean absolute rank shift.",
			fmt.Sprintf("%d samples; top and bottom bands of %d stations; step ±%g %%", sv.Samples, sv.TopN, 100*sv.Step))
	}
	if c := w.e.Clusters; c != nil {
		add("10. Clustering", "Stations are grouped by their standardised features (z-scores); "+c.Method+". Profiles give each cluster's mean feature values and describe its standardised centroid in words.",
			fmt.Sprintf("k = %d; features: %s; mean silhouette width %.3f", c.K, strings.Join(c.Features, ", "), c.Silhouette))
	}
	w.table(s, cols, rows)
	for i, row := range rows {
		w.style(s, cell(1, i+2), cell(3, i+2), w.wrap)
		// Spreadsheets do not always grow a row to its wrapped text:
		// set the height from the longest cell.
		lines := 1
		for j, v := range row {
			text, _ := v.(string)
			n := 0
			for _, line := range strings.Split(text, "\n") {
				per := max(1, int(cols[j].Width*1.1))
				n += max(1, (len([]rune(line))+per-1)/per)
			}
			lines = max(lines, n)
		}
		w.set(w.f.SetRowHeight(s, i+2, float64(15*lines)))
	}
}

func eventRules(cfg *config.Config) string {
	e := cfg.Events
	if e == nil {
		return ""
	}
	var parts []string
	if e.Heatwave.Enabled {
		parts = append(parts, fmt.Sprintf("heat wave: %s above its %gth percentile for at least %d days (gaps up to %d days)", e.Heatwave.Variable, e.Heatwave.Percentile, e.Heatwave.MinDays, e.Heatwave.MaxGapDays))
	}
	if e.Drought.Enabled {
		parts = append(parts, fmt.Sprintf("drought: %s below its %gth percentile for at least %d days", e.Drought.Variable, e.Drought.Percentile, e.Drought.MinDays))
	}
	if e.Flood.Enabled {
		parts = append(parts, fmt.Sprintf("flood: %s peaks above its %gth percentile", e.Flood.Variable, e.Flood.Percentile))
	}
	parts = append(parts, fmt.Sprintf("recovery: %d consecutive days within normal ± %g sd", e.Recovery.RunDays, e.Recovery.ToleranceSD))
	return strings.Join(parts, "\n")
}
