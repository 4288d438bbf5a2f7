package charts

import (
	"fmt"
	"math"
	"testing"
)

func scores(n int, intervals bool) []Score {
	out := make([]Score, n)
	for i := range out {
		out[i] = Score{Label: fmt.Sprintf("S-%02d Station number %d on the river", i+1, i+1), Score: 95 - 80*float64(i)/float64(max(n-1, 1)), Rank: i + 1}
		if intervals {
			out[i].Low, out[i].High = max(1, i-2), min(n, i+4)
		}
	}
	return out
}

func TestScores(t *testing.T) {
	for _, tc := range []struct {
		name       string
		stations   []Score
		minH, maxH float64
	}{
		{"scores_32", scores(32, false), 6.5, 7.5},
		{"scores_32_intervals", scores(32, true), 6.5, 8},
		{"scores_2", scores(2, true), 1.5, 2.5},
		{"scores_1", scores(1, false), 0.5, 1.5},
		{"scores_500", scores(500, true), 8.5, 9.5},
		{"scores_nan", append(scores(3, false), Score{Label: "X no score", Score: math.NaN(), Rank: 4}), 0.5, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			data, err := Scores(tc.stations, "5th–95th percentile")
			if err != nil {
				t.Fatal(err)
			}
			check(t, tc.name, data, tc.minH, tc.maxH)
		})
	}
	if _, err := Scores(nil, ""); err != ErrNoData {
		t.Errorf("no stations: %v, want ErrNoData", err)
	}
}
