package events

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"rebound/index/calendar"
	"rebound/index/series"
)

// synthStation returns years of invented daily air temperature, water
// temperature and discharge in the manner of the project's benchmark
// inputs: annual cycles plus AR(1) weather, water as smoothed air, flow
// log-normal with storms, and 1% of days missing.
func synthStation(years int, seed uint64) *series.Station {
	rng := rand.New(rand.NewPCG(seed, 7))
	start := calendar.New(1991, 1, 1)
	n := int(calendar.New(1991+years, 1, 1) - start)
	air, water, q := make([]float64, n), make([]float64, n), make([]float64, n)
	var ea, ew, eq, storm, ws float64
	for i := range n {
		ph := 2 * math.Pi * float64(i) / 365.25
		ea = 0.7*ea + 3*math.Sqrt(1-0.49)*rng.NormFloat64()
		air[i] = 10 + 10*math.Cos(ph-2*math.Pi*200/365.25) + ea
		ws = 0.85*ws + 0.15*air[i]
		ew = 0.8*ew + 0.5*math.Sqrt(1-0.64)*rng.NormFloat64()
		water[i] = max(0, 4+0.6*ws+ew)
		eq = 0.98*eq + 0.4*math.Sqrt(1-0.98*0.98)*rng.NormFloat64()
		storm *= 0.7
		if rng.Float64() < 0.03 {
			storm += 20 * rng.ExpFloat64()
		}
		q[i] = 10*math.Exp(0.5*math.Cos(ph-2*math.Pi*100/365.25)+eq) + storm
	}
	for _, x := range [][]float64{air, water, q} {
		for i := range x {
			if rng.Float64() < 0.01 {
				x[i] = math.NaN()
			}
		}
	}
	return &series.Station{ID: "B", Start: start, Days: n,
		Vars: map[string][]float64{"air_temperature": air, "water_temperature": water, "discharge": q}}
}

// BenchmarkAnalyze measures one station: climatologies of three variables,
// heat waves, droughts, floods, antecedent dryness and the water-
// temperature responses. The target is 30 ms per station-30-years.
func BenchmarkAnalyze(b *testing.B) {
	for _, years := range []int{1, 10, 30} {
		s := synthStation(years, 1)
		o := DefaultOptions()
		o.Climate.MinYears = 1
		b.Run(fmt.Sprintf("years=%d", years), func(b *testing.B) {
			var a Analyzer
			b.ReportAllocs()
			for b.Loop() {
				if _, err := a.Analyze(s, nil, o); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkClimatology(b *testing.B) {
	for _, years := range []int{10, 30} {
		s := synthStation(years, 1)
		x := s.Var("air_temperature")
		b.Run(fmt.Sprintf("years=%d", years), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := (Climate{}).Compute(x, s.Start, 90); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkSeverity measures what rating adds to one station-30-years of
// Analyze: the annual maxima, the GEV fit and the return periods of the
// floods, and the probabilities of the droughts (the heat-wave category is
// a ratio taken in the detection loop). The target is at most 10% of
// BenchmarkAnalyze/years=30.
func BenchmarkSeverity(b *testing.B) {
	s := synthStation(30, 1)
	o := DefaultOptions()
	o.Climate.MinYears = 1
	r, err := Analyze(s, nil, o)
	if err != nil {
		b.Fatal(err)
	}
	var floods, droughts []Event
	for _, e := range r.Events {
		switch e.Kind {
		case FloodKind:
			floods = append(floods, e)
		case DroughtKind:
			droughts = append(droughts, e)
		}
	}
	q := s.Var("discharge")
	o = o.withDefaults()
	b.ReportAllocs()
	for b.Loop() {
		if err := rateFloods(floods, q, s.Start, o.Severity); err != nil {
			b.Fatal(err)
		}
		rateDroughts(droughts, o.Severity.Probabilities)
	}
}
