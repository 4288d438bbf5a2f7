package index_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"rebound/attributes"
	"rebound/config"
	"rebound/index"
	"rebound/index/calendar"
	"rebound/index/events"
	"rebound/index/series"
)

// plantedStation builds 30 years (1991–2020) of daily air and water
// temperature. Air alternates 15.5 and 14.5 °C, so the 90th percentile of
// every calendar day's pool is 15.5 and only planted days exceed it; the
// seasonal mean is about 15, so the threshold stands about 0.5 °C above
// it (by hand, as in the events package's planted records). Water is
// 10 °C. plant(year) returns the heat waves of a year: start (month, day),
// length in days, air temperature on those days and the water warming on
// those days.
func plantedStation(id string, plant func(year int) []heat) *series.Station {
	start := calendar.New(1991, 1, 1)
	n := int(calendar.New(2021, 1, 1) - start)
	air, water := make([]float64, n), make([]float64, n)
	for i := range n {
		air[i] = 14.5
		if i%2 == 0 {
			air[i] = 15.5
		}
		water[i] = 10
	}
	for y := 1991; y <= 2020; y++ {
		for _, h := range plant(y) {
			d0 := int(calendar.New(y, h.month, h.day) - start)
			for d := d0; d < d0+h.days; d++ {
				air[d], water[d] = h.air, 10+h.warming
			}
		}
	}
	return &series.Station{ID: id, Start: start, Days: n,
		Vars: map[string][]float64{"air_temperature": air, "water_temperature": water}}
}

type heat struct {
	month, day, days int
	air, warming     float64
}

// rank derives the events of the stations with the default event options,
// and computes one indicator with the configuration's defaults otherwise.
func indicatorValues(t *testing.T, stations []*series.Station, ind config.Indicator) []float64 {
	t.Helper()
	o := events.DefaultOptions()
	o.Responses = []events.Variable{{Name: "water_temperature", Harmful: +1, Tolerance: 0.5, Driver: events.HeatWaveKind}}
	o.Drought.Off, o.Flood.Off = true, true
	tab := &index.EventTable{File: "derived", Has: map[string]bool{"severity": true, "driver_intensity": true, "censor_reason": true}}
	var csv strings.Builder
	csv.WriteString("station,name,latitude,longitude\n")
	for k, s := range stations {
		r, err := events.Analyze(s, nil, o)
		if err != nil {
			t.Fatal(err)
		}
		for _, row := range r.Rows(nil) {
			tab.Events = append(tab.Events, index.Event{Station: row.Station, ID: row.EventID, Kind: row.Kind,
				Variable: row.Variable, Start: row.Start, End: row.End, PeakDeparture: row.PeakDeparture,
				RecoveryDays: float64(row.RecoveryDays), Recovered: row.Recovered, Dryness: row.AntecedentDryness,
				Severity: row.Severity, DriverIntensity: row.DriverIntensity, Censor: string(row.Censor)})
		}
		fmt.Fprintf(&csv, "%s,%s,45.%d,-30.%d\n", s.ID, s.ID, k, k)
	}
	attrs, errs := attributes.ReadCSV(strings.NewReader(csv.String()), "stations.csv")
	if errs != nil {
		t.Fatal(errs)
	}
	cfg := config.Default()
	cfg.Indicators = []config.Indicator{ind}
	raw, errs := index.Compute(tab, attrs, cfg, nil)
	if errs != nil {
		t.Fatal(errs)
	}
	out := make([]float64, len(stations))
	for i := range stations {
		out[i] = raw.Values[i][0]
	}
	return out
}

// TestSevereEventsRank: four stations with three mild heat waves every
// summer (air 15.9 °C, 0.9 above normal: ratio about 1.8, Hobday category
// I) and two severe ones in 30 years (air 20 °C: category IV). Station k
// (0–3) warms by 4 − k °C in the mild ones and by 1 + k °C in the severe
// ones, so by its response to the severe heat waves station 0 is the most
// resilient and station 3 the least. With the default min_severity
// (strong and above) the median warming follows the severe responses;
// counting every heat wave (min_severity = 1) the 90 mild ones outvote the
// two severe ones and the order turns round. Constructed by hand.
func TestSevereEventsRank(t *testing.T) {
	var stations []*series.Station
	for k := range 4 {
		mild, severe := 4-float64(k), 1+float64(k)
		stations = append(stations, plantedStation(fmt.Sprintf("S%d", k), func(y int) []heat {
			h := []heat{{6, 10, 4, 15.9, mild}, {7, 5, 4, 15.9, mild}, {8, 20, 4, 15.9, mild}}
			if y == 2003 || y == 2018 {
				h = append(h, heat{7, 20, 10, 20, severe})
			}
			return h
		}))
	}
	ind := config.Indicator{Name: "heat", Measure: config.Magnitude, Kinds: []string{"heatwave"},
		Variables: []string{"water_temperature"}, Better: config.Lower, EventWeights: config.WeightNone}
	got := indicatorValues(t, stations, ind)
	for k, v := range got {
		if want := 1 + float64(k); math.Abs(v-want) > 0.1 {
			t.Errorf("default: station %d median warming %.3f, want %.0f ± 0.1 (the severe response)", k, v, want)
		}
	}
	one := 1
	ind.MinSeverity = &one
	got = indicatorValues(t, stations, ind)
	// The normals absorb part of the mild warming, planted on 12 days of
	// every summer, so the medians are 80–100% of it; what matters is the
	// order, which is the reverse of the default's.
	for k, v := range got {
		if want := 4 - float64(k); !(v >= 0.8*want && v <= want) {
			t.Errorf("every event: station %d median warming %.3f, want 80-100%% of %.0f (the mild response)", k, v, want)
		}
	}
}

// TestResponseSlopeLikeForLike: two stations warm by the same 0.6 °C per
// °C of air-temperature anomaly, but station A sees heat waves 2–4 °C above
// normal and station B 4–8 °C. Their magnitudes differ by about a factor of
// two; their response slopes agree, 0.6 within 2% (by construction; the
// seasonal normals absorb a little of the planted warming).
func TestResponseSlopeLikeForLike(t *testing.T) {
	const beta = 0.6
	mk := func(id string, lo, hi float64) *series.Station {
		return plantedStation(id, func(y int) []heat {
			a := lo + (hi-lo)*float64((y*7)%10)/9 // a spread of anomalies
			return []heat{{7, 10, 6, 15 + a, beta * a}}
		})
	}
	stations := []*series.Station{mk("A", 2, 4), mk("B", 4, 8)}
	slope := config.Indicator{Name: "per_degree", Measure: config.ResponseSlope, Kinds: []string{"heatwave"},
		Variables: []string{"water_temperature"}, Better: config.Lower, EventWeights: config.WeightNone}
	got := indicatorValues(t, stations, slope)
	for i, v := range got {
		if math.Abs(v-beta) > 0.02*beta {
			t.Errorf("station %s: slope %.4f, want %.2f within 2%%", stations[i].ID, v, beta)
		}
	}
	mag := slope
	mag.Measure = config.Magnitude
	one := 1
	mag.MinSeverity = &one
	m := indicatorValues(t, stations, mag)
	if !(m[1] > 1.5*m[0]) {
		t.Errorf("magnitudes %v: want station B's well above A's (it faced hotter heat waves)", m)
	}
}

// TestSeverityColumn: the optional columns are read, a bad class is an
// error at its line and column (counted by hand), and an explicit severity floor on a table
// without the column is an error naming the key.
func TestSeverityColumn(t *testing.T) {
	head := "station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness,severity,driver_intensity,censor_reason\n"
	tab, errs := index.ReadEvents(strings.NewReader(head+
		"S0,H1,heatwave,water_temperature,2019-07-01,2019-07-05,2,4,true,,strong,3.5,\n"+
		"S0,H2,heatwave,water_temperature,2020-07-01,2020-07-05,2,4,false,,1,2.5,next_event\n"), "e.csv")
	if errs != nil {
		t.Fatal(errs)
	}
	if e := tab.Events[0]; e.Severity != 2 || e.DriverIntensity != 3.5 || !tab.Has["severity"] {
		t.Errorf("row 1: %+v", e)
	}
	if e := tab.Events[1]; e.Severity != 1 || e.Censor != "next_event" {
		t.Errorf("row 2: %+v", e)
	}
	_, errs = index.ReadEvents(strings.NewReader(head+
		"S0,H1,heatwave,water_temperature,2019-07-01,2019-07-05,2,4,true,,5,3.5,later\n"), "e.csv")
	var got []string
	for _, e := range errs {
		got = append(got, e.Error())
	}
	all := strings.Join(got, "\n")
	for _, want := range []string{
		`e.csv:2:66: severity: want a severity class 0-4 or one of ["unrated" "moderate" "strong" "severe" "extreme"], got "5"`,
		`e.csv:2:72: censor_reason: want blank or one of ["record_end" "gap" "next_event"], got "later"`,
	} {
		if !strings.Contains(all, want) {
			t.Errorf("missing %q in:\n%s", want, all)
		}
	}

	plain, errs := index.ReadEvents(strings.NewReader(
		"station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness\n"+
			"S0,H1,heatwave,water_temperature,2019-07-01,2019-07-05,2,4,true,\n"), "plain.csv")
	if errs != nil {
		t.Fatal(errs)
	}
	attrs, _ := attributes.ReadCSV(strings.NewReader("station,name,latitude,longitude\nS0,S0,45,-30\n"), "stations.csv")
	cfg := config.Default()
	cfg.File = "study.toml"
	three := 3
	cfg.Indicators = []config.Indicator{{Name: "heat", Measure: config.Magnitude, Kinds: []string{"heatwave"},
		Variables: []string{"water_temperature"}, Better: config.Lower, MinSeverity: &three}}
	if _, errs := index.Compute(plain, attrs, cfg, nil); len(errs) == 0 ||
		!strings.Contains(errs[0].Error(), "indicator[1].min_severity: plain.csv has no severity column") {
		t.Errorf("explicit floor without the column: %v", errs)
	}
}

// TestSharedBasis: by hand. Three stations with a record through 2019
// (marked by user events on its first and last day). S0 and S1 have heat
// waves on 07-01..05 and 07-03..08, S2 one on 08-01..03. With min_share
// 0.5 the regional heat wave is 07-03..05 (two of three stations); S2's
// August heat wave is its own and does not count under basis = "shared".
func TestSharedBasis(t *testing.T) {
	rows := "station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness,severity\n"
	for _, s := range []string{"S0", "S1", "S2"} {
		rows += s + ",M1,marker,water_temperature,2019-01-01,2019-01-01,0,1,true,,0\n"
		rows += s + ",M2,marker,water_temperature,2019-12-31,2019-12-31,0,0,false,,0\n"
	}
	rows += "S0,H1,heatwave,water_temperature,2019-07-01,2019-07-05,2,4,true,,2\n"
	rows += "S1,H1,heatwave,water_temperature,2019-07-03,2019-07-08,3,4,true,,2\n"
	rows += "S2,H1,heatwave,water_temperature,2019-08-01,2019-08-03,4,4,true,,2\n"
	tab, errs := index.ReadEvents(strings.NewReader(rows), "e.csv")
	if errs != nil {
		t.Fatal(errs)
	}
	attrs, _ := attributes.ReadCSV(strings.NewReader("station,name,latitude,longitude\nS0,a,45,-30\nS1,b,45,-31\nS2,c,45,-32\n"), "stations.csv")
	cfg := config.Default()
	cfg.Comparison = config.Comparison{Basis: config.BasisShared, MinShare: 0.5}
	cfg.Indicators = []config.Indicator{{Name: "heat", Measure: config.Magnitude, Kinds: []string{"heatwave"},
		Variables: []string{"water_temperature"}, Better: config.Lower, EventWeights: config.WeightNone}}
	raw, errs := index.Compute(tab, attrs, cfg, nil)
	if errs != nil {
		t.Fatal(errs)
	}
	var hw []index.RegionalEvent
	for _, r := range raw.Regional {
		if r.Kind == "heatwave" {
			hw = append(hw, r)
		}
	}
	if len(hw) != 1 || hw[0].Start.String() != "2019-07-03" || hw[0].End.String() != "2019-07-05" || hw[0].Stations != 2 {
		t.Fatalf("regional heat waves %+v, want one, 2019-07-03..05, 2 stations", hw)
	}
	if v := raw.Values; v[0][0] != 2 || v[1][0] != 3 || !math.IsNaN(v[2][0]) {
		t.Errorf("shared-basis magnitudes %v %v %v, want 2 3 NaN", v[0][0], v[1][0], v[2][0])
	}
	cfg.Comparison.Basis = config.BasisStation
	raw, _ = index.Compute(tab, attrs, cfg, nil)
	if raw.Values[2][0] != 4 {
		t.Errorf("station basis: S2 %v, want 4", raw.Values[2][0])
	}
}
