package clustering

import (
	"math"
	"sort"
)

// Merge is one step of a dendrogram, in the conventions of scipy's linkage
// matrix: items are numbered 0..N−1 and the cluster made by Merges[i] is
// numbered N+i.
type Merge struct {
	A, B   int     // the two clusters joined, A < B
	Height float64 // their linkage distance when joined
	Size   int     // observations in the new cluster
}

// Dendrogram is the result of agglomerative clustering of N items: N−1
// merges in order of non-decreasing height.
type Dendrogram struct {
	N      int
	Merges []Merge
}

// Cut returns the partition into k clusters obtained by undoing the last
// k−1 merges, as scipy's fcluster(criterion="maxclust") and R's cutree do.
// When merges tie in height at the cut, Cut still returns exactly k
// clusters, undoing the merges made last (scipy's maxclust would then
// return fewer). k is clamped to [1, N].
//
// Cluster labels are 0, 1, ... in the order of each cluster's first item.
// Cut stores the labels in dst and returns it; if dst is nil a new slice is
// allocated, and otherwise it must have length N.
func (d *Dendrogram) Cut(dst []int, k int) []int {
	k = min(max(k, 1), d.N)
	return d.apply(dst, d.N-k)
}

// CutHeight returns the partition made by the merges of height at most h,
// as scipy's fcluster(criterion="distance") does: items are in one cluster
// when their cophenetic distance is at most h. Labels and dst are as for
// Cut.
func (d *Dendrogram) CutHeight(dst []int, h float64) []int {
	m := sort.Search(len(d.Merges), func(i int) bool { return !(d.Merges[i].Height <= h) })
	return d.apply(dst, m)
}

// apply labels the items by the clusters that the first m merges make.
func (d *Dendrogram) apply(dst []int, m int) []int {
	n := d.N
	if dst == nil {
		dst = make([]int, n)
	} else if len(dst) != n {
		panic("clustering: dst length mismatch")
	}
	parent := make([]int, n+m)
	for i := range parent {
		parent[i] = i
	}
	for i, mg := range d.Merges[:m] {
		parent[mg.A], parent[mg.B] = n+i, n+i
	}
	label := make([]int, n+m)
	for i := range label {
		label[i] = -1
	}
	next := 0
	for i := range n {
		r := i
		for parent[r] != r {
			r = parent[r]
		}
		// Path compression keeps this linear overall.
		for j := i; parent[j] != r; {
			j, parent[j] = parent[j], r
		}
		if label[r] < 0 {
			label[r] = next
			next++
		}
		dst[i] = label[r]
	}
	return dst
}

// eachJoin calls f for every merge with its height and the items of the
// two clusters it joins.
func (d *Dendrogram) eachJoin(f func(h float64, a, b []int)) {
	n := d.N
	// The items of each cluster form a linked list through next.
	head := make([]int, max(2*n-1, 0))
	tail := make([]int, max(2*n-1, 0))
	next := make([]int, n)
	for i := range n {
		head[i], tail[i], next[i] = i, i, -1
	}
	var a, b []int
	for i, m := range d.Merges {
		a = collect(a[:0], head[m.A], next)
		b = collect(b[:0], head[m.B], next)
		f(m.Height, a, b)
		id := n + i
		next[tail[m.A]] = head[m.B]
		head[id], tail[id] = head[m.A], tail[m.B]
	}
}

func collect(dst []int, i int, next []int) []int {
	for ; i >= 0; i = next[i] {
		dst = append(dst, i)
	}
	return dst
}

// Cophenetic returns the cophenetic distances of the items: for each pair,
// the height of the merge that first puts them in one cluster.
func (d *Dendrogram) Cophenetic() Condensed {
	c := NewCondensed(d.N)
	rs := rowStarts(d.N)
	d.eachJoin(func(h float64, a, b []int) {
		for _, i := range a {
			for _, j := range b {
				c.D[pairIndex(rs, i, j)] = h
			}
		}
	})
	return c
}

// CopheneticCorrelation returns the Pearson correlation between the
// distances orig and the cophenetic distances of d (Sokal & Rohlf 1962), a
// measure of how faithfully the tree keeps the distances. It needs no
// second matrix of distances. It returns NaN when either set of distances
// is constant, and panics if orig.N != d.N.
func CopheneticCorrelation(d *Dendrogram, orig Condensed) float64 {
	if orig.N != d.N || len(orig.D) != d.N*(d.N-1)/2 {
		panic("clustering: dendrogram and distances differ in size")
	}
	p := float64(len(orig.D))
	var so, sc float64
	for _, v := range orig.D {
		so += v
	}
	// Merge.Size counts observations, which after AgglomerateSized are
	// not items; count items here.
	items := make([]int, max(2*d.N-1, 0))
	for i := range d.N {
		items[i] = 1
	}
	for i, m := range d.Merges {
		sc += m.Height * float64(items[m.A]*items[m.B])
		items[d.N+i] = items[m.A] + items[m.B]
	}
	mo, mc := so/p, sc/p
	var soo, scc, soc float64
	for _, v := range orig.D {
		soo += (v - mo) * (v - mo)
	}
	rs := rowStarts(d.N)
	d.eachJoin(func(h float64, a, b []int) {
		var s float64
		for _, i := range a {
			for _, j := range b {
				s += orig.D[pairIndex(rs, i, j)] - mo
			}
		}
		pairs := float64(len(a) * len(b))
		scc += pairs * (h - mc) * (h - mc)
		soc += (h - mc) * s
	})
	if soo == 0 || scc == 0 {
		return math.NaN()
	}
	return soc / math.Sqrt(soo*scc)
}
