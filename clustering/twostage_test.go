package clustering

import (
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// With at least as many groups as rows, every row is its own group of size
// 1, and two-stage Ward is plain Ward (the initial Ward distance of two
// single rows is their Euclidean distance).
func TestTwoStageAllRowsIsWard(t *testing.T) {
	x, _ := readIris(t, "iris_every10th.csv")
	plain, err := Agglomerate(Pairwise(x), Ward)
	if err != nil {
		t.Fatal(err)
	}
	tree, err := TwoStage{Above: 5, Centroids: 100}.Tree(x, Ward)
	if err != nil {
		t.Fatal(err)
	}
	if !tree.TwoStage || len(tree.Warnings) == 0 {
		t.Errorf("the tree does not say it was built in two stages")
	}
	if !slices.Equal(tree.Dendrogram.Merges, plain.Merges) {
		t.Errorf("two-stage merges %v\nwant %v", tree.Dendrogram.Merges, plain.Merges)
	}
	for k := 1; k <= 15; k++ {
		if got, want := tree.Cut(nil, k), plain.Cut(nil, k); !slices.Equal(got, want) {
			t.Errorf("k = %d: got %v, want %v", k, got, want)
		}
	}
}

// When every row appears twice, k-means into n/2 groups finds the
// distinct rows (inertia 0), and Ward on groups of size 2 must give the
// Ward tree of all rows above the zero-height merges of the copies; this
// checks the Lance–Williams update with initial sizes against plain Ward
// (Ward's ΔESS for two groups of 2 is ‖ca−cb‖², so the height is √2·‖ca−cb‖).
func TestTwoStageGroupsMatchWard(t *testing.T) {
	x, _ := readIris(t, "iris_every10th.csv")
	n, d := x.Dims()
	twice := mat.NewDense(2*n, d, nil)
	for i := range n {
		twice.SetRow(i, x.RawRowView(i))
		twice.SetRow(n+i, x.RawRowView(i))
	}
	plain, err := Agglomerate(Pairwise(twice), Ward)
	if err != nil {
		t.Fatal(err)
	}
	tree, err := TwoStage{Above: 10, Centroids: n}.Tree(twice, Ward)
	if err != nil {
		t.Fatal(err)
	}
	if tree.Dendrogram.N != n {
		t.Fatalf("tree over %d groups, want %d", tree.Dendrogram.N, n)
	}
	want := heights(plain)[n:]
	if !floats.EqualApprox(heights(tree.Dendrogram), want, 1e-12) {
		t.Errorf("heights %v\nwant %v", heights(tree.Dendrogram), want)
	}
	for k := 1; k <= n; k++ {
		if got, want := tree.Cut(nil, k), plain.Cut(nil, k); !slices.Equal(got, want) {
			t.Errorf("k = %d: got %v, want %v", k, got, want)
		}
	}
	last := tree.Dendrogram.Merges[n-2]
	if last.Size != 2*n {
		t.Errorf("top merge holds %d rows, want %d", last.Size, 2*n)
	}
}

func TestTwoStageLarge(t *testing.T) {
	x := mixture(3000, 4, 5, 9)
	tree, err := TwoStage{Above: 1000, Centroids: 200}.Tree(x, Ward)
	if err != nil {
		t.Fatal(err)
	}
	if !tree.TwoStage || tree.Dendrogram.N != 200 || len(tree.Group) != 3000 {
		t.Fatalf("got a tree over %d items (two-stage %v)", tree.Dendrogram.N, tree.TwoStage)
	}
	labels := tree.Cut(nil, 5)
	if got := len(countLabels(labels)); got != 5 {
		t.Errorf("cut into %d clusters, want 5", got)
	}
	// The two-stage partition should be close to plain Ward's on this
	// well-mixed but structured sample.
	plain, err := Agglomerate(Pairwise(x), Ward)
	if err != nil {
		t.Fatal(err)
	}
	if ari := AdjustedRand(labels, plain.Cut(nil, 5)); ari < 0.8 {
		t.Errorf("ARI with plain Ward %.3f, want >= 0.8", ari)
	}
	_, err = TwoStage{Above: 1000}.Tree(x, Average)
	if err == nil || !strings.Contains(err.Error(), "only ward linkage") {
		t.Errorf("average linkage above the limit: got %v", err)
	}
}
