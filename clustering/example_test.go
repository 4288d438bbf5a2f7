package clustering_test

import (
	"fmt"

	"gonum.org/v1/gonum/mat"

	"rebound/clustering"
)

// Six invented stations described by two standardised features. The
// inertia and merge heights printed below were also worked by hand.
var stations = mat.NewDense(6, 2, []float64{
	-1.2, 0.9,
	-1.0, 1.1,
	-1.05, 1.0,
	1.0, -0.8,
	1.2, -1.1,
	0.9, -1.0,
})

func ExampleKMeans_Cluster() {
	r, err := clustering.KMeans{K: 2, Seed: 1}.Cluster(stations)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("labels:", r.Labels)
	fmt.Println("sizes:", r.Sizes)
	fmt.Printf("inertia: %.3f\n", r.Inertia)
	// Output:
	// labels: [0 0 0 1 1 1]
	// sizes: [3 3]
	// inertia: 0.135
}

func ExampleAgglomerate() {
	d := clustering.Pairwise(stations)
	dend, err := clustering.Agglomerate(d, clustering.Ward)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, m := range dend.Merges {
		fmt.Printf("%d+%d at %.3f (%d stations)\n", m.A, m.B, m.Height, m.Size)
	}
	fmt.Println("two clusters:", dend.Cut(nil, 2))
	// Output:
	// 1+2 at 0.112 (2 stations)
	// 3+5 at 0.224 (2 stations)
	// 0+6 at 0.266 (3 stations)
	// 4+7 at 0.370 (3 stations)
	// 8+9 at 5.004 (6 stations)
	// two clusters: [0 0 0 1 1 1]
}

func ExampleDescribe() {
	words := []clustering.Words{
		{High: "warm", Low: "cool"},
		{High: "flashy", Low: "steady"},
		{High: "much baseflow", Low: "little baseflow"},
	}
	fmt.Println(clustering.Describe([]float64{0.8, 1.4, -0.6}, words))
	fmt.Println(clustering.Describe([]float64{0.2, -0.1, 0.3}, words))
	// Output:
	// flashy, warm, little baseflow
	// near average
}

func ExampleChooseK() {
	tables, err := clustering.ChooseK(stations, clustering.KSearch{Max: 4, Linkages: []clustering.Linkage{clustering.Average}})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, t := range tables {
		fmt.Printf("%s: k = %d by silhouette, %d by Calinski–Harabasz, %d by Davies–Bouldin\n", t.Method, t.Best, t.BestCH, t.BestDB)
	}
	// Output:
	// kmeans: k = 2 by silhouette, 2 by Calinski–Harabasz, 2 by Davies–Bouldin
	// average: k = 2 by silhouette, 2 by Calinski–Harabasz, 2 by Davies–Bouldin
}
