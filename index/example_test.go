package index_test

import (
	"fmt"

	"rebound/config"
	"rebound/index"
)

// Four invented stations scored on three indicators, min–max normalised
// and averaged with weights 0.5, 0.3 and 0.2. The composites agree with a
// numpy 1.24.2 computation of the same formulas (OECD/JRC Handbook, Nardo
// et al. 2008): 0.9444, 0.675, 0.6856, 0.0455.
func ExampleScore() {
	inds := []config.Indicator{
		{Name: "peak_warming", Better: config.Lower}, // °C
		{Name: "recovery_days", Better: config.Lower},
		{Name: "baseflow_index", Better: config.Higher},
	}
	raw := &index.Raw{
		Stations:   []string{"A", "B", "C", "D"},
		Names:      []string{"A", "B", "C", "D"},
		Groups:     make([]string, 4),
		Indicators: inds,
		Values:     [][]float64{{2.0, 12, 0.60}, {1.5, 45, 0.55}, {3.0, 20, 0.45}, {6.0, 40, 0.20}},
		Notes:      [][]string{make([]string, 3), make([]string, 3), make([]string, 3), make([]string, 3)},
		Fallback:   [][]bool{make([]bool, 3), make([]bool, 3), make([]bool, 3), make([]bool, 3)},
		Events:     []int{10, 10, 10, 10},
	}
	spec := index.Spec{
		Weights:     []float64{0.5, 0.3, 0.2},
		Aggregation: config.Arithmetic,
		Missing:     config.Renormalize,
	}
	for _, ind := range inds {
		spec.Methods = append(spec.Methods, index.Method{Norm: config.MinMax, Better: ind.Better})
	}
	res, err := index.Score(raw, spec)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, i := range res.Order {
		fmt.Printf("%d %s %.1f\n", res.Rank[i], raw.Stations[i], res.Score[i])
	}
	// Output:
	// 1 A 94.4
	// 2 C 68.6
	// 3 B 67.5
	// 4 D 4.5
}
