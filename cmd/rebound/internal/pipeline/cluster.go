package pipeline

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"

	"gonum.org/v1/gonum/mat"

	"rebound/clustering"
	"rebound/clustering/features"
	"rebound/config"
	"rebound/index"
	"rebound/index/series"
)

// Unclustered is the normalisation group of the stations left out of
// clustering when normalization.scope = "cluster": they are normalised
// among themselves, and a warning says how many there are.
const Unclustered = "unclustered"

// KMeans is the name of the k-means partition in ClusterResult.Partitions
// and in the outputs; the linkages go by their own names ("ward", ...).
const KMeans = "kmeans"

// ClusterResult holds the clustering of the stations: the features, the
// partitions of k-means and of each linkage into K clusters, the table of
// validity indices from which K was chosen, their agreement, and the
// profiles and stability of the partition used for peer groups (Method).
// Rows of every per-station slice and matrix are the clustered stations,
// in Stations order; cluster labels are 0-based (the outputs number them
// from 1).
type ClusterResult struct {
	// Source is where the features came from: "series", or the path of
	// the feature table.
	Source string
	// Features names the features and Units gives their units ("" when
	// unknown, as for a feature table's columns).
	Features []string
	Units    []string
	// Stations are the stations clustered, in the order of the attribute
	// table (of the feature table when there is none).
	Stations []string
	// Values holds the features in their original units, one row per
	// station.
	Values *mat.Dense
	// Scale is how the features were scaled ("zscore", "robust" or
	// "none"); Scaled holds the scaled features, and Center and Spread
	// what was subtracted and divided by (0 and 1 for "none").
	Scale          string
	Scaled         *mat.Dense
	Center, Spread []float64
	// PCA is the principal component analysis whose scores were
	// clustered; nil when pca_components = 0.
	PCA *clustering.PCA
	// Excluded lists the stations left out, with the reason, in the order
	// of the attribute table.
	Excluded []features.Exclusion

	// Method is the partition used for peer groups and profiles: KMeans or
	// a linkage name.
	Method string
	// K is the number of clusters of every partition; Chosen says whether
	// it was chosen by the silhouette (true) or fixed by the configuration.
	K      int
	Chosen bool
	// Partitions holds k-means first, then each linkage computed (ward,
	// average, complete, single; ward alone in two stages).
	Partitions []Partition
	// Tables score each method for every k tried; Tables[i] belongs to
	// Partitions[i].
	Tables []clustering.KTable
	// Agreement holds the adjusted Rand index between every pair of
	// partitions.
	Agreement []Agreement
	// Widths holds the silhouette width of each station in the partition
	// used (NaN when the silhouette was not computed exactly).
	Widths []float64
	// Profiles describes each cluster of the partition used, in label
	// order; Medoids names each cluster's medoid station.
	Profiles []clustering.Profile
	Medoids  []string
	// Stability is the bootstrap stability of each cluster of the
	// partition used (Hennig 2007) over Replicates bootstrap replicates;
	// nil when clustering.bootstrap = 0.
	Stability  *clustering.Stability
	Replicates int
	// TwoStage says whether Ward linkage ran in two stages (more stations
	// than clustering.two_stage_above); the Ward tree's items are then the
	// first-stage groups (Partition.Tree.Group).
	TwoStage bool
	// Warnings are the warnings of the clustering (also in Run.Warnings).
	Warnings []error

	row map[string]int
}

// Partition is one method's partition of the stations into K clusters.
type Partition struct {
	Method string // KMeans or a linkage name
	Labels []int  // per station, 0..K−1
	// Tree is the hierarchical tree; nil for k-means.
	Tree *clustering.Tree
	// Cophenetic is the cophenetic correlation of the tree; NaN for
	// k-means and for a tree built in two stages.
	Cophenetic float64
	// Score holds the validity indices of the partition.
	Score clustering.KScore
}

// Agreement is the adjusted Rand index of two partitions.
type Agreement struct {
	A, B         string
	AdjustedRand float64
}

// Used returns the partition used for peer groups and profiles.
func (c *ClusterResult) Used() *Partition {
	for i := range c.Partitions {
		if c.Partitions[i].Method == c.Method {
			return &c.Partitions[i]
		}
	}
	return nil
}

// Table returns the validity table of the partition used.
func (c *ClusterResult) Table() *clustering.KTable {
	for i := range c.Partitions {
		if c.Partitions[i].Method == c.Method {
			return &c.Tables[i]
		}
	}
	return nil
}

// Label returns the cluster (0-based) of station id in the partition used;
// ok is false for a station left out.
func (c *ClusterResult) Label(id string) (label int, ok bool) {
	i, ok := c.row[id]
	if !ok {
		return -1, false
	}
	return c.Used().Labels[i], true
}

// Row returns the row of station id in Stations, or −1.
func (c *ClusterResult) Row(id string) int {
	if i, ok := c.row[id]; ok {
		return i
	}
	return -1
}

// GroupName is the normalisation group of cluster label (0-based).
func GroupName(label int) string { return fmt.Sprintf("cluster %d", label+1) }

// Groups returns the normalisation group of each station in ids: the
// cluster of the partition used ("cluster 1", ...), or Unclustered.
func (c *ClusterResult) Groups(ids []string) []string {
	out := make([]string, len(ids))
	for i, id := range ids {
		if l, ok := c.Label(id); ok {
			out[i] = GroupName(l)
		} else {
			out[i] = Unclustered
		}
	}
	return out
}

// clusterGroups returns the normalisation groups of the scored stations
// for scope "cluster", and a warning about stations left out.
func (r *Run) clusterGroups() []string {
	g := r.Clusters.Groups(r.Raw.Stations)
	n := 0
	for _, name := range g {
		if name == Unclustered {
			n++
		}
	}
	if n > 0 {
		r.Warnings = append(r.Warnings, &index.Warning{Msg: fmt.Sprintf(
			"normalization.scope = \"cluster\": %d stations left out of clustering are normalised together as group %q", n, Unclustered)})
	}
	return g
}

// extractor returns the feature extractor of the configuration, or nil
// when the run computes no features from the series.
func (r *Run) extractor() (*features.Extractor, error) {
	cfg := r.Config
	names := cfg.ClusterFeatures()
	if names == nil {
		return nil, nil
	}
	cl := cfg.Clustering
	req := series.Requirement{MinFraction: cl.MinCoverage, MinYears: cl.MinYears}
	if cfg.Events != nil {
		req.WaterYear = cfg.Events.WaterYear
	}
	// The pass over the series has filled short gaps already.
	return features.New(features.Config{Features: names, Coverage: req, MaxLag: cl.MaxLag})
}

// featureExtractor returns the function that computes a station's
// clustering features during the pass over the series, or nil when the run
// does not cluster. A station left out gets nil values and the reason.
func (r *Run) featureExtractor() func(*series.Station) ([]float64, string) {
	ex, err := r.extractor()
	if ex == nil || err != nil {
		return nil // an error is reported by cluster
	}
	return func(st *series.Station) ([]float64, string) {
		v, why := ex.Extract(nil, st)
		if why != "" {
			return nil, why
		}
		return v, ""
	}
}

// ClusterFile clusters the feature table at path (CSV: station, then
// numeric columns) without a configuration file: the clustering defaults,
// adjusted by opt.Clustering, and seed opt.Seed (1 when nil). The run has
// no attribute table, indicators or score; its stations are the table's.
func ClusterFile(path string, opt Options) (*Run, []error) {
	cfg := config.Default()
	cfg.Events, cfg.Sensitivity = nil, nil
	cfg.Clustering = config.DefaultClustering()
	if opt.Seed != nil {
		cfg.Seed = *opt.Seed
	}
	if opt.Clustering != nil {
		opt.Clustering(cfg.Clustering)
	}
	cfg.Clustering.FeaturesFile = path
	if errs := cfg.ValidateClustering(); len(errs) > 0 {
		return nil, errs
	}
	r := &Run{Config: cfg, clusterProgress: opt.ClusterProgress}
	if err := r.cluster(); err != nil {
		return nil, splitJoined(err)
	}
	return r, nil
}

// cluster groups the stations after the pass over the series, when the
// configuration has a [clustering] section.
func (r *Run) cluster() error {
	cl := r.Config.Clustering
	if cl == nil {
		return nil
	}
	t, units, source, warns, err := r.featureTable()
	if err != nil {
		return err
	}
	res, err := clusterTable(t, units, cl, r.Config.Seed, r.clusterProgress)
	if err != nil && r.Config.File != "" {
		return &config.Error{File: r.Config.File, Key: "clustering", Msg: err.Error()}
	}
	if err != nil {
		return fmt.Errorf("clustering: %w", err)
	}
	res.Source = source
	res.Warnings = append(warns, res.Warnings...)
	r.Clusters = res
	for _, e := range res.Excluded {
		r.Warnings = append(r.Warnings, &index.Warning{Station: e.Station, Msg: "left out of clustering: " + e.Reason})
	}
	for _, w := range res.Warnings {
		r.Warnings = append(r.Warnings, &index.Warning{Msg: "clustering: " + w.Error()})
	}
	return nil
}

// featureTable assembles the stations' features: from the pass over the
// series, or from the configured feature table. Rows follow the attribute
// table when there is one; its stations without features are excluded with
// the reason, and table rows of stations it lacks are skipped with a
// warning.
func (r *Run) featureTable() (t *features.Table, units []string, source string, warns []error, err error) {
	cfg := r.Config
	cl := cfg.Clustering
	if cl.FeaturesFile != "" {
		path := cfg.Path(cl.FeaturesFile)
		f, err := os.Open(path)
		if err != nil {
			return nil, nil, "", nil, err
		}
		defer f.Close()
		ft, err := features.ReadTable(f, path)
		if err != nil {
			return nil, nil, "", nil, err
		}
		in, err := digest("features", path)
		if err != nil {
			return nil, nil, "", nil, err
		}
		in.Rows = len(ft.Stations)
		r.Inputs = append(r.Inputs, in)
		units = make([]string, len(ft.Names))
		if r.Attrs == nil {
			return ft, units, path, nil, nil
		}
		t = &features.Table{Names: ft.Names}
		row := map[string]int{}
		for i, id := range ft.Stations {
			row[id] = i
		}
		known := map[string]bool{}
		for _, s := range r.Attrs.Stations {
			known[s.ID] = true
			i, ok := row[s.ID]
			if !ok {
				t.Excluded = append(t.Excluded, features.Exclusion{Station: s.ID, Reason: "not in the feature table " + filepath.Base(path)})
				continue
			}
			t.Stations = append(t.Stations, s.ID)
			t.Data = append(t.Data, ft.Row(i)...)
		}
		for _, id := range ft.Stations {
			if !known[id] {
				warns = append(warns, &index.Warning{Station: id, Msg: "in the feature table but not in the attribute table; skipped"})
			}
		}
		return t, units, path, warns, nil
	}
	if !cfg.HasSeries() {
		return nil, nil, "", nil, &config.Error{File: cfg.File, Key: "clustering",
			Msg: "clustering needs daily series (inputs.series or inputs.wide) or a feature table (clustering.features_file)"}
	}
	ex, err := r.extractor()
	if err != nil {
		return nil, nil, "", nil, &config.Error{File: cfg.File, Key: "clustering.features", Msg: err.Error()}
	}
	t = &features.Table{Names: ex.Names()}
	have := map[string]*StationSeries{}
	for _, s := range r.Stations {
		have[s.ID] = s
	}
	for _, s := range r.Attrs.Stations {
		ss, ok := have[s.ID]
		switch {
		case !ok:
			t.Excluded = append(t.Excluded, features.Exclusion{Station: s.ID, Reason: "no daily series"})
		case ss.Features == nil:
			t.Excluded = append(t.Excluded, features.Exclusion{Station: s.ID, Reason: ss.FeatureReason})
		default:
			t.Stations = append(t.Stations, s.ID)
			t.Data = append(t.Data, ss.Features...)
		}
	}
	return t, featureUnits(cfg, t.Names), "series", nil, nil
}

// featureUnits returns the units of the named features of the configured
// variables.
func featureUnits(cfg *config.Config, names []string) []string {
	var vars []series.Var
	for _, v := range cfg.Variables {
		vars = append(vars, series.Var{Name: v.Name, Units: v.Units})
	}
	known := map[string]string{}
	for _, in := range features.Available(vars...) {
		known[in.Name] = in.Units
	}
	out := make([]string, len(names))
	for i, n := range names {
		u, ok := known[n]
		if !ok && percentileRE.MatchString(n) {
			v, _, _ := strings.Cut(n, ".")
			u = known[v+".p10"]
		}
		out[i] = u
	}
	return out
}

var percentileRE = regexp.MustCompile(`\.p\d\d$`)

// clusterTable clusters the rows of t. progress, when not nil, hears of
// each stage.
func clusterTable(t *features.Table, units []string, cl *config.Clustering, seed uint64, progress func(stage string, done, total int)) (*ClusterResult, error) {
	res := &ClusterResult{Features: t.Names, Units: units, Excluded: slices.Clone(t.Excluded),
		Scale: cl.Scale, Method: cl.Method, row: map[string]int{}}
	if progress == nil {
		progress = func(string, int, int) {}
	}
	d := len(t.Names)
	// A station with a missing value cannot be placed.
	var data []float64
	for i, id := range t.Stations {
		row := t.Row(i)
		var missing []string
		for j, v := range row {
			if math.IsNaN(v) {
				missing = append(missing, t.Names[j])
			}
		}
		if len(missing) > 0 {
			res.Excluded = append(res.Excluded, features.Exclusion{Station: id, Reason: "missing: " + strings.Join(missing, ", ")})
			continue
		}
		res.row[id] = len(res.Stations)
		res.Stations = append(res.Stations, id)
		data = append(data, row...)
	}
	n := len(res.Stations)
	if n < 3 {
		msg := fmt.Sprintf("%d of the stations have a value of every feature, fewer than the 3 that clustering needs", n)
		if len(res.Excluded) > 0 {
			e := res.Excluded[0]
			msg += fmt.Sprintf(" (%d left out, the first, %s: %s)", len(res.Excluded), e.Station, e.Reason)
		}
		return nil, fmt.Errorf("%s", msg)
	}
	res.Values = mat.NewDense(n, d, data)

	// Scale, then optionally project.
	res.Scaled = mat.NewDense(n, d, nil)
	if cl.Scale == "none" {
		res.Scaled.Copy(res.Values)
		res.Center, res.Spread = make([]float64, d), make([]float64, d)
		for j := range res.Spread {
			res.Spread[j] = 1
		}
	} else {
		how, err := clustering.ParseScale(cl.Scale)
		if err != nil {
			return nil, err
		}
		if res.Center, res.Spread, err = clustering.Standardize(res.Scaled, res.Values, how); err != nil {
			return nil, err
		}
		for j, s := range res.Spread {
			if s == 0 {
				res.Warnings = append(res.Warnings, fmt.Errorf("feature %s has the same value at every station; it does not separate stations", t.Names[j]))
			}
		}
	}
	var x mat.Matrix = res.Scaled
	if c := cl.PCAComponents; c > 0 {
		if c > min(n, d) {
			return nil, fmt.Errorf("pca_components = %d, but %d stations of %d features have at most %d components", c, n, d, min(n, d))
		}
		p, err := clustering.PrincipalComponents(res.Scaled, c)
		if err != nil {
			return nil, err
		}
		res.PCA = &p
		x = p.Scores
	}

	// Methods: k-means and every linkage, or Ward alone in two stages.
	linkages := []clustering.Linkage{clustering.Ward, clustering.Average, clustering.Complete, clustering.Single}
	if n > cl.TwoStageAbove {
		res.TwoStage = true
		linkages = linkages[:1]
		if cl.Method != KMeans && cl.Method != "ward" {
			return nil, fmt.Errorf("method %q: %s linkage needs the distances of all %d stations (%.1f GB); above two_stage_above = %d stations use \"ward\" (in two stages) or \"kmeans\"",
				cl.Method, cl.Method, n, 4*float64(n)*float64(n-1)/1e9, cl.TwoStageAbove)
		}
		res.Warnings = append(res.Warnings, fmt.Errorf("%d stations, more than two_stage_above = %d: average, complete and single linkage were skipped", n, cl.TwoStageAbove))
	}
	km := clustering.KMeans{Restarts: cl.Restarts, MaxIter: cl.MaxIter, Seed: seed}
	ts := clustering.TwoStage{Above: cl.TwoStageAbove, Centroids: cl.TwoStageGroups}
	lo, hi := cl.KMin, cl.KMax
	if cl.K > 0 {
		if cl.K > n-1 {
			return nil, fmt.Errorf("k = %d, but %d stations can be split into at most %d clusters", cl.K, n, n-1)
		}
		lo, hi = min(lo, cl.K), max(hi, cl.K)
	}
	hi = min(hi, n-1)
	if lo > hi {
		return nil, fmt.Errorf("k_min = %d, but %d stations can be split into at most %d clusters", lo, n, n-1)
	}
	progress("scoring k", 0, hi-lo+1)
	tables, err := clustering.ChooseK(x, clustering.KSearch{Min: lo, Max: hi, KMeans: km, Linkages: linkages, TwoStage: ts, Seed: seed})
	if err != nil {
		return nil, err
	}
	res.Tables = tables
	for _, tb := range tables {
		res.Warnings = append(res.Warnings, tb.Warnings...)
	}
	res.K, res.Chosen = cl.K, cl.K == 0
	if res.Chosen {
		for _, tb := range tables {
			if tb.Method == cl.Method {
				res.K = tb.Best
			}
		}
	}
	k := res.K

	// The partitions at k.
	progress("partitions", 0, len(linkages)+1)
	kmk := km
	kmk.K = k
	kr, err := kmk.Cluster(x)
	if err != nil {
		return nil, err
	}
	res.Partitions = append(res.Partitions, Partition{Method: KMeans, Labels: kr.Labels, Cophenetic: math.NaN()})
	for i, l := range linkages {
		tree := tables[i+1].Tree // ChooseK lists k-means first, then each linkage
		p := Partition{Method: l.String(), Tree: tree, Labels: tree.Cut(nil, k), Cophenetic: math.NaN()}
		if !tree.TwoStage {
			p.Cophenetic = clustering.CopheneticCorrelation(tree.Dendrogram, clustering.Pairwise(x))
		}
		res.Partitions = append(res.Partitions, p)
	}
	for i := range res.Partitions {
		for _, sc := range tables[i].Scores {
			if sc.K == k {
				res.Partitions[i].Score = sc
			}
		}
	}
	for i, a := range res.Partitions {
		for _, b := range res.Partitions[i+1:] {
			res.Agreement = append(res.Agreement, Agreement{A: a.Method, B: b.Method, AdjustedRand: clustering.AdjustedRand(a.Labels, b.Labels)})
		}
	}

	used := res.Used()
	res.Widths = make([]float64, n)
	if n <= clustering.SilhouetteExactMax {
		clustering.Silhouette(x, used.Labels, res.Widths)
	} else {
		for i := range res.Widths {
			res.Widths[i] = math.NaN()
		}
		res.Warnings = append(res.Warnings, fmt.Errorf("silhouette widths are not given per station above %d stations; the mean widths are estimated from %d stations",
			clustering.SilhouetteExactMax, clustering.SilhouetteSampleSize))
	}

	// Profiles describe the centroids in standard deviations, so with
	// unscaled features they use z-scores.
	std := res.Scaled
	if cl.Scale == "none" {
		std = mat.NewDense(n, d, nil)
		if _, _, err := clustering.Standardize(std, res.Values, clustering.ZScore); err != nil {
			return nil, err
		}
	}
	words := make([]clustering.Words, d)
	for j, f := range t.Names {
		words[j] = FeatureWords(f)
	}
	if res.Profiles, err = clustering.Profiles(res.Values, std, used.Labels, words); err != nil {
		return nil, err
	}
	for _, p := range res.Profiles {
		m := ""
		if p.Medoid >= 0 {
			m = res.Stations[p.Medoid]
		}
		res.Medoids = append(res.Medoids, m)
	}

	if cl.Bootstrap > 0 {
		var method clustering.Method
		if used.Tree == nil {
			method = clustering.KMeansMethod(kmk)
		} else {
			l, _ := clustering.ParseLinkage(used.Method)
			method = clustering.TreeMethod(ts, l, k)
		}
		done := 0
		counted := func(x mat.Matrix) ([]int, error) {
			progress("bootstrap", done, cl.Bootstrap)
			done++
			return method(x)
		}
		st, err := clustering.Bootstrap{Replicates: cl.Bootstrap, Seed: seed}.Assess(x, used.Labels, counted)
		if err != nil {
			return nil, err
		}
		progress("bootstrap", cl.Bootstrap, cl.Bootstrap)
		res.Stability, res.Replicates = &st, cl.Bootstrap
	}
	return res, nil
}

// FeatureWords returns the plain-language words for the high and low ends
// of feature name ("<variable>.<statistic>"), used to describe clusters.
// Features it does not know get "high name" and "low name" (a column of a
// feature table, "petal_width", gets "high petal width").
func FeatureWords(name string) clustering.Words {
	v, stat, ok := strings.Cut(name, ".")
	if !ok {
		label := strings.ReplaceAll(name, "_", " ")
		return clustering.Words{High: "high " + label, Low: "low " + label}
	}
	if w, ok := knownWords[v+"."+stat]; ok {
		return w
	}
	label := strings.ReplaceAll(v, "_", " ")
	switch {
	case stat == "mean":
		return clustering.Words{High: "high " + label, Low: "low " + label}
	case stat == "sd", stat == "cv":
		return clustering.Words{High: "variable " + label, Low: "steady " + label}
	case stat == "skew":
		return clustering.Words{High: "right-skewed " + label, Low: "left-skewed " + label}
	case stat == "lag1":
		return clustering.Words{High: "persistent " + label + " anomalies", Low: "short-lived " + label + " anomalies"}
	case stat == "amplitude":
		return clustering.Words{High: "strongly seasonal " + label, Low: "weakly seasonal " + label}
	case stat == "phase":
		return clustering.Words{High: "late " + label + " peak", Low: "early " + label + " peak"}
	case percentileRE.MatchString("." + stat):
		return clustering.Words{High: "high " + label + " " + stat, Low: "low " + label + " " + stat}
	}
	return clustering.Words{High: "high " + name, Low: "low " + name}
}

// knownWords are the words of the default features.
var knownWords = map[string]clustering.Words{
	"water_temperature.mean":                {High: "warm", Low: "cool"},
	"water_temperature.sd":                  {High: "wide temperature range", Low: "narrow temperature range"},
	"water_temperature.skew":                {High: "warm spells stand out", Low: "cold spells stand out"},
	"water_temperature.lag1":                {High: "lasting temperature anomalies", Low: "brief temperature anomalies"},
	"water_temperature.amplitude":           {High: "large seasonal temperature swing", Low: "small seasonal temperature swing"},
	"water_temperature.phase":               {High: "late temperature peak", Low: "early temperature peak"},
	"water_temperature.p10":                 {High: "mild cold-season water", Low: "cold cold-season water"},
	"water_temperature.p90":                 {High: "hot summer water", Low: "cool summer water"},
	"water_temperature.thermal_sensitivity": {High: "follows air temperature", Low: "buffered from air temperature"},
	"water_temperature.air_lag":             {High: "slow to follow air temperature", Low: "quick to follow air temperature"},
	"air_temperature.mean":                  {High: "warm climate", Low: "cool climate"},
	"air_temperature.sd":                    {High: "wide air-temperature range", Low: "narrow air-temperature range"},
	"air_temperature.amplitude":             {High: "large seasonal air-temperature swing", Low: "small seasonal air-temperature swing"},
	"air_temperature.p10":                   {High: "mild winters", Low: "cold winters"},
	"air_temperature.p90":                   {High: "hot summers", Low: "cool summers"},
	"air_temperature.lag1":                  {High: "lasting weather anomalies", Low: "brief weather anomalies"},
	"discharge.mean":                        {High: "large river", Low: "small stream"},
	"discharge.sd":                          {High: "large flow swings", Low: "small flow swings"},
	"discharge.cv":                          {High: "variable flow", Low: "even flow"},
	"discharge.skew":                        {High: "flow dominated by floods", Low: "flow seldom in flood"},
	"discharge.lag1":                        {High: "slowly changing flow", Low: "quickly changing flow"},
	"discharge.amplitude":                   {High: "strongly seasonal flow", Low: "weakly seasonal flow"},
	"discharge.phase":                       {High: "late high-flow season", Low: "early high-flow season"},
	"discharge.p10":                         {High: "ample dry-weather flow", Low: "scant dry-weather flow"},
	"discharge.p90":                         {High: "large high flows", Low: "small high flows"},
	"discharge.flashiness":                  {High: "flashy", Low: "steady"},
	"discharge.bfi":                         {High: "much baseflow", Low: "little baseflow"},
	"discharge.q90_q50":                     {High: "sustained low flows", Low: "low flows drop away"},
	"specific_conductance.mean":             {High: "high conductance", Low: "low conductance"},
	"dissolved_oxygen.mean":                 {High: "well oxygenated", Low: "low in oxygen"},
}
