package events

import (
	"math"
	"testing"
)

// TestRespond checks the response measures on hand-made departure series;
// every expected value is worked by hand from the definitions in Response.
func TestRespond(t *testing.T) {
	nan := math.NaN()
	rec := Recovery{Lag: 2, Run: 3, MaxGap: 3}
	for _, tc := range []struct {
		name             string
		a                []float64
		start, end, stop int // stop: the day the next disturbance starts, or len(a)
		harmful          int
		o                Recovery
		peak             float64
		timeToPeak       int
		mean, cum        float64
		observed         int
		recovered        bool
		recoveryDays     int
		censor           Censor
	}{
		{
			name: "recovered", a: []float64{0, 0, 2, 3, 4, 3, 2, 0.5, 0.5, 0.5, 0, 0},
			start: 2, end: 4, stop: 12, harmful: 1, o: rec,
			peak: 4, timeToPeak: 2, mean: 3, cum: 9, observed: 3,
			// Days 5 and 6 are out of band; the run 7–9 starts on day 7 = end + 3.
			recovered: true, recoveryDays: 3,
		},
		{
			name: "in band at once", a: []float64{0, 2, 0, 0, 0, 0},
			start: 1, end: 1, stop: 6, harmful: 1, o: rec,
			peak: 2, timeToPeak: 0, mean: 2, cum: 2, observed: 1,
			recovered: true, recoveryDays: 1,
		},
		{
			name: "peak after the end, within the lag", a: []float64{0, 1, 2, 3, 5, 6, 0, 0, 0},
			start: 1, end: 2, stop: 9, harmful: 1, o: Recovery{Lag: 3, Run: 3, MaxGap: 3},
			// The window is days 1 to 2 + 3.
			peak: 6, timeToPeak: 4, mean: 1.5, cum: 3, observed: 2,
			recovered: true, recoveryDays: 4, // days 3, 4, 5 out; run 6–8
		},
		{
			name: "decrease harmful", a: []float64{0, -1, 4, -3, -2, 0, 0, 0},
			start: 1, end: 3, stop: 8, harmful: -1, o: rec,
			// The +4 is a departure in the harmless direction.
			peak: -3, timeToPeak: 2, mean: 0, cum: 0, observed: 3,
			recovered: true, recoveryDays: 2, // day 4 out, run 5–7
		},
		{
			name: "next event first", a: []float64{0, 0, 2, 3, 4, 3, 2, 10, 0, 0, 0, 0},
			start: 2, end: 4, stop: 7, harmful: 1, o: rec,
			// The lag window 2–6 ends before day 7, so 10 is not the peak.
			peak: 4, timeToPeak: 2, mean: 3, cum: 9, observed: 3,
			recoveryDays: 2, censor: NextEvent,
		},
		{
			name: "next event before the run completes", a: []float64{0, 3, 0, 0, 5, 0, 0, 0},
			start: 1, end: 1, stop: 4, harmful: 1, o: rec,
			peak: 3, timeToPeak: 0, mean: 3, cum: 3, observed: 1,
			recoveryDays: 2, censor: NextEvent,
		},
		{
			name: "long gap", a: []float64{2, 2, 3, nan, nan, nan, nan, 0, 0, 0},
			start: 0, end: 1, stop: 10, harmful: 1, o: rec,
			peak: 3, timeToPeak: 2, mean: 2, cum: 4, observed: 2,
			recoveryDays: 1, censor: DataGap, // day 2 observed, then 4 missing days > 3
		},
		{
			name: "short gap breaks the run", a: []float64{2, 0, 0, nan, nan, nan, 0, 0, 0},
			start: 0, end: 0, stop: 9, harmful: 1, o: rec,
			peak: 2, timeToPeak: 0, mean: 2, cum: 2, observed: 1,
			recovered: true, recoveryDays: 6,
		},
		{
			name: "record ends", a: []float64{0, 0, 2, 3, 2, 2},
			start: 2, end: 3, stop: 6, harmful: 1, o: rec,
			peak: 3, timeToPeak: 1, mean: 2.5, cum: 5, observed: 2,
			recoveryDays: 2, censor: RecordEnd,
		},
		{
			name: "event ends the record", a: []float64{0, 0, 2},
			start: 2, end: 2, stop: 3, harmful: 1, o: rec,
			peak: 2, timeToPeak: 0, mean: 2, cum: 2, observed: 1,
			recoveryDays: 0, censor: RecordEnd,
		},
		{
			name: "no data in the event", a: []float64{0, nan, nan, nan, 0, 0, 0},
			start: 1, end: 2, stop: 7, harmful: 1, o: Recovery{Lag: 0, Run: 3, MaxGap: 3},
			peak: nan, timeToPeak: -1, mean: nan, cum: nan, observed: 0,
			recovered: true, recoveryDays: 2,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			win := Span{tc.start, min(tc.end+tc.o.Lag, tc.stop-1, len(tc.a)-1)}
			got := respond(tc.a, win, tc.end, tc.stop, nil, tc.harmful, 1, tc.o)
			if !close(got.PeakDeparture, tc.peak, 1e-12) || got.TimeToPeak != tc.timeToPeak {
				t.Errorf("peak %v after %d days, want %v after %d", got.PeakDeparture, got.TimeToPeak, tc.peak, tc.timeToPeak)
			}
			if !close(got.MeanDeparture, tc.mean, 1e-12) || !close(got.CumDeparture, tc.cum, 1e-12) || got.Observed != tc.observed {
				t.Errorf("mean %v cum %v over %d days, want %v %v over %d",
					got.MeanDeparture, got.CumDeparture, got.Observed, tc.mean, tc.cum, tc.observed)
			}
			if got.Recovered != tc.recovered || got.RecoveryDays != tc.recoveryDays || got.Censor != tc.censor {
				t.Errorf("recovered %v after %d days (%q), want %v %d (%q)",
					got.Recovered, got.RecoveryDays, got.Censor, tc.recovered, tc.recoveryDays, tc.censor)
			}
		})
	}
}
