package report

import (
	"encoding/csv"
	"io"
	"strconv"
	"strings"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/index"
	"rebound/index/events"
)

// DerivedEventColumns are the columns of events.csv when events are derived
// from series: the events-table columns rebound reads, then the details.
var DerivedEventColumns = append(append([]string(nil), index.EventColumns...),
	"severity", "severity_name", "driver_intensity",
	"mean_departure", "cumulative_departure", "peak_date", "time_to_peak_days", "censor_reason", "censored_by",
	"duration_days", "observed_days", "recovery_tolerance", "driver_peak", "driver_peak_date",
	"heat_mean_intensity_degC", "heat_cumulative_intensity_degC_days", "heat_threshold_ratio",
	"drought_deficit_m3s_days", "drought_deficit_volume_m3", "drought_deficit_probability", "drought_duration_probability",
	"flood_return_period_years", "flood_empirical_return_period_years", "overlaps", "peak_days_ceded")

// WriteDerivedEvents writes the events derived from the series, station by
// station in input order. The file can be given back to rebound as an
// events table (inputs.events): the extra columns are ignored on reading.
func WriteDerivedEvents(w io.Writer, r *pipeline.Run) error {
	cw := csv.NewWriter(w)
	cw.Write(DerivedEventColumns)
	date := func(ok bool, s string) string {
		if !ok {
			return ""
		}
		return s
	}
	for _, s := range r.Stations {
		for _, e := range s.Rows {
			cw.Write([]string{
				e.Station, e.EventID, e.Kind, e.Variable, e.Start.String(), e.End.String(),
				Num(e.PeakDeparture), strconv.Itoa(e.RecoveryDays), strconv.FormatBool(e.Recovered), Num(e.AntecedentDryness),
				strconv.Itoa(e.Severity), events.SeverityName(e.Severity), Num(e.DriverIntensity),
				Num(e.MeanDeparture), Num(e.CumDeparture), date(e.TimeToPeak >= 0, e.PeakDate.String()), timeToPeak(e),
				string(e.Censor), e.CensoredBy, strconv.Itoa(e.Duration), strconv.Itoa(e.Observed), Num(e.Tolerance),
				Num(e.DriverPeak), date(e.Kind != "" && !isNaN(e.DriverPeak), e.DriverPeakDate.String()),
				Num(e.MeanIntensity), Num(e.CumIntensity), Num(e.HeatRatio),
				Num(e.Deficit), Num(e.DeficitVolume), Num(e.DeficitProbability), Num(e.DurationProbability),
				Num(e.ReturnPeriod), Num(e.EmpiricalReturnPeriod), strings.Join(e.Overlaps, ";"), strconv.Itoa(e.Shared),
			})
		}
	}
	cw.Flush()
	return cw.Error()
}

func timeToPeak(e events.Row) string {
	if e.TimeToPeak < 0 {
		return ""
	}
	return strconv.Itoa(e.TimeToPeak)
}

func isNaN(x float64) bool { return x != x }

// CriteriaColumns are the columns of criteria.csv.
var CriteriaColumns = []string{"station", "criterion", "limit_degC", "basis", "variable", "days_with_value",
	"days_above", "failure_events", "reliability", "resilience", "vulnerability_degC",
	"mean_excess_degC", "max_excess_degC", "max_7day_degC", "max_7day_date"}

// WriteCriteria writes every station's performance against every
// criterion: the 7-day statistic used (7DADM or the 7-day mean of daily
// means) and the Hashimoto reliability, resilience and vulnerability.
func WriteCriteria(w io.Writer, r *pipeline.Run) error {
	cw := csv.NewWriter(w)
	cw.Write(CriteriaColumns)
	for _, s := range r.Stations {
		c := s.Criteria
		if c == nil {
			continue
		}
		for _, p := range c.Criteria {
			maxDate := ""
			if !isNaN(c.Max) {
				maxDate = c.MaxDate.String()
			}
			cw.Write([]string{s.ID, p.Name, Num(p.Limit), string(c.Basis), c.Variable, strconv.Itoa(p.Days),
				strconv.Itoa(p.DaysAbove), strconv.Itoa(p.Events), Num(p.Reliability), Num(p.Resilience),
				Num(p.Vulnerability), Num(p.MeanExcess), Num(p.MaxExcess), Num(c.Max), maxDate})
		}
	}
	cw.Flush()
	return cw.Error()
}
