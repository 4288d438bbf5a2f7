package clustering

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

func TestStandardize(t *testing.T) {
	// Column 0: 2,4,4,4,5,5,7,9 has mean 5 and population sd 2 (by hand);
	// median 4.5 and MAD 0.5.
	// Column 1: 1 six times, 3, 5: median 1 and MAD 0, so the robust scale
	// falls back to the mean absolute deviation 6/8 times √(π/2).
	// Column 2 is constant. Column 3 has a missing value.
	nan := math.NaN()
	x := mat.NewDense(8, 4, []float64{
		2, 1, 3, nan,
		4, 1, 3, 1,
		4, 1, 3, 2,
		4, 1, 3, 3,
		5, 1, 3, 4,
		5, 1, 3, 5,
		7, 3, 3, 6,
		9, 5, 3, 7,
	})
	mean1 := 14.0 / 8
	sd1 := math.Sqrt((6*0.75*0.75 + 1.25*1.25 + 3.25*3.25) / 8)
	mad1 := 0.75 * math.Sqrt(math.Pi/2)
	for _, tc := range []struct {
		how           Scale
		center, scale []float64
	}{
		{ZScore, []float64{5, mean1, 3, 4}, []float64{2, sd1, 0, 2}},
		{Robust, []float64{4.5, 1, 3, 4}, []float64{1.4826 * 0.5, mad1, 0, 1.4826 * 2}},
	} {
		t.Run(tc.how.String(), func(t *testing.T) {
			var z mat.Dense
			center, scale, err := Standardize(&z, x, tc.how)
			if err != nil {
				t.Fatal(err)
			}
			if !floats.EqualApprox(center, tc.center, 1e-12) || !floats.EqualApprox(scale, tc.scale, 1e-12) {
				t.Fatalf("center %v scale %v, want %v %v", center, scale, tc.center, tc.scale)
			}
			for i := range 8 {
				for j := range 4 {
					v, got := x.At(i, j), z.At(i, j)
					want := (v - tc.center[j]) / tc.scale[j]
					if tc.scale[j] == 0 {
						want = 0
					}
					if math.IsNaN(v) {
						if !math.IsNaN(got) {
							t.Errorf("z[%d,%d] = %v, want NaN kept", i, j, got)
						}
						continue
					}
					if math.Abs(got-want) > 1e-12 {
						t.Errorf("z[%d,%d] = %v, want %v", i, j, got, want)
					}
				}
			}
		})
	}
	inf := mat.NewDense(2, 1, []float64{1, math.Inf(-1)})
	if _, _, err := Standardize(&mat.Dense{}, inf, ZScore); err == nil || err.Error() != "clustering: x[1, 0] = -Inf: want a finite value" {
		t.Errorf("Inf: got %v", err)
	}
	// In place.
	y := mat.DenseCopyOf(x.Slice(0, 8, 0, 1))
	if _, _, err := Standardize(y, y, ZScore); err != nil || y.At(0, 0) != -1.5 {
		t.Errorf("in place: %v, %v", y.At(0, 0), err)
	}
}

func FuzzParseScale(f *testing.F) {
	for _, s := range []string{"zscore", "robust", "", "Z", "zscore\x00"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, err := ParseScale(s)
		if err != nil {
			_ = err.Error()
			return
		}
		b, err := v.MarshalText()
		if err != nil || string(b) != s {
			t.Fatalf("%q parsed to %v, which prints as %q (%v)", s, v, b, err)
		}
	})
}

func FuzzParseLinkage(f *testing.F) {
	for _, s := range []string{"ward", "single", "complete", "average", "Ward", "centroid", ""} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		var l Linkage
		if err := l.UnmarshalText([]byte(s)); err != nil {
			_ = err.Error()
			return
		}
		b, err := l.MarshalText()
		if err != nil || string(b) != s {
			t.Fatalf("%q parsed to %v, which prints as %q (%v)", s, l, b, err)
		}
	})
}
