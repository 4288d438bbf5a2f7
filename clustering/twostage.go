package clustering

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// TwoStage holds the settings for hierarchical clustering of many rows.
// Up to Above rows, the tree is built on the rows themselves. Above it,
// Ward linkage runs in two stages: k-means groups the rows into
// Centroids groups, then Ward linkage joins the groups, starting from
// their centroids weighted by their sizes (the Lance–Williams update with
// initial sizes), so that the tree above the groups is the Ward tree of
// the rows given the groups. This bounds memory at one condensed matrix of
// Centroids items. The other linkages have no such shortcut and are
// refused above Above rows. The zero value is ready to use.
type TwoStage struct {
	// Above is the number of rows above which Ward runs in two stages;
	// 0 means 30,000 (3.6 GB of distances at that size).
	Above int

	// Centroids is the number of k-means groups of the first stage;
	// 0 means 1,000. When it is not below the number of rows, every row
	// is its own group.
	Centroids int

	// KMeans holds the settings of the first stage. Its K is ignored.
	// Zero fields here mean 1 restart, at most 20 iterations, Tol 1e-4
	// and 1 candidate per centre (the original k-means++): the stage only
	// needs to quantise the rows, and stopping at 20 iterations is not
	// reported. (On 50,000 rows of an 8-group mixture, 1,000 groups after
	// 20 iterations have an inertia 0.3 % above the converged one.)
	KMeans KMeans
}

// Tree is a hierarchical clustering of rows.
type Tree struct {
	// Dendrogram is the tree. Its items are the rows, or, when TwoStage
	// is true, the first-stage groups.
	Dendrogram *Dendrogram

	// Group holds the first-stage group of each row when TwoStage is
	// true, and is nil otherwise.
	Group []int

	// TwoStage says whether the rows were first grouped by k-means.
	TwoStage bool

	// Warnings reports the use of the two-stage method and any warning of
	// its first stage.
	Warnings []error
}

// Tree builds the hierarchical clustering of the rows of x under linkage l,
// in two stages for Ward above ts.Above rows (see TwoStage). It returns an
// error for NaN or ±Inf in x (a *ValueError), for no rows, and for a
// linkage other than Ward above ts.Above rows.
func (ts TwoStage) Tree(x mat.Matrix, l Linkage) (*Tree, error) {
	data, n, d := rowMajor(x)
	if err := checkFinite(data, d); err != nil {
		return nil, err
	}
	above := ts.Above
	if above == 0 {
		above = 30000
	}
	if n <= above {
		dend, err := Agglomerate(Pairwise(x), l)
		if err != nil {
			return nil, err
		}
		return &Tree{Dendrogram: dend}, nil
	}
	if l != Ward {
		return nil, fmt.Errorf("clustering: %v linkage of %d rows would need %.1f GB of distances; above %d rows only ward linkage (in two stages) or k-means is offered",
			l, n, 4*float64(n)*float64(n-1)/1e9, above)
	}
	m := ts.Centroids
	if m == 0 {
		m = 1000
	}
	t := &Tree{TwoStage: true}
	var centres mat.Matrix
	var sizes []int
	if m >= n {
		t.Group = make([]int, n)
		for i := range t.Group {
			t.Group[i] = i
		}
		centres, sizes = x, make([]int, n)
		for i := range sizes {
			sizes[i] = 1
		}
	} else {
		km := ts.KMeans
		km.K = m
		if km.Restarts == 0 {
			km.Restarts = 1
		}
		if km.MaxIter == 0 {
			km.MaxIter = 20
		}
		if km.Candidates == 0 {
			km.Candidates = 1
		}
		r, err := km.Cluster(x)
		if err != nil {
			return nil, err
		}
		t.Group, centres, sizes = r.Labels, r.Centers, r.Sizes
		for _, w := range r.Warnings {
			if !errors.Is(w, ErrMaxIter) || ts.KMeans.MaxIter != 0 {
				t.Warnings = append(t.Warnings, w)
			}
		}
	}
	t.Warnings = append(t.Warnings, fmt.Errorf("ward linkage of %d rows ran in two stages: k-means grouped the rows into %d groups, then ward linkage joined the groups; the tree has no levels below the groups", n, len(sizes)))
	dend, err := AgglomerateSized(wardGroupDistances(centres, sizes), Ward, sizes)
	if err != nil {
		return nil, err
	}
	t.Dendrogram = dend
	return t, nil
}

// wardGroupDistances returns sqrt(2·na·nb/(na+nb))·‖ca−cb‖ for each pair of
// groups with centroids c and sizes n, the Ward distance between them.
func wardGroupDistances(c mat.Matrix, sizes []int) Condensed {
	dist := Pairwise(c)
	n := dist.N
	for i := range n {
		for j := i + 1; j < n; j++ {
			a, b := float64(sizes[i]), float64(sizes[j])
			dist.D[dist.Index(i, j)] *= math.Sqrt(2 * a * b / (a + b))
		}
	}
	return dist
}

// Cut returns the partition of the rows into k clusters (see
// Dendrogram.Cut), numbered in the order of each cluster's first row. k is
// clamped to [1, number of items of the tree]. dst is as for
// Dendrogram.Cut.
func (t *Tree) Cut(dst []int, k int) []int {
	if t.Group == nil {
		return t.Dendrogram.Cut(dst, k)
	}
	leaf := t.Dendrogram.Cut(nil, k)
	if dst == nil {
		dst = make([]int, len(t.Group))
	} else if len(dst) != len(t.Group) {
		panic("clustering: dst length mismatch")
	}
	for i, g := range t.Group {
		dst[i] = leaf[g]
	}
	firstAppearance(dst, min(max(k, 1), t.Dendrogram.N))
	return dst
}
