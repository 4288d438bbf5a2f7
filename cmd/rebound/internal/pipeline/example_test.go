package pipeline_test

import (
	"fmt"
	"path/filepath"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/config"
)

// Cluster a feature table without a configuration: rows 1, 11, ..., 141 of
// Fisher's iris data, unscaled, into three clusters. The cophenetic
// correlation of the Ward tree is scipy 1.10.1's, 0.875831.
func ExampleClusterFile() {
	path := filepath.Join("..", "..", "testdata", "iris", "iris_every10th.csv")
	r, errs := pipeline.ClusterFile(path, pipeline.Options{Clustering: func(c *config.Clustering) {
		c.Scale, c.K, c.Bootstrap = "none", 3, 0
	}})
	if len(errs) > 0 {
		fmt.Println(errs)
		return
	}
	c := r.Clusters
	w := c.Used()
	fmt.Printf("%s, k = %d, sizes %v, cophenetic correlation %.4f\n", w.Method, c.K, w.Score.Sizes, w.Cophenetic)
	for k, p := range c.Profiles {
		fmt.Printf("cluster %d: medoid %s, %s\n", k+1, c.Medoids[k], p.Description)
	}
	for _, a := range c.Agreement[:1] {
		fmt.Printf("adjusted Rand index of %s and %s: %.2f\n", a.A, a.B, a.AdjustedRand)
	}
	// Output:
	// ward, k = 3, sizes [5 7 3], cophenetic correlation 0.8758
	// cluster 1: medoid row001, low petal length, low petal width, low sepal length
	// cluster 2: medoid row111, high sepal length, high petal width, high petal length
	// cluster 3: medoid row081, low sepal width, low sepal length
	// adjusted Rand index of kmeans and ward: 1.00
}
