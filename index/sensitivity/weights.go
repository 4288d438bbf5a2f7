package sensitivity

import (
	"fmt"
	"math/rand/v2"

	"gonum.org/v1/gonum/stat/distuv"
)

// weightSampler draws weight vectors from a Dirichlet distribution, by
// normalising independent gamma variates (Marsaglia & Tsang 2000, as
// implemented by gonum's distuv.Gamma, which switches to Liu, Martin &
// Syring 2017 below shape 0.2), rejecting vectors outside the bounds.
type weightSampler struct {
	alpha  []float64 // Dirichlet parameters; 0 keeps a weight at 0
	bounds []Bound
}

// maxTries bounds the draws for one accepted weight vector.
const maxTries = 100_000

// Feasibility pilot: this many draws must give at least pilotAccept
// vectors within the bounds.
const (
	pilotDraws  = 1000
	pilotAccept = 10
)

func newWeightSampler(w []float64, s Settings) (*weightSampler, error) {
	ws := &weightSampler{alpha: make([]float64, len(w))}
	switch s.Sampling {
	case Dirichlet:
		c := s.concentration()
		if !(c > 0) || c > 1e300 {
			return nil, fmt.Errorf("sensitivity: Dirichlet concentration %g; want a finite value > 0", c)
		}
		for j, x := range w {
			ws.alpha[j] = c * x
		}
	case UniformSimplex:
		for j, x := range w {
			if x > 0 {
				ws.alpha[j] = 1
			}
		}
	default:
		return nil, fmt.Errorf("sensitivity: unknown sampling %v", s.Sampling)
	}
	if s.Bounds == nil {
		return ws, nil
	}
	if len(s.Bounds) != len(w) {
		return nil, fmt.Errorf("sensitivity: %d weight bounds for %d weights", len(s.Bounds), len(w))
	}
	var lo, hi float64
	for j, b := range s.Bounds {
		if !(0 <= b.Lo && b.Lo <= b.Hi && b.Hi <= 1) {
			return nil, fmt.Errorf("sensitivity: bounds of weight %d are [%g, %g]; want 0 <= lo <= hi <= 1", j, b.Lo, b.Hi)
		}
		if w[j] == 0 && b.Lo > 0 {
			return nil, fmt.Errorf("sensitivity: weight %d has base weight 0, which stays 0, but its lower bound is %g", j, b.Lo)
		}
		lo += b.Lo
		hi += b.Hi
	}
	if lo > 1 || hi < 1 {
		return nil, fmt.Errorf("sensitivity: no weights within the bounds sum to 1 (lower bounds sum to %g, upper bounds to %g)", lo, hi)
	}
	ws.bounds = s.Bounds

	// Pilot run on a stream of its own.
	dst := make([]float64, len(w))
	src := rand.NewPCG(s.Seed, pilotStream)
	accepted := 0
	for range pilotDraws {
		if ws.gammas(dst, src) && ws.inBounds(dst) {
			accepted++
		}
	}
	if accepted < pilotAccept {
		return nil, fmt.Errorf("sensitivity: only %d of %d trial weight vectors fall within the bounds (need %d); widen the bounds, or sample closer to the base weights with a larger concentration",
			accepted, pilotDraws, pilotAccept)
	}
	return ws, nil
}

// Random streams: Monte Carlo sample i draws from rand.NewPCG(Seed, i);
// the other streams use second seed words at and above 1<<62.
const (
	pilotStream     = 1 << 62
	sobolStream     = 2 << 62
	bootstrapStream = 3 << 62
)

// draw sets dst to one weight vector from src, redrawing until it falls
// within the bounds. It returns false after maxTries rejected draws.
func (ws *weightSampler) draw(dst []float64, src rand.Source) bool {
	for range maxTries {
		if ws.gammas(dst, src) && ws.inBounds(dst) {
			return true
		}
	}
	return false
}

// gammas sets dst to normalised gamma variates, a Dirichlet draw. It
// returns false when every variate underflowed to 0.
func (ws *weightSampler) gammas(dst []float64, src rand.Source) bool {
	var sum float64
	for j, a := range ws.alpha {
		dst[j] = 0
		if a > 0 {
			dst[j] = distuv.Gamma{Alpha: a, Beta: 1, Src: src}.Rand()
		}
		sum += dst[j]
	}
	if !(sum > 0) {
		return false
	}
	for j := range dst {
		dst[j] /= sum
	}
	return true
}

func (ws *weightSampler) inBounds(w []float64) bool {
	for j, b := range ws.bounds {
		if w[j] < b.Lo || w[j] > b.Hi {
			return false
		}
	}
	return true
}
