package config

import (
	"math"
	"slices"
	"strings"

	"rebound/clustering/features"
)

// Clustering configures station clustering by features of the daily
// records ([clustering]). The section's presence turns clustering on; every
// field has a default (DefaultClustering) and a comment in the template.
type Clustering struct {
	// Features lists the features computed from each station's daily
	// records, "<variable>.<statistic>" (see package
	// rebound/clustering/features). Empty means the features'
	// defaults whose variables are all defined in [[variable]] tables
	// (ClusterFeatures).
	Features []string `toml:"features"`
	// FeaturesFile is a precomputed feature table (CSV: station, then
	// numeric columns) clustered instead of features of the series.
	FeaturesFile string `toml:"features_file"`
	// Scale is how features are put on a common scale: "zscore" (mean and
	// population standard deviation), "robust" (median and MAD × 1.4826)
	// or "none".
	Scale string `toml:"scale"`
	// PCAComponents, when positive, clusters the scores of that many
	// principal components of the scaled features; 0 clusters the scaled
	// features themselves.
	PCAComponents int `toml:"pca_components"`
	// Method is the partition used for peer groups and profiles: "kmeans"
	// or the linkage "ward", "average", "complete" or "single".
	Method string `toml:"method"`
	// K fixes the number of clusters; 0 chooses it from KMin..KMax by the
	// highest mean silhouette width of Method.
	K    int `toml:"k"`
	KMin int `toml:"k_min"`
	KMax int `toml:"k_max"`
	// Restarts and MaxIter configure k-means: the number of k-means++
	// seedings kept best of, and the most Lloyd iterations of each.
	Restarts int `toml:"restarts"`
	MaxIter  int `toml:"max_iter"`
	// Bootstrap is the number of bootstrap replicates of the stability
	// assessment; 0 turns it off.
	Bootstrap int `toml:"bootstrap"`
	// TwoStageAbove is the number of stations above which Ward linkage
	// runs in two stages (k-means to TwoStageGroups groups, then Ward on
	// the groups) and the other linkages are skipped.
	TwoStageAbove  int `toml:"two_stage_above"`
	TwoStageGroups int `toml:"two_stage_groups"`
	// MinCoverage and MinYears are the record a station needs for every
	// variable its features use: MinYears years (water years when
	// events.water_year is set) with at least MinCoverage of their days.
	MinCoverage float64 `toml:"min_coverage"`
	MinYears    int     `toml:"min_years"`
	// MaxLag is the largest lag, in days, tried for the lag of water
	// behind air temperature (air_lag).
	MaxLag int `toml:"max_lag"`
}

// The choices of clustering.method and clustering.scale.
var (
	ClusterMethods = []string{"kmeans", "ward", "average", "complete", "single"}
	ClusterScales  = []string{"zscore", "robust", "none"}
)

// DefaultClustering returns the clustering defaults.
func DefaultClustering() *Clustering {
	return &Clustering{
		Features: []string{}, Scale: "zscore", Method: "ward",
		KMin: 2, KMax: 10, Restarts: 20, MaxIter: 300, Bootstrap: 100,
		TwoStageAbove: 30000, TwoStageGroups: 1000,
		MinCoverage: 0.8, MinYears: 5, MaxLag: 10,
	}
}

// ClusterFeatures returns the features clustering computes from the
// series: clustering.features when it is set, otherwise the default
// features (features.DefaultFeatures) of the variables that [[variable]]
// tables define. It returns nil when clustering is off or reads a feature
// table.
func (c *Config) ClusterFeatures() []string {
	cl := c.Clustering
	if cl == nil || cl.FeaturesFile != "" {
		return nil
	}
	if len(cl.Features) > 0 {
		return slices.Clone(cl.Features)
	}
	var out []string
	for _, f := range features.DefaultFeatures() {
		if c.hasFeatureVars(f) {
			out = append(out, f)
		}
	}
	return out
}

// hasFeatureVars reports whether every variable feature f uses is defined.
func (c *Config) hasFeatureVars(f string) bool {
	v, stat, _ := strings.Cut(f, ".")
	if _, ok := c.Variable(v); !ok {
		return false
	}
	if stat == "thermal_sensitivity" || stat == "air_lag" {
		_, ok := c.Variable("air_temperature")
		return ok
	}
	return true
}

func (c *Config) validateClustering(bad reportFunc) {
	cl := c.Clustering
	if cl == nil {
		return
	}
	if msg := choiceMsg(cl.Scale, ClusterScales); msg != "" {
		bad("clustering.scale", "%s", msg)
	}
	if msg := choiceMsg(cl.Method, ClusterMethods); msg != "" {
		bad("clustering.method", "%s", msg)
	}
	if cl.PCAComponents < 0 {
		bad("clustering.pca_components", "want a number of components >= 0 (0 = no PCA), got %d", cl.PCAComponents)
	}
	if cl.K < 0 || cl.K == 1 {
		bad("clustering.k", "want k >= 2 (or 0 to choose k from k_min..k_max), got %d", cl.K)
	}
	if cl.KMin < 2 {
		bad("clustering.k_min", "want >= 2, got %d", cl.KMin)
	}
	if cl.KMax < cl.KMin {
		bad("clustering.k_max", "want >= k_min = %d, got %d", cl.KMin, cl.KMax)
	}
	if cl.Restarts < 1 {
		bad("clustering.restarts", "want >= 1, got %d", cl.Restarts)
	}
	if cl.MaxIter < 1 {
		bad("clustering.max_iter", "want >= 1, got %d", cl.MaxIter)
	}
	if cl.Bootstrap < 0 {
		bad("clustering.bootstrap", "want a number of replicates >= 0 (0 = no stability assessment), got %d", cl.Bootstrap)
	}
	if cl.TwoStageAbove < 3 {
		bad("clustering.two_stage_above", "want a number of stations >= 3, got %d", cl.TwoStageAbove)
	}
	if kk := max(cl.KMax, cl.K); cl.TwoStageGroups <= kk {
		bad("clustering.two_stage_groups", "want more groups than the largest k (%d), got %d", kk, cl.TwoStageGroups)
	}
	if !(cl.MinCoverage > 0 && cl.MinCoverage <= 1) || math.IsNaN(cl.MinCoverage) {
		bad("clustering.min_coverage", "want a fraction of days in (0, 1], got %g", cl.MinCoverage)
	}
	if cl.MinYears < 0 {
		bad("clustering.min_years", "want years >= 0, got %d", cl.MinYears)
	}
	if cl.MaxLag < 1 {
		bad("clustering.max_lag", "want days >= 1, got %d", cl.MaxLag)
	}
	if cl.FeaturesFile != "" && len(cl.Features) > 0 {
		bad("clustering.features", "features are computed from the series, but features_file gives a precomputed table; remove one of the two")
	}
	if len(cl.Features) > 0 {
		if _, err := features.New(features.Config{Features: cl.Features}); err != nil {
			bad("clustering.features", "%s", strings.TrimPrefix(err.Error(), "features: "))
		}
		for _, f := range cl.Features {
			v, stat, ok := strings.Cut(f, ".")
			if !ok {
				continue // reported above
			}
			if _, ok := c.Variable(v); !ok {
				bad("clustering.features", "%q: variable %q is not defined in a [[variable]] table", f, v)
			} else if (stat == "thermal_sensitivity" || stat == "air_lag") && !c.hasFeatureVars(f) {
				bad("clustering.features", "%q needs air temperature: define a [[variable]] named \"air_temperature\"", f)
			}
		}
	}
	if cl.FeaturesFile == "" && len(cl.Features) == 0 && len(c.ClusterFeatures()) == 0 {
		bad("clustering.features", "none of the default features applies to the variables defined; list features, or name a features_file")
	}
}

const templateClustering = `
# Clustering of stations by features of their daily records, so that alike
# stations can be compared with each other (normalization.scope =
# "cluster"). The section's presence turns clustering on: remove the "# "
# before [clustering] and before the keys you set. "rebound cluster" runs
# it with these settings, or the defaults shown, whether or not the section
# is present.
# [clustering]
# Features computed from each station's series, "<variable>.<statistic>":
#   mean, sd, cv, skew, p10, p90 (or any pNN)   of the daily values
#   lag1        lag-1 autocorrelation of the anomalies from the annual cycle
#   amplitude, phase   size and day of year of the peak of the annual cycle
#   flashiness, bfi, q90_q50   flow indices (for discharge)
#   thermal_sensitivity, air_lag   water against air temperature (for
#               water_temperature; needs air_temperature)
# Empty means every statistic of water temperature, air temperature and
# discharge (not the cv of temperatures) whose variables are defined above.
# features = ["water_temperature.mean", "discharge.flashiness", "discharge.bfi"]
# Or cluster a precomputed table instead (CSV: station, then numeric
# columns); then leave features empty.
# features_file = ""
# Put features on a common scale: "zscore" (mean, standard deviation),
# "robust" (median, MAD x 1.4826) or "none" (features already comparable).
# scale = "zscore"
# Cluster the first pca_components principal components of the scaled
# features (their explained variance is reported); 0 = no PCA.
# pca_components = 0
# The partition used for peer groups and profiles: "kmeans", or
# hierarchical "ward", "average", "complete" or "single" linkage. All five
# are computed and compared.
# method = "ward"
# Number of clusters; 0 chooses it in k_min..k_max by the highest mean
# silhouette width of the method above (the smallest k on a tie).
# k = 0
# k_min = 2
# k_max = 10
# k-means: the best of restarts k-means++ seedings, each at most max_iter
# iterations.
# restarts = 20
# max_iter = 300
# Bootstrap replicates of the stability of each cluster (mean Jaccard
# similarity, Hennig 2007); 0 = none.
# bootstrap = 100
# Above two_stage_above stations, Ward linkage runs in two stages (k-means
# into two_stage_groups groups, then Ward on the groups) and the other
# linkages are skipped: their distance matrix would not fit in memory.
# two_stage_above = 30000
# two_stage_groups = 1000
# A station is clustered when every variable its features use has at least
# min_years years (water years if events.water_year = true) with
# min_coverage of their days; stations short of it are listed with the
# reason and left out.
# min_coverage = 0.8
# min_years = 5
# Largest lag in days tried for the lag of water behind air temperature.
# max_lag = 10
`

// ValidateClustering checks the [clustering] section alone, for a run that
// clusters a feature table without a configuration file.
func (c *Config) ValidateClustering() []error {
	var errs []error
	c.validateClustering(c.reporter(&errs))
	return errs
}
