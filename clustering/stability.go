package clustering

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/mat"
)

// A Method clusters the rows of x and returns one label (>= 0) per row.
type Method func(x mat.Matrix) ([]int, error)

// KMeansMethod returns the Method that clusters by km.
func KMeansMethod(km KMeans) Method {
	return func(x mat.Matrix) ([]int, error) {
		r, err := km.Cluster(x)
		return r.Labels, err
	}
}

// TreeMethod returns the Method that builds the tree of linkage l with ts
// and cuts it into k clusters.
func TreeMethod(ts TwoStage, l Linkage, k int) Method {
	return func(x mat.Matrix) ([]int, error) {
		t, err := ts.Tree(x, l)
		if err != nil {
			return nil, err
		}
		return t.Cut(nil, k), nil
	}
}

// Bootstrap holds the settings of a cluster stability assessment by the
// bootstrap (Hennig 2007, "Cluster-wise assessment of cluster stability",
// Comput. Stat. Data Anal. 52:258–271).
type Bootstrap struct {
	// Replicates is the number of bootstrap samples; 0 means 100.
	Replicates int
	// Seed selects the samples: replicate r draws its rows from
	// rand.New(rand.NewPCG(Seed, uint64(r))).
	Seed uint64
}

// Stability is the outcome of a bootstrap assessment, one element per
// cluster label of the partition assessed.
type Stability struct {
	// Jaccard holds the mean over replicates of the best Jaccard
	// similarity between the cluster and a cluster of the replicate; NaN
	// if no replicate drew a row of it. Hennig (2007) reads a mean of 0.75
	// or more as a stable cluster and below 0.6 as one not to trust (as
	// recalled from the documentation of the author's R package fpc).
	Jaccard []float64
	// Dissolved counts replicates whose best similarity was at most 0.5,
	// and Recovered those where it exceeded 0.75.
	Dissolved, Recovered []int
	// Drawn counts replicates that drew at least one row of the cluster,
	// the denominator of Jaccard.
	Drawn []int
}

// Assess measures how stable each cluster of labels is, a partition of the
// rows of x made by method. Each replicate draws n rows with replacement,
// clusters them with method, and compares every original cluster C with
// the replicate's clusters D, both restricted to the distinct rows drawn:
// the best Jaccard similarity |C∩D|/|C∪D| over D is kept. A row drawn
// more than once counts once, in the cluster its first copy was given.
// Replicates run one after another in order, so the result depends only on
// the seed and method. Assess returns the first error of method, with the
// replicate named. It panics if len(labels) differs from the number of
// rows or a label is negative.
func (bs Bootstrap) Assess(x mat.Matrix, labels []int, method Method) (Stability, error) {
	data, n, d := rowMajor(x)
	if len(labels) != n {
		panic("clustering: labels length mismatch")
	}
	if n == 0 {
		return Stability{}, errors.New("clustering: no rows to resample")
	}
	k := len(countLabels(labels))
	reps := bs.Replicates
	if reps == 0 {
		reps = 100
	}
	st := Stability{
		Jaccard:   make([]float64, k),
		Dissolved: make([]int, k),
		Recovered: make([]int, k),
		Drawn:     make([]int, k),
	}
	rows := make([]int, n)
	sample := mat.NewDense(n, max(d, 1), nil)
	first := make([]int, n) // position of a row's first copy in the sample, or −1
	for r := range reps {
		rng := rand.New(rand.NewPCG(bs.Seed, uint64(r)))
		for i := range rows {
			rows[i] = rng.IntN(n)
		}
		for i := range first {
			first[i] = -1
		}
		for p, i := range rows {
			sample.SetRow(p, data[i*d:(i+1)*d])
			if first[i] < 0 {
				first[i] = p
			}
		}
		got, err := method(sample)
		if err != nil {
			return Stability{}, fmt.Errorf("clustering: bootstrap replicate %d: %w", r, err)
		}
		if len(got) != n {
			panic("clustering: method returned the wrong number of labels")
		}
		kr := len(countLabels(got))
		both := make([]int, k*kr)
		sizeC := make([]int, k)
		sizeD := make([]int, kr)
		for i, p := range first {
			if p < 0 {
				continue
			}
			c, dl := labels[i], got[p]
			both[c*kr+dl]++
			sizeC[c]++
			sizeD[dl]++
		}
		for c := range k {
			if sizeC[c] == 0 {
				continue
			}
			best := 0.0
			for dl := range kr {
				if m := both[c*kr+dl]; m > 0 {
					best = max(best, float64(m)/float64(sizeC[c]+sizeD[dl]-m))
				}
			}
			st.Jaccard[c] += best
			st.Drawn[c]++
			if best <= 0.5 {
				st.Dissolved[c]++
			}
			if best > 0.75 {
				st.Recovered[c]++
			}
		}
	}
	for c := range k {
		if st.Drawn[c] == 0 {
			st.Jaccard[c] = math.NaN()
		} else {
			st.Jaccard[c] /= float64(st.Drawn[c])
		}
	}
	return st, nil
}
