package features

import (
	"math"
	"slices"
	"sync"

	"rebound/index/calendar"
	"rebound/index/robust"
)

// Moments returns the mean, the sample standard deviation (ddof = 1) and
// the adjusted Fisher–Pearson skewness G1 of the values of x that are not
// NaN, and their number n. The standard deviation is NaN for n < 2; the
// skewness is NaN for n < 3 and for constant data.
func Moments(x []float64) (mean, sd, skew float64, n int) {
	s := 0.0
	for _, v := range x {
		if !math.IsNaN(v) {
			s += v
			n++
		}
	}
	if n == 0 {
		return math.NaN(), math.NaN(), math.NaN(), 0
	}
	mean = s / float64(n)
	var m2, m3 float64
	for _, v := range x {
		if !math.IsNaN(v) {
			d := v - mean
			d2 := d * d
			m2 += d2
			m3 += d2 * d
		}
	}
	sd, skew = math.NaN(), math.NaN()
	fn := float64(n)
	if n >= 2 {
		sd = math.Sqrt(m2 / (fn - 1))
	}
	if n >= 3 && m2 > 0 {
		m2 /= fn
		m3 /= fn
		skew = math.Sqrt(fn*(fn-1)) / (fn - 2) * m3 / (m2 * math.Sqrt(m2))
	}
	return mean, sd, skew, n
}

// Lag1 returns the lag-1 autocorrelation of x, estimated as the Pearson
// correlation of the pairs (x[t−1], x[t]) in which both values are present
// (not NaN). It is NaN with fewer than 3 pairs or when either member of the
// pairs is constant.
func Lag1(x []float64) float64 {
	return laggedCorrelation(x, x, 1)
}

// laggedCorrelation returns the Pearson correlation of the pairs
// (x[t], y[t+k]) with both values present. It makes one pass with sums of
// the values shifted by the first pair, which keeps the cancellation of the
// one-pass formula small (the shifted-data algorithm; Chan, Golub & LeVeque
// 1983).
func laggedCorrelation(x, y []float64, k int) float64 {
	var sx, sy, sxx, syy, sxy, cx, cy float64
	n := 0
	end := min(len(x), len(y)-k)
	for t := 0; t < end; t++ {
		a, b := x[t], y[t+k]
		if math.IsNaN(a) || math.IsNaN(b) {
			continue
		}
		if n == 0 {
			cx, cy = a, b
		}
		a -= cx
		b -= cy
		sx += a
		sy += b
		sxx += a * a
		syy += b * b
		sxy += a * b
		n++
	}
	if n < 3 {
		return math.NaN()
	}
	fn := float64(n)
	vx := sxx - sx*sx/fn
	vy := syy - sy*sy/fn
	if !(vx > 0) || !(vy > 0) {
		return math.NaN()
	}
	return (sxy - sx*sy/fn) / math.Sqrt(vx*vy)
}

// LagOfMaxCorrelation returns the lag k in 0..maxLag at which the
// correlation of x[t] with y[t+k] (y lagging x) is largest, and that
// correlation. Ties go to the smaller lag. lag is −1 and r NaN when no lag
// has a defined correlation (see Lag1 for the estimator).
func LagOfMaxCorrelation(x, y []float64, maxLag int) (lag int, r float64) {
	lag, r = -1, math.NaN()
	for k := 0; k <= maxLag; k++ {
		c := laggedCorrelation(x, y, k)
		if !math.IsNaN(c) && (lag < 0 || c > r) {
			lag, r = k, c
		}
	}
	return lag, r
}

// Flashiness returns the Richards–Baker flashiness index (Baker et al.
// 2004) of daily flows q: the sum of |q[t] − q[t−1]| over the pairs of
// consecutive days with both flows present, divided by the sum of q[t] over
// the same pairs. The first day of the record, and the first day after each
// gap, is therefore not in the denominator. NaN when there is no pair or
// the flows sum to zero or less.
func Flashiness(q []float64) float64 {
	var path, total float64
	n := 0
	for t := 1; t < len(q); t++ {
		a, b := q[t-1], q[t]
		if math.IsNaN(a) || math.IsNaN(b) {
			continue
		}
		path += math.Abs(b - a)
		total += b
		n++
	}
	if n == 0 || total <= 0 {
		return math.NaN()
	}
	return path / total
}

// Quantile returns the p-quantile (0 <= p <= 1) of the values of x that are
// not NaN by linear interpolation between order statistics (Hyndman & Fan
// 1996 type 7, numpy's default, with numpy's arithmetic; see
// robust.Quantile): with the n values sorted, h = (n−1)p and
// q = x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋+1] − x[⌊h⌋]). NaN when x has no value. x is
// not changed.
func Quantile(p float64, x []float64) float64 {
	buf := make([]float64, 0, len(x))
	for _, v := range x {
		if !math.IsNaN(v) {
			buf = append(buf, v)
		}
	}
	return robust.SelectQuantile(buf, p)
}

// Omega is the angular frequency of the annual harmonic, 2π/365.25 per day.
const Omega = 2 * math.Pi / 365.25

// Harmonic is an annual harmonic y = Mean + Cos·cos(ωt) + Sin·sin(ωt), with
// ω = Omega and t in days since 1970-01-01.
type Harmonic struct {
	Mean, Cos, Sin float64
}

// Amplitude returns √(Cos² + Sin²), half the peak-to-trough range.
func (h Harmonic) Amplitude() float64 { return math.Hypot(h.Cos, h.Sin) }

// PeakDay returns t_pk = atan2(Sin, Cos)/ω mod 365.25, in [0, 365.25): the
// curve is Mean + A·cos(ω(t − t_pk)), largest at t_pk. With t counted from
// 1970-01-01, t_pk + 1 is the 1-based day of the year of the maximum.
func (h Harmonic) PeakDay() float64 {
	d := math.Mod(math.Atan2(h.Sin, h.Cos)/Omega, 365.25)
	if d < 0 {
		d += 365.25
	}
	return d
}

// At returns the harmonic's value at day t.
func (h Harmonic) At(t float64) float64 {
	s, c := math.Sincos(Omega * t)
	return h.Mean + h.Cos*c + h.Sin*s
}

// FitHarmonic fits an annual harmonic to the points (t[i], y[i]) with y not
// NaN by ordinary least squares. ok is false with fewer than 3 points or
// when the points do not determine the curve (for example all on the same
// day of the cycle). It panics if len(t) != len(y).
func FitHarmonic(t, y []float64) (h Harmonic, ok bool) {
	if len(t) != len(y) {
		panic("features: slice length mismatch")
	}
	var ne normalEq
	for i, v := range y {
		if !math.IsNaN(v) {
			s, c := math.Sincos(Omega * t[i])
			ne.add(c, s, v)
		}
	}
	return ne.solve()
}

// cycle is the length in days of the cycle of ωt: ω·1461 = 8π exactly, so
// cos(ωt) and sin(ωt) for whole days t repeat every 1461 days.
const cycle = 1461

// trig holds cos(ωk) and sin(ωk) for k in [0, 1461).
var trig = sync.OnceValue(func() *[2][cycle]float64 {
	var tb [2][cycle]float64
	for k := range cycle {
		tb[1][k], tb[0][k] = math.Sincos(Omega * float64(k))
	}
	return &tb
})

// phaseOf returns the index of day d in the trig table.
func phaseOf(d calendar.Date) int {
	k := int(d) % cycle
	if k < 0 {
		k += cycle
	}
	return k
}

// fitDaily fits an annual harmonic to daily values y from day start.
func fitDaily(start calendar.Date, y []float64) (Harmonic, bool) {
	tb := trig()
	var ne normalEq
	k := phaseOf(start)
	for _, v := range y {
		if !math.IsNaN(v) {
			ne.add(tb[0][k], tb[1][k], v)
		}
		if k++; k == cycle {
			k = 0
		}
	}
	return ne.solve()
}

// anomalies sets dst[i] to y[i] minus the harmonic h on day start+i (NaN
// stays NaN) and returns dst.
func anomalies(dst []float64, start calendar.Date, y []float64, h Harmonic) []float64 {
	tb := trig()
	k := phaseOf(start)
	for i, v := range y {
		dst[i] = v - (h.Mean + h.Cos*tb[0][k] + h.Sin*tb[1][k])
		if k++; k == cycle {
			k = 0
		}
	}
	return dst
}

// normalEq accumulates the normal equations of y = m + a·c + b·s. The
// values are shifted by the first one to limit cancellation.
type normalEq struct {
	n                       float64
	sc, ss, scc, scs, sss   float64
	sy, syc, sys, shift, sh float64
	started                 bool
}

func (e *normalEq) add(c, s, y float64) {
	if !e.started {
		e.shift, e.started = y, true
	}
	y -= e.shift
	e.n++
	e.sc += c
	e.ss += s
	e.scc += c * c
	e.scs += c * s
	e.sss += s * s
	e.sy += y
	e.syc += y * c
	e.sys += y * s
}

// solve solves the 3×3 system by Gaussian elimination with partial
// pivoting.
func (e *normalEq) solve() (Harmonic, bool) {
	if e.n < 3 {
		return Harmonic{math.NaN(), math.NaN(), math.NaN()}, false
	}
	a := [3][4]float64{
		{e.n, e.sc, e.ss, e.sy},
		{e.sc, e.scc, e.scs, e.syc},
		{e.ss, e.scs, e.sss, e.sys},
	}
	for col := range 3 {
		p := col
		for r := col + 1; r < 3; r++ {
			if math.Abs(a[r][col]) > math.Abs(a[p][col]) {
				p = r
			}
		}
		if math.Abs(a[p][col]) <= 1e-10*e.n {
			return Harmonic{math.NaN(), math.NaN(), math.NaN()}, false
		}
		a[col], a[p] = a[p], a[col]
		for r := col + 1; r < 3; r++ {
			f := a[r][col] / a[col][col]
			for c := col; c < 4; c++ {
				a[r][c] -= f * a[col][c]
			}
		}
	}
	var x [3]float64
	for r := 2; r >= 0; r-- {
		s := a[r][3]
		for c := r + 1; c < 3; c++ {
			s -= a[r][c] * x[c]
		}
		x[r] = s / a[r][r]
	}
	return Harmonic{Mean: x[0] + e.shift, Cos: x[1], Sin: x[2]}, true
}

// LyneHollick is the Lyne & Hollick (1979) recursive digital filter that
// separates baseflow from daily flow, with the passes and start-up of
// Ladson et al. (2013). Each pass computes quickflow
//
//	f[k] = α·f[k−1] + (1+α)/2·(x[k] − x[k−1])
//
// and baseflow x[k] − f[k] where f[k] > 0, else x[k]; negative quickflow is
// carried forward. Passes alternate forward, backward, forward, each
// filtering the baseflow of the one before.
//
// With Reflect > 0 (the default), Reflect values are mirrored at each end
// of the record before filtering (x[Reflect], …, x[1] in front and x[n−2],
// …, x[n−1−Reflect] behind, the end values not repeated), the first pass
// starts with quickflow equal to the first padded flow, each later pass
// starts with quickflow equal to the baseflow left at its starting end, and
// the padding is dropped afterwards. This takes the warm-up of the filter
// into the padding. With Reflect < 0 nothing is mirrored, every pass starts
// with quickflow 0 and baseflow is kept within [0, flow]. In both cases
// baseflow is never below 0.
type LyneHollick struct {
	Alpha   float64 // filter parameter; 0 means 0.925
	Passes  int     // 0 means 3
	Reflect int     // values mirrored at each end; 0 means 30, < 0 none
}

// Baseflow sets dst to the baseflow of the daily flows q, which must not
// hold NaN, and returns dst. The mirrored padding is shortened to len(q)−1
// values for short records. It panics if len(dst) != len(q).
func (lh LyneHollick) Baseflow(dst, q []float64) []float64 {
	if len(dst) != len(q) {
		panic("features: slice length mismatch")
	}
	return lh.filter(dst, q, nil)
}

// filter is Baseflow with a scratch slice for the padded record, grown as
// needed.
func (lh LyneHollick) filter(dst, q, scratch []float64) []float64 {
	alpha, passes, r := lh.Alpha, lh.Passes, lh.Reflect
	if alpha == 0 {
		alpha = 0.925
	}
	if passes == 0 {
		passes = 3
	}
	if r == 0 {
		r = 30
	}
	n := len(q)
	if n == 0 {
		return dst
	}
	r = min(r, n-1)
	g := (1 + alpha) / 2
	if r < 0 {
		copy(dst, q)
		for p := range passes {
			f, prev := 0.0, 0.0
			for j := range n {
				k := j
				if p%2 == 1 {
					k = n - 1 - j
				}
				x := dst[k]
				if j > 0 {
					f = alpha*f + g*(x-prev)
				}
				prev = x
				if f > 0 {
					dst[k] = max(x-f, 0)
				}
			}
		}
		return dst
	}
	m := n + 2*r
	b := slices.Grow(scratch[:0], m)[:m]
	for i := range r {
		b[i] = q[r-i]
		b[r+n+i] = q[n-2-i]
	}
	copy(b[r:], q)
	f0 := b[0]
	for p := range passes {
		f, prev := f0, 0.0
		for j := range m {
			k := j
			if p%2 == 1 {
				k = m - 1 - j
			}
			x := b[k]
			if j > 0 {
				f = alpha*f + g*(x-prev)
			}
			prev = x
			if f > 0 {
				b[k] = max(x-f, 0)
			}
			if j == m-1 {
				f0 = b[k] // the next pass starts at this end
			}
		}
	}
	copy(dst, b[r:r+n])
	return dst
}

// ThermalSensitivity returns the ordinary least-squares slope of weekly
// mean water temperature on weekly mean air temperature (°C per °C). Weeks
// are consecutive 7-day blocks from index 0 of the daily series water and
// air, which share their first day; the last block may be shorter. A block
// counts when at least 5 of its days have both temperatures, and its means
// are taken over those days. NaN with fewer than 3 such weeks or when their
// air means are all equal. It panics if len(water) != len(air).
func ThermalSensitivity(water, air []float64) float64 {
	if len(water) != len(air) {
		panic("features: slice length mismatch")
	}
	// One pass over the weekly points, shifted by the first of them.
	var sx, sy, sxx, sxy, cx, cy float64
	n := 0
	for w := 0; w < len(water); w += 7 {
		var sw, sa float64
		k := 0
		for i := w; i < min(w+7, len(water)); i++ {
			if !math.IsNaN(water[i]) && !math.IsNaN(air[i]) {
				sw += water[i]
				sa += air[i]
				k++
			}
		}
		if k < 5 {
			continue
		}
		x, y := sa/float64(k), sw/float64(k)
		if n == 0 {
			cx, cy = x, y
		}
		x, y = x-cx, y-cy
		sx += x
		sy += y
		sxx += x * x
		sxy += x * y
		n++
	}
	if n < 3 {
		return math.NaN()
	}
	fn := float64(n)
	sxx -= sx * sx / fn
	sxy -= sx * sy / fn
	if !(sxx > 0) {
		return math.NaN()
	}
	return sxy / sxx
}
