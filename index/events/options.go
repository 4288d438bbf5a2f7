package events

import (
	"fmt"
	"math"
	"slices"
)

// Kinds of the detected events.
const (
	HeatWaveKind = "heatwave"
	DroughtKind  = "drought"
	FloodKind    = "flood"
)

// Options configures Analyze. Start from DefaultOptions: for most fields
// the zero value means the default, but for the fields marked "zero is a
// real value" it means zero.
type Options struct {
	// Climate sets the reference period and the climatology windows shared
	// by every variable.
	Climate Climate
	Heat    HeatRule
	Drought DroughtRule
	Flood   FloodRule
	// Responses are the water-quality variables whose departures are
	// measured. A variable the station does not record is skipped
	// silently.
	Responses []Variable
	Recovery  Recovery
	// Antecedent sets the measure of antecedent dryness.
	Antecedent Antecedent
	// Severity sets how the severity class of each detected event is found.
	Severity Severity
}

// Severity classes shared by every kind of event, from the mildest. A user
// event has class 0: its severity is not known.
const (
	Unrated  = 0
	Moderate = 1
	Strong   = 2
	Severe   = 3
	Extreme  = 4
)

// SeverityNames are the names of the classes, indexed by class.
var SeverityNames = [...]string{"unrated", "moderate", "strong", "severe", "extreme"}

// SeverityName returns the name of class c, "unrated" when c is out of range.
func SeverityName(c int) string {
	if c < 0 || c >= len(SeverityNames) {
		return SeverityNames[0]
	}
	return SeverityNames[c]
}

// Severity configures the severity class of the detected events.
//
// Heat waves take the category of Hobday et al. (2018): the largest daily
// ratio of the driver's departure from its seasonal mean to the threshold's
// departure, floored and capped at 4 (1–2 moderate, 2–3 strong, 3–4 severe,
// 4 and more extreme).
//
// Floods take the return period of their peak in the generalised extreme
// value distribution fitted by L-moments to the station's annual maxima; a
// peak below ReturnPeriods[0] is moderate, below ReturnPeriods[1] strong,
// below ReturnPeriods[2] severe, and extreme above.
//
// Droughts take the larger of the empirical non-exceedance probabilities of
// their deficit and duration among the station's droughts (Weibull plotting
// position, count(<= x)/(n+1)); classes break at Probabilities as for
// floods.
type Severity struct {
	// ReturnPeriods are the three return periods in years that separate
	// the flood classes, increasing. Zero means 2, 10, 50.
	ReturnPeriods [3]float64
	// Probabilities are the three non-exceedance probabilities that
	// separate the drought classes, increasing in (0, 1). Zero means 0.5,
	// 0.8, 0.95.
	Probabilities [3]float64
	// FitMinYears is the fewest annual maxima the flood fit takes; with
	// fewer the floods are unrated and a warning says so. 0 means 10.
	FitMinYears int
	// YearCoverage is the least fraction of a year's days that must have a
	// flow for its maximum to enter the fit. 0 means 0.9.
	YearCoverage float64
	// WaterYear takes annual maxima over October–September water years
	// instead of calendar years.
	WaterYear bool
}

// Month sets are the months in which an event kind is reported: an event is
// kept when the day of its driver's extreme falls in one of them. Empty
// means every month.
type Months []int

// has reports whether month m (1–12) is in the set.
func (ms Months) has(m int) bool {
	if len(ms) == 0 {
		return true
	}
	for _, x := range ms {
		if x == m {
			return true
		}
	}
	return false
}

// HeatRule configures heat-wave detection.
type HeatRule struct {
	Off bool // no heat waves are detected
	// Variable is the driver. "" means "air_temperature".
	Variable string
	// Percentile of the seasonally varying threshold. 0 means 90.
	Percentile float64
	// MinDuration is the fewest days above the threshold that make an
	// event. 0 means 3; note that Hobday et al. (2016) use 5 days for
	// marine heat waves, but air over a river warms its water in less.
	MinDuration int
	// MaxGap: events separated by this many days or fewer are joined, after
	// the events shorter than MinDuration are dropped. Zero is a real
	// value; DefaultOptions sets 2 (Hobday et al. 2016).
	MaxGap int
	// Months is the season: heat waves whose hottest day falls outside it
	// are not reported. DefaultOptions sets June–September, the northern
	// warm season; a winter warm spell does not stress a river the way
	// summer heat does.
	Months Months
}

// Threshold says how the drought threshold varies over the year.
type Threshold string

const (
	Fixed Threshold = "fixed" // one flow for the whole year
	Daily Threshold = "daily" // the percentile of each calendar day's window
)

// DroughtRule configures drought detection (the threshold level method).
type DroughtRule struct {
	Off bool // no drought events are reported (antecedent dryness still uses the detection)
	// Variable is the driver. "" means "discharge".
	Variable string
	// Percentile of the reference-period flows used as threshold. 0 means
	// 20: Q80, the flow exceeded 80% of the time.
	Percentile float64
	// Threshold is Fixed (the percentile of all reference flows) or Daily
	// (the percentile of the day-of-year climatology). "" means Daily: a
	// fixed threshold calls every seasonal low-flow period a drought.
	Threshold Threshold
	// MinDuration is the shortest event kept, in days, pooled gaps
	// included. 0 means 5.
	MinDuration int
	// Pool: runs separated by this many days or fewer are pooled (the
	// inter-event time criterion t_c). Zero is a real value;
	// DefaultOptions sets 5.
	Pool int
	// PoolRatio is the inter-event volume criterion of the IC method
	// (Zelenhasić & Salvai 1987; Tallaksen et al. 1997): runs closer than
	// Pool days are pooled only when the flow volume above the threshold
	// between them is at most PoolRatio times the deficit of the event
	// before. Zero turns the volume test off (time criterion only);
	// DefaultOptions sets 0.1.
	PoolRatio float64
	// MinDeficitFraction drops the events whose deficit is below this
	// fraction of the station's largest. Zero keeps all; DefaultOptions
	// sets 0.005.
	MinDeficitFraction float64
	// Months is the season: droughts whose lowest flow falls outside it
	// are not reported (antecedent dryness still counts them). Empty
	// means every month.
	Months Months
}

// FloodRule configures flood detection.
type FloodRule struct {
	Off bool // no floods are detected
	// Variable is the driver. "" means "discharge".
	Variable string
	// Percentile of the reference-period flows used as the fixed
	// threshold. 0 means 95: Q5, the flow exceeded 5% of the time.
	Percentile float64
	// Separation is the fewest days between independent peaks. 0 means 7.
	Separation int
	// Trough is the fraction of the smaller peak the flow must drop below
	// between independent peaks. 0 means 0.75.
	Trough float64
	// Months is the season: floods whose peak falls outside it are not
	// reported. Empty means every month.
	Months Months
}

// Variable is a water-quality variable and the direction of harm.
type Variable struct {
	Name string // e.g. "water_temperature"
	// Harmful is +1 when an increase is harmful (temperature,
	// conductance) and −1 when a decrease is (dissolved oxygen).
	Harmful int
	// Tolerance is the half-width of the recovery band in the variable's
	// units. 0 means Recovery.ToleranceSD standard deviations of the
	// station's reference-period departures.
	Tolerance float64
	// Driver is the kind of event that drives this variable (e.g.
	// "heatwave" for water temperature). When the peak windows of two
	// events of different kinds share days, those days count for the
	// event of the driver kind, or, when neither is, for the later one.
	// "" means no kind is preferred.
	Driver string
}

// Recovery configures the response window and the recovery rule.
type Recovery struct {
	// Lag extends the window searched for the peak departure past the end
	// of the disturbance, in days. Zero is a real value; DefaultOptions
	// sets 14.
	Lag int
	// Run is the number of consecutive days the departure must stay
	// within the band. 0 means 7.
	Run int
	// ToleranceSD is the band half-width in standard deviations of the
	// reference-period departures, for variables without a fixed
	// Tolerance. 0 means 1.
	ToleranceSD float64
	// MaxGap is the longest run of missing days the recovery search steps
	// over; a longer gap censors recovery. Zero is a real value;
	// DefaultOptions sets 3.
	MaxGap int
	// CensorBy says which next event cuts a recovery short (and ends the
	// peak window): "" means CensorSameKindOrSevere.
	CensorBy CensorRule
	// CensorMinSeverity is the least severity class of an event of another
	// kind that censors, for CensorSevere and CensorSameKindOrSevere. 0
	// means Strong.
	CensorMinSeverity int
}

// CensorRule names the events that end a recovery search.
type CensorRule string

const (
	// CensorAny: any next event.
	CensorAny CensorRule = "any"
	// CensorSameKind: the next event of the same kind, or a user event.
	CensorSameKind CensorRule = "same_kind"
	// CensorSevere: the next event of at least CensorMinSeverity, or a user
	// event.
	CensorSevere CensorRule = "severe"
	// CensorSameKindOrSevere: the next event of the same kind or of at
	// least CensorMinSeverity, or a user event. A moderate flood a week
	// after a heat wave does not hide the river's recovery from the heat;
	// a second heat wave does.
	CensorSameKindOrSevere CensorRule = "same_kind_or_severe"
)

// CensorRules lists every rule.
var CensorRules = []CensorRule{CensorSameKindOrSevere, CensorAny, CensorSameKind, CensorSevere}

// Dryness names a measure of antecedent dryness.
type Dryness string

const (
	// Fraction is the fraction of the prior days spent in drought, 0–1.
	Fraction Dryness = "fraction"
	// Index is the standardized cumulative flow deficit of the prior days.
	Index Dryness = "index"
)

// Antecedent configures antecedent dryness (the memory of prior drought).
type Antecedent struct {
	// Measure is Fraction or Index. "" means Fraction.
	Measure Dryness
	// Days is the length of the window before the event start. 0 means
	// 365; 730 and 1095 are also common.
	Days int
	// MinCoverage is the fraction of the window's days that must have a
	// flow value; otherwise the dryness is NaN. 0 means 0.8.
	MinCoverage float64
}

// DefaultOptions returns the defaults, with the three water-quality
// variables the configuration knows.
func DefaultOptions() Options {
	return Options{
		Heat: HeatRule{Variable: "air_temperature", Percentile: 90, MinDuration: 3, MaxGap: 2, Months: Months{6, 7, 8, 9}},
		Drought: DroughtRule{Variable: "discharge", Percentile: 20, Threshold: Daily, MinDuration: 5, Pool: 5,
			PoolRatio: 0.1, MinDeficitFraction: 0.005},
		Flood: FloodRule{Variable: "discharge", Percentile: 95, Separation: 7, Trough: 0.75},
		Responses: []Variable{
			{Name: "water_temperature", Harmful: +1, Driver: HeatWaveKind},
			{Name: "specific_conductance", Harmful: +1, Driver: DroughtKind},
			{Name: "dissolved_oxygen", Harmful: -1, Driver: HeatWaveKind},
		},
		Recovery:   Recovery{Lag: 14, Run: 7, ToleranceSD: 1, MaxGap: 3, CensorBy: CensorSameKindOrSevere, CensorMinSeverity: Strong},
		Antecedent: Antecedent{Measure: Fraction, Days: 365, MinCoverage: 0.8},
		Severity: Severity{ReturnPeriods: [3]float64{2, 10, 50}, Probabilities: [3]float64{0.5, 0.8, 0.95},
			FitMinYears: 10, YearCoverage: 0.9},
	}
}

func (o Options) withDefaults() Options {
	o.Climate = o.Climate.withDefaults()
	h, d, f, r, a := &o.Heat, &o.Drought, &o.Flood, &o.Recovery, &o.Antecedent
	setS(&h.Variable, "air_temperature")
	setF(&h.Percentile, 90)
	setI(&h.MinDuration, 3)
	setS(&d.Variable, "discharge")
	setF(&d.Percentile, 20)
	if d.Threshold == "" {
		d.Threshold = Daily
	}
	setI(&d.MinDuration, 5)
	setS(&f.Variable, "discharge")
	setF(&f.Percentile, 95)
	setI(&f.Separation, 7)
	setF(&f.Trough, 0.75)
	setI(&r.Run, 7)
	setF(&r.ToleranceSD, 1)
	if r.CensorBy == "" {
		r.CensorBy = CensorSameKindOrSevere
	}
	setI(&r.CensorMinSeverity, Strong)
	sv := &o.Severity
	if sv.ReturnPeriods == [3]float64{} {
		sv.ReturnPeriods = [3]float64{2, 10, 50}
	}
	if sv.Probabilities == [3]float64{} {
		sv.Probabilities = [3]float64{0.5, 0.8, 0.95}
	}
	setI(&sv.FitMinYears, 10)
	setF(&sv.YearCoverage, 0.9)
	if a.Measure == "" {
		a.Measure = Fraction
	}
	setI(&a.Days, 365)
	setF(&a.MinCoverage, 0.8)
	return o
}

func setS(p *string, v string) {
	if *p == "" {
		*p = v
	}
}

func setI(p *int, v int) {
	if *p == 0 {
		*p = v
	}
}

func setF(p *float64, v float64) {
	if *p == 0 {
		*p = v
	}
}

// Validate reports the first invalid field, named as in the configuration.
func (o Options) Validate() error {
	if err := o.Climate.validate("climate."); err != nil {
		return err
	}
	pct := func(name string, p float64) error {
		if !(p > 0 && p < 100) && p != 0 {
			return fmt.Errorf("%s: want a percentile strictly between 0 and 100, got %v", name, p)
		}
		return nil
	}
	nonNeg := func(name string, v int) error {
		if v < 0 {
			return fmt.Errorf("%s: want days >= 0, got %d", name, v)
		}
		return nil
	}
	frac := func(name string, v float64, hi float64) error {
		if !(v >= 0 && v <= hi) {
			return fmt.Errorf("%s: want a number in [0, %g], got %v", name, hi, v)
		}
		return nil
	}
	for _, err := range []error{
		pct("heat.percentile", o.Heat.Percentile),
		nonNeg("heat.min_duration", o.Heat.MinDuration),
		nonNeg("heat.max_gap", o.Heat.MaxGap),
		pct("drought.percentile", o.Drought.Percentile),
		nonNeg("drought.min_duration", o.Drought.MinDuration),
		nonNeg("drought.pool", o.Drought.Pool),
		frac("drought.min_deficit_fraction", o.Drought.MinDeficitFraction, 1),
		pct("flood.percentile", o.Flood.Percentile),
		nonNeg("flood.separation", o.Flood.Separation),
		frac("flood.trough", o.Flood.Trough, 1),
		nonNeg("recovery.lag", o.Recovery.Lag),
		nonNeg("recovery.run", o.Recovery.Run),
		nonNeg("recovery.max_gap", o.Recovery.MaxGap),
		nonNeg("antecedent.days", o.Antecedent.Days),
		frac("antecedent.min_coverage", o.Antecedent.MinCoverage, 1),
	} {
		if err != nil {
			return err
		}
	}
	switch o.Drought.Threshold {
	case "", Fixed, Daily:
	default:
		return fmt.Errorf("drought.threshold: want %q or %q, got %q", Fixed, Daily, o.Drought.Threshold)
	}
	for _, m := range []struct {
		key string
		ms  Months
	}{{"heat.months", o.Heat.Months}, {"drought.months", o.Drought.Months}, {"flood.months", o.Flood.Months}} {
		for i, x := range m.ms {
			if x < 1 || x > 12 {
				return fmt.Errorf("%s[%d]: want a month 1–12, got %d", m.key, i+1, x)
			}
		}
	}
	if err := frac("drought.pool_ratio", o.Drought.PoolRatio, math.Inf(1)); err != nil {
		return err
	}
	if o.Recovery.CensorBy != "" && !slices.Contains(CensorRules, o.Recovery.CensorBy) {
		return fmt.Errorf("recovery.censor_by: want one of %q, got %q", CensorRules, o.Recovery.CensorBy)
	}
	if c := o.Recovery.CensorMinSeverity; c < 0 || c > Extreme {
		return fmt.Errorf("recovery.censor_min_severity: want a class 1–4, got %d", c)
	}
	sv := o.Severity
	if sv.ReturnPeriods != [3]float64{} {
		r := sv.ReturnPeriods
		if !(r[0] > 1 && r[1] > r[0] && r[2] > r[1]) || math.IsInf(r[2], 0) {
			return fmt.Errorf("severity.return_periods: want three increasing return periods above 1 year, got %v", r[:])
		}
	}
	if sv.Probabilities != [3]float64{} {
		p := sv.Probabilities
		if !(p[0] > 0 && p[1] > p[0] && p[2] > p[1] && p[2] < 1) {
			return fmt.Errorf("severity.probabilities: want three increasing probabilities strictly between 0 and 1, got %v", p[:])
		}
	}
	if sv.FitMinYears < 0 {
		return fmt.Errorf("severity.fit_min_years: want a number of years >= 0, got %d", sv.FitMinYears)
	}
	if err := frac("severity.year_coverage", sv.YearCoverage, 1); err != nil {
		return err
	}
	switch o.Antecedent.Measure {
	case "", Fraction, Index:
	default:
		return fmt.Errorf("antecedent.measure: want %q or %q, got %q", Fraction, Index, o.Antecedent.Measure)
	}
	if !(o.Recovery.ToleranceSD >= 0) || math.IsInf(o.Recovery.ToleranceSD, 0) {
		return fmt.Errorf("recovery.tolerance_sd: want a number >= 0, got %v", o.Recovery.ToleranceSD)
	}
	seen := make(map[string]bool, len(o.Responses))
	for i, v := range o.Responses {
		key := fmt.Sprintf("responses[%d]", i)
		switch {
		case v.Name == "":
			return fmt.Errorf("%s.name: want a variable name, got \"\"", key)
		case seen[v.Name]:
			return fmt.Errorf("%s.name: %q is listed twice", key, v.Name)
		case v.Harmful != 1 && v.Harmful != -1:
			return fmt.Errorf("%s.harmful: want +1 (increase harmful) or -1 (decrease harmful), got %d", key, v.Harmful)
		case !(v.Tolerance >= 0) || math.IsInf(v.Tolerance, 0):
			return fmt.Errorf("%s.tolerance: want a number >= 0, got %v", key, v.Tolerance)
		}
		seen[v.Name] = true
	}
	return nil
}
