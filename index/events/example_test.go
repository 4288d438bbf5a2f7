package events_test

import (
	"fmt"
	"strings"

	"rebound/index/calendar"
	"rebound/index/events"
	"rebound/index/series"
)

// A heat wave with a given climatology: a seasonal mean of 15 °C and a
// threshold of 18 °C (Hobday et al. 2016 rules: 5-day minimum, then gaps of
// 2 days or fewer joined).
func ExampleHeatWaves() {
	temp := []float64{16, 16, 16, 16, 18.5, 19, 20.5, 19.5, 18.2, 17, 17.5, 18.4, 19.2, 21, 19.8, 18.6, 16}
	seas, thresh := make([]float64, len(temp)), make([]float64, len(temp))
	for i := range temp {
		seas[i], thresh[i] = 15, 18
	}
	for _, hw := range events.HeatWaves(temp, seas, thresh, 5, 2) {
		fmt.Printf("days %d–%d (%d), peak day %d at +%.1f °C, mean +%.4f °C, cumulative %.1f °C·d\n",
			hw.Start+1, hw.End+1, hw.Len(), hw.Peak+1, hw.MaxIntensity, hw.MeanIntensity, hw.CumIntensity)
	}
	// Output:
	// days 5–16 (12), peak day 14 at +6.0 °C, mean +3.9333 °C, cumulative 47.2 °C·d
}

// Droughts by the threshold level method with a fixed threshold of 10 m³/s,
// runs 2 days apart or less pooled and events under 3 days removed.
func ExampleDroughts() {
	q := []float64{15, 14, 13, 12, 11, 9, 8, 7, 8, 9, 11, 10.5, 9.5, 8, 6, 5, 7, 12, 14, 13,
		12, 11, 9, 9.5, 11, 12, 13, 12, 11, 10.2, 8, 7, 6, 6.5, 7.5, 9, 11, 12, 12, 13}
	thr := make([]float64, len(q))
	for i := range thr {
		thr[i] = 10
	}
	for _, d := range events.Droughts(q, thr, events.DroughtCriteria{Pool: 2, MinDuration: 3}) {
		fmt.Printf("days %d–%d: deficit %.1f m³/s·d = %.0f m³, lowest %.1f m³/s on day %d\n",
			d.Start+1, d.End+1, d.Deficit, d.Deficit*86400, d.MinFlow, d.Min+1)
	}
	// Output:
	// days 6–17: deficit 23.5 m³/s·d = 2030400 m³, lowest 5.0 m³/s on day 16
	// days 31–36: deficit 16.0 m³/s·d = 1382400 m³, lowest 6.0 m³/s on day 33
}

func ExampleReadUserEvents() {
	in := "kind,start,end,station\nspill,2019-07-03,2019-07-05,R1\nworks,2019-07-01,2019-06-30,\n"
	_, err := events.ReadUserEvents(strings.NewReader(in), "events.csv")
	fmt.Println(err)
	// Output:
	// events.csv:3:18: end: want a date >= start 2019-07-01, got "2019-06-30"
}

func ExampleAnalyze() {
	// Five years of invented air and water temperature at a station whose
	// normal is flat, with one heat wave in July of the last year.
	start := calendar.New(2016, 1, 1)
	n := int(calendar.New(2021, 1, 1) - start)
	air, water := make([]float64, n), make([]float64, n)
	for i := range n {
		air[i], water[i] = 14.5+float64(i%2), 12
	}
	hw := int(calendar.New(2020, 7, 10) - start)
	for i := hw; i < hw+6; i++ {
		air[i] = 22
		water[i] = 12 + float64(i-hw+1)*0.5 // warms by 0.5 °C a day
	}
	water[hw+6], water[hw+7] = 14, 13 // then cools over two days
	s := &series.Station{ID: "R1", Start: start, Days: n,
		Vars: map[string][]float64{"air_temperature": air, "water_temperature": water}}

	o := events.DefaultOptions()
	o.Drought.Off, o.Flood.Off = true, true
	o.Responses = []events.Variable{{Name: "water_temperature", Harmful: +1, Tolerance: 0.5}}
	r, err := events.Analyze(s, nil, o)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, row := range r.Rows(nil) {
		fmt.Printf("%s %s %v..%v: peak %+.2f °C on %v (day %d), recovered %v after %d days\n",
			row.Station, row.EventID, row.Start, row.End, row.PeakDeparture, row.PeakDate, row.TimeToPeak,
			row.Recovered, row.RecoveryDays)
	}
	// Output:
	// R1 HW-2020-07-10 2020-07-10..2020-07-15: peak +2.91 °C on 2020-07-15 (day 5), recovered true after 3 days
}
