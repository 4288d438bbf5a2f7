package config

import (
	"reflect"
	"slices"
	"strings"
	"testing"
)

func TestClusteringSection(t *testing.T) {
	ind := "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\n"
	t.Run("absent", func(t *testing.T) {
		cfg, errs := Decode(base+ind, "c.toml")
		if len(errs) > 0 || cfg.Clustering != nil {
			t.Fatalf("errs %v, clustering %+v", errs, cfg.Clustering)
		}
		if f := cfg.ClusterFeatures(); f != nil {
			t.Errorf("ClusterFeatures without clustering = %v", f)
		}
	})
	t.Run("empty section takes the defaults", func(t *testing.T) {
		cfg, errs := Decode(base+ind+"[clustering]\n", "c.toml")
		if errs = append(errs, cfg.Validate()...); len(errs) > 0 {
			t.Fatal(errs)
		}
		if !reflect.DeepEqual(cfg.Clustering, DefaultClustering()) {
			t.Errorf("got %+v, want %+v", cfg.Clustering, DefaultClustering())
		}
	})
	t.Run("keys decode", func(t *testing.T) {
		text := base + ind + `[clustering]
features = ["water_temperature.mean", "discharge.bfi"]
scale = "robust"
pca_components = 2
method = "kmeans"
k = 4
k_min = 3
k_max = 6
restarts = 5
max_iter = 50
bootstrap = 0
two_stage_above = 500
two_stage_groups = 50
min_coverage = 0.9
min_years = 3
max_lag = 5
`
		cfg, errs := Decode(text, "c.toml")
		if errs = append(errs, cfg.Validate()...); len(errs) > 0 {
			t.Fatal(errs)
		}
		want := &Clustering{Features: []string{"water_temperature.mean", "discharge.bfi"}, Scale: "robust", PCAComponents: 2,
			Method: "kmeans", K: 4, KMin: 3, KMax: 6, Restarts: 5, MaxIter: 50, Bootstrap: 0, TwoStageAbove: 500,
			TwoStageGroups: 50, MinCoverage: 0.9, MinYears: 3, MaxLag: 5}
		if !reflect.DeepEqual(cfg.Clustering, want) {
			t.Errorf("got %+v\nwant %+v", cfg.Clustering, want)
		}
		if got := cfg.ClusterFeatures(); !slices.Equal(got, want.Features) {
			t.Errorf("ClusterFeatures = %v", got)
		}
	})
}

// The default features are those of features.DefaultFeatures whose
// variables the configuration defines.
func TestClusterFeaturesDefaults(t *testing.T) {
	cfg, errs := Decode(base+"[[variable]]\nname = \"water_temperature\"\nunits = \"degC\"\n[[variable]]\nname = \"discharge\"\nunits = \"m3/s\"\n[clustering]\n", "c.toml")
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	got := cfg.ClusterFeatures()
	for _, f := range got {
		if !strings.HasPrefix(f, "water_temperature.") && !strings.HasPrefix(f, "discharge.") {
			t.Errorf("feature %q of an undefined variable", f)
		}
		if strings.HasSuffix(f, ".thermal_sensitivity") || strings.HasSuffix(f, ".air_lag") {
			t.Errorf("feature %q needs air temperature, which is not defined", f)
		}
	}
	// 8 statistics of water temperature, and 9 generic and 3 flow statistics
	// of discharge.
	if len(got) != 20 {
		t.Errorf("%d default features: %v", len(got), got)
	}
	cfg.Clustering.FeaturesFile = "f.csv"
	if f := cfg.ClusterFeatures(); f != nil {
		t.Errorf("ClusterFeatures with a features file = %v", f)
	}
}

func TestClusteringErrors(t *testing.T) {
	head := base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\n[clustering]\n"
	tests := []struct {
		name, toml string
		want       []string
	}{
		{"bad method with suggestion", head + "method = \"kmean\"\n",
			[]string{`c.toml:10:10: clustering.method: want one of "kmeans", "ward", "average", "complete", "single", got "kmean" (did you mean "kmeans"?)`}},
		{"bad scale", head + "scale = \"minmax\"\n",
			[]string{`c.toml:10:9: clustering.scale: want one of "zscore", "robust", "none", got "minmax"`}},
		{"k of 1", head + "k = 1\n", []string{`c.toml:10:5: clustering.k: want k >= 2 (or 0 to choose k from k_min..k_max), got 1`}},
		{"k range", head + "k_min = 1\nk_max = 0\n", []string{`clustering.k_min: want >= 2, got 1`, `clustering.k_max: want >= k_min = 1, got 0`}},
		{"counts", head + "restarts = 0\nmax_iter = 0\nbootstrap = -1\npca_components = -2\nmin_years = -1\nmax_lag = 0\n",
			[]string{`clustering.restarts: want >= 1`, `clustering.max_iter: want >= 1`, `clustering.bootstrap: want a number of replicates >= 0`,
				`clustering.pca_components: want a number of components >= 0`, `clustering.min_years: want years >= 0`, `clustering.max_lag: want days >= 1`}},
		{"coverage", head + "min_coverage = 1.5\n", []string{`c.toml:10:16: clustering.min_coverage: want a fraction of days in (0, 1], got 1.5`}},
		{"two stage", head + "two_stage_above = 2\ntwo_stage_groups = 10\n",
			[]string{`clustering.two_stage_above: want a number of stations >= 3, got 2`, `clustering.two_stage_groups: want more groups than the largest k (10), got 10`}},
		{"unknown statistic", head + "features = [\"water_temperature.median\"]\n",
			[]string{`c.toml:10:12: clustering.features: "water_temperature.median": unknown statistic "median"`}},
		{"undefined variable", head + "features = [\"turbidity.mean\"]\n",
			[]string{`clustering.features: "turbidity.mean": variable "turbidity" is not defined in a [[variable]] table`}},
		{"features and a table", head + "features = [\"discharge.bfi\"]\nfeatures_file = \"f.csv\"\n",
			[]string{`clustering.features: features are computed from the series, but features_file gives a precomputed table`}},
		{"unknown key", head + "linkage = \"ward\"\n", []string{`c.toml:10: clustering.linkage: unknown key`}},
		{"wrong type", head + "k = \"four\"\n", []string{`c.toml:10:5: clustering.k: want an integer, got a string`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			cfg, errs := Decode(tc.toml, "c.toml")
			if len(errs) == 0 {
				errs = cfg.Validate()
			}
			var got []string
			for _, e := range errs {
				got = append(got, e.Error())
			}
			all := strings.Join(got, "\n")
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("missing error %q; got:\n%s", w, all)
				}
			}
		})
	}
}

// A scope of "cluster" needs the section.
func TestClusterScopeNeedsSection(t *testing.T) {
	text := base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\n[normalization]\nscope = \"cluster\"\n"
	cfg, errs := Decode(text, "c.toml")
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	errs = cfg.Validate()
	if len(errs) != 1 || !strings.Contains(errs[0].Error(), `scope "cluster" needs a [clustering] section`) {
		t.Errorf("errors: %v", errs)
	}
	cfg, errs = Decode(text+"[clustering]\n", "c.toml")
	if errs = append(errs, cfg.Validate()...); len(errs) > 0 {
		t.Errorf("with the section: %v", errs)
	}
}

// FuzzClustering: no [clustering] section panics the decoder, the
// validation or ClusterFeatures, and every error prints.
func FuzzClustering(f *testing.F) {
	f.Add("features = [\"water_temperature.mean\", \"discharge.p05\"]\nk = 3\n")
	f.Add("features = [\"x\", \".mean\", \"discharge.\", \"a.b.c\"]\nmethod = \"average\"\nscale = \"robust\"\n")
	f.Add("k = -1\nk_min = 5\nk_max = 2\ntwo_stage_groups = 0\nmin_coverage = nan\n")
	f.Add("features_file = \"f.csv\"\npca_components = 3\n")
	f.Fuzz(func(t *testing.T, section string) {
		cfg, errs := Decode(base+"[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\n[clustering]\n"+section, "f.toml")
		if len(errs) == 0 {
			errs = cfg.Validate()
			cfg.ClusterFeatures()
		}
		for _, e := range errs {
			_ = e.Error()
		}
	})
}
