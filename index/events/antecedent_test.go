package events

import (
	"math"
	"testing"
)

func TestDrynessFractionWithGaps(t *testing.T) {
	// By hand, a 10-day window before day 15: days 5 and 6 have no flow
	// and days 8 to 11 lie in a drought. The fraction is over the window's
	// days, 4/10, not over the 8 days with a flow. Coverage 8/10 meets
	// 0.8; with one more missing day it does not, and a window that would
	// start before the record has no value either.
	nan := math.NaN()
	q := filled(20, 10)
	q[5], q[6] = nan, nan
	buf := [][]float64{make([]float64, 21), make([]float64, 21), make([]float64, 21)}
	o := Antecedent{Measure: Fraction, Days: 10, MinCoverage: 0.8}
	dry := dryness(buf, o, q, filled(20, 10), []Drought{{Span: Span{8, 11}}}, true)
	if got := dry(15); got != 0.4 {
		t.Errorf("dryness before day 15: %v, want 0.4", got)
	}
	if got := dry(9); !math.IsNaN(got) {
		t.Errorf("window before the record: %v, want NaN", got)
	}
	q[7] = nan
	dry = dryness(buf, o, q, filled(20, 10), []Drought{{Span: Span{8, 11}}}, true)
	if got := dry(15); !math.IsNaN(got) {
		t.Errorf("7 of 10 days with a flow: %v, want NaN", got)
	}
}
