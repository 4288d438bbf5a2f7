package events

import "rebound/index/calendar"

// before366[m-1] is the number of days before month m in a leap year.
var before366 = [12]int{0, 31, 60, 91, 121, 152, 182, 213, 244, 274, 305, 335}

// daysOf366 sets dst[i] to (start+i).DayOf366() − 1, in 0..365, and returns
// dst. It walks the calendar instead of converting every day.
func daysOf366(dst []int16, start calendar.Date) []int16 {
	y, m, d := start.Civil()
	for i := range dst {
		dst[i] = int16(before366[m-1] + d - 1)
		if d++; d > calendar.DaysIn(y, m) {
			d = 1
			if m++; m > 12 {
				m = 1
				y++
			}
		}
	}
	return dst
}

// yearBounds returns the day indices [lo, hi) of calendar years first..last
// within a record of n days from start, clipped to the record.
func yearBounds(start calendar.Date, n, first, last int) (lo, hi int) {
	lo = int(calendar.New(first, 1, 1) - start)
	hi = int(calendar.New(last+1, 1, 1) - start)
	return min(max(lo, 0), n), min(max(hi, 0), n)
}
