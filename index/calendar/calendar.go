// Package calendar is a civil (time-zone free) calendar date for daily
// records. A Date counts days since 1970-01-01 in the proleptic Gregorian
// calendar, so day arithmetic is integer arithmetic and a date needs four
// bytes. Dates are calendar dates in the station's local time: no clock and
// no time zone is implied.
package calendar

import (
	"errors"
	"fmt"
)

// Date is a calendar day, counted from 1970-01-01 (day 0).
type Date int32

// ErrSyntax reports a date that is not an ISO 8601 calendar date YYYY-MM-DD.
var ErrSyntax = errors.New("want an ISO 8601 date YYYY-MM-DD")

// ErrRange reports a well-formed date that does not exist (for example
// 2023-02-29).
var ErrRange = errors.New("no such calendar day")

// IsLeap reports whether year y has 366 days in the Gregorian calendar.
func IsLeap(y int) bool { return y%4 == 0 && (y%100 != 0 || y%400 == 0) }

// DaysIn returns the number of days in month m (1..12) of year y.
func DaysIn(y, m int) int {
	switch m {
	case 2:
		if IsLeap(y) {
			return 29
		}
		return 28
	case 4, 6, 9, 11:
		return 30
	}
	return 31
}

// New returns the Date for year y, month m (1..12) and day d (1..31). It does
// not validate; use Valid for that. Out-of-range months and days roll over
// the way the days-from-civil algorithm extends them.
func New(y, m, d int) Date {
	// Days from civil, after H. Hinnant's public-domain date algorithms.
	if m <= 2 {
		y--
	}
	era := y / 400
	if y < 0 && y%400 != 0 {
		era = (y - 399) / 400
	}
	yoe := y - era*400
	mp := (m + 9) % 12
	doy := (153*mp+2)/5 + d - 1
	doe := yoe*365 + yoe/4 - yoe/100 + doy
	return Date(era*146097 + doe - 719468)
}

// Valid reports whether y-m-d names a real calendar day.
func Valid(y, m, d int) bool {
	return m >= 1 && m <= 12 && d >= 1 && d <= DaysIn(y, m)
}

// Civil returns the year, month (1..12) and day (1..31) of t.
func (t Date) Civil() (y, m, d int) {
	z := int(t) + 719468
	era := z / 146097
	if z < 0 && z%146097 != 0 {
		era = (z - 146096) / 146097
	}
	doe := z - era*146097
	yoe := (doe - doe/1460 + doe/36524 - doe/146096) / 365
	y = yoe + era*400
	doy := doe - (365*yoe + yoe/4 - yoe/100)
	mp := (5*doy + 2) / 153
	d = doy - (153*mp+2)/5 + 1
	m = mp + 3
	if m > 12 {
		m -= 12
	}
	if m <= 2 {
		y++
	}
	return y, m, d
}

// Year returns the calendar year of t.
func (t Date) Year() int { y, _, _ := t.Civil(); return y }

// DayOfYear returns the ordinal day of t in its year, 1..365 (or 366).
func (t Date) DayOfYear() int {
	y, _, _ := t.Civil()
	return int(t-New(y, 1, 1)) + 1
}

// DayOf366 returns the day of t in a fixed 366-day year in which 29 February
// is always day 60 and 1 March always day 61, so that the same calendar day
// has the same index in leap and common years. This is the convention of
// day-of-year climatologies.
func (t Date) DayOf366() int {
	y, m, _ := t.Civil()
	doy := t.DayOfYear()
	if !IsLeap(y) && m > 2 {
		doy++
	}
	return doy
}

// WaterYear returns the October–September water year of t, named by the
// calendar year in which it ends (1 October 2020 is in water year 2021).
func (t Date) WaterYear() int {
	y, m, _ := t.Civil()
	if m >= 10 {
		return y + 1
	}
	return y
}

// String formats t as YYYY-MM-DD.
func (t Date) String() string {
	y, m, d := t.Civil()
	if y < 0 || y > 9999 {
		return fmt.Sprintf("%+05d-%02d-%02d", y, m, d)
	}
	var b [10]byte
	put4(b[0:4], y)
	b[4] = '-'
	put2(b[5:7], m)
	b[7] = '-'
	put2(b[8:10], d)
	return string(b[:])
}

// AppendText appends the YYYY-MM-DD form of t to b.
func (t Date) AppendText(b []byte) ([]byte, error) { return append(b, t.String()...), nil }

func put4(b []byte, v int) {
	put2(b[0:2], v/100)
	put2(b[2:4], v%100)
}

func put2(b []byte, v int) {
	b[0] = byte('0' + v/10)
	b[1] = byte('0' + v%10)
}

// Parse reads an ISO 8601 calendar date in the extended form YYYY-MM-DD.
// A trailing time part starting with 'T' or a space (as in
// "2021-07-04T00:00:00") is not accepted: daily records carry dates only.
func Parse(s string) (Date, error) { return ParseBytes([]byte(s)) }

// ParseBytes is Parse for a byte slice; it does not allocate.
func ParseBytes(b []byte) (Date, error) {
	if len(b) != 10 || b[4] != '-' || b[7] != '-' {
		return 0, ErrSyntax
	}
	y, ok1 := digits(b[0:4])
	m, ok2 := digits(b[5:7])
	d, ok3 := digits(b[8:10])
	if !ok1 || !ok2 || !ok3 {
		return 0, ErrSyntax
	}
	if !Valid(y, m, d) {
		return 0, ErrRange
	}
	return New(y, m, d), nil
}

func digits(b []byte) (int, bool) {
	v := 0
	for _, c := range b {
		if c < '0' || c > '9' {
			return 0, false
		}
		v = v*10 + int(c-'0')
	}
	return v, true
}
