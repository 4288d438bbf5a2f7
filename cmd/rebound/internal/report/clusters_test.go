package report

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/config"
)

func irisRun(t *testing.T, set func(*config.Clustering)) *pipeline.ClusterResult {
	t.Helper()
	r, errs := pipeline.ClusterFile(filepath.Join("..", "..", "testdata", "iris", "iris.csv"), pipeline.Options{Clustering: set})
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	return r.Clusters
}

func records(t *testing.T, write func(*bytes.Buffer) error) [][]string {
	t.Helper()
	var buf bytes.Buffer
	if err := write(&buf); err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return recs
}

// In two stages the Ward tree joins first-stage groups: clusters.csv gives
// each station's group as its linkage item, and linkage.csv holds that
// tree alone.
func TestClusterFilesTwoStage(t *testing.T) {
	c := irisRun(t, func(c *config.Clustering) { c.TwoStageAbove, c.TwoStageGroups, c.K, c.Bootstrap = 100, 20, 3, 0 })
	recs := records(t, func(b *bytes.Buffer) error { return WriteClusters(b, c) })
	if got := strings.Join(recs[0], ","); got != "station,cluster,silhouette_width,kmeans,ward,linkage_item,note" {
		t.Errorf("header %s", got)
	}
	group := c.Partitions[1].Tree.Group
	for i, rec := range recs[1:] {
		if rec[5] != strconv.Itoa(group[i]) {
			t.Errorf("%s: linkage item %s, want group %d", rec[0], rec[5], group[i])
		}
	}
	link := records(t, func(b *bytes.Buffer) error { return WriteLinkage(b, c) })
	if len(link) != 1+19 || link[1][0] != "ward" || link[19][5] != "150" {
		t.Errorf("linkage.csv: %d rows, first %v, last %v", len(link), link[1], link[len(link)-1])
	}
	var out bytes.Buffer
	PrintClusters(&out, c)
	if !strings.Contains(out.String(), "Ward linkage ran in two stages") || !strings.Contains(out.String(), "k = 3, as configured") {
		t.Errorf("summary:\n%s", out.String())
	}
}

// cluster_pca.csv holds the explained variance of each component, and the
// loadings are unit vectors.
func TestClusterPCAFile(t *testing.T) {
	c := irisRun(t, func(c *config.Clustering) { c.PCAComponents, c.Bootstrap = 2, 0 })
	var buf bytes.Buffer
	ok, err := WriteClusterFile(&buf, "cluster_pca.csv", c)
	if !ok || err != nil {
		t.Fatal(ok, err)
	}
	recs, _ := csv.NewReader(&buf).ReadAll()
	want := "component,variance,explained,cumulative,loading_sepal_length,loading_sepal_width,loading_petal_length,loading_petal_width"
	if got := strings.Join(recs[0], ","); got != want {
		t.Errorf("header %s", got)
	}
	for k, rec := range recs[1:] {
		if e, _ := strconv.ParseFloat(rec[2], 64); !scalar.EqualWithinAbs(e, c.PCA.Explained[k], 1e-11) {
			t.Errorf("component %d: explained %s, want %g", k+1, rec[2], c.PCA.Explained[k])
		}
		var ss float64
		for _, s := range rec[4:] {
			v, _ := strconv.ParseFloat(s, 64)
			ss += v * v
		}
		if !scalar.EqualWithinAbs(ss, 1, 1e-9) {
			t.Errorf("component %d: loadings of length² %g", k+1, ss)
		}
	}
	var out bytes.Buffer
	PrintClusters(&out, c)
	if !strings.Contains(out.String(), "Clustered on the first 2 principal components, explaining ") {
		t.Errorf("summary:\n%s", out.String())
	}
	if ok, _ := WriteClusterFile(&buf, "cluster_pca.csv", irisRun(t, func(c *config.Clustering) { c.Bootstrap = 0 })); ok {
		t.Error("cluster_pca.csv without PCA")
	}
	if _, err := WriteClusterFile(&buf, "clusters.txt", c); err == nil {
		t.Error("an unknown output name")
	}
}

// The summary lists at most printLimit stations left out.
func TestPrintClustersLeftOut(t *testing.T) {
	dir := t.TempDir()
	var b strings.Builder
	b.WriteString("station,x,y\n")
	for i := range 30 {
		fmt.Fprintf(&b, "s%02d,%d,%d\n", i, i%3, i%5)
	}
	for i := range 25 {
		fmt.Fprintf(&b, "m%02d,,1\n", i)
	}
	path := filepath.Join(dir, "t.csv")
	os.WriteFile(path, []byte(b.String()), 0o644)
	r, errs := pipeline.ClusterFile(path, pipeline.Options{Clustering: func(c *config.Clustering) { c.Bootstrap = 0 }})
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	var out bytes.Buffer
	PrintClusters(&out, r.Clusters)
	s := out.String()
	if !strings.Contains(s, "Left out (25):\n  m00: missing: x\n") || !strings.Contains(s, "  ... and 5 more (clusters.csv lists every station left out") {
		t.Errorf("summary:\n%s", s)
	}
	recs := records(t, func(b *bytes.Buffer) error { return WriteClusters(b, r.Clusters) })
	if last := recs[len(recs)-1]; last[0] != "m24" || last[1] != "" || last[len(last)-1] != "left out: missing: x" {
		t.Errorf("last row of clusters.csv %q", last)
	}
}
