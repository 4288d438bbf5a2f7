package events

import (
	"math"
	"slices"
	"testing"
)

// TestCensors is the censoring rule of every option, by definition.
func TestCensors(t *testing.T) {
	hw := &Event{Kind: HeatWaveKind, Severity: Moderate}
	for _, tc := range []struct {
		rule CensorRule
		next Event
		want bool
	}{
		{CensorAny, Event{Kind: FloodKind, Severity: Moderate}, true},
		{CensorSameKind, Event{Kind: FloodKind, Severity: Extreme}, false},
		{CensorSameKind, Event{Kind: HeatWaveKind, Severity: Moderate}, true},
		{CensorSevere, Event{Kind: HeatWaveKind, Severity: Moderate}, false},
		{CensorSevere, Event{Kind: FloodKind, Severity: Strong}, true},
		{CensorSameKindOrSevere, Event{Kind: FloodKind, Severity: Moderate}, false},
		{CensorSameKindOrSevere, Event{Kind: FloodKind, Severity: Strong}, true},
		{CensorSameKindOrSevere, Event{Kind: HeatWaveKind, Severity: Moderate}, true},
		{CensorSameKindOrSevere, Event{Kind: FloodKind, Severity: Unrated}, false},
		// A user event's severity is unknown: it censors under every rule.
		{CensorSameKind, Event{Kind: "spill"}, true},
		{CensorSevere, Event{Kind: "spill"}, true},
		{CensorSameKindOrSevere, Event{Kind: "spill"}, true},
	} {
		o := Recovery{CensorBy: tc.rule, CensorMinSeverity: Strong}
		if got := o.censors(hw, &tc.next); got != tc.want {
			t.Errorf("%s, next %s class %d: got %v, want %v", tc.rule, tc.next.Kind, tc.next.Severity, got, tc.want)
		}
	}
}

// TestCeded checks the overlap rule by hand: a heat wave (window days
// 10–30) and a drought that starts inside it (window 20–40). For water
// temperature, driven by heat waves, the heat wave keeps days 20–30 and
// the drought cedes them; for conductance, driven by droughts, the
// reverse; for a variable with no driver the later event (the drought)
// keeps them.
func TestCeded(t *testing.T) {
	evs := []Event{{Kind: HeatWaveKind}, {Kind: DroughtKind}}
	win := []Span{{10, 30}, {20, 40}}
	pairs := overlapping(evs, win)
	if !slices.Equal(pairs, [][2]int{{0, 1}}) {
		t.Fatalf("pairs %v, want [[0 1]]", pairs)
	}
	for _, tc := range []struct {
		driver     string
		heat, drou []Span
	}{
		{HeatWaveKind, nil, []Span{{20, 30}}},
		{DroughtKind, []Span{{20, 30}}, nil},
		{"", []Span{{20, 30}}, nil},
	} {
		if got := ceded(nil, 0, tc.driver, evs, win, pairs); !slices.Equal(got, tc.heat) {
			t.Errorf("driver %q: heat wave cedes %v, want %v", tc.driver, got, tc.heat)
		}
		if got := ceded(nil, 1, tc.driver, evs, win, pairs); !slices.Equal(got, tc.drou) {
			t.Errorf("driver %q: drought cedes %v, want %v", tc.driver, got, tc.drou)
		}
	}
	// Ceded spans are merged: a flood (window 25–35) also overlaps both.
	evs = append(evs, Event{Kind: FloodKind})
	win = append(win, Span{25, 35})
	pairs = overlapping(evs, win)
	if got, want := ceded(nil, 0, "", evs, win, pairs), []Span{{20, 30}}; !slices.Equal(got, want) {
		t.Errorf("heat wave cedes %v, want %v", got, want)
	}
}

// TestRespondSkip: days ceded to another event are left out of the peak
// search and counted, by hand.
func TestRespondSkip(t *testing.T) {
	a := []float64{0, 1, 5, 2, 0, 0, 0, 0, 0, 0}
	o := Recovery{Lag: 3, Run: 2, MaxGap: 1}
	r := respond(a, Span{0, 4}, 1, 10, []Span{{2, 2}}, +1, 0.5, o)
	if r.PeakDeparture != 2 || r.TimeToPeak != 3 || r.Shared != 1 {
		t.Errorf("peak %v at %d, %d shared; want 2 at 3, 1 shared", r.PeakDeparture, r.TimeToPeak, r.Shared)
	}
}

// TestClassOf: class limits are inclusive from below, by definition.
func TestClassOf(t *testing.T) {
	lim := [3]float64{2, 10, 50}
	for _, tc := range []struct {
		v    float64
		want int
	}{{1.5, Moderate}, {2, Strong}, {9.99, Strong}, {10, Severe}, {50, Extreme}, {math.Inf(1), Extreme}, {math.NaN(), Unrated}} {
		if got := classOf(tc.v, lim); got != tc.want {
			t.Errorf("classOf(%v) = %d, want %d", tc.v, got, tc.want)
		}
	}
}
