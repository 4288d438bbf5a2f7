package events

import (
	"fmt"
	"math"
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
	// (the percentile of the day-of-year climatology). "" means Fixed.
	Threshold Threshold
	// MinDuration is the shortest event kept, in days, pooled gaps
	// included. 0 means 5.
	MinDuration int
	// Pool: runs separated by this many days or fewer are pooled (the
	// inter-event time criterion t_c). Zero is a real value;
	// DefaultOptions sets 5.
	Pool int
	// MinDeficitFraction drops the events whose deficit is below this
	// fraction of the station's largest. 0 (the default) keeps all.
	MinDeficitFraction float64
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
}

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
		Heat:    HeatRule{Variable: "air_temperature", Percentile: 90, MinDuration: 3, MaxGap: 2},
		Drought: DroughtRule{Variable: "discharge", Percentile: 20, Threshold: Fixed, MinDuration: 5, Pool: 5},
		Flood:   FloodRule{Variable: "discharge", Percentile: 95, Separation: 7, Trough: 0.75},
		Responses: []Variable{
			{Name: "water_temperature", Harmful: +1},
			{Name: "specific_conductance", Harmful: +1},
			{Name: "dissolved_oxygen", Harmful: -1},
		},
		Recovery:   Recovery{Lag: 14, Run: 7, ToleranceSD: 1, MaxGap: 3},
		Antecedent: Antecedent{Measure: Fraction, Days: 365, MinCoverage: 0.8},
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
		d.Threshold = Fixed
	}
	setI(&d.MinDuration, 5)
	setS(&f.Variable, "discharge")
	setF(&f.Percentile, 95)
	setI(&f.Separation, 7)
	setF(&f.Trough, 0.75)
	setI(&r.Run, 7)
	setF(&r.ToleranceSD, 1)
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
