package events

import (
	"fmt"
	"math"
	"slices"

	"rebound/index/calendar"
)

// GEV is a generalised extreme value distribution in Hosking's
// parametrisation: location Xi, scale Alpha > 0 and shape K, with
// F(x) = exp(−(1 − K(x − Xi)/Alpha)^(1/K)) for K ≠ 0 and the Gumbel
// distribution for K = 0. K > 0 bounds the distribution above; K is the
// shape c of scipy.stats.genextreme.
type GEV struct{ Xi, Alpha, K float64 }

// LMoments returns the first two sample L-moments and the L-skewness t3 of
// x, from the unbiased probability-weighted moments b0, b1, b2 (Hosking
// 1990). It reorders nothing: x is copied and sorted.
func LMoments(x []float64) (l1, l2, t3 float64) {
	s := slices.Clone(x)
	slices.Sort(s)
	n := float64(len(s))
	var b0, b1, b2 float64
	for i, v := range s {
		j := float64(i) // 0-based rank
		b0 += v
		b1 += v * j / (n - 1)
		b2 += v * j * (j - 1) / ((n - 1) * (n - 2))
	}
	b0, b1, b2 = b0/n, b1/n, b2/n
	l1, l2 = b0, 2*b1-b0
	l3 := 6*b2 - 6*b1 + b0
	return l1, l2, l3 / l2
}

// FitGEV fits a GEV to the sample x by L-moments with the approximation of
// Hosking, Wallis & Wood (1985): c = 2/(3 + t3) − ln 2/ln 3,
// K = 7.8590c + 2.9554c², accurate to better than 9×10⁻⁴ in K for
// −0.5 ≤ K ≤ 0.5; then Alpha = l2·K/((1 − 2^−K)Γ(1 + K)) and
// Xi = l1 − Alpha(1 − Γ(1 + K))/K. It needs at least three values and
// l2 > 0, and refuses |t3| ≥ 0.9, outside the range where the fit is
// usable.
func FitGEV(x []float64) (GEV, error) {
	if len(x) < 3 {
		return GEV{}, fmt.Errorf("%d annual maxima, fewer than 3", len(x))
	}
	l1, l2, t3 := LMoments(x)
	if !(l2 > 0) {
		return GEV{}, fmt.Errorf("the annual maxima do not vary (L-scale %g)", l2)
	}
	if !(math.Abs(t3) < 0.9) {
		return GEV{}, fmt.Errorf("L-skewness %.3f of the annual maxima is outside (-0.9, 0.9)", t3)
	}
	c := 2/(3+t3) - math.Ln2/math.Log(3)
	k := 7.8590*c + 2.9554*c*c
	if math.Abs(k) < 1e-9 {
		// The Gumbel limit: Alpha = l2/ln 2, Xi = l1 − γ·Alpha.
		a := l2 / math.Ln2
		return GEV{Xi: l1 - 0.5772156649015329*a, Alpha: a}, nil
	}
	g := math.Gamma(1 + k)
	a := l2 * k / ((1 - math.Pow(2, -k)) * g)
	return GEV{Xi: l1 - a*(1-g)/k, Alpha: a, K: k}, nil
}

// CDF returns F(x): 0 below the lower bound (K < 0) and 1 above the upper
// bound (K > 0).
func (g GEV) CDF(x float64) float64 {
	y := (x - g.Xi) / g.Alpha
	if g.K == 0 {
		return math.Exp(-math.Exp(-y))
	}
	t := 1 - g.K*y
	if t <= 0 {
		if g.K > 0 {
			return 1
		}
		return 0
	}
	return math.Exp(-math.Pow(t, 1/g.K))
}

// Quantile returns x(F) for 0 < F < 1.
func (g GEV) Quantile(f float64) float64 {
	if g.K == 0 {
		return g.Xi - g.Alpha*math.Log(-math.Log(f))
	}
	return g.Xi + g.Alpha*(1-math.Pow(-math.Log(f), g.K))/g.K
}

// ReturnPeriod returns 1/(1 − F(x)) in years, +Inf at and above an upper
// bound.
func (g GEV) ReturnPeriod(x float64) float64 {
	f := g.CDF(x)
	if f >= 1 {
		return math.Inf(1)
	}
	return 1 / (1 - f)
}

// Gringorten returns the empirical return period (n + 0.12)/(m − 0.44) of
// a value exceeded or equalled by m of n annual maxima (Gringorten 1963);
// NaN when m is 0.
func Gringorten(m, n int) float64 {
	if m == 0 {
		return math.NaN()
	}
	return (float64(n) + 0.12) / (float64(m) - 0.44)
}

// AnnualMaxima returns the largest value of each calendar year (or each
// October–September water year, labelled by the year it ends) of the
// daily series q starting on start, for the years in which at least
// coverage of the days have a value, and the number of years skipped.
func AnnualMaxima(q []float64, start calendar.Date, waterYear bool, coverage float64) (maxima []float64, skipped int) {
	year := func(d calendar.Date) int {
		if waterYear {
			return d.WaterYear()
		}
		return d.Year()
	}
	days := func(y int) int {
		if waterYear {
			return int(calendar.New(y, 10, 1) - calendar.New(y-1, 10, 1))
		}
		return int(calendar.New(y+1, 1, 1) - calendar.New(y, 1, 1))
	}
	cur, have, best := 0, 0, math.Inf(-1)
	flush := func() {
		if cur == 0 {
			return
		}
		if float64(have) >= coverage*float64(days(cur)) && have > 0 {
			maxima = append(maxima, best)
		} else {
			skipped++
		}
	}
	for i, v := range q {
		y := year(start + calendar.Date(i))
		if y != cur {
			flush()
			cur, have, best = y, 0, math.Inf(-1)
		}
		if !math.IsNaN(v) {
			have++
			best = max(best, v)
		}
	}
	flush()
	return maxima, skipped
}

// rateFloods sets the return periods and class of the floods evs from the
// annual maxima of q (the record starting on start). It returns why the
// floods could not be rated, leaving them unrated.
func rateFloods(evs []Event, q []float64, start calendar.Date, o Severity) error {
	for k := range evs {
		evs[k].ReturnPeriod, evs[k].EmpiricalReturnPeriod, evs[k].Severity = math.NaN(), math.NaN(), Unrated
	}
	am, skipped := AnnualMaxima(q, start, o.WaterYear, o.YearCoverage)
	if len(am) < o.FitMinYears {
		return fmt.Errorf("%d years with at least %.0f%% of days (%d skipped), fewer than the %d a return period needs (events.flood.fit_min_years)",
			len(am), 100*o.YearCoverage, skipped, o.FitMinYears)
	}
	g, err := FitGEV(am)
	if err != nil {
		return fmt.Errorf("GEV fit: %w", err)
	}
	for k := range evs {
		e := &evs[k]
		e.ReturnPeriod = g.ReturnPeriod(e.DriverPeak)
		m := 0
		for _, v := range am {
			if v >= e.DriverPeak {
				m++
			}
		}
		e.EmpiricalReturnPeriod = Gringorten(m, len(am))
		e.Severity = classOf(e.ReturnPeriod, o.ReturnPeriods)
	}
	return nil
}
