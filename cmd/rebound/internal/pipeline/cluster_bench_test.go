package pipeline

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"rebound/clustering/features"
	"rebound/config"
)

// mixtureTable returns n stations of d features drawn from 8 Gaussian
// blobs, with a fixed seed.
func mixtureTable(n, d int) *features.Table {
	rng := rand.New(rand.NewPCG(1, 0))
	centres := make([]float64, 8*d)
	for i := range centres {
		centres[i] = 10*rng.Float64() - 5
	}
	t := &features.Table{}
	for j := range d {
		t.Names = append(t.Names, fmt.Sprintf("f%d", j))
	}
	for i := range n {
		t.Stations = append(t.Stations, fmt.Sprintf("S%05d", i))
		c := rng.IntN(8)
		for j := range d {
			t.Data = append(t.Data, centres[c*d+j]+rng.NormFloat64())
		}
	}
	return t
}

// BenchmarkClusterTable times the clustering step of a run on n stations of
// 10 features with the default settings: scaling, the k table for k = 2..10
// of k-means and four linkages, the partitions, agreement, silhouette
// widths and profiles; with bootstrap = 100 also the stability of Ward's
// clusters.
func BenchmarkClusterTable(b *testing.B) {
	for _, tc := range []struct{ n, bootstrap int }{{100, 0}, {1000, 0}, {5000, 0}, {100, 100}, {1000, 100}} {
		b.Run(fmt.Sprintf("stations=%d/bootstrap=%d", tc.n, tc.bootstrap), func(b *testing.B) {
			t := mixtureTable(tc.n, 10)
			units := make([]string, 10)
			cl := config.DefaultClustering()
			cl.Bootstrap = tc.bootstrap
			b.ReportAllocs()
			for b.Loop() {
				if _, err := clusterTable(t, units, cl, 1, nil); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
