package clustering

import (
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

func TestDescribe(t *testing.T) {
	words := []Words{{"warm", "cool"}, {"flashy", "steady"}, {"much baseflow", "little baseflow"}, {"", "low oxygen"}}
	for _, tc := range []struct {
		z    []float64
		want string
	}{
		{[]float64{1.2, -0.7, 0.1, 0}, "warm, steady"},
		{[]float64{0.3, -0.2, 0.49, -0.1}, NearAverage},
		{[]float64{0.5, 2, -3, -0.6}, "little baseflow, flashy, low oxygen"},
		{[]float64{0.5, -0.5, 0, 0}, "warm, steady"},   // a tie keeps feature order
		{[]float64{math.NaN(), 0.8, 0, 0.9}, "flashy"}, // NaN and an empty word skipped
	} {
		if got := Describe(tc.z, words); got != tc.want {
			t.Errorf("Describe(%v) = %q, want %q", tc.z, got, tc.want)
		}
	}
}

func TestProfiles(t *testing.T) {
	// Temperature 10, 11, 12 | 20, 21, 22 and a constant flashiness: by
	// hand the z-scores of temperature use mean 16 and sd √(154/6), so
	// the centroids are ∓5/√(154/6) = ∓0.98693 and the medoids the middle
	// rows.
	orig := mat.NewDense(6, 2, []float64{10, 0.5, 12, 0.5, 11, 0.5, 20, 0.5, 22, 0.5, 21, 0.5})
	var std mat.Dense
	if _, _, err := Standardize(&std, orig, ZScore); err != nil {
		t.Fatal(err)
	}
	labels := []int{0, 0, 0, 1, 1, 1}
	words := []Words{{"warm", "cool"}, {"flashy", "steady"}}
	ps, err := Profiles(orig, &std, labels, words)
	if err != nil {
		t.Fatal(err)
	}
	z := 5 / math.Sqrt(154.0/6)
	want := []Profile{
		{Size: 3, Medoid: 2, Mean: []float64{11, 0.5}, Median: []float64{11, 0.5}, Centroid: []float64{-z, 0}, Description: "cool"},
		{Size: 3, Medoid: 5, Mean: []float64{21, 0.5}, Median: []float64{21, 0.5}, Centroid: []float64{z, 0}, Description: "warm"},
	}
	for c, w := range want {
		p := ps[c]
		if p.Size != w.Size || p.Medoid != w.Medoid || p.Description != w.Description ||
			!floats.EqualApprox(p.Mean, w.Mean, 1e-12) || !floats.EqualApprox(p.Median, w.Median, 1e-12) ||
			!floats.EqualApprox(p.Centroid, w.Centroid, 1e-12) {
			t.Errorf("cluster %d: got %+v, want %+v", c, p, w)
		}
	}
	// A gap in the labels gives an empty profile; a tie in the medoid goes
	// to the lowest row.
	two := mat.NewDense(2, 1, []float64{0, 1})
	ps, err = Profiles(two, two, []int{1, 1}, nil)
	if err != nil || ps[0].Size != 0 || ps[0].Medoid != -1 || ps[1].Medoid != 0 {
		t.Errorf("got %+v, %v", ps, err)
	}
	if !slices.Equal([]float64{ps[1].Median[0]}, []float64{0.5}) {
		t.Errorf("median of an even count: %v, want 0.5", ps[1].Median)
	}
}
