package clustering

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"slices"
)

// Agglomerate builds the dendrogram of the d.N items whose pairwise
// distances are d, joining at each step the two closest clusters under
// linkage l.
//
// Ward, complete and average linkage run the nearest-neighbour chain and
// single linkage runs Prim's minimum spanning tree, both as described by
// Müllner (2011), "Modern hierarchical, agglomerative clustering
// algorithms", arXiv:1109.2378. Both take O(n²) time. The only memory of
// that order is d itself: Agglomerate overwrites d.D as its working storage
// (single linkage leaves it unchanged; Ward may change it even when it
// returns an error), so compute d again, or copy it first, to use the
// distances afterwards. New cluster distances follow the
// Lance–Williams update of each linkage; Ward works on squared distances
// internally and reports heights as sqrt(2·ΔESS).
//
// Ties: a nearest-neighbour search keeps the cluster it came from when
// another is equally close, and otherwise takes the candidate with the
// lowest item index; the spanning tree likewise takes the lowest index.
// When all distances differ the result does not depend on the order of the
// items, and a tie is resolved the same way on every run.
//
// The merges are sorted by height (a stable sort, so merges of equal height
// keep the order they were made in) and numbered as scipy numbers them; see
// Merge. Agglomerate returns an error if d.N is 0 or d holds a NaN, an
// infinite or a negative distance. It panics if len(d.D) != d.N*(d.N-1)/2.
func Agglomerate(d Condensed, l Linkage) (*Dendrogram, error) {
	return AgglomerateSized(d, l, nil)
}

// AgglomerateSized is Agglomerate for items that stand for groups:
// sizes[i] is the number of observations item i stands for (nil means all
// 1). The sizes enter the Lance–Williams updates of Ward and average
// linkage as initial cluster sizes, and Merge.Size counts observations. For
// Ward, d must then hold the Ward distances between the groups,
// sqrt(2·nA·nB/(nA+nB))·‖cA−cB‖ for groups of sizes nA and nB with centroids
// cA and cB; the tree is then the one that Ward linkage of the
// observations builds when it starts from those groups. AgglomerateSized panics if sizes has the wrong
// length, and returns an error for a size below 1.
func AgglomerateSized(d Condensed, l Linkage, sizes []int) (*Dendrogram, error) {
	n := d.N
	if n < 0 || len(d.D) != n*(n-1)/2 {
		panic("clustering: condensed distances have the wrong length")
	}
	if sizes != nil && len(sizes) != n {
		panic("clustering: sizes length mismatch")
	}
	if l < Ward || l > Average {
		return nil, fmt.Errorf("clustering: unknown linkage %d", int(l))
	}
	if n == 0 {
		return nil, errors.New("clustering: no items to cluster")
	}
	size := make([]float64, n)
	for i := range size {
		size[i] = 1
		if sizes != nil {
			if sizes[i] < 1 {
				return nil, fmt.Errorf("clustering: item %d has size %d: want >= 1", i, sizes[i])
			}
			size[i] = float64(sizes[i])
		}
	}
	if err := checkDistances(d, l == Ward); err != nil {
		return nil, err
	}
	var merges []Merge
	if l == Single {
		merges = primChain(d)
	} else {
		merges = nnChain(d, l, size)
		if l == Ward {
			for i := range merges {
				merges[i].Height = math.Sqrt(max(0, merges[i].Height))
			}
		}
	}
	slices.SortStableFunc(merges, func(a, b Merge) int { return cmp.Compare(a.Height, b.Height) })
	relabel(merges, n, sizes)
	return &Dendrogram{N: n, Merges: merges}, nil
}

// checkDistances reports the first distance that is NaN, infinite or
// negative. If square is true it squares the distances as it goes, in the
// same pass over memory; on error, d is partly squared.
func checkDistances(d Condensed, square bool) error {
	for k, v := range d.D {
		if square {
			d.D[k] = v * v
		}
		if !(v >= 0) || math.IsInf(v, 1) {
			// Find the pair; this runs once, on failure.
			rs := rowStarts(d.N)
			i := 0
			for i+1 < d.N && rs[i+1]+i+2 <= k {
				i++
			}
			return fmt.Errorf("clustering: distance between items %d and %d is %v: want a finite value >= 0", i, k-rs[i], v)
		}
	}
	return nil
}

// nnChain runs the nearest-neighbour chain on the condensed distances d
// (squared for Ward), overwriting them. It returns merges in the order made,
// with A and B the slots (items) that hold the two clusters: a cluster lives
// in the slot of its largest-numbered surviving item, which is always one of
// its items.
func nnChain(d Condensed, l Linkage, size []float64) []Merge {
	n := d.N
	D := d.D
	rs := rowStarts(n)
	active := make([]int32, n) // slots still in use, ascending
	for i := range active {
		active[i] = int32(i)
	}
	chain := make([]int, 0, n)
	merges := make([]Merge, 0, n-1)
	for len(merges) < n-1 {
		if len(chain) == 0 {
			chain = append(chain, int(active[0]))
		}
		var x, y, px int
		var dxy float64
		for {
			x = chain[len(chain)-1]
			px, _ = slices.BinarySearch(active, int32(x))
			prev := -1
			dxy = math.Inf(1)
			if len(chain) > 1 {
				prev = chain[len(chain)-2]
				y = prev
				dxy = D[pairIndex(rs, x, prev)]
			}
			// Slots below x: column x of their rows.
			for _, a := range active[:px] {
				if v := D[rs[a]+x]; v < dxy {
					dxy, y = v, int(a)
				}
			}
			// Slots above x: row x, contiguous.
			off := rs[x]
			for _, a := range active[px+1:] {
				if v := D[off+int(a)]; v < dxy {
					dxy, y = v, int(a)
				}
			}
			if y == prev {
				break
			}
			chain = append(chain, y)
		}
		chain = chain[:len(chain)-2]
		if x > y {
			x, y = y, x
			px, _ = slices.BinarySearch(active, int32(x))
		}
		nx, ny := size[x], size[y]
		merges = append(merges, Merge{A: x, B: y, Height: dxy})
		lanceWilliams(D, rs, active, x, y, dxy, l, size)
		size[y] = nx + ny
		size[x] = 0
		active = slices.Delete(active, px, px+1)
	}
	return merges
}

// pairIndex returns the position of the pair i ≠ j in a condensed slice.
func pairIndex(rs []int, i, j int) int {
	if i < j {
		return rs[i] + j
	}
	return rs[j] + i
}

// lanceWilliams writes into slot y the distances from every active slot to
// the union of the clusters in slots x < y, which are dxy apart.
func lanceWilliams(D []float64, rs []int, active []int32, x, y int, dxy float64, l Linkage, size []float64) {
	nx, ny := size[x], size[y]
	for _, a := range active {
		i := int(a)
		if i == x || i == y {
			continue
		}
		var ix, iy int
		switch {
		case i < x:
			ix, iy = rs[i]+x, rs[i]+y
		case i < y:
			ix, iy = rs[x]+i, rs[i]+y
		default:
			ix, iy = rs[x]+i, rs[y]+i
		}
		dix, diy := D[ix], D[iy]
		switch l {
		case Ward: // squared distances
			ni := size[i]
			D[iy] = ((ni+nx)*dix + (ni+ny)*diy - ni*dxy) / (ni + nx + ny)
		case Average:
			D[iy] = (nx*dix + ny*diy) / (nx + ny)
		case Complete:
			D[iy] = max(dix, diy)
		}
	}
}

// primChain builds the single-linkage merges from Prim's minimum spanning
// tree: each step joins the item nearest to the tree grown so far, and is
// recorded as a merge of the item added before it with the new item.
// Sorted by height, these merges give the single-linkage dendrogram
// (Müllner 2011, section 3.3).
func primChain(d Condensed) []Merge {
	n := d.N
	D := d.D
	rs := rowStarts(n)
	rest := make([]int32, n-1) // items not yet in the tree, ascending
	for i := range rest {
		rest[i] = int32(i + 1)
	}
	near := make([]float64, n) // distance from each item to the tree
	for i := range near {
		near[i] = math.Inf(1)
	}
	merges := make([]Merge, 0, n-1)
	x := 0
	for len(rest) > 0 {
		best, bp := math.Inf(1), 0
		for p, a := range rest {
			i := int(a)
			v := D[pairIndex(rs, x, i)]
			if v < near[i] {
				near[i] = v
			}
			if near[i] < best {
				best, bp = near[i], p
			}
		}
		y := int(rest[bp])
		merges = append(merges, Merge{A: x, B: y, Height: best})
		rest = slices.Delete(rest, bp, bp+1)
		x = y
	}
	return merges
}

// relabel turns merges of items (in height order) into merges of cluster
// ids: the cluster made by merges[i] gets id n+i, and each merge lists the
// smaller id first.
func relabel(merges []Merge, n int, sizes []int) {
	parent := make([]int, 2*n-1)
	count := make([]int, 2*n-1)
	for i := range parent {
		parent[i] = i
		if i < n {
			count[i] = 1
			if sizes != nil {
				count[i] = sizes[i]
			}
		}
	}
	find := func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	for i := range merges {
		m := &merges[i]
		a, b := find(m.A), find(m.B)
		if a > b {
			a, b = b, a
		}
		id := n + i
		parent[a], parent[b] = id, id
		count[id] = count[a] + count[b]
		m.A, m.B, m.Size = a, b, count[id]
	}
}
