package report

import (
	"bytes"
	"encoding/json"
	"io"
	"math"
	"runtime"

	"github.com/BurntSushi/toml"

	"rebound/cmd/rebound/internal/pipeline"
)

// Meta says what produced a run.
type Meta struct {
	Version string // tool version
	RunDate string // YYYY-MM-DD; see the command's documentation
	Outputs []string
}

// Manifest is the content of run.json.
type Manifest struct {
	Tool       string              `json:"tool"`
	Version    string              `json:"version"`
	Go         string              `json:"go"`
	RunDate    string              `json:"run_date"`
	ConfigFile string              `json:"config_file"`
	Seed       uint64              `json:"seed"`
	Config     map[string]any      `json:"config"`
	Inputs     []ManifestInput     `json:"inputs"`
	Weights    ManifestWeights     `json:"weights"`
	Series     *ManifestSeries     `json:"series,omitempty"`
	Clustering *ManifestClustering `json:"clustering,omitempty"`
	// Sensitivity summarises the sensitivity analysis; absent when it did
	// not run.
	Sensitivity *ManifestSensitivity `json:"sensitivity,omitempty"`
	Stations    int                  `json:"stations"`
	Scored      int                  `json:"scored"`
	Outputs     []string             `json:"outputs"`
	Warnings    []string             `json:"warnings"`
	Caution     string               `json:"caution"`
}

// ManifestInput is one input file.
type ManifestInput struct {
	Role     string   `json:"role"`
	Path     string   `json:"path"`
	SHA256   string   `json:"sha256"`
	Bytes    int64    `json:"bytes"`
	Rows     int      `json:"rows"`
	Rejected int      `json:"rejected"`
	Notes    []string `json:"notes,omitempty"`
}

// ManifestSeries says what the pass over the daily series read, dropped and
// filled, in total and per station.
type ManifestSeries struct {
	Rows     int                                  `json:"rows"`
	Stations int                                  `json:"stations"`
	Skipped  map[string]int                       `json:"skipped_variables,omitempty"`
	Unknown  []string                             `json:"stations_not_in_attributes,omitempty"`
	Totals   map[string]ManifestCounts            `json:"totals"`
	Station  map[string]map[string]ManifestCounts `json:"per_station"`
}

// ManifestCounts are one variable's counts (see series.Counts).
type ManifestCounts struct {
	Rows       int `json:"rows"`
	Kept       int `json:"kept"`
	Blank      int `json:"blank"`
	Excluded   int `json:"excluded_by_qualifier"`
	Filled     int `json:"filled"`
	Converted  int `json:"converted"`
	OutOfRange int `json:"out_of_range"`
}

// ManifestWeights are the weights actually used.
type ManifestWeights struct {
	Method  string             `json:"method"`
	Weights map[string]float64 `json:"weights"`
	AHP     *ManifestAHP       `json:"ahp,omitempty"`
}

// ManifestAHP reports the AHP consistency figures.
type ManifestAHP struct {
	LambdaMax float64 `json:"lambda_max"`
	CI        float64 `json:"consistency_index"`
	RI        float64 `json:"random_index"`
	CR        float64 `json:"consistency_ratio"`
}

// Caution is the standing caution that every output carries.
const Caution = "Screening aid, not a regulatory determination. Results depend on the inputs, indicators and weights chosen; " +
	"defer to the water-quality standards that apply locally and to licensed professional judgement before acting on them."

// BuildManifest collects the manifest of a finished run.
func BuildManifest(r *pipeline.Run, m Meta) (*Manifest, error) {
	cfgMap, err := configMap(r)
	if err != nil {
		return nil, err
	}
	man := &Manifest{
		Tool: "rebound", Version: m.Version, Go: runtime.Version(), RunDate: m.RunDate,
		ConfigFile: r.Config.File, Seed: r.Config.Seed, Config: cfgMap,
		Stations: len(r.Raw.Stations), Outputs: m.Outputs, Caution: Caution,
		Weights:  ManifestWeights{Method: string(r.Weights.Method), Weights: map[string]float64{}},
		Warnings: []string{},
	}
	for _, in := range r.Inputs {
		man.Inputs = append(man.Inputs, ManifestInput(in))
	}
	for j, ind := range r.Raw.Indicators {
		man.Weights.Weights[ind.Name] = r.Weights.W[j]
	}
	if a := r.Weights.AHP; a != nil {
		man.Weights.AHP = &ManifestAHP{a.LambdaMax, a.CI, a.RI, a.CR}
	}
	for _, s := range r.Result.Score {
		if !math.IsNaN(s) {
			man.Scored++
		}
	}
	for _, w := range r.Warnings {
		man.Warnings = append(man.Warnings, w.Error())
	}
	man.Clustering = clusterManifest(r)
	man.Sensitivity = manifestSensitivity(r)
	if sum := r.SeriesSummary; sum != nil {
		ms := &ManifestSeries{Rows: sum.Rows, Stations: sum.Stations, Skipped: sum.Skipped, Unknown: sum.Unknown,
			Totals: map[string]ManifestCounts{}, Station: map[string]map[string]ManifestCounts{}}
		for v, c := range sum.Vars {
			ms.Totals[v] = ManifestCounts(*c)
		}
		for _, st := range r.Stations {
			m := map[string]ManifestCounts{}
			for v, c := range st.Counts {
				m[v] = ManifestCounts(*c)
			}
			ms.Station[st.ID] = m
		}
		man.Series = ms
	}
	return man, nil
}

// configMap renders the resolved configuration (defaults filled in) as a
// map keyed like the TOML file.
func configMap(r *pipeline.Run) (map[string]any, error) {
	var buf bytes.Buffer
	if err := toml.NewEncoder(&buf).Encode(r.Config); err != nil {
		return nil, err
	}
	m := map[string]any{}
	if _, err := toml.Decode(buf.String(), &m); err != nil {
		return nil, err
	}
	return m, nil
}

// WriteManifest writes man as indented JSON.
func WriteManifest(w io.Writer, man *Manifest) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(man)
}
