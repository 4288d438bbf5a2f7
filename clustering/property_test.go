package clustering

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
	"pgregory.net/rapid"
)

// randomRows returns n×d uniform values from a seed; continuous values make
// every distance differ, so linkage has no ties.
func randomRows(n, d int, seed uint64) *mat.Dense {
	rng := rand.New(rand.NewPCG(seed, 1))
	x := mat.NewDense(n, d, nil)
	for i := range n {
		for j := range d {
			x.Set(i, j, rng.Float64())
		}
	}
	return x
}

// blobs returns comps tight, well-separated groups of per rows each, in an
// order mixed by seed.
func blobs(comps, per, d int, seed uint64) *mat.Dense {
	rng := rand.New(rand.NewPCG(seed, 2))
	x := mat.NewDense(comps*per, d, nil)
	for p, i := range rng.Perm(comps * per) {
		c := i % comps
		for j := range d {
			x.Set(p, j, 20*float64(c)*float64(1+j%2)+0.5*rng.NormFloat64())
		}
	}
	return x
}

// permuted returns the rows of x in the order perm: row i of the result is
// row perm[i] of x.
func permuted(x *mat.Dense, perm []int) *mat.Dense {
	n, d := x.Dims()
	y := mat.NewDense(n, d, nil)
	for i, p := range perm {
		y.SetRow(i, x.RawRowView(p))
	}
	return y
}

// unpermute returns the labels of the original rows given labels of the
// rows in the order perm.
func unpermute(labels, perm []int) []int {
	out := make([]int, len(labels))
	for i, p := range perm {
		out[p] = labels[i]
	}
	return out
}

func heights(d *Dendrogram) []float64 {
	h := make([]float64, len(d.Merges))
	for i, m := range d.Merges {
		h[i] = m.Height
	}
	return h
}

// Permuting rows, or scaling all features by a positive constant, leaves
// every linkage's partitions unchanged (and scales the heights) when the
// distances are distinct; common practice for any method built on
// Euclidean distances.
func TestLinkageInvariance(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(2, 40).Draw(t, "n")
		d := rapid.IntRange(1, 4).Draw(t, "d")
		x := randomRows(n, d, rapid.Uint64().Draw(t, "seed"))
		perm := rapid.Permutation(iotaInts(n)).Draw(t, "perm")
		c := rapid.Float64Range(1e-3, 1e3).Draw(t, "scale")
		var scaled mat.Dense
		scaled.Scale(c, x)
		for _, l := range []Linkage{Ward, Single, Complete, Average} {
			base, err := Agglomerate(Pairwise(x), l)
			if err != nil {
				t.Fatal(err)
			}
			perm1, err := Agglomerate(Pairwise(permuted(x, perm)), l)
			if err != nil {
				t.Fatal(err)
			}
			scal, err := Agglomerate(Pairwise(&scaled), l)
			if err != nil {
				t.Fatal(err)
			}
			hb := heights(base)
			if !floats.EqualApprox(hb, heights(perm1), 1e-12) {
				t.Fatalf("%v: heights change with row order", l)
			}
			hs := heights(scal)
			floats.Scale(1/c, hs)
			if !floats.EqualApprox(hb, hs, 1e-9) {
				t.Fatalf("%v: heights do not scale with the features", l)
			}
			for k := 1; k <= n; k++ {
				want := base.Cut(nil, k)
				if got := unpermute(perm1.Cut(nil, k), perm); !samePartition(got, want) {
					t.Fatalf("%v, k = %d: permuting rows changes the partition", l, k)
				}
				if got := scal.Cut(nil, k); !slices.Equal(got, want) {
					t.Fatalf("%v, k = %d: scaling changes the partition", l, k)
				}
			}
		}
	})
}

func iotaInts(n int) []int {
	s := make([]int, n)
	for i := range s {
		s[i] = i
	}
	return s
}

// On well-separated groups, k-means finds the groups whatever the row
// order or scale (common practice). Scaling by a power of two is exact in
// floating point, so there the whole result is identical.
func TestKMeansInvariance(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		k := rapid.IntRange(2, 5).Draw(t, "k")
		x := blobs(k, rapid.IntRange(3, 20).Draw(t, "per"), 3, rapid.Uint64().Draw(t, "seed"))
		n, _ := x.Dims()
		perm := rapid.Permutation(iotaInts(n)).Draw(t, "perm")
		km := KMeans{K: k, Restarts: 5, Seed: rapid.Uint64().Draw(t, "kmseed")}
		base, err := km.Cluster(x)
		if err != nil {
			t.Fatal(err)
		}
		p, err := km.Cluster(permuted(x, perm))
		if err != nil {
			t.Fatal(err)
		}
		if !samePartition(unpermute(p.Labels, perm), base.Labels) {
			t.Fatalf("permuting rows changes the partition")
		}
		c := rapid.Float64Range(1e-3, 1e3).Draw(t, "scale")
		var scaled mat.Dense
		scaled.Scale(c, x)
		s, err := km.Cluster(&scaled)
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(s.Labels, base.Labels) {
			t.Fatalf("scaling by %v changes the partition", c)
		}
		e := math.Ldexp(1, rapid.IntRange(-8, 8).Draw(t, "exp"))
		scaled.Scale(e, x)
		s, err = km.Cluster(&scaled)
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(s.Labels, base.Labels) || s.Inertia != e*e*base.Inertia || s.Iter != base.Iter {
			t.Fatalf("scaling by %v changes the result", e)
		}
	})
}

func TestAdjustedRandProperties(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(0, 60).Draw(t, "n")
		a := rapid.SliceOfN(rapid.IntRange(-2, 5), n, n).Draw(t, "a")
		b := rapid.SliceOfN(rapid.IntRange(0, 5), n, n).Draw(t, "b")
		if got := AdjustedRand(a, a); got != 1 {
			t.Fatalf("ARI(a, a) = %v, want 1", got)
		}
		ab, ba := AdjustedRand(a, b), AdjustedRand(b, a)
		if ab != ba {
			t.Fatalf("ARI(a, b) = %v but ARI(b, a) = %v", ab, ba)
		}
		if ab > 1 || math.IsNaN(ab) {
			t.Fatalf("ARI(a, b) = %v, want a number <= 1", ab)
		}
		// Renaming labels changes nothing.
		renamed := make([]int, n)
		for i, v := range b {
			renamed[i] = 10 - 3*v
		}
		if got := AdjustedRand(a, renamed); got != ab {
			t.Fatalf("ARI changes when labels are renamed: %v, %v", got, ab)
		}
	})
}

func TestAdjustedRandHand(t *testing.T) {
	// Hubert & Arabie (1985) formula worked by hand on the species × k-means
	// table of iris (setosa 50,0,0; versicolor 0,48,2; virginica 0,14,36):
	// (3075 − 3675·3819/11175) / (½(3675+3819) − 3675·3819/11175) = 0.730238,
	// which scikit-learn 1.2.1 adjusted_rand_score also gives.
	var a, b []int
	table := [3][3]int{{50, 0, 0}, {0, 48, 2}, {0, 14, 36}}
	for i, row := range table {
		for j, m := range row {
			for range m {
				a, b = append(a, i), append(b, j)
			}
		}
	}
	if got := AdjustedRand(a, b); !scalar.EqualWithinAbs(got, 0.730238, 1e-6) {
		t.Errorf("got %.6f, want 0.730238", got)
	}
	// Both trivial: one cluster each, or all singletons each.
	if got := AdjustedRand([]int{1, 1, 1}, []int{4, 4, 4}); got != 1 {
		t.Errorf("one cluster each: got %v, want 1", got)
	}
	if got := AdjustedRand([]int{0, 1, 2}, []int{2, 0, 1}); got != 1 {
		t.Errorf("singletons each: got %v, want 1", got)
	}
	// One cluster against singletons: no pair agrees beyond chance, 0 (by hand).
	if got := AdjustedRand([]int{0, 0, 0, 0}, []int{0, 1, 2, 3}); got != 0 {
		t.Errorf("one cluster vs singletons: got %v, want 0", got)
	}
}
