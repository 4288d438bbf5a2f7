package clustering

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/mat"
)

// Scale is a way to put features on a common scale before clustering. The
// zero value is ZScore.
type Scale int

const (
	// ZScore subtracts the mean and divides by the population standard
	// deviation (divisor n, as scikit-learn's StandardScaler does).
	ZScore Scale = iota
	// Robust subtracts the median and divides by the median absolute
	// deviation (MAD) times 1.4826, which makes it estimate the standard
	// deviation of normal data (Rousseeuw & Croux 1993). When the MAD is 0
	// (more than half the values equal), the scale is the mean absolute
	// deviation from the median times √(π/2) ≈ 1.2533, which also
	// estimates the standard deviation of normal data.
	Robust
)

var scaleNames = [...]string{ZScore: "zscore", Robust: "robust"}

// String returns "zscore" or "robust".
func (s Scale) String() string {
	if s < 0 || int(s) >= len(scaleNames) {
		return fmt.Sprintf("Scale(%d)", int(s))
	}
	return scaleNames[s]
}

// ParseScale returns the Scale named s, one of the names String returns.
func ParseScale(s string) (Scale, error) {
	for v, name := range scaleNames {
		if s == name {
			return Scale(v), nil
		}
	}
	return 0, fmt.Errorf("clustering: scale %q: want zscore or robust", s)
}

// MarshalText returns the name of s.
func (s Scale) MarshalText() ([]byte, error) {
	if s < 0 || int(s) >= len(scaleNames) {
		return nil, fmt.Errorf("clustering: unknown scale %d", int(s))
	}
	return []byte(s.String()), nil
}

// UnmarshalText sets s from its name, as ParseScale does.
func (s *Scale) UnmarshalText(b []byte) error {
	v, err := ParseScale(string(b))
	if err != nil {
		return err
	}
	*s = v
	return nil
}

// Standardize stores in dst the columns of x shifted by center and divided
// by scale, and returns both, one per column, computed as how says. NaN
// marks a missing value: it is left out of the statistics and stays NaN in
// dst. A column with no spread (or no values) gets scale 0 and is set to 0
// (NaN where missing), since it carries no information for clustering;
// check scale for zeros to report such columns. Standardize returns an
// error if x holds ±Inf or how is unknown.
//
// If dst is empty it is resized to the size of x; otherwise it must have
// that size, or Standardize panics. dst may be x itself.
func Standardize(dst *mat.Dense, x mat.Matrix, how Scale) (center, scale []float64, err error) {
	n, d := x.Dims()
	if n == 0 || d == 0 {
		return nil, nil, errors.New("clustering: nothing to standardise: no rows or no columns")
	}
	if how != ZScore && how != Robust {
		return nil, nil, fmt.Errorf("clustering: unknown scale %d", int(how))
	}
	for i := range n {
		for j := range d {
			if v := x.At(i, j); math.IsInf(v, 0) {
				return nil, nil, &ValueError{Row: i, Col: j, Value: v}
			}
		}
	}
	if dst.IsEmpty() {
		dst.ReuseAs(n, d)
	} else if r, c := dst.Dims(); r != n || c != d {
		panic(mat.ErrShape)
	}
	center = make([]float64, d)
	scale = make([]float64, d)
	col := make([]float64, 0, n)
	for j := range d {
		col = col[:0]
		for i := range n {
			if v := x.At(i, j); !math.IsNaN(v) {
				col = append(col, v)
			}
		}
		if how == ZScore {
			center[j], scale[j] = meanSD(col)
		} else {
			center[j], scale[j] = medianMAD(col)
		}
		for i := range n {
			v := x.At(i, j)
			switch {
			case math.IsNaN(v):
				dst.Set(i, j, v)
			case scale[j] == 0:
				dst.Set(i, j, 0)
			default:
				dst.Set(i, j, (v-center[j])/scale[j])
			}
		}
	}
	return center, scale, nil
}

// meanSD returns the mean and population standard deviation of x (NaN and
// 0 for an empty x).
func meanSD(x []float64) (mean, sd float64) {
	if len(x) == 0 {
		return math.NaN(), 0
	}
	for _, v := range x {
		mean += v
	}
	mean /= float64(len(x))
	var ss float64
	for _, v := range x {
		ss += (v - mean) * (v - mean)
	}
	return mean, math.Sqrt(ss / float64(len(x)))
}

// MADScale is the factor that turns a median absolute deviation into an
// estimate of the standard deviation of normal data, 1/Φ⁻¹(3/4).
const MADScale = 1.4826

// medianMAD returns the median of x and its MAD times MADScale, falling
// back to the mean absolute deviation times √(π/2) when the MAD is 0. It
// reorders x.
func medianMAD(x []float64) (med, scale float64) {
	if len(x) == 0 {
		return math.NaN(), 0
	}
	med = median(x)
	dev := make([]float64, len(x))
	var mean float64
	for i, v := range x {
		dev[i] = math.Abs(v - med)
		mean += dev[i]
	}
	if mad := median(dev); mad > 0 {
		return med, MADScale * mad
	}
	return med, math.Sqrt(math.Pi/2) * mean / float64(len(x))
}

// median returns the median of x, the mean of the two middle values when
// len(x) is even. It sorts x.
func median(x []float64) float64 {
	slices.Sort(x)
	m := len(x) / 2
	if len(x)%2 == 1 {
		return x[m]
	}
	return (x[m-1] + x[m]) / 2
}
