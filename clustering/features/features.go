package features

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"sync"

	"rebound/index/robust"
	"rebound/index/series"
)

// Config says which features to compute and how.
type Config struct {
	// Features lists the features by name, "<variable>.<statistic>" (see
	// the package documentation and Available). Nil means DefaultFeatures.
	Features []string
	// Coverage is the record a station needs, for every variable its
	// features use, to be kept; the zero Requirement asks for at least one
	// value of each.
	Coverage series.Requirement
	// FillGaps is the longest interior gap, in days, filled by linear
	// interpolation (series.Station.FillGaps) before the features are
	// computed; 0 fills none. Callers usually set 2.
	FillGaps int
	// MaxLag is the largest lag in days tried by air_lag; 0 means 10.
	MaxLag int
	// MinSegment is the shortest run of consecutive days with flow that the
	// baseflow filter is applied to, in days; 0 means 60.
	MinSegment int
	// Baseflow configures the baseflow filter; the zero value is α = 0.925,
	// 3 passes and 30 values mirrored at each end.
	Baseflow LyneHollick
}

// DefaultFeatures returns the features computed when Config.Features is
// nil: every statistic of water temperature, air temperature and discharge,
// except the coefficient of variation of the temperatures (°C has an
// arbitrary zero, so their CV has no meaning).
func DefaultFeatures() []string {
	var out []string
	generic := []string{"mean", "sd", "skew", "lag1", "amplitude", "phase", "p10", "p90"}
	for _, s := range generic {
		out = append(out, series.WaterTemperature+"."+s)
	}
	out = append(out, series.WaterTemperature+".thermal_sensitivity", series.WaterTemperature+".air_lag")
	for _, s := range generic {
		out = append(out, series.AirTemperature+"."+s)
	}
	for _, s := range slices.Insert(generic, 2, "cv") {
		out = append(out, series.Discharge+"."+s)
	}
	return append(out, series.Discharge+".flashiness", series.Discharge+".bfi", series.Discharge+".q90_q50")
}

// Info describes one feature.
type Info struct {
	Name       string // e.g. "water_temperature.mean"
	Units      string // e.g. "°C", "1" for dimensionless
	Definition string // one line
}

type scope uint8

const (
	anyVar   scope = iota
	flowVar        // meant for discharge
	waterAir       // water temperature with air temperature
)

// stat is one statistic of a variable.
type stat struct {
	name  string
	scope scope
	units func(u string) string // from the variable's canonical units
	def   string
}

func same(u string) string { return u }
func one(string) string    { return "1" }

var stats = []stat{
	{"mean", anyVar, same, "mean of the daily values"},
	{"sd", anyVar, same, "sample standard deviation of the daily values (ddof = 1)"},
	{"cv", anyVar, one, "coefficient of variation sd/mean; undefined unless the mean is positive"},
	{"skew", anyVar, one, "adjusted Fisher–Pearson skewness G1 of the daily values"},
	{"lag1", anyVar, one, "lag-1 autocorrelation of the daily anomalies from the annual harmonic"},
	{"amplitude", anyVar, same, "amplitude of the least-squares annual harmonic"},
	{"phase", anyVar, func(string) string { return "day of year" }, "day of year (1-based) of the maximum of the annual harmonic"},
	{"p10", anyVar, same, "10th percentile of the daily values (type 7)"},
	{"p90", anyVar, same, "90th percentile of the daily values (type 7)"},
	{"flashiness", flowVar, one, "Richards–Baker flashiness index"},
	{"bfi", flowVar, one, "baseflow index by the Lyne–Hollick filter"},
	{"q90_q50", flowVar, one, "low-flow ratio Q90/Q50 (flow exceeded 90% / 50% of days)"},
	{"thermal_sensitivity", waterAir, one, "OLS slope of weekly mean water on weekly mean air temperature"},
	{"air_lag", waterAir, func(string) string { return "days" }, "lag (days) of the largest correlation of water with air temperature anomalies"},
}

// Available lists the features that can be computed for vars: every generic
// statistic for each variable, the flow statistics for discharge and the
// water–air statistics when both water and air temperature are listed.
// Other percentiles pNN (NN from 1 to 99) are accepted too but not listed.
func Available(vars ...series.Var) []Info {
	var out []Info
	has := map[string]bool{}
	for _, v := range vars {
		has[v.Name] = true
	}
	for _, v := range vars {
		u := canonicalUnits(v)
		for _, s := range stats {
			switch s.scope {
			case flowVar:
				if v.Name != series.Discharge {
					continue
				}
			case waterAir:
				if v.Name != series.WaterTemperature || !has[series.AirTemperature] {
					continue
				}
			}
			out = append(out, Info{Name: v.Name + "." + s.name, Units: s.units(u), Definition: s.def})
		}
	}
	return out
}

func canonicalUnits(v series.Var) string {
	if v.Units != "" {
		return series.LookupUnit(v.Units).Canonical()
	}
	switch v.Name {
	case series.WaterTemperature, series.AirTemperature:
		return "°C"
	case series.Discharge:
		return "m³/s"
	}
	return ""
}

// feature is a parsed feature name.
type feature struct {
	name string
	v    string  // variable
	stat string  // statistic, "pNN" for percentiles
	p    float64 // percentile as a fraction, for pNN
}

// Extractor computes a configured list of features. It is safe for
// concurrent use.
type Extractor struct {
	cfg   Config
	feats []feature
	vars  []string // variables the features use, in first-use order
	pool  sync.Pool
}

// New checks the configuration and returns an Extractor.
func New(cfg Config) (*Extractor, error) {
	names := cfg.Features
	if names == nil {
		names = DefaultFeatures()
	}
	if len(names) == 0 {
		return nil, fmt.Errorf("features: no features configured")
	}
	if cfg.MaxLag < 0 || cfg.MinSegment < 0 || cfg.FillGaps < 0 {
		return nil, fmt.Errorf("features: max lag, min segment and fill gaps must not be negative")
	}
	if cfg.MaxLag == 0 {
		cfg.MaxLag = 10
	}
	if cfg.MinSegment == 0 {
		cfg.MinSegment = 60
	}
	e := &Extractor{cfg: cfg}
	seen := map[string]bool{}
	for _, name := range names {
		f, err := parseFeature(name)
		if err != nil {
			return nil, err
		}
		if seen[name] {
			return nil, fmt.Errorf("features: %q listed twice", name)
		}
		seen[name] = true
		e.feats = append(e.feats, f)
		if !slices.Contains(e.vars, f.v) {
			e.vars = append(e.vars, f.v)
		}
		if f.stat == "thermal_sensitivity" || f.stat == "air_lag" {
			if !slices.Contains(e.vars, series.AirTemperature) {
				e.vars = append(e.vars, series.AirTemperature)
			}
		}
	}
	return e, nil
}

func parseFeature(name string) (feature, error) {
	i := strings.LastIndexByte(name, '.')
	if i <= 0 || i == len(name)-1 {
		return feature{}, fmt.Errorf("features: %q: want <variable>.<statistic>", name)
	}
	f := feature{name: name, v: name[:i], stat: name[i+1:]}
	if len(f.stat) == 3 && f.stat[0] == 'p' {
		if k, err := strconv.Atoi(f.stat[1:]); err == nil && k >= 1 && k <= 99 {
			f.p = float64(k) / 100
			return f, nil
		}
	}
	for _, s := range stats {
		if s.name != f.stat {
			continue
		}
		if s.scope == waterAir && f.v != series.WaterTemperature {
			return feature{}, fmt.Errorf("features: %q: %s is defined for %s only", name, f.stat, series.WaterTemperature)
		}
		return f, nil
	}
	var valid []string
	for _, s := range stats {
		valid = append(valid, s.name)
	}
	return feature{}, fmt.Errorf("features: %q: unknown statistic %q; want one of %s or pNN",
		name, f.stat, strings.Join(valid, ", "))
}

// Names returns the names of the features, in the order of Extract's
// values.
func (e *Extractor) Names() []string {
	out := make([]string, len(e.feats))
	for i, f := range e.feats {
		out[i] = f.name
	}
	return out
}

// Vars returns the variables the features use.
func (e *Extractor) Vars() []string { return slices.Clone(e.vars) }

// Extract computes the features of station s into dst, which it grows or
// allocates as needed, and returns it. When the station is to be left out
// of clustering, reason says why: a variable below the configured coverage
// ("discharge: 2 of 5 required years with >= 80% of days") or features
// that are undefined for it ("undefined: discharge.cv"). Extract fills the
// station's short gaps first when Config.FillGaps > 0, changing s.
func (e *Extractor) Extract(dst []float64, s *series.Station) (values []float64, reason string) {
	dst = slices.Grow(dst[:0], len(e.feats))[:len(e.feats)]
	for i := range dst {
		dst[i] = math.NaN()
	}
	if e.cfg.FillGaps > 0 {
		s.FillGaps(e.cfg.FillGaps)
	}
	if ok, why := e.cfg.Coverage.Check(s, e.vars...); !ok {
		return dst, why
	}
	c, _ := e.pool.Get().(*calc)
	if c == nil {
		c = &calc{}
	}
	c.reset(e, s)
	defer e.pool.Put(c)
	var undefined []string
	for i, f := range e.feats {
		dst[i] = c.feature(f)
		if math.IsNaN(dst[i]) {
			undefined = append(undefined, f.name)
		}
	}
	if len(undefined) > 0 {
		reason = "undefined: " + strings.Join(undefined, ", ")
	}
	return dst, reason
}

// calc computes features of one station, sharing work between them. Its
// buffers are reused from station to station.
type calc struct {
	e     *Extractor
	s     *series.Station
	vars  []varCalc
	names []string
	bufs  [][]float64 // scratch buffers; the first used of them are taken
	used  int
}

func (c *calc) reset(e *Extractor, s *series.Station) {
	c.e, c.s = e, s
	// Room for every variable up front: pointers into vars stay valid.
	c.vars = slices.Grow(c.vars[:0], len(e.vars))
	c.names, c.used = c.names[:0], 0
}

// buf returns a scratch slice of length n.
func (c *calc) buf(n int) []float64 {
	if c.used == len(c.bufs) {
		c.bufs = append(c.bufs, nil)
	}
	b := slices.Grow(c.bufs[c.used][:0], n)[:n]
	c.bufs[c.used] = b
	c.used++
	return b
}

// varCalc holds what is computed once per variable.
type varCalc struct {
	x              []float64
	momDone        bool
	mean, sd, skew float64
	meanAbs        float64
	harmDone       bool
	harm           Harmonic
	harmOK         bool
	anom           []float64
	selDone        bool
	sel            robust.Selection // over the present values (see quantile)
}

func (c *calc) v(name string) *varCalc {
	for i, n := range c.names {
		if n == name {
			return &c.vars[i]
		}
	}
	c.names = append(c.names, name)
	c.vars = append(c.vars, varCalc{x: c.s.Vars[name]})
	return &c.vars[len(c.vars)-1]
}

func (vc *varCalc) moments() {
	if vc.momDone {
		return
	}
	vc.momDone = true
	vc.mean, vc.sd, vc.skew, _ = Moments(vc.x)
	n := 0
	for _, v := range vc.x {
		if !math.IsNaN(v) {
			vc.meanAbs += math.Abs(v)
			n++
		}
	}
	vc.meanAbs /= float64(n)
}

func (c *calc) harmonic(vc *varCalc) (Harmonic, bool) {
	if !vc.harmDone {
		vc.harmDone = true
		vc.harm, vc.harmOK = fitDaily(c.s.Start, vc.x)
	}
	return vc.harm, vc.harmOK
}

func (c *calc) anomalies(vc *varCalc) []float64 {
	if vc.anom == nil {
		h, ok := c.harmonic(vc)
		if !ok {
			return nil
		}
		vc.anom = anomalies(c.buf(len(vc.x)), c.s.Start, vc.x, h)
	}
	return vc.anom
}

// quantile returns the p-quantile of the variable's values, by selection
// on one copy of them that each quantile leaves more ordered for the next.
func (c *calc) quantile(vc *varCalc, p float64) float64 {
	if !vc.selDone {
		vc.selDone = true
		x := c.buf(len(vc.x))[:0]
		for _, v := range vc.x {
			if !math.IsNaN(v) {
				x = append(x, v)
			}
		}
		vc.sel.Reset(x)
	}
	return vc.sel.Quantile(p)
}

func (c *calc) feature(f feature) float64 {
	vc := c.v(f.v)
	if f.p > 0 {
		return c.quantile(vc, f.p)
	}
	switch f.stat {
	case "mean":
		vc.moments()
		return vc.mean
	case "sd":
		vc.moments()
		return vc.sd
	case "cv":
		vc.moments()
		if !(vc.mean > 1e-9*vc.meanAbs) {
			return math.NaN()
		}
		return vc.sd / vc.mean
	case "skew":
		vc.moments()
		return vc.skew
	case "lag1":
		return Lag1(c.anomalies(vc))
	case "amplitude":
		h, ok := c.harmonic(vc)
		if !ok {
			return math.NaN()
		}
		return h.Amplitude()
	case "phase":
		h, ok := c.harmonic(vc)
		if !ok {
			return math.NaN()
		}
		return h.PeakDay() + 1
	case "flashiness":
		return Flashiness(vc.x)
	case "bfi":
		return c.bfi(vc.x)
	case "q90_q50":
		q50 := c.quantile(vc, 0.5)
		if !(q50 > 0) {
			return math.NaN()
		}
		return c.quantile(vc, 0.1) / q50
	case "thermal_sensitivity":
		return ThermalSensitivity(vc.x, c.v(series.AirTemperature).x)
	case "air_lag":
		wa := c.anomalies(vc)
		aa := c.anomalies(c.v(series.AirTemperature))
		if wa == nil || aa == nil {
			return math.NaN()
		}
		lag, _ := LagOfMaxCorrelation(aa, wa, c.e.cfg.MaxLag)
		if lag < 0 {
			return math.NaN()
		}
		return float64(lag)
	}
	panic("features: unknown statistic " + f.stat) // New rejects these
}

// bfi is the baseflow index over the runs of at least MinSegment days with
// flow.
func (c *calc) bfi(q []float64) float64 {
	var base, total float64
	buf := c.buf(len(q))
	pad := c.buf(len(q) + 2*max(c.e.cfg.Baseflow.Reflect, 30))
	for i := 0; i < len(q); {
		if math.IsNaN(q[i]) {
			i++
			continue
		}
		j := i
		for j < len(q) && !math.IsNaN(q[j]) {
			j++
		}
		if j-i >= c.e.cfg.MinSegment {
			seg := q[i:j]
			bf := c.e.cfg.Baseflow.filter(buf[:len(seg)], seg, pad)
			for k, b := range bf {
				base += b
				total += seg[k]
			}
		}
		i = j
	}
	if !(total > 0) {
		return math.NaN()
	}
	return base / total
}
