package sensitivity

import (
	"errors"

	"rebound/index/rankstat"
)

// Scenario is one alternative way of building the composite (for example
// one normalisation method × aggregation method × scope), given by the
// scores it gives the stations: higher is more resilient, NaN undefined.
type Scenario struct {
	Name   string
	Scores []float64
}

// StructuralResult compares the rankings of alternative scenarios.
type StructuralResult struct {
	Names []string
	// Ranks[i] holds the competition ranks under scenario i.
	Ranks [][]int32
	// Min[s] and Max[s] are the best and worst rank of station s over all
	// scenarios.
	Min, Max []int32
	// Spearman[i] and MeanShift[i] compare scenario i with scenario 0, the
	// reference: Spearman's rho of the two rank vectors (stations with
	// undefined scores form one tie group at the bottom) and the mean
	// absolute rank change over stations.
	Spearman  []float64
	MeanShift []float64
}

// Structural ranks the stations under each scenario and reports each
// station's rank range (Nardo et al. 2008, uncertainty in the choice of
// normalisation, weighting and aggregation). Scenario 0 is the reference.
// Structural panics if the scenarios score different numbers of stations.
func Structural(scenarios []Scenario) (*StructuralResult, error) {
	if len(scenarios) == 0 {
		return nil, errors.New("sensitivity: no scenarios")
	}
	n := len(scenarios[0].Scores)
	if n == 0 {
		return nil, errNoStations
	}
	res := &StructuralResult{Min: make([]int32, n), Max: make([]int32, n)}
	var ranker rankstat.Ranker
	ref := make([]float64, n)
	alt := make([]float64, n)
	for i, sc := range scenarios {
		if len(sc.Scores) != n {
			panic("sensitivity: scenarios of different lengths")
		}
		r := ranker.Ranks(nil, sc.Scores)
		res.Names = append(res.Names, sc.Name)
		res.Ranks = append(res.Ranks, r)
		var sum int64
		for st, x := range r {
			if i == 0 {
				res.Min[st], res.Max[st] = x, x
				ref[st] = float64(x)
			}
			res.Min[st] = min(res.Min[st], x)
			res.Max[st] = max(res.Max[st], x)
			alt[st] = float64(x)
			sum += int64(abs32(x - res.Ranks[0][st]))
		}
		res.Spearman = append(res.Spearman, rankstat.Spearman(ref, alt))
		res.MeanShift = append(res.MeanShift, float64(sum)/float64(n))
	}
	return res, nil
}
