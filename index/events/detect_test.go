package events

import (
	"math"
	"slices"
	"testing"
)

func filled(n int, v float64) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = v
	}
	return x
}

// TestHeatWavesTiny is the tiny case with a given climatology (15 °C) and
// threshold (18 °C) on heatwave_tiny.csv: runs above 18 are days 5–9,
// 12–16, 20–23, 27 and 29–32 (day 28 is exactly 18.0, not above); with a
// 5-day minimum and a 2-day gap only 5–9 and 12–16 survive and are joined.
// Hand working and a numpy 1.24.2 script of the Hobday et al. (2016)
// detection rule agree. Days are 1-based here and indices 0-based. The
// category of Hobday et al. (2018) is the floor of the largest ratio of the
// departure to the threshold's (3 °C here), by hand: a 6 °C peak is
// ratio 2, "strong" (category II); the others are below 2, "moderate".
func TestHeatWavesTiny(t *testing.T) {
	x := readCSV(t, "testdata/heatwave_tiny.csv", 1)
	seas, thresh := filled(len(x), 15), filled(len(x), 18)
	for _, tc := range []struct {
		name           string
		minDur, maxGap int
		want           []HeatWave
	}{
		{
			name: "min 5 gap 2", minDur: 5, maxGap: 2,
			want: []HeatWave{{Span: Span{4, 15}, Peak: 13, MaxIntensity: 6, MeanIntensity: 3.9333333333, CumIntensity: 47.2, MaxRatio: 2, Category: 2}},
		},
		{
			// By hand: 20–23 and 29–32 (4 days) now qualify; 29–32 is 6 days
			// after 23, too far to join; day 27 (1 day) never qualifies, so
			// "join first" would have made 27–32 one event.
			name: "min 4 gap 2", minDur: 4, maxGap: 2,
			want: []HeatWave{
				{Span: Span{4, 15}, Peak: 13, MaxIntensity: 6, MeanIntensity: 3.9333333333, CumIntensity: 47.2, MaxRatio: 2, Category: 2},
				{Span: Span{19, 22}, Peak: 21, MaxIntensity: 4.5, MeanIntensity: 3.95, CumIntensity: 15.8, MaxRatio: 1.5, Category: 1},
				{Span: Span{28, 31}, Peak: 29, MaxIntensity: 4.4, MeanIntensity: 3.825, CumIntensity: 15.3, MaxRatio: 4.4 / 3, Category: 1},
			},
		},
		{
			// By hand: no joining across the 2-day gap.
			name: "min 5 gap 1", minDur: 5, maxGap: 1,
			want: []HeatWave{
				{Span: Span{4, 8}, Peak: 6, MaxIntensity: 5.5, MeanIntensity: 4.14, CumIntensity: 20.7, MaxRatio: 5.5 / 3, Category: 1},
				{Span: Span{11, 15}, Peak: 13, MaxIntensity: 6, MeanIntensity: 4.4, CumIntensity: 22, MaxRatio: 2, Category: 2},
			},
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := HeatWaves(x, seas, thresh, tc.minDur, tc.maxGap)
			if len(got) != len(tc.want) {
				t.Fatalf("got %+v, want %+v", got, tc.want)
			}
			for i, g := range got {
				w := tc.want[i]
				if g.Span != w.Span || g.Peak != w.Peak || !close(g.MaxIntensity, w.MaxIntensity, 1e-9) ||
					!close(g.MeanIntensity, w.MeanIntensity, 1e-9) || !close(g.CumIntensity, w.CumIntensity, 1e-9) ||
					!close(g.MaxRatio, w.MaxRatio, 1e-9) || g.Category != w.Category {
					t.Errorf("event %d: got %+v, want %+v", i, g, w)
				}
			}
		})
	}
}

// TestDroughtsLowflow40 is the threshold-level case of lowflow40.csv with a
// fixed threshold of 10 m³/s, t_c = 2 days and a 3-day minimum: runs 6–10
// and 13–17 pool into 6–17 (deficit 23.5 m³/s·d = 2,030,400 m³, minimum
// 5.0 on day 16), 23–24 is too short, 31–36 stays (deficit 16.0, minimum
// 6.0 on day 33). Hand working and a numpy 1.24.2 script agree.
func TestDroughtsLowflow40(t *testing.T) {
	q := readCSV(t, "testdata/lowflow40.csv", 1)
	thr := filled(len(q), 10)
	for _, tc := range []struct {
		name   string
		pool   int
		minDur int
		frac   float64
		ratio  float64
		want   []Drought
	}{
		{"reference", 2, 3, 0, 0, []Drought{
			{Span: Span{5, 16}, Deficit: 23.5, Min: 15, MinFlow: 5},
			{Span: Span{30, 35}, Deficit: 16, Min: 32, MinFlow: 6},
		}},
		// By hand: without pooling, 6–10 (9.0) and 13–17 (14.5) stay apart.
		// The IC volume criterion, from the same numbers: the flow above the
		// threshold in the gap (days 11–12) is 1.5 m³/s·d and the deficit
		// of the run before is 9.0, a ratio of 1/6. With p_c = 0.1 the
		// runs stay apart, as without pooling; with p_c = 0.2 they pool.
		{"IC ratio 0.1", 2, 3, 0, 0.1, []Drought{
			{Span: Span{5, 9}, Deficit: 9, Min: 7, MinFlow: 7},
			{Span: Span{12, 16}, Deficit: 14.5, Min: 15, MinFlow: 5},
			{Span: Span{30, 35}, Deficit: 16, Min: 32, MinFlow: 6},
		}},
		{"IC ratio 0.2", 2, 3, 0, 0.2, []Drought{
			{Span: Span{5, 16}, Deficit: 23.5, Min: 15, MinFlow: 5},
			{Span: Span{30, 35}, Deficit: 16, Min: 32, MinFlow: 6},
		}},
		{"no pooling", 0, 3, 0, 0, []Drought{
			{Span: Span{5, 9}, Deficit: 9, Min: 7, MinFlow: 7},
			{Span: Span{12, 16}, Deficit: 14.5, Min: 15, MinFlow: 5},
			{Span: Span{30, 35}, Deficit: 16, Min: 32, MinFlow: 6},
		}},
		// By hand: 23–24 (deficit 1.5) kept with a 2-day minimum, then
		// removed as minor: 1.5 < 0.1 × 23.5.
		{"minor by deficit", 2, 2, 0.1, 0, []Drought{
			{Span: Span{5, 16}, Deficit: 23.5, Min: 15, MinFlow: 5},
			{Span: Span{30, 35}, Deficit: 16, Min: 32, MinFlow: 6},
		}},
		{"minor by deficit kept", 2, 2, 0.05, 0, []Drought{
			{Span: Span{5, 16}, Deficit: 23.5, Min: 15, MinFlow: 5},
			{Span: Span{22, 23}, Deficit: 1.5, Min: 22, MinFlow: 9},
			{Span: Span{30, 35}, Deficit: 16, Min: 32, MinFlow: 6},
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := Droughts(q, thr, DroughtCriteria{Pool: tc.pool, PoolRatio: tc.ratio, MinDuration: tc.minDur, MinDeficitFraction: tc.frac})
			if !slices.EqualFunc(got, tc.want, func(a, b Drought) bool {
				return a.Span == b.Span && a.Min == b.Min && a.MinFlow == b.MinFlow && close(a.Deficit, b.Deficit, 1e-12)
			}) {
				t.Errorf("got %+v, want %+v", got, tc.want)
			}
		})
	}
	// By hand: deficits 12 (three days at 6) and 6 (three days at 8)
	// below 10; with minFrac 0.5 the second is exactly half the largest,
	// which is not below it, so it stays.
	q2 := []float64{6, 6, 6, 10, 10, 10, 10, 10, 8, 8, 8}
	want2 := []Drought{{Span: Span{0, 2}, Deficit: 12, Min: 0, MinFlow: 6}, {Span: Span{8, 10}, Deficit: 6, Min: 8, MinFlow: 8}}
	if got := Droughts(q2, filled(len(q2), 10), DroughtCriteria{MinDuration: 3, MinDeficitFraction: 0.5}); !slices.Equal(got, want2) {
		t.Errorf("deficit equal to the fraction: got %+v, want %+v", got, want2)
	}
	// 23.5 m³/s·d is 2,030,400 m³ (× 86 400 s).
	if v := Droughts(q, thr, DroughtCriteria{Pool: 2, MinDuration: 3})[0].Deficit * 86400; !close(v, 2030400, 1e-9) {
		t.Errorf("deficit volume %v m³, want 2030400", v)
	}
}

func TestFloods(t *testing.T) {
	nan := math.NaN()
	// Hand-made hydrographs against a threshold of 10; sep 7 days, trough 0.75.
	for _, tc := range []struct {
		name string
		q    []float64
		want []Flood
	}{
		{"one run", []float64{5, 12, 20, 15, 5}, []Flood{{Span{1, 3}, 2, 20}}},
		{"peaks 3 days apart", []float64{5, 30, 5, 5, 25, 5}, []Flood{{Span{1, 4}, 1, 30}}},
		{"peaks 8 days apart, deep trough", []float64{5, 30, 5, 5, 5, 5, 5, 5, 5, 25, 5},
			[]Flood{{Span{1, 1}, 1, 30}, {Span{9, 9}, 9, 25}}},
		// The flow between stays at 10 ≥ 0.75 × 12 = 9: one event.
		{"peaks 8 days apart, shallow trough", []float64{5, 12, 10, 10, 10, 10, 10, 10, 10, 13, 5},
			[]Flood{{Span{1, 9}, 9, 13}}},
		// The flow between drops to 10, below 0.75 × 30 but not below
		// 0.75 × 12 = 9, the smaller peak's trough: one event.
		{"trough below the larger peak only", []float64{5, 30, 10, 10, 10, 10, 10, 10, 10, 12, 5},
			[]Flood{{Span{1, 9}, 1, 30}}},
		{"missing days between", []float64{5, 30, nan, nan, nan, nan, nan, nan, nan, 25, 5},
			[]Flood{{Span{1, 1}, 1, 30}, {Span{9, 9}, 9, 25}}},
		{"none", []float64{5, 10, nan}, nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := Floods(tc.q, filled(len(tc.q), 10), 7, 0.75)
			if !slices.Equal(got, tc.want) {
				t.Errorf("got %+v, want %+v", got, tc.want)
			}
		})
	}
}

func TestRuns(t *testing.T) {
	nan := math.NaN()
	x := []float64{1, 3, 3, nan, 3, 2, 1, 0, 0}
	thr := []float64{2, 2, 2, 2, 2, 2, nan, 1, 1}
	if got, want := Runs(nil, x, thr, +1), []Span{{1, 2}, {4, 4}}; !slices.Equal(got, want) {
		t.Errorf("above: got %v, want %v", got, want)
	}
	if got, want := Runs(nil, x, thr, -1), []Span{{0, 0}, {7, 8}}; !slices.Equal(got, want) {
		t.Errorf("below: got %v, want %v", got, want)
	}
}
