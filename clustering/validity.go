package clustering

import (
	"math"
	"math/rand/v2"
	"slices"

	"gonum.org/v1/gonum/mat"
)

// Silhouette returns the mean silhouette width of the labelled rows of x
// (Rousseeuw 1987, "Silhouettes: a graphical aid to the interpretation and
// validation of cluster analysis", J. Comput. Appl. Math. 20:53–65), using
// Euclidean distances. For row i with mean distance a to the other rows of
// its cluster and mean distance b to the rows of the nearest other
// cluster, the width is (b−a)/max(a, b); it is 0 for a row alone in its
// cluster, and 0 when a = b = 0. Higher is better; the range is [−1, 1].
//
// If widths is not nil it must have one element per row and receives the
// width of each row. Silhouette is exact and takes O(n²·d) time, spread
// over GOMAXPROCS goroutines (the result does not depend on their number);
// see SilhouetteSample for large n.
//
// Labels are cluster numbers >= 0; numbers without rows are ignored. The
// result is NaN when there are fewer than 2 or more than n−1 clusters, or
// when x holds NaN. Silhouette panics if len(labels) or len(widths) differ
// from the number of rows, or a label is negative.
func Silhouette(x mat.Matrix, labels []int, widths []float64) float64 {
	n, _ := x.Dims()
	rows := make([]int, n)
	for i := range rows {
		rows[i] = i
	}
	return silhouette(x, labels, rows, widths)
}

// SilhouetteExactMax is the largest number of rows for which ChooseK
// computes the exact silhouette; above it, it estimates the silhouette
// from SilhouetteSampleSize rows with SilhouetteSample.
const (
	SilhouetteExactMax   = 20000
	SilhouetteSampleSize = 5000
)

// SilhouetteSample estimates the mean silhouette width from m rows drawn
// without replacement from rng, each compared with all rows, in O(m·n·d)
// time. When m >= n it equals Silhouette. Its standard error is about
// sd(widths)/√m, times √(1−m/n).
func SilhouetteSample(x mat.Matrix, labels []int, m int, rng *rand.Rand) float64 {
	n, _ := x.Dims()
	if m >= n {
		return Silhouette(x, labels, nil)
	}
	rows := rng.Perm(n)[:max(m, 0)]
	slices.Sort(rows)
	return silhouette(x, labels, rows, nil)
}

// silhouette returns the mean width over the given rows, storing each in
// widths if widths is not nil.
func silhouette(x mat.Matrix, labels []int, rows []int, widths []float64) float64 {
	data, n, d := rowMajor(x)
	if len(labels) != n || (widths != nil && len(widths) != n) {
		panic("clustering: labels length mismatch")
	}
	counts := countLabels(labels)
	k := len(counts)
	if m := nonEmpty(counts); m < 2 || m > n-1 {
		for i := range widths {
			widths[i] = math.NaN()
		}
		return math.NaN()
	}
	// Lay the rows out cluster by cluster so that each sum runs over a
	// contiguous block.
	start := make([]int, k+1)
	for c, v := range counts {
		start[c+1] = start[c] + v
	}
	sorted := make([]float64, n*d)
	pos := slices.Clone(start[:k])
	for i, l := range labels {
		copy(sorted[pos[l]*d:(pos[l]+1)*d], data[i*d:(i+1)*d])
		pos[l]++
	}
	s := make([]float64, len(rows))
	chunks(len(rows), 8, workerCount(0), func(_, lo, hi int) {
		sum := make([]float64, k)
		for r := lo; r < hi; r++ {
			i := rows[r]
			xi := data[i*d : (i+1)*d]
			for c := range k {
				sum[c] = sumDistances(xi, sorted[start[c]*d:start[c+1]*d])
			}
			own := labels[i]
			if counts[own] == 1 {
				s[r] = 0
				continue
			}
			a := sum[own] / float64(counts[own]-1)
			b := math.Inf(1)
			for c := range k {
				if c != own && counts[c] > 0 {
					b = min(b, sum[c]/float64(counts[c]))
				}
			}
			switch {
			case math.IsNaN(a) || math.IsNaN(b):
				s[r] = math.NaN()
			case a == 0 && b == 0:
				s[r] = 0
			default:
				s[r] = (b - a) / max(a, b)
			}
		}
	})
	var mean float64
	for r, v := range s {
		mean += v
		if widths != nil {
			widths[rows[r]] = v
		}
	}
	return mean / float64(len(rows))
}

// centroids returns the k×d cluster means (row-major) and the counts per
// label.
func centroids(data []float64, d int, labels []int) (cent []float64, counts []int) {
	counts = countLabels(labels)
	cent = make([]float64, len(counts)*d)
	for i, l := range labels {
		for j := range d {
			cent[l*d+j] += data[i*d+j]
		}
	}
	for c, m := range counts {
		for j := range d {
			cent[c*d+j] /= float64(m)
		}
	}
	return cent, counts
}

// WithinSS returns the within-cluster sum of squares: the summed squared
// Euclidean distance of each row to the mean of its cluster. It panics if
// len(labels) differs from the number of rows or a label is negative.
func WithinSS(x mat.Matrix, labels []int) float64 {
	data, n, d := rowMajor(x)
	if len(labels) != n {
		panic("clustering: labels length mismatch")
	}
	cent, _ := centroids(data, d, labels)
	return withinSS(data, d, labels, cent)
}

// withinSS returns the summed squared distance of each row to the centroid
// of its cluster, cent.
func withinSS(data []float64, d int, labels []int, cent []float64) float64 {
	var w float64
	for i, l := range labels {
		w += sqDist(data[i*d:(i+1)*d], cent[l*d:(l+1)*d])
	}
	return w
}

// CalinskiHarabasz returns the variance ratio criterion of Caliński &
// Harabasz (1974, Commun. Stat. 3:1–27), [B/(k−1)] / [W/(n−k)], where B and
// W are the between- and within-cluster sums of squares and k the number
// of non-empty clusters. Higher is better. It is NaN when k < 2 or k = n,
// and +Inf when W = 0 < B. Labels are as for Silhouette.
func CalinskiHarabasz(x mat.Matrix, labels []int) float64 {
	data, n, d := rowMajor(x)
	if len(labels) != n {
		panic("clustering: labels length mismatch")
	}
	cent, counts := centroids(data, d, labels)
	k := nonEmpty(counts)
	if k < 2 || k == n {
		return math.NaN()
	}
	mean := make([]float64, d)
	for i := range n {
		for j := range d {
			mean[j] += data[i*d+j]
		}
	}
	for j := range mean {
		mean[j] /= float64(n)
	}
	w := withinSS(data, d, labels, cent)
	var b float64
	for c, m := range counts {
		if m > 0 {
			b += float64(m) * sqDist(cent[c*d:(c+1)*d], mean)
		}
	}
	if w == 0 {
		if b == 0 {
			return math.NaN()
		}
		return math.Inf(1)
	}
	return (b / float64(k-1)) / (w / float64(n-k))
}

// DaviesBouldin returns the index of Davies & Bouldin (1979, IEEE Trans.
// Pattern Anal. Mach. Intell. 1:224–227): the mean over clusters i of the
// largest (s_i+s_j)/d_ij over other clusters j, where s is the mean
// Euclidean distance of a cluster's rows to its centroid and d_ij the
// distance between centroids. Lower is better. Two clusters with the same
// centroid give +Inf (scikit-learn's davies_bouldin_score gives 0 there);
// fewer than 2 non-empty clusters give NaN. Labels are as for Silhouette.
func DaviesBouldin(x mat.Matrix, labels []int) float64 {
	data, n, d := rowMajor(x)
	if len(labels) != n {
		panic("clustering: labels length mismatch")
	}
	cent, counts := centroids(data, d, labels)
	k := len(counts)
	if nonEmpty(counts) < 2 {
		return math.NaN()
	}
	s := make([]float64, k)
	for i, l := range labels {
		s[l] += math.Sqrt(sqDist(data[i*d:(i+1)*d], cent[l*d:(l+1)*d]))
	}
	for c, m := range counts {
		if m > 0 {
			s[c] /= float64(m)
		}
	}
	var db float64
	for i := range k {
		if counts[i] == 0 {
			continue
		}
		worst := 0.0
		for j := range k {
			if j == i || counts[j] == 0 {
				continue
			}
			dij := math.Sqrt(sqDist(cent[i*d:(i+1)*d], cent[j*d:(j+1)*d]))
			r := math.Inf(1)
			if dij > 0 {
				r = (s[i] + s[j]) / dij
			}
			worst = max(worst, r)
		}
		db += worst
	}
	return db / float64(nonEmpty(counts))
}

// AdjustedRand returns the adjusted Rand index of two partitions of the
// same items (Hubert & Arabie 1985, "Comparing partitions", J. Classif.
// 2:193–218): 1 for identical partitions, about 0 for chance agreement,
// and possibly negative. The labels in a and b are arbitrary integers.
// When both partitions put every item in one cluster, or both put every
// item alone, the index is 1. It panics if len(a) != len(b).
func AdjustedRand(a, b []int) float64 {
	if len(a) != len(b) {
		panic("clustering: partitions differ in length")
	}
	type pair struct{ a, b int }
	nij := map[pair]int64{}
	ni := map[int]int64{}
	nj := map[int]int64{}
	for i := range a {
		nij[pair{a[i], b[i]}]++
		ni[a[i]]++
		nj[b[i]]++
	}
	c2 := func(m int64) int64 { return m * (m - 1) / 2 }
	var index, sa, sb int64
	for _, m := range nij {
		index += c2(m)
	}
	for _, m := range ni {
		sa += c2(m)
	}
	for _, m := range nj {
		sb += c2(m)
	}
	total := c2(int64(len(a)))
	if (sa == 0 && sb == 0) || (sa == total && sb == total) {
		return 1
	}
	expected := float64(sa) * float64(sb) / float64(total)
	maxIndex := float64(sa+sb) / 2
	return (float64(index) - expected) / (maxIndex - expected)
}
