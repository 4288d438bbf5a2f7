package events

import "rebound/index/calendar"

// Row is one line of the events table: one station, event and variable.
// NaN marks a value that is undefined (for example the deficit of a heat
// wave); writers leave it blank.
type Row struct {
	Station           string
	EventID           string
	Kind              string
	Variable          string
	Start, End        calendar.Date
	PeakDeparture     float64 // signed, in the variable's units
	RecoveryDays      int
	Recovered         bool
	AntecedentDryness float64

	MeanDeparture  float64
	CumDeparture   float64 // units·d
	PeakDate       calendar.Date
	TimeToPeak     int // days; -1 when PeakDeparture is NaN
	Censor         Censor
	Duration       int // days
	DriverPeak     float64
	DriverPeakDate calendar.Date
	MeanIntensity  float64 // heat waves, °C
	CumIntensity   float64 // heat waves, °C·d
	Deficit        float64 // droughts, m³/s·d
	DeficitVolume  float64 // droughts, m³
	Tolerance      float64 // recovery band half-width, variable units
	Observed       int     // event days with a value

	Severity              int     // class 1–4, 0 unrated
	DriverIntensity       float64 // see Event.DriverIntensity
	HeatRatio             float64 // heat waves
	ReturnPeriod          float64 // floods, years
	EmpiricalReturnPeriod float64 // floods, years (Gringorten)
	DeficitProbability    float64 // droughts
	DurationProbability   float64 // droughts
	Overlaps              []string
	CensoredBy            string
	Shared                int // peak-window days credited to an overlapping event
}

// Rows appends to dst one row per event and response of r, in event
// order, and returns dst. Events without responses give no row.
func (r *Result) Rows(dst []Row) []Row {
	for _, e := range r.Events {
		for _, v := range e.Responses {
			dst = append(dst, Row{
				Station: r.Station, EventID: e.ID, Kind: e.Kind, Variable: v.Variable,
				Start: e.Start, End: e.End,
				PeakDeparture: v.PeakDeparture, RecoveryDays: v.RecoveryDays, Recovered: v.Recovered,
				AntecedentDryness: e.AntecedentDryness,
				MeanDeparture:     v.MeanDeparture, CumDeparture: v.CumDeparture,
				PeakDate: v.PeakDate, TimeToPeak: v.TimeToPeak, Censor: v.Censor,
				Duration: e.Duration, DriverPeak: e.DriverPeak, DriverPeakDate: e.DriverPeakDate,
				MeanIntensity: e.MeanIntensity, CumIntensity: e.CumIntensity,
				Deficit: e.Deficit, DeficitVolume: e.DeficitVolume,
				Tolerance: v.Tolerance, Observed: v.Observed,
				Severity: e.Severity, DriverIntensity: e.DriverIntensity, HeatRatio: e.HeatRatio,
				ReturnPeriod: e.ReturnPeriod, EmpiricalReturnPeriod: e.EmpiricalReturnPeriod,
				DeficitProbability: e.DeficitProbability, DurationProbability: e.DurationProbability,
				Overlaps: e.Overlaps, CensoredBy: v.CensoredBy, Shared: v.Shared,
			})
		}
	}
	return dst
}
