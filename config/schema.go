package config

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
)

// Config is a whole configuration. Every field has a default (see Default)
// and a comment in the template (see Template).
type Config struct {
	// Title names the study in the outputs.
	Title string `toml:"title"`
	// Seed fixes every random choice (demo data, clustering restarts,
	// sensitivity samples). The same inputs and seed give the same outputs.
	Seed uint64 `toml:"seed"`

	Inputs        Inputs        `toml:"inputs"`
	Variables     []Variable    `toml:"variable"`
	Indicators    []Indicator   `toml:"indicator"`
	Normalization Normalization `toml:"normalization"`
	Weighting     Weighting     `toml:"weighting"`
	Aggregation   Aggregation   `toml:"aggregation"`
	Missing       Missing       `toml:"missing"`
	Memory        Memory        `toml:"memory"`
	Comparison    Comparison    `toml:"comparison"`
	Output        Output        `toml:"output"`

	// Events configures deriving events from daily series ([events]);
	// nil when the section is absent.
	Events *Events `toml:"events"`
	// Criteria are numeric water-temperature criteria ([[criterion]]).
	Criteria []Criterion `toml:"criterion"`
	// Clustering configures station clustering ([clustering]); nil when
	// the section is absent.
	Clustering *Clustering `toml:"clustering"`
	// Sensitivity configures the robustness analysis ([sensitivity]); nil
	// when the section is absent.
	Sensitivity *Sensitivity `toml:"sensitivity"`

	// File is the path the configuration was read from ("" when it was
	// built in code). Relative input paths are resolved against its
	// directory.
	File string `toml:"-"`
	// Lines maps key paths (e.g. "indicator[2].weight") to the position of
	// their value, for error messages. Nil when built in code.
	Lines map[string]Pos `toml:"-"`
}

// Inputs names the input files.
type Inputs struct {
	// Events is the table of per-event departures (CSV). Leave it empty and
	// name Series to derive the events from daily records instead.
	Events string `toml:"events"`
	// Series are daily station records in the long layout
	// (station,date,variable,value[,qualifier]).
	Series []string `toml:"series"`
	// Wide are daily records in the wide layout (date,<station>,...), one
	// file per variable.
	Wide []WideInput `toml:"wide"`
	// UserEvents lists disturbances the series do not show (kind,start,end
	// [,station]).
	UserEvents string `toml:"user_events"`
	// ExcludeQualifiers drops series rows whose qualifier holds one of
	// these codes (e.g. "P" provisional, "E" estimated).
	ExcludeQualifiers []string `toml:"exclude_qualifiers"`
	// FillGapDays is the longest gap in a daily series filled by linear
	// interpolation; longer gaps stay missing.
	FillGapDays int `toml:"fill_gap_days"`
	// Attributes is the station and basin attribute table (CSV or XLSX).
	Attributes string `toml:"attributes"`
	// RecordYears is the length of record, in years, that frequency
	// indicators divide by when the attribute table has no RecordYearsColumn
	// value for a station. 0 means: take it from the attribute table only.
	RecordYears float64 `toml:"record_years"`
	// RecordYearsColumn is the attribute column holding each station's
	// length of record in years.
	RecordYearsColumn string `toml:"record_years_column"`
}

// WideInput is one wide-layout series file.
type WideInput struct {
	Path     string `toml:"path"`
	Variable string `toml:"variable"`
}

// Variable describes one variable of the series or the events table.
type Variable struct {
	Name string `toml:"name"`
	// Units are the units of the values in the series files. Temperatures
	// ("degC", "degF") are converted to °C and discharge ("m3/s", "ft3/s")
	// to m³/s; other units pass through. The events table is always in
	// these canonical units.
	Units string `toml:"units"`
	// Harmful says which direction of departure from normal is harmful:
	// "increase" (warmer, saltier) or "decrease" (less dissolved oxygen).
	// Empty for drivers such as air temperature and discharge, which are
	// not water-quality responses.
	Harmful Direction `toml:"harmful"`
	// Tolerance is a fixed half-width of the recovery band, in the
	// variable's units; 0 means events.recovery.tolerance_sd standard
	// deviations of the station's normal departures.
	Tolerance float64 `toml:"tolerance"`
	// Driver is the kind of event whose peak a shared day counts for when
	// two events of different kinds overlap: "heatwave", "drought",
	// "flood" or "none". Empty takes the default of DriverOf.
	Driver string `toml:"driver"`
	// Range is the physically plausible range [low, high] in canonical
	// units; series values outside it are dropped and counted. Empty means
	// no check.
	Range []float64 `toml:"range"`
}

// Indicator defines one column of the index.
type Indicator struct {
	// Name identifies the indicator in outputs and in the AHP order.
	Name string `toml:"name"`
	// Label is a human-readable description with units, for reports.
	Label string `toml:"label"`
	// Measure is what is computed: magnitude, recovery, memory, frequency
	// (from events) or attribute (a column of the attribute table).
	Measure Measure `toml:"measure"`
	// Kinds and Variables filter the events a measure uses; empty means all.
	Kinds     []string `toml:"kinds"`
	Variables []string `toml:"variables"`
	// MinSeverity keeps the events of this severity class (1 moderate to 4
	// extreme) and above; nil takes the measure's default (see
	// DefaultMinSeverity). Events of user kinds have no class and are
	// always kept.
	MinSeverity *int `toml:"min_severity"`
	// EventWeights is "none" (every event counts once) or "severity" (an
	// event of class c counts c times: as if repeated).
	EventWeights string `toml:"event_weights"`
	// Attribute is the attribute column for measure = "attribute".
	Attribute string `toml:"attribute"`
	// Transform is applied to attribute values before normalisation.
	Transform Transform `toml:"transform"`
	// Better is "higher" or "lower": which raw values mean more resilient.
	// Empty takes the measure's default (lower for every event measure).
	Better Better `toml:"better"`
	// Weight is the indicator's weight for weighting.method = "explicit".
	Weight *Weight `toml:"weight"`
	// Normalize overrides normalization.method for this indicator.
	Normalize NormMethod `toml:"normalize"`
	// Target and Tolerance define method "target": values within
	// Tolerance of Target score 1.
	Target    *float64 `toml:"target"`
	Tolerance float64  `toml:"tolerance"`
	// Criterion and Statistic define measure "criterion": the name of a
	// [[criterion]] and one of reliability, resilience, vulnerability or
	// days_above (per year of record).
	Criterion string    `toml:"criterion"`
	Statistic Statistic `toml:"statistic"`
}

// Statistic is a performance statistic against a criterion.
type Statistic string

const (
	Reliability   Statistic = "reliability"
	Resilience    Statistic = "resilience"
	Vulnerability Statistic = "vulnerability"
	DaysAbove     Statistic = "days_above"
)

// Statistics lists every statistic.
var Statistics = []Statistic{Reliability, Resilience, Vulnerability, DaysAbove}

func (s *Statistic) UnmarshalTOML(v any) error {
	t, err := text(v, "statistic")
	*s = Statistic(t)
	return err
}

// Normalization configures how raw indicator values become comparable.
type Normalization struct {
	Method NormMethod `toml:"method"`
	// Scope is "all" (every station together), "group" (peer groups from
	// the attribute table's group column) or "cluster" (the clusters found
	// by [clustering]).
	Scope Scope `toml:"scope"`
}

// Weighting configures indicator weights.
type Weighting struct {
	// Method is "explicit" (each indicator's weight, normalised to sum 1),
	// "equal", or "ahp" (Saaty's pairwise comparisons).
	Method WeightMethod `toml:"method"`
	AHP    AHP          `toml:"ahp"`
}

// AHP holds a pairwise comparison matrix on Saaty's 1–9 scale.
type AHP struct {
	// Order names the indicators in the order of the matrix rows.
	Order []string `toml:"order"`
	// Matrix[i][j] says how much more important Order[i] is than Order[j].
	// Entries are positive numbers or fractions written as strings ("1/3").
	Matrix [][]Judgement `toml:"matrix"`
	// MaxCR is the largest consistency ratio accepted.
	MaxCR float64 `toml:"max_cr"`
	// AcceptInconsistent accepts a matrix whose CR exceeds MaxCR (with a
	// warning in every output) instead of rejecting it.
	AcceptInconsistent bool `toml:"accept_inconsistent"`
}

// Aggregation configures how normalised values combine into a score.
type Aggregation struct {
	// Method is "arithmetic" (weighted mean) or "geometric" (weighted
	// product).
	Method AggMethod `toml:"method"`
	// Floor keeps zeros out of the geometric product: each normalised value
	// v in [0,1] enters as Floor + (1 − Floor)·v.
	Floor float64 `toml:"floor"`
}

// Missing configures what happens to a station with a missing indicator.
type Missing struct {
	// Policy is "renormalize" (drop the indicator for that station and
	// rescale its remaining weights), "impute" (use the median of the
	// station's normalisation group) or "error".
	Policy MissingPolicy `toml:"policy"`
	// MinEvents flags stations with fewer events than this.
	MinEvents int `toml:"min_events"`
}

// Memory configures the drought-memory indicator.
type Memory struct {
	// MinEvents is the fewest events with a known antecedent dryness for
	// which the Theil–Sen slope is computed.
	MinEvents int `toml:"min_events"`
	// Dryness says what antecedent_dryness holds: "fraction" (share of the
	// prior period in drought, 0–1) or "index" (a standardized index).
	Dryness DrynessScale `toml:"dryness"`
}

// Output configures what is written and printed.
type Output struct {
	// Dir is the output folder, relative to the configuration file.
	Dir string `toml:"dir"`
	// Print is how many stations from the top and from the bottom the
	// ranking table on the terminal shows.
	Print int `toml:"print"`
}

// text decodes a TOML string for a field with a closed set of choices.
// Membership is checked by Validate, so that every bad choice in a file is
// reported at once.
func text(v any, what string) (string, error) {
	s, ok := v.(string)
	if !ok {
		return "", fmt.Errorf("%s: want a string, got %s", what, describe(v))
	}
	return s, nil
}

// choiceMsg returns "" when s is one of allowed, else an error message.
func choiceMsg(s string, allowed []string) string {
	if slices.Contains(allowed, s) {
		return ""
	}
	msg := fmt.Sprintf("want one of %s, got %q", quoteList(allowed), s)
	if near := closest(s, allowed); near != "" {
		msg += fmt.Sprintf(" (did you mean %q?)", near)
	}
	return msg
}

func quoteList(xs []string) string {
	q := make([]string, len(xs))
	for i, x := range xs {
		q[i] = strconv.Quote(x)
	}
	return strings.Join(q, ", ")
}

func describe(v any) string {
	switch v := v.(type) {
	case string:
		return strconv.Quote(v)
	case int64:
		return "the integer " + strconv.FormatInt(v, 10)
	case float64:
		return "the number " + strconv.FormatFloat(v, 'g', -1, 64)
	case bool:
		return "the boolean " + strconv.FormatBool(v)
	case []any:
		return "an array"
	case map[string]any:
		return "a table"
	}
	return fmt.Sprintf("%T", v)
}

// Direction is the harmful direction of a departure.
type Direction string

const (
	Increase Direction = "increase"
	Decrease Direction = "decrease"
)

// Sign returns +1 when an increase is harmful and −1 when a decrease is.
func (d Direction) Sign() float64 {
	if d == Decrease {
		return -1
	}
	return 1
}

func (d *Direction) UnmarshalTOML(v any) error {
	s, err := text(v, "harmful direction")
	*d = Direction(s)
	return err
}

// Measure is what an indicator computes.
type Measure string

const (
	Magnitude Measure = "magnitude"
	Recovery  Measure = "recovery"
	MemoryM   Measure = "memory"
	// ResponseSlope is the Theil–Sen slope of the harmful departure on the
	// driver's intensity: the response per unit of disturbance.
	ResponseSlope Measure = "response_slope"
	Frequency     Measure = "frequency"
	Attribute     Measure = "attribute"
	// CriterionM is a station's performance against a [[criterion]].
	CriterionM Measure = "criterion"
)

// Measures lists every measure.
var Measures = []Measure{Magnitude, Recovery, MemoryM, ResponseSlope, Frequency, Attribute, CriterionM}

// Comparison says which disturbances the stations are compared on.
type Comparison struct {
	// Basis is "station" (every station on its own events) or "shared"
	// (only the events that overlap a regional event: a run of days on
	// which at least MinShare of the stations of the normalisation group
	// with a record were in an event of that kind).
	Basis string `toml:"basis"`
	// MinShare is the share of stations, in (0, 1], that makes an event
	// regional.
	MinShare float64 `toml:"min_share"`
}

// Comparison bases.
const (
	BasisStation = "station"
	BasisShared  = "shared"
)

// Event weightings.
const (
	WeightNone     = "none"
	WeightSeverity = "severity"
)

// DefaultMinSeverity is the least severity class a measure counts when the
// indicator does not say: strong (2) for magnitude, recovery and frequency,
// so that a station's typical response is its response to the disturbances
// that matter, not to however many mild ones it happened to have; moderate
// (1, every event) for the slopes, which need the spread of mild to severe
// events to be estimated.
func DefaultMinSeverity(m Measure) int {
	switch m {
	case Magnitude, Recovery, Frequency:
		return 2
	}
	return 1
}

// SeverityFloor returns the least severity class the indicator counts.
func (in Indicator) SeverityFloor() int {
	if in.MinSeverity != nil {
		return *in.MinSeverity
	}
	return DefaultMinSeverity(in.Measure)
}

// FromEvents reports whether the measure is computed from the events table.
func (m Measure) FromEvents() bool { return m != Attribute && m != CriterionM && m != "" }

func (m *Measure) UnmarshalTOML(v any) error {
	s, err := text(v, "measure")
	*m = Measure(s)
	return err
}

// Transform is applied to attribute values before normalisation.
type Transform string

const (
	NoTransform Transform = "none"
	Log         Transform = "log"
	Sqrt        Transform = "sqrt"
)

func (t *Transform) UnmarshalTOML(v any) error {
	s, err := text(v, "transform")
	*t = Transform(s)
	return err
}

// Better says which raw values are more resilient.
type Better string

const (
	Higher Better = "higher"
	Lower  Better = "lower"
)

func (b *Better) UnmarshalTOML(v any) error {
	s, err := text(v, "better")
	*b = Better(s)
	return err
}

// NormMethod is a normalisation method.
type NormMethod string

const (
	MinMax  NormMethod = "minmax"
	ZScore  NormMethod = "zscore"
	Rank    NormMethod = "rank"
	TargetN NormMethod = "target"
)

// NormMethods lists every normalisation method.
var NormMethods = []NormMethod{MinMax, ZScore, Rank, TargetN}

func (n *NormMethod) UnmarshalTOML(v any) error {
	s, err := text(v, "normalisation method")
	*n = NormMethod(s)
	return err
}

// Scope is the set of stations a normalisation is computed over.
type Scope string

const (
	ScopeAll     Scope = "all"
	ScopeGroup   Scope = "group"
	ScopeCluster Scope = "cluster"
)

// Scopes lists every scope.
var Scopes = []Scope{ScopeAll, ScopeGroup, ScopeCluster}

func (s *Scope) UnmarshalTOML(v any) error {
	c, err := text(v, "scope")
	*s = Scope(c)
	return err
}

// WeightMethod is how weights are set.
type WeightMethod string

const (
	Explicit WeightMethod = "explicit"
	Equal    WeightMethod = "equal"
	AHPW     WeightMethod = "ahp"
)

func (w *WeightMethod) UnmarshalTOML(v any) error {
	s, err := text(v, "weighting method")
	*w = WeightMethod(s)
	return err
}

// AggMethod is an aggregation method.
type AggMethod string

const (
	Arithmetic AggMethod = "arithmetic"
	Geometric  AggMethod = "geometric"
)

// AggMethods lists every aggregation method.
var AggMethods = []AggMethod{Arithmetic, Geometric}

func (a *AggMethod) UnmarshalTOML(v any) error {
	s, err := text(v, "aggregation method")
	*a = AggMethod(s)
	return err
}

// MissingPolicy is what happens to missing indicator values.
type MissingPolicy string

const (
	Renormalize MissingPolicy = "renormalize"
	Impute      MissingPolicy = "impute"
	ErrorPolicy MissingPolicy = "error"
)

func (m *MissingPolicy) UnmarshalTOML(v any) error {
	s, err := text(v, "missing policy")
	*m = MissingPolicy(s)
	return err
}

// DrynessScale says what the antecedent_dryness column holds.
type DrynessScale string

const (
	Fraction DrynessScale = "fraction"
	Index    DrynessScale = "index"
)

func (d *DrynessScale) UnmarshalTOML(v any) error {
	s, err := text(v, "dryness scale")
	*d = DrynessScale(s)
	return err
}

// Weight is a non-negative, finite indicator weight.
type Weight float64

func (w *Weight) UnmarshalTOML(v any) error {
	x, err := number(v, "weight")
	if err != nil {
		return err
	}
	*w = Weight(x) // the sign is checked by Validate
	return nil
}

// Judgement is one AHP matrix entry: a positive number, or a fraction
// written as a string such as "1/3".
type Judgement float64

func (j *Judgement) UnmarshalTOML(v any) error {
	var x float64
	if s, ok := v.(string); ok {
		num, den, isFrac := strings.Cut(strings.TrimSpace(s), "/")
		a, err1 := strconv.ParseFloat(strings.TrimSpace(num), 64)
		b := 1.0
		var err2 error
		if isFrac {
			b, err2 = strconv.ParseFloat(strings.TrimSpace(den), 64)
		}
		x = a / b
		if err1 != nil || err2 != nil || b == 0 {
			x = math.NaN() // reported by Validate
		}
	} else {
		var err error
		if x, err = number(v, "ahp judgement"); err != nil {
			return err
		}
	}
	*j = Judgement(x) // positivity is checked by Validate
	return nil
}

func number(v any, what string) (float64, error) {
	var x float64
	switch v := v.(type) {
	case int64:
		x = float64(v)
	case float64:
		x = v
	default:
		return 0, fmt.Errorf("%s: want a number, got %s", what, describe(v))
	}
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, fmt.Errorf("%s: want a finite number, got %g", what, x)
	}
	return x, nil
}

func strs[T ~string](xs []T) []string {
	out := make([]string, len(xs))
	for i, x := range xs {
		out[i] = string(x)
	}
	return out
}
