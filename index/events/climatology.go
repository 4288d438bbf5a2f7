package events

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"rebound/index/calendar"
	"rebound/index/series"
)

// Climate says how day-of-year climatologies are computed. The zero value
// is the default.
type Climate struct {
	// FirstYear and LastYear bound the reference period in calendar years,
	// both included. 0 means the first (last) year of the record.
	FirstYear, LastYear int
	// MinYears is the fewest reference-period years with data a
	// climatology needs. 0 means 5. (Hobday et al. 2016 recommend 30
	// years; shorter periods give noisier percentiles.)
	MinYears int
	// YearFraction is the fraction of a calendar year's days that must
	// have a value for the year to count towards MinYears. 0 means 0.5,
	// low enough for records kept only from April to October.
	YearFraction float64
	// HalfWidth is w, the half-width in days of the window pooled around
	// each calendar day, so that 2w+1 days are pooled. 0 means 5 (an 11-day
	// window).
	HalfWidth int
	// Smooth is the width in days of the moving average, wrapping around
	// the year, that smooths the mean and the percentiles. It must be odd.
	// 0 means 31; 1 means no smoothing.
	Smooth int
}

func (c Climate) withDefaults() Climate {
	if c.MinYears == 0 {
		c.MinYears = 5
	}
	if c.YearFraction == 0 {
		c.YearFraction = 0.5
	}
	if c.HalfWidth == 0 {
		c.HalfWidth = 5
	}
	if c.Smooth == 0 {
		c.Smooth = 31
	}
	return c
}

func (c Climate) validate(prefix string) error {
	switch {
	case c.FirstYear < 0:
		return fmt.Errorf("%sfirst_year: want a year or 0 (start of record), got %d", prefix, c.FirstYear)
	case c.LastYear < 0:
		return fmt.Errorf("%slast_year: want a year or 0 (end of record), got %d", prefix, c.LastYear)
	case c.FirstYear > 0 && c.LastYear > 0 && c.LastYear < c.FirstYear:
		return fmt.Errorf("%slast_year: want a year >= first_year = %d, got %d", prefix, c.FirstYear, c.LastYear)
	case c.MinYears < 0:
		return fmt.Errorf("%smin_years: want >= 0, got %d", prefix, c.MinYears)
	case !(c.YearFraction >= 0 && c.YearFraction <= 1):
		return fmt.Errorf("%syear_fraction: want a number in [0, 1], got %v", prefix, c.YearFraction)
	case c.HalfWidth < 0 || c.HalfWidth > 60:
		return fmt.Errorf("%shalf_width: want 0..60 days, got %d", prefix, c.HalfWidth)
	case c.Smooth < 0 || c.Smooth > 365 || c.Smooth > 0 && c.Smooth%2 == 0:
		return fmt.Errorf("%ssmooth: want an odd number of days up to 365 (or 0 for 31), got %d", prefix, c.Smooth)
	}
	return nil
}

// ErrShortReference reports a reference period with fewer years of data
// than Climate.MinYears.
var ErrShortReference = errors.New("too few years of data in the reference period")

// Climatology is the day-of-year climatology of one variable at one
// station. Index d−1 holds calendar day d of a 366-day year in which
// 29 February is day 60 (calendar.Date.DayOf366). A day is NaN when no
// value fell within its window.
type Climatology struct {
	Mean [366]float64
	// Pct holds one curve per percentile asked for, in that order.
	Pct [][366]float64
	// First and Last are the reference years used, and Years the number
	// of them that have data.
	First, Last, Years int
}

// Compute returns the climatology of the daily series x, whose first day is
// start: the mean and the p-th percentiles (0..100) of every calendar day.
//
// The method is that of Hobday et al. (2016), "A hierarchical approach to
// defining marine heatwaves", Progress in Oceanography 141:227–238, with the
// calendar conventions of the authors' reference code:
//
//   - For each calendar day d other than 29 February, the pool holds the
//     values within ±w days (by position in the record) of every day of the
//     reference years whose DayOf366 is d. Pooling is by position, so a
//     window reaches past the reference years when the record continues
//     (the pool of 31 December of the last reference year holds the first
//     days of the next year), and 29 February enters the pools of its
//     neighbours in leap years.
//   - The mean is the mean of the pool and the percentile is its type-7
//     percentile (linear interpolation between order statistics, Hyndman &
//     Fan 1996, as numpy.percentile computes it); missing values are left
//     out.
//   - 29 February (day 60) gets no pool of its own: its mean and
//     percentiles are the average of those of days 59 and 61, in every
//     year. Common years simply never use day 60.
//   - Every curve is then smoothed by a centred moving average of Smooth
//     days that wraps from 31 December to 1 January. Where some days of a
//     window are NaN (a record that covers only part of the year), the
//     average is over the others; a NaN day stays NaN.
//
// Compute returns an error wrapping ErrShortReference when the reference
// period has fewer than MinYears years with data. It panics if a
// percentile is outside [0, 100].
func (c Climate) Compute(x []float64, start calendar.Date, p ...float64) (*Climatology, error) {
	doy := daysOf366(make([]int16, len(x)), start)
	var w workspace
	return c.compute(&w, x, start, doy, p)
}

// refPeriod is the reference period of one variable.
type refPeriod struct {
	first, last int // calendar years
	years       int // years with data
	lo, hi      int // day indices [lo, hi) of the period within the record
}

// reference returns the reference period of x (c with defaults set) and an
// error wrapping ErrShortReference when it has fewer than c.MinYears years
// with data.
func (c Climate) reference(x []float64, start calendar.Date) (refPeriod, error) {
	n := len(x)
	if n == 0 {
		return refPeriod{}, fmt.Errorf("%w: the record is empty", ErrShortReference)
	}
	r := refPeriod{first: c.FirstYear, last: c.LastYear}
	if r.first == 0 {
		r.first = start.Year()
	}
	if r.last == 0 {
		r.last = (start + calendar.Date(n-1)).Year()
	}
	for _, y := range series.Coverage(start, x, false) {
		if y.Year >= r.first && y.Year <= r.last && y.Fraction() >= c.YearFraction {
			r.years++
		}
	}
	if r.years < c.MinYears {
		return r, fmt.Errorf("%w: %d years of %d–%d have %s%% of their days or more, want at least min_years = %d",
			ErrShortReference, r.years, r.first, r.last, strconv.FormatFloat(100*c.YearFraction, 'g', 4, 64), c.MinYears)
	}
	r.lo, r.hi = yearBounds(start, n, r.first, r.last)
	return r, nil
}

// workspace holds buffers reused across variables and stations.
type workspace struct {
	doy   []int16
	order []int32 // reference-period day indices grouped by calendar day
	first [367]int32
	pool  []float64
	f     [][]float64
}

// floats returns k buffers of n float64s, reused across calls.
func (w *workspace) floats(k, n int) [][]float64 {
	for len(w.f) < k {
		w.f = append(w.f, nil)
	}
	for i := range k {
		if cap(w.f[i]) < n {
			w.f[i] = make([]float64, n)
		}
		w.f[i] = w.f[i][:n]
	}
	return w.f[:k]
}

func (c Climate) compute(w *workspace, x []float64, start calendar.Date, doy []int16, p []float64) (*Climatology, error) {
	for _, q := range p {
		if !(q >= 0 && q <= 100) {
			panic("events: percentile out of range")
		}
	}
	c = c.withDefaults()
	n := len(x)
	ref, err := c.reference(x, start)
	if err != nil {
		return nil, err
	}
	cl := &Climatology{First: ref.first, Last: ref.last, Years: ref.years}

	// Group the reference days by calendar day (a counting sort).
	lo, hi := ref.lo, ref.hi
	w.first = [367]int32{}
	for _, d := range doy[lo:hi] {
		w.first[d+1]++
	}
	for d := 1; d <= 366; d++ {
		w.first[d] += w.first[d-1]
	}
	if cap(w.order) < hi-lo {
		w.order = make([]int32, hi-lo)
	}
	order := w.order[:hi-lo]
	next := w.first
	for i := lo; i < hi; i++ {
		d := doy[i]
		order[next[d]] = int32(i)
		next[d]++
	}

	cl.Pct = make([][366]float64, len(p))
	const feb29 = 59
	for d := range 366 {
		if d == feb29 {
			continue
		}
		pool := w.pool[:0]
		for _, i := range order[w.first[d]:w.first[d+1]] {
			for j := max(int(i)-c.HalfWidth, 0); j <= min(int(i)+c.HalfWidth, n-1); j++ {
				if v := x[j]; !math.IsNaN(v) {
					pool = append(pool, v)
				}
			}
		}
		w.pool = pool
		if len(pool) == 0 {
			cl.Mean[d] = math.NaN()
			for k := range p {
				cl.Pct[k][d] = math.NaN()
			}
			continue
		}
		sum := 0.0
		for _, v := range pool {
			sum += v
		}
		cl.Mean[d] = sum / float64(len(pool))
		for k, q := range p {
			cl.Pct[k][d] = percentile(pool, q)
		}
	}
	cl.Mean[feb29] = 0.5*cl.Mean[feb29-1] + 0.5*cl.Mean[feb29+1]
	for k := range p {
		cl.Pct[k][feb29] = 0.5*cl.Pct[k][feb29-1] + 0.5*cl.Pct[k][feb29+1]
	}
	if c.Smooth > 1 {
		smooth(&cl.Mean, c.Smooth)
		for k := range p {
			smooth(&cl.Pct[k], c.Smooth)
		}
	}
	return cl, nil
}

// smooth replaces y by its centred moving average of width k (odd),
// wrapping around the year. NaN values are left out of the averages and
// stay NaN.
func smooth(y *[366]float64, k int) {
	const n = 366
	var ext [3 * n]float64
	copy(ext[:n], y[:])
	copy(ext[n:], y[:])
	copy(ext[2*n:], y[:])
	h := k / 2
	for d := range n {
		if math.IsNaN(y[d]) {
			continue
		}
		sum, cnt := 0.0, 0
		for _, v := range ext[n+d-h : n+d+h+1] {
			if !math.IsNaN(v) {
				sum += v
				cnt++
			}
		}
		y[d] = sum / float64(cnt)
	}
}

// daily sets dst[i] to curve[doy[i]] and returns dst; doy holds
// DayOf366 − 1 of every day.
func daily(dst []float64, curve *[366]float64, doy []int16) []float64 {
	for i, d := range doy {
		dst[i] = curve[d]
	}
	return dst
}

// At returns the climatological mean of day t.
func (c *Climatology) At(t calendar.Date) float64 { return c.Mean[t.DayOf366()-1] }
