package sensitivity

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"rebound/index/rankstat"
)

// Aggregation selects how Composite combines a station's indicator values.
type Aggregation uint8

const (
	// Arithmetic is the weighted arithmetic mean of the present values.
	Arithmetic Aggregation = iota
	// Geometric is the weighted geometric mean of the present values after
	// each is raised to the floor: u = f + (1−f)·v.
	Geometric
)

// String returns "arithmetic" or "geometric".
func (a Aggregation) String() string {
	switch a {
	case Arithmetic:
		return "arithmetic"
	case Geometric:
		return "geometric"
	}
	return fmt.Sprintf("Aggregation(%d)", uint8(a))
}

// DefaultFloor is the geometric floor that a zero Floor stands for.
const DefaultFloor = 0.1

// Composite returns the composite score of every station. v holds n
// stations × k indicators in row-major order (station s, indicator j at
// v[s*k+j]), normalised so that higher means more resilient, with NaN for a
// missing value; w holds the k non-negative weights. With
// P = {j : v_sj is not NaN},
//
//	Arithmetic: c_s = Σ_{j∈P} w_j·v_sj / Σ_{j∈P} w_j
//	Geometric:  c_s = exp(Σ_{j∈P} w_j·ln u_sj / Σ_{j∈P} w_j),  u = f + (1−f)·v
//
// so missing values drop out and the remaining weights are renormalised
// (Nardo et al. 2008). c_s is NaN when no present value has a positive
// weight, and in particular when the whole row is missing. floor f must be
// in (0, 1) for Geometric; 0 means DefaultFloor. v is meant to lie in
// [0, 1]; Geometric gives NaN for a value below −f/(1−f).
//
// If dst is nil a new slice is allocated; otherwise len(dst) must be n.
// Composite panics if len(w) is 0, len(v) is not a multiple of len(w), a
// weight is negative or NaN, agg is unknown or floor is out of range.
func Composite(dst, v, w []float64, agg Aggregation, floor float64) []float64 {
	k := len(w)
	if k == 0 {
		panic("sensitivity: no weights")
	}
	if len(v)%k != 0 {
		panic("sensitivity: len(v) is not a multiple of len(w)")
	}
	for _, x := range w {
		if !(x >= 0) {
			panic("sensitivity: negative or NaN weight")
		}
	}
	n := len(v) / k
	if dst == nil {
		dst = make([]float64, n)
	} else if len(dst) != n {
		panic("sensitivity: slice length mismatch")
	}
	switch agg {
	case Arithmetic:
		for s := range n {
			dst[s] = weightedMean(v[s*k:s*k+k], w)
		}
	case Geometric:
		f := floorOrDefault(floor)
		if !(f > 0 && f < 1) {
			panic("sensitivity: geometric floor out of (0, 1)")
		}
		logs := make([]float64, k)
		for s := range n {
			floorLogs(logs, v[s*k:s*k+k], f)
			dst[s] = math.Exp(weightedMean(logs, w))
		}
	default:
		panic("sensitivity: unknown aggregation")
	}
	return dst
}

// weightedMean returns Σ w_j·x_j / Σ w_j over the non-NaN x_j. Composite
// and the analyses compute the same sums in the same order, so that their
// scores are identical to the last bit; the conversions keep the compiler
// from fusing the multiply and add, which would round differently.
func weightedMean(x, w []float64) float64 {
	var num, den float64
	for j, v := range x {
		if !math.IsNaN(v) {
			num += float64(w[j] * v)
			den += w[j]
		}
	}
	return num / den
}

// floorLogs sets dst[j] = ln(f + (1−f)·v[j]), NaN where v[j] is NaN.
func floorLogs(dst, v []float64, f float64) {
	for j, x := range v {
		dst[j] = math.Log(f + (1-f)*x)
	}
}

func floorOrDefault(f float64) float64 {
	if f == 0 {
		return DefaultFloor
	}
	return f
}

// Model is the composite indicator whose ranking the analyses perturb.
type Model struct {
	// Values holds n stations × k indicators in row-major order, normalised
	// so that higher means more resilient, NaN where missing (see
	// Composite).
	Values []float64
	// Weights holds the k base weights: finite, non-negative, with a
	// positive sum. They are scaled to sum to 1, so only their ratios
	// matter.
	Weights []float64
	// Aggregation is Arithmetic (the zero value) or Geometric.
	Aggregation Aggregation
	// Floor is the geometric floor f in (0, 1); 0 means DefaultFloor.
	// Arithmetic ignores it.
	Floor float64
}

// Composites returns every station's composite under the base weights,
// scaled to sum to 1, exactly as the analyses compute it: their base
// ranking is rankstat.Ranks(nil, composites). It fails on the models the
// analyses refuse (no stations, an infinite value, weights that sum to 0,
// a floor out of range).
func (m Model) Composites() ([]float64, error) {
	p, err := m.prepare()
	if err != nil {
		return nil, err
	}
	return p.base, nil
}

// prepared is a validated Model in the form the analyses use.
type prepared struct {
	n, k int
	w    []float64 // base weights scaled to sum to 1
	// table is what weightedMean averages: the values themselves
	// (Arithmetic) or their floored logarithms (Geometric).
	table     []float64
	geometric bool
	noMissing bool // table has no NaN
	// The composites and ranks under the base weights, whether each
	// station's composite is defined, and how many are.
	base       []float64
	baseRanks  []int32
	baseFinite []bool
	finite     int
}

// errNoStations is returned for a model without stations.
var errNoStations = errors.New("sensitivity: no stations")

func (m Model) prepare() (*prepared, error) {
	k := len(m.Weights)
	if k == 0 {
		return nil, errors.New("sensitivity: no weights")
	}
	if len(m.Values)%k != 0 {
		panic("sensitivity: len(Values) is not a multiple of len(Weights)")
	}
	n := len(m.Values) / k
	if n == 0 {
		return nil, errNoStations
	}
	w, err := normalizeWeights(m.Weights)
	if err != nil {
		return nil, err
	}
	p := &prepared{n: n, k: k, w: w, noMissing: true}
	for i, x := range m.Values {
		if math.IsInf(x, 0) {
			return nil, fmt.Errorf("sensitivity: station %d, indicator %d: value %g; want a finite value or NaN for missing", i/k, i%k, x)
		}
	}
	switch m.Aggregation {
	case Arithmetic:
		p.table = m.Values
	case Geometric:
		f := floorOrDefault(m.Floor)
		if !(f > 0 && f < 1) {
			return nil, fmt.Errorf("sensitivity: geometric floor %g; want a floor strictly between 0 and 1", m.Floor)
		}
		p.geometric = true
		p.table = make([]float64, len(m.Values))
		for s := range n {
			floorLogs(p.table[s*k:s*k+k], m.Values[s*k:s*k+k], f)
		}
	default:
		return nil, fmt.Errorf("sensitivity: unknown aggregation %v", m.Aggregation)
	}
	for _, x := range p.table {
		if math.IsNaN(x) {
			p.noMissing = false
			break
		}
	}
	p.base = p.composites(make([]float64, n), w)
	p.baseRanks = rankstat.Ranks(nil, p.base)
	p.baseFinite = make([]bool, n)
	for s, x := range p.base {
		if !math.IsNaN(x) {
			p.baseFinite[s] = true
			p.finite++
		}
	}
	return p, nil
}

// normalizeWeights returns w scaled to sum to 1.
func normalizeWeights(w []float64) ([]float64, error) {
	var sum float64
	for j, x := range w {
		if !(x >= 0) || math.IsInf(x, 1) {
			return nil, fmt.Errorf("sensitivity: weight %d is %g; want a finite weight >= 0", j, x)
		}
		sum += x
	}
	if !(sum > 0) {
		return nil, errors.New("sensitivity: the weights sum to 0; want at least one positive weight")
	}
	out := make([]float64, len(w))
	for j, x := range w {
		out[j] = x / sum
	}
	return out, nil
}

// composites sets dst[s] to the composite of station s under weights w,
// exactly as Composite computes it, and returns dst.
func (p *prepared) composites(dst, w []float64) []float64 {
	k := p.k
	if p.noMissing {
		// weightedMean's sums, in the same order, without the NaN tests,
		// four stations at a time so that their additions overlap.
		var den float64
		for _, x := range w {
			den += x
		}
		s := 0
		for ; s+4 <= len(dst); s += 4 {
			r := p.table[s*k : s*k+4*k]
			r0, r1, r2, r3 := r[:k], r[k:2*k], r[2*k:3*k], r[3*k:]
			var a0, a1, a2, a3 float64
			for j, wj := range w {
				a0 += float64(wj * r0[j])
				a1 += float64(wj * r1[j])
				a2 += float64(wj * r2[j])
				a3 += float64(wj * r3[j])
			}
			dst[s], dst[s+1], dst[s+2], dst[s+3] = a0/den, a1/den, a2/den, a3/den
		}
		for ; s < len(dst); s++ {
			var num float64
			for j, v := range p.table[s*k : s*k+k] {
				num += float64(w[j] * v)
			}
			dst[s] = num / den
		}
	} else {
		for s := range dst {
			dst[s] = weightedMean(p.table[s*k:s*k+k], w)
		}
	}
	if p.geometric {
		for s, x := range dst {
			dst[s] = math.Exp(x)
		}
	}
	return dst
}

func grow[T any](s []T, n int) []T { return slices.Grow(s[:0], n)[:n] }
