package clustering

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// KMeans holds the settings of k-means clustering: k-means++ seeding
// (Arthur & Vassilvitskii 2007, "k-means++: the advantages of careful
// seeding", SODA) followed by Lloyd's iterations (Lloyd 1982, "Least
// squares quantization in PCM", IEEE Trans. Inf. Theory 28:129–137),
// sped up by Hamerly's (2010) bounds, restarted several times, keeping the
// restart with the lowest inertia (the lowest-numbered restart on a tie).
// An empty cluster is refilled with the row farthest from its centre. The
// zero value of every field but K selects a default.
type KMeans struct {
	// K is the number of clusters, 1 <= K <= number of rows.
	K int

	// Restarts is the number of independent seedings; 0 means 20.
	Restarts int

	// MaxIter bounds the Lloyd iterations of each restart; 0 means 300.
	MaxIter int

	// Tol ends a restart once the centres moved by a summed squared
	// distance of at most Tol times the mean per-feature variance of the
	// rows in one iteration (the rule of scikit-learn's KMeans), after
	// which the rows are assigned once more to the final centres. A
	// restart also ends when no row changes cluster. 0 means 1e-4; a
	// negative Tol leaves only the second rule.
	Tol float64

	// Candidates is the number of rows drawn for each new centre during
	// seeding; the one that most reduces the inertia is kept ("greedy"
	// k-means++, as in scikit-learn). 0 means 2 + ⌊ln K⌋; 1 is the
	// original k-means++.
	Candidates int

	// Seed selects the random draws: restart r draws from
	// rand.New(rand.NewPCG(Seed, uint64(r))).
	Seed uint64

	// Workers is the number of goroutines that assign rows to centres;
	// 0 means GOMAXPROCS. Rows are processed in fixed blocks whose partial
	// sums are added in block order, so the result is the same for any
	// value.
	Workers int
}

// Result is the outcome of a k-means clustering.
type Result struct {
	// Labels holds the cluster of each row, 0..K−1, numbered in the order
	// of each cluster's first row.
	Labels []int

	// Centers holds the K centres, one per row, in label order.
	Centers *mat.Dense

	// Sizes holds the number of rows in each cluster (rows, not weights).
	Sizes []int

	// Inertia is the sum over rows of the (weighted) squared Euclidean
	// distance to the row's centre.
	Inertia float64

	// Iter is the number of Lloyd iterations of the restart kept, and
	// Restart its number.
	Iter, Restart int

	// Converged says whether the restart kept met the convergence rule
	// before MaxIter; if not, Warnings holds an error wrapping ErrMaxIter.
	Converged bool

	// Warnings lists conditions that make the result less trustworthy,
	// such as a restart that stopped at MaxIter.
	Warnings []error
}

// ErrMaxIter is wrapped by the warning of a k-means result whose best
// restart stopped at MaxIter before converging.
var ErrMaxIter = errors.New("k-means stopped at MaxIter before converging")

// kmBlock is the number of rows per block of parallel work; the result
// depends on it, never on the number of workers.
const kmBlock = 2048

// Cluster partitions the rows of x into km.K clusters. It returns an error
// if x holds NaN or ±Inf (a *ValueError), if K is out of range, or if a
// setting is negative.
func (km KMeans) Cluster(x mat.Matrix) (Result, error) {
	return km.ClusterWeighted(x, nil)
}

// ClusterWeighted is Cluster with a weight per row (nil means all 1): the
// seeding draws rows in proportion to weight times squared distance,
// centres are weighted means, and the inertia is weighted. A row of weight
// w counts as w copies of it. It panics if len(w) differs from the number
// of rows, and returns an error for a negative, NaN or infinite weight or
// if all weights are zero.
func (km KMeans) ClusterWeighted(x mat.Matrix, w []float64) (Result, error) {
	data, n, d := rowMajor(x)
	if w != nil && len(w) != n {
		panic("clustering: weights length mismatch")
	}
	if err := km.check(n); err != nil {
		return Result{}, err
	}
	if err := checkFinite(data, d); err != nil {
		return Result{}, err
	}
	var wsum float64
	for i, v := range w {
		if !(v >= 0) || math.IsInf(v, 1) {
			return Result{}, fmt.Errorf("clustering: weight %d is %v: want a finite value >= 0", i, v)
		}
		wsum += v
	}
	if w != nil && wsum == 0 {
		return Result{}, errors.New("clustering: all weights are zero")
	}
	s := newKMState(data, n, d, km.K, w, workerCount(km.Workers))
	restarts, maxIter, tol := km.Restarts, km.MaxIter, km.Tol
	if restarts == 0 {
		restarts = 20
	}
	if maxIter == 0 {
		maxIter = 300
	}
	if tol == 0 {
		tol = 1e-4
	}
	tol *= s.meanVariance()
	trials := km.Candidates
	if trials == 0 {
		trials = 2 + int(math.Log(float64(km.K)))
	}

	best := Result{Inertia: math.Inf(1)}
	var repeats int
	for r := range restarts {
		rng := rand.New(rand.NewPCG(km.Seed, uint64(r)))
		repeats = s.seed(rng, trials)
		iter, converged := s.lloyd(maxIter, tol)
		if s.inertia < best.Inertia {
			best.Labels = append(best.Labels[:0], s.labels...)
			best.Centers = mat.NewDense(km.K, d, append([]float64(nil), s.centres...))
			best.Inertia, best.Iter, best.Restart = s.inertia, iter, r
			best.Converged = converged
		}
	}
	if !best.Converged {
		best.Warnings = append(best.Warnings, fmt.Errorf("%w: the best of %d restarts ran MaxIter = %d iterations", ErrMaxIter, restarts, maxIter))
	}
	if repeats > 0 {
		best.Warnings = append(best.Warnings, fmt.Errorf("k-means: fewer distinct rows than K = %d: %d centres repeat another", km.K, repeats))
	}
	to := firstAppearance(best.Labels, km.K)
	ordered := mat.NewDense(km.K, d, nil)
	best.Sizes = make([]int, km.K)
	for old, nw := range to {
		if nw >= 0 {
			ordered.SetRow(nw, best.Centers.RawRowView(old))
		}
	}
	best.Centers = ordered
	for _, l := range best.Labels {
		best.Sizes[l]++
	}
	return best, nil
}

func (km KMeans) check(n int) error {
	switch {
	case n == 0:
		return errors.New("clustering: no rows to cluster")
	case km.K < 1 || km.K > n:
		return fmt.Errorf("clustering: k-means with K = %d: want 1 <= K <= %d, the number of rows", km.K, n)
	case km.Restarts < 0:
		return fmt.Errorf("clustering: k-means Restarts = %d: want >= 0", km.Restarts)
	case km.MaxIter < 0:
		return fmt.Errorf("clustering: k-means MaxIter = %d: want >= 0", km.MaxIter)
	case km.Candidates < 0:
		return fmt.Errorf("clustering: k-means Candidates = %d: want >= 0", km.Candidates)
	case math.IsNaN(km.Tol):
		return errors.New("clustering: k-means Tol is NaN")
	}
	return nil
}

// kmState is the working memory of k-means over n×d row-major data.
type kmState struct {
	x          []float64
	n, d, k    int
	w          []float64 // nil means all 1
	workers    int
	centres    []float64 // k×d
	labels     []int
	near       []float64 // squared distance of each row to its centre
	upper      []float64 // bound on the distance of each row to its centre
	lower      []float64 // bound on the distance of each row to other centres
	half       []float64 // half the gap from each centre to the nearest other
	move       []float64 // how far each centre moved in the last update
	inertia    float64
	sums       []float64 // k×d weighted sums of the rows of each cluster
	mass       []float64 // k weights per cluster
	count      []int     // k rows per cluster
	blockSums  [][]float64
	blockMass  [][]float64
	blockCount [][]int
	blockIn    []float64
	blockMoved []int
	tmp, cum   []float64 // seeding
}

func newKMState(x []float64, n, d, k int, w []float64, workers int) *kmState {
	nb := (n + kmBlock - 1) / kmBlock
	s := &kmState{
		x: x, n: n, d: d, k: k, w: w, workers: workers,
		centres:    make([]float64, k*d),
		labels:     make([]int, n),
		near:       make([]float64, n),
		upper:      make([]float64, n),
		lower:      make([]float64, n),
		half:       make([]float64, k),
		move:       make([]float64, k),
		sums:       make([]float64, k*d),
		mass:       make([]float64, k),
		count:      make([]int, k),
		blockSums:  make([][]float64, nb),
		blockMass:  make([][]float64, nb),
		blockCount: make([][]int, nb),
		blockIn:    make([]float64, nb),
		blockMoved: make([]int, nb),
		tmp:        make([]float64, n),
		cum:        make([]float64, n),
	}
	for b := range nb {
		s.blockSums[b] = make([]float64, k*d)
		s.blockMass[b] = make([]float64, k)
		s.blockCount[b] = make([]int, k)
	}
	return s
}

func (s *kmState) weight(i int) float64 {
	if s.w == nil {
		return 1
	}
	return s.w[i]
}

// meanVariance returns the mean over features of the weighted population
// variance of the rows.
func (s *kmState) meanVariance() float64 {
	var total float64
	for j := range s.d {
		var sw, mean float64
		for i := range s.n {
			sw += s.weight(i)
			mean += s.weight(i) * s.x[i*s.d+j]
		}
		mean /= sw
		var v float64
		for i := range s.n {
			dv := s.x[i*s.d+j] - mean
			v += s.weight(i) * dv * dv
		}
		total += v / sw
	}
	return total / float64(s.d)
}

// seed chooses initial centres by greedy k-means++ with the given number
// of candidates per centre. It returns how many centres had to repeat a
// row already chosen because all rows lay on chosen centres.
func (s *kmState) seed(rng *rand.Rand, trials int) (repeats int) {
	n, d := s.n, s.d
	chosen := make([]int, 0, s.k)
	first := s.draw(rng, func(i int) float64 { return s.weight(i) })
	chosen = append(chosen, first)
	copy(s.centres[:d], s.x[first*d:(first+1)*d])
	// s.near holds each row's squared distance to the nearest chosen centre.
	s.distTo(s.near, s.near, first, true)
	cand := make([]float64, n)
	for c := 1; c < s.k; c++ {
		pot := s.cumulate(func(i int) float64 { return s.weight(i) * s.near[i] })
		if pot <= 0 {
			// Every row with weight lies on a chosen centre.
			next := 0
			for slices.Contains(chosen, next) || s.weight(next) == 0 {
				next++
				if next == n {
					next = chosen[0]
					break
				}
			}
			chosen = append(chosen, next)
			copy(s.centres[c*d:(c+1)*d], s.x[next*d:(next+1)*d])
			repeats++
			continue
		}
		bestPot, bestRow := math.Inf(1), -1
		for range trials {
			u := rng.Float64() * pot
			row := sort.Search(n, func(i int) bool { return s.cum[i] > u })
			if row == n {
				row = n - 1
			}
			p := s.distTo(cand, s.near, row, false)
			if p < bestPot {
				bestPot, bestRow = p, row
				s.tmp, cand = cand, s.tmp
			}
		}
		chosen = append(chosen, bestRow)
		copy(s.centres[c*d:(c+1)*d], s.x[bestRow*d:(bestRow+1)*d])
		s.near, s.tmp = s.tmp, s.near
	}
	return repeats
}

// draw returns a row drawn with probability proportional to f(row).
func (s *kmState) draw(rng *rand.Rand, f func(int) float64) int {
	total := s.cumulate(f)
	u := rng.Float64() * total
	row := sort.Search(s.n, func(i int) bool { return s.cum[i] > u })
	return min(row, s.n-1)
}

// cumulate fills s.cum with the running sums of f and returns the total.
func (s *kmState) cumulate(f func(int) float64) float64 {
	var t float64
	for i := range s.n {
		t += f(i)
		s.cum[i] = t
	}
	return t
}

// distTo sets dst[i] to the squared distance from row i to row c, or, if
// fresh is false, to the smaller of that and near[i]. It returns the
// weighted sum of dst, added block by block in block order.
func (s *kmState) distTo(dst, near []float64, c int, fresh bool) float64 {
	d := s.d
	xc := s.x[c*d : (c+1)*d]
	chunks(s.n, kmBlock, s.workers, func(b, lo, hi int) {
		out := dst[lo:hi]
		sqDistances(out, xc, s.x[lo*d:hi*d])
		var t float64
		for j, v := range out {
			if !fresh {
				v = min(v, near[lo+j])
				out[j] = v
			}
			t += s.weight(lo+j) * v
		}
		s.blockIn[b] = t
	})
	var t float64
	for _, v := range s.blockIn[:(s.n+kmBlock-1)/kmBlock] {
		t += v
	}
	return t
}

// lloyd runs Lloyd's iterations from s.centres until convergence or
// maxIter, with the bounds of Hamerly (2010, "Making k-means even faster",
// SIAM SDM) to skip rows whose centre cannot have changed: an upper bound
// on the distance to the row's own centre and a lower bound on the
// distance to any other. A row is checked in full whenever the bounds do
// not clear it by a relative margin of 1e-12, so the assignments are those
// of plain Lloyd iterations (nearest centre, the lowest-numbered on a
// tie). It leaves s.labels assigned to the nearest of s.centres and
// s.inertia set accordingly.
func (s *kmState) lloyd(maxIter int, tol float64) (iter int, converged bool) {
	for i := range s.labels {
		s.labels[i] = -1
	}
	s.assign(true)
	for iter < maxIter {
		shift := s.update()
		iter++
		s.moveBounds()
		moved := s.assign(false)
		if moved == 0 || shift <= tol {
			converged = true
			break
		}
	}
	s.inertia = s.sumNear()
	return iter, converged
}

// margin is the relative slack by which Hamerly's bounds must clear a row
// before it is skipped, to absorb rounding in the bounds.
const margin = 1 - 1e-12

// assign moves every row to its nearest centre (the lowest-numbered one on
// a tie), checking in full every row when full is true and otherwise only
// the rows that the bounds do not clear. It gathers the per-cluster sums,
// weights and counts and returns the number of rows whose cluster changed.
func (s *kmState) assign(full bool) (moved int) {
	d, k := s.d, s.k
	if !full {
		s.halfGaps()
	}
	nb := (s.n + kmBlock - 1) / kmBlock
	chunks(s.n, kmBlock, s.workers, func(b, lo, hi int) {
		sums, mass, count := s.blockSums[b], s.blockMass[b], s.blockCount[b]
		clear(sums)
		clear(mass)
		clear(count)
		mv := 0
		for i := lo; i < hi; i++ {
			xi := s.x[i*d : (i+1)*d]
			a := s.labels[i]
			if full || s.upper[i] >= margin*max(s.half[a], s.lower[i]) {
				check := full
				if !full {
					// Tighten the upper bound first; often that clears the row.
					s.upper[i] = math.Sqrt(sqDist(xi, s.centres[a*d:(a+1)*d]))
					check = s.upper[i] >= margin*max(s.half[a], s.lower[i])
				}
				if check {
					c, d1, d2 := nearest2(xi, s.centres)
					if c != a {
						s.labels[i] = c
						mv++
					}
					s.upper[i], s.lower[i] = math.Sqrt(d1), math.Sqrt(d2)
				}
			}
			bc := s.labels[i]
			wi := s.weight(i)
			sc := sums[bc*d : (bc+1)*d]
			for j, v := range xi {
				sc[j] += wi * v
			}
			mass[bc] += wi
			count[bc]++
		}
		s.blockMoved[b] = mv
	})
	clear(s.sums)
	clear(s.mass)
	clear(s.count)
	for b := range nb {
		for j, v := range s.blockSums[b] {
			s.sums[j] += v
		}
		for c := range k {
			s.mass[c] += s.blockMass[b][c]
			s.count[c] += s.blockCount[b][c]
		}
		moved += s.blockMoved[b]
	}
	return moved
}

// halfGaps sets s.half[c] to half the distance from centre c to the
// nearest other centre: a row closer than that to c is closer to c than to
// any other centre.
func (s *kmState) halfGaps() {
	d := s.d
	for c := range s.k {
		s.half[c] = math.Inf(1)
	}
	for c := range s.k {
		cc := s.centres[c*d : (c+1)*d]
		for e := c + 1; e < s.k; e++ {
			g := 0.5 * math.Sqrt(sqDist(cc, s.centres[e*d:(e+1)*d]))
			s.half[c] = min(s.half[c], g)
			s.half[e] = min(s.half[e], g)
		}
	}
}

// moveBounds widens the bounds of every row by the distances the centres
// moved in the last update.
func (s *kmState) moveBounds() {
	far, next, fc := 0.0, 0.0, -1
	for c, m := range s.move {
		if m > far {
			far, next, fc = m, far, c
		} else if m > next {
			next = m
		}
	}
	for i, a := range s.labels {
		s.upper[i] += s.move[a]
		if a == fc {
			s.lower[i] -= next
		} else {
			s.lower[i] -= far
		}
	}
}

// sumNear returns the weighted sum of squared distances from the rows to
// their centres, added block by block in block order, and leaves those
// distances in s.near.
func (s *kmState) sumNear() float64 {
	d := s.d
	nb := (s.n + kmBlock - 1) / kmBlock
	chunks(s.n, kmBlock, s.workers, func(b, lo, hi int) {
		var t float64
		for i := lo; i < hi; i++ {
			a := s.labels[i]
			v := sqDist(s.x[i*d:(i+1)*d], s.centres[a*d:(a+1)*d])
			s.near[i] = v
			t += s.weight(i) * v
		}
		s.blockIn[b] = t
	})
	var t float64
	for _, v := range s.blockIn[:nb] {
		t += v
	}
	return t
}

// update sets each centre to the weighted mean of its rows, refilling an
// empty cluster with the row farthest from its own centre (taken from a
// cluster of more than one row, the lowest-numbered row on a tie). It
// records how far each centre moved and returns the summed squared
// movement.
func (s *kmState) update() (shift float64) {
	d := s.d
	repaired := false
	for c := range s.k {
		if s.count[c] > 0 && s.mass[c] > 0 {
			continue
		}
		if !repaired {
			s.sumNear() // exact distances to the current centres
			repaired = true
		}
		far, fi := -1.0, -1
		for i, v := range s.near {
			if v > far && s.count[s.labels[i]] > 1 && s.weight(i) > 0 {
				far, fi = v, i
			}
		}
		if fi < 0 {
			continue // fewer rows with weight than clusters; leave the centre
		}
		old := s.labels[fi]
		wi := s.weight(fi)
		xi := s.x[fi*d : (fi+1)*d]
		for j, v := range xi {
			s.sums[old*d+j] -= wi * v
			s.sums[c*d+j] = wi * v
		}
		s.mass[old] -= wi
		s.count[old]--
		s.mass[c], s.count[c] = wi, 1
		s.labels[fi] = c
		s.near[fi] = -1 // not to be taken again
		s.upper[fi], s.lower[fi] = math.Inf(1), 0
	}
	for c := range s.k {
		s.move[c] = 0
		if s.mass[c] <= 0 {
			continue
		}
		cc := s.centres[c*d : (c+1)*d]
		var m float64
		for j := range cc {
			v := s.sums[c*d+j] / s.mass[c]
			m += (v - cc[j]) * (v - cc[j])
			cc[j] = v
		}
		s.move[c] = math.Sqrt(m)
		shift += m
	}
	return shift
}
