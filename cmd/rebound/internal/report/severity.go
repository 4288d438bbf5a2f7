package report

import (
	"fmt"
	"strings"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/index"
)

// SeverityKinds are the derived kinds, in the order reports list them.
var SeverityKinds = []string{"heatwave", "drought", "flood"}

// SeverityCounts returns station i's distinct events of kind by class, as
// "moderate/strong/severe/extreme" counts, with the unrated ones after a
// plus when there are any: "12/3/1/0" or "30/6/2/0 +2 unrated".
func SeverityCounts(r *pipeline.Run, i int, kind string) string {
	c := r.Raw.BySeverity[i][kind]
	s := fmt.Sprintf("%d/%d/%d/%d", c[1], c[2], c[3], c[4])
	if c[0] > 0 {
		s += fmt.Sprintf(" +%d unrated", c[0])
	}
	return s
}

// FloorText says which events indicator j counted: "strong or stronger
// heatwave events", or "every event".
func FloorText(r *pipeline.Run, j int) string {
	ind := r.Raw.Indicators[j]
	f := EffectiveFloor(r, j)
	what := "events"
	if len(ind.Kinds) > 0 {
		what = strings.Join(ind.Kinds, "/") + " events"
	}
	w := ""
	if ind.EventWeights == "severity" {
		w = ", each counted as many times as its class"
	}
	if f <= 1 {
		return "every " + strings.TrimSuffix(what, "s") + w
	}
	return index.SeverityNames[f] + " or stronger " + what + w
}
