package series

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"rebound/index/calendar"
)

// YearCoverage is how much of one year a variable's record covers.
type YearCoverage struct {
	Year    int // calendar year, or water year named by the year it ends in
	Days    int // days in that year: 365 or 366
	Present int // days with a value (not NaN)
}

// Fraction returns Present/Days.
func (y YearCoverage) Fraction() float64 { return float64(y.Present) / float64(y.Days) }

// Coverage counts the days with a value in x, whose index 0 is day start,
// for every year from the one holding start to the one holding the last day
// of x. Years are calendar years, or water years (1 October to 30 September,
// named by the calendar year in which they end) when waterYear is true. Days
// of a year outside x count as absent, so a record that starts in June
// covers less than 60% of its first calendar year.
func Coverage(start calendar.Date, x []float64, waterYear bool) []YearCoverage {
	if len(x) == 0 {
		return nil
	}
	yearOf := calendar.Date.Year
	if waterYear {
		yearOf = calendar.Date.WaterYear
	}
	first, last := yearOf(start), yearOf(start+calendar.Date(len(x)-1))
	out := make([]YearCoverage, last-first+1)
	for k := range out {
		y := first + k
		lo, hi := calendar.New(y, 1, 1), calendar.New(y+1, 1, 1)
		if waterYear {
			lo, hi = calendar.New(y-1, 10, 1), calendar.New(y, 10, 1)
		}
		out[k] = YearCoverage{Year: y, Days: int(hi - lo)}
		i0 := max(int(lo-start), 0)
		i1 := min(int(hi-start), len(x))
		for _, v := range x[i0:i1] {
			if !math.IsNaN(v) {
				out[k].Present++
			}
		}
	}
	return out
}

// YearsMeeting returns how many of years have at least minFraction of their
// days with a value.
func YearsMeeting(years []YearCoverage, minFraction float64) int {
	n := 0
	for _, y := range years {
		if y.Fraction() >= minFraction {
			n++
		}
	}
	return n
}

// Requirement is the record a station must have for a variable to be used.
// The zero Requirement asks only for at least one value.
type Requirement struct {
	// MinFraction is the fraction of a year's days that must have a value
	// for the year to count as complete, for example 0.8 (common practice;
	// the project's configuration sets it).
	MinFraction float64
	// MinYears is the number of complete years required.
	MinYears int
	// WaterYear counts water years (October–September) instead of calendar
	// years.
	WaterYear bool
}

// Check reports whether every variable in vars meets r at station s. When
// one does not, the reason names it, for example
//
//	water_temperature: 2 of 5 required years with >= 80% of days
//
// and reasons for several variables are joined by "; ". A variable with no
// value at all fails whatever r asks ("discharge: no data").
func (r Requirement) Check(s *Station, vars ...string) (ok bool, reason string) {
	var reasons []string
	for _, name := range vars {
		x := s.Vars[name]
		if Present(x) == 0 {
			reasons = append(reasons, name+": no data")
			continue
		}
		if r.MinYears <= 0 {
			continue
		}
		got := YearsMeeting(Coverage(s.Start, x, r.WaterYear), r.MinFraction)
		if got < r.MinYears {
			kind := "years"
			if r.WaterYear {
				kind = "water years"
			}
			reasons = append(reasons, fmt.Sprintf("%s: %d of %d required %s with >= %s%% of days",
				name, got, r.MinYears, kind, strconv.FormatFloat(100*r.MinFraction, 'g', 4, 64)))
		}
	}
	return len(reasons) == 0, strings.Join(reasons, "; ")
}
