package charts

import (
	"math"
	"testing"
)

func TestTornado(t *testing.T) {
	for _, tc := range []struct {
		name       string
		swings     []Swing
		minH, maxH float64
	}{
		{"tornado_8", []Swing{{"heat_warming", 6, 9}, {"recovery", 4, 3}, {"drought_memory", 2, 5}, {"drought_salinity", 1, 1},
			{"oxygen_sag", 0, 2}, {"heat_frequency", 0, 0}, {"forest_cover", 3, 2}, {"baseflow", 1, math.NaN()}}, 3, 4},
		{"tornado_1", []Swing{{"only", 0, 0}}, 1, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			data, err := Tornado(tc.swings, "±25 %")
			if err != nil {
				t.Fatal(err)
			}
			check(t, tc.name, data, tc.minH, tc.maxH)
		})
	}
}
