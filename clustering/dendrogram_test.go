package clustering

import (
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat"
)

func TestCutHeight(t *testing.T) {
	x, _ := readIris(t, "iris_every10th.csv")
	dend, err := Agglomerate(Pairwise(x), Ward)
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		h    float64
		want int // clusters; the heights are the scipy 1.10.1 Ward column of h15
	}{
		{0, 15}, {0.17, 15}, {0.18, 14}, {0.71, 9}, {1.0, 7}, {2.2, 3}, {10.4, 1}, {math.Inf(1), 1}, {math.NaN(), 15},
	} {
		got := dend.CutHeight(nil, tc.h)
		if m := len(countLabels(got)); m != tc.want {
			t.Errorf("h = %v: %d clusters, want %d", tc.h, m, tc.want)
		}
		if tc.want >= 1 && !slices.Equal(got, dend.Cut(nil, tc.want)) {
			t.Errorf("h = %v: differs from Cut at k = %d", tc.h, tc.want)
		}
	}
	if got := dend.Cut(nil, 0); !slices.Equal(got, make([]int, 15)) {
		t.Errorf("k = 0 is not clamped to one cluster: %v", got)
	}
	if got := dend.Cut(make([]int, 15), 99); !slices.Equal(got, iotaInts(15)) {
		t.Errorf("k = 99 is not clamped to singletons: %v", got)
	}
}

func TestCophenetic(t *testing.T) {
	x, _ := readIris(t, "iris_every10th.csv")
	for _, tc := range h15 {
		dend, err := Agglomerate(Pairwise(x), tc.l)
		if err != nil {
			t.Fatal(err)
		}
		c := dend.Cophenetic()
		// The pair (0, 4) merges first, at 0.173205; setosa (0–4) and the
		// rest meet only at the top merge (scipy 1.10.1, table h15).
		top := tc.rows[len(tc.rows)-1].Height
		if !scalar.EqualWithinAbs(c.At(0, 4), 0.173205, 1e-6) || !scalar.EqualWithinAbs(c.At(14, 0), top, 1e-6) {
			t.Errorf("%v: cophenetic (0,4) = %v, (0,14) = %v", tc.l, c.At(0, 4), c.At(14, 0))
		}
		// The one-pass correlation equals gonum's Pearson correlation of
		// the two matrices.
		orig := Pairwise(x)
		if r, want := CopheneticCorrelation(dend, orig), stat.Correlation(orig.D, c.D, nil); !scalar.EqualWithinAbs(r, want, 1e-12) {
			t.Errorf("%v: correlation %v, gonum stat.Correlation %v", tc.l, r, want)
		}
	}
}

func TestAgglomerateSmall(t *testing.T) {
	for _, l := range []Linkage{Ward, Single, Complete, Average} {
		d, err := Agglomerate(NewCondensed(1), l)
		if err != nil || d.N != 1 || len(d.Merges) != 0 {
			t.Errorf("%v, one item: %+v, %v", l, d, err)
		}
		if got := d.Cut(nil, 3); !slices.Equal(got, []int{0}) {
			t.Errorf("%v, one item: cut %v", l, got)
		}
		d, err = Agglomerate(Condensed{N: 2, D: []float64{3}}, l)
		if err != nil || !slices.Equal(d.Merges, []Merge{{0, 1, 3, 2}}) {
			t.Errorf("%v, two items: %+v, %v", l, d, err)
		}
	}
}

func TestAgglomerateErrors(t *testing.T) {
	for _, tc := range []struct {
		name string
		d    Condensed
		l    Linkage
		want string
	}{
		{"none", NewCondensed(0), Ward, "clustering: no items to cluster"},
		{"NaN", Condensed{N: 3, D: []float64{1, 2, math.NaN()}}, Average, "clustering: distance between items 1 and 2 is NaN: want a finite value >= 0"},
		{"negative", Condensed{N: 3, D: []float64{1, -2, 1}}, Single, "clustering: distance between items 0 and 2 is -2: want a finite value >= 0"},
		{"Inf", Condensed{N: 4, D: []float64{1, 2, 3, 4, math.Inf(1), 6}}, Complete, "clustering: distance between items 1 and 3 is +Inf: want a finite value >= 0"},
		{"linkage", NewCondensed(2), Linkage(7), "clustering: unknown linkage 7"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Agglomerate(tc.d, tc.l)
			if err == nil || err.Error() != tc.want {
				t.Errorf("got %v, want %q", err, tc.want)
			}
		})
	}
}

// Ties are resolved the same way on every run and by the documented rule:
// with four corners of a unit square, every first merge is a tie, and the
// lowest item numbers win.
func TestAgglomerateTies(t *testing.T) {
	s := 1.0
	diag := math.Sqrt2
	// Items 0..3 at (0,0), (1,0), (0,1), (1,1).
	d := []float64{s, s, diag, diag, s, s}
	for _, l := range []Linkage{Single, Complete, Average} {
		first, err := Agglomerate(Condensed{N: 4, D: slices.Clone(d)}, l)
		if err != nil {
			t.Fatal(err)
		}
		if m := first.Merges[0]; m.A != 0 || m.B != 1 {
			t.Errorf("%v: first merge %+v, want items 0 and 1", l, m)
		}
		for range 5 {
			again, _ := Agglomerate(Condensed{N: 4, D: slices.Clone(d)}, l)
			if !slices.Equal(again.Merges, first.Merges) {
				t.Fatalf("%v: a tie is resolved differently on another run", l)
			}
		}
	}
}
