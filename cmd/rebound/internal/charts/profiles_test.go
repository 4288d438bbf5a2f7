package charts

import (
	"math"
	"testing"
)

func TestProfiles(t *testing.T) {
	features := []string{"mean water temperature", "thermal sensitivity", "flashiness", "baseflow index", "DO seasonality", "conductance trend"}
	data, err := Profiles(features, []Profile{
		{ProfileLabel(0, 7, "cool, steady"), []float64{-1.2, -0.8, -0.5, 1.4, 0.1, -0.2}},
		{ProfileLabel(1, 9, "flashy"), []float64{0.3, 0.9, 1.8, -1.1, 0.4, math.NaN()}},
		{ProfileLabel(2, 1, ""), []float64{0.9, 0.2, -0.7, -0.5, -0.6, 2.9}},
	})
	if err != nil {
		t.Fatal(err)
	}
	check(t, "profiles_3", data, 3, 4)
	if _, err := Profiles(nil, nil); err != ErrNoData {
		t.Errorf("no data: %v", err)
	}
	if got := ProfileLabel(2, 1, ""); got != "cluster 3 (1 station)" {
		t.Errorf("ProfileLabel = %q", got)
	}
}

// TestProfilesTall checks that many features still fit a printed page.
func TestProfilesTall(t *testing.T) {
	features := make([]string, 30)
	z := make([]float64, 30)
	for j := range features {
		features[j] = "feature number " + string(rune('A'+j%26))
		z[j] = float64(j%7) - 3
	}
	var profs []Profile
	for c := range 6 {
		profs = append(profs, Profile{Label: ProfileLabel(c, 3, "a long description of the cluster in several words"), Z: z})
	}
	data, err := Profiles(features, profs)
	if err != nil {
		t.Fatal(err)
	}
	check(t, "profiles_tall", data, 7, 8.6)
}
