package sensitivity

import (
	"reflect"
	"testing"
)

func TestStructural(t *testing.T) {
	// By hand. Reference ranks A 1, B 3, C 2, D 4; "swap" swaps B and C;
	// "reorder" gives A 3, B 2, C 1, D 4; "missing" leaves D undefined
	// (ranked last) and C and B tied. Spearman against the reference, no
	// ties: 1 − 6Σd²/(n(n²−1)) = 1 − 6·2/60 = 0.8 for "swap" and
	// 1 − 6·6/60 = 0.4 for "reorder"; with the B–C tie, the Pearson
	// correlation of (1, 3, 2, 4) with (1, 2.5, 2.5, 4) is √0.9 = 0.9487.
	res, err := Structural([]Scenario{
		{"reference", []float64{0.9, 0.5, 0.7, 0.1}},
		{"swap", []float64{0.9, 0.8, 0.7, 0.1}},
		{"reorder", []float64{0.2, 0.5, 0.7, 0.1}},
		{"missing", []float64{0.9, 0.6, 0.6, nan}},
	})
	if err != nil {
		t.Fatal(err)
	}
	want := &StructuralResult{
		Names:     []string{"reference", "swap", "reorder", "missing"},
		Ranks:     [][]int32{{1, 3, 2, 4}, {1, 2, 3, 4}, {3, 2, 1, 4}, {1, 2, 2, 4}},
		Min:       []int32{1, 2, 1, 4},
		Max:       []int32{3, 3, 3, 4},
		MeanShift: []float64{0, 0.5, 1, 0.25},
	}
	spearman := []float64{1, 0.8, 0.4, 0.9486832981}
	got := *res
	for i, r := range got.Spearman {
		if d := r - spearman[i]; d > 1e-9 || d < -1e-9 {
			t.Errorf("Spearman[%d] = %.10f, want %.10f", i, r, spearman[i])
		}
	}
	got.Spearman = nil
	if !reflect.DeepEqual(&got, want) {
		t.Errorf("got %+v\nwant %+v", got, *want)
	}
	if _, err := Structural(nil); err == nil {
		t.Error("no error without scenarios")
	}
}
