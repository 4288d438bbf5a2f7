package clustering

import (
	"cmp"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/gonum/mat"
)

// Words names the two ends of a feature in plain language, for example
// High "flashy" and Low "steady" for a flashiness index. An empty word
// keeps that end of the feature out of descriptions.
type Words struct {
	High, Low string
}

const (
	// DescribeThreshold is the smallest |z| (centroid distance from the
	// overall mean, in standard deviations) at which Describe mentions a
	// feature.
	DescribeThreshold = 0.5
	// DescribeMax is the largest number of words Describe uses.
	DescribeMax = 3
	// NearAverage is Describe's text when no feature qualifies.
	NearAverage = "near average"
)

// Describe returns a short plain-language description of a cluster from
// its standardised centroid z: the words of the features with |z| >=
// DescribeThreshold, strongest first (the lower feature index on a tie), at
// most DescribeMax of them, joined by ", "; the High word for a positive z
// and the Low word for a negative one. Features whose word is empty, and
// NaN elements, are skipped. With no qualifying feature it returns
// NearAverage. Describe panics if len(words) != len(z).
//
// For example, z = (1.2, −0.7, 0.1) with words warm/cool, flashy/steady,
// much/little baseflow gives "warm, steady".
func Describe(z []float64, words []Words) string {
	if len(words) != len(z) {
		panic("clustering: words length mismatch")
	}
	var picked []int
	for j, v := range z {
		if !(math.Abs(v) >= DescribeThreshold) {
			continue
		}
		if w := words[j]; (v > 0 && w.High != "") || (v < 0 && w.Low != "") {
			picked = append(picked, j)
		}
	}
	if len(picked) == 0 {
		return NearAverage
	}
	slices.SortStableFunc(picked, func(a, b int) int { return cmp.Compare(math.Abs(z[b]), math.Abs(z[a])) })
	parts := make([]string, 0, DescribeMax)
	for _, j := range picked[:min(len(picked), DescribeMax)] {
		if z[j] > 0 {
			parts = append(parts, words[j].High)
		} else {
			parts = append(parts, words[j].Low)
		}
	}
	return strings.Join(parts, ", ")
}

// Profile summarises one cluster.
type Profile struct {
	// Size is the number of rows in the cluster.
	Size int
	// Medoid is the row of the cluster with the least summed Euclidean
	// distance, in the standardised features, to the cluster's other rows
	// (the lowest row number on a tie); −1 for an empty cluster.
	Medoid int
	// Mean and Median hold each feature over the cluster's rows in
	// original units, leaving out NaN; the median of an even count is the
	// mean of the two middle values.
	Mean, Median []float64
	// Centroid holds the mean of the standardised features.
	Centroid []float64
	// Description describes the centroid in words (see Describe); it is
	// empty for an empty cluster, or when no words were given.
	Description string
}

// Profiles summarises each cluster 0..max(labels) of a partition, from the
// features in original units (orig) and standardised (std, the features
// the clustering used; a *ValueError reports NaN or ±Inf there). words,
// one per feature or nil, feed Describe. Finding medoids takes
// O(Σ size²·d) time over GOMAXPROCS goroutines. Profiles panics if orig and
// std differ in size, or labels or words in length.
func Profiles(orig, std mat.Matrix, labels []int, words []Words) ([]Profile, error) {
	z, n, d := rowMajor(std)
	if r, c := orig.Dims(); r != n || c != d {
		panic(mat.ErrShape)
	}
	if len(labels) != n || (words != nil && len(words) != d) {
		panic("clustering: labels or words length mismatch")
	}
	if err := checkFinite(z, d); err != nil {
		return nil, err
	}
	raw, _, _ := rowMajor(orig)
	counts := countLabels(labels)
	members := make([][]int, len(counts))
	for i, l := range labels {
		members[l] = append(members[l], i)
	}
	out := make([]Profile, len(counts))
	col := make([]float64, 0, n)
	for c, rows := range members {
		p := Profile{Size: len(rows), Medoid: -1}
		p.Mean, p.Median, p.Centroid = make([]float64, d), make([]float64, d), make([]float64, d)
		for j := range d {
			col = col[:0]
			var zs float64
			for _, i := range rows {
				if v := raw[i*d+j]; !math.IsNaN(v) {
					col = append(col, v)
				}
				zs += z[i*d+j]
			}
			p.Mean[j], p.Median[j] = math.NaN(), math.NaN()
			if len(col) > 0 {
				var s float64
				for _, v := range col {
					s += v
				}
				p.Mean[j] = s / float64(len(col))
				p.Median[j] = median(col)
			}
			p.Centroid[j] = zs / float64(len(rows))
		}
		if len(rows) > 0 {
			p.Medoid = medoid(z, d, rows)
			if words != nil {
				p.Description = Describe(p.Centroid, words)
			}
		}
		out[c] = p
	}
	return out, nil
}

// medoid returns the row among rows with the least summed distance to the
// others, the first on a tie.
func medoid(z []float64, d int, rows []int) int {
	block := make([]float64, 0, len(rows)*d)
	for _, i := range rows {
		block = append(block, z[i*d:(i+1)*d]...)
	}
	total := make([]float64, len(rows))
	chunks(len(rows), 16, workerCount(0), func(_, lo, hi int) {
		for a := lo; a < hi; a++ {
			total[a] = sumDistances(block[a*d:(a+1)*d], block)
		}
	})
	best := 0
	for a, s := range total {
		if s < total[best] {
			best = a
		}
	}
	return rows[best]
}
