package series

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Names of the variables the project's features and events know about.
const (
	WaterTemperature = "water_temperature" // water temperature, °C
	AirTemperature   = "air_temperature"   // air temperature, °C
	Discharge        = "discharge"         // discharge (streamflow), m³/s
)

// Options says which variables a reader keeps and how it treats their rows.
// The zero Options keeps no variable.
type Options struct {
	// Vars are the variables to keep. Rows of any other variable are
	// skipped and counted in Summary.Skipped.
	Vars []Var
	// Exclude lists qualifier codes whose rows are dropped and counted as
	// Excluded, for example "P" (provisional) or "E" (estimated). A
	// qualifier field may hold several codes separated by spaces; the row is
	// dropped when any of them is listed. Nil drops no row.
	Exclude []string
	// Ignore lists extra columns of a long file to read past. Any other
	// column that is not station, date, variable, value or qualifier is an
	// error.
	Ignore []string
	// MaxErrors is how many problems a reader collects before it stops.
	// 0 means stop at the first problem; a positive n means skip bad rows
	// and stop after n problems; a negative value means no limit.
	MaxErrors int
}

// Var is one variable to keep.
type Var struct {
	// Name is the variable's name in Station.Vars, e.g. "water_temperature".
	Name string
	// Source is the variable's name in the input's variable column; empty
	// means Name.
	Source string
	// Units are the input units, converted to canonical units as described
	// in the package documentation. Empty means canonical already.
	Units string
	// Range holds the physically plausible values, in canonical units.
	// Values outside it are dropped and counted as OutOfRange.
	Range Range
}

// Range is an inclusive range of plausible values. The zero Range keeps
// every finite value.
type Range struct {
	Min, Max float64
}

// IsZero reports whether r is the zero Range, which checks nothing.
func (r Range) IsZero() bool { return r.Min == 0 && r.Max == 0 }

// Contains reports whether x lies in r. Every value lies in the zero Range.
func (r Range) Contains(x float64) bool {
	return r.IsZero() || (x >= r.Min && x <= r.Max)
}

// DefaultRange returns physical limits for the variables the project knows
// (water and air temperature, discharge). They are generous bounds that
// catch unit mix-ups and sentinel values such as -9999, not quality-control
// thresholds:
//
//   - water_temperature: −5..45 °C (liquid river water; a few degrees below
//     zero allows for sensor offsets in ice-covered reaches);
//   - air_temperature: −90..60 °C (beyond the extremes ever measured);
//   - discharge: 0..+Inf m³/s (tidal reaches with flow reversal need a
//     wider range set by the caller).
//
// The bounds are common practice, chosen for this project. ok is false for
// other names.
func DefaultRange(name string) (r Range, ok bool) {
	switch name {
	case WaterTemperature:
		return Range{-5, 45}, true
	case AirTemperature:
		return Range{-90, 60}, true
	case Discharge:
		return Range{0, math.Inf(1)}, true
	}
	return Range{}, false
}

// Unit is an input unit and its conversion to canonical units.
type Unit struct {
	name      string // as given
	canonical string
	kind      unitKind
}

type unitKind uint8

const (
	unitAsIs unitKind = iota
	unitCelsius
	unitFahrenheit
	unitCubicMetres
	unitCubicFeet
)

// foot3 is one cubic foot in cubic metres: 0.3048³, exact because the
// international foot is defined as 0.3048 m.
const foot3 = 0.028316846592

// LookupUnit returns the Unit for an input unit name. Spellings of °C, °F,
// m³/s and ft³/s are recognised without regard to case; any other name is
// passed through unchanged and is its own canonical unit.
func LookupUnit(name string) Unit {
	u := Unit{name: name, canonical: name}
	switch strings.ToLower(name) {
	case "degc", "°c", "c":
		u.kind, u.canonical = unitCelsius, "°C"
	case "degf", "°f", "f":
		u.kind, u.canonical = unitFahrenheit, "°C"
	case "m3/s", "m³/s", "m^3/s", "cms":
		u.kind, u.canonical = unitCubicMetres, "m³/s"
	case "ft3/s", "ft³/s", "ft^3/s", "cfs":
		u.kind, u.canonical = unitCubicFeet, "m³/s"
	}
	return u
}

// Canonical returns the unit values are converted to.
func (u Unit) Canonical() string { return u.canonical }

// Converts reports whether values in u change when converted.
func (u Unit) Converts() bool { return u.kind == unitFahrenheit || u.kind == unitCubicFeet }

// Convert returns x in canonical units.
func (u Unit) Convert(x float64) float64 {
	switch u.kind {
	case unitFahrenheit:
		return (x - 32) * 5 / 9
	case unitCubicFeet:
		return x * foot3
	}
	return x
}

func (u Unit) isTemperature() bool { return u.kind == unitCelsius || u.kind == unitFahrenheit }
func (u Unit) isFlow() bool        { return u.kind == unitCubicMetres || u.kind == unitCubicFeet }

// Validate reports problems with the options: empty or repeated variable
// names, a range with Min > Max or NaN bounds, and units that do not fit a
// variable the project knows (temperature units for discharge, say).
func (o Options) Validate() error {
	var errs []error
	names := map[string]bool{}
	sources := map[string]bool{}
	for i, v := range o.Vars {
		if v.Name == "" {
			errs = append(errs, fmt.Errorf("series: variable %d has no name", i+1))
			continue
		}
		if names[v.Name] {
			errs = append(errs, fmt.Errorf("series: variable %q listed twice", v.Name))
		}
		names[v.Name] = true
		src := v.source()
		if sources[src] {
			errs = append(errs, fmt.Errorf("series: source variable %q listed twice", src))
		}
		sources[src] = true
		if err := v.validate(); err != nil {
			errs = append(errs, err)
		}
	}
	return errors.Join(errs...)
}

func (v Var) source() string {
	if v.Source == "" {
		return v.Name
	}
	return v.Source
}

func (v Var) validate() error {
	r := v.Range
	if math.IsNaN(r.Min) || math.IsNaN(r.Max) || r.Min > r.Max {
		return fmt.Errorf("series: variable %q: range: want min <= max, got %g..%g", v.Name, r.Min, r.Max)
	}
	u := LookupUnit(v.Units)
	switch v.Name {
	case WaterTemperature, AirTemperature:
		if v.Units != "" && !u.isTemperature() {
			return fmt.Errorf("series: variable %q: units: want a temperature (degC or degF), got %q", v.Name, v.Units)
		}
	case Discharge:
		if v.Units != "" && !u.isFlow() {
			return fmt.Errorf("series: variable %q: units: want a discharge (m3/s or ft3/s), got %q", v.Name, v.Units)
		}
	}
	return nil
}
