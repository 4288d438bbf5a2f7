package series

import (
	"math"

	"rebound/index/calendar"
)

// Station is the daily record of one station.
type Station struct {
	ID    string
	Start calendar.Date // the day of index 0 in every Var
	Days  int           // length of every Var
	// Vars maps a variable name (as named in the configuration, e.g.
	// "water_temperature") to its daily values in canonical units, one per
	// day from Start, NaN where missing.
	Vars map[string][]float64
	// Counts says, per variable, what the reader kept, dropped or filled.
	Counts map[string]*Counts
}

// Counts records what happened to one variable's rows of one station.
type Counts struct {
	Rows       int // data rows read for this station and variable
	Kept       int // values kept (finite, not excluded)
	Blank      int // rows with an empty value field
	Excluded   int // rows dropped because of their quality qualifier
	Filled     int // days filled by interpolation across short gaps
	Converted  int // values converted to canonical units
	OutOfRange int // values dropped as physically impossible
}

// Date returns the date of day index i.
func (s *Station) Date(i int) calendar.Date { return s.Start + calendar.Date(i) }

// Index returns the day index of d, which may lie outside [0, Days).
func (s *Station) Index(d calendar.Date) int { return int(d - s.Start) }

// End returns the last day of the record.
func (s *Station) End() calendar.Date { return s.Start + calendar.Date(s.Days-1) }

// Var returns the values of variable name, or nil when the station has none.
func (s *Station) Var(name string) []float64 { return s.Vars[name] }

// Present counts the non-NaN values in x.
func Present(x []float64) int {
	n := 0
	for _, v := range x {
		if !math.IsNaN(v) {
			n++
		}
	}
	return n
}
