package features

import (
	"bytes"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"rebound/index/calendar"
	"rebound/index/series"
)

func TestNew(t *testing.T) {
	e, err := New(Config{})
	if err != nil {
		t.Fatal(err)
	}
	if got := e.Names(); !slices.Equal(got, DefaultFeatures()) || len(got) != 30 {
		t.Errorf("default names %v", got)
	}
	if got := e.Vars(); !slices.Equal(got, []string{series.WaterTemperature, series.AirTemperature, series.Discharge}) {
		t.Errorf("default vars %v", got)
	}
	for _, tc := range []struct {
		features []string
		want     string
	}{
		{[]string{"discharge.median"}, `features: "discharge.median": unknown statistic "median"; want one of mean, sd, cv, skew, lag1, amplitude, phase, p10, p90, flashiness, bfi, q90_q50, thermal_sensitivity, air_lag or pNN`},
		{[]string{"discharge"}, `features: "discharge": want <variable>.<statistic>`},
		{[]string{"discharge."}, `features: "discharge.": want <variable>.<statistic>`},
		{[]string{"discharge.air_lag"}, `features: "discharge.air_lag": air_lag is defined for water_temperature only`},
		{[]string{"discharge.p0"}, `features: "discharge.p0": unknown statistic "p0"; want one of mean, sd, cv, skew, lag1, amplitude, phase, p10, p90, flashiness, bfi, q90_q50, thermal_sensitivity, air_lag or pNN`},
		{[]string{"a.mean", "a.mean"}, `features: "a.mean" listed twice`},
		{[]string{}, `features: no features configured`},
	} {
		if _, err := New(Config{Features: tc.features}); err == nil || err.Error() != tc.want {
			t.Errorf("New(%q) = %v, want %s", tc.features, err, tc.want)
		}
	}
	e, err = New(Config{Features: []string{"water_temperature.air_lag", "turbidity.p95"}})
	if err != nil || !slices.Equal(e.Vars(), []string{series.WaterTemperature, series.AirTemperature, "turbidity"}) {
		t.Errorf("vars %v, %v", e.Vars(), err)
	}
}

func TestAvailable(t *testing.T) {
	vars := []series.Var{{Name: series.WaterTemperature, Units: "degF"}, {Name: series.AirTemperature},
		{Name: series.Discharge, Units: "cfs"}, {Name: "conductance", Units: "uS/cm"}}
	infos := Available(vars...)
	units := map[string]string{}
	var names []string
	for _, in := range infos {
		units[in.Name] = in.Units
		names = append(names, in.Name)
		if in.Definition == "" {
			t.Errorf("%s: no definition", in.Name)
		}
	}
	for name, want := range map[string]string{
		"water_temperature.mean": "°C", "water_temperature.phase": "day of year", "water_temperature.air_lag": "days",
		"discharge.p10": "m³/s", "discharge.bfi": "1", "conductance.sd": "uS/cm", "air_temperature.amplitude": "°C",
	} {
		if units[name] != want {
			t.Errorf("units of %s = %q, want %q", name, units[name], want)
		}
	}
	if _, ok := units["conductance.bfi"]; ok {
		t.Error("flow statistics listed for conductance")
	}
	if _, err := New(Config{Features: names}); err != nil {
		t.Errorf("available names rejected: %v", err)
	}
	for _, name := range DefaultFeatures() {
		if _, ok := units[name]; !ok {
			t.Errorf("default feature %s not available", name)
		}
	}
	if got := Available(series.Var{Name: series.WaterTemperature}); len(got) != 9 {
		t.Errorf("water temperature alone: %d features, want 9 (no water-air ones)", len(got))
	}
}

// station returns a station with the given daily variables from start.
func station(id string, start calendar.Date, vars map[string][]float64) *series.Station {
	s := &series.Station{ID: id, Start: start, Vars: vars, Counts: map[string]*series.Counts{}}
	for _, x := range vars {
		s.Days = len(x)
	}
	return s
}

func TestExtractDischarge(t *testing.T) {
	q := readColumn(t, "flow60.csv", 1)
	names := []string{"discharge.mean", "discharge.sd", "discharge.cv", "discharge.skew", "discharge.p10",
		"discharge.flashiness", "discharge.bfi", "discharge.q90_q50"}
	e, err := New(Config{Features: names})
	if err != nil {
		t.Fatal(err)
	}
	vals, reason := e.Extract(nil, station("Q", calendar.New(2001, 1, 1), map[string][]float64{series.Discharge: q}))
	if reason != "" {
		t.Fatalf("excluded: %s", reason)
	}
	want := []float64{
		7.61, 7.340639144573684, 7.340639144573684 / 7.61, 2.9772344537205733, // pandas 1.5.3
		3.8,          // numpy 1.24.2 percentile
		120 / 451.6,  // flashiness, path length over flows of days 2..60
		0.5599900997, // Lyne–Hollick BFI, 30 reflected values, 3 passes (numpy reference)
		3.8 / 4.65,   // numpy 1.24.2 percentiles 10 and 50
	}
	for i := range want {
		if !near(vals[i], want[i], 1e-9) {
			t.Errorf("%s = %.10g, want %.10g", names[i], vals[i], want[i])
		}
	}

	// A missing day 30 leaves two runs shorter than 60 days: no BFI.
	q2 := append([]float64(nil), q...)
	q2[29] = nan
	_, reason = e.Extract(nil, station("Q2", calendar.New(2001, 1, 1), map[string][]float64{series.Discharge: q2}))
	if reason != "undefined: discharge.bfi" {
		t.Errorf("gap: reason %q", reason)
	}
	// Filling the gap first gives the BFI back.
	e2, _ := New(Config{Features: names, FillGaps: 2})
	if _, reason = e2.Extract(nil, station("Q2", calendar.New(2001, 1, 1), map[string][]float64{series.Discharge: q2})); reason != "" {
		t.Errorf("filled gap: reason %q", reason)
	}

	// Coverage: 60 days meet no year.
	e3, _ := New(Config{Features: names, Coverage: series.Requirement{MinFraction: 0.8, MinYears: 2}})
	vals, reason = e3.Extract(nil, station("Q", calendar.New(2001, 1, 1), map[string][]float64{series.Discharge: q}))
	if reason != "discharge: 0 of 2 required years with >= 80% of days" || !math.IsNaN(vals[0]) {
		t.Errorf("coverage: reason %q, values %v", reason, vals)
	}
	_, reason = e3.Extract(nil, station("E", 0, map[string][]float64{}))
	if reason != "discharge: no data" {
		t.Errorf("no data: reason %q", reason)
	}
	// A non-positive mean has no CV.
	e4, _ := New(Config{Features: []string{"x.cv"}})
	if _, reason = e4.Extract(nil, station("N", 0, map[string][]float64{"x": {-1, 1, -2, 1.5}})); reason != "undefined: x.cv" {
		t.Errorf("cv: reason %q", reason)
	}
}

// synthStation makes three years of water and air temperature in which
// water follows air 3 days later: water[t] = 3 + 0.5·air[t−3].
func synthStation(rng *rand.Rand, start calendar.Date, days int) *series.Station {
	air := make([]float64, days+3)
	e := 0.0
	for i := range air {
		e = 0.7*e + 2*rng.NormFloat64()
		t := float64(int(start) + i - 3)
		air[i] = 10 + 10*math.Cos(Omega*(t-195)) + e
	}
	water := make([]float64, days)
	for i := range water {
		water[i] = 3 + 0.5*air[i]
	}
	air = air[3:]
	for i := range days {
		if rng.IntN(20) == 0 {
			water[i] = nan
		}
		if rng.IntN(25) == 0 {
			air[i] = nan
		}
	}
	return station("W", start, map[string][]float64{series.WaterTemperature: water, series.AirTemperature: air})
}

func TestExtractTemperature(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	start := calendar.New(1991, 1, 1)
	s := synthStation(rng, start, 3*365)
	names := []string{"water_temperature.amplitude", "water_temperature.phase", "water_temperature.lag1",
		"water_temperature.thermal_sensitivity", "water_temperature.air_lag", "air_temperature.p90"}
	e, err := New(Config{Features: names})
	if err != nil {
		t.Fatal(err)
	}
	vals, reason := e.Extract(nil, s)
	if reason != "" {
		t.Fatalf("excluded: %s", reason)
	}
	w, a := s.Vars[series.WaterTemperature], s.Vars[series.AirTemperature]
	tt := make([]float64, len(w))
	for i := range tt {
		tt[i] = float64(int(start) + i)
	}
	h, _ := FitHarmonic(tt, w)
	an := func(y []float64, h Harmonic) []float64 {
		out := make([]float64, len(y))
		for i := range y {
			out[i] = y[i] - h.At(tt[i])
		}
		return out
	}
	want := []float64{h.Amplitude(), h.PeakDay() + 1, Lag1(an(w, h)), ThermalSensitivity(w, a), 3, Quantile(0.9, a)}
	for i := range want {
		if !near(vals[i], want[i], 1e-9) {
			t.Errorf("%s = %v, want %v", names[i], vals[i], want[i])
		}
	}
	// The air signal peaks on day 195 after 1970-01-01 of its cycle and
	// water 3 days later with half the amplitude (analytic, up to noise).
	if math.Abs(vals[0]-5) > 0.3 || math.Abs(vals[1]-(195+3+1)) > 3 {
		t.Errorf("amplitude %v phase %v, want about 5 and 199", vals[0], vals[1])
	}
}

// FromLong, FromStations and Extract give the same table at any number of
// workers.
func TestFromLong(t *testing.T) {
	data, stations := synthFile(6, 3)
	e, err := New(Config{Coverage: series.Requirement{MinFraction: 0.5, MinYears: 2}})
	if err != nil {
		t.Fatal(err)
	}
	opt := series.Options{Vars: []series.Var{{Name: series.WaterTemperature}, {Name: series.AirTemperature}, {Name: series.Discharge}}}
	var want *Table
	for _, w := range []int{1, 2, 4} {
		tab, sum, err := e.FromLong(bytes.NewReader(data), "synth", opt, w)
		if err != nil {
			t.Fatal(err)
		}
		if sum.Stations != 6 || len(tab.Stations)+len(tab.Excluded) != 6 {
			t.Fatalf("workers %d: %d stations, table %d + %d excluded", w, sum.Stations, len(tab.Stations), len(tab.Excluded))
		}
		if want == nil {
			want = tab
			continue
		}
		if !slices.Equal(tab.Stations, want.Stations) || !sameData(tab.Data, want.Data) || !slices.Equal(tab.Excluded, want.Excluded) {
			t.Errorf("workers %d: table differs", w)
		}
	}
	if len(want.Excluded) != 1 || want.Excluded[0] != (Exclusion{"ST0005", "water_temperature: no data"}) {
		t.Errorf("excluded %v", want.Excluded)
	}
	if _, _, err := e.FromLong(bytes.NewReader(data), "synth", series.Options{Vars: opt.Vars[:2]}, 1); err == nil ||
		err.Error() != `features: the features use "discharge", which the series options do not keep` {
		t.Errorf("missing variable: %v", err)
	}
	// Values written with shortest round-trip formatting read back exactly.
	got := e.FromStations(stations, 2)
	if !slices.Equal(got.Stations, want.Stations) || !sameData(got.Data, want.Data) {
		t.Errorf("FromStations differs from FromLong")
	}
}

func sameData(a, b []float64) bool {
	return slices.EqualFunc(a, b, func(x, y float64) bool { return x == y || math.IsNaN(x) && math.IsNaN(y) })
}

// synthFile returns a long file of n synthetic stations over the given
// years, with the three standard variables rounded as loggers report them,
// and the stations as read back. The last station has no water
// temperature.
func synthFile(n, years int) ([]byte, []*series.Station) {
	rng := rand.New(rand.NewPCG(uint64(n), uint64(years)))
	start := calendar.New(1991, 1, 1)
	days := int(calendar.New(1991+years, 1, 1) - start)
	var st []*series.Station
	for k := range n {
		s := synthStation(rng, start, days)
		s.ID = "ST" + string(rune('0'+k/1000%10)) + string(rune('0'+k/100%10)) + string(rune('0'+k/10%10)) + string(rune('0'+k%10))
		q := make([]float64, days)
		base := math.Exp(rng.Float64()*6 - 1)
		e, storm := 0.0, 0.0
		for i := range q {
			e = 0.97*e + 0.1*rng.NormFloat64()
			storm *= 0.6
			if rng.IntN(30) == 0 {
				storm += base * 3 * rng.ExpFloat64()
			}
			t := float64(int(start) + i)
			q[i] = math.Round(1000*(base*math.Exp(0.5*math.Cos(Omega*(t-100))+e)+storm)) / 1000
			if rng.IntN(100) == 0 {
				q[i] = nan
			}
		}
		for _, name := range []string{series.WaterTemperature, series.AirTemperature} {
			for i, v := range s.Vars[name] {
				s.Vars[name][i] = math.Round(100*v) / 100
			}
		}
		s.Vars[series.Discharge] = q
		if k == n-1 {
			delete(s.Vars, series.WaterTemperature)
		}
		st = append(st, s)
	}
	var buf bytes.Buffer
	if err := series.WriteLong(&buf, st); err != nil {
		panic(err)
	}
	opt := series.Options{Vars: []series.Var{{Name: series.WaterTemperature}, {Name: series.AirTemperature}, {Name: series.Discharge}}}
	back, _, err := series.ReadAll(bytes.NewReader(buf.Bytes()), "synth", opt)
	if err != nil {
		panic(err)
	}
	return buf.Bytes(), back
}
