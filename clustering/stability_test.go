package clustering

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// Hennig (2007) reads a mean Jaccard similarity near 1 as a cluster that
// the data support, and clearly lower values as one that the method
// imposes; a mixture of well-separated groups and one uniform blob cut in
// three are the two ends (common practice for checking the bootstrap).
func TestStability(t *testing.T) {
	km := KMeansMethod(KMeans{K: 3, Restarts: 5, Seed: 1})
	bs := Bootstrap{Replicates: 30, Seed: 2}

	sep := blobs(3, 40, 2, 5)
	labels, _ := km(sep)
	st, err := bs.Assess(sep, labels, km)
	if err != nil {
		t.Fatal(err)
	}
	for c, j := range st.Jaccard {
		if j < 0.98 || st.Drawn[c] != 30 || st.Dissolved[c] != 0 {
			t.Errorf("separated cluster %d: Jaccard %.3f, drawn %d, dissolved %d; want >= 0.98, 30, 0", c, j, st.Drawn[c], st.Dissolved[c])
		}
	}

	rng := rand.New(rand.NewPCG(3, 3))
	uni := mat.NewDense(120, 2, nil)
	for i := range 120 {
		// A disc: no direction is favoured, so the cut into three wanders.
		for {
			a, b := 2*rng.Float64()-1, 2*rng.Float64()-1
			if a*a+b*b <= 1 {
				uni.SetRow(i, []float64{a, b})
				break
			}
		}
	}
	labels, _ = km(uni)
	st2, err := bs.Assess(uni, labels, km)
	if err != nil {
		t.Fatal(err)
	}
	var mean float64
	for _, j := range st2.Jaccard {
		mean += j / 3
	}
	t.Logf("uniform disc: Jaccard %.3f, dissolved %v, recovered %v", st2.Jaccard, st2.Dissolved, st2.Recovered)
	if mean > 0.85 {
		t.Errorf("uniform disc: mean Jaccard %.3f, want clearly below the separated groups (<= 0.85)", mean)
	}
}

func TestStabilityTree(t *testing.T) {
	// The same for a hierarchical method.
	sep := blobs(3, 20, 2, 6)
	m := TreeMethod(TwoStage{}, Average, 3)
	labels, err := m(sep)
	if err != nil {
		t.Fatal(err)
	}
	st, err := Bootstrap{Replicates: 10}.Assess(sep, labels, m)
	if err != nil {
		t.Fatal(err)
	}
	for c, j := range st.Jaccard {
		if j < 0.98 {
			t.Errorf("cluster %d: Jaccard %.3f, want >= 0.98", c, j)
		}
	}
}
