package events

import (
	"math"
	"strings"
	"testing"

	"rebound/index/calendar"
	"rebound/index/series"
)

// station builds a station from columns starting on start.
func station(id string, start calendar.Date, vars map[string][]float64) *series.Station {
	n := 0
	for _, x := range vars {
		n = len(x)
	}
	return &series.Station{ID: id, Start: start, Days: n, Vars: vars}
}

// TestAnalyzeHobday runs the whole heat-wave pipeline on
// heatwave_synth_2001_2006.csv with climatology period 2001–2005 and a
// 5-day minimum. The event and its intensities are those of the Hobday et
// al. (2016) authors' reference code (github ecjoliver/marineHeatWaves
// d7292bf), printed to 6 decimals.
func TestAnalyzeHobday(t *testing.T) {
	x := readCSV(t, "testdata/heatwave_synth_2001_2006.csv", 1)
	s := station("SYN", calendar.New(2001, 1, 1), map[string][]float64{"air_temperature": x})
	o := DefaultOptions()
	o.Climate.FirstYear, o.Climate.LastYear = 2001, 2005
	o.Heat.MinDuration = 5
	o.Drought.Off, o.Flood.Off = true, true
	r, err := Analyze(s, nil, o)
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Events) != 1 {
		t.Fatalf("got %d events, want 1: %+v", len(r.Events), r.Events)
	}
	e := r.Events[0]
	if e.ID != "HW-2006-07-08" || e.Start != date("2006-07-08") || e.End != date("2006-07-27") ||
		e.Duration != 20 || e.DriverPeakDate != date("2006-07-27") {
		t.Errorf("event %s %v..%v (%d days), peak %v; want HW-2006-07-08 2006-07-08..2006-07-27 (20), peak 2006-07-27",
			e.ID, e.Start, e.End, e.Duration, e.DriverPeakDate)
	}
	const tol = 1e-6
	if !close(e.DriverPeak, 4.440432, tol) || !close(e.MeanIntensity, 2.959775, tol) || !close(e.CumIntensity, 59.195491, tol) {
		t.Errorf("intensity max %.6f mean %.6f cum %.6f, want 4.440432 2.959775 59.195491", e.DriverPeak, e.MeanIntensity, e.CumIntensity)
	}
	// The reference code rates the event "Extreme", category IV of Hobday
	// et al. (2018).
	if e.Severity != Extreme || !(e.HeatRatio >= 4) || e.DriverIntensity != e.MeanIntensity {
		t.Errorf("severity %d (ratio %v, driver intensity %v), want %d (ratio >= 4, the mean intensity)", e.Severity, e.HeatRatio, e.DriverIntensity, Extreme)
	}
	// With the package default (3 days) the 4-day August pulse becomes a
	// second event: 2006-08-20..23 at +3.5 °C (by construction of the series).
	o.Heat.MinDuration = 0
	r, _ = Analyze(s, nil, o)
	var ids []string
	for _, e := range r.Events {
		ids = append(ids, e.ID)
	}
	if got := strings.Join(ids, " "); !strings.Contains(got, "HW-2006-08-20") {
		t.Errorf("events with the 3-day minimum: %s, want HW-2006-08-20 among them", got)
	}
}

// plantedHeat is a station with planted heat waves and water-temperature
// responses. Air temperature alternates 15.5 and 14.5 °C, so the smoothed
// 90th percentile is 15.5 everywhere (by hand: no pool holds more than 10
// planted values of 132) and only planted days (21.5 °C) exceed it. Water
// temperature is 10 °C plus planted departures; the climatological mean
// absorbs at most about 0.4 °C of them, well inside the margins below.
func plantedHeat() (*series.Station, calendar.Date) {
	start := calendar.New(2009, 1, 1)
	n := int(calendar.New(2021, 1, 1) - start)
	air, water := make([]float64, n), make([]float64, n)
	for i := range n {
		air[i] = 14.5
		if i%2 == 0 {
			air[i] = 15.5
		}
		water[i] = 10
	}
	set := func(x []float64, from, to string, v float64) {
		for d := date(from); d <= date(to); d++ {
			x[d-start] = v
		}
	}
	heat := func(from, to string) { set(air, from, to, 21.5) }
	warm := func(from, to string, dep float64) { set(water, from, to, 10+dep) }

	// Back-to-back: 3 days apart, more than the 2-day join gap.
	heat("2015-07-01", "2015-07-10")
	heat("2015-07-14", "2015-07-20")
	warm("2015-07-05", "2015-07-10", 3)
	warm("2015-07-11", "2015-07-11", 5)
	warm("2015-07-12", "2015-07-13", 3)
	warm("2015-07-14", "2015-07-20", 4)
	warm("2015-07-18", "2015-07-18", 6)
	warm("2015-07-21", "2015-07-21", 2)
	// Over 29 February of a leap year.
	heat("2016-02-26", "2016-03-03")
	warm("2016-02-28", "2016-03-05", 3)
	warm("2016-02-29", "2016-02-29", 6)
	// Over the new year.
	heat("2019-12-29", "2020-01-04")
	warm("2019-12-30", "2020-01-06", 3)
	warm("2020-01-01", "2020-01-01", 6)
	// At the end of the record.
	heat("2020-12-26", "2020-12-29")
	warm("2020-12-26", "2020-12-30", 3)
	warm("2020-12-31", "2020-12-31", 5)
	// Followed by a 5-day gap in water temperature.
	heat("2013-06-01", "2013-06-05")
	warm("2013-06-01", "2013-06-06", 3)
	warm("2013-06-03", "2013-06-03", 5)
	set(water, "2013-06-07", "2013-06-11", math.NaN())
	// Too short to be a heat wave.
	heat("2014-08-01", "2014-08-02")
	return station("PLANT", start, map[string][]float64{"air_temperature": air, "water_temperature": water}), start
}

// plantedOptions are the options the planted records were worked by hand
// with: heat waves in every month, a fixed drought threshold pooled by the
// time criterion alone, no minor-deficit removal, and recovery censored by
// any next event.
func plantedOptions() Options {
	o := DefaultOptions()
	o.Heat.Months = nil
	o.Drought.Threshold, o.Drought.PoolRatio, o.Drought.MinDeficitFraction = Fixed, 0, 0
	o.Recovery.CensorBy = CensorAny
	return o
}

func TestAnalyzePlantedHeat(t *testing.T) {
	s, _ := plantedHeat()
	o := plantedOptions()
	o.Responses = []Variable{{Name: "water_temperature", Harmful: +1, Tolerance: 1}}
	users := []UserEvent{
		{Kind: "spill", Start: date("2018-05-01"), End: date("2018-05-03")},
		{Kind: "spill", Start: date("2018-05-01"), End: date("2018-05-05"), Station: "PLANT"},
		{Kind: "spill", Start: date("2018-06-01"), End: date("2018-06-03"), Station: "OTHER"},
		{Kind: "works", Start: date("2008-12-20"), End: date("2009-01-03")},
		{Kind: "works", Start: date("2030-01-01"), End: date("2030-01-03")},
	}
	r, err := Analyze(s, users, o)
	if err != nil {
		t.Fatal(err)
	}
	// Every expected value below follows from the planted series by hand.
	type want struct {
		id           string
		end          string
		duration     int
		peakDate     string
		timeToPeak   int
		peak         float64 // ± 0.5: the climatology absorbs part of it
		recovered    bool
		recoveryDays int
		censor       Censor
	}
	wants := []want{
		{"works-2009-01-01", "2009-01-03", 3, "", -2, 0, true, 1, NotCensored},
		{"HW-2013-06-01", "2013-06-05", 5, "2013-06-03", 2, 5, false, 1, DataGap},
		{"HW-2015-07-01", "2015-07-10", 10, "2015-07-11", 10, 5, false, 3, NextEvent},
		{"HW-2015-07-14", "2015-07-20", 7, "2015-07-18", 4, 6, true, 2, NotCensored},
		{"HW-2016-02-26", "2016-03-03", 7, "2016-02-29", 3, 6, true, 3, NotCensored},
		{"spill-2018-05-01", "2018-05-03", 3, "", -2, 0, true, 1, NotCensored},
		{"spill-2018-05-01-2", "2018-05-05", 5, "", -2, 0, true, 1, NotCensored},
		{"HW-2019-12-29", "2020-01-04", 7, "2020-01-01", 3, 6, true, 3, NotCensored},
		{"HW-2020-12-26", "2020-12-29", 4, "2020-12-31", 5, 5, false, 2, RecordEnd},
	}
	if len(r.Events) != len(wants) {
		for _, e := range r.Events {
			t.Logf("%s %v..%v", e.ID, e.Start, e.End)
		}
		t.Fatalf("got %d events, want %d", len(r.Events), len(wants))
	}
	for i, e := range r.Events {
		w := wants[i]
		if e.ID != w.id || e.End != date(w.end) || e.Duration != w.duration {
			t.Errorf("event %d: %s ending %v (%d days), want %s ending %s (%d)", i, e.ID, e.End, e.Duration, w.id, w.end, w.duration)
			continue
		}
		if len(e.Responses) != 1 {
			t.Errorf("%s: %d responses, want 1", e.ID, len(e.Responses))
			continue
		}
		v := e.Responses[0]
		if w.timeToPeak != -2 { // -2: a flat response, no single peak day
			if v.TimeToPeak != w.timeToPeak || v.PeakDate != date(w.peakDate) || math.Abs(v.PeakDeparture-w.peak) > 0.5 {
				t.Errorf("%s: peak %.2f on %v (day %d), want %.0f on %s (day %d)",
					e.ID, v.PeakDeparture, v.PeakDate, v.TimeToPeak, w.peak, w.peakDate, w.timeToPeak)
			}
		}
		if v.Recovered != w.recovered || v.RecoveryDays != w.recoveryDays || v.Censor != w.censor {
			t.Errorf("%s: recovered %v after %d days (%q), want %v %d (%q)",
				e.ID, v.Recovered, v.RecoveryDays, v.Censor, w.recovered, w.recoveryDays, w.censor)
		}
		if e.Kind == HeatWaveKind && !(e.DriverPeak > 6 && e.DriverPeak < 6.5) {
			// 21.5 − a seasonal mean a little above 15.
			t.Errorf("%s: air-temperature peak departure %.3f, want 6..6.5", e.ID, e.DriverPeak)
		}
		if !math.IsNaN(e.AntecedentDryness) {
			t.Errorf("%s: antecedent dryness %v without discharge, want NaN", e.ID, e.AntecedentDryness)
		}
	}
	// Warnings: no discharge (droughts, floods), one user event cut to the
	// record and one outside it.
	if len(r.Warnings) != 4 {
		t.Errorf("warnings: %v, want 4", r.Warnings)
	}
	rows := r.Rows(nil)
	if len(rows) != len(wants) || rows[2].EventID != "HW-2015-07-01" || rows[2].Censor != NextEvent || rows[2].Station != "PLANT" {
		t.Errorf("rows: %+v", rows)
	}
}

// TestAnalyzePlantedFlow checks droughts, floods and antecedent dryness on
// planted_flow.csv. Droughts and dryness come from testdata/planted_flow.py
// (numpy 1.24.2), floods from the planted hydrographs by hand (Q5 = 11
// m³/s, numpy 1.24.2 np.percentile).
func TestAnalyzePlantedFlow(t *testing.T) {
	q := readCSV(t, "testdata/planted_flow.csv", 1)
	s := station("FLOW", calendar.New(2009, 1, 1), map[string][]float64{"discharge": q})
	users := []UserEvent{
		{Kind: "check", Start: date("2011-01-01"), End: date("2011-01-01")},
		{Kind: "check", Start: date("2012-07-20"), End: date("2012-07-20")},
		{Kind: "check", Start: date("2013-06-01"), End: date("2013-06-01")},
		{Kind: "check", Start: date("2009-06-01"), End: date("2009-06-01")},
		{Kind: "check", Start: date("2016-03-10"), End: date("2016-03-10")},
	}
	o := plantedOptions()
	o.Heat.Off = true
	r, err := Analyze(s, users, o)
	if err != nil {
		t.Fatal(err)
	}
	type want struct {
		id             string
		end            string
		driverPeak     float64
		driverPeakDate string
		deficit        float64
	}
	nan := math.NaN()
	wants := []want{
		{"check-2009-06-01", "2009-06-01", nan, "", nan},
		{"DR-2010-08-01", "2010-08-20", 5, "2010-08-01", 80},
		{"check-2011-01-01", "2011-01-01", nan, "", nan},
		{"FL-2011-04-10", "2011-04-13", 60, "2011-04-10", nan},
		{"DR-2012-07-01", "2012-07-16", 6, "2012-07-01", 36},
		{"check-2012-07-20", "2012-07-20", nan, "", nan},
		{"check-2013-06-01", "2013-06-01", nan, "", nan},
		{"FL-2014-05-01", "2014-05-11", 14, "2014-05-11", nan},
		{"FL-2015-06-01", "2015-06-01", 30, "2015-06-01", nan},
		{"FL-2015-06-15", "2015-06-15", 25, "2015-06-15", nan},
		{"DR-2016-02-27", "2016-03-04", 7, "2016-02-27", 14},
		{"check-2016-03-10", "2016-03-10", nan, "", nan},
	}
	if len(r.Events) != len(wants) {
		for _, e := range r.Events {
			t.Logf("%s %v..%v", e.ID, e.Start, e.End)
		}
		t.Fatalf("got %d events, want %d", len(r.Events), len(wants))
	}
	for i, e := range r.Events {
		w := wants[i]
		if e.ID != w.id || e.End != date(w.end) || !close(e.DriverPeak, w.driverPeak, 0) ||
			(w.driverPeakDate != "" && e.DriverPeakDate != date(w.driverPeakDate)) ||
			!close(e.Deficit, w.deficit, 1e-12) || !close(e.DeficitVolume, w.deficit*86400, 1e-12) {
			t.Errorf("event %d: %s ending %v, driver %v on %v, deficit %v (%v m³); want %+v",
				i, e.ID, e.End, e.DriverPeak, e.DriverPeakDate, e.Deficit, e.DeficitVolume, w)
		}
	}

	// Antecedent dryness of the check events: testdata/planted_flow.py.
	for _, tc := range []struct {
		measure Dryness
		want    map[string]float64
	}{
		{Fraction, map[string]float64{
			"check-2011-01-01": 0.054794520548, // 20/365
			"check-2012-07-20": 0.043835616438, // 16/365
			"check-2013-06-01": 0.043835616438,
			"check-2009-06-01": nan,            // the window starts before the record
			"check-2016-03-10": 0.019178082192, // 7/365
		}},
		{Index, map[string]float64{
			"check-2011-01-01": 2.223431091991,
			"check-2012-07-20": 0.582877953715,
			"check-2013-06-01": 0.582877953715,
			"check-2009-06-01": nan,
			"check-2016-03-10": -0.237398615423,
		}},
	} {
		o.Antecedent.Measure = tc.measure
		r, err := Analyze(s, users, o)
		if err != nil {
			t.Fatal(err)
		}
		for _, e := range r.Events {
			if w, ok := tc.want[e.ID]; ok && !close(e.AntecedentDryness, w, 1e-9) {
				t.Errorf("%s: %s dryness %.12f, want %.12f", tc.measure, e.ID, e.AntecedentDryness, w)
			}
		}
	}
}

func TestAnalyzeDroughtOptions(t *testing.T) {
	q := readCSV(t, "testdata/planted_flow.csv", 1)
	s := station("FLOW", calendar.New(2009, 1, 1), map[string][]float64{"discharge": q})
	for _, tc := range []struct {
		name   string
		change func(*Options)
		want   []string
	}{
		// By hand: with a 3-day minimum the 3-day event of 2013 stays.
		{"min 3", func(o *Options) { o.Drought.MinDuration = 3 },
			[]string{"DR-2010-08-01", "DR-2012-07-01", "DR-2013-09-10", "DR-2016-02-27"}},
		// By hand: without pooling 2012 splits (the gap is 4 days) and both
		// 6-day halves stay.
		{"pool 0", func(o *Options) { o.Drought.Pool = 0 },
			[]string{"DR-2010-08-01", "DR-2012-07-01", "DR-2012-07-11", "DR-2016-02-27"}},
		// By hand: the daily 20th percentile is 9 m³/s on every calendar
		// day, as the fixed one is (no pool of 88 values holds more than 11
		// planted low flows, below its 18th value), so the events agree.
		{"daily threshold", func(o *Options) { o.Drought.Threshold = Daily },
			[]string{"DR-2010-08-01", "DR-2012-07-01", "DR-2016-02-27"}},
		// By hand: 14 < 0.3 × 80 removes the 2016 event; 36 stays.
		{"minor by deficit", func(o *Options) { o.Drought.MinDeficitFraction = 0.3 },
			[]string{"DR-2010-08-01", "DR-2012-07-01"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			o := plantedOptions()
			o.Heat.Off, o.Flood.Off = true, true
			tc.change(&o)
			r, err := Analyze(s, nil, o)
			if err != nil {
				t.Fatal(err)
			}
			var got []string
			for _, e := range r.Events {
				got = append(got, e.ID)
			}
			if strings.Join(got, " ") != strings.Join(tc.want, " ") {
				t.Errorf("got %v, want %v", got, tc.want)
			}
		})
	}
}

func TestValidate(t *testing.T) {
	for _, tc := range []struct {
		name   string
		change func(*Options)
		want   string
	}{
		{"default", func(*Options) {}, ""},
		{"zero", func(o *Options) { *o = Options{} }, ""},
		{"percentile", func(o *Options) { o.Heat.Percentile = 100 }, "heat.percentile: want a percentile strictly between 0 and 100, got 100"},
		{"smooth even", func(o *Options) { o.Climate.Smooth = 30 }, "climate.smooth: want an odd number of days up to 365 (or 0 for 31), got 30"},
		{"year fraction", func(o *Options) { o.Climate.YearFraction = 2 }, "climate.year_fraction: want a number in [0, 1], got 2"},
		{"years", func(o *Options) { o.Climate.FirstYear, o.Climate.LastYear = 2005, 2001 }, "climate.last_year: want a year >= first_year = 2005, got 2001"},
		{"threshold", func(o *Options) { o.Drought.Threshold = "monthly" }, `drought.threshold: want "fixed" or "daily", got "monthly"`},
		{"pool", func(o *Options) { o.Drought.Pool = -1 }, "drought.pool: want days >= 0, got -1"},
		{"trough", func(o *Options) { o.Flood.Trough = 1.5 }, "flood.trough: want a number in [0, 1], got 1.5"},
		{"harmful", func(o *Options) { o.Responses[1].Harmful = 0 }, "responses[1].harmful: want +1 (increase harmful) or -1 (decrease harmful), got 0"},
		{"twice", func(o *Options) { o.Responses[2].Name = o.Responses[0].Name }, `responses[2].name: "water_temperature" is listed twice`},
		{"measure", func(o *Options) { o.Antecedent.Measure = "spi" }, `antecedent.measure: want "fraction" or "index", got "spi"`},
		{"coverage", func(o *Options) { o.Antecedent.MinCoverage = math.NaN() }, "antecedent.min_coverage: want a number in [0, 1], got NaN"},
		{"month", func(o *Options) { o.Heat.Months = Months{6, 13} }, "heat.months[2]: want a month 1–12, got 13"},
		{"censor rule", func(o *Options) { o.Recovery.CensorBy = "kind" }, `recovery.censor_by: want one of ["same_kind_or_severe" "any" "same_kind" "severe"], got "kind"`},
		{"censor class", func(o *Options) { o.Recovery.CensorMinSeverity = 5 }, "recovery.censor_min_severity: want a class 1–4, got 5"},
		{"return periods", func(o *Options) { o.Severity.ReturnPeriods = [3]float64{10, 2, 50} }, "severity.return_periods: want three increasing return periods above 1 year, got [10 2 50]"},
		{"probabilities", func(o *Options) { o.Severity.Probabilities = [3]float64{0.5, 0.8, 1} }, "severity.probabilities: want three increasing probabilities strictly between 0 and 1, got [0.5 0.8 1]"},
		{"pool ratio", func(o *Options) { o.Drought.PoolRatio = -0.1 }, "drought.pool_ratio: want a number in [0, +Inf], got -0.1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			o := DefaultOptions()
			tc.change(&o)
			got := ""
			if err := o.Validate(); err != nil {
				got = err.Error()
			}
			if got != tc.want {
				t.Errorf("got %q, want %q", got, tc.want)
			}
		})
	}
}

// TestAnalyzeEmpty checks that stations with nothing in them give warnings,
// not panics.
func TestAnalyzeEmpty(t *testing.T) {
	users := []UserEvent{{Kind: "spill", Start: date("2019-07-03"), End: date("2019-07-05")}}
	for _, s := range []*series.Station{
		{ID: "NONE", Start: date("2019-01-01")},
		{ID: "EMPTY", Start: date("2019-01-01"), Vars: map[string][]float64{"air_temperature": {}, "discharge": {}, "water_temperature": {}}},
		{ID: "NAN", Start: date("2019-01-01"), Days: 3, Vars: map[string][]float64{
			"air_temperature": {math.NaN(), math.NaN(), math.NaN()}, "discharge": {math.NaN(), math.NaN(), math.NaN()}}},
	} {
		r, err := Analyze(s, users, DefaultOptions())
		if err != nil {
			t.Fatal(err)
		}
		if len(r.Events) != 0 || len(r.Warnings) == 0 {
			t.Errorf("%s: %d events, warnings %v; want none and some", s.ID, len(r.Events), r.Warnings)
		}
	}
}
