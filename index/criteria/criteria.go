package criteria

import (
	"errors"
	"fmt"
	"math"

	"rebound/index/calendar"
	"rebound/index/series"
)

// Window is the length in days of the moving window of the weekly statistic.
const Window = 7

// Basis names the weekly statistic used for a station.
type Basis string

const (
	// DailyMax is the 7DADM: the 7-day average of daily maxima.
	DailyMax Basis = "7DADM"
	// DailyMean is the 7-day average of daily means, used when a station
	// has no daily maxima.
	DailyMean Basis = "7-day mean of daily means"
)

// Criterion is a numeric criterion for the weekly statistic: a day fails
// when the statistic is strictly greater than Limit.
type Criterion struct {
	Name  string  // a label for reports, e.g. "core juvenile rearing"
	Limit float64 // °C
}

// Options says which variables hold the daily maxima and means and which
// criteria to apply.
type Options struct {
	// MaxVariable names the daily maximum water temperature.
	// "" means "water_temperature_max".
	MaxVariable string
	// MeanVariable names the daily mean water temperature, used when the
	// station has no complete 7-day window of daily maxima.
	// "" means "water_temperature".
	MeanVariable string
	// Criteria are applied in order. None by default.
	Criteria []Criterion
}

// DefaultOptions returns the options a configuration is decoded onto.
func DefaultOptions() Options {
	return Options{MaxVariable: "water_temperature_max", MeanVariable: "water_temperature"}
}

// Validate reports the first invalid field by name.
func (o Options) Validate() error {
	seen := make(map[string]bool, len(o.Criteria))
	for i, c := range o.Criteria {
		if c.Name == "" {
			return fmt.Errorf("criteria[%d].name: want a name, got \"\"", i)
		}
		if seen[c.Name] {
			return fmt.Errorf("criteria[%d].name: %q is used twice", i, c.Name)
		}
		seen[c.Name] = true
		if math.IsNaN(c.Limit) || math.IsInf(c.Limit, 0) {
			return fmt.Errorf("criteria[%d].limit: want a finite temperature, got %v", i, c.Limit)
		}
	}
	return nil
}

func (o Options) withDefaults() Options {
	if o.MaxVariable == "" {
		o.MaxVariable = "water_temperature_max"
	}
	if o.MeanVariable == "" {
		o.MeanVariable = "water_temperature"
	}
	return o
}

// ErrNoTemperature is the warning of a station with no complete 7-day window
// of either daily maxima or daily means.
var ErrNoTemperature = errors.New("no complete 7-day window of water temperature")

// Result is one station's weekly statistic and its performance against
// each criterion.
type Result struct {
	Station  string
	Basis    Basis  // "" when the station has no usable temperature
	Variable string // the variable the weekly statistic was computed from
	// Weekly holds the 7-day value of every day of the record, NaN where
	// the window is incomplete.
	Weekly []float64
	// Max is the largest weekly value and MaxDate the day its window ends
	// (the first such day on ties). Max is NaN when Weekly has no value.
	Max     float64
	MaxDate calendar.Date
	// Criteria holds one entry per criterion, in the order of Options.Criteria.
	Criteria []Performance
	// Warnings says what could not be computed and why.
	Warnings []error
}

// Performance is a station's record against one criterion.
type Performance struct {
	Criterion
	RRV
}

// Evaluate computes the weekly statistic of station s and its performance
// against each criterion of o. It uses the 7DADM when the station has at
// least one complete 7-day window of o.MaxVariable and the 7-day mean of
// o.MeanVariable otherwise. It returns an error only when o is invalid.
func Evaluate(s *series.Station, o Options) (Result, error) {
	if err := o.Validate(); err != nil {
		return Result{}, err
	}
	o = o.withDefaults()
	res := Result{Station: s.ID, Max: math.NaN()}
	for _, c := range []struct {
		name  string
		basis Basis
	}{{o.MaxVariable, DailyMax}, {o.MeanVariable, DailyMean}} {
		x := s.Var(c.name)
		if x == nil {
			continue
		}
		w := SevenDay(make([]float64, len(x)), x)
		if i := argMax(w); i >= 0 {
			res.Basis, res.Variable, res.Weekly = c.basis, c.name, w
			res.Max, res.MaxDate = w[i], s.Date(i)
			break
		}
	}
	if res.Weekly == nil {
		res.Warnings = append(res.Warnings, fmt.Errorf("station %s: %w (%s or %s)", s.ID, ErrNoTemperature, o.MaxVariable, o.MeanVariable))
	}
	res.Criteria = make([]Performance, len(o.Criteria))
	for i, c := range o.Criteria {
		res.Criteria[i] = Performance{Criterion: c, RRV: Hashimoto(res.Weekly, c.Limit)}
	}
	return res, nil
}

// argMax returns the index of the first largest non-NaN value of x, or -1.
func argMax(x []float64) int {
	k := -1
	for i, v := range x {
		if !math.IsNaN(v) && (k < 0 || v > x[k]) {
			k = i
		}
	}
	return k
}

// SevenDay sets dst[i] to the mean of x[i-6], ..., x[i], the 7-day window
// ending on day i, and to NaN when i < 6 or any of the seven values is NaN.
// It returns dst, which must not overlap x. SevenDay panics if
// len(dst) != len(x).
func SevenDay(dst, x []float64) []float64 {
	if len(dst) != len(x) {
		panic("criteria: slice length mismatch")
	}
	// Each window is summed afresh with Neumaier's compensated summation
	// (Neumaier 1974, ZAMM 54:39–51), not carried as a running sum: a mean
	// of decimal readings that equals a criterion exactly (17.26, …, 18.51
	// averaging 18.00) must not come out a rounding error above it, and
	// rounding must not drift over a long record.
	run := 0 // consecutive non-NaN values ending at i
	for i, v := range x {
		if math.IsNaN(v) {
			run = 0
		} else {
			run++
		}
		if run < Window {
			dst[i] = math.NaN()
			continue
		}
		dst[i] = compensatedSum(x[i-Window+1:i+1]) / Window
	}
	return dst
}

// compensatedSum returns the sum of x by Neumaier's variant of Kahan
// summation, which keeps the rounding error of each addition.
func compensatedSum(x []float64) float64 {
	var sum, c float64
	for _, v := range x {
		t := sum + v
		if math.Abs(sum) >= math.Abs(v) {
			c += (sum - t) + v
		} else {
			c += (v - t) + sum
		}
		sum = t
	}
	return sum + c
}
