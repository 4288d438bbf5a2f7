package index

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"rebound/config"
	"rebound/index/rankstat"
	"rebound/index/robust"
	"rebound/index/sensitivity"
)

// Spec is everything Score needs besides the raw values.
type Spec struct {
	Methods     []Method  // one per indicator
	Weights     []float64 // one per indicator, summing to 1
	Aggregation config.AggMethod
	// Floor keeps zeros out of the geometric product (see
	// config.Aggregation.Floor); 0 means sensitivity.DefaultFloor, as in
	// sensitivity.Composite, which computes the composites.
	Floor   float64
	Missing config.MissingPolicy
	// Groups assigns each station to a normalisation group; nil puts every
	// station in one group.
	Groups []string
	// MinEvents flags stations with fewer events.
	MinEvents int
}

// SpecFrom builds the Spec a configuration asks for. groups is nil for
// scope "all".
func SpecFrom(cfg *config.Config, w *Weights, groups []string) Spec {
	s := Spec{
		Weights:     w.W,
		Aggregation: cfg.Aggregation.Method,
		Floor:       cfg.Aggregation.Floor,
		Missing:     cfg.Missing.Policy,
		Groups:      groups,
		MinEvents:   cfg.Missing.MinEvents,
	}
	for j, ind := range cfg.Indicators {
		m := Method{Norm: cfg.NormMethod(j), Better: ind.Better, Tolerance: ind.Tolerance}
		if ind.Target != nil {
			m.Target = *ind.Target
		}
		s.Methods = append(s.Methods, m)
	}
	return s
}

// Bounded reports whether every normalised value lies in [0, 1], so that
// the composite has a fixed scale (no z-scores).
func (s Spec) Bounded() bool {
	return !slices.ContainsFunc(s.Methods, func(m Method) bool { return m.Norm == config.ZScore })
}

// Result is a scored and ranked set of stations. Slices are indexed like
// Raw.Stations.
type Result struct {
	Spec Spec
	// Normalized[i][j] is the normalised value used (after imputation);
	// NaN where the indicator is missing and its weight was redistributed.
	Normalized [][]float64
	Imputed    [][]bool
	// Contribution[i][j]: for arithmetic aggregation, the score points
	// indicator j adds at station i, w'_j·v_ij scaled like the score (with
	// z-scores the points sum to the score less a common offset); for
	// geometric aggregation, the factor u_ij^w'_j by which the indicator
	// multiplies the composite.
	Contribution [][]float64
	// Composite is the aggregate before scaling to 0–100, computed by
	// sensitivity.Composite (see Model).
	Composite []float64
	Score     []float64 // 0–100, higher = more resilient; NaN with no indicator
	// Rank ranks the composites with rankstat.Ranks: 1 = most resilient,
	// equal composites share the lower rank (1, 2, 2, 4), stations without
	// a score come last and share a rank. It is the base ranking of the
	// sensitivity analyses of Model.
	Rank []int
	// Order lists station indices from rank 1 down, ties by identifier.
	Order    []int
	Flags    [][]string
	Warnings []error
}

// Score normalises, aggregates and ranks the raw indicator values.
//
// Aggregation with weights w and the set P of indicators present at a
// station, w'_j = w_j / Σ_{k∈P} w_k:
//
//	arithmetic  C = Σ_{j∈P} w'_j v_j
//	geometric   C = Π_{j∈P} u_j^{w'_j},  u_j = floor + (1 − floor)·v_j
//
// The score is 100·C for arithmetic aggregation of bounded values,
// 100·(C − floor)/(1 − floor) for geometric aggregation (so both run from 0
// to 100), and, when any indicator is a z-score, the composite rescaled to
// 0–100 over the stations, 100·(C − min C)/(max C − min C). The composite
// C is sensitivity.Composite's, and the ranks are rankstat.Ranks of C, so
// that the ranking and the sensitivity analyses of Result.Model agree
// exactly; the listing order breaks ties by station identifier.
func Score(raw *Raw, spec Spec) (*Result, error) {
	n, k := len(raw.Stations), len(raw.Indicators)
	if len(spec.Methods) != k || len(spec.Weights) != k {
		panic("index: spec does not match the indicators")
	}
	res := &Result{
		Spec:         spec,
		Normalized:   matrix(n, k),
		Imputed:      make([][]bool, n),
		Contribution: matrix(n, k),
		Score:        make([]float64, n),
		Flags:        make([][]string, n),
	}
	for i := range n {
		res.Imputed[i] = make([]bool, k)
	}
	groups := groupIndex(spec.Groups, n)

	// Missing values.
	values := matrix(n, k)
	for i := range n {
		copy(values[i], raw.Values[i])
	}
	var missing []string
	for j, ind := range raw.Indicators {
		present := 0
		for i := range n {
			if !math.IsNaN(values[i][j]) {
				present++
			}
		}
		if present == 0 {
			return nil, fmt.Errorf("indicator %q has no value at any station (%s)", ind.Name, firstNote(raw, j))
		}
		for i := range n {
			if !math.IsNaN(values[i][j]) {
				continue
			}
			switch spec.Missing {
			case config.ErrorPolicy:
				missing = append(missing, fmt.Sprintf("station %s: %s: %s", raw.Stations[i], ind.Name, raw.Notes[i][j]))
			case config.Impute:
				// Medians of the observed values only, never of imputed ones.
				values[i][j] = groupMedian(raw.Values, j, groups[groupOf(spec.Groups, i)])
				if math.IsNaN(values[i][j]) {
					values[i][j] = groupMedian(raw.Values, j, allIndices(n))
				}
				res.Imputed[i][j] = true
				res.Flags[i] = append(res.Flags[i], "imputed:"+ind.Name)
			default:
				res.Flags[i] = append(res.Flags[i], "missing:"+ind.Name)
			}
		}
	}
	if len(missing) > 0 {
		return nil, fmt.Errorf("missing.policy = \"error\" and %d indicator values are missing:\n%s", len(missing), joinLines(missing))
	}

	// Normalisation, per indicator and group.
	col := make([]float64, 0, n)
	out := make([]float64, 0, n)
	for j, ind := range raw.Indicators {
		for _, g := range sortedKeys(groups) {
			members := groups[g]
			col, out = col[:0], out[:len(members)]
			for _, i := range members {
				col = append(col, values[i][j])
			}
			if _, ok := Normalize(out, col, spec.Methods[j]); !ok {
				where := ""
				if g != "" {
					where = fmt.Sprintf(" in group %q", g)
				}
				res.Warnings = append(res.Warnings, &Warning{Indicator: ind.Name,
					Msg: fmt.Sprintf("no spread%s (%d stations); it does not tell stations apart there", where, len(members))})
			}
			for m, i := range members {
				res.Normalized[i][j] = out[m]
			}
		}
	}

	// Aggregation: the composites, then each indicator's contribution.
	geo := spec.Aggregation == config.Geometric
	floor := spec.Floor
	if floor == 0 {
		floor = sensitivity.DefaultFloor
	}
	composite, err := res.Model().Composites()
	if err != nil {
		return nil, err
	}
	res.Composite = composite
	for i := range n {
		wsum := 0.0
		for j := range k {
			if !math.IsNaN(res.Normalized[i][j]) {
				wsum += spec.Weights[j]
			}
		}
		if !(wsum > 0) {
			for j := range k {
				res.Contribution[i][j] = math.NaN()
			}
			res.Flags[i] = append(res.Flags[i], "no_score")
			continue
		}
		for j := range k {
			v := res.Normalized[i][j]
			if math.IsNaN(v) {
				res.Contribution[i][j] = math.NaN()
				continue
			}
			w := spec.Weights[j] / wsum
			if geo {
				res.Contribution[i][j] = math.Pow(floor+(1-floor)*v, w)
			} else {
				res.Contribution[i][j] = w * v
			}
		}
	}

	// Scaling to 0–100.
	switch {
	case !spec.Bounded():
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, c := range res.Composite {
			if !math.IsNaN(c) {
				lo, hi = math.Min(lo, c), math.Max(hi, c)
			}
		}
		for i, c := range res.Composite {
			switch {
			case math.IsNaN(c):
				res.Score[i] = c
			case hi > lo:
				res.Score[i] = 100 * (c - lo) / (hi - lo)
			default:
				res.Score[i] = 50 // every station has the same composite
			}
			if !geo {
				for j := range k {
					if hi > lo {
						res.Contribution[i][j] *= 100 / (hi - lo)
					}
				}
			}
		}
	case geo:
		for i, c := range res.Composite {
			res.Score[i] = 100 * (c - floor) / (1 - floor)
		}
	default:
		for i, c := range res.Composite {
			res.Score[i] = 100 * c
			for j := range k {
				res.Contribution[i][j] *= 100
			}
		}
	}
	for i := range n {
		if !math.IsNaN(res.Score[i]) {
			res.Score[i] = math.Min(100, math.Max(0, res.Score[i])) // rounding only
		}
	}

	res.Rank, res.Order = rankComposites(res.Composite, raw.Stations)

	for i := range n {
		for j, ind := range raw.Indicators {
			if raw.Fallback[i][j] {
				res.Flags[i] = append(res.Flags[i], "km_rmst:"+ind.Name)
			}
		}
		if raw.Events[i] < spec.MinEvents && usesEvents(raw.Indicators) {
			res.Flags[i] = append(res.Flags[i], "few_events")
		}
		slices.Sort(res.Flags[i])
	}
	return res, nil
}

// Model returns the composite indicator of the result for the sensitivity
// analyses: the normalised values (NaN where a value is missing and its
// weight redistributed; imputed values as used), the weights and the
// aggregation. Its base ranking is res.Rank.
func (res *Result) Model() sensitivity.Model {
	k := len(res.Spec.Weights)
	m := sensitivity.Model{Values: make([]float64, 0, len(res.Normalized)*k), Weights: res.Spec.Weights}
	for _, row := range res.Normalized {
		m.Values = append(m.Values, row...)
	}
	if res.Spec.Aggregation == config.Geometric {
		m.Aggregation, m.Floor = sensitivity.Geometric, res.Spec.Floor
	}
	return m
}

// rankComposites ranks composites with rankstat.Ranks and lists the
// stations from rank 1 down, ties by identifier.
func rankComposites(composite []float64, id []string) (rank, order []int) {
	r := rankstat.Ranks(nil, composite)
	rank = make([]int, len(r))
	order = make([]int, len(r))
	for i, x := range r {
		rank[i], order[i] = int(x), i
	}
	slices.SortFunc(order, func(a, b int) int {
		return cmp.Or(cmp.Compare(rank[a], rank[b]), cmp.Compare(id[a], id[b]))
	})
	return rank, order
}

func usesEvents(inds []config.Indicator) bool {
	return slices.ContainsFunc(inds, func(in config.Indicator) bool { return in.Measure.FromEvents() })
}

func matrix(n, k int) [][]float64 {
	backing := make([]float64, n*k)
	m := make([][]float64, n)
	for i := range m {
		m[i] = backing[i*k : (i+1)*k : (i+1)*k]
	}
	return m
}

// groupIndex maps each group name to its station indices ("" holds every
// station when groups is nil).
func groupIndex(groups []string, n int) map[string][]int {
	out := map[string][]int{}
	for i := range n {
		out[groupOf(groups, i)] = append(out[groupOf(groups, i)], i)
	}
	return out
}

func groupOf(groups []string, i int) string {
	if groups == nil {
		return ""
	}
	return groups[i]
}

func allIndices(n int) []int {
	out := make([]int, n)
	for i := range out {
		out[i] = i
	}
	return out
}

func groupMedian(values [][]float64, j int, members []int) float64 {
	var x []float64
	for _, i := range members {
		if v := values[i][j]; !math.IsNaN(v) {
			x = append(x, v)
		}
	}
	return robust.Median(x)
}

func firstNote(raw *Raw, j int) string {
	for i := range raw.Stations {
		if raw.Notes[i][j] != "" {
			return "e.g. station " + raw.Stations[i] + ": " + raw.Notes[i][j]
		}
	}
	return "no values"
}

func joinLines(xs []string) string {
	out := ""
	for i, x := range xs {
		if i > 0 {
			out += "\n"
		}
		out += "  " + x
	}
	return out
}
