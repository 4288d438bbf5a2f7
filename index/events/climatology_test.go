package events

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"rebound/index/calendar"
)

// TestClimatologyHobday checks the climatology of heatwave_synth_2001_2006.csv
// with reference period 2001–2005 against the Hobday et al. (2016) authors'
// reference code (github ecjoliver/marineHeatWaves d7292bf) at five dates,
// and against the numpy 1.24.2 re-implementation testdata/heatwave_clim.py
// on all 366 days.
func TestClimatologyHobday(t *testing.T) {
	x := readCSV(t, "testdata/heatwave_synth_2001_2006.csv", 1)
	cl, err := Climate{FirstYear: 2001, LastYear: 2005}.Compute(x, calendar.New(2001, 1, 1), 90)
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-6
	for _, tc := range []struct {
		date         string
		seas, thresh float64 // reference code, printed to 6 decimals
	}{
		{"2006-01-15", 8.095768, 9.019446},
		{"2006-07-01", 19.613838, 20.564622},
		{"2006-07-15", 19.895908, 20.838042},
		{"2006-08-21", 19.057850, 19.974117},
		{"2006-12-31", 8.380441, 9.324365},
	} {
		d := date(tc.date).DayOf366() - 1
		if !close(cl.Mean[d], tc.seas, tol) || !close(cl.Pct[0][d], tc.thresh, tol) {
			t.Errorf("%s: seas %.6f thresh %.6f, want %.6f %.6f", tc.date, cl.Mean[d], cl.Pct[0][d], tc.seas, tc.thresh)
		}
	}
	seas := readCSV(t, "testdata/heatwave_synth_clim.csv", 1)
	thresh := readCSV(t, "testdata/heatwave_synth_clim.csv", 2)
	for d := range 366 {
		if !close(cl.Mean[d], seas[d], 1e-9) || !close(cl.Pct[0][d], thresh[d], 1e-9) {
			t.Errorf("day %d: seas %.10f thresh %.10f, want %.10f %.10f", d+1, cl.Mean[d], cl.Pct[0][d], seas[d], thresh[d])
		}
	}
	if cl.Years != 5 || cl.First != 2001 || cl.Last != 2005 {
		t.Errorf("reference %d–%d with %d years, want 2001–2005 with 5", cl.First, cl.Last, cl.Years)
	}
}

// TestClimatologySinusoid checks that the climatology of 30 years of a
// sinusoid with period 365.25 days recovers it. The analytic expectation on
// calendar day D is 12 + 8·k·mean_y cos(2π(t_y − 200)/365.25) over the days
// t_y with DayOf366 D, where k is the attenuation of the moving averages:
// an m-day average scales a sinusoid of period P by
// sin(mπ/P)/(m·sin(π/P)) (k = 0.99852 for the 11-day pool and 0.98674
// with the 31-day smoothing as well). The tolerances allow for the noise
// (sd 0.1, about 0.006 on a mean of 330 values) and, with smoothing, for
// the 366-day calendar: the smoothing window crosses day 60, which is one
// day in leap years and none in common years, shifting the phase near
// 1 March by up to half a day (0.035 °C at the steepest slope, measured).
func TestClimatologySinusoid(t *testing.T) {
	const P = 365.25
	start := calendar.New(1991, 1, 1)
	n := int(calendar.New(2021, 1, 1) - start)
	var cosSum [366]float64
	var cnt [366]int
	for i := range n {
		d := start + calendar.Date(i)
		k := d.DayOf366() - 1
		cosSum[k] += math.Cos(2 * math.Pi * (float64(d) - 200) / P)
		cnt[k]++
	}
	att := func(m float64) float64 { return math.Sin(m*math.Pi/P) / (m * math.Sin(math.Pi/P)) }
	rng := rand.New(rand.NewPCG(1, 2))
	for _, tc := range []struct {
		name   string
		noise  float64
		smooth int
		k      float64
		tol    float64
	}{
		{"exact, unsmoothed", 0, 1, att(11), 0.005},
		{"noisy, unsmoothed", 0.1, 1, att(11), 0.03},
		{"exact, smoothed", 0, 31, att(11) * att(31), 0.04},
		{"noisy, smoothed", 0.1, 31, att(11) * att(31), 0.045},
	} {
		t.Run(tc.name, func(t *testing.T) {
			x := make([]float64, n)
			for i := range x {
				x[i] = 12 + 8*math.Cos(2*math.Pi*(float64(start)+float64(i)-200)/P) + tc.noise*rng.NormFloat64()
			}
			cl, err := Climate{Smooth: tc.smooth}.Compute(x, start)
			if err != nil {
				t.Fatal(err)
			}
			for d := range 366 {
				if d == 59 { // 29 February: interpolated
					continue
				}
				want := 12 + 8*tc.k*cosSum[d]/float64(cnt[d])
				if math.Abs(cl.Mean[d]-want) > tc.tol {
					t.Errorf("day %d: %.4f, want %.4f ± %g", d+1, cl.Mean[d], want, tc.tol)
				}
			}
		})
	}
}

func TestClimatologyCalendar(t *testing.T) {
	// A value that equals the DayOf366 of its date: the unsmoothed mean of
	// a day is the mean of the days pooled around it, and 29 February
	// (day 60) is the average of days 59 and 61 (by hand).
	start := calendar.New(2000, 1, 1)
	n := int(calendar.New(2010, 1, 1) - start)
	x := make([]float64, n)
	for i := range x {
		x[i] = float64((start + calendar.Date(i)).DayOf366())
	}
	cl, err := Climate{HalfWidth: 1, Smooth: 1}.Compute(x, start)
	if err != nil {
		t.Fatal(err)
	}
	// Day 59 (28 February) pools 27 Feb, 28 Feb and the next day: 29 Feb
	// (60) in the 3 leap years 2000, 2004, 2008 and 1 March (61) in the 7
	// common ones. Day 61 pools 29 Feb (60) or 28 Feb (59), 1 and 2 March.
	want59 := (58 + 59 + (3*60+7*61)/10.0) / 3
	want61 := ((3*60+7*59)/10.0 + 61 + 62) / 3
	for _, tc := range []struct {
		day       int
		got, want float64
	}{
		{59, cl.Mean[58], want59},
		{61, cl.Mean[60], want61},
		{60, cl.Mean[59], (want59 + want61) / 2},
		{100, cl.Mean[99], 100},
		// 1 January pools 31 December of the year before (366) except in
		// 2000, the first year of the record: (9·366 + 10·1 + 10·2)/29.
		{1, cl.Mean[0], (9*366 + 10*1 + 10*2) / 29.0},
	} {
		if !close(tc.got, tc.want, 1e-12) {
			t.Errorf("day %d: mean %v, want %v", tc.day, tc.got, tc.want)
		}
	}
}

func TestClimatologyShortReference(t *testing.T) {
	start := calendar.New(2001, 1, 1)
	x := make([]float64, 3*365)
	for i := range x {
		x[i] = 1
		if i >= 365 && i < 365+200 { // 2002 has 165 days: less than half
			x[i] = math.NaN()
		}
	}
	for _, tc := range []struct {
		c     Climate
		years int
		err   bool
	}{
		{Climate{MinYears: 2}, 2, false},
		{Climate{MinYears: 3}, 2, true},
		{Climate{}, 2, true},                                // default 5
		{Climate{MinYears: 3, YearFraction: 0.4}, 3, false}, // 165/365 = 0.45 of 2002
		{Climate{FirstYear: 2003, LastYear: 2003, MinYears: 1}, 1, false},
		{Climate{FirstYear: 1990, LastYear: 1995, MinYears: 1}, 0, true},
	} {
		cl, err := tc.c.Compute(x, start)
		if tc.err != (err != nil) || err != nil && !errors.Is(err, ErrShortReference) {
			t.Errorf("%+v: error %v, want error %v", tc.c, err, tc.err)
		}
		if err == nil && cl.Years != tc.years {
			t.Errorf("%+v: %d years, want %d", tc.c, cl.Years, tc.years)
		}
	}
	// A year with exactly YearFraction of its days counts: 183 of the 366
	// days of 2004 are half of them (by hand).
	leap := make([]float64, 366+365)
	for i := range leap {
		if i >= 183 && i < 366 {
			leap[i] = math.NaN()
		}
	}
	if cl, err := (Climate{MinYears: 2}).Compute(leap, calendar.New(2004, 1, 1)); err != nil || cl.Years != 2 {
		t.Errorf("half of 2004 present: %v, want 2 years", err)
	}
}

func TestClimatologyPartialYear(t *testing.T) {
	// Values from April to October only: the other days have no pool and
	// stay NaN; smoothing near the edges averages the days that exist.
	start := calendar.New(2001, 1, 1)
	n := int(calendar.New(2011, 1, 1) - start)
	x := make([]float64, n)
	for i := range x {
		d := start + calendar.Date(i)
		if _, m, _ := d.Civil(); m >= 4 && m <= 10 {
			x[i] = 10
		} else {
			x[i] = math.NaN()
		}
	}
	cl, err := Climate{}.Compute(x, start, 90)
	if err != nil {
		t.Fatal(err)
	}
	jan1, mar20, jun1 := 0, calendar.New(2001, 3, 20).DayOf366()-1, calendar.New(2001, 6, 1).DayOf366()-1
	if !math.IsNaN(cl.Mean[jan1]) || !math.IsNaN(cl.Pct[0][jan1]) {
		t.Errorf("1 January: %v %v, want NaN", cl.Mean[jan1], cl.Pct[0][jan1])
	}
	// 27 March pools 1 April: by hand, every pooled value is 10.
	for _, d := range []int{mar20 + 7, jun1} {
		if cl.Mean[d] != 10 || cl.Pct[0][d] != 10 {
			t.Errorf("day %d: %v %v, want 10", d+1, cl.Mean[d], cl.Pct[0][d])
		}
	}
}
