package pipeline

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"
	"pgregory.net/rapid"

	"rebound/clustering"
	"rebound/clustering/features"
	"rebound/cmd/rebound/internal/demo"
	"rebound/config"
)

// writeDir writes name → content into a temporary folder and returns it.
func writeDir(t *testing.T, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for name, data := range files {
		p := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(data), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

func mustLoad(t *testing.T, path string, opt Options) *Run {
	t.Helper()
	r, errs := LoadInputs(path, opt)
	if len(errs) > 0 {
		for _, e := range errs {
			t.Error(e)
		}
		t.FailNow()
	}
	return r
}

// demoKind is the invented kind of a demo station, from its identifier:
// spring-fed FEN, snowmelt HIC, dam tailwater BRT-01..03, urban BRT-04..09
// and lowland LOW (see package demo).
func demoKind(id string) int {
	switch {
	case strings.HasPrefix(id, "FEN"):
		return 0
	case strings.HasPrefix(id, "HIC"):
		return 1
	case id <= "BRT-03" && strings.HasPrefix(id, "BRT"):
		return 2
	case strings.HasPrefix(id, "BRT"):
		return 3
	}
	return 4
}

// The demo plants five kinds of station; clustering its series must find
// them. The ground truth is the kind each station was generated as.
func TestDemoClustersMatchKinds(t *testing.T) {
	files, err := demo.Files()
	if err != nil {
		t.Fatal(err)
	}
	m := map[string]string{}
	for _, f := range files {
		m[f.Name] = string(f.Data)
	}
	r := mustLoad(t, filepath.Join(writeDir(t, m), demo.ConfigName), Options{})
	c := r.Clusters
	if c == nil {
		t.Fatal("the demo did not cluster")
	}
	if len(c.Excluded) != 0 || len(c.Stations) != 32 {
		t.Errorf("%d stations clustered, left out: %v", len(c.Stations), c.Excluded)
	}
	if c.K != 5 || !c.Chosen {
		t.Errorf("k = %d (chosen %v), want 5 chosen by the silhouette", c.K, c.Chosen)
	}
	kinds := make([]int, len(c.Stations))
	for i, id := range c.Stations {
		kinds[i] = demoKind(id)
	}
	for _, p := range c.Partitions {
		ari := clustering.AdjustedRand(p.Labels, kinds)
		t.Logf("%s: adjusted Rand index against the invented kinds %.4f", p.Method, ari)
		if ari < 0.95 {
			t.Errorf("%s: adjusted Rand index against the invented kinds %.3f, want >= 0.95", p.Method, ari)
		}
	}
	// The profiles read as the kinds were invented.
	want := map[int][]string{
		0: {"narrow temperature range"},   // spring-fed: groundwater buffers the temperature
		1: {"cool"},                       // snowmelt headwaters
		2: {"late temperature peak"},      // tailwater: the reservoir delays the warming
		3: {"flashy"},                     // urban
		4: {"large seasonal temperature"}, // lowland
	}
	for k, p := range c.Profiles {
		kind := demoKind(c.Medoids[k])
		for _, w := range want[kind] {
			if !strings.Contains(p.Description, w) {
				t.Errorf("cluster %d (medoid %s): description %q lacks %q", k+1, c.Medoids[k], p.Description, w)
			}
		}
		if j := c.Stability.Jaccard[k]; !(j >= 0.75) {
			t.Errorf("cluster %d: bootstrap stability %.3f, want >= 0.75 (stable after Hennig 2007)", k+1, j)
		}
	}
}

// stationSeries returns a long series of water temperature and discharge
// from first to first+days−1 (day numbers since 2010-01-01): an annual
// cycle of mean, amplitude and peak day for temperature, and a base flow
// with a storm every period days.
func stationSeries(id string, days int, mean, amp float64, peak int, base, storm float64, period int) string {
	var b strings.Builder
	start := 14610 // 2010-01-01 in days since 1970-01-01
	for d := range days {
		date := fmt.Sprint(dateString(start + d))
		w := mean + amp*math.Cos(2*math.Pi*float64(d-peak)/365.25) + 0.3*math.Sin(float64(d)*1.7)
		q := base * (1 + 0.3*math.Cos(2*math.Pi*float64(d-30)/365.25))
		if d%period < 3 {
			q += storm * float64(3-d%period)
		}
		fmt.Fprintf(&b, "%s,%s,water_temperature,%.3f\n%s,%s,discharge,%.4f\n", id, date, w, id, date, q)
	}
	return b.String()
}

func dateString(days int) string {
	// Civil date from days since 1970-01-01 (Howard Hinnant's algorithm).
	z := days + 719468
	era := z / 146097
	doe := z - era*146097
	yoe := (doe - doe/1460 + doe/36524 - doe/146096) / 365
	y := yoe + era*400
	doy := doe - (365*yoe + yoe/4 - yoe/100)
	mp := (5*doy + 2) / 153
	d := doy - (153*mp+2)/5 + 1
	m := mp + 3
	if m > 12 {
		m -= 12
		y++
	}
	return fmt.Sprintf("%04d-%02d-%02d", y, m, d)
}

const smallClusterConfig = `
[inputs]
events = "events.csv"
series = ["series.csv"]
attributes = "stations.csv"

[[variable]]
name = "water_temperature"
units = "degC"
[[variable]]
name = "discharge"
units = "m3/s"

[[indicator]]
name = "forest"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 1

[normalization]
scope = "cluster"

[clustering]
features = ["water_temperature.mean", "water_temperature.amplitude", "discharge.flashiness", "discharge.bfi"]
min_years = 2
min_coverage = 0.8
bootstrap = 20
`

// Stations short of the coverage, or without series, are left out with the
// reason, warned about and normalised as their own group.
func TestClusterCoverageAndScope(t *testing.T) {
	series := "station,date,variable,value\n" +
		stationSeries("A1", 1100, 9, 2, 200, 1, 0.5, 30) +
		stationSeries("A2", 1100, 9.2, 2.1, 205, 1.2, 0.6, 31) +
		stationSeries("A3", 1100, 8.9, 1.9, 198, 0.9, 0.5, 29) +
		stationSeries("B1", 1100, 15, 8, 215, 0.5, 5, 12) +
		stationSeries("B2", 1100, 15.5, 8.5, 212, 0.6, 6, 11) +
		stationSeries("SHORT", 500, 12, 5, 210, 1, 1, 20)
	stations := "station,name,latitude,longitude,forest_pct\n" +
		"A1,a1,46,-38,60\nA2,a2,46,-38,50\nA3,a3,46,-38,40\nB1,b1,46,-38,10\nB2,b2,46,-38,20\nSHORT,s,46,-38,30\nNOSERIES,n,46,-38,35\n"
	dir := writeDir(t, map[string]string{
		"rebound.toml": smallClusterConfig, "series.csv": series, "stations.csv": stations,
		"events.csv": "station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness\n" +
			"A1,E1,heatwave,water_temperature,2010-07-01,2010-07-05,1.5,4,true,0.2\n",
	})
	r, errs := Load(filepath.Join(dir, "rebound.toml"))
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	c := r.Clusters
	if !slices.Equal(c.Stations, []string{"A1", "A2", "A3", "B1", "B2"}) {
		t.Errorf("clustered %v", c.Stations)
	}
	wantOut := []features.Exclusion{
		{Station: "SHORT", Reason: "water_temperature: 1 of 2 required years with >= 80% of days; discharge: 1 of 2 required years with >= 80% of days"},
		{Station: "NOSERIES", Reason: "no daily series"},
	}
	if !slices.Equal(c.Excluded, wantOut) {
		t.Errorf("left out %q\nwant %q", c.Excluded, wantOut)
	}
	var warned []string
	for _, w := range r.Warnings {
		if strings.Contains(w.Error(), "left out of clustering") {
			warned = append(warned, w.Error())
		}
	}
	if len(warned) != 2 || !strings.HasPrefix(warned[0], "station SHORT: left out of clustering: water_temperature: 1 of 2") {
		t.Errorf("warnings about stations left out: %q", warned)
	}
	// Two clear groups.
	if c.K != 2 || !slices.Equal(c.Used().Labels, []int{0, 0, 0, 1, 1}) {
		t.Errorf("k = %d, labels %v", c.K, c.Used().Labels)
	}
	if err := r.Score(); err != nil {
		t.Fatal(err)
	}
	groups := c.Groups(r.Raw.Stations)
	want := []string{"cluster 1", "cluster 1", "cluster 1", "cluster 2", "cluster 2", Unclustered, Unclustered}
	if !slices.Equal(groups, want) {
		t.Errorf("groups %v, want %v", groups, want)
	}
	// Within cluster 1 the forest cover 60, 50, 40 normalises to 1, 0.5, 0
	// (min–max); the two stations left out are normalised together.
	norm := []float64{1, 0.5, 0, 0, 1, 0, 1}
	for i, w := range norm {
		if got := r.Result.Normalized[i][0]; math.Abs(got-w) > 1e-12 {
			t.Errorf("%s: normalised forest %g, want %g", r.Raw.Stations[i], got, w)
		}
	}
	found := false
	for _, w := range r.Warnings {
		found = found || strings.Contains(w.Error(), `2 stations left out of clustering are normalised together as group "unclustered"`)
	}
	if !found {
		t.Error("no warning about the unclustered group")
	}
}

// Check values for the 15 rows of iris_every10th.csv (rows 1, 11, ..., 141
// of Fisher's iris data, unscaled): scipy.cluster.hierarchy.linkage and
// cophenet, scipy 1.10.1; R hclust (stats 4.2.2) gives the same heights.
var iris15 = map[string]struct {
	merges     [][4]float64 // a, b, height, size
	cophenetic float64
}{
	"ward": {[][4]float64{{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {15, 17, 0.616441, 4}, {8, 9, 0.640312, 2},
		{7, 11, 0.700000, 2}, {10, 16, 0.746101, 3}, {3, 18, 0.777174, 5}, {6, 19, 1.084743, 3}, {5, 20, 1.126943, 3},
		{13, 21, 1.289703, 4}, {24, 25, 2.189912, 7}, {23, 26, 4.880535, 10}, {22, 27, 10.321822, 15}}, 0.875831},
	"average": {[][4]float64{{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {15, 17, 0.473288, 4}, {8, 9, 0.640312, 2},
		{3, 18, 0.654718, 5}, {10, 16, 0.657692, 3}, {7, 11, 0.700000, 2}, {6, 19, 0.961224, 3}, {5, 22, 1.026115, 3},
		{13, 21, 1.082135, 4}, {24, 25, 1.356817, 7}, {23, 26, 2.467717, 10}, {20, 27, 4.101440, 15}}, 0.880233},
	"complete": {[][4]float64{{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {3, 15, 0.547723, 3}, {8, 9, 0.640312, 2},
		{7, 11, 0.700000, 2}, {10, 16, 0.707107, 3}, {17, 18, 0.854400, 5}, {5, 20, 1.174734, 3}, {6, 19, 1.208305, 3},
		{13, 21, 1.352775, 4}, {23, 25, 2.027313, 7}, {22, 24, 3.388215, 8}, {26, 27, 5.643580, 15}}, 0.811570},
	"single": {[][4]float64{{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {15, 17, 0.374166, 4}, {3, 18, 0.538516, 5},
		{10, 16, 0.608276, 3}, {8, 9, 0.640312, 2}, {11, 20, 0.678233, 4}, {7, 22, 0.700000, 5}, {6, 21, 0.714143, 3},
		{13, 23, 0.854400, 6}, {5, 25, 0.877496, 7}, {24, 26, 1.019804, 10}, {19, 27, 2.345208, 15}}, 0.856396},
}

func irisFile(name string) string { return filepath.Join("..", "..", "testdata", "iris", name) }

func clusterIris(t *testing.T, name string, set func(*config.Clustering)) *ClusterResult {
	t.Helper()
	r, errs := ClusterFile(irisFile(name), Options{Clustering: set})
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	return r.Clusters
}

// On iris rows without ties, every linkage's merge table and cophenetic
// correlation equal scipy's, and the cuts into 3 clusters too.
func TestIrisLinkages(t *testing.T) {
	c := clusterIris(t, "iris_every10th.csv", func(c *config.Clustering) { c.Scale, c.K = "none", 3 })
	if c.K != 3 || c.Chosen {
		t.Fatalf("k = %d, chosen %v", c.K, c.Chosen)
	}
	// fcluster(criterion="maxclust", t=3), scipy 1.10.1: every method gives
	// {0–4}{5,7,10,11,12,13,14}{6,8,9}.
	cut3 := []int{0, 0, 0, 0, 0, 1, 2, 1, 2, 2, 1, 1, 1, 1, 1}
	for _, p := range c.Partitions {
		if p.Method == KMeans {
			continue
		}
		t.Run(p.Method, func(t *testing.T) {
			want := iris15[p.Method]
			for i, m := range p.Tree.Dendrogram.Merges {
				w := want.merges[i]
				if m.A != int(w[0]) || m.B != int(w[1]) || m.Size != int(w[3]) || !scalar.EqualWithinAbs(m.Height, w[2], 1e-6) {
					t.Errorf("merge %d: %v, want %v", i, m, w)
				}
			}
			if !scalar.EqualWithinAbs(p.Cophenetic, want.cophenetic, 1e-6) {
				t.Errorf("cophenetic correlation %.6f, want %.6f", p.Cophenetic, want.cophenetic)
			}
			if !slices.Equal(p.Labels, cut3) {
				t.Errorf("cut into 3: %v, want %v", p.Labels, cut3)
			}
		})
	}
}

// k-means and the validity indices on all 150 iris rows, unscaled, against
// scikit-learn 1.2.1 (KMeans best of 5×200 restarts; silhouette_score,
// calinski_harabasz_score, davies_bouldin_score, adjusted_rand_score).
func TestIrisKMeans(t *testing.T) {
	c := clusterIris(t, "iris.csv", func(c *config.Clustering) { c.Scale, c.Method, c.KMax, c.Bootstrap = "none", "kmeans", 6, 10 })
	want := map[int][4]float64{ // inertia, silhouette, CH, DB
		2: {152.347952, 0.681046, 513.924546, 0.404293},
		3: {78.851441, 0.552819, 561.627757, 0.661972},
	}
	for _, s := range c.Tables[0].Scores {
		w, ok := want[s.K]
		if !ok {
			continue
		}
		got := [4]float64{s.WithinSS, s.Silhouette, s.CalinskiHarabasz, s.DaviesBouldin}
		if !floats.EqualApprox(got[:], w[:], 1e-6) {
			t.Errorf("k = %d: inertia, silhouette, CH, DB = %v, want %v", s.K, got, w)
		}
	}
	// The silhouette is highest at k = 2 (scikit-learn 1.2.1, as above) and
	// Calinski–Harabasz at k = 3.
	if c.K != 2 || c.Tables[0].BestCH != 3 {
		t.Errorf("k = %d, Calinski–Harabasz best at %d; want 2 and 3", c.K, c.Tables[0].BestCH)
	}
	c3 := clusterIris(t, "iris.csv", func(c *config.Clustering) { c.Scale, c.Method, c.K, c.Bootstrap = "none", "kmeans", 3, 0 })
	species := make([]int, 150)
	for i := range species {
		species[i] = i / 50 // rows 1–50 setosa, 51–100 versicolor, 101–150 virginica
	}
	// adjusted_rand_score against the species, scikit-learn 1.2.1: 0.730238.
	if ari := clustering.AdjustedRand(c3.Used().Labels, species); !scalar.EqualWithinAbs(ari, 0.730238, 1e-6) {
		t.Errorf("adjusted Rand index of k-means (k = 3) against the species %.6f, want 0.730238", ari)
	}
	if sizes := c3.Used().Score.Sizes; !slices.Equal(sizes, []int{50, 62, 38}) {
		t.Errorf("sizes %v, want 50 62 38 (scikit-learn 1.2.1)", sizes)
	}
	if c3.Stability != nil {
		t.Error("bootstrap = 0 assessed the stability")
	}
}

// Reordering the stations does not change any partition, the merge
// heights or the chosen k.
func TestClusterStationOrder(t *testing.T) {
	base := clusterIris(t, "iris_every10th.csv", func(c *config.Clustering) { c.Bootstrap = 0 })
	rows := make([]int, len(base.Stations))
	for i := range rows {
		rows[i] = i
	}
	rapid.Check(t, func(rt *rapid.T) {
		perm := rapid.Permutation(rows).Draw(rt, "order")
		tb := &features.Table{Names: base.Features}
		for _, i := range perm {
			tb.Stations = append(tb.Stations, base.Stations[i])
			tb.Data = append(tb.Data, base.Values.RawRowView(i)...)
		}
		cl := config.DefaultClustering()
		cl.Bootstrap = 0
		c, err := clusterTable(tb, make([]string, len(tb.Names)), cl, 1, nil)
		if err != nil {
			rt.Fatal(err)
		}
		if c.K != base.K {
			rt.Fatalf("k = %d, want %d", c.K, base.K)
		}
		for m, p := range c.Partitions {
			back := make([]int, len(perm))
			for q, i := range perm {
				back[i] = p.Labels[q]
			}
			if ari := clustering.AdjustedRand(back, base.Partitions[m].Labels); ari != 1 {
				rt.Errorf("%s: the partition changed with the order (adjusted Rand index %g)", p.Method, ari)
			}
			if p.Tree == nil {
				continue
			}
			for s, mg := range p.Tree.Dendrogram.Merges {
				if h := base.Partitions[m].Tree.Dendrogram.Merges[s].Height; math.Abs(mg.Height-h) > 1e-12 {
					rt.Errorf("%s: merge %d at height %g, want %g", p.Method, s, mg.Height, h)
				}
			}
		}
	})
}

// Above two_stage_above stations only k-means and Ward (in two stages)
// run, and the outputs say so.
func TestClusterTwoStage(t *testing.T) {
	c := clusterIris(t, "iris.csv", func(c *config.Clustering) {
		c.TwoStageAbove, c.TwoStageGroups, c.K, c.Bootstrap = 100, 30, 3, 5
	})
	if !c.TwoStage || len(c.Partitions) != 2 || c.Partitions[1].Method != "ward" {
		t.Fatalf("two-stage %v, partitions %d", c.TwoStage, len(c.Partitions))
	}
	w := c.Partitions[1]
	if !w.Tree.TwoStage || len(w.Tree.Group) != 150 || w.Tree.Dendrogram.N != 30 || !math.IsNaN(w.Cophenetic) {
		t.Errorf("tree: two-stage %v, %d groups of %d rows, cophenetic %g", w.Tree.TwoStage, w.Tree.Dendrogram.N, len(w.Tree.Group), w.Cophenetic)
	}
	var msgs []string
	for _, e := range c.Warnings {
		msgs = append(msgs, e.Error())
	}
	all := strings.Join(msgs, "\n")
	for _, want := range []string{"ran in two stages", "average, complete and single linkage were skipped"} {
		if !strings.Contains(all, want) {
			t.Errorf("no warning %q in:\n%s", want, all)
		}
	}
	_, errs := ClusterFile(irisFile("iris.csv"), Options{Clustering: func(c *config.Clustering) {
		c.TwoStageAbove, c.TwoStageGroups, c.Method = 100, 30, "average"
	}})
	if len(errs) != 1 || !strings.Contains(errs[0].Error(), `above two_stage_above = 100 stations use "ward"`) {
		t.Errorf("average linkage above the limit: %v", errs)
	}
}

// Four points ±2u and ±v with u = (0.8, 0.6), v = (0.6, −0.8): the
// principal components explain 0.8 and 0.2 of the variance (worked by
// hand).
func TestClusterPCA(t *testing.T) {
	tb := &features.Table{Names: []string{"x", "y"}, Stations: []string{"a", "b", "c", "d"},
		Data: []float64{1.6, 1.2, -1.6, -1.2, 0.6, -0.8, -0.6, 0.8}}
	cl := config.DefaultClustering()
	cl.Scale, cl.PCAComponents, cl.Bootstrap = "none", 2, 0
	c, err := clusterTable(tb, []string{"", ""}, cl, 1, nil)
	if err != nil {
		t.Fatal(err)
	}
	if c.PCA == nil || !floats.EqualApprox(c.PCA.Explained, []float64{0.8, 0.2}, 1e-12) {
		t.Errorf("PCA %+v", c.PCA)
	}
	cl.PCAComponents = 3
	if _, err := clusterTable(tb, []string{"", ""}, cl, 1, nil); err == nil || !strings.Contains(err.Error(), "at most 2 components") {
		t.Errorf("3 components of 2 features: %v", err)
	}
}

func TestClusterTooFew(t *testing.T) {
	tb := &features.Table{Names: []string{"x"}, Stations: []string{"a", "b", "c"}, Data: []float64{1, 2, math.NaN()},
		Excluded: []features.Exclusion{{Station: "z", Reason: "no daily series"}}}
	_, err := clusterTable(tb, []string{""}, config.DefaultClustering(), 1, nil)
	if err == nil || err.Error() != "2 of the stations have a value of every feature, fewer than the 3 that clustering needs (2 left out, the first, z: no daily series)" {
		t.Errorf("error %v", err)
	}
}

func TestFeatureWords(t *testing.T) {
	for _, tc := range []struct{ name, high, low string }{
		{"discharge.flashiness", "flashy", "steady"},
		{"water_temperature.mean", "warm", "cool"},
		{"specific_conductance.sd", "variable specific conductance", "steady specific conductance"},
		{"dissolved_oxygen.p05", "high dissolved oxygen p05", "low dissolved oxygen p05"},
		{"petal_width", "high petal width", "low petal width"},
	} {
		if w := FeatureWords(tc.name); w.High != tc.high || w.Low != tc.low {
			t.Errorf("%s: %+v", tc.name, w)
		}
	}
}

// A feature table named in the configuration is matched to the attribute
// table: its stations missing there are skipped with a warning, and
// attribute stations missing from it are left out with the reason.
func TestClusterFeaturesFile(t *testing.T) {
	dir := writeDir(t, map[string]string{
		"rebound.toml": `
[inputs]
attributes = "stations.csv"
[[indicator]]
name = "forest"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 1
[clustering]
features_file = "f.csv"
bootstrap = 0
`,
		"stations.csv": "station,name,latitude,longitude,forest_pct\nA,a,46,-38,1\nB,b,46,-38,2\nC,c,46,-38,3\nD,d,46,-38,4\nE,e,46,-38,5\n",
		"f.csv":        "station,x,y\nE,5,1\nA,0,0\nB,0.1,0\nZ,9,9\nC,5,1.2\nD,NA,1\n",
	})
	r := mustLoad(t, filepath.Join(dir, "rebound.toml"), Options{})
	c := r.Clusters
	if !slices.Equal(c.Stations, []string{"A", "B", "C", "E"}) || c.Source != filepath.Join(dir, "f.csv") {
		t.Errorf("clustered %v from %s", c.Stations, c.Source)
	}
	want := []features.Exclusion{{Station: "D", Reason: "missing: x"}}
	if !slices.Equal(c.Excluded, want) {
		t.Errorf("left out %v", c.Excluded)
	}
	if len(c.Warnings) == 0 || c.Warnings[0].Error() != "station Z: in the feature table but not in the attribute table; skipped" {
		t.Errorf("warnings %v", c.Warnings)
	}
	if c.K != 2 || !slices.Equal(c.Used().Labels, []int{0, 0, 1, 1}) {
		t.Errorf("k = %d, labels %v", c.K, c.Used().Labels)
	}
	roles := ""
	for _, in := range r.Inputs {
		roles += in.Role + " "
	}
	if !strings.Contains(roles, "features") {
		t.Errorf("inputs %q lack the feature table", roles)
	}
}

// Coverage counts water years (October–September) when events.water_year
// is set: a record from October 2010 to September 2012 holds two complete
// water years but only one calendar year with 80 % of its days.
func TestClusterCoverageWaterYear(t *testing.T) {
	var w strings.Builder
	for _, line := range strings.SplitAfter(stationSeries("W1", 1100, 12, 5, 210, 1, 1, 20), "\n") {
		if d, _, _ := strings.Cut(strings.TrimPrefix(line, "W1,"), ","); d >= "2010-10-01" && d <= "2012-09-30" {
			w.WriteString(line)
		}
	}
	series := "station,date,variable,value\n" + w.String() +
		stationSeries("A1", 1100, 9, 2, 200, 1, 0.5, 30) +
		stationSeries("A2", 1100, 9.2, 2.1, 205, 1.2, 0.6, 31) +
		stationSeries("B1", 1100, 15, 8, 215, 0.5, 5, 12)
	for _, waterYear := range []bool{false, true} {
		dir := writeDir(t, map[string]string{
			"rebound.toml": strings.Replace(smallClusterConfig, "[clustering]", fmt.Sprintf("[events]\nwater_year = %v\n\n[clustering]", waterYear), 1),
			"series.csv":   series,
			"stations.csv": "station,name,latitude,longitude,forest_pct\nW1,w,46,-38,1\nA1,a1,46,-38,2\nA2,a2,46,-38,3\nB1,b1,46,-38,4\n",
			"events.csv":   "station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness\nA1,E1,heatwave,water_temperature,2010-07-01,2010-07-05,1.5,4,true,0.2\n",
		})
		c := mustLoad(t, filepath.Join(dir, "rebound.toml"), Options{}).Clusters
		if got := c.Row("W1") >= 0; got != waterYear {
			t.Errorf("water_year = %v: W1 clustered %v, left out %v", waterYear, got, c.Excluded)
		}
	}
}
