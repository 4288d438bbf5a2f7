package charts

import (
	"math"
	"testing"

	"rebound/index/calendar"
)

func window(days int, recovered bool) Window {
	first := calendar.New(2023, 6, 8)
	w := Window{Station: "LOW-04 Lowmere at Barley Hithe", Variable: "water temperature", Units: "°C",
		Event: "heat wave HW-2023-07-08", First: first, Tolerance: 0.9,
		Start: calendar.New(2023, 7, 8), End: calendar.New(2023, 7, 23), Recovered: recovered, RecoveryDays: 19}
	for i := range days {
		d := first + calendar.Date(i)
		normal := 17 + 4*math.Sin(2*math.Pi*float64(d.DayOfYear()-110)/365)
		dep := 0.0
		switch {
		case d >= w.Start && d <= w.End:
			dep = 3.5 * math.Sin(math.Pi*float64(d-w.Start)/float64(w.End-w.Start+1))
		case d > w.End:
			dep = 1.5 * math.Exp(-float64(d-w.End)/8)
		}
		obs := normal + dep + 0.3*math.Sin(float64(i))
		if i > 60 && i < 64 {
			obs = math.NaN() // a gap
		}
		w.Observed = append(w.Observed, obs)
		w.Normal = append(w.Normal, normal)
	}
	return w
}

func TestDeparture(t *testing.T) {
	for _, tc := range []struct {
		name string
		w    Window
	}{
		{"departure_recovered", window(120, true)},
		{"departure_open", window(300, false)},
		{"departure_short", window(12, false)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			data, err := Departure(tc.w)
			if err != nil {
				t.Fatal(err)
			}
			check(t, tc.name, data, 3.6, 4.2)
		})
	}
	if _, err := Departure(Window{}); err != ErrNoData {
		t.Errorf("empty window: %v", err)
	}
	allNaN := window(5, false)
	for i := range allNaN.Observed {
		allNaN.Observed[i], allNaN.Normal[i] = math.NaN(), math.NaN()
	}
	if _, err := Departure(allNaN); err != ErrNoData {
		t.Errorf("all missing: %v", err)
	}
}
