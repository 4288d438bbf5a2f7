package config

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"regexp"
	"slices"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"
)

// Default returns the configuration that an empty file means.
func Default() *Config {
	return &Config{
		Seed: 1,
		Inputs: Inputs{
			RecordYearsColumn: "record_years",
			FillGapDays:       2,
		},
		Variables: DefaultVariables(),
		Normalization: Normalization{
			Method: MinMax,
			Scope:  ScopeAll,
		},
		Weighting: Weighting{
			Method: Explicit,
			AHP:    AHP{MaxCR: 0.10},
		},
		Aggregation: Aggregation{Method: Arithmetic, Floor: 0.1},
		Missing:     Missing{Policy: Renormalize, MinEvents: 3},
		Memory:      Memory{MinEvents: 5, Dryness: Fraction},
		Comparison:  Comparison{Basis: BasisStation, MinShare: 0.5},
		Output:      Output{Dir: "out", Print: 10},
		Events:      DefaultEvents(),
		Clustering:  DefaultClustering(),
		Sensitivity: DefaultSensitivity(),
	}
}

// DefaultVariables are the variables used when the file has no [[variable]].
func DefaultVariables() []Variable {
	return []Variable{
		{Name: "water_temperature", Units: "degC", Harmful: Increase},
		{Name: "specific_conductance", Units: "uS/cm", Harmful: Increase},
		{Name: "dissolved_oxygen", Units: "mg/L", Harmful: Decrease},
		{Name: "water_temperature_max", Units: "degC"},
		{Name: "air_temperature", Units: "degC"},
		{Name: "discharge", Units: "m3/s"},
	}
}

// Error is a problem in a configuration file, placed at a line and column
// when known, else at a key path.
type Error struct {
	File string
	Line int // 1-based; 0 when unknown
	Col  int // 1-based; 0 when unknown
	Key  string
	Msg  string
}

func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ":%d", e.Line)
		if e.Col > 0 {
			fmt.Fprintf(&b, ":%d", e.Col)
		}
	}
	if e.Key != "" {
		b.WriteString(": " + e.Key)
	}
	b.WriteString(": " + e.Msg)
	return b.String()
}

// Load reads, decodes and validates the configuration file at path. It
// returns every problem it finds, not only the first; the configuration is
// usable only when the error list is empty.
func Load(path string) (*Config, []error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, []error{err}
	}
	cfg, errs := Decode(string(data), path)
	if len(errs) > 0 {
		return cfg, errs
	}
	return cfg, cfg.Validate()
}

// Decode decodes TOML text onto Default() strictly. file names the source
// in error messages and anchors relative paths. It does not call Validate.
func Decode(text, file string) (*Config, []error) {
	cfg := Default()
	cfg.File = file
	cfg.Variables = nil
	lines := keyLines(text)
	cfg.Lines = lines
	md, err := toml.Decode(text, cfg)
	if err != nil {
		return cfg, []error{tomlError(err, file, lines)}
	}
	var errs []error
	seen := map[string]int{} // how often each unknown key was reported
	for _, k := range md.Undecoded() {
		path := []string(k)
		key := strings.Join(path, ".")
		e := &Error{File: file, Key: key, Msg: "unknown key"}
		// A key repeated in several [[table]] elements is reported once
		// per element, each at its own line.
		if ps := findLines(lines, path); len(ps) > 0 {
			e.Line = ps[min(seen[key], len(ps)-1)].Line
		}
		seen[key]++
		valid := validKeys(reflect.TypeOf(*cfg), path[:len(path)-1])
		if near := closest(path[len(path)-1], valid); near != "" {
			e.Msg += fmt.Sprintf(" (did you mean %q?)", near)
		} else if len(valid) > 0 {
			e.Msg += "; valid keys here: " + strings.Join(valid, ", ")
		}
		errs = append(errs, e)
	}
	if len(cfg.Variables) == 0 {
		cfg.Variables = DefaultVariables()
	}
	// Optional sections exist only when the file has them; [events] is
	// also in force, with its defaults, when events are derived from series.
	if !md.IsDefined("events") && !cfg.DeriveEvents() {
		cfg.Events = nil
	}
	if !md.IsDefined("clustering") {
		cfg.Clustering = nil
	}
	if !md.IsDefined("sensitivity") {
		cfg.Sensitivity = nil
	}
	for i := range cfg.Indicators {
		in := &cfg.Indicators[i]
		if in.Transform == "" {
			in.Transform = NoTransform
		}
		if in.Better == "" && in.Measure.FromEvents() {
			in.Better = Lower
		}
		if in.EventWeights == "" && in.Measure.FromEvents() {
			in.EventWeights = WeightNone
		}
		if in.Better == "" && in.Measure == CriterionM {
			in.Better = defaultBetter(in.Statistic)
		}
	}
	return cfg, errs
}

var typeErrRE = regexp.MustCompile(`^toml: (?:line (\d+) )?\(last key "([^"]*)"\): (.*)$`)
var incompatibleRE = regexp.MustCompile(`^incompatible types: TOML value has type (\S+); destination has type (\S+)$`)

// tomlError turns the decoder's error into an Error at a line and column.
func tomlError(err error, file string, lines map[string]Pos) error {
	var pe toml.ParseError
	if errors.As(err, &pe) {
		return &Error{File: file, Line: pe.Position.Line, Col: pe.Position.Col, Key: pe.LastKey, Msg: strings.TrimPrefix(pe.Message, "toml: ")}
	}
	// Type mismatches come as plain errors that name the line and key.
	if m := typeErrRE.FindStringSubmatch(err.Error()); m != nil {
		e := &Error{File: file, Key: m[2], Msg: m[3]}
		p := findLine(lines, strings.Split(m[2], "."))
		e.Line, e.Col = p.Line, p.Col
		if e.Line == 0 {
			e.Line, _ = strconv.Atoi(m[1])
		}
		if t := incompatibleRE.FindStringSubmatch(m[3]); t != nil {
			e.Msg = fmt.Sprintf("want %s, got %s", article(t[2]), article(t[1]))
		}
		return e
	}
	return &Error{File: file, Msg: strings.TrimPrefix(err.Error(), "toml: ")}
}

func article(typ string) string {
	switch typ {
	case "int64", "integer":
		return "an integer"
	case "float64", "float":
		return "a number"
	case "string":
		return "a string"
	case "bool":
		return "true or false"
	case "[]interface", "[]any", "slice", "array":
		return "an array"
	case "map[string]interface", "map[string]any", "struct", "map":
		return "a table"
	}
	return "a value of type " + typ
}

var nameRE = regexp.MustCompile(`^[A-Za-z][A-Za-z0-9_\-]*$`)

// Validate checks everything that spans several keys and returns every
// problem found.
func (c *Config) Validate() []error {
	var errs []error
	bad := c.reporter(&errs)
	c.checkChoices(bad)
	if c.Inputs.Attributes == "" {
		bad("inputs.attributes", "missing: name the station attribute table (CSV or XLSX)")
	}
	if c.Inputs.RecordYears < 0 || math.IsNaN(c.Inputs.RecordYears) {
		bad("inputs.record_years", "want years > 0 (or 0 to take them from the attribute table), got %g", c.Inputs.RecordYears)
	}

	vars := map[string]bool{}
	for i, v := range c.Variables {
		key := fmt.Sprintf("variable[%d]", i+1)
		switch {
		case v.Name == "":
			bad(key+".name", "missing")
		case !nameRE.MatchString(v.Name):
			bad(key+".name", "want letters, digits, '_' or '-', starting with a letter, got %q", v.Name)
		case vars[v.Name]:
			bad(key+".name", "variable %q is defined twice", v.Name)
		}
		vars[v.Name] = true
	}

	if len(c.Indicators) == 0 {
		errs = append(errs, &Error{File: c.File, Key: "indicator", Msg: "no [[indicator]] defined; the score needs at least one"})
	}
	names := map[string]bool{}
	needEvents := false
	var weightSum float64
	for i, in := range c.Indicators {
		key := fmt.Sprintf("indicator[%d]", i+1)
		switch {
		case in.Name == "":
			bad(key+".name", "missing")
		case !nameRE.MatchString(in.Name):
			bad(key+".name", "want letters, digits, '_' or '-', starting with a letter, got %q", in.Name)
		case names[in.Name]:
			bad(key+".name", "indicator %q is defined twice", in.Name)
		}
		names[in.Name] = true
		switch in.Measure {
		case "":
			bad(key+".measure", "missing: want one of %s", quoteList(strs(Measures)))
		case CriterionM:
			// checked in validateEvents
		case Attribute:
			if in.Attribute == "" {
				bad(key+".attribute", "missing: measure \"attribute\" needs the attribute column name")
			}
			if in.Better == "" {
				bad(key+".better", "missing: say whether \"higher\" or \"lower\" values of %q are more resilient", in.Attribute)
			}
			if len(in.Kinds) > 0 || len(in.Variables) > 0 {
				bad(key+".kinds", "event filters do not apply to measure \"attribute\"")
			}
		default:
			needEvents = true
			if in.Attribute != "" {
				bad(key+".attribute", "only measure \"attribute\" reads an attribute column")
			}
			if in.Transform != NoTransform && in.Transform != "" {
				bad(key+".transform", "transforms apply to measure \"attribute\" only")
			}
			for _, v := range in.Variables {
				if !vars[v] {
					bad(key+".variables", "variable %q is not defined in a [[variable]] table", v)
				}
			}
			departures := in.Measure == Magnitude || in.Measure == MemoryM || in.Measure == ResponseSlope
			if departures && len(in.Variables) != 1 {
				bad(key+".variables", "measure %q compares departures, which have units: name exactly one variable, got %d", in.Measure, len(in.Variables))
			}
			if in.Measure == ResponseSlope && len(in.Kinds) != 1 {
				bad(key+".kinds", "measure \"response_slope\" divides by the driver's intensity, whose scale differs by kind: name exactly one of \"heatwave\", \"drought\", \"flood\", got %d kinds", len(in.Kinds))
			}
			if in.Measure == ResponseSlope && len(in.Kinds) == 1 {
				if msg := choiceMsg(in.Kinds[0], []string{"heatwave", "drought", "flood"}); msg != "" {
					bad(key+".kinds", "measure \"response_slope\" needs a derived kind with a driver intensity: %s", msg)
				}
			}
			if ms := in.MinSeverity; ms != nil && (*ms < 1 || *ms > 4) {
				bad(key+".min_severity", "want a severity class 1-4 (1 moderate = every event, 2 strong, 3 severe, 4 extreme), got %d", *ms)
			}
			if msg := choiceMsg(in.EventWeights, []string{WeightNone, WeightSeverity}); in.EventWeights != "" && msg != "" {
				bad(key+".event_weights", "%s", msg)
			}
			if departures && len(in.Variables) == 1 {
				if v, ok := c.Variable(in.Variables[0]); ok && v.Harmful == "" {
					bad(key+".variables", "variable %q has no harmful direction; set harmful = \"increase\" or \"decrease\" in its [[variable]] table", v.Name)
				}
			}
			if in.Measure == Frequency && c.Inputs.RecordYears == 0 && c.Inputs.RecordYearsColumn == "" {
				bad(key+".measure", "frequency needs a length of record: set inputs.record_years or inputs.record_years_column")
			}
		}
		method := c.NormMethod(i)
		if method == TargetN {
			if in.Target == nil {
				bad(key+".target", "missing: normalisation \"target\" needs a target value")
			}
			if in.Tolerance < 0 || math.IsNaN(in.Tolerance) {
				bad(key+".tolerance", "want a tolerance >= 0, got %g", in.Tolerance)
			}
		}
		if in.Normalize == ZScore && c.Aggregation.Method == Geometric {
			bad(key+".normalize", "z-scores can be negative, so they cannot enter a geometric aggregation; use minmax, rank or target, or arithmetic aggregation")
		}
		if c.Weighting.Method == Explicit {
			if in.Weight == nil {
				bad(key+".weight", "missing: give a weight, or set weighting.method = \"equal\" or \"ahp\"")
			} else {
				weightSum += float64(*in.Weight)
			}
		}
	}
	if c.Weighting.Method == Explicit && len(c.Indicators) > 0 && weightSum == 0 {
		bad("indicator.weight", "all weights are zero; at least one must be positive")
	}
	if needEvents && c.Inputs.Events == "" && !c.HasSeries() {
		bad("inputs.events", "missing: event indicators need the events table, or daily series (inputs.series) to derive it from")
	}
	if c.Normalization.Scope == ScopeCluster && c.Clustering == nil {
		bad("normalization.scope", "scope \"cluster\" needs a [clustering] section")
	}
	c.validateEvents(bad)
	c.validateClustering(bad)
	c.validateSensitivity(bad)
	if c.Weighting.Method == AHPW {
		errs = append(errs, c.validateAHP(names)...)
	}
	if c.Normalization.Method == ZScore && c.Aggregation.Method == Geometric && slices.ContainsFunc(c.Indicators, func(in Indicator) bool { return in.Normalize == "" }) {
		bad("normalization.method", "z-scores can be negative, so they cannot enter a geometric aggregation; use minmax, rank or target, or arithmetic aggregation")
	}
	if c.Aggregation.Method == Geometric && !(c.Aggregation.Floor > 0 && c.Aggregation.Floor < 1) {
		bad("aggregation.floor", "want a floor strictly between 0 and 1, got %g", c.Aggregation.Floor)
	}
	if c.Missing.MinEvents < 0 {
		bad("missing.min_events", "want >= 0, got %d", c.Missing.MinEvents)
	}
	if c.Memory.MinEvents < 3 {
		bad("memory.min_events", "want >= 3 (a slope from fewer events means little), got %d", c.Memory.MinEvents)
	}
	if msg := choiceMsg(c.Comparison.Basis, []string{BasisStation, BasisShared}); msg != "" {
		bad("comparison.basis", "%s", msg)
	}
	if !(c.Comparison.MinShare > 0 && c.Comparison.MinShare <= 1) {
		bad("comparison.min_share", "want a share of stations in (0, 1], got %g", c.Comparison.MinShare)
	}
	if c.Output.Print < 0 {
		bad("output.print", "want >= 0, got %d", c.Output.Print)
	}
	if c.Output.Dir == "" {
		bad("output.dir", "missing")
	}
	return errs
}

func (c *Config) validateAHP(names map[string]bool) []error {
	var errs []error
	a := c.Weighting.AHP
	bad := c.reporter(&errs)
	seen := map[string]bool{}
	for _, o := range a.Order {
		if !names[o] {
			bad("weighting.ahp.order", "%q is not an indicator name", o)
		}
		if seen[o] {
			bad("weighting.ahp.order", "%q is listed twice", o)
		}
		seen[o] = true
	}
	for _, in := range c.Indicators {
		if in.Name != "" && !seen[in.Name] {
			bad("weighting.ahp.order", "indicator %q is missing from the order", in.Name)
		}
	}
	n := len(a.Order)
	if len(a.Matrix) != n {
		bad("weighting.ahp.matrix", "want %d rows (one per indicator in the order), got %d", n, len(a.Matrix))
		return errs
	}
	for i, row := range a.Matrix {
		if len(row) != n {
			bad("weighting.ahp.matrix", "row %d: want %d entries, got %d", i+1, n, len(row))
			return errs
		}
	}
	for i := range n {
		if d := float64(a.Matrix[i][i]); math.Abs(d-1) > 1e-9 {
			bad("weighting.ahp.matrix", "row %d, column %d: the diagonal must be 1, got %g", i+1, i+1, d)
		}
		for j := i + 1; j < n; j++ {
			p := float64(a.Matrix[i][j]) * float64(a.Matrix[j][i])
			// Judgements typed as decimals ("0.333") are accepted up to 1%.
			if math.Abs(p-1) > 0.01 {
				bad("weighting.ahp.matrix", "not reciprocal: entry (%d,%d) = %g but (%d,%d) = %g; want a_ji = 1/a_ij", i+1, j+1, float64(a.Matrix[i][j]), j+1, i+1, float64(a.Matrix[j][i]))
			}
		}
	}
	if !(a.MaxCR > 0) {
		bad("weighting.ahp.max_cr", "want a positive consistency-ratio limit, got %g", a.MaxCR)
	}
	return errs
}

// defaultBetter is the direction of a criterion statistic: more reliable
// and more resilient is better; more vulnerable and more days above is
// worse.
func defaultBetter(s Statistic) Better {
	if s == Reliability || s == Resilience {
		return Higher
	}
	return Lower
}

// NormMethod returns the normalisation method of indicator i (its own
// override, else the global method).
func (c *Config) NormMethod(i int) NormMethod {
	if m := c.Indicators[i].Normalize; m != "" {
		return m
	}
	return c.Normalization.Method
}

// Path resolves p against the directory of the configuration file.
func (c *Config) Path(p string) string {
	if p == "" || filepath.IsAbs(p) || c.File == "" {
		return p
	}
	return filepath.Join(filepath.Dir(c.File), p)
}

// Variable returns the variable named name.
func (c *Config) Variable(name string) (Variable, bool) {
	i := slices.IndexFunc(c.Variables, func(v Variable) bool { return v.Name == name })
	if i < 0 {
		return Variable{}, false
	}
	return c.Variables[i], true
}

// pos returns the position of key, or of its nearest enclosing table.
func (c *Config) pos(key string) Pos {
	for k := key; k != ""; {
		if p, ok := c.Lines[k]; ok {
			return p
		}
		i := strings.LastIndexByte(k, '.')
		if i < 0 {
			break
		}
		k = k[:i]
	}
	return Pos{}
}

type reportFunc func(key, format string, args ...any)

func (c *Config) reporter(errs *[]error) reportFunc {
	return func(key, format string, args ...any) {
		p := c.pos(key)
		*errs = append(*errs, &Error{File: c.File, Line: p.Line, Col: p.Col, Key: key, Msg: fmt.Sprintf(format, args...)})
	}
}

// checkChoices reports every field whose value is not one of its choices.
func (c *Config) checkChoices(bad reportFunc) {
	check := func(key, v string, allowed []string) {
		if v == "" {
			return // absent: defaults or Validate's "missing" apply
		}
		if msg := choiceMsg(v, allowed); msg != "" {
			bad(key, "%s", msg)
		}
	}
	for i, v := range c.Variables {
		check(fmt.Sprintf("variable[%d].harmful", i+1), string(v.Harmful), []string{string(Increase), string(Decrease)})
	}
	for i, in := range c.Indicators {
		key := fmt.Sprintf("indicator[%d]", i+1)
		check(key+".measure", string(in.Measure), strs(Measures))
		check(key+".transform", string(in.Transform), []string{string(NoTransform), string(Log), string(Sqrt)})
		check(key+".better", string(in.Better), []string{string(Higher), string(Lower)})
		check(key+".normalize", string(in.Normalize), strs(NormMethods))
		check(key+".statistic", string(in.Statistic), strs(Statistics))
		if in.Weight != nil && !(*in.Weight >= 0) {
			bad(key+".weight", "want a number >= 0, got %g", float64(*in.Weight))
		}
	}
	check("normalization.method", string(c.Normalization.Method), strs(NormMethods))
	check("normalization.scope", string(c.Normalization.Scope), strs(Scopes))
	check("weighting.method", string(c.Weighting.Method), []string{string(Explicit), string(Equal), string(AHPW)})
	check("aggregation.method", string(c.Aggregation.Method), strs(AggMethods))
	check("missing.policy", string(c.Missing.Policy), []string{string(Renormalize), string(Impute), string(ErrorPolicy)})
	check("memory.dryness", string(c.Memory.Dryness), []string{string(Fraction), string(Index)})
	for i, row := range c.Weighting.AHP.Matrix {
		for j, x := range row {
			if !(x > 0) || math.IsInf(float64(x), 0) {
				bad("weighting.ahp.matrix", "row %d, column %d: want a positive number or a fraction like \"1/3\"", i+1, j+1)
			}
		}
	}
}
