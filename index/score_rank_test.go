package index

import (
	"math"
	"slices"
	"testing"

	"rebound/config"
	"rebound/index/sensitivity"
)

// The ranking of Score is the base ranking of the sensitivity analyses of
// its Model, to the last bit, under both aggregations and with missing
// values; equal composites share a rank and are listed by identifier.
func TestScoreRankIsSensitivityBase(t *testing.T) {
	for _, agg := range config.AggMethods {
		for _, missing := range []bool{false, true} {
			raw := handbook()
			// F (first) and E copy A: equal composites, listed A, E, F by
			// identifier whatever their position.
			raw.Stations = []string{"F", "B", "C", "D", "A", "E"}
			raw.Values = append(raw.Values, raw.Values[0], raw.Values[0])
			raw.Names = raw.Stations
			raw.Groups = make([]string, 6)
			raw.Events = []int{10, 10, 10, 10, 10, 10}
			raw.Notes = append(raw.Notes, make([]string, 3), make([]string, 3))
			raw.Fallback = append(raw.Fallback, make([]bool, 3), make([]bool, 3))
			if missing {
				raw.Values[1] = []float64{1.5, math.NaN(), 0.55}
			}
			res, err := Score(raw, handbookSpec(config.MinMax, agg))
			if err != nil {
				t.Fatal(err)
			}
			oat, err := sensitivity.OneAtATime(res.Model(), sensitivity.Settings{})
			if err != nil {
				t.Fatal(err)
			}
			for i, r := range oat.Base {
				if int(r) != res.Rank[i] {
					t.Fatalf("%s missing=%v: Score ranks %v, sensitivity base ranks %v", agg, missing, res.Rank, oat.Base)
				}
			}
			// A (index 4), E (5) and F (0) tie, listed A, E, F.
			r := res.Rank[4]
			p := slices.Index(res.Order, 4)
			if res.Rank[0] != r || res.Rank[5] != r || p < 0 || !slices.Equal(res.Order[p:p+3], []int{4, 5, 0}) {
				t.Errorf("%s missing=%v: ranks %v, order %v; want A, E, F tied", agg, missing, res.Rank, res.Order)
			}
		}
	}
}
