package clustering

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// mixture returns n rows of d features drawn from a mixture of comps
// Gaussian blobs with unit variance and centres spread over [-5, 5]^d,
// with a fixed seed.
func mixture(n, d, comps int, seed uint64) *mat.Dense {
	rng := rand.New(rand.NewPCG(seed, 0))
	centres := make([]float64, comps*d)
	for i := range centres {
		centres[i] = 10*rng.Float64() - 5
	}
	x := mat.NewDense(n, d, nil)
	for i := range n {
		c := rng.IntN(comps)
		for j := range d {
			x.Set(i, j, centres[c*d+j]+rng.NormFloat64())
		}
	}
	return x
}

func BenchmarkPairwise(b *testing.B) {
	for _, n := range []int{1000, 5000, 10000} {
		x := mixture(n, 10, 8, 1)
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				Pairwise(x)
			}
		})
	}
}

// BenchmarkWard times Pairwise plus Agglomerate, as scipy's pdist plus
// linkage(method="ward") was timed (1k/5k/10k/20k rows of 10 features:
// 0.016/0.78/3.28/21.15 s on the project's 2-core machine). The 20k case
// needs 1.6 GB; run it alone: -bench 'Ward/20000' -benchtime 1x.
func BenchmarkWard(b *testing.B) {
	for _, n := range []int{1000, 5000, 10000, 20000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			x := mixture(n, 10, 8, 1)
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Agglomerate(Pairwise(x), Ward); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkLinkage(b *testing.B) {
	x := mixture(5000, 10, 8, 1)
	for _, l := range []Linkage{Single, Complete, Average, Ward} {
		b.Run(l.String(), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Agglomerate(Pairwise(x), l); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkKMeans: k = 8, 10 restarts, 20,000 × 10, as scikit-learn 1.2.1
// KMeans(n_clusters=8, n_init=10) was timed on the project's 2-core
// machine: 0.127 s with 1 thread, 0.242 s with 2.
func BenchmarkKMeans(b *testing.B) {
	for _, n := range []int{1000, 5000, 20000} {
		x := mixture(n, 10, 8, 1)
		for _, w := range []int{1, 2} {
			b.Run(fmt.Sprintf("%d/workers=%d", n, w), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := (KMeans{K: 8, Restarts: 10, Seed: 1, Workers: w}).Cluster(x); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkSilhouette: scikit-learn 1.2.1 silhouette_score took
// 0.013/0.21/2.1/3.7 s at 1k/5k/10k/20k rows with 1 thread.
func BenchmarkSilhouette(b *testing.B) {
	for _, n := range []int{1000, 5000, 10000, 20000} {
		x := mixture(n, 10, 8, 1)
		r, err := KMeans{K: 8, Restarts: 2, Seed: 1}.Cluster(x)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				Silhouette(x, r.Labels, nil)
			}
		})
	}
}

// BenchmarkTwoStage: Ward linkage of 50,000 rows by way of 1,000 k-means
// groups (the defaults); plain Ward would need 10 GB of distances.
func BenchmarkTwoStage(b *testing.B) {
	x := mixture(50000, 10, 8, 1)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := (TwoStage{}).Tree(x, Ward); err != nil {
			b.Fatal(err)
		}
	}
}
