package sensitivity

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sync"

	"gonum.org/v1/gonum/stat"
)

// SobolSettings configures Sobol. The zero value of every field stands for
// the documented default.
type SobolSettings struct {
	// N is the number of rows in each of the two base sample matrices A and
	// B; the model is run N·(k+2) times, fewer for inputs whose range is a
	// single point. 0 means 4096.
	N int
	// Bootstrap is the number of bootstrap replicates; 0 means 1000 and a
	// negative value means no intervals.
	Bootstrap int
	// Level is the confidence level of the intervals; 0 means 0.95.
	Level float64
	// IntervalOutputs lists the outputs that get bootstrap intervals; nil
	// means every output. Each costs Bootstrap·N·(k+2) operations and
	// 8·N·(k+2) bytes.
	IntervalOutputs []int
	// Seed fixes the samples: row r of A and B draws from
	// rand.NewPCG(Seed, 1<<63+r), bootstrap replicate b from
	// rand.NewPCG(Seed, 3<<62+b).
	Seed uint64
	// Workers is the number of goroutines that run the model; 0 means
	// runtime.GOMAXPROCS(0).
	Workers int
}

// SobolResult holds first-order and total Sobol indices. First, Total and
// the interval bounds hold Outputs × Inputs values in row-major order: the
// index of input i for output o is at [o*Inputs+i] (see FirstOrder and
// TotalOrder). An index is NaN when its output is constant: its standard
// deviation is below 1e-11 times its root mean square, where rounding
// errors would decide the indices. An interval bound is NaN when the output
// was not bootstrapped or a replicate was constant.
type SobolResult struct {
	Inputs, Outputs int
	N               int // rows of each base sample matrix
	Evaluations     int // model runs
	// Mean and Variance are each output's mean and population variance
	// over the 2N runs on A and B.
	Mean, Variance []float64
	First, Total   []float64
	// Percentile bootstrap intervals at the given Level, from Bootstrap
	// replicates that resample the N rows.
	FirstLo, FirstHi, TotalLo, TotalHi []float64
	Level                              float64
	Bootstrap                          int
}

// FirstOrder returns the first-order indices of output o, one per input.
func (r *SobolResult) FirstOrder(o int) []float64 { return r.First[o*r.Inputs : (o+1)*r.Inputs] }

// TotalOrder returns the total indices of output o, one per input.
func (r *SobolResult) TotalOrder(o int) []float64 { return r.Total[o*r.Inputs : (o+1)*r.Inputs] }

// Sobol estimates the first-order and total Sobol indices of a model with k
// = len(lo) independent inputs, input i uniform in [lo[i], hi[i]], and
// vector output: model(dst, x) must set all `outputs` elements of dst from
// the k inputs in x. model is called from several goroutines at once and
// must not keep x or dst.
//
// Two N×k matrices A and B are drawn by plain pseudo-random sampling, and
// AB_i is A with column i taken from B. With f_A, f_B and f_ABi the model
// outputs on corresponding rows and V the variance of the 2N outputs on A
// and B, the estimators are those of Saltelli et al. (2010), "Variance
// based sensitivity analysis of model output. Design and estimator for the
// total sensitivity index", Comput. Phys. Commun. 181:259–270, Table 2:
//
//	first order (Saltelli et al. 2010):  S_i  = mean(f_B·(f_ABi − f_A)) / V
//	total (Jansen 1999):                 ST_i = mean((f_A − f_ABi)²) / (2V)
//
// Before averaging, every output is shifted by its value at the centre of
// the input box. The shift leaves both estimators unbiased (the mean of
// f_ABi − f_A is zero) and removes the noise that a large output mean adds
// to the first-order estimator. The confidence intervals are bootstrap
// percentile intervals (Efron & Tibshirani 1993) over replicates that
// resample the N rows with replacement, the same rows for every output,
// with the empirical (type 1) quantiles.
//
// The estimates are streamed: apart from the bootstrapped outputs, memory
// does not grow with N. Sobol panics if len(lo) != len(hi).
func Sobol(model func(dst, x []float64), lo, hi []float64, outputs int, s SobolSettings) (*SobolResult, error) {
	k := len(lo)
	if len(hi) != k {
		panic("sensitivity: slice length mismatch")
	}
	if k == 0 {
		return nil, fmt.Errorf("sensitivity: Sobol indices need at least one input")
	}
	if outputs < 1 {
		return nil, fmt.Errorf("sensitivity: %d model outputs; want at least 1", outputs)
	}
	for i := range k {
		if !(lo[i] <= hi[i]) || math.IsInf(lo[i], 0) || math.IsInf(hi[i], 0) {
			return nil, fmt.Errorf("sensitivity: input %d has range [%g, %g]; want finite lo <= hi", i, lo[i], hi[i])
		}
	}
	N := s.N
	if N == 0 {
		N = 4096
	}
	if N < 2 {
		return nil, fmt.Errorf("sensitivity: %d base samples; want at least 2", N)
	}
	B := s.Bootstrap
	if B == 0 {
		B = 1000
	}
	B = max(B, 0)
	level := s.Level
	if level == 0 {
		level = 0.95
	}
	if !(level > 0 && level < 1) {
		return nil, fmt.Errorf("sensitivity: confidence level %g; want a level strictly between 0 and 1", level)
	}
	boot := s.IntervalOutputs
	if boot == nil {
		boot = make([]int, outputs)
		for o := range boot {
			boot[o] = o
		}
	}
	for _, o := range boot {
		if o < 0 || o >= outputs {
			return nil, fmt.Errorf("sensitivity: interval output %d is not one of the %d outputs", o, outputs)
		}
	}
	if B == 0 {
		boot = nil
	}

	e := &sobolEstimator{
		model: model, lo: lo, hi: hi, k: k, m: outputs, n: N, seed: s.Seed,
		varies: make([]bool, k),
	}
	for i := range k {
		e.varies[i] = lo[i] < hi[i]
		if e.varies[i] {
			e.evals++
		}
	}
	e.evals += 2
	e.run(workers(s.Workers), boot)
	res := e.result(level, B)
	if len(boot) > 0 {
		e.bootstrap(res, boot, B, level, workers(s.Workers))
	}
	return res, nil
}

type sobolEstimator struct {
	model  func(dst, x []float64)
	lo, hi []float64
	k, m   int // inputs, outputs
	n      int // rows
	seed   uint64
	varies []bool // input i has a range wider than a point
	evals  int    // model runs per row

	shift []float64 // per output: its value at the centre of the box
	// Per output sums over rows of the shifted outputs a = f_A − shift and
	// b = f_B − shift: Σa, Σb, Σa², Σb²; per output and input
	// Σ b·(f_ABi − f_A) and Σ (f_A − f_ABi)².
	sa, sb, qa, qb []float64
	first, total   []float64
	// rows holds, per bootstrapped output, every row's shifted a, b and
	// f_ABi values, k+2 per row.
	rows [][]float64
}

// minRelSD is the relative standard deviation below which an output counts
// as constant. Composites that are mathematically constant vary by a few
// units in the last place, 1e-16 relative.
const minRelSD = 1e-11

// rowsPerBlock bounds the memory of one block of model outputs to about
// 32 MiB.
func rowsPerBlock(evals, m, workers int) int {
	r := (32 << 20) / (8 * evals * m)
	return min(max(r, workers, 1), 1024)
}

func (e *sobolEstimator) run(nw int, boot []int) {
	k, m := e.k, e.m
	centre := make([]float64, k)
	for i := range k {
		centre[i] = e.lo[i] + (e.hi[i]-e.lo[i])/2
	}
	e.shift = make([]float64, m)
	e.model(e.shift, centre)
	for o, c := range e.shift {
		if math.IsNaN(c) || math.IsInf(c, 0) {
			e.shift[o] = 0
		}
	}
	e.sa, e.sb = make([]float64, m), make([]float64, m)
	e.qa, e.qb = make([]float64, m), make([]float64, m)
	e.first, e.total = make([]float64, m*k), make([]float64, m*k)
	e.rows = make([][]float64, len(boot))
	for j := range boot {
		e.rows[j] = make([]float64, 0, e.n*(k+2))
	}
	bootIndex := make([]int, m) // position in boot + 1, 0 if not bootstrapped
	for j, o := range boot {
		bootIndex[o] = j + 1
	}

	nw = min(nw, e.n)
	R := rowsPerBlock(k+2, m, nw)
	// out holds, for each row of the block, k+2 output vectors: f_A, f_B,
	// f_AB0, ..., f_AB(k−1).
	out := make([]float64, R*(k+2)*m)
	type scratch struct {
		pcg     rand.PCG
		a, b, x []float64
	}
	scr := make([]scratch, nw)
	for w := range scr {
		scr[w] = scratch{a: make([]float64, k), b: make([]float64, k), x: make([]float64, k)}
	}
	var wg sync.WaitGroup
	for r0 := 0; r0 < e.n; r0 += R {
		r1 := min(r0+R, e.n)
		for w := range nw {
			wg.Go(func() {
				sc := &scr[w]
				rnd := rand.New(&sc.pcg)
				for r := r0 + w; r < r1; r += nw {
					sc.pcg.Seed(e.seed, sobolStream+uint64(r))
					for i := range k {
						sc.a[i] = e.lo[i] + (e.hi[i]-e.lo[i])*rnd.Float64()
					}
					for i := range k {
						sc.b[i] = e.lo[i] + (e.hi[i]-e.lo[i])*rnd.Float64()
					}
					fs := out[(r-r0)*(k+2)*m : (r-r0+1)*(k+2)*m]
					e.model(fs[:m], sc.a)
					e.model(fs[m:2*m], sc.b)
					for i := range k {
						dst := fs[(2+i)*m : (3+i)*m]
						if !e.varies[i] {
							copy(dst, fs[:m]) // AB_i is A
							continue
						}
						copy(sc.x, sc.a)
						sc.x[i] = sc.b[i]
						e.model(dst, sc.x)
					}
				}
			})
		}
		wg.Wait()
		// Accumulate in row order, each worker a range of outputs.
		for w := range nw {
			wg.Go(func() {
				for o := w * m / nw; o < (w+1)*m/nw; o++ {
					e.accumulate(o, out[:(r1-r0)*(k+2)*m], bootIndex[o])
				}
			})
		}
		wg.Wait()
	}
}

// accumulate adds the block's rows of output o to the sums.
func (e *sobolEstimator) accumulate(o int, out []float64, bootIndex int) {
	k, m := e.k, e.m
	c := e.shift[o]
	first := e.first[o*k : (o+1)*k]
	total := e.total[o*k : (o+1)*k]
	for base := 0; base < len(out); base += (k + 2) * m {
		a := out[base+o] - c
		b := out[base+m+o] - c
		e.sa[o] += a
		e.sb[o] += b
		e.qa[o] += a * a
		e.qb[o] += b * b
		for i := range k {
			ab := out[base+(2+i)*m+o] - c
			first[i] += b * (ab - a)
			total[i] += (a - ab) * (a - ab)
		}
		if bootIndex > 0 {
			rows := e.rows[bootIndex-1]
			rows = append(rows, a, b)
			for i := range k {
				rows = append(rows, out[base+(2+i)*m+o]-c)
			}
			e.rows[bootIndex-1] = rows
		}
	}
}

// indices turns sums over n rows of outputs shifted by c into the mean and
// variance and, in place, the indices. The indices are NaN when the
// standard deviation is below minRelSD times the root mean square output:
// a constant output whose rounding errors would otherwise give arbitrary
// indices.
func indices(first, total []float64, sa, sb, qa, qb, c float64, n int) (mean, v float64) {
	nn := float64(2 * n)
	shifted := (sa + sb) / nn
	v = (qa+qb)/nn - shifted*shifted
	mean = shifted + c
	defined := v > minRelSD*minRelSD*(v+mean*mean)
	for i := range first {
		if defined {
			first[i] = first[i] / float64(n) / v
			total[i] = total[i] / nn / v
		} else {
			first[i], total[i] = math.NaN(), math.NaN()
		}
	}
	return mean, v
}

func (e *sobolEstimator) result(level float64, B int) *SobolResult {
	k, m := e.k, e.m
	res := &SobolResult{
		Inputs: k, Outputs: m, N: e.n, Evaluations: 1 + e.n*e.evals,
		Mean: make([]float64, m), Variance: make([]float64, m),
		First: e.first, Total: e.total,
		FirstLo: nanSlice(m * k), FirstHi: nanSlice(m * k),
		TotalLo: nanSlice(m * k), TotalHi: nanSlice(m * k),
		Level: level, Bootstrap: B,
	}
	for o := range m {
		mean, v := indices(e.first[o*k:(o+1)*k], e.total[o*k:(o+1)*k], e.sa[o], e.sb[o], e.qa[o], e.qb[o], e.shift[o], e.n)
		res.Mean[o] = mean
		res.Variance[o] = v
	}
	return res
}

// bootstrap fills the intervals of the outputs in boot.
func (e *sobolEstimator) bootstrap(res *SobolResult, boot []int, B int, level float64, nw int) {
	k := e.k
	nw = min(nw, B)
	reps := make([]float64, B*2*k) // per replicate: S then ST
	pick := make([][]int32, nw)
	for w := range nw {
		pick[w] = make([]int32, e.n)
	}
	vals := make([]float64, B)
	for j, o := range boot {
		rows := e.rows[j]
		var wg sync.WaitGroup
		for w := range nw {
			wg.Go(func() {
				var pcg rand.PCG
				rnd := rand.New(&pcg)
				first, total := make([]float64, k), make([]float64, k)
				for b := w; b < B; b += nw {
					pcg.Seed(e.seed, bootstrapStream+uint64(b))
					for t := range pick[w] {
						pick[w][t] = int32(rnd.IntN(e.n))
					}
					clear(first)
					clear(total)
					var sa, sb, qa, qb float64
					for _, r := range pick[w] {
						row := rows[int(r)*(k+2) : (int(r)+1)*(k+2)]
						a, bb := row[0], row[1]
						sa += a
						sb += bb
						qa += a * a
						qb += bb * bb
						for i, ab := range row[2:] {
							first[i] += bb * (ab - a)
							total[i] += (a - ab) * (a - ab)
						}
					}
					indices(first, total, sa, sb, qa, qb, e.shift[o], e.n)
					copy(reps[b*2*k:], first)
					copy(reps[b*2*k+k:], total)
				}
			})
		}
		wg.Wait()
		alpha := (1 - level) / 2
		for i := range k {
			for part, dst := range [2][2][]float64{{res.FirstLo, res.FirstHi}, {res.TotalLo, res.TotalHi}} {
				for b := range B {
					vals[b] = reps[b*2*k+part*k+i]
				}
				lo, hi := percentileInterval(vals, alpha)
				dst[0][o*k+i], dst[1][o*k+i] = lo, hi
			}
		}
	}
}

// percentileInterval returns the empirical alpha and 1−alpha quantiles of
// x, sorting x; NaN if x holds a NaN.
func percentileInterval(x []float64, alpha float64) (lo, hi float64) {
	for _, v := range x {
		if math.IsNaN(v) {
			return math.NaN(), math.NaN()
		}
	}
	slices.Sort(x)
	return stat.Quantile(alpha, stat.Empirical, x, nil), stat.Quantile(1-alpha, stat.Empirical, x, nil)
}

func nanSlice(n int) []float64 {
	s := make([]float64, n)
	for i := range s {
		s[i] = math.NaN()
	}
	return s
}
