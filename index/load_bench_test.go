package index

import (
	"fmt"
	"math/rand/v2"
	"strings"
	"testing"

	"rebound/attributes"
	"rebound/config"
)

// loadFixture builds an events table of about rows rows over rows/100
// stations (34 events × 3 variables each), with its attribute table and a
// five-indicator configuration.
func loadFixture(rows int) (events, stations string, cfg *config.Config) {
	rng := rand.New(rand.NewPCG(1, 2))
	nSt := max(1, rows/100)
	var sb strings.Builder
	sb.WriteString("station,name,latitude,longitude,forest_pct,record_years\n")
	for i := range nSt {
		fmt.Fprintf(&sb, "S%05d,Station %d,%.4f,%.4f,%.1f,20\n", i, i, 45+rng.Float64(), -70-rng.Float64(), 100*rng.Float64())
	}
	stations = sb.String()
	sb.Reset()
	sb.WriteString(eventsHeader)
	kinds := []string{"heatwave", "drought", "flood"}
	vars := []string{"water_temperature", "specific_conductance", "dissolved_oxygen"}
	n := 0
	for i := 0; n < rows; i = (i + 1) % nSt {
		for e := 0; e < 34 && n < rows; e++ {
			y := 2000 + e/2
			for _, v := range vars {
				fmt.Fprintf(&sb, "S%05d,%s-%d-%02d,%s,%s,%d-07-01,%d-07-%d,%.3f,%d,%t,%.3f\n", i, strings.ToUpper(kinds[e%3][:2]), y, e,
					kinds[e%3], v, y, y, 10+e%9, 2+rng.NormFloat64(), rng.IntN(60), rng.Float64() < 0.8, rng.Float64())
				n++
			}
		}
		if i == nSt-1 {
			break
		}
	}
	cfg = config.Default()
	cfg.Indicators = []config.Indicator{
		{Name: "heat", Measure: config.Magnitude, Kinds: []string{"heatwave"}, Variables: []string{"water_temperature"}, Better: config.Lower, Weight: weight(1)},
		{Name: "recovery", Measure: config.Recovery, Better: config.Lower, Weight: weight(1)},
		{Name: "memory", Measure: config.MemoryM, Variables: []string{"water_temperature"}, Better: config.Lower, Weight: weight(1)},
		{Name: "frequency", Measure: config.Frequency, Better: config.Lower, Weight: weight(1)},
		{Name: "forest", Measure: config.Attribute, Attribute: "forest_pct", Transform: config.NoTransform, Better: config.Higher, Weight: weight(1)},
	}
	return sb.String(), stations, cfg
}

// BenchmarkLoadAndReduce reads an events table and reduces it to raw
// indicators per station. Target: 1,000,000 rows in <= 2 s.
func BenchmarkLoadAndReduce(b *testing.B) {
	for _, rows := range []int{100_000, 1_000_000} {
		events, stations, cfg := loadFixture(rows)
		attrs, errs := attributes.ReadCSV(strings.NewReader(stations), "stations.csv")
		if errs != nil {
			b.Fatal(errs[0])
		}
		b.Run(fmt.Sprintf("rows=%d", rows), func(b *testing.B) {
			b.SetBytes(int64(len(events)))
			b.ReportAllocs()
			for b.Loop() {
				tab, errs := ReadEvents(strings.NewReader(events), "events.csv")
				if errs != nil {
					b.Fatal(errs[0])
				}
				if _, errs := Compute(tab, attrs, cfg, nil); errs != nil {
					b.Fatal(errs[0])
				}
			}
		})
	}
}
