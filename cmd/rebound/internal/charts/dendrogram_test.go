package charts

import (
	"fmt"
	"testing"

	"gonum.org/v1/gonum/mat"
	"rebound/clustering"
)

// tree builds a Ward tree of n points in three loose groups on a line.
func tree(t *testing.T, n int) *clustering.Dendrogram {
	t.Helper()
	x := mat.NewDense(n, 2, nil)
	for i := range n {
		g := float64(i % 3)
		x.Set(i, 0, 10*g+float64(i%7)*0.3)
		x.Set(i, 1, float64(i%5)*0.2-g)
	}
	d, err := clustering.Agglomerate(clustering.Pairwise(x), clustering.Ward)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

func TestDendrogram(t *testing.T) {
	for _, tc := range []struct {
		name string
		n, k int
	}{
		{"dendrogram_32", 32, 3},
		{"dendrogram_2", 2, 2},
		{"dendrogram_1cluster", 6, 1},
		{"dendrogram_200", 200, 4},
	} {
		t.Run(tc.name, func(t *testing.T) {
			labels := make([]string, tc.n)
			for i := range labels {
				labels[i] = fmt.Sprintf("ST-%03d", i+1)
			}
			data, err := Dendrogram(tree(t, tc.n), labels, tc.k, "Ward linkage distance (standardised features)")
			if err != nil {
				t.Fatal(err)
			}
			check(t, tc.name, data, 3.7, 4.3)
		})
	}
	if _, err := Dendrogram(nil, nil, 2, ""); err != ErrNoData {
		t.Errorf("nil tree: %v, want ErrNoData", err)
	}
}
