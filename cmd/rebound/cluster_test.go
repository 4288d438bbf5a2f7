package main

import (
	"bytes"
	"encoding/csv"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"rebound/cmd/rebound/internal/report"
)

// readCSV reads a CSV output, failing the test when it cannot.
func readCSV(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return recs
}

func irisPath(t *testing.T, name string) string {
	t.Helper()
	p, err := filepath.Abs(filepath.Join("testdata", "iris", name))
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// rebound cluster on the demo finds the five invented kinds of station and
// writes the same files as rebound run.
func TestClusterCommandDemo(t *testing.T) {
	dir := t.TempDir()
	if _, stderr, status := rebound(t, dir, "demo", "-out", "d"); status != 0 {
		t.Fatalf("demo: %s", stderr)
	}
	stdout, stderr, status := rebound(t, dir, "cluster", "-config", "d/rebound.toml", "-out", "cl", "-quiet")
	if status != 0 {
		t.Fatalf("cluster: %d %s", status, stderr)
	}
	if stderr != "" {
		t.Errorf("stderr with -quiet: %q", stderr)
	}
	golden(t, "demo_cluster.stdout", stdout)
	for _, name := range report.ClusterFiles[:6] {
		a, err := os.ReadFile(filepath.Join(dir, "cl", name))
		if err != nil {
			t.Fatal(err)
		}
		b, _ := os.ReadFile(filepath.Join(dir, "d", "out", name))
		if !bytes.Equal(a, b) {
			t.Errorf("%s differs between rebound cluster and rebound run", name)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "cl", "cluster_pca.csv")); err == nil {
		t.Error("cluster_pca.csv written without PCA")
	}
	// Every station's cluster is that of its kind (the kind is in the
	// identifier: FEN, HIC, BRT-01..03, BRT-04..09, LOW).
	kindCluster := map[string]string{}
	for _, rec := range readCSV(t, filepath.Join(dir, "cl", "clusters.csv"))[1:] {
		id := rec[0]
		kind := id[:3]
		if kind == "BRT" && id > "BRT-03" {
			kind = "URB"
		}
		if c, ok := kindCluster[kind]; ok && c != rec[1] {
			t.Errorf("%s in cluster %s, other %s stations in %s", id, rec[1], kind, c)
		}
		kindCluster[kind] = rec[1]
	}
	if len(kindCluster) != 5 {
		t.Errorf("kinds → clusters %v", kindCluster)
	}
	ranking := readCSV(t, filepath.Join(dir, "d", "out", "ranking.csv"))
	if h := ranking[0]; h[len(h)-1] != "cluster" {
		t.Errorf("ranking.csv header %v lacks the cluster column", h)
	}

	// Flags override the configuration.
	stdout, stderr, status = rebound(t, dir, "cluster", "-config", "d/rebound.toml", "-out", "cl2", "-method", "kmeans", "-k", "4", "-scale", "robust")
	if status != 0 {
		t.Fatalf("cluster with flags: %d %s", status, stderr)
	}
	if !strings.Contains(stdout, "k = 4, as configured") || !strings.Contains(stdout, "Clusters (k-means)") || !strings.Contains(stdout, "scaled by median and MAD") {
		t.Errorf("stdout:\n%s", stdout)
	}
	used := 0
	for _, rec := range readCSV(t, filepath.Join(dir, "cl2", "cluster_scores.csv"))[1:] {
		if rec[len(rec)-1] == "yes" {
			used++
			if rec[0] != "kmeans" || rec[1] != "4" {
				t.Errorf("used row %v, want kmeans at k = 4", rec)
			}
		}
	}
	if used != 1 {
		t.Errorf("%d rows marked used", used)
	}
}

// The CSV outputs have the documented headers.
func TestClusterOutputHeaders(t *testing.T) {
	dir := t.TempDir()
	_, stderr, status := rebound(t, dir, "cluster", "-features", irisPath(t, "iris_every10th.csv"), "-out", "o", "-k", "3")
	if status != 0 {
		t.Fatal(stderr)
	}
	feats := "sepal_length,sepal_width,petal_length,petal_width"
	for name, want := range map[string]string{
		"features.csv":          "station," + feats,
		"clusters.csv":          "station,cluster,silhouette_width,kmeans,ward,average,complete,single,linkage_item,note",
		"cluster_scores.csv":    strings.Join(report.ClusterScoresColumns, ","),
		"linkage.csv":           "method,step,a,b,height,size",
		"cluster_profiles.csv":  "cluster,size,medoid,description,stability,feature,units,mean,median,centroid_z",
		"cluster_agreement.csv": "method_a,method_b,adjusted_rand",
	} {
		if got := strings.Join(readCSV(t, filepath.Join(dir, "o", name))[0], ","); got != want {
			t.Errorf("%s header %q, want %q", name, got, want)
		}
	}
}

// -features clusters a table without a configuration; on iris rows without
// ties, linkage.csv is scipy's linkage matrix.
func TestClusterFeaturesIris(t *testing.T) {
	dir := t.TempDir()
	stdout, stderr, status := rebound(t, dir, "cluster", "-features", irisPath(t, "iris_every10th.csv"), "-scale", "none", "-k", "3", "-out", "o")
	if status != 0 {
		t.Fatalf("%d %s", status, stderr)
	}
	if !strings.Contains(stdout, "Clustered 15 of 15 stations by 4 features of the table") {
		t.Errorf("stdout:\n%s", stdout)
	}
	// scipy.cluster.hierarchy.linkage(X, "ward"), scipy 1.10.1, on rows
	// 1, 11, ..., 141 of Fisher's iris data, unscaled (R hclust ward.D2 in
	// stats 4.2.2 gives the same heights).
	ward := [][4]float64{{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {15, 17, 0.616441, 4},
		{8, 9, 0.640312, 2}, {7, 11, 0.700000, 2}, {10, 16, 0.746101, 3}, {3, 18, 0.777174, 5}, {6, 19, 1.084743, 3},
		{5, 20, 1.126943, 3}, {13, 21, 1.289703, 4}, {24, 25, 2.189912, 7}, {23, 26, 4.880535, 10}, {22, 27, 10.321822, 15}}
	// scipy.cluster.hierarchy.linkage(X, "single"), the same rows.
	single := [][4]float64{{0, 4, 0.173205, 2}, {12, 14, 0.264575, 2}, {1, 2, 0.360555, 2}, {15, 17, 0.374166, 4},
		{3, 18, 0.538516, 5}, {10, 16, 0.608276, 3}, {8, 9, 0.640312, 2}, {11, 20, 0.678233, 4}, {7, 22, 0.700000, 5},
		{6, 21, 0.714143, 3}, {13, 23, 0.854400, 6}, {5, 25, 0.877496, 7}, {24, 26, 1.019804, 10}, {19, 27, 2.345208, 15}}
	got := map[string][][]string{}
	for _, rec := range readCSV(t, filepath.Join(dir, "o", "linkage.csv"))[1:] {
		got[rec[0]] = append(got[rec[0]], rec[2:])
	}
	for method, want := range map[string][][4]float64{"ward": ward, "single": single} {
		rows := got[method]
		if len(rows) != len(want) {
			t.Errorf("%s: %d merges, want %d", method, len(rows), len(want))
			continue
		}
		for i, w := range want {
			h, _ := strconv.ParseFloat(rows[i][2], 64)
			if rows[i][0] != strconv.Itoa(int(w[0])) || rows[i][1] != strconv.Itoa(int(w[1])) ||
				rows[i][3] != strconv.Itoa(int(w[3])) || !scalar.EqualWithinAbs(h, w[2], 1e-6) {
				t.Errorf("%s step %d: %v, want %v", method, i, rows[i], w)
			}
		}
	}
	// fcluster(maxclust=3), scipy 1.10.1: {0–4}{5,7,10,11,12,13,14}{6,8,9}.
	var ward3 []string
	for _, rec := range readCSV(t, filepath.Join(dir, "o", "clusters.csv"))[1:] {
		ward3 = append(ward3, rec[4])
	}
	if s := strings.Join(ward3, ""); s != "111112323322222" {
		t.Errorf("ward cut into 3 clusters: %s", s)
	}

	// All 150 rows with k-means: scikit-learn 1.2.1 KMeans (best of 5×200
	// restarts) and its silhouette_score, calinski_harabasz_score and
	// davies_bouldin_score.
	_, stderr, status = rebound(t, dir, "cluster", "-features", irisPath(t, "iris.csv"), "-scale", "none", "-method", "kmeans", "-out", "all")
	if status != 0 {
		t.Fatalf("%d %s", status, stderr)
	}
	want := map[string][4]float64{ // silhouette, CH, DB, inertia
		"2": {0.681046, 513.924546, 0.404293, 152.347952},
		"3": {0.552819, 561.627757, 0.661972, 78.851441},
	}
	for _, rec := range readCSV(t, filepath.Join(dir, "all", "cluster_scores.csv"))[1:] {
		w, ok := want[rec[1]]
		if rec[0] != "kmeans" || !ok {
			continue
		}
		for j, v := range w {
			x, _ := strconv.ParseFloat(rec[2+j], 64)
			if !scalar.EqualWithinAbs(x, v, 1e-6) {
				t.Errorf("kmeans k = %s, %s = %s, want %g", rec[1], report.ClusterScoresColumns[2+j], rec[2+j], v)
			}
		}
		// Silhouette and Davies–Bouldin are best at k = 2 in the same table.
		if rec[1] == "2" && (rec[7] != "silhouette;davies_bouldin" || rec[8] != "yes") {
			t.Errorf("k = 2 row %v: want best by silhouette and Davies–Bouldin, and used", rec)
		}
		if rec[1] == "3" && (rec[6] != "50;62;38" || rec[7] != "calinski_harabasz") {
			t.Errorf("k = 3 row %v: want sizes 50;62;38, best by calinski_harabasz", rec)
		}
	}
}

func TestClusterCommandErrors(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{
		"rebound.toml": smallConfig + "[clustering]\n",
		"stations.csv": smallStations,
		"events.csv":   smallEvents,
		"bad.csv":      "station,x,y\nA,1,2\nB,3,oops\n",
	})
	iris := irisPath(t, "iris_every10th.csv")
	tests := []struct {
		name   string
		args   []string
		status int
		stdout string
		stderr string
	}{
		{"help", []string{"help", "cluster"}, 0, "linkage.csv", ""},
		{"-h", []string{"cluster", "-h"}, 0, "cluster_scores.csv", ""},
		{"no input", []string{"cluster"}, 2, "", "-config FILE (or -features FILE) is required"},
		{"k of 1", []string{"cluster", "-features", iris, "-k", "1"}, 2, "", "-k: want a number of clusters >= 2"},
		{"bad method", []string{"cluster", "-features", iris, "-method", "centroid"}, 2, "", `-method: want one of [kmeans ward average complete single], got "centroid"`},
		{"bad scale", []string{"cluster", "-features", iris, "-scale", "minmax"}, 2, "", `-scale: want one of [zscore robust none], got "minmax"`},
		{"bad table", []string{"cluster", "-features", "bad.csv"}, 1, "", `bad.csv:3:5: y: want a finite decimal number`},
		{"no series", []string{"cluster", "-config", "rebound.toml"}, 1, "", "clustering: clustering needs daily series (inputs.series or inputs.wide) or a feature table"},
		{"k too large", []string{"cluster", "-features", iris, "-k", "15"}, 1, "", "k = 15, but 15 stations can be split into at most 14 clusters"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			stdout, stderr, status := rebound(t, dir, tc.args...)
			if status != tc.status || !strings.Contains(stdout, tc.stdout) || !strings.Contains(stderr, tc.stderr) {
				t.Errorf("status %d (want %d)\nstdout: %s\nstderr: %s", status, tc.status, stdout, stderr)
			}
		})
	}

	// features.csv can be clustered again, but not written over itself.
	if _, stderr, status := rebound(t, dir, "cluster", "-features", iris, "-out", "o"); status != 0 {
		t.Fatal(stderr)
	}
	before, _ := os.ReadFile(filepath.Join(dir, "o", "features.csv"))
	_, stderr, status := rebound(t, dir, "cluster", "-features", "o/features.csv", "-out", "o")
	if status != 1 || !strings.Contains(stderr, "is the features input") {
		t.Errorf("overwriting the input: %d %s", status, stderr)
	}
	if after, _ := os.ReadFile(filepath.Join(dir, "o", "features.csv")); !bytes.Equal(before, after) {
		t.Error("the input was overwritten")
	}
	if _, stderr, status := rebound(t, dir, "cluster", "-features", "o/features.csv", "-out", "again"); status != 0 {
		t.Errorf("clustering features.csv again: %s", stderr)
	}
}
