package events

import "math"

// Span is a run of days given by the indices of its first and last day,
// both included.
type Span struct{ Start, End int }

// Len returns the number of days in s.
func (s Span) Len() int { return s.End - s.Start + 1 }

// Runs appends to dst the maximal runs of days on which x[i] > thr[i]
// (sign > 0) or x[i] < thr[i] (sign < 0), and returns dst. The comparisons
// are strict, and a NaN in x or thr is not a run day. Runs panics if
// len(x) != len(thr).
func Runs(dst []Span, x, thr []float64, sign int) []Span {
	if len(x) != len(thr) {
		panic("events: slice length mismatch")
	}
	in := false
	for i, v := range x {
		var hit bool
		if sign > 0 {
			hit = v > thr[i]
		} else {
			hit = v < thr[i]
		}
		switch {
		case hit && !in:
			dst = append(dst, Span{i, i})
			in = true
		case hit:
			dst[len(dst)-1].End = i
		default:
			in = false
		}
	}
	return dst
}

// dropShort removes the runs shorter than minDur days, in place.
func dropShort(runs []Span, minDur int) []Span {
	k := 0
	for _, r := range runs {
		if r.Len() >= minDur {
			runs[k] = r
			k++
		}
	}
	return runs[:k]
}

// join merges, in place, consecutive runs separated by maxGap days or
// fewer; the days between them become part of the event.
func join(runs []Span, maxGap int) []Span {
	if len(runs) == 0 {
		return runs
	}
	k := 0
	for _, r := range runs[1:] {
		if r.Start-runs[k].End-1 <= maxGap {
			runs[k].End = r.End
		} else {
			k++
			runs[k] = r
		}
	}
	return runs[:k+1]
}

// HeatWave is a heat event found by HeatWaves. Intensities are departures
// from the seasonal mean; missing days inside a joined event are left out
// of the mean and the sum.
type HeatWave struct {
	Span
	Peak          int     // index of the day of largest intensity (the first on ties)
	MaxIntensity  float64 // x − seas on the peak day
	MeanIntensity float64 // mean of x − seas over the event
	CumIntensity  float64 // sum of x − seas over the event (e.g. °C·d)
	// MaxRatio is the largest daily (x − seas)/(thresh − seas) of the
	// event, and Category its floor capped at 4: the category of Hobday et
	// al. (2018), 1 moderate, 2 strong, 3 severe, 4 extreme. The day of the
	// largest ratio need not be the day of largest intensity.
	MaxRatio float64
	Category int
}

// HeatWaves finds the events of the percentile-threshold definition of
// Hobday et al. (2016): runs of days with x strictly above thresh lasting
// at least minDur days, then, in that order, events separated by maxGap
// days or fewer joined (the gap days become part of the event). Filtering
// before joining means that short runs never join into an event. seas is
// the seasonal mean that intensities are measured from.
//
// HeatWaves panics if x, seas and thresh differ in length.
func HeatWaves(x, seas, thresh []float64, minDur, maxGap int) []HeatWave {
	if len(seas) != len(x) {
		panic("events: slice length mismatch")
	}
	spans := join(dropShort(Runs(nil, x, thresh, +1), minDur), maxGap)
	out := make([]HeatWave, len(spans))
	for k, s := range spans {
		hw := HeatWave{Span: s, Peak: -1, MaxIntensity: math.NaN(), MaxRatio: math.NaN()}
		n := 0
		for i := s.Start; i <= s.End; i++ {
			a := x[i] - seas[i]
			if math.IsNaN(a) {
				continue
			}
			if d := thresh[i] - seas[i]; d > 0 && !(a/d <= hw.MaxRatio) {
				hw.MaxRatio = a / d
			}
			if hw.Peak < 0 || a > hw.MaxIntensity {
				hw.Peak, hw.MaxIntensity = i, a
			}
			hw.CumIntensity += a
			n++
		}
		hw.MeanIntensity = hw.CumIntensity / float64(n)
		hw.Category = hobdayCategory(hw.MaxRatio)
		out[k] = hw
	}
	return out
}

// hobdayCategory returns the category of Hobday et al. (2018) for the
// largest ratio r of departure to threshold departure: floor(r) capped at
// 4, at least 1 (an event day exceeds the threshold, so r > 1 but for
// rounding), 0 when r is NaN.
func hobdayCategory(r float64) int {
	if math.IsNaN(r) {
		return 0
	}
	return int(min(max(math.Floor(r), 1), 4))
}

// DroughtCriteria are the pooling and minor-event rules of Droughts.
type DroughtCriteria struct {
	// Pool is the inter-event time criterion t_c: runs separated by this
	// many days or fewer may be pooled.
	Pool int
	// PoolRatio, when > 0, adds the inter-event volume criterion p_c: the
	// flow above the threshold between two runs must be at most PoolRatio
	// times the deficit of the event before them.
	PoolRatio float64
	// MinDuration removes the events shorter than this many days, pooled
	// gaps included.
	MinDuration int
	// MinDeficitFraction removes, after that, the events whose deficit is
	// below this fraction of the largest deficit left.
	MinDeficitFraction float64
}

// Drought is a low-flow event found by Droughts.
type Drought struct {
	Span
	// Deficit is the sum of max(0, thr − q) over the event in flow·days
	// (m³/s·d for flows in m³/s); multiply by 86 400 for a volume in m³.
	// Days of the pooled gaps, where the flow is above the threshold, add
	// nothing (their excess is not subtracted).
	Deficit float64
	Min     int     // index of the day of lowest flow (the first on ties)
	MinFlow float64 // q on that day
}

// Droughts finds streamflow droughts by the threshold level method
// (Yevjevich 1967; Zelenhasić & Salvai 1987; Tallaksen, Madsen & Clausen
// 1997, Hydrological Sciences Journal 42:15–33):
//
//  1. drought days are days with q strictly below thr;
//  2. runs separated by c.Pool days or fewer are pooled into one event,
//     the days between them included (the inter-event time criterion),
//     when c.PoolRatio is 0 or the volume above the threshold between
//     them is at most c.PoolRatio times the deficit of the event so far
//     (the inter-event volume criterion of the IC method);
//  3. minor events are removed: those lasting fewer than c.MinDuration
//     days, pooled gaps included, and then those whose deficit is below
//     c.MinDeficitFraction times the largest deficit of the events left.
//
// Droughts panics if len(q) != len(thr).
func Droughts(q, thr []float64, c DroughtCriteria) []Drought {
	runs := Runs(nil, q, thr, -1)
	if c.PoolRatio > 0 {
		runs = poolIC(runs, q, thr, c.Pool, c.PoolRatio)
	} else {
		runs = join(runs, c.Pool)
	}
	spans := dropShort(runs, c.MinDuration)
	minFrac := c.MinDeficitFraction
	out := make([]Drought, len(spans))
	largest := 0.0
	for k, s := range spans {
		d := Drought{Span: s, Min: -1, MinFlow: math.NaN()}
		for i := s.Start; i <= s.End; i++ {
			if v := q[i]; !math.IsNaN(v) {
				if d.Min < 0 || v < d.MinFlow {
					d.Min, d.MinFlow = i, v
				}
				if v < thr[i] {
					d.Deficit += thr[i] - v
				}
			}
		}
		largest = max(largest, d.Deficit)
		out[k] = d
	}
	if minFrac > 0 {
		k := 0
		for _, d := range out {
			if d.Deficit >= minFrac*largest {
				out[k] = d
				k++
			}
		}
		out = out[:k]
	}
	return out
}

// poolIC pools, in place, the runs separated by pool days or fewer whose
// excess volume between them (the sum of q − thr over the gap's days with a
// flow) is at most ratio times the deficit of the pooled event before.
func poolIC(runs []Span, q, thr []float64, pool int, ratio float64) []Span {
	if len(runs) == 0 {
		return runs
	}
	deficit := func(s Span) float64 {
		d := 0.0
		for i := s.Start; i <= s.End; i++ {
			if v := q[i]; v < thr[i] {
				d += thr[i] - v
			}
		}
		return d
	}
	k, acc := 0, deficit(runs[0])
	for _, r := range runs[1:] {
		if r.Start-runs[k].End-1 <= pool {
			excess := 0.0
			for i := runs[k].End + 1; i < r.Start; i++ {
				if v := q[i]; v > thr[i] {
					excess += v - thr[i]
				}
			}
			if excess <= ratio*acc {
				runs[k].End = r.End
				acc += deficit(r)
				continue
			}
		}
		k++
		runs[k] = r
		acc = deficit(r)
	}
	return runs[:k+1]
}

// Flood is a high-flow event found by Floods.
type Flood struct {
	Span
	Peak     int     // index of the day of highest flow (the first on ties)
	PeakFlow float64 // q on that day
}

// Floods finds high-flow events: runs of days with q strictly above thr,
// where a run is joined to the event before it unless the two are
// independent. Two peaks are independent when they are at least sep days
// apart and the flow between the two events drops below trough times the
// smaller peak. This is the two-part independence rule of peaks-over-
// threshold series, in the form of US Water Resources Council (1982)
// Bulletin 17B, which uses a 75% trough and a separation that grows with
// basin area (from memory); here sep is fixed. Missing days are left out of
// the trough; a gap with no value between two events meets the trough test.
//
// Floods panics if len(q) != len(thr).
func Floods(q, thr []float64, sep int, trough float64) []Flood {
	spans := Runs(nil, q, thr, +1)
	var out []Flood
	for _, s := range spans {
		f := Flood{Span: s, Peak: s.Start, PeakFlow: q[s.Start]}
		for i := s.Start + 1; i <= s.End; i++ {
			if q[i] > f.PeakFlow {
				f.Peak, f.PeakFlow = i, q[i]
			}
		}
		if len(out) > 0 {
			prev := &out[len(out)-1]
			low := math.Inf(1)
			for _, v := range q[prev.End+1 : s.Start] {
				if v < low {
					low = v
				}
			}
			independent := f.Peak-prev.Peak >= sep &&
				(math.IsInf(low, 1) || low < trough*min(prev.PeakFlow, f.PeakFlow))
			if !independent {
				prev.End = s.End
				if f.PeakFlow > prev.PeakFlow {
					prev.Peak, prev.PeakFlow = f.Peak, f.PeakFlow
				}
				continue
			}
		}
		out = append(out, f)
	}
	return out
}
