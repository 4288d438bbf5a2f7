package criteria

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"rebound/index/calendar"
	"rebound/index/series"
)

// synthTmax returns years of invented daily maximum water temperature: an
// annual cycle plus noise, with 1% of days missing.
func synthTmax(years int, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 1))
	x := make([]float64, years*365)
	for i := range x {
		if rng.Float64() < 0.01 {
			x[i] = math.NaN()
			continue
		}
		x[i] = 12 + 8*math.Cos(2*math.Pi*float64(i-200)/365.25) + rng.NormFloat64()
	}
	return x
}

func BenchmarkEvaluate(b *testing.B) {
	for _, years := range []int{1, 10, 30} {
		b.Run(fmt.Sprintf("years=%d", years), func(b *testing.B) {
			x := synthTmax(years, 1)
			s := &series.Station{ID: "B", Start: calendar.New(1991, 1, 1), Days: len(x),
				Vars: map[string][]float64{"water_temperature_max": x}}
			o := DefaultOptions()
			o.Criteria = []Criterion{{"a", 16}, {"b", 18}, {"c", 20}}
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Evaluate(s, o); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
