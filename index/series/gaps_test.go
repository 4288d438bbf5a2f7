package series

import (
	"testing"

	"rebound/index/calendar"
)

func TestFillGaps(t *testing.T) {
	in := []float64{nan, 1, nan, 3, nan, nan, 9, nan, nan, nan, 2, nan, 0.5, nan}
	// numpy 1.24.2 numpy.interp over the present values, kept only for gaps of
	// at most 2 interior days (no extrapolation at the ends):
	// [1, 1, 2, 3, 5, 7, 9, 7.25, 5.5, 3.75, 2, 1.25, 0.5, 0.5]
	tests := []struct {
		maxGap int
		want   []float64
		filled int
	}{
		{0, in, 0},
		{1, []float64{nan, 1, 2, 3, nan, nan, 9, nan, nan, nan, 2, 1.25, 0.5, nan}, 2},
		{2, []float64{nan, 1, 2, 3, 5, 7, 9, nan, nan, nan, 2, 1.25, 0.5, nan}, 4},
		{3, []float64{nan, 1, 2, 3, 5, 7, 9, 7.25, 5.5, 3.75, 2, 1.25, 0.5, nan}, 7},
	}
	for _, tc := range tests {
		x := append([]float64(nil), in...)
		n := FillGaps(x, tc.maxGap)
		if n != tc.filled || !sameFloats(x, tc.want, 1e-15) {
			t.Errorf("maxGap %d: filled %d %v, want %d %v", tc.maxGap, n, x, tc.filled, tc.want)
		}
	}
	s := &Station{Vars: map[string][]float64{"a": {1, nan, 3}, "b": {nan, 1, nan, nan, 2}}, Counts: map[string]*Counts{"a": {}}}
	if n := s.FillGaps(2); n != 3 || s.Counts["a"].Filled != 1 || s.Counts["b"].Filled != 2 {
		t.Errorf("Station.FillGaps = %d, counts %+v %+v", n, s.Counts["a"], s.Counts["b"])
	}
}

func TestCoverage(t *testing.T) {
	// 2019-12-30 .. 2021-01-02: 2 days of 2019, 366 of 2020 (leap year), 2 of
	// 2021; counts by hand.
	start := calendar.New(2019, 12, 30)
	x := make([]float64, 2+366+2)
	for i := range x {
		if i >= 2+60 && i < 2+60+30 { // 30 missing days in 2020
			x[i] = nan
		}
	}
	got := Coverage(start, x, false)
	want := []YearCoverage{{2019, 365, 2}, {2020, 366, 336}, {2021, 365, 2}}
	if len(got) != 3 || got[0] != want[0] || got[1] != want[1] || got[2] != want[2] {
		t.Errorf("calendar years %v, want %v", got, want)
	}
	// Water years: WY2020 = 2019-10-01..2020-09-30 (366 days) holds 2 days of
	// 2019 and 274 of 2020, 30 of them missing; WY2021 holds the other 94.
	got = Coverage(start, x, true)
	want = []YearCoverage{{2020, 366, 246}, {2021, 365, 94}}
	if len(got) != 2 || got[0] != want[0] || got[1] != want[1] {
		t.Errorf("water years %v, want %v", got, want)
	}
	if n := YearsMeeting(Coverage(start, x, false), 0.9); n != 1 {
		t.Errorf("YearsMeeting = %d, want 1", n)
	}
}

func TestRequirement(t *testing.T) {
	start := calendar.New(2001, 1, 1)
	days := int(calendar.New(2006, 1, 1) - start)
	w := make([]float64, days)
	for i := range w {
		if y := (start + calendar.Date(i)).Year(); y >= 2003 && (start+calendar.Date(i)).DayOfYear() > 300 {
			w[i] = nan // 2003-2005 lose 65 days: 82% of 365
		}
		if (start + calendar.Date(i)).Year() >= 2004 {
			w[i] = nan
		}
	}
	s := &Station{ID: "A", Start: start, Days: days, Vars: map[string][]float64{WaterTemperature: w}}
	tests := []struct {
		r      Requirement
		ok     bool
		reason string
	}{
		{Requirement{}, true, ""},
		{Requirement{MinFraction: 0.8, MinYears: 3}, true, ""},
		{Requirement{MinFraction: 0.85, MinYears: 3}, false, "water_temperature: 2 of 3 required years with >= 85% of days"},
		{Requirement{MinFraction: 0.8, MinYears: 5, WaterYear: true}, false, "water_temperature: 2 of 5 required water years with >= 80% of days"},
	}
	for _, tc := range tests {
		ok, reason := tc.r.Check(s, WaterTemperature)
		if ok != tc.ok || reason != tc.reason {
			t.Errorf("%+v: %v %q, want %v %q", tc.r, ok, reason, tc.ok, tc.reason)
		}
	}
	ok, reason := Requirement{}.Check(s, WaterTemperature, Discharge, AirTemperature)
	if ok || reason != "discharge: no data; air_temperature: no data" {
		t.Errorf("missing variables: %v %q", ok, reason)
	}
}
