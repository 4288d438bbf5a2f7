package demo

import (
	"bytes"
	"encoding/csv"
	"math"
	"math/rand/v2"
	"strconv"

	"rebound/index/calendar"
)

// Event is one generated row of the events table.
type Event struct {
	Station   string
	Dist      Disturbance
	Variable  string
	Peak      float64 // signed departure
	Recovery  float64 // days
	Recovered bool
	Dryness   float64 // NaN when the record is too short to say
}

// droughtLag is how long after a regional drought ends a basin still
// behaves as dry (groundwater and soils recover slowly in the lowlands).
var droughtLag = map[Kind]int{Spring: 0, Snowmelt: 60, Tailwater: 0, Urban: 0, Lowland: 150}

// dryness returns the fraction of the 365 days before d spent in drought,
// for a station of kind k whose record starts at first; NaN when the
// window starts before the record.
func dryness(ds []Disturbance, k Kind, d, first calendar.Date) float64 {
	from := d - 365
	if from < first {
		return math.NaN()
	}
	days := 0
	for t := from; t < d; t++ {
		for _, x := range ds {
			if x.Kind == "drought" && t >= x.Start && t <= x.End+calendar.Date(droughtLag[k]) {
				days++
				break
			}
		}
	}
	return float64(days) / 365
}

// response is a station kind's behaviour.
type response struct {
	heat      float64 // °C of water warming per °C of air anomaly
	heatDry   float64 // extra warming per unit antecedent dryness (fraction of heat)
	lateHeat  float64 // extra °C per °C of anomaly per day beyond 10 days (cold-pool exhaustion)
	droughtWT float64 // °C of warming per unit drought severity
	cond      float64 // µS/cm per unit drought severity
	doHeat    float64 // mg/L of oxygen lost per °C of warming
	doFlood   float64 // mg/L of oxygen lost per unit flood index
	recHeat   float64 // typical days to recover after a heat wave
	recLate   float64 // extra recovery days per day of heat wave beyond 10
	recDry    float64 // extra recovery days per unit antecedent dryness
	recDrt    float64 // typical days to recover after a drought
	recFlood  float64 // typical days to recover after a flood
	noise     float64 // °C of noise on warming
}

var responses = map[Kind]response{
	Spring:    {heat: 0.16, heatDry: 0.15, droughtWT: 0.3, cond: 30, doHeat: 0.45, doFlood: 0.3, recHeat: 3, recDry: 2, recDrt: 6, recFlood: 2, noise: 0.12},
	Snowmelt:  {heat: 0.33, heatDry: 0.8, droughtWT: 1.0, cond: 45, doHeat: 0.5, doFlood: 0.3, recHeat: 6, recDry: 8, recDrt: 14, recFlood: 3, noise: 0.25},
	Tailwater: {heat: 0.10, heatDry: 0.1, lateHeat: 0.055, droughtWT: 0.5, cond: 60, doHeat: 1.1, doFlood: 0.4, recHeat: 5, recLate: 1.3, recDry: 4, recDrt: 12, recFlood: 3, noise: 0.15},
	Urban:     {heat: 0.55, heatDry: 0.1, droughtWT: 1.2, cond: 260, doHeat: 0.8, doFlood: 1.7, recHeat: 3, recDry: 2, recDrt: 8, recFlood: 2, noise: 0.35},
	Lowland:   {heat: 0.42, heatDry: 1.4, droughtWT: 2.0, cond: 380, doHeat: 1.0, doFlood: 1.0, recHeat: 16, recDry: 30, recDrt: 40, recFlood: 8, noise: 0.3},
}

// noDO lists stations without an oxygen sensor.
var noDO = map[string]bool{"FEN-05": true, "HIC-05": true, "LOW-07": true}

// Events generates every station's response to every disturbance within
// its record.
func Events(stations []Station, ds []Disturbance, rng *rand.Rand) []Event {
	lastDay := calendar.New(LastYear, 12, 31)
	var out []Event
	for _, s := range stations {
		first := calendar.New(LastYear-int(s.RecordYears)+1, 1, 1)
		r := responses[s.Kind]
		for k, d := range ds {
			if d.Start < first {
				continue
			}
			dur := float64(d.End - d.Start + 1)
			a := dryness(ds, s.Kind, d.Start, first)
			aa := a
			if math.IsNaN(aa) {
				aa = 0.1
			}
			if !math.IsNaN(a) {
				a = math.Min(1, math.Max(0, math.Round((a+0.02*rng.NormFloat64())*1000)/1000))
			}
			next := lastDay + 1
			if k+1 < len(ds) {
				next = ds[k+1].Start
			}
			emit := func(variable string, peak, rec float64) {
				rec = math.Max(0, math.Round(rec*math.Exp(0.25*rng.NormFloat64())))
				e := Event{Station: s.ID, Dist: d, Variable: variable, Peak: round(peak, 2), Recovery: rec, Recovered: true, Dryness: a}
				// Right-censoring: the record ends, or the next disturbance
				// starts, before the variable is back to normal.
				if limit := float64(next - d.End - 1); rec > limit {
					e.Recovery, e.Recovered = math.Max(0, limit), false
				}
				out = append(out, e)
			}
			switch d.Kind {
			case "heatwave":
				warm := r.heat*d.Intensity*(1+r.heatDry*aa) + r.lateHeat*d.Intensity*math.Max(0, dur-10) + r.noise*rng.NormFloat64()
				warm = math.Max(0.05, warm)
				emit("water_temperature", warm, r.recHeat+r.recLate*math.Max(0, dur-10)+r.recDry*aa)
				if !noDO[s.ID] {
					emit("dissolved_oxygen", -r.doHeat*warm*(1+0.1*rng.NormFloat64()), r.recHeat+r.recLate*math.Max(0, dur-10)+r.recDry*aa)
				}
			case "drought":
				sev := d.Intensity
				emit("water_temperature", math.Max(0.05, r.droughtWT*sev*(1+0.5*aa)+r.noise*rng.NormFloat64()), r.recDrt*(1+aa))
				emit("specific_conductance", r.cond*sev*(1+0.6*aa)*(1+0.1*rng.NormFloat64()), r.recDrt*(1.2+aa))
				if !noDO[s.ID] {
					emit("dissolved_oxygen", -0.6*r.doHeat*sev*(1+aa)*(1+0.1*rng.NormFloat64()), r.recDrt*(1+aa))
				}
			case "flood":
				emit("specific_conductance", -0.4*r.cond*d.Intensity*(1+0.1*rng.NormFloat64()), r.recFlood)
				if !noDO[s.ID] {
					emit("dissolved_oxygen", -r.doFlood*d.Intensity*(1+0.15*rng.NormFloat64()), r.recFlood)
				}
			}
		}
	}
	return out
}

func eventsCSV(events []Event) ([]byte, error) {
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	w.Write([]string{"station", "event", "kind", "variable", "start", "end", "peak_departure", "recovery_days", "recovered", "antecedent_dryness"})
	f := func(x float64) string {
		if math.IsNaN(x) {
			return ""
		}
		return strconv.FormatFloat(x, 'f', -1, 64)
	}
	for _, e := range events {
		w.Write([]string{e.Station, e.Dist.ID, e.Dist.Kind, e.Variable, e.Dist.Start.String(), e.Dist.End.String(),
			f(e.Peak), f(e.Recovery), strconv.FormatBool(e.Recovered), f(e.Dryness)})
	}
	w.Flush()
	return buf.Bytes(), w.Error()
}
