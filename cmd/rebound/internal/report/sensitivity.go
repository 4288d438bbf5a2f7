package report

import (
	"cmp"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"rebound/index"
	"slices"
	"strconv"
	"strings"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/view"
	"rebound/config"
	"rebound/index/sensitivity"
)

// The sensitivity outputs. Ranks are competition ranks, 1 = most
// resilient; a rank change is the new rank minus the base rank, so a
// positive change is a fall.

// SensitivityColumns are the columns of sensitivity.csv: per station, the
// base rank; over the Monte Carlo samples the median, 5th and 95th
// percentile, best, worst and mean rank, the shares of samples in the top
// and in the bottom group, and the stability class; the largest rank change
// of the one-at-a-time runs; and the best and worst rank over the
// structural alternatives.
var SensitivityColumns = []string{"station", "name", "rank", "rank_median", "rank_p5", "rank_p95", "rank_best", "rank_worst", "rank_mean",
	"p_top", "p_bottom", "stability", "oat_max_change", "structural_best", "structural_worst"}

// WriteSensitivity writes sensitivity.csv, stations in rank order. The
// rank statistics of a station without a score are blank and its
// stability is "unranked"; the structural columns are blank when there was
// no alternative to score.
func WriteSensitivity(w io.Writer, r *pipeline.Run) error {
	s := r.Sensitivity
	cw := csv.NewWriter(w)
	cw.Write(SensitivityColumns)
	for _, i := range r.Result.Order {
		st := s.MonteCarlo.Stations[i]
		row := []string{r.Raw.Stations[i], r.Raw.Names[i], strconv.Itoa(r.Result.Rank[i])}
		if st.Stability == sensitivity.Unranked {
			row = append(row, "", "", "", "", "", "", "", "", st.Stability.String(), "", "", "")
			cw.Write(row)
			continue
		}
		row = append(row, itoa32(st.Median), itoa32(st.Low), itoa32(st.High), itoa32(st.Best), itoa32(st.Worst), Num(st.Mean),
			Num(st.Top), Num(st.Bottom), st.Stability.String(), itoa32(s.OAT.StationMax[i]))
		if sr := s.Structural; sr != nil {
			row = append(row, itoa32(sr.Min[i]), itoa32(sr.Max[i]))
		} else {
			row = append(row, "", "")
		}
		cw.Write(row)
	}
	cw.Flush()
	return cw.Error()
}

// OATColumns are the columns of sensitivity_oat.csv.
var OATColumns = []string{"indicator", "step", "base_weight", "weight", "max_change", "mean_abs_change", "station", "base_rank", "rank", "change"}

// WriteOAT writes sensitivity_oat.csv in long form: one row per
// one-at-a-time run (an indicator and a signed relative step, its weight
// before and after, and the run's largest and mean absolute rank change,
// a tornado chart's data) and station (stations in base rank order).
func WriteOAT(w io.Writer, r *pipeline.Run) error {
	oat := r.Sensitivity.OAT
	cw := csv.NewWriter(w)
	cw.Write(OATColumns)
	for _, run := range oat.Runs {
		j := run.Indicator
		head := []string{r.Raw.Indicators[j].Name, Num(run.Delta), Num(r.Weights.W[j]), Num(run.Weights[j]), itoa32(run.MaxShift), Num(run.MeanShift)}
		for _, i := range r.Result.Order {
			base := oat.Base[i]
			cw.Write(append(slices.Clip(head), r.Raw.Stations[i], itoa32(base), itoa32(run.Ranks[i]), itoa32(run.Ranks[i]-base)))
		}
	}
	cw.Flush()
	return cw.Error()
}

// SobolColumns are the columns of sensitivity_sobol.csv.
var SobolColumns = []string{"output", "station", "indicator", "base_weight", "s1", "s1_low", "s1_high", "st", "st_low", "st_high"}

// WriteSobol writes sensitivity_sobol.csv: the first-order (s1) and total
// (st) Sobol indices of each weight with their bootstrap intervals, first
// for the ranking-wide output "mean_rank_shift" (the mean absolute rank
// change from the base ranking), then for each station's "composite", in
// rank order. Blank cells are undefined (an output that does not vary) or
// not bootstrapped.
func WriteSobol(w io.Writer, r *pipeline.Run) error {
	s := r.Sensitivity
	sob := s.Sobol
	cw := csv.NewWriter(w)
	cw.Write(SobolColumns)
	write := func(output, station string, o int) {
		for j, ind := range r.Raw.Indicators {
			x := o*sob.Inputs + j
			cw.Write([]string{output, station, ind.Name, Num(r.Weights.W[j]),
				Num(sob.First[x]), Num(sob.FirstLo[x]), Num(sob.FirstHi[x]), Num(sob.Total[x]), Num(sob.TotalLo[x]), Num(sob.TotalHi[x])})
		}
	}
	write("mean_rank_shift", "", s.RankShift())
	for _, i := range r.Result.Order {
		write("composite", r.Raw.Stations[i], i)
	}
	cw.Flush()
	return cw.Error()
}

// WriteStructural writes sensitivity_structural.csv: one row per station,
// in base rank order, with its rank under each way of building the index
// that the structural analysis scored (columns named
// normalisation/aggregation/scope; the first is the configured one).
func WriteStructural(w io.Writer, r *pipeline.Run) error {
	sr := r.Sensitivity.Structural
	cw := csv.NewWriter(w)
	cw.Write(append([]string{"station", "name"}, sr.Names...))
	for _, i := range r.Result.Order {
		row := []string{r.Raw.Stations[i], r.Raw.Names[i]}
		for _, ranks := range sr.Ranks {
			row = append(row, itoa32(ranks[i]))
		}
		cw.Write(row)
	}
	cw.Flush()
	return cw.Error()
}

// rankingSensitivityColumns are the columns ranking.csv gains when the
// sensitivity analysis ran.
func rankingSensitivityColumns(r *pipeline.Run) []string {
	if r.Sensitivity == nil {
		return nil
	}
	return []string{"rank_p5", "rank_median", "rank_p95", "stability"}
}

// rankingSensitivityCells are station i's cells of those columns.
func rankingSensitivityCells(r *pipeline.Run, i int) []string {
	if r.Sensitivity == nil {
		return nil
	}
	st := r.Sensitivity.MonteCarlo.Stations[i]
	if st.Stability == sensitivity.Unranked {
		return []string{"", "", "", st.Stability.String()}
	}
	return []string{itoa32(st.Low), itoa32(st.Median), itoa32(st.High), st.Stability.String()}
}

// rankInterval is the rank-interval column of the terminal ranking.
type rankInterval struct{ r *pipeline.Run }

const intervalHeader = "p5-p95"

func (iv rankInterval) header() string {
	if iv.r.Sensitivity == nil {
		return ""
	}
	return fmt.Sprintf("%-7s  ", intervalHeader)
}

func (iv rankInterval) cell(i int) string {
	if iv.r.Sensitivity == nil {
		return ""
	}
	st := iv.r.Sensitivity.MonteCarlo.Stations[i]
	c := "-"
	if st.Stability != sensitivity.Unranked {
		c = fmt.Sprintf("%d-%d", st.Low, st.High)
	}
	return fmt.Sprintf("%-7s  ", c)
}

func (iv rankInterval) note() string {
	s := iv.r.Sensitivity
	if s == nil {
		return ""
	}
	return fmt.Sprintf("%s: the 5th to 95th percentile of the station's rank over %d weight samples (sensitivity.csv).\n", intervalHeader, s.MonteCarlo.Samples)
}

func itoa32(x int32) string { return strconv.Itoa(int(x)) }

// ManifestSensitivity is the sensitivity section of run.json: what the
// analysis ran with and what it found, in summary. Per-station figures are
// in the sensitivity CSV files.
type ManifestSensitivity struct {
	Seed          uint64  `json:"seed"`
	Samples       int     `json:"samples"`
	Sampling      string  `json:"sampling"`
	Concentration float64 `json:"concentration,omitempty"`
	// Bounds are the weight bounds by indicator, when given.
	Bounds map[string][]float64 `json:"bounds,omitempty"`
	TopN   int                  `json:"top_n"`
	// Stability counts the stations in each stability class, and the lists
	// name them, in rank order.
	Stability       map[string]int `json:"stability"`
	RobustTop       []string       `json:"robust_top"`
	RobustBottom    []string       `json:"robust_bottom"`
	WeightDependent []string       `json:"weight_dependent"`
	// Spearman and Kendall summarise the agreement of the sampled rankings
	// with the base ranking; Kendall's tau-b is computed on every
	// KendallStride-th sample.
	Spearman      ManifestAgreement `json:"spearman"`
	Kendall       ManifestAgreement `json:"kendall_tau_b"`
	KendallStride int               `json:"kendall_stride"`
	OneAtATime    []ManifestOAT     `json:"one_at_a_time"`
	Structural    []ManifestAlt     `json:"structural"`
	Skipped       []string          `json:"structural_skipped"`
	Sobol         *ManifestSobol    `json:"sobol,omitempty"`
	Outputs       []string          `json:"outputs"`
}

// ManifestAgreement summarises a rank correlation over the samples.
type ManifestAgreement struct {
	Mean jnum `json:"mean"`
	Min  jnum `json:"min"`
	P05  jnum `json:"p05"`
}

// ManifestOAT is one one-at-a-time run.
type ManifestOAT struct {
	Indicator  string  `json:"indicator"`
	Step       float64 `json:"step"`
	BaseWeight float64 `json:"base_weight"`
	Weight     float64 `json:"weight"`
	MaxChange  int32   `json:"max_change"`
	MeanChange float64 `json:"mean_abs_change"`
}

// ManifestAlt is one way of building the index in the structural
// analysis, compared with the configured one (the first).
type ManifestAlt struct {
	Name          string  `json:"name"`
	Normalization string  `json:"normalization"`
	Aggregation   string  `json:"aggregation"`
	Scope         string  `json:"scope"`
	Spearman      jnum    `json:"spearman"`
	MeanChange    float64 `json:"mean_abs_change"`
}

// ManifestSobol holds the Sobol indices of the weights on the mean
// absolute rank shift.
type ManifestSobol struct {
	BaseSamples int     `json:"base_samples"`
	Evaluations int     `json:"evaluations"`
	Spread      float64 `json:"spread"`
	Bootstrap   int     `json:"bootstrap"`
	Level       float64 `json:"level"`
	// Output names the output the indices are of; Mean and Variance are
	// its mean and variance over the base samples.
	Output   string          `json:"output"`
	Mean     jnum            `json:"mean"`
	Variance jnum            `json:"variance"`
	Indices  []ManifestIndex `json:"indices"`
}

// ManifestIndex is one weight's first-order and total Sobol index with
// their intervals.
type ManifestIndex struct {
	Indicator string `json:"indicator"`
	S1        jnum   `json:"s1"`
	S1Low     jnum   `json:"s1_low"`
	S1High    jnum   `json:"s1_high"`
	ST        jnum   `json:"st"`
	STLow     jnum   `json:"st_low"`
	STHigh    jnum   `json:"st_high"`
}

// jnum is a number that JSON writes as null when it is NaN (undefined).
type jnum float64

func (x jnum) MarshalJSON() ([]byte, error) {
	if math.IsNaN(float64(x)) || math.IsInf(float64(x), 0) {
		return []byte("null"), nil
	}
	return json.Marshal(float64(x))
}

// manifestSensitivity builds the sensitivity section of run.json; nil when
// the analysis did not run.
func manifestSensitivity(r *pipeline.Run) *ManifestSensitivity {
	s := r.Sensitivity
	if s == nil {
		return nil
	}
	cs := r.Config.Sensitivity
	mc := s.MonteCarlo
	m := &ManifestSensitivity{
		Seed: s.Settings.Seed, Samples: mc.Samples, Sampling: string(cs.Sampling), TopN: mc.TopN,
		Stability: map[string]int{}, RobustTop: []string{}, RobustBottom: []string{}, WeightDependent: []string{},
		Spearman:      ManifestAgreement{jnum(mc.Spearman.Mean), jnum(mc.Spearman.Min), jnum(mc.Spearman.P05)},
		Kendall:       ManifestAgreement{jnum(mc.Kendall.Mean), jnum(mc.Kendall.Min), jnum(mc.Kendall.P05)},
		KendallStride: mc.KendallStride,
		OneAtATime:    []ManifestOAT{}, Structural: []ManifestAlt{}, Skipped: []string{},
		Outputs: SensitivityOutputs(r),
	}
	if cs.Sampling == config.Dirichlet {
		m.Concentration = cs.Concentration
	}
	if len(cs.Bounds) > 0 {
		m.Bounds = cs.Bounds
	}
	for _, i := range r.Result.Order {
		st := mc.Stations[i]
		m.Stability[st.Stability.String()]++
		switch st.Stability {
		case sensitivity.RobustTop:
			m.RobustTop = append(m.RobustTop, r.Raw.Stations[i])
		case sensitivity.RobustBottom:
			m.RobustBottom = append(m.RobustBottom, r.Raw.Stations[i])
		case sensitivity.WeightDependent:
			m.WeightDependent = append(m.WeightDependent, r.Raw.Stations[i])
		}
	}
	for _, run := range s.OAT.Runs {
		j := run.Indicator
		m.OneAtATime = append(m.OneAtATime, ManifestOAT{r.Raw.Indicators[j].Name, run.Delta, r.Weights.W[j], run.Weights[j], run.MaxShift, run.MeanShift})
	}
	if sr := s.Structural; sr != nil {
		for i, sc := range s.Scenarios {
			m.Structural = append(m.Structural, ManifestAlt{sc.Name(), string(sc.Normalization), string(sc.Aggregation), string(sc.Scope),
				jnum(sr.Spearman[i]), sr.MeanShift[i]})
		}
	}
	for _, sk := range s.Skipped {
		m.Skipped = append(m.Skipped, sk.String())
	}
	if sob := s.Sobol; sob != nil {
		o := s.RankShift()
		ms := &ManifestSobol{BaseSamples: sob.N, Evaluations: sob.Evaluations, Spread: s.Settings.Spread, Bootstrap: sob.Bootstrap, Level: sob.Level,
			Output: "mean_rank_shift", Mean: jnum(sob.Mean[o]), Variance: jnum(sob.Variance[o])}
		for j, ind := range r.Raw.Indicators {
			x := o*sob.Inputs + j
			ms.Indices = append(ms.Indices, ManifestIndex{ind.Name, jnum(sob.First[x]), jnum(sob.FirstLo[x]), jnum(sob.FirstHi[x]),
				jnum(sob.Total[x]), jnum(sob.TotalLo[x]), jnum(sob.TotalHi[x])})
		}
		m.Sobol = ms
	}
	return m
}

// SensitivityOutputs names the files the sensitivity analysis of r writes.
func SensitivityOutputs(r *pipeline.Run) []string {
	s := r.Sensitivity
	if s == nil {
		return nil
	}
	names := []string{"sensitivity.csv", "sensitivity_oat.csv"}
	if s.Structural != nil {
		names = append(names, "sensitivity_structural.csv")
	}
	if s.Sobol != nil {
		names = append(names, "sensitivity_sobol.csv")
	}
	return names
}

// SensitivityWriters returns the writer of each sensitivity output, by
// name, in the order of SensitivityOutputs.
func SensitivityWriters(r *pipeline.Run) map[string]func(io.Writer, *pipeline.Run) error {
	all := map[string]func(io.Writer, *pipeline.Run) error{
		"sensitivity.csv":            WriteSensitivity,
		"sensitivity_oat.csv":        WriteOAT,
		"sensitivity_structural.csv": WriteStructural,
		"sensitivity_sobol.csv":      WriteSobol,
	}
	out := map[string]func(io.Writer, *pipeline.Run) error{}
	for _, name := range SensitivityOutputs(r) {
		out[name] = all[name]
	}
	return out
}

// maxListed is how many stations a summary sentence names before it
// points at the tables.
const maxListed = 12

// SensitivitySummary says in plain words what the sensitivity analysis
// found, one paragraph per string, ready for a memo: which stations are
// robustly in the top and bottom groups, which depend on the weighting,
// which weights matter most, how the other ways of building the index
// compare, and how far the sampled rankings agree with the configured one.
func SensitivitySummary(r *pipeline.Run) []string {
	s := r.Sensitivity
	if s == nil {
		return nil
	}
	cs := r.Config.Sensitivity
	mc := s.MonteCarlo
	n, top := len(mc.Stations), mc.TopN
	var out []string

	how := fmt.Sprintf("drawn around the configured weights from a Dirichlet distribution with concentration %g", cs.Concentration)
	if cs.Sampling == config.UniformSimplex {
		how = "drawn uniformly from every set of weights that sums to 1"
	}
	if len(cs.Bounds) > 0 {
		how += ", within the configured bounds"
	}
	first := fmt.Sprintf("How robust is the ranking? The %s were ranked again under %d sets of weights %s (seed %d). "+
		"A station's rank interval runs from the 5th to the 95th percentile of its ranks over these samples.",
		plural(n, "station"), mc.Samples, how, s.Settings.Seed)
	if len(r.Raw.Indicators) == 1 {
		first += " With a single indicator, whose weight is always 1, the weights cannot change the ranking; only other ways of building the index can."
	}
	out = append(out, first)

	var robustTop, robustBottom, dependent []int
	for _, i := range r.Result.Order {
		switch mc.Stations[i].Stability {
		case sensitivity.RobustTop:
			robustTop = append(robustTop, i)
		case sensitivity.RobustBottom:
			robustBottom = append(robustBottom, i)
		case sensitivity.WeightDependent:
			dependent = append(dependent, i)
		}
	}
	group := func(list []int, where string, p func(sensitivity.StationRanks) float64) string {
		place := fmt.Sprintf("in the %s %d", where, top)
		if top == 1 {
			place = map[string]string{"top": "first", "bottom": "last"}[where]
		}
		if len(list) > 0 {
			return fmt.Sprintf("Robustly %s (there in at least 95%% of the samples): %s.", place, stationList(r, list, nil))
		}
		best := -1
		for _, i := range r.Result.Order {
			if mc.Stations[i].Stability != sensitivity.Unranked && (best < 0 || p(mc.Stations[i]) > p(mc.Stations[best])) {
				best = i
			}
		}
		msg := fmt.Sprintf("No station stays %s in 95%% of the samples", place)
		if best >= 0 && p(mc.Stations[best]) > 0 {
			msg += fmt.Sprintf("; the surest is %s, there in %.0f%% of them", stationName(r, best), 100*p(mc.Stations[best]))
		}
		return msg + "."
	}
	out = append(out, group(robustTop, "top", func(st sensitivity.StationRanks) float64 { return st.Top })+" "+
		group(robustBottom, "bottom", func(st sensitivity.StationRanks) float64 { return st.Bottom }))

	if len(dependent) > 0 {
		out = append(out, fmt.Sprintf("Depend on the weighting (rank interval wider than %s): %s. The other %d stations keep their place within %s or stay in the top or bottom group.",
			plural(top, "rank"), stationList(r, dependent, func(i int) string {
				st := mc.Stations[i]
				return fmt.Sprintf("ranks %d–%d", st.Low, st.High)
			}), n-len(dependent)-unranked(mc), plural(top, "rank")))
	} else {
		out = append(out, fmt.Sprintf("No station's place depends much on the weighting: every rank interval spans at most %s.", plural(top, "rank")))
	}

	out = append(out, weightsParagraph(r))
	if p := structuralParagraph(r); p != "" {
		out = append(out, p)
	}
	if math.IsNaN(mc.Spearman.Mean) {
		out = append(out, "Rank correlations with the configured ranking need at least two stations with a score.")
	} else {
		out = append(out, fmt.Sprintf("Agreement with the configured ranking over the samples: Spearman's rho averages %s (5th percentile %s), Kendall's tau-b %s.",
			Round(mc.Spearman.Mean, 3), Round(mc.Spearman.P05, 3), Round(mc.Kendall.Mean, 3)))
	}
	return out
}

func unranked(mc *sensitivity.MonteCarloResult) int {
	n := 0
	for _, st := range mc.Stations {
		if st.Stability == sensitivity.Unranked {
			n++
		}
	}
	return n
}

// weightsParagraph says which weights matter most: by their total Sobol
// index on the mean rank shift when computed, and by the one-at-a-time
// rank changes.
func weightsParagraph(r *pipeline.Run) string {
	s := r.Sensitivity
	inds := r.Raw.Indicators
	var b strings.Builder
	if sob := s.Sobol; sob != nil {
		o := s.RankShift()
		st := sob.TotalOrder(o)
		order := indicatorOrder(len(inds), func(j int) float64 { return st[j] })
		if math.IsNaN(st[order[0]]) {
			fmt.Fprintf(&b, "With every weight varied by ±%g%% the ranking never changes, so no single weight matters for it.", 100*s.Settings.Spread)
		} else {
			fmt.Fprintf(&b, "The weights that matter most for the ranking (total Sobol index of the mean rank shift, each weight varied by ±%g%%): ", 100*s.Settings.Spread)
			shown := min(3, len(order))
			for q, j := range order[:shown] {
				if q > 0 {
					b.WriteString(", ")
				}
				x := o*sob.Inputs + j
				fmt.Fprintf(&b, "%s %s", inds[j].Name, Round(st[j], 2))
				if !math.IsNaN(sob.TotalLo[x]) {
					fmt.Fprintf(&b, " (%g%% interval %s–%s)", 100*sob.Level, Round(sob.TotalLo[x], 2), Round(sob.TotalHi[x], 2))
				}
			}
			b.WriteString(".")
			if last := order[len(order)-1]; len(order) > shown && Round(st[last], 2) != Round(st[order[shown-1]], 2) {
				fmt.Fprintf(&b, " The least: %s %s.", inds[last].Name, Round(st[last], 2))
			}
		}
		b.WriteString(" ")
	}
	// One at a time, at the largest step, in the order every output uses.
	if len(s.OAT.Runs) == 0 {
		return strings.TrimSpace(b.String())
	}
	sv := view.Of(r).Sensitivity
	step := fmt.Sprintf("±%g%%", 100*sv.Step)
	largest := func(sw view.Swing) int { return int(max(nz(sw.Down), nz(sw.Up))) }
	if len(sv.Swings) == 0 || largest(sv.Swings[0]) == 0 {
		fmt.Fprintf(&b, "Moving any one weight at a time by %s (the others rescaled) changes no station's rank.", step)
		return b.String()
	}
	fmt.Fprintf(&b, "Moving one weight at a time by %s (the others rescaled), ", step)
	var parts []string
	for _, sw := range sv.Swings[:min(3, len(sv.Swings))] {
		if largest(sw) == 0 {
			break
		}
		parts = append(parts, fmt.Sprintf("%s moves a station by up to %s (%s on average)", sw.Indicator, plural(largest(sw), "rank"),
			Round(max(nz(sw.MeanDown), nz(sw.MeanUp)), 1)))
	}
	b.WriteString(strings.Join(parts, "; ") + ".")
	return b.String()
}

func nz(x float64) float64 {
	if math.IsNaN(x) {
		return 0
	}
	return x
}

// indicatorOrder returns 0..k−1 by decreasing key, NaN last, ties in
// indicator order.
func indicatorOrder(k int, key func(int) float64) []int {
	order := make([]int, k)
	for j := range order {
		order[j] = j
	}
	slices.SortStableFunc(order, func(a, b int) int {
		ka, kb := key(a), key(b)
		switch na, nb := math.IsNaN(ka), math.IsNaN(kb); {
		case na && nb:
			return 0
		case na:
			return 1
		case nb:
			return -1
		}
		return cmp.Compare(kb, ka)
	})
	return order
}

// structuralParagraph compares the other ways of building the index:
// first the other normalisations and aggregations at the configured scope,
// then the other scopes, which answer another question (how a station
// compares with its peers) and are reported apart.
func structuralParagraph(r *pipeline.Run) string {
	s := r.Sensitivity
	sr := s.Structural
	skipped := skippedSentence(s.Skipped)
	if sr == nil {
		if skipped == "" {
			return ""
		}
		return "No other way of building the index could be scored." + skipped
	}
	ref := s.Scenarios[0]
	var same, other, sev []int
	for q, sc := range s.Scenarios[1:] {
		switch {
		case sc.MinSeverity > 0:
			sev = append(sev, q+1)
		case sc.Scope == ref.Scope:
			same = append(same, q+1)
		default:
			other = append(other, q+1)
		}
	}
	var parts []string
	if len(sev) > 0 {
		var floors []string
		for _, q := range sev {
			floors = append(floors, index.SeverityNames[s.Scenarios[q].MinSeverity])
		}
		parts = append(parts, fmt.Sprintf("Counting the events from another severity class (%s and stronger, instead of each indicator's min_severity): %s.",
			strings.Join(floors, " or "), spearmanRange(sr, sev)))
	}
	if len(same) > 0 {
		msg := fmt.Sprintf("Other normalisations and aggregations (%s to the configured %s, named normalisation/aggregation/scope): ",
			plural(len(same), "alternative"), sr.Names[0])
		if i, lo, hi := widestRange(r, append([]int{0}, same...)); i >= 0 && hi > lo {
			msg += fmt.Sprintf("the widest rank range of any station is %s, %s; ", plural(int(hi-lo), "rank"),
				stationList(r, []int{i}, func(int) string { return fmt.Sprintf("ranks %d–%d", lo, hi) }))
		} else if i >= 0 {
			msg += "no station changes rank; "
		}
		parts = append(parts, msg+spearmanRange(sr, same)+".")
	}
	if len(other) > 0 {
		var scopes []string
		for _, q := range other {
			if w := scopeWords(s.Scenarios[q].Scope); !slices.Contains(scopes, w) {
				scopes = append(scopes, w)
			}
		}
		what := "compares each station with its peers rather than with every station"
		if ref.Scope != config.ScopeAll {
			what = "compares each station with a different set of stations than the configured scope does"
			if len(scopes) == 1 && scopes[0] == scopeWords(config.ScopeAll) {
				what = "compares each station with every station rather than with its peers"
			}
		}
		parts = append(parts, fmt.Sprintf("Normalising %s instead (%s) %s, a different question: %s.",
			strings.Join(scopes, " or "), plural(len(other), "alternative"), what, spearmanRange(sr, other)))
	}
	return strings.Join(parts, " ") + skipped
}

// skippedSentence names the combinations not scored, grouped by reason.
func skippedSentence(skipped []pipeline.Skipped) string {
	if len(skipped) == 0 {
		return ""
	}
	var reasons []string
	names := map[string][]string{}
	for _, sk := range skipped {
		if names[sk.Reason] == nil {
			reasons = append(reasons, sk.Reason)
		}
		names[sk.Reason] = append(names[sk.Reason], sk.Name())
	}
	var parts []string
	for _, why := range reasons {
		parts = append(parts, strings.Join(names[why], " and ")+", because "+why)
	}
	return " Not scored: " + strings.Join(parts, "; ") + "."
}

// widestRange returns the station whose rank varies most over the
// scenarios qs, with its best and worst rank; −1 when every station is
// unranked.
func widestRange(r *pipeline.Run, qs []int) (station int, lo, hi int32) {
	sr := r.Sensitivity.Structural
	station = -1
	for _, i := range r.Result.Order {
		if r.Sensitivity.MonteCarlo.Stations[i].Stability == sensitivity.Unranked {
			continue
		}
		a, b := sr.Ranks[qs[0]][i], sr.Ranks[qs[0]][i]
		for _, q := range qs[1:] {
			a, b = min(a, sr.Ranks[q][i]), max(b, sr.Ranks[q][i])
		}
		if station < 0 || b-a > hi-lo {
			station, lo, hi = i, a, b
		}
	}
	return station, lo, hi
}

// spearmanRange says how far Spearman's rho with the configured ranking
// runs over the scenarios qs.
func spearmanRange(sr *sensitivity.StructuralResult, qs []int) string {
	lo, hi := qs[0], qs[0]
	if math.IsNaN(sr.Spearman[lo]) {
		return "Spearman's rho with the configured ranking is undefined (fewer than two stations with a score)"
	}
	for _, q := range qs {
		if sr.Spearman[q] < sr.Spearman[lo] {
			lo = q
		}
		if sr.Spearman[q] > sr.Spearman[hi] {
			hi = q
		}
	}
	if lo == hi {
		return fmt.Sprintf("Spearman's rho with the configured ranking is %s", Round(sr.Spearman[lo], 3))
	}
	return fmt.Sprintf("Spearman's rho with the configured ranking runs from %s (%s) to %s (%s)",
		Round(sr.Spearman[lo], 3), sr.Names[lo], Round(sr.Spearman[hi], 3), sr.Names[hi])
}

// scopeWords describes a normalisation scope.
func scopeWords(sc config.Scope) string {
	switch sc {
	case config.ScopeAll:
		return "over all stations together"
	case config.ScopeGroup:
		return "within the peer groups of the attribute table"
	case config.ScopeCluster:
		return "within the clusters"
	}
	return "within scope " + string(sc)
}

// plural returns "1 rank", "2 ranks".
func plural(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return strconv.Itoa(n) + " " + noun + "s"
}

func stationName(r *pipeline.Run, i int) string {
	if name := r.Raw.Names[i]; name != "" && name != r.Raw.Stations[i] {
		return r.Raw.Stations[i] + " (" + name + ")"
	}
	return r.Raw.Stations[i]
}

// stationList names the stations, with an optional note each, up to
// maxListed of them.
func stationList(r *pipeline.Run, list []int, note func(int) string) string {
	var parts []string
	for _, i := range list[:min(len(list), maxListed)] {
		p := stationName(r, i)
		if note != nil {
			if strings.HasSuffix(p, ")") {
				p = p[:len(p)-1] + ", " + note(i) + ")"
			} else {
				p += " (" + note(i) + ")"
			}
		}
		parts = append(parts, p)
	}
	out := strings.Join(parts, ", ")
	if extra := len(list) - maxListed; extra > 0 {
		out += fmt.Sprintf(" and %d more (sensitivity.csv lists them)", extra)
	}
	return out
}

// PrintSensitivity prints the summary of the sensitivity analysis,
// wrapped to width columns.
func PrintSensitivity(w io.Writer, r *pipeline.Run, width int) {
	for q, p := range SensitivitySummary(r) {
		if q > 0 {
			fmt.Fprintln(w)
		}
		fmt.Fprint(w, wrap(p, width))
	}
}

// wrap breaks text into lines of at most width columns at spaces.
func wrap(text string, width int) string {
	var b strings.Builder
	col := 0
	for _, word := range strings.Fields(text) {
		n := len([]rune(word))
		if col > 0 && col+1+n > width {
			b.WriteString("\n")
			col = 0
		} else if col > 0 {
			b.WriteString(" ")
			col++
		}
		b.WriteString(word)
		col += n
	}
	b.WriteString("\n")
	return b.String()
}
