package clustering

import (
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// Linkage matrices of the 15 iris rows in testdata/iris_every10th.csv
// (rows 1, 11, ..., 141; four unscaled measurements, Euclidean), from
// scipy.cluster.hierarchy.linkage 1.10.1. R hclust (stats 4.2.2) gives the
// same heights and cuts. The subset has no tied merge under any method
// (the smallest gap between best and second-best merge is 0.0027).
var h15 = []struct {
	l    Linkage
	rows []Merge
	coph float64 // cophenetic correlation, scipy.cluster.hierarchy.cophenet 1.10.1
	cuts map[int][][]int
}{
	{
		l: Single,
		rows: []Merge{
			{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {15, 17, 0.374166, 4},
			{3, 18, 0.538516, 5}, {10, 16, 0.608276, 3}, {8, 9, 0.640312, 2}, {11, 20, 0.678233, 4},
			{7, 22, 0.700000, 5}, {6, 21, 0.714143, 3}, {13, 23, 0.854400, 6}, {5, 25, 0.877496, 7},
			{24, 26, 1.019804, 10}, {19, 27, 2.345208, 15},
		},
		coph: 0.856396,
		// scipy fcluster(criterion="maxclust") 1.10.1 and R cutree.
		cuts: map[int][][]int{
			2: {{0, 1, 2, 3, 4}, {5, 6, 7, 8, 9, 10, 11, 12, 13, 14}},
			3: {{0, 1, 2, 3, 4}, {5, 7, 10, 11, 12, 13, 14}, {6, 8, 9}},
			4: {{0, 1, 2, 3, 4}, {5}, {6, 8, 9}, {7, 10, 11, 12, 13, 14}},
		},
	},
	{
		l: Complete,
		rows: []Merge{
			{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {3, 15, 0.547723, 3},
			{8, 9, 0.640312, 2}, {7, 11, 0.700000, 2}, {10, 16, 0.707107, 3}, {17, 18, 0.854400, 5},
			{5, 20, 1.174734, 3}, {6, 19, 1.208305, 3}, {13, 21, 1.352775, 4}, {23, 25, 2.027313, 7},
			{22, 24, 3.388215, 8}, {26, 27, 5.643580, 15},
		},
		coph: 0.811570,
		cuts: map[int][][]int{
			2: {{0, 1, 2, 3, 4, 6, 8, 9}, {5, 7, 10, 11, 12, 13, 14}},
			3: {{0, 1, 2, 3, 4}, {5, 7, 10, 11, 12, 13, 14}, {6, 8, 9}},
			4: {{0, 1, 2, 3, 4}, {5, 7, 11}, {6, 8, 9}, {10, 12, 13, 14}},
		},
	},
	{
		l: Average,
		rows: []Merge{
			{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {15, 17, 0.473288, 4},
			{8, 9, 0.640312, 2}, {3, 18, 0.654718, 5}, {10, 16, 0.657692, 3}, {7, 11, 0.700000, 2},
			{6, 19, 0.961224, 3}, {5, 22, 1.026115, 3}, {13, 21, 1.082135, 4}, {24, 25, 1.356817, 7},
			{23, 26, 2.467717, 10}, {20, 27, 4.101440, 15},
		},
		coph: 0.880233,
		cuts: map[int][][]int{
			2: {{0, 1, 2, 3, 4}, {5, 6, 7, 8, 9, 10, 11, 12, 13, 14}},
			3: {{0, 1, 2, 3, 4}, {5, 7, 10, 11, 12, 13, 14}, {6, 8, 9}},
			4: {{0, 1, 2, 3, 4}, {5, 7, 11}, {6, 8, 9}, {10, 12, 13, 14}},
		},
	},
	{
		l: Ward,
		rows: []Merge{
			{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {15, 17, 0.616441, 4},
			{8, 9, 0.640312, 2}, {7, 11, 0.700000, 2}, {10, 16, 0.746101, 3}, {3, 18, 0.777174, 5},
			{6, 19, 1.084743, 3}, {5, 20, 1.126943, 3}, {13, 21, 1.289703, 4}, {24, 25, 2.189912, 7},
			{23, 26, 4.880535, 10}, {22, 27, 10.321822, 15},
		},
		coph: 0.875831,
		cuts: map[int][][]int{
			2: {{0, 1, 2, 3, 4}, {5, 6, 7, 8, 9, 10, 11, 12, 13, 14}},
			3: {{0, 1, 2, 3, 4}, {5, 7, 10, 11, 12, 13, 14}, {6, 8, 9}},
			4: {{0, 1, 2, 3, 4}, {5, 7, 11}, {6, 8, 9}, {10, 12, 13, 14}},
		},
	},
}

// Linkage matrices of iris rows 1 to 10 (testdata/iris_first10.csv), which
// are free of ties for average and Ward linkage only; scipy 1.10.1.
var h10 = []struct {
	l    Linkage
	rows []Merge
	coph float64
	cut3 [][]int // nil when not checked
}{
	{
		l: Ward,
		rows: []Merge{
			{0, 4, 0.141421, 2}, {1, 9, 0.173205, 2}, {7, 10, 0.216025, 3}, {2, 3, 0.244949, 2},
			{6, 13, 0.316228, 3}, {8, 14, 0.500000, 4}, {11, 15, 0.574456, 6}, {5, 12, 0.779957, 4},
			{16, 17, 1.450172, 10},
		},
		coph: 0.620201,
		cut3: [][]int{{0, 4, 7}, {1, 2, 3, 6, 8, 9}, {5}},
	},
	{
		l: Average,
		rows: []Merge{
			{0, 4, 0.141421, 2}, {1, 9, 0.173205, 2}, {7, 10, 0.198406, 3}, {2, 3, 0.244949, 2},
			{6, 13, 0.298119, 3}, {11, 14, 0.375601, 5}, {8, 15, 0.470058, 6}, {12, 16, 0.564590, 9},
			{5, 17, 0.971179, 10},
		},
		coph: 0.827054,
	},
}

func checkMerges(t *testing.T, got *Dendrogram, want []Merge, tol float64) {
	t.Helper()
	if len(got.Merges) != len(want) {
		t.Fatalf("got %d merges, want %d", len(got.Merges), len(want))
	}
	for i, w := range want {
		g := got.Merges[i]
		if g.A != w.A || g.B != w.B || g.Size != w.Size || !scalar.EqualWithinAbs(g.Height, w.Height, tol) {
			t.Errorf("merge %d: got %d %d %.6f %d, want %d %d %.6f %d", i, g.A, g.B, g.Height, g.Size, w.A, w.B, w.Height, w.Size)
		}
	}
}

func TestAgglomerateIris15(t *testing.T) {
	x, _ := readIris(t, "iris_every10th.csv")
	for _, tc := range h15 {
		t.Run(tc.l.String(), func(t *testing.T) {
			dend, err := Agglomerate(Pairwise(x), tc.l)
			if err != nil {
				t.Fatal(err)
			}
			checkMerges(t, dend, tc.rows, 1e-6)
			r := CopheneticCorrelation(dend, Pairwise(x))
			if !scalar.EqualWithinAbs(r, tc.coph, 1e-6) {
				t.Errorf("cophenetic correlation: got %.6f, want %.6f", r, tc.coph)
			}
			for k, want := range tc.cuts {
				if got := groups(dend.Cut(nil, k)); !slices.EqualFunc(got, want, slices.Equal) {
					t.Errorf("cut k=%d: got %v, want %v", k, got, want)
				}
			}
		})
	}
}

func TestAgglomerateIris10(t *testing.T) {
	x, _ := readIris(t, "iris_first10.csv")
	for _, tc := range h10 {
		t.Run(tc.l.String(), func(t *testing.T) {
			dend, err := Agglomerate(Pairwise(x), tc.l)
			if err != nil {
				t.Fatal(err)
			}
			checkMerges(t, dend, tc.rows, 1e-6)
			r := CopheneticCorrelation(dend, Pairwise(x))
			if !scalar.EqualWithinAbs(r, tc.coph, 1e-6) {
				t.Errorf("cophenetic correlation: got %.6f, want %.6f", r, tc.coph)
			}
			if tc.cut3 != nil {
				if got := groups(dend.Cut(nil, 3)); !slices.EqualFunc(got, tc.cut3, slices.Equal) {
					t.Errorf("cut k=3: got %v, want %v", got, tc.cut3)
				}
			}
		})
	}
}
