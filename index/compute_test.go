package index

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"rebound/attributes"
	"rebound/config"
)

const stationsCSV = `station,name,latitude,longitude,forest_pct,record_years,group
S1,One,45.1,-70.1,60,10,a
S2,Two,45.2,-70.2,0,,a
S3,Three,45.3,-70.3,30,5,b
`

func computeFixture(t *testing.T, eventsCSV string, cfg *config.Config) (*Raw, []error) {
	t.Helper()
	attrs, errs := attributes.ReadCSV(strings.NewReader(stationsCSV), "stations.csv")
	if errs != nil {
		t.Fatal(errs)
	}
	evs, errs := ReadEvents(strings.NewReader(eventsHeader+eventsCSV), "events.csv")
	if errs != nil {
		t.Fatal(errs)
	}
	return Compute(evs, attrs, cfg, nil)
}

func weight(x float64) *config.Weight { w := config.Weight(x); return &w }

func TestCompute(t *testing.T) {
	cfg := config.Default()
	cfg.Inputs.RecordYears = 8 // S2 has no record_years value
	cfg.Indicators = []config.Indicator{
		{Name: "heat", Measure: config.Magnitude, Kinds: []string{"heatwave"}, Variables: []string{"water_temperature"}, Better: config.Lower, Weight: weight(1)},
		{Name: "oxygen", Measure: config.Magnitude, Variables: []string{"dissolved_oxygen"}, Better: config.Lower, Weight: weight(1)},
		{Name: "recovery", Measure: config.Recovery, Better: config.Lower, Weight: weight(1)},
		{Name: "memory", Measure: config.MemoryM, Variables: []string{"water_temperature"}, Better: config.Lower, Weight: weight(1)},
		{Name: "frequency", Measure: config.Frequency, Kinds: []string{"heatwave"}, Better: config.Lower, Weight: weight(1)},
		{Name: "forest", Measure: config.Attribute, Attribute: "forest_pct", Transform: config.Log, Better: config.Higher, Weight: weight(1)},
	}
	events := `S1,H1,heatwave,water_temperature,2019-07-01,2019-07-05,2.0,4,true,0.1
S1,H1,heatwave,dissolved_oxygen,2019-07-01,2019-07-05,-1.2,6,true,0.1
S1,H2,heatwave,water_temperature,2020-07-01,2020-07-05,3.0,8,true,0.3
S1,H3,heatwave,water_temperature,2021-07-01,2021-07-05,2.5,10,false,0.2
S1,H4,heatwave,water_temperature,2022-07-01,2022-07-05,4.0,12,true,0.6
S1,H5,heatwave,water_temperature,2023-07-01,2023-07-05,5.0,20,true,0.9
S1,D1,drought,water_temperature,2023-08-01,2023-09-05,1.0,30,true,
S3,H1,heatwave,water_temperature,2019-07-01,2019-07-05,1.0,40,false,0.5
S3,H2,heatwave,water_temperature,2020-07-01,2020-07-05,1.5,50,false,0.5
S3,H3,heatwave,water_temperature,2021-07-01,2021-07-05,0.5,10,true,0.5
`
	raw, errs := computeFixture(t, events, cfg)
	if errs != nil {
		t.Fatal(errs)
	}
	nan := math.NaN()
	want := [][]float64{
		// heat: median of 2, 3, 2.5, 4, 5 = 3. oxygen: harmful sign −1, so
		// −(−1.2) = 1.2. recovery: KM over 4, 6, 8, 10+, 12, 20, 30 (the
		// drought counts; 7 rows): S = 6/7 after 4, 5/7 after 6, 4/7 after
		// 8, then 10 censored, 3 at risk at 12 → 4/7·2/3 = 8/21 <= 0.5, so
		// the median is 12 (hand). memory: Theil–Sen of the five heat
		// magnitudes on dryness (0.1, 0.3, 0.2, 0.6, 0.9) — the drought row
		// has unknown dryness — by hand, the 10 pairwise slopes are 10/3 (three
		// times), 25/7, 3.75, 3.75, 4, 5, 5, 5; their median is 3.75.
		// frequency: 5 heat waves / 10 years. forest: ln 60.
		{3, 1.2, 12, 3.75, 0.5, math.Log(60)},
		// S2: no events; frequency 0 over 8 years; log 0 undefined.
		{nan, nan, nan, nan, 0, nan},
		// S3: median 1; recovery 40+, 50+, 10: S = 2/3 then never <= 0.5 →
		// RMST to 50 = 10·1 + 40·2/3 = 36.666…; dryness all 0.5 → no slope
		// (and only 3 events); frequency 3/5.
		{1, nan, 10 + 40*2.0/3, nan, 0.6, math.Log(30)},
	}
	for i := range want {
		for j := range want[i] {
			got := raw.Values[i][j]
			if math.IsNaN(want[i][j]) != math.IsNaN(got) || (!math.IsNaN(got) && !scalar.EqualWithinAbs(got, want[i][j], 1e-12)) {
				t.Errorf("%s %s = %v, want %v (note %q)", raw.Stations[i], raw.Indicators[j].Name, got, want[i][j], raw.Notes[i][j])
			}
		}
	}
	if !raw.Fallback[2][2] || !strings.Contains(raw.Notes[2][2], "2 of 3 events not recovered") {
		t.Errorf("S3 recovery fallback %v %q", raw.Fallback[2][2], raw.Notes[2][2])
	}
	if !strings.Contains(raw.Notes[2][3], "fewer than memory.min_events = 5") {
		t.Errorf("S3 memory note %q", raw.Notes[2][3])
	}
	if raw.Notes[1][5] != "log transform of 0 is undefined" || raw.Events[0] != 6 || raw.Events[1] != 0 {
		t.Errorf("notes %q events %v", raw.Notes[1][5], raw.Events)
	}

	// Through to a score: flags say what happened.
	w, _ := ResolveWeights(cfg)
	res, err := Score(raw, SpecFrom(cfg, w, nil))
	if err != nil {
		t.Fatal(err)
	}
	if got := strings.Join(res.Flags[2], " "); got != "km_rmst:recovery missing:memory missing:oxygen" {
		t.Errorf("S3 flags %q", got)
	}
	if got := strings.Join(res.Flags[1], " "); !strings.Contains(got, "few_events") || !strings.Contains(got, "missing:heat") {
		t.Errorf("S2 flags %q", got)
	}
}

func TestComputeCrossTableErrors(t *testing.T) {
	cfg := config.Default()
	cfg.Indicators = []config.Indicator{
		{Name: "r", Measure: config.Recovery, Weight: weight(1)},
		{Name: "x", Measure: config.Attribute, Attribute: "slope_pct", Better: config.Higher, Weight: weight(1)},
	}
	events := `S9,H1,heatwave,water_temperature,2019-07-01,2019-07-05,2.0,4,true,0.1
S1,H1,heatwave,water_temperature,2019-07-01,2019-07-05,2.0,4,true,1.4
S1,H1,heatwave,water_temperature,2019-07-01,2019-07-05,2.0,4,true,0.1
`
	_, errs := computeFixture(t, events, cfg)
	var all []string
	for _, e := range errs {
		all = append(all, e.Error())
	}
	joined := strings.Join(all, "\n")
	for _, want := range []string{
		`events.csv:2: station: station "S9" is not in the attribute table stations.csv`,
		`events.csv:3: antecedent_dryness: want a fraction in [0, 1] (memory.dryness = "fraction"), got 1.4`,
		`events.csv:4: event: duplicate row for station "S1", event "H1", variable "water_temperature" (first on line 3)`,
		`indicator[2].attribute: stations.csv has no numeric column "slope_pct"; it has forest_pct, record_years`,
	} {
		if !strings.Contains(joined, want) {
			t.Errorf("want %q in:\n%s", want, joined)
		}
	}
}
