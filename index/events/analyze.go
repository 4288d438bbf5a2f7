package events

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"

	"rebound/index/calendar"
	"rebound/index/robust"
	"rebound/index/series"
)

// Event is one disturbance at one station and the water-quality responses
// to it.
type Event struct {
	// ID is "<prefix>-<start date>", with prefix HW, DR or FL for the
	// detected kinds and the kind itself for user events, e.g.
	// "HW-2019-07-03"; a second event of the same kind starting the same
	// day gets "-2", and so on.
	ID         string
	Kind       string
	Start, End calendar.Date // both included
	Duration   int           // days, End − Start + 1

	// DriverPeak is the extreme of the driver during the event: for heat
	// waves the largest departure of air temperature from its seasonal
	// mean (°C), for droughts the lowest flow and for floods the highest
	// flow (m³/s). NaN for user events, and then DriverPeakDate is
	// meaningless.
	DriverPeak     float64
	DriverPeakDate calendar.Date
	// MeanIntensity and CumIntensity are the mean (°C) and sum (°C·d) of
	// the air-temperature departures of a heat wave; NaN for other kinds.
	MeanIntensity, CumIntensity float64
	// Deficit is the flow deficit of a drought below its threshold in
	// m³/s·d, and DeficitVolume the same in m³ (× 86 400 s); NaN for other
	// kinds.
	Deficit, DeficitVolume float64

	// Severity is the event's class, Moderate to Extreme (Unrated for user
	// events and floods whose return period could not be fitted); see
	// Severity for how each kind is rated.
	Severity int
	// DriverIntensity is the strength of the disturbance on one scale per
	// kind, for comparing responses per unit of driver: the mean intensity
	// of a heat wave (°C above the seasonal mean), the relative flow deficit
	// 1 − q_min/threshold of a drought (0–1), and the peak-to-threshold
	// ratio of a flood. NaN for user events.
	DriverIntensity float64
	// HeatRatio is the heat wave's largest ratio of departure to threshold
	// departure (its Hobday category is its floor, capped at 4); NaN for
	// other kinds.
	HeatRatio float64
	// ReturnPeriod is the flood peak's return period in years from the GEV
	// fitted to the annual maxima, and EmpiricalReturnPeriod its
	// Gringorten plotting position among them, (n + 0.12)/(m − 0.44) with m
	// the number of annual maxima at or above the peak; NaN for other kinds
	// and when the fit failed.
	ReturnPeriod, EmpiricalReturnPeriod float64
	// DeficitProbability and DurationProbability are a drought's empirical
	// non-exceedance probabilities among the station's reported droughts,
	// count(<= x)/(n + 1) (Weibull); NaN for other kinds.
	DeficitProbability, DurationProbability float64
	// Overlaps lists the IDs of the other events whose peak windows share
	// days with this one's.
	Overlaps []string

	// AntecedentDryness measures the dryness of the days before Start (see
	// Antecedent); NaN when it cannot be computed.
	AntecedentDryness float64

	// Responses holds one entry per response variable the station records,
	// in the order of Options.Responses.
	Responses []Response
}

// Censor says why a recovery was not observed.
type Censor string

const (
	NotCensored Censor = ""
	RecordEnd   Censor = "record_end" // the record ended first
	DataGap     Censor = "gap"        // a gap longer than Recovery.MaxGap came first
	NextEvent   Censor = "next_event" // the next disturbance started first
)

// Response is the response of one water-quality variable to one event.
// Departures are observed values minus the climatological mean of the
// calendar day, in the variable's units.
type Response struct {
	Variable string
	// PeakDeparture is the departure on the day it is most harmful (largest
	// for Harmful = +1, most negative for −1) within the peak window: from
	// Start to End + Recovery.Lag days, ending earlier at the end of the
	// record or the day before the next disturbance. It keeps its sign. NaN
	// when the window has no value.
	PeakDeparture float64
	PeakDate      calendar.Date // Start when PeakDeparture is NaN
	TimeToPeak    int           // PeakDate − Start in days; -1 when PeakDeparture is NaN
	// MeanDeparture and CumDeparture are the mean and the sum (units·d)
	// of the departures from Start to End, over the Observed days with a
	// value.
	MeanDeparture, CumDeparture float64
	Observed                    int
	// Tolerance is the half-width of the recovery band used.
	Tolerance float64
	// Recovered reports whether the departure came back within ±Tolerance
	// for Recovery.Run consecutive days. RecoveryDays is then r − End,
	// where r is the first day after End that starts such a run (so the
	// least value is 1). When recovery is censored, RecoveryDays is the
	// number of days after End that were observed before the censoring
	// event: up to the end of the record, the last day before the gap, or
	// the day before the next disturbance starts.
	Recovered    bool
	RecoveryDays int
	Censor       Censor
	// CensoredBy is the ID of the event that cut the recovery short when
	// Censor is NextEvent, "" otherwise.
	CensoredBy string
	// Shared is the number of peak-window days credited to another event
	// under the overlap rule (see Variable.Driver) and left out of the
	// peak search.
	Shared int
}

// Result holds the events of one station.
type Result struct {
	Station string
	Events  []Event // by start, then end, then kind, then ID
	// Warnings says what could not be computed and why.
	Warnings []error
}

// Analyze finds the disturbances of station s, adds the user events that
// name s or no station, and measures the response of every water-quality
// variable of o.Responses that s records. It returns an error only when o
// is invalid; anything the data cause (a short record, a missing driver,
// a user event outside the record, which is left out, or partly outside,
// which is cut to the record) is a warning in the result. Every variable
// of s must hold s.Days values.
func Analyze(s *series.Station, users []UserEvent, o Options) (Result, error) {
	var a Analyzer
	return a.Analyze(s, users, o)
}

// An Analyzer is Analyze with buffers kept from one station to the next.
// The zero value is ready to use; an Analyzer must not be used by two
// goroutines at once.
type Analyzer struct {
	w workspace
}

// Analyze is the function Analyze, reusing a's buffers.
func (a *Analyzer) Analyze(s *series.Station, users []UserEvent, o Options) (Result, error) {
	if err := o.Validate(); err != nil {
		return Result{}, err
	}
	o = o.withDefaults()
	res := Result{Station: s.ID}
	warn := func(format string, args ...any) {
		res.Warnings = append(res.Warnings, fmt.Errorf("station %s: "+format, append([]any{s.ID}, args...)...))
	}
	n := s.Days
	w := &a.w
	if cap(w.doy) < n {
		w.doy = make([]int16, n)
	}
	doy := daysOf366(w.doy[:n], s.Start)
	buf := w.floats(7, n+1)
	seas, thr, dthr, anom := buf[0][:n], buf[1][:n], buf[2][:n], buf[3][:n]

	// Heat waves.
	if !o.Heat.Off {
		if x := s.Var(o.Heat.Variable); x == nil {
			warn("no %s: heat waves not detected", o.Heat.Variable)
		} else if cl, err := o.Climate.compute(w, x, s.Start, doy, []float64{o.Heat.Percentile}); err != nil {
			warn("%s: %w: heat waves not detected", o.Heat.Variable, err)
		} else {
			daily(seas, &cl.Mean, doy)
			daily(thr, &cl.Pct[0], doy)
			for _, hw := range HeatWaves(x, seas, thr, o.Heat.MinDuration, o.Heat.MaxGap) {
				if !inSeason(o.Heat.Months, s.Date(hw.Peak)) {
					continue
				}
				res.Events = append(res.Events, Event{
					Kind: HeatWaveKind, Start: s.Date(hw.Start), End: s.Date(hw.End), Duration: hw.Len(),
					DriverPeak: hw.MaxIntensity, DriverPeakDate: s.Date(hw.Peak),
					MeanIntensity: hw.MeanIntensity, CumIntensity: hw.CumIntensity,
					Deficit: math.NaN(), DeficitVolume: math.NaN(),
					Severity: hw.Category, DriverIntensity: hw.MeanIntensity, HeatRatio: hw.MaxRatio,
				}.blank(HeatWaveKind))
			}
		}
	}

	// Droughts, which antecedent dryness needs even when they are not
	// reported, and needs out of season too.
	q := s.Var(o.Drought.Variable)
	var droughts []Drought
	haveDrought := false
	if q == nil {
		warn("no %s: droughts not detected, antecedent dryness left blank", o.Drought.Variable)
	} else if err := o.droughtThreshold(w, dthr, q, s.Start, doy); err != nil {
		warn("%s: %w: droughts not detected, antecedent dryness left blank", o.Drought.Variable, err)
	} else {
		haveDrought = true
		droughts = Droughts(q, dthr, DroughtCriteria{Pool: o.Drought.Pool, PoolRatio: o.Drought.PoolRatio,
			MinDuration: o.Drought.MinDuration, MinDeficitFraction: o.Drought.MinDeficitFraction})
		if !o.Drought.Off {
			from := len(res.Events)
			for _, d := range droughts {
				if !inSeason(o.Drought.Months, s.Date(d.Min)) {
					continue
				}
				res.Events = append(res.Events, Event{
					Kind: DroughtKind, Start: s.Date(d.Start), End: s.Date(d.End), Duration: d.Len(),
					DriverPeak: d.MinFlow, DriverPeakDate: s.Date(d.Min),
					MeanIntensity: math.NaN(), CumIntensity: math.NaN(),
					Deficit: d.Deficit, DeficitVolume: d.Deficit * 86400,
					DriverIntensity: relativeDeficit(d.MinFlow, dthr[max(d.Min, 0)]),
				}.blank(DroughtKind))
			}
			rateDroughts(res.Events[from:], o.Severity.Probabilities)
		}
	}

	// Floods.
	if !o.Flood.Off {
		if qf := s.Var(o.Flood.Variable); qf == nil {
			warn("no %s: floods not detected", o.Flood.Variable)
		} else if ref, err := o.Climate.reference(qf, s.Start); err != nil {
			warn("%s: %w: floods not detected", o.Flood.Variable, err)
		} else {
			t := fixedPercentile(w, qf[ref.lo:ref.hi], o.Flood.Percentile)
			for i := range thr {
				thr[i] = t
			}
			from := len(res.Events)
			for _, f := range Floods(qf, thr, o.Flood.Separation, o.Flood.Trough) {
				if !inSeason(o.Flood.Months, s.Date(f.Peak)) {
					continue
				}
				res.Events = append(res.Events, Event{
					Kind: FloodKind, Start: s.Date(f.Start), End: s.Date(f.End), Duration: f.Len(),
					DriverPeak: f.PeakFlow, DriverPeakDate: s.Date(f.Peak),
					MeanIntensity: math.NaN(), CumIntensity: math.NaN(),
					Deficit: math.NaN(), DeficitVolume: math.NaN(),
					DriverIntensity: f.PeakFlow / t,
				}.blank(FloodKind))
			}
			if floods := res.Events[from:]; len(floods) > 0 {
				if err := rateFloods(floods, qf, s.Start, o.Severity); err != nil {
					warn("%s: %v: floods left unrated", o.Flood.Variable, err)
				}
			}
		}
	}

	// User events.
	first, last := s.Start, s.End()
	for _, u := range users {
		if u.Station != "" && u.Station != s.ID {
			continue
		}
		if u.End < first || u.Start > last {
			warn("%s event %v..%v lies outside the record %v..%v: left out", u.Kind, u.Start, u.End, first, last)
			continue
		}
		start, end := max(u.Start, first), min(u.End, last)
		if start != u.Start || end != u.End {
			warn("%s event %v..%v cut to the record: %v..%v", u.Kind, u.Start, u.End, start, end)
		}
		res.Events = append(res.Events, Event{
			Kind: u.Kind, Start: start, End: end, Duration: int(end-start) + 1,
		}.blank(u.Kind))
	}

	slices.SortStableFunc(res.Events, func(a, b Event) int {
		return cmp.Or(cmp.Compare(a.Start, b.Start), cmp.Compare(a.End, b.End), cmp.Compare(a.Kind, b.Kind))
	})
	assignIDs(res.Events)

	// Antecedent dryness.
	dry := dryness(buf[4:7], o.Antecedent, q, dthr, droughts, haveDrought)
	for k := range res.Events {
		res.Events[k].AntecedentDryness = dry(s.Index(res.Events[k].Start))
	}

	// Responses, stored in one block shared by the events.
	nv := 0
	for _, v := range o.Responses {
		if s.Var(v.Name) != nil {
			nv++
		}
	}
	block := make([]Response, 0, nv*len(res.Events))
	// stop[k] is the day the disturbance that censors event k starts (see
	// Recovery.CensorBy), or the end of the record; by[k] is its index,
	// -1 for the end of the record. win[k] is the peak window.
	stop, by := make([]int, len(res.Events)), make([]int, len(res.Events))
	win := make([]Span, len(res.Events))
	for k := range res.Events {
		e := &res.Events[k]
		e.Responses = block[k*nv : k*nv : (k+1)*nv]
		stop[k], by[k] = n, -1
		for j := sort.Search(len(res.Events), func(j int) bool { return res.Events[j].Start > e.End }); j < len(res.Events); j++ {
			if o.Recovery.censors(e, &res.Events[j]) {
				stop[k], by[k] = s.Index(res.Events[j].Start), j
				break
			}
		}
		win[k] = Span{s.Index(e.Start), min(s.Index(e.End)+o.Recovery.Lag, stop[k]-1, n-1)}
	}
	pairs := overlapping(res.Events, win)
	for _, pr := range pairs {
		a, b := &res.Events[pr[0]], &res.Events[pr[1]]
		a.Overlaps = append(a.Overlaps, b.ID)
		b.Overlaps = append(b.Overlaps, a.ID)
	}
	var skip []Span
	for _, v := range o.Responses {
		x := s.Var(v.Name)
		if x == nil {
			continue
		}
		cl, err := o.Climate.compute(w, x, s.Start, doy, nil)
		if err != nil {
			warn("%s: %w: responses left out", v.Name, err)
			continue
		}
		daily(seas, &cl.Mean, doy)
		for i, xv := range x {
			anom[i] = xv - seas[i]
		}
		tol := v.Tolerance
		if tol == 0 {
			lo, hi := yearBounds(s.Start, n, cl.First, cl.Last)
			tol = o.Recovery.ToleranceSD * stdDev(anom[lo:hi])
		}
		for k := range res.Events {
			e := &res.Events[k]
			skip = ceded(skip[:0], k, v.Driver, res.Events, win, pairs)
			r := respond(anom, win[k], s.Index(e.End), stop[k], skip, v.Harmful, tol, o.Recovery)
			r.Variable = v.Name
			r.PeakDate = e.Start + calendar.Date(max(r.TimeToPeak, 0))
			if r.Censor == NextEvent {
				r.CensoredBy = res.Events[by[k]].ID
			}
			e.Responses = append(e.Responses, r)
		}
	}
	return res, nil
}

// droughtThreshold sets dst to the drought threshold of every day.
func (o *Options) droughtThreshold(w *workspace, dst, q []float64, start calendar.Date, doy []int16) error {
	if o.Drought.Threshold == Daily {
		cl, err := o.Climate.compute(w, q, start, doy, []float64{o.Drought.Percentile})
		if err != nil {
			return err
		}
		daily(dst, &cl.Pct[0], doy)
		return nil
	}
	ref, err := o.Climate.reference(q, start)
	if err != nil {
		return err
	}
	t := fixedPercentile(w, q[ref.lo:ref.hi], o.Drought.Percentile)
	for i := range dst {
		dst[i] = t
	}
	return nil
}

// fixedPercentile returns the p-th percentile of the non-NaN values of x.
func fixedPercentile(w *workspace, x []float64, p float64) float64 {
	v := w.pool[:0]
	for _, f := range x {
		if !math.IsNaN(f) {
			v = append(v, f)
		}
	}
	w.pool = v
	return percentile(v, p)
}

// percentile returns the p-th percentile (0 <= p <= 100) of x by linear
// interpolation between order statistics, type 7 of Hyndman & Fan (1996),
// with numpy's arithmetic: robust.SelectQuantile at p/100, the fraction
// numpy.percentile computes first. It reorders x. It returns NaN when x is
// empty; x must hold no NaN.
func percentile(x []float64, p float64) float64 {
	if !(p >= 0 && p <= 100) {
		panic("events: percentile out of range")
	}
	return robust.SelectQuantile(x, p/100)
}

// prefix returns the ID prefix of a kind.
func prefix(kind string) string {
	switch kind {
	case HeatWaveKind:
		return "HW"
	case DroughtKind:
		return "DR"
	case FloodKind:
		return "FL"
	}
	return kind
}

// assignIDs gives every event its ID, numbering repeats of a prefix and
// start date in order.
func assignIDs(evs []Event) {
	seen := make(map[string]int, len(evs))
	for k := range evs {
		id := prefix(evs[k].Kind) + "-" + evs[k].Start.String()
		seen[id]++
		if c := seen[id]; c > 1 {
			id += "-" + strconv.Itoa(c)
		}
		evs[k].ID = id
	}
}

// stdDev returns the sample standard deviation (n−1 denominator) of the
// non-NaN values of x, NaN when there are fewer than two.
func stdDev(x []float64) float64 {
	sum, k := 0.0, 0
	for _, v := range x {
		if !math.IsNaN(v) {
			sum += v
			k++
		}
	}
	if k < 2 {
		return math.NaN()
	}
	mean := sum / float64(k)
	ss := 0.0
	for _, v := range x {
		if !math.IsNaN(v) {
			ss += (v - mean) * (v - mean)
		}
	}
	return math.Sqrt(ss / float64(k-1))
}

// respond measures the response of the departures a to the event whose
// peak window is win and whose last day is end, given that the disturbance
// that censors it starts on day stop (len(a) when there is none). The days
// of skip (sorted, disjoint) are left out of the peak search: they are
// credited to another event.
func respond(a []float64, win Span, end, stop int, skip []Span, harmful int, tol float64, o Recovery) Response {
	n := len(a)
	start := win.Start
	r := Response{PeakDeparture: math.NaN(), TimeToPeak: -1, Tolerance: tol}
	h := float64(harmful)
	sk := 0
	for i := start; i <= win.End; i++ {
		for sk < len(skip) && skip[sk].End < i {
			sk++
		}
		if sk < len(skip) && skip[sk].Start <= i {
			r.Shared++
			continue
		}
		if v := a[i]; !math.IsNaN(v) && (r.TimeToPeak < 0 || h*v > h*r.PeakDeparture) {
			r.PeakDeparture, r.TimeToPeak = v, i-start
		}
	}
	for _, v := range a[start : end+1] {
		if !math.IsNaN(v) {
			r.CumDeparture += v
			r.Observed++
		}
	}
	r.MeanDeparture = r.CumDeparture / float64(r.Observed)
	if r.Observed == 0 {
		r.CumDeparture = math.NaN()
	}

	run, gap := 0, 0
	for i := end + 1; ; i++ {
		switch {
		case i >= n:
			r.Censor, r.RecoveryDays = RecordEnd, n-1-end
			return r
		case i >= stop:
			r.Censor, r.RecoveryDays = NextEvent, stop-1-end
			return r
		}
		v := a[i]
		if math.IsNaN(v) {
			run = 0
			if gap++; gap > o.MaxGap {
				r.Censor, r.RecoveryDays = DataGap, i-gap-end
				return r
			}
			continue
		}
		gap = 0
		if math.Abs(v) > tol {
			run = 0
			continue
		}
		if run++; run == o.Run {
			r.Recovered, r.RecoveryDays = true, i-o.Run+1-end
			return r
		}
	}
}
