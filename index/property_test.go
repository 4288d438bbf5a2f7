package index

import (
	"fmt"
	"math"
	"testing"

	"pgregory.net/rapid"

	"rebound/config"
)

// genProblem draws a random scoring problem: 2–12 stations, 1–5
// indicators, some values missing, random directions, weights and methods.
func genProblem(t *rapid.T) (*Raw, Spec) {
	n := rapid.IntRange(2, 12).Draw(t, "stations")
	k := rapid.IntRange(1, 5).Draw(t, "indicators")
	raw := &Raw{Stations: make([]string, n), Names: make([]string, n), Groups: make([]string, n), Events: make([]int, n)}
	spec := Spec{
		Aggregation: rapid.SampledFrom(config.AggMethods).Draw(t, "aggregation"),
		Floor:       0.1,
		Missing:     rapid.SampledFrom([]config.MissingPolicy{config.Renormalize, config.Impute}).Draw(t, "missing"),
	}
	norms := []config.NormMethod{config.MinMax, config.Rank, config.TargetN}
	if spec.Aggregation == config.Arithmetic {
		norms = append(norms, config.ZScore)
	}
	for j := range k {
		better := rapid.SampledFrom([]config.Better{config.Higher, config.Lower}).Draw(t, "better")
		raw.Indicators = append(raw.Indicators, config.Indicator{Name: fmt.Sprintf("i%d", j), Better: better})
		spec.Methods = append(spec.Methods, Method{
			Norm: rapid.SampledFrom(norms).Draw(t, "norm"), Better: better,
			Target: rapid.Float64Range(-5, 5).Draw(t, "target"), Tolerance: rapid.Float64Range(0, 2).Draw(t, "tol"),
		})
		spec.Weights = append(spec.Weights, rapid.Float64Range(0.01, 1).Draw(t, "w"))
	}
	normalizeWeights(spec.Weights)
	for i := range n {
		raw.Stations[i] = fmt.Sprintf("S%02d", i)
		row := make([]float64, k)
		for j := range row {
			if rapid.IntRange(0, 9).Draw(t, "missing?") == 0 && i > 0 {
				row[j] = math.NaN()
			} else {
				row[j] = float64(rapid.IntRange(-20, 20).Draw(t, "x")) / 4 // ties happen
			}
		}
		raw.Values = append(raw.Values, row)
		raw.Notes = append(raw.Notes, make([]string, k))
		raw.Fallback = append(raw.Fallback, make([]bool, k))
	}
	return raw, spec
}

func normalizeWeights(w []float64) {
	s := 0.0
	for _, x := range w {
		s += x
	}
	for j := range w {
		w[j] /= s
	}
}

func scoreByID(t *rapid.T, raw *Raw, spec Spec) map[string]float64 {
	res, err := Score(raw, spec)
	if err != nil {
		t.Skip(err) // a column with no value at all
	}
	out := map[string]float64{}
	for i, id := range raw.Stations {
		out[id] = res.Score[i]
	}
	return out
}

func sameScores(t *rapid.T, a, b map[string]float64, what string) {
	for id, x := range a {
		y := b[id]
		if math.IsNaN(x) != math.IsNaN(y) || (!math.IsNaN(x) && math.Abs(x-y) > 1e-9) {
			t.Fatalf("%s: station %s score %v became %v", what, id, x, y)
		}
	}
}

// Property: shuffling the station order changes nothing.
func TestPropertyShuffle(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		raw, spec := genProblem(t)
		before := scoreByID(t, raw, spec)
		perm := rapid.Permutation(indices(len(raw.Stations))).Draw(t, "perm")
		shuffled := &Raw{Indicators: raw.Indicators}
		for _, i := range perm {
			shuffled.Stations = append(shuffled.Stations, raw.Stations[i])
			shuffled.Names = append(shuffled.Names, raw.Names[i])
			shuffled.Groups = append(shuffled.Groups, raw.Groups[i])
			shuffled.Values = append(shuffled.Values, raw.Values[i])
			shuffled.Notes = append(shuffled.Notes, raw.Notes[i])
			shuffled.Fallback = append(shuffled.Fallback, raw.Fallback[i])
			shuffled.Events = append(shuffled.Events, raw.Events[i])
		}
		sameScores(t, before, scoreByID(t, shuffled, spec), "shuffle")
	})
}

// Property: scaling every weight by the same constant changes nothing.
func TestPropertyWeightScale(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		raw, spec := genProblem(t)
		before := scoreByID(t, raw, spec)
		c := rapid.Float64Range(0.1, 10).Draw(t, "c")
		scaled := spec
		scaled.Weights = make([]float64, len(spec.Weights))
		for j, w := range spec.Weights {
			scaled.Weights[j] = c * w
		}
		sameScores(t, before, scoreByID(t, raw, scaled), "scaled weights")
	})
}

// Property: scores stay within [0, 100] (or NaN when nothing is known).
func TestPropertyBounds(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		raw, spec := genProblem(t)
		for id, s := range scoreByID(t, raw, spec) {
			if !math.IsNaN(s) && (s < 0 || s > 100) {
				t.Fatalf("station %s score %v outside [0, 100]", id, s)
			}
		}
	})
}

// Property: improving one indicator in its good direction never lowers
// that station's score (min–max and rank normalisation, both aggregations,
// no missing values).
func TestPropertyMonotone(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		raw, spec := genProblem(t)
		for j := range spec.Methods {
			spec.Methods[j].Norm = rapid.SampledFrom([]config.NormMethod{config.MinMax, config.Rank}).Draw(t, "norm")
		}
		for i := range raw.Values {
			for j := range raw.Values[i] {
				if math.IsNaN(raw.Values[i][j]) {
					raw.Values[i][j] = 0
				}
			}
		}
		i := rapid.IntRange(0, len(raw.Stations)-1).Draw(t, "station")
		j := rapid.IntRange(0, len(raw.Indicators)-1).Draw(t, "indicator")
		before := scoreByID(t, raw, spec)[raw.Stations[i]]
		step := rapid.Float64Range(0.01, 10).Draw(t, "step")
		if spec.Methods[j].Better == config.Lower {
			step = -step
		}
		raw.Values[i][j] += step
		after := scoreByID(t, raw, spec)[raw.Stations[i]]
		if after < before-1e-9 {
			t.Fatalf("improving %s at %s lowered its score from %v to %v", raw.Indicators[j].Name, raw.Stations[i], before, after)
		}
	})
}

func indices(n int) []int {
	out := make([]int, n)
	for i := range out {
		out[i] = i
	}
	return out
}

func BenchmarkScore(b *testing.B) {
	for _, size := range []struct{ n, k int }{{1000, 12}, {10000, 12}} {
		raw := &Raw{}
		spec := Spec{Aggregation: config.Arithmetic, Missing: config.Renormalize, Floor: 0.1}
		for j := range size.k {
			raw.Indicators = append(raw.Indicators, config.Indicator{Name: fmt.Sprintf("i%d", j)})
			spec.Methods = append(spec.Methods, Method{Norm: config.MinMax, Better: config.Higher})
			spec.Weights = append(spec.Weights, 1/float64(size.k))
		}
		for i := range size.n {
			raw.Stations = append(raw.Stations, fmt.Sprintf("S%05d", i))
			row := make([]float64, size.k)
			for j := range row {
				row[j] = float64((i*7919+j*104729)%1000) / 10
			}
			raw.Values = append(raw.Values, row)
			raw.Notes = append(raw.Notes, make([]string, size.k))
			raw.Fallback = append(raw.Fallback, make([]bool, size.k))
		}
		raw.Names, raw.Groups, raw.Events = raw.Stations, make([]string, size.n), make([]int, size.n)
		b.Run(fmt.Sprintf("stations=%d/indicators=%d", size.n, size.k), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Score(raw, spec); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
