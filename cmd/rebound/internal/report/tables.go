package report

import (
	"encoding/csv"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"rebound/cmd/rebound/internal/pipeline"
)

// Num formats a number for CSV with 12 significant digits (enough for
// every quantity here, and free of binary noise such as 0.5700000000000001),
// and an empty cell for NaN.
func Num(x float64) string {
	if math.IsNaN(x) {
		return ""
	}
	return strconv.FormatFloat(x, 'g', 12, 64)
}

// Round formats x with d decimals, or "" for NaN.
func Round(x float64, d int) string {
	if math.IsNaN(x) {
		return ""
	}
	s := strconv.FormatFloat(x, 'f', d, 64)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-") // no "-0.00"
	}
	return s
}

// RankingColumns are the columns of ranking.csv. A run that clusters adds
// a last column, cluster: the station's cluster (from 1) in the partition
// used for peer groups, blank for a station left out.
var RankingColumns = []string{"rank", "station", "name", "group", "score", "events", "latitude", "longitude", "flags"}

// WriteRanking writes ranking.csv: one row per station, from rank 1 down
// (ties by station identifier). The score keeps full precision. When the
// sensitivity analysis ran, the rank interval and stability class
// (rank_p5, rank_median, rank_p95, stability) follow the flags.
func WriteRanking(w io.Writer, r *pipeline.Run) error {
	cw := csv.NewWriter(w)
	head := append(slices.Clip(RankingColumns), rankingSensitivityColumns(r)...)
	if r.Clusters != nil {
		head = append(head[:len(head):len(head)], "cluster")
	}
	cw.Write(head)
	res := r.Result
	for _, i := range res.Order {
		s := r.Attrs.Stations[i]
		rec := []string{
			strconv.Itoa(res.Rank[i]), s.ID, s.Name, s.Group, Num(res.Score[i]),
			strconv.Itoa(r.Raw.Events[i]), Num(s.Latitude), Num(s.Longitude), strings.Join(res.Flags[i], ";"),
		}
		rec = append(rec, rankingSensitivityCells(r, i)...)
		if r.Clusters != nil {
			rec = append(rec, clusterCell(r.Clusters, s.ID))
		}
		cw.Write(rec)
	}
	cw.Flush()
	return cw.Error()
}

// IndicatorStatus says how indicator j was used at station i: "ok",
// "imputed" (the group median stood in), "missing" (left out, its weight
// redistributed) or "rmst" (a restricted mean survival time instead of the
// Kaplan–Meier median). Every output uses these words.
func IndicatorStatus(r *pipeline.Run, i, j int) string {
	res := r.Result
	switch {
	case res.Imputed[i][j]:
		return "imputed"
	case math.IsNaN(res.Normalized[i][j]):
		return "missing"
	case r.Raw.Fallback[i][j]:
		return "rmst"
	}
	return "ok"
}

// EffectiveFloor is the least severity class indicator j counted: its
// min_severity, or 1 when the events carry no severity.
func EffectiveFloor(r *pipeline.Run, j int) int {
	if !r.Raw.SeverityKnown {
		return 1
	}
	return r.Raw.Indicators[j].SeverityFloor()
}

// IndicatorColumns are the columns of indicators.csv.
var IndicatorColumns = []string{"station", "indicator", "measure", "raw", "normalized", "weight", "contribution", "status", "note",
	"min_severity", "event_weights", "events_used", "censored_record_end", "censored_gap", "censored_next_event"}

// WriteIndicators writes indicators.csv in long form: one row per station
// and indicator, stations in rank order. status is ok, missing (weight
// redistributed), imputed (group median used) or rmst (restricted mean
// survival time instead of the Kaplan–Meier median).
func WriteIndicators(w io.Writer, r *pipeline.Run) error {
	cw := csv.NewWriter(w)
	cw.Write(IndicatorColumns)
	res := r.Result
	for _, i := range res.Order {
		cens := r.Raw.Censored[i]
		for j, ind := range r.Raw.Indicators {
			status := IndicatorStatus(r, i, j)
			floor, used := "", ""
			if ind.Measure.FromEvents() {
				floor, used = strconv.Itoa(EffectiveFloor(r, j)), strconv.Itoa(r.Raw.Used[i][j])
			}
			cw.Write([]string{
				r.Raw.Stations[i], ind.Name, string(ind.Measure), Num(r.Raw.Values[i][j]), Num(res.Normalized[i][j]),
				Num(r.Weights.W[j]), Num(res.Contribution[i][j]), status, r.Raw.Notes[i][j],
				floor, ind.EventWeights, used,
				strconv.Itoa(cens["record_end"]), strconv.Itoa(cens["gap"]), strconv.Itoa(cens["next_event"]),
			})
		}
	}
	cw.Flush()
	return cw.Error()
}
