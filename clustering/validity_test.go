package clustering

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat"
)

// Four points on a line, {0, 1} and {4, 6}, worked by hand from the
// definitions (Rousseeuw 1987; Caliński & Harabasz 1974; Davies & Bouldin
// 1979):
//   - silhouette: a = 1, 1, 2, 2 and b = 5, 4, 3.5, 5.5, so the widths are
//     0.8, 0.75, 3/7 and 7/11, mean 0.6537337662;
//   - W = 0.25+0.25+1+1 = 2.5, B = 4·2.25² = 20.25, CH = 20.25/(2.5/2) = 16.2;
//   - s = 0.5 and 1, centroids 4.5 apart: DB = 1.5/4.5 = 1/3.
func TestIndicesByHand(t *testing.T) {
	x := mat.NewDense(4, 1, []float64{0, 1, 4, 6})
	labels := []int{0, 0, 1, 1}
	widths := make([]float64, 4)
	if got := Silhouette(x, labels, widths); !scalar.EqualWithinAbs(got, 0.6537337662, 1e-10) {
		t.Errorf("silhouette %v, want 0.6537337662", got)
	}
	if want := []float64{0.8, 0.75, 3.0 / 7, 7.0 / 11}; !floats.EqualApprox(widths, want, 1e-12) {
		t.Errorf("widths %v, want %v", widths, want)
	}
	if got := CalinskiHarabasz(x, labels); !scalar.EqualWithinAbs(got, 16.2, 1e-12) {
		t.Errorf("Calinski–Harabasz %v, want 16.2", got)
	}
	if got := DaviesBouldin(x, labels); !scalar.EqualWithinAbs(got, 1.0/3, 1e-12) {
		t.Errorf("Davies–Bouldin %v, want 1/3", got)
	}
	if got := WithinSS(x, labels); !scalar.EqualWithinAbs(got, 2.5, 1e-12) {
		t.Errorf("WithinSS %v, want 2.5", got)
	}

	// A fifth point alone in its cluster has width 0 and changes no other
	// width (its distances exceed every b): mean 2.6149350649/5.
	x5 := mat.NewDense(5, 1, []float64{0, 1, 4, 6, 20})
	l5 := []int{0, 0, 1, 1, 2}
	if got := Silhouette(x5, l5, nil); !scalar.EqualWithinAbs(got, 2.6149350649/5, 1e-10) {
		t.Errorf("with a singleton: %v, want %v", got, 2.6149350649/5)
	}
	// Label numbers without rows are ignored.
	if got := Silhouette(x, []int{3, 3, 7, 7}, nil); !scalar.EqualWithinAbs(got, 0.6537337662, 1e-10) {
		t.Errorf("sparse labels: %v", got)
	}
}

func TestIndicesUndefined(t *testing.T) {
	x := mat.NewDense(3, 1, []float64{0, 1, 2})
	for _, tc := range []struct {
		name   string
		labels []int
	}{{"one cluster", []int{0, 0, 0}}, {"all singletons", []int{0, 1, 2}}} {
		widths := make([]float64, 3)
		if got := Silhouette(x, tc.labels, widths); !math.IsNaN(got) || !math.IsNaN(widths[0]) {
			t.Errorf("%s: silhouette %v, want NaN", tc.name, got)
		}
		if got := CalinskiHarabasz(x, tc.labels); !math.IsNaN(got) {
			t.Errorf("%s: Calinski–Harabasz %v, want NaN", tc.name, got)
		}
	}
	if got := DaviesBouldin(x, []int{0, 0, 0}); !math.IsNaN(got) {
		t.Errorf("one cluster: Davies–Bouldin %v, want NaN", got)
	}
	nan := mat.NewDense(4, 1, []float64{0, 1, math.NaN(), 6})
	if got := Silhouette(nan, []int{0, 0, 1, 1}, nil); !math.IsNaN(got) {
		t.Errorf("NaN input: silhouette %v, want NaN", got)
	}
}

func TestSilhouetteSample(t *testing.T) {
	x, species := readIris(t, "iris.csv")
	y := codes(species)
	exact := Silhouette(x, y, nil)
	if got := SilhouetteSample(x, y, 150, rand.New(rand.NewPCG(1, 1))); got != exact {
		t.Errorf("m = n: %v, want the exact %v", got, exact)
	}
	// The estimate from half the rows lies within 4 standard errors of
	// the exact mean: sd(widths)/√m·√(1−m/n) for sampling without
	// replacement (common practice).
	widths := make([]float64, 150)
	Silhouette(x, y, widths)
	se := stat.StdDev(widths, nil) / math.Sqrt(75) * math.Sqrt(0.5)
	for s := range uint64(5) {
		got := SilhouetteSample(x, y, 75, rand.New(rand.NewPCG(s, 0)))
		if math.Abs(got-exact) > 4*se {
			t.Errorf("seed %d: estimate %v, exact %v, standard error %v", s, got, exact, se)
		}
	}
}
