package sensitivity

import "runtime"

// Settings configures the analyses. The zero value of every field stands
// for the documented default, so the zero Settings is a sensible analysis.
type Settings struct {
	// One-at-a-time analysis (OneAtATime).

	// Deltas are the relative steps δ (> 0) of the one-at-a-time analysis:
	// each base weight w_i in turn becomes w_i(1−δ) and w_i(1+δ), clipped
	// to [0, 1]. nil means DefaultDeltas.
	Deltas []float64

	// Monte Carlo analysis (MonteCarlo).

	// Samples is the number of weight vectors drawn; 0 means 10000.
	Samples int
	// Sampling is the distribution of the weight vectors: Dirichlet (the
	// zero value), centred on the base weights, or UniformSimplex.
	Sampling Sampling
	// Concentration is c in the Dirichlet parameters α_j = c·w_j. Each
	// weight then has mean w_j and variance w_j(1−w_j)/(c+1): larger c
	// keeps the samples closer to the base weights. 0 means 50, which gives
	// a weight of 0.2 a standard deviation of 0.056, about ±28 % of its
	// value, the spread of a uniform ±50 % perturbation (0.5/√3 = 0.29),
	// as in the variance-based analysis.
	Concentration float64
	// Bounds, if not nil, holds one [Lo, Hi] interval per weight; weight
	// vectors outside the bounds are rejected and drawn again. nil means no
	// bounds.
	Bounds []Bound
	// TopN is the size of the top and bottom bands for P(top-N),
	// P(bottom-N) and the stability classes; 0 means a tenth of the
	// stations, rounded up.
	TopN int
	// KendallSamples is how many samples Kendall's tau-b is computed on:
	// every ⌈Samples/KendallSamples⌉-th sample from sample 0. 0 means 1000;
	// a negative value means every sample. Spearman's rho is computed on
	// every sample.
	KendallSamples int
	// MaxMemory bounds the bytes of the rank histograms (n² counters of 2
	// bytes, or 4 when Samples > 65535); 0 means 1 GiB.
	MaxMemory int64

	// Variance-based analysis (WeightIndices).

	// Spread is δ for the variance-based analysis: each raw weight is
	// uniform in [w_j(1−δ), w_j(1+δ)] and the weights are renormalised to
	// sum to 1 inside the model. It must be in (0, 1]; 0 means 0.5.
	Spread float64
	// BaseSamples is N, the number of rows in each of the two base sample
	// matrices; the model is run N(k+2) times. 0 means 4096.
	BaseSamples int
	// Bootstrap is the number of bootstrap replicates for the confidence
	// intervals; 0 means 1000 and a negative value means no intervals.
	Bootstrap int
	// Level is the confidence level of the intervals; 0 means 0.95.
	Level float64
	// StationIntervals asks for bootstrap intervals on every station's
	// composite as well as on the ranking-wide output. They cost
	// Bootstrap·N·(k+2) operations per station.
	StationIntervals bool

	// Seed fixes the random draws; the same Seed gives the same results
	// at any Workers or GOMAXPROCS.
	Seed uint64
	// Workers is the number of goroutines; 0 means runtime.GOMAXPROCS(0).
	Workers int
}

// DefaultDeltas are the one-at-a-time steps that nil Deltas stands for.
var DefaultDeltas = []float64{0.2, 0.5}

// Sampling selects the distribution of Monte Carlo weight vectors.
type Sampling uint8

const (
	// Dirichlet draws weights from the Dirichlet distribution with
	// α_j = c·w_j, centred on the base weights (mean w).
	Dirichlet Sampling = iota
	// UniformSimplex draws weights uniformly over the simplex of weights
	// that sum to 1 (the Dirichlet distribution with every α_j = 1).
	UniformSimplex
)

// String returns "dirichlet" or "uniform-simplex".
func (s Sampling) String() string {
	switch s {
	case Dirichlet:
		return "dirichlet"
	case UniformSimplex:
		return "uniform-simplex"
	}
	return "Sampling(?)"
}

// Bound is a closed interval for one weight (after the weights are scaled
// to sum to 1).
type Bound struct{ Lo, Hi float64 }

func (s Settings) samples() int {
	if s.Samples == 0 {
		return 10000
	}
	return s.Samples
}

func (s Settings) concentration() float64 {
	if s.Concentration == 0 {
		return 50
	}
	return s.Concentration
}

func (s Settings) topN(n int) int {
	if s.TopN == 0 {
		return max(1, (n+9)/10)
	}
	return min(s.TopN, n)
}

func (s Settings) kendallStride(samples int) int {
	k := s.KendallSamples
	if k == 0 {
		k = 1000
	}
	if k < 0 || k >= samples {
		return 1
	}
	return (samples + k - 1) / k
}

func (s Settings) maxMemory() int64 {
	if s.MaxMemory == 0 {
		return 1 << 30
	}
	return s.MaxMemory
}

func (s Settings) spread() float64 {
	if s.Spread == 0 {
		return 0.5
	}
	return s.Spread
}

func (s Settings) workers() int {
	return workers(s.Workers)
}

func workers(w int) int {
	if w <= 0 {
		return runtime.GOMAXPROCS(0)
	}
	return w
}
