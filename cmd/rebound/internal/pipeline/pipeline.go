// Package pipeline runs rebound's job end to end for the command: it loads
// and checks the configuration and every input, derives the indicators,
// weights, scores and ranks, and collects what the writers need (input
// digests, row counts, warnings). It prints nothing.
package pipeline

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"

	"rebound/attributes"
	"rebound/config"
	"rebound/index"
)

// Input describes one input file as it was read.
type Input struct {
	Role     string // "config", "attributes", "events", ...
	Path     string // as given (resolved against the configuration)
	SHA256   string
	Bytes    int64
	Rows     int // data rows read
	Rejected int // rows rejected (always 0 in a run that succeeded)
	Notes    []string
}

// Run is one execution of the pipeline.
type Run struct {
	Config  *config.Config
	Attrs   *attributes.Table
	Events  *index.EventTable // nil when no indicator needs events
	Inputs  []Input
	Raw     *index.Raw
	Weights *index.Weights
	Result  *index.Result
	// Stations holds, per station with daily records, what the pass over
	// the series kept (derived events, criteria, features), in input order;
	// nil when the run reads no series.
	Stations      []*StationSeries
	SeriesSummary *SeriesSummary
	// Series is what the criterion indicators need.
	Series *index.Series
	// Clusters is the clustering of the stations ([clustering]); nil when
	// the run does not cluster.
	Clusters *ClusterResult
	// Sensitivity is the robustness analysis of the ranking
	// ([sensitivity]); nil when it did not run.
	Sensitivity *SensitivityResult
	// SensitivitySkipped says why a configured sensitivity analysis did
	// not run ("" when it ran or was not configured).
	SensitivitySkipped string
	// Warnings gathers every warning of every step, for the manifest,
	// workbook and memo.
	Warnings []error

	progress        func(int)
	onlyClusters    bool
	clusterProgress func(stage string, done, total int)
}

// Options adjusts how a run reads its inputs.
type Options struct {
	// Progress, when set, is called with the number of stations read so
	// far while the daily series are read.
	Progress func(stations int)
	// Clustering, when set, turns clustering on (with the defaults when
	// the configuration has no [clustering] section) and adjusts its
	// settings before the inputs are read: the cluster command's flags.
	Clustering func(*config.Clustering)
	// Seed, when set, replaces the configuration's seed before anything
	// random is drawn (clustering runs while the inputs are read).
	Seed *uint64
	// ClusterProgress, when set, is called as clustering goes through its
	// stages ("scoring k", "partitions", "bootstrap") with the work done
	// and the total.
	ClusterProgress func(stage string, done, total int)
	// OnlyClusters skips deriving events and criteria from the series (the
	// cluster command needs only the features); NoClusters skips the
	// clustering (the events and check commands).
	OnlyClusters, NoClusters bool
	// Checking validates the inputs without the costly parts that check
	// nothing (the clustering's bootstrap replicates).
	Checking bool
}

// Load reads and validates the configuration at path and every input it
// names, derives what the daily series give, and computes the raw
// indicators and weights. It returns every problem found.
func Load(path string) (*Run, []error) { return LoadWith(path, Options{}) }

// LoadWith is Load with options.
func LoadWith(path string, opt Options) (*Run, []error) {
	r, errs := LoadInputs(path, opt)
	if len(errs) > 0 {
		return nil, errs
	}
	if errs := r.computeIndicators(); len(errs) > 0 {
		return nil, errs
	}
	return r, nil
}

// LoadInputs reads and validates the configuration and every input, and
// makes the pass over the daily series (deriving events, criteria and
// features), but computes no indicator.
func LoadInputs(path string, opt Options) (*Run, []error) {
	cfg, errs := config.Load(path)
	if len(errs) > 0 {
		return nil, errs
	}
	if opt.Seed != nil {
		cfg.Seed = *opt.Seed
	}
	if opt.Clustering != nil {
		if cfg.Clustering == nil {
			cfg.Clustering = config.DefaultClustering()
		}
		opt.Clustering(cfg.Clustering)
		if errs := cfg.Validate(); len(errs) > 0 {
			return nil, errs
		}
	}
	if opt.NoClusters {
		cfg.Clustering = nil
	}
	if opt.Checking && cfg.Clustering != nil {
		cfg.Clustering.Bootstrap = 0
	}
	r := &Run{Config: cfg, progress: opt.Progress, clusterProgress: opt.ClusterProgress, onlyClusters: opt.OnlyClusters}
	if in, err := digest("config", path); err == nil {
		r.Inputs = append(r.Inputs, in)
	}

	attrPath := cfg.Path(cfg.Inputs.Attributes)
	attrs, aerrs := attributes.Load(attrPath)
	aerrs = keyed(cfg, "inputs.attributes", aerrs)
	errs = append(errs, aerrs...)
	if len(aerrs) == 0 {
		r.Attrs = attrs
		in, err := digest("attributes", attrPath)
		if err != nil {
			errs = append(errs, err)
		}
		in.Rows = attrs.Rows
		r.Inputs = append(r.Inputs, in)
		if cfg.Normalization.Scope == config.ScopeGroup && !attrs.HasGroup {
			errs = append(errs, &config.Error{File: cfg.File, Key: "normalization.scope",
				Msg: fmt.Sprintf("scope \"group\" needs a group column in %s", attrPath)})
		}
	}

	if cfg.Inputs.Events != "" {
		evPath := cfg.Path(cfg.Inputs.Events)
		events, eerrs := index.LoadEvents(evPath)
		eerrs = keyed(cfg, "inputs.events", eerrs)
		errs = append(errs, eerrs...)
		if len(eerrs) == 0 {
			r.Events = events
			in, err := digest("events", evPath)
			if err != nil {
				errs = append(errs, err)
			}
			in.Rows = len(events.Events)
			if len(events.Extra) > 0 {
				in.Notes = append(in.Notes, fmt.Sprintf("extra columns kept in the file but not used: %v", events.Extra))
			}
			r.Inputs = append(r.Inputs, in)
		}
	}
	if len(errs) > 0 {
		return nil, errs
	}
	if r.needsSeries() {
		if serrs := r.passSeries(50); len(serrs) > 0 {
			return nil, serrs
		}
	}
	if err := r.cluster(); err != nil {
		return nil, []error{err}
	}
	return r, nil
}

func (r *Run) computeIndicators() []error {
	cfg := r.Config
	raw, cerrs := index.Compute(r.Events, r.Attrs, cfg, r.Series)
	if len(cerrs) > 0 {
		return cerrs
	}
	r.Raw = raw
	r.Warnings = append(r.Warnings, raw.Warnings...)
	w, err := index.ResolveWeights(cfg)
	if err != nil {
		return []error{err}
	}
	r.Weights = w
	r.Warnings = append(r.Warnings, w.Warnings...)
	return nil
}

// Score normalises, aggregates and ranks.
func (r *Run) Score() error {
	var groups []string
	switch r.Config.Normalization.Scope {
	case config.ScopeGroup:
		groups = r.Raw.Groups
	case config.ScopeCluster:
		groups = r.clusterGroups()
	}
	res, err := index.Score(r.Raw, index.SpecFrom(r.Config, r.Weights, groups))
	if err != nil {
		if r.Config.DeriveEvents() && r.Events != nil && len(r.Events.Events) == 0 {
			return fmt.Errorf("%w; no event was derived from the series at any station: do they hold the drivers (%s for heat waves, %s for droughts and floods)? rebound events -config %s lists what each station lacks",
				err, r.Config.Events.Heatwave.Variable, r.Config.Events.Drought.Variable, r.Config.File)
		}
		return err
	}
	r.Result = res
	if err := r.analyzeSensitivity(); err != nil {
		return err
	}
	r.Warnings = append(r.Warnings, res.Warnings...)
	for i, id := range r.Raw.Stations {
		for j, ind := range r.Raw.Indicators {
			if note := r.Raw.Notes[i][j]; note != "" {
				r.Warnings = append(r.Warnings, &index.Warning{Station: id, Indicator: ind.Name, Msg: note})
			}
		}
		if r.Raw.Events[i] < r.Config.Missing.MinEvents && hasEventIndicator(r.Config) {
			r.Warnings = append(r.Warnings, &index.Warning{Station: id,
				Msg: fmt.Sprintf("%d events, fewer than missing.min_events = %d; read its score with care", r.Raw.Events[i], r.Config.Missing.MinEvents)})
		}
	}
	return nil
}

func hasEventIndicator(cfg *config.Config) bool {
	for _, in := range cfg.Indicators {
		if in.Measure.FromEvents() {
			return true
		}
	}
	return false
}

// OutputDir returns the output folder: override when not "", else the
// configuration's output.dir resolved against the configuration file.
func (r *Run) OutputDir(override string) string {
	if override != "" {
		return override
	}
	return r.Config.Path(r.Config.Output.Dir)
}

// CheckOutputs refuses output paths that would overwrite an input.
func (r *Run) CheckOutputs(paths []string) error {
	inputs := map[string]string{}
	for _, in := range r.Inputs {
		if abs, err := filepath.Abs(in.Path); err == nil {
			inputs[abs] = in.Role
		}
	}
	for _, p := range paths {
		abs, err := filepath.Abs(p)
		if err != nil {
			return err
		}
		if role, ok := inputs[abs]; ok {
			return fmt.Errorf("output %s is the %s input; choose another output folder (-out)", p, role)
		}
	}
	return nil
}

// keyed names the configuration key of an input file that cannot be
// opened, so that the message says which setting to fix:
// "study.toml: inputs.attributes: cannot open stations.csv: no such file
// or directory". Other errors already name the file, line and column.
func keyed(cfg *config.Config, key string, errs []error) []error {
	for i, err := range errs {
		var pe *fs.PathError
		if errors.As(err, &pe) && pe.Op == "open" {
			errs[i] = &config.Error{File: cfg.File, Key: key, Msg: fmt.Sprintf("cannot open %s: %v", pe.Path, pe.Err)}
		}
	}
	return errs
}

func digest(role, path string) (Input, error) {
	in := Input{Role: role, Path: path}
	f, err := os.Open(path)
	if err != nil {
		return in, err
	}
	defer f.Close()
	h := sha256.New()
	n, err := io.Copy(h, f)
	if err != nil {
		return in, fmt.Errorf("%s: %w", path, err)
	}
	in.SHA256 = hex.EncodeToString(h.Sum(nil))
	in.Bytes = n
	return in, nil
}

// ErrNoScore reports a run in which no station could be scored.
var ErrNoScore = errors.New("no station could be scored")
