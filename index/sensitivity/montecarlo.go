package sensitivity

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sync"

	"gonum.org/v1/gonum/stat"

	"rebound/index/rankstat"
)

// MonteCarloResult is the distribution of every station's rank over random
// weight vectors.
type MonteCarloResult struct {
	Samples int // weight vectors drawn
	TopN    int // size of the top and bottom bands
	// Stations holds each station's rank statistics, in station order.
	Stations []StationRanks
	// Spearman and Kendall summarise, over the samples, the agreement of
	// each sample's ranking with the base ranking: Spearman's rho on every
	// sample, Kendall's tau-b on every KendallStride-th sample.
	Spearman, Kendall Agreement
	KendallStride     int
	// SpearmanSamples[i] is Spearman's rho of sample i, and
	// KendallSamples[j] is Kendall's tau-b of sample j·KendallStride.
	SpearmanSamples, KendallSamples []float64
}

// StationRanks is one station's rank over the Monte Carlo samples. Ranks
// are competition ranks, 1 = most resilient. The percentiles are ranks
// observed in the samples: the p-th percentile is the smallest rank r such
// that at least ⌈p·Samples/100⌉ samples rank the station r or better (the
// inverse of the empirical distribution function, Hyndman & Fan 1996
// type 1; numpy's method "inverted_cdf").
type StationRanks struct {
	Base   int32 // rank under the base weights
	Median int32 // 50th percentile
	Low    int32 // 5th percentile: the better end of the 90 % interval
	High   int32 // 95th percentile: the worse end
	Best   int32 // best rank in any sample
	Worst  int32 // worst rank in any sample
	// Mean is the mean rank.
	Mean float64
	// Top is the fraction of samples that rank the station TopN or better
	// (a station tied at rank TopN counts), and Bottom the fraction that
	// rank it below n−TopN, n the number of stations with a score.
	Top, Bottom float64
	Stability   Stability
}

// Stability classifies a station's rank over the samples. With n stations
// that have a score,
// N = TopN and the 5th–95th percentile interval [Low, High], the first rule
// that holds decides:
//
//	Unranked       the base composite is undefined (NaN)
//	RobustTop      High ≤ N: at least 95 % of samples rank it in the top N
//	RobustBottom   Low > n−N: at least 95 % rank it in the bottom N
//	Stable         High − Low ≤ N: the interval spans at most N ranks
//	WeightDependent otherwise: the interval spans more than N ranks
type Stability uint8

const (
	WeightDependent Stability = iota
	Stable
	RobustTop
	RobustBottom
	Unranked
)

// String returns "weight-dependent", "stable", "robust-top",
// "robust-bottom" or "unranked".
func (s Stability) String() string {
	switch s {
	case WeightDependent:
		return "weight-dependent"
	case Stable:
		return "stable"
	case RobustTop:
		return "robust-top"
	case RobustBottom:
		return "robust-bottom"
	case Unranked:
		return "unranked"
	}
	return fmt.Sprintf("Stability(%d)", uint8(s))
}

// Agreement summarises a rank correlation over samples. P05 is the 5th
// percentile (type 1, as for StationRanks). All three are NaN if the
// correlation is undefined in any sample (fewer than two ranked stations).
type Agreement struct {
	Mean, Min, P05 float64
}

// MonteCarlo ranks the stations under s.Samples random weight vectors
// (Saltelli et al. 2008; Nardo et al. 2008, uncertainty analysis) and
// reports each station's rank distribution and the agreement of each
// sample's ranking with the base ranking.
//
// A weight whose base value is 0 stays 0 in every sample. Sample i draws
// from rand.NewPCG(s.Seed, i), so results do not depend on
// s.Workers or GOMAXPROCS. The rank distributions are streamed into
// per-station rank histograms of n² counters (2 bytes each, 200 MB at
// 10,000 stations), filled from blocks of about 32 MiB of ranks, so memory
// does not grow with the number of samples; only the per-sample
// correlations take 8 bytes a sample. Spearman and Kendall are computed
// over the stations with a defined base composite. At most 65535 stations
// can be ranked.
func MonteCarlo(m Model, s Settings) (*MonteCarloResult, error) {
	p, err := m.prepare()
	if err != nil {
		return nil, err
	}
	samples := s.samples()
	if samples < 1 {
		return nil, fmt.Errorf("sensitivity: %d Monte Carlo samples; want at least 1", samples)
	}
	if s.TopN < 0 {
		return nil, fmt.Errorf("sensitivity: top and bottom bands of %d stations; want at least 1", s.TopN)
	}
	ws, err := newWeightSampler(p.w, s)
	if err != nil {
		return nil, err
	}
	if p.n > math.MaxUint16 {
		// Ranks are stored in 2 bytes; the histograms alone would take
		// more than 8 GiB.
		return nil, fmt.Errorf("sensitivity: %d stations; the Monte Carlo analysis ranks at most %d", p.n, math.MaxUint16)
	}
	counter := int64(2)
	if samples > math.MaxUint16 {
		counter = 4
	}
	if need := counter * int64(p.n) * int64(p.n); need > s.maxMemory() {
		return nil, fmt.Errorf("sensitivity: %d stations need %s of rank histograms, more than the %s allowed (MaxMemory)",
			p.n, byteSize(need), byteSize(s.maxMemory()))
	}
	if counter == 2 {
		return monteCarlo[uint16](p, ws, s, samples)
	}
	return monteCarlo[uint32](p, ws, s, samples)
}

// blockSamples returns how many samples are ranked between histogram
// updates: each update brings every station's counters in from memory, so
// the blocks are as long as about 32 MiB of 2-byte ranks allows (at least
// 64, at most 8192 samples).
func blockSamples(n int) int {
	return min(max((32<<20)/(2*n), 64), 8192)
}

func monteCarlo[C uint16 | uint32](p *prepared, ws *weightSampler, s Settings, samples int) (*MonteCarloResult, error) {
	n := p.n
	res := &MonteCarloResult{
		Samples:         samples,
		TopN:            s.topN(n),
		KendallStride:   s.kendallStride(samples),
		SpearmanSamples: make([]float64, samples),
	}
	res.KendallSamples = make([]float64, (samples+res.KendallStride-1)/res.KendallStride)
	shared := newAgreementBase(p)

	nw := min(s.workers(), samples)
	workers := make([]*mcWorker, nw)
	for i := range workers {
		workers[i] = &mcWorker{
			p: p, ws: ws, base: shared, seed: s.Seed, stride: res.KendallStride, res: res,
			w:      make([]float64, p.k),
			scores: make([]float64, n),
			ranks:  make([]int32, n),
		}
	}
	hist := make([]C, n*n)
	block := min(blockSamples(n), samples)
	ranks := make([]uint16, block*n)
	for b0 := 0; b0 < samples; b0 += block {
		b1 := min(b0+block, samples)
		// Rank the block's samples, interleaved over the workers.
		var wg sync.WaitGroup
		for wi, w := range workers {
			wg.Go(func() {
				for i := b0 + wi; i < b1; i += nw {
					if w.err == nil {
						w.sample(i, ranks[(i-b0)*n:(i-b0+1)*n])
					}
				}
			})
		}
		wg.Wait()
		if err := firstError(workers); err != nil {
			return nil, err
		}
		// Count the ranks, each worker a range of stations. The cost is
		// in bringing each station's counters in from memory, once per
		// block.
		for wi := range nw {
			wg.Go(func() {
				for st := wi * n / nw; st < (wi+1)*n/nw; st++ {
					row := hist[st*n : st*n+n]
					for b := range b1 - b0 {
						row[ranks[b*n+st]-1]++
					}
				}
			})
		}
		wg.Wait()
	}

	// The bottom band counts from the last station with a score: stations
	// without one rank after every scored station in every sample.
	ranked := 0
	for _, ok := range p.baseFinite {
		if ok {
			ranked++
		}
	}
	res.Stations = make([]StationRanks, n)
	var wg sync.WaitGroup
	for wi := range nw {
		wg.Go(func() {
			for st := wi * n / nw; st < (wi+1)*n/nw; st++ {
				res.Stations[st] = summarize(hist[st*n:st*n+n], samples, res.TopN, ranked, p.baseRanks[st], p.baseFinite[st])
			}
		})
	}
	wg.Wait()
	res.Spearman = summarizeAgreement(res.SpearmanSamples)
	res.Kendall = summarizeAgreement(res.KendallSamples)
	return res, nil
}

func firstError(workers []*mcWorker) error {
	var err error
	first := -1
	for _, w := range workers {
		if w.err != nil && (first < 0 || w.errSample < first) {
			err, first = w.err, w.errSample
		}
	}
	return err
}

// summarize reads one station's rank histogram (count[r−1] samples at
// rank r). ranked is the number of stations with a score, which the bottom
// band counts back from.
func summarize[C uint16 | uint32](count []C, samples, topN, ranked int, base int32, defined bool) StationRanks {
	n := ranked
	sr := StationRanks{Base: base}
	n05, n50, n95 := percentileCount(5, samples), percentileCount(50, samples), percentileCount(95, samples)
	var cum, top, bottom int
	var sum float64
	for i, c := range count {
		if c == 0 {
			continue
		}
		r := int32(i + 1)
		if sr.Best == 0 {
			sr.Best = r
		}
		sr.Worst = r
		prev := cum
		cum += int(c)
		sum += float64(r) * float64(c)
		if prev < n05 && cum >= n05 {
			sr.Low = r
		}
		if prev < n50 && cum >= n50 {
			sr.Median = r
		}
		if prev < n95 && cum >= n95 {
			sr.High = r
		}
		if i < topN {
			top += int(c)
		}
		if i >= n-topN {
			bottom += int(c)
		}
	}
	sr.Mean = sum / float64(samples)
	sr.Top = float64(top) / float64(samples)
	sr.Bottom = float64(bottom) / float64(samples)
	switch {
	case !defined:
		sr.Stability = Unranked
	case int(sr.High) <= topN:
		sr.Stability = RobustTop
	case int(sr.Low) > n-topN:
		sr.Stability = RobustBottom
	case int(sr.High-sr.Low) <= topN:
		sr.Stability = Stable
	default:
		sr.Stability = WeightDependent
	}
	return sr
}

func summarizeAgreement(x []float64) Agreement {
	if len(x) == 0 {
		return Agreement{math.NaN(), math.NaN(), math.NaN()}
	}
	sorted := slices.Clone(x)
	for _, v := range sorted {
		if math.IsNaN(v) {
			return Agreement{math.NaN(), math.NaN(), math.NaN()}
		}
	}
	slices.Sort(sorted)
	return Agreement{
		Mean: stat.Mean(x, nil),
		Min:  sorted[0],
		P05:  sorted[percentileCount(5, len(sorted))-1],
	}
}

// percentileCount returns ⌈pct·n/100⌉, in integer arithmetic: the type 1
// pct-th percentile of n sorted values is the one at that 1-based
// position.
func percentileCount(pct, n int) int { return (pct*n + 99) / 100 }

// agreementBase holds what the rank correlations with the base ranking
// need, computed once: the stations with a defined base composite, their
// base ranks, and their centred base midranks.
type agreementBase struct {
	included []bool
	m        int       // number of included stations
	mu       float64   // mean midrank, (m+1)/2
	centred  []float64 // base midrank − mu; 0 for excluded stations
	ss       float64   // Σ centred²
	ranks    []int32   // base ranks of the included stations, in station order
	idx      []int32   // the included stations
}

func newAgreementBase(p *prepared) *agreementBase {
	a := &agreementBase{included: p.baseFinite, m: p.finite, centred: make([]float64, p.n)}
	a.mu = float64(a.m+1) / 2
	mid := rankstat.MidRanks(nil, p.base) // NaN for excluded stations
	for st, x := range mid {
		if !a.included[st] {
			continue
		}
		// MidRanks counts up from the lowest score and ranks count down
		// from the highest; correlation is the same after flipping both,
		// so flip the base to match the sample ranks.
		c := float64(a.m+1) - x - a.mu
		a.centred[st] = c
		a.ss += c * c
		a.ranks = append(a.ranks, p.baseRanks[st])
		a.idx = append(a.idx, int32(st))
	}
	return a
}

// mcWorker ranks Monte Carlo samples with its own scratch space.
type mcWorker struct {
	p      *prepared
	ws     *weightSampler
	base   *agreementBase
	res    *MonteCarloResult
	seed   uint64
	stride int

	pcg     rand.PCG
	w       []float64
	scores  []float64
	ranks   []int32
	ranker  rankstat.Ranker
	kendall rankstat.Kendall
	ky      []int32

	err       error
	errSample int
}

// sample draws weight vector i, writes the ranks it gives to dst and
// records its agreement with the base ranking.
func (w *mcWorker) sample(i int, dst []uint16) {
	w.pcg.Seed(w.seed, uint64(i))
	if !w.ws.draw(w.w, &w.pcg) {
		w.err = fmt.Errorf("sensitivity: Monte Carlo sample %d: no weight vector within the bounds in %d draws", i, maxTries)
		w.errSample = i
		return
	}
	w.p.composites(w.scores, w.w)
	ranks := w.ranker.Ranks(w.ranks, w.scores)
	for st, r := range ranks {
		dst[st] = uint16(r)
	}
	w.res.SpearmanSamples[i] = w.spearman(ranks)
	if i%w.stride == 0 {
		w.res.KendallSamples[i/w.stride] = w.tauB(ranks)
	}
}

// spearman returns Spearman's rho between ranks and the base ranking, over
// the included stations: the Pearson correlation of midranks, whose mean
// is (m+1)/2 in both rankings.
func (w *mcWorker) spearman(ranks []int32) float64 {
	a := w.base
	if a.m < 2 {
		return math.NaN()
	}
	order := w.ranker.Order()
	var num, ss float64
	placed := 0 // included stations ranked above the current tie group
	for i := 0; i < len(order); {
		r := ranks[order[i]]
		j := i + 1
		for j < len(order) && ranks[order[j]] == r {
			j++
		}
		c := 0
		for _, st := range order[i:j] {
			if a.included[st] {
				c++
			}
		}
		d := float64(placed) + float64(c+1)/2 - a.mu
		for _, st := range order[i:j] {
			if a.included[st] {
				num += d * a.centred[st]
				ss += d * d
			}
		}
		placed += c
		i = j
	}
	return num / math.Sqrt(a.ss*ss)
}

// tauB returns Kendall's tau-b between ranks and the base ranking, over the
// included stations, whose ranks lie in 1..m.
func (w *mcWorker) tauB(ranks []int32) float64 {
	a := w.base
	if a.m < 2 {
		return math.NaN()
	}
	w.ky = grow(w.ky, a.m)
	for t, st := range a.idx {
		w.ky[t] = ranks[st]
	}
	return w.kendall.TauB(a.ranks, w.ky)
}

// byteSize formats a number of bytes for a message.
func byteSize(b int64) string {
	switch {
	case b >= 1<<30:
		return fmt.Sprintf("%.1f GiB", float64(b)/(1<<30))
	case b >= 1<<20:
		return fmt.Sprintf("%.1f MiB", float64(b)/(1<<20))
	}
	return fmt.Sprintf("%d bytes", b)
}
