package clustering

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
)

func TestChooseKIris(t *testing.T) {
	x, _ := readIris(t, "iris.csv")
	tables, err := ChooseK(x, KSearch{Min: 2, Max: 6, KMeans: KMeans{Seed: 3}, Linkages: []Linkage{Ward, Average}})
	if err != nil {
		t.Fatal(err)
	}
	if len(tables) != 3 || tables[0].Method != "kmeans" || tables[1].Method != "ward" || tables[2].Method != "average" {
		t.Fatalf("got %d tables", len(tables))
	}
	km := tables[0]
	// scikit-learn 1.2.1 (best k-means partitions, see irisKMeans): the
	// silhouette is highest at k = 2 and Calinski–Harabasz at k = 3;
	// Davies–Bouldin is lowest at k = 2.
	if km.Best != 2 || km.BestCH != 3 || km.BestDB != 2 {
		t.Errorf("k chosen %d (CH %d, DB %d), want 2 (3, 2)", km.Best, km.BestCH, km.BestDB)
	}
	for i, sc := range km.Scores {
		want := irisKMeans[i]
		if sc.K != want.k {
			t.Fatalf("row %d has k = %d, want %d", i, sc.K, want.k)
		}
		if !scalar.EqualWithinAbs(sc.WithinSS, want.inertia, 1e-6) {
			continue // a different local optimum; TestKMeansIris covers this
		}
		if !scalar.EqualWithinAbs(sc.Silhouette, want.sil, 1e-6) ||
			!scalar.EqualWithinAbs(sc.CalinskiHarabasz, want.ch, 1e-6) ||
			!scalar.EqualWithinAbs(sc.DaviesBouldin, want.db, 1e-6) {
			t.Errorf("k = %d: got %+v", sc.K, sc)
		}
	}
	for _, tb := range tables[1:] {
		if len(tb.Scores) != 5 || tb.Best < 2 || tb.Best > 6 {
			t.Errorf("%s: %d rows, best %d", tb.Method, len(tb.Scores), tb.Best)
		}
	}
}

func TestChooseKErrors(t *testing.T) {
	x := mat.NewDense(4, 1, []float64{1, 2, 3, 4})
	for _, tc := range []struct {
		name string
		s    KSearch
		x    mat.Matrix
		want string
	}{
		{"few rows", KSearch{}, mat.NewDense(2, 1, []float64{1, 2}), "clustering: choosing k for 2 rows: want at least 3"},
		{"min 1", KSearch{Min: 1}, x, "clustering: choosing k from 1 to 3 (for 4 rows): want 2 <= Min <= Max <= 3"},
		{"min > max", KSearch{Min: 4, Max: 5}, x, "clustering: choosing k from 4 to 3 (for 4 rows): want 2 <= Min <= Max <= 3"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := ChooseK(tc.x, tc.s)
			if err == nil || err.Error() != tc.want {
				t.Errorf("got %v, want %q", err, tc.want)
			}
		})
	}
	tables, err := ChooseK(x, KSearch{Max: 50})
	if err != nil || len(tables[0].Scores) != 2 {
		t.Errorf("Max above n−1 is not lowered: %v, %v", tables, err)
	}
}
