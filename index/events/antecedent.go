package events

import "math"

// dryness returns the function giving the antecedent dryness of an event
// starting on day index s: the days s−Days .. s−1 are the window. It
// returns NaN for every event when the drought detection is not
// available (ok false). buf holds three buffers of len(q)+1 floats.
//
// Fraction is the number of window days inside a drought event (pooled
// gaps included) divided by Days. Index is the cumulative deficit
// D = Σ max(0, thr − q) over the window's days with a flow, scaled by
// Days/(days with a flow), and standardized as (D − mean)/sd, where the
// mean and the sample standard deviation are over the windows ending on
// every day of the record that meet the coverage rule. Either is NaN when
// the window starts before the record or fewer than MinCoverage·Days of its
// days have a flow.
func dryness(buf [][]float64, o Antecedent, q, thr []float64, droughts []Drought, ok bool) func(s int) float64 {
	if !ok {
		return func(int) float64 { return math.NaN() }
	}
	n, N := len(q), o.Days
	need := int(math.Ceil(o.MinCoverage * float64(N)))
	// Prefix sums over the record: days with a flow, drought days and
	// deficits; c[i] covers days [0, i).
	present, inDrought, deficit := buf[0], buf[1], buf[2]
	present[0], inDrought[0], deficit[0] = 0, 0, 0
	k := 0 // next drought event
	for i, v := range q {
		p, d, f := 0.0, 0.0, 0.0
		if !math.IsNaN(v) {
			p = 1
			f = max(0, thr[i]-v)
		}
		for k < len(droughts) && droughts[k].End < i {
			k++
		}
		if k < len(droughts) && droughts[k].Start <= i {
			d = 1
		}
		present[i+1] = present[i] + p
		inDrought[i+1] = inDrought[i] + d
		deficit[i+1] = deficit[i] + f
	}
	covered := func(s int) bool { return s >= N && s <= n && present[s]-present[s-N] >= float64(need) }
	if o.Measure == Fraction {
		return func(s int) float64 {
			if !covered(s) {
				return math.NaN()
			}
			return (inDrought[s] - inDrought[s-N]) / float64(N)
		}
	}
	d := func(s int) float64 { // the scaled deficit of the window ending on day s−1
		return (deficit[s] - deficit[s-N]) * float64(N) / (present[s] - present[s-N])
	}
	sum, cnt := 0.0, 0
	for s := N; s <= n; s++ {
		if covered(s) {
			sum += d(s)
			cnt++
		}
	}
	mean, ss := sum/float64(cnt), 0.0
	for s := N; s <= n; s++ {
		if covered(s) {
			ss += (d(s) - mean) * (d(s) - mean)
		}
	}
	sd := math.Sqrt(ss / float64(cnt-1))
	return func(s int) float64 {
		if !covered(s) || !(sd > 0) {
			return math.NaN()
		}
		return (d(s) - mean) / sd
	}
}
