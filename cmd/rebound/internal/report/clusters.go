package report

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"rebound/clustering/features"
	"rebound/cmd/rebound/internal/pipeline"
)

// ClusterFiles names the clustering outputs, in the order they are
// written; cluster_pca.csv is written only when the features were
// projected on principal components.
var ClusterFiles = []string{"features.csv", "clusters.csv", "cluster_scores.csv", "linkage.csv",
	"cluster_profiles.csv", "cluster_agreement.csv", "cluster_pca.csv"}

// WriteClusterFile writes the clustering output named name (one of
// ClusterFiles). It reports false, writing nothing, for cluster_pca.csv of
// a run without PCA.
func WriteClusterFile(w io.Writer, name string, c *pipeline.ClusterResult) (bool, error) {
	switch name {
	case "features.csv":
		return true, WriteFeatures(w, c)
	case "clusters.csv":
		return true, WriteClusters(w, c)
	case "cluster_scores.csv":
		return true, WriteClusterScores(w, c)
	case "linkage.csv":
		return true, WriteLinkage(w, c)
	case "cluster_profiles.csv":
		return true, WriteClusterProfiles(w, c)
	case "cluster_agreement.csv":
		return true, WriteClusterAgreement(w, c)
	case "cluster_pca.csv":
		if c.PCA == nil {
			return false, nil
		}
		return true, WriteClusterPCA(w, c)
	}
	return false, fmt.Errorf("no clustering output named %q", name)
}

// WriteFeatures writes features.csv: the features of each clustered
// station in original units, in the layout a feature table is read in
// (station, then one column per feature), so that it can be clustered
// again with -features or clustering.features_file.
func WriteFeatures(w io.Writer, c *pipeline.ClusterResult) error {
	r, d := c.Values.Dims()
	data := make([]float64, 0, r*d)
	for i := range r {
		data = append(data, c.Values.RawRowView(i)...)
	}
	return features.WriteTable(w, &features.Table{Names: c.Features, Stations: c.Stations, Data: data})
}

// ClustersColumns are the columns of clusters.csv after the station;
// one column per partition follows "silhouette_width".
var ClustersColumns = []string{"station", "cluster", "silhouette_width"}

// WriteClusters writes clusters.csv: one row per station, the clustered
// ones first in table order, then those left out. cluster is the cluster
// (from 1) of the partition used for peer groups, silhouette_width its
// silhouette width there; a column per method (kmeans, ward, average,
// complete, single) gives that method's cluster; linkage_item is the
// station's item number (0-based) in linkage.csv, which is the first-stage
// group when Ward linkage ran in two stages; note says why a station was
// left out.
func WriteClusters(w io.Writer, c *pipeline.ClusterResult) error {
	cw := csv.NewWriter(w)
	head := append([]string(nil), ClustersColumns...)
	for _, p := range c.Partitions {
		head = append(head, p.Method)
	}
	cw.Write(append(head, "linkage_item", "note"))
	used := c.Used()
	for i, id := range c.Stations {
		rec := []string{id, strconv.Itoa(used.Labels[i] + 1), Num(c.Widths[i])}
		for _, p := range c.Partitions {
			rec = append(rec, strconv.Itoa(p.Labels[i]+1))
		}
		item := i
		if c.TwoStage {
			item = c.Partitions[1].Tree.Group[i]
		}
		cw.Write(append(rec, strconv.Itoa(item), ""))
	}
	for _, e := range c.Excluded {
		rec := make([]string, len(head)+2)
		rec[0], rec[len(rec)-1] = e.Station, "left out: "+e.Reason
		cw.Write(rec)
	}
	cw.Flush()
	return cw.Error()
}

// ClusterScoresColumns are the columns of cluster_scores.csv.
var ClusterScoresColumns = []string{"method", "k", "silhouette", "calinski_harabasz", "davies_bouldin", "within_ss", "sizes", "best_by", "used"}

// WriteClusterScores writes cluster_scores.csv: the validity of each
// method's partition for every k tried. best_by names the indices whose
// best value is at that k (silhouette and Calinski–Harabasz highest,
// Davies–Bouldin lowest); used is "yes" on the partition used.
func WriteClusterScores(w io.Writer, c *pipeline.ClusterResult) error {
	cw := csv.NewWriter(w)
	cw.Write(ClusterScoresColumns)
	for _, t := range c.Tables {
		for _, s := range t.Scores {
			var best []string
			if s.K == t.Best {
				best = append(best, "silhouette")
			}
			if s.K == t.BestCH {
				best = append(best, "calinski_harabasz")
			}
			if s.K == t.BestDB {
				best = append(best, "davies_bouldin")
			}
			used := ""
			if t.Method == c.Method && s.K == c.K {
				used = "yes"
			}
			sizes := make([]string, len(s.Sizes))
			for i, n := range s.Sizes {
				sizes[i] = strconv.Itoa(n)
			}
			cw.Write([]string{t.Method, strconv.Itoa(s.K), Num(s.Silhouette), Num(s.CalinskiHarabasz), Num(s.DaviesBouldin),
				Num(s.WithinSS), strings.Join(sizes, ";"), strings.Join(best, ";"), used})
		}
	}
	cw.Flush()
	return cw.Error()
}

// LinkageColumns are the columns of linkage.csv.
var LinkageColumns = []string{"method", "step", "a", "b", "height", "size"}

// WriteLinkage writes linkage.csv: the merge table of each linkage in the
// conventions of scipy's linkage matrix. Items are numbered 0..n−1 (the
// linkage_item of clusters.csv); step i (from 0) joins clusters a < b at
// height into cluster n + i of size observations.
func WriteLinkage(w io.Writer, c *pipeline.ClusterResult) error {
	cw := csv.NewWriter(w)
	cw.Write(LinkageColumns)
	for _, p := range c.Partitions {
		if p.Tree == nil {
			continue
		}
		for i, m := range p.Tree.Dendrogram.Merges {
			cw.Write([]string{p.Method, strconv.Itoa(i), strconv.Itoa(m.A), strconv.Itoa(m.B), Num(m.Height), strconv.Itoa(m.Size)})
		}
	}
	cw.Flush()
	return cw.Error()
}

// ClusterProfilesColumns are the columns of cluster_profiles.csv.
var ClusterProfilesColumns = []string{"cluster", "size", "medoid", "description", "stability", "feature", "units", "mean", "median", "centroid_z"}

// WriteClusterProfiles writes cluster_profiles.csv: one row per cluster of
// the partition used and feature, with the cluster's size, medoid station,
// description, bootstrap stability (mean Jaccard similarity; blank when
// not assessed), and the feature's mean and median in original units and
// the cluster's mean of the scaled feature (centroid_z).
func WriteClusterProfiles(w io.Writer, c *pipeline.ClusterResult) error {
	cw := csv.NewWriter(w)
	cw.Write(ClusterProfilesColumns)
	for k, p := range c.Profiles {
		stab := math.NaN()
		if c.Stability != nil {
			stab = c.Stability.Jaccard[k]
		}
		for j, f := range c.Features {
			cw.Write([]string{strconv.Itoa(k + 1), strconv.Itoa(p.Size), c.Medoids[k], p.Description, Num(stab),
				f, c.Units[j], Num(p.Mean[j]), Num(p.Median[j]), Num(p.Centroid[j])})
		}
	}
	cw.Flush()
	return cw.Error()
}

// WriteClusterAgreement writes cluster_agreement.csv: the adjusted Rand
// index of every pair of partitions.
func WriteClusterAgreement(w io.Writer, c *pipeline.ClusterResult) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"method_a", "method_b", "adjusted_rand"})
	for _, a := range c.Agreement {
		cw.Write([]string{a.A, a.B, Num(a.AdjustedRand)})
	}
	cw.Flush()
	return cw.Error()
}

// WriteClusterPCA writes cluster_pca.csv: per principal component its
// variance, the share of the total variance it explains and the
// cumulative share, then its loading on each feature.
func WriteClusterPCA(w io.Writer, c *pipeline.ClusterResult) error {
	cw := csv.NewWriter(w)
	head := []string{"component", "variance", "explained", "cumulative"}
	for _, f := range c.Features {
		head = append(head, "loading_"+f)
	}
	cw.Write(head)
	p := c.PCA
	var cum float64
	for k := range p.Variance {
		cum += p.Explained[k]
		rec := []string{strconv.Itoa(k + 1), Num(p.Variance[k]), Num(p.Explained[k]), Num(cum)}
		for j := range c.Features {
			rec = append(rec, Num(p.Loadings.At(j, k)))
		}
		cw.Write(rec)
	}
	cw.Flush()
	return cw.Error()
}

// stabilityWord reads a mean Jaccard similarity as Hennig (2007) does:
// 0.75 or more stable, below 0.6 doubtful, uncertain between.
func stabilityWord(j float64) string {
	switch {
	case math.IsNaN(j):
		return ""
	case j >= 0.75:
		return "stable"
	case j >= 0.6:
		return "uncertain"
	}
	return "doubtful"
}

// printLimit is the most stations left out that PrintClusters lists.
const printLimit = 20

// PrintClusters prints a summary of the clustering: what was clustered,
// the k chosen and why, the agreement between methods, each cluster's
// size, medoid, stability and description, and the stations left out.
func PrintClusters(w io.Writer, c *pipeline.ClusterResult) {
	n := len(c.Stations)
	src := "their daily series"
	if c.Source != "series" {
		src = "the table " + c.Source
	}
	scale := map[string]string{"zscore": "as z-scores", "robust": "scaled by median and MAD", "none": "unscaled"}[c.Scale]
	fmt.Fprintf(w, "Clustered %d of %d stations by %d features of %s, %s.\n", n, n+len(c.Excluded), len(c.Features), src, scale)
	if p := c.PCA; p != nil {
		var parts []string
		var sum float64
		for _, e := range p.Explained {
			parts = append(parts, Round(100*e, 1)+"%")
			sum += e
		}
		fmt.Fprintf(w, "Clustered on the first %d principal components, explaining %s of the variance (%s%% in all).\n",
			len(p.Explained), strings.Join(parts, ", "), Round(100*sum, 1))
	}
	t := c.Table()
	name := methodName(c.Method)
	if c.Chosen {
		fmt.Fprintf(w, "k = %d, the highest mean silhouette width of %s (%s) for k = %d..%d; Calinski–Harabasz would choose %d, Davies–Bouldin %d.\n",
			c.K, name, Round(c.Used().Score.Silhouette, 3), t.Scores[0].K, t.Scores[len(t.Scores)-1].K, t.BestCH, t.BestDB)
	} else {
		fmt.Fprintf(w, "k = %d, as configured; mean silhouette width of %s %s (the silhouette's best k in %d..%d is %d).\n",
			c.K, name, Round(c.Used().Score.Silhouette, 3), t.Scores[0].K, t.Scores[len(t.Scores)-1].K, t.Best)
	}
	var agree []string
	for _, a := range c.Agreement {
		if a.A == pipeline.KMeans {
			agree = append(agree, fmt.Sprintf("%s %s", a.B, Round(a.AdjustedRand, 2)))
		}
	}
	fmt.Fprintf(w, "Agreement of k-means with hierarchical clustering (adjusted Rand index): %s.\n", strings.Join(agree, ", "))
	if c.TwoStage {
		fmt.Fprintf(w, "Ward linkage ran in two stages: k-means grouped the stations first, and linkage.csv joins those groups.\n")
	}

	fmt.Fprintf(w, "\nClusters (%s):\n", name)
	medW := 6
	for _, m := range c.Medoids {
		medW = max(medW, utf8.RuneCountInString(m))
	}
	fmt.Fprintf(w, "%7s  %8s  %-*s  %-14s  %s\n", "cluster", "stations", medW, "medoid", "stability", "description")
	for k, p := range c.Profiles {
		stab := ""
		if c.Stability != nil {
			j := c.Stability.Jaccard[k]
			stab = Round(j, 2) + " " + stabilityWord(j)
		}
		fmt.Fprintf(w, "%7d  %8d  %-*s  %-14s  %s\n", k+1, p.Size, medW, c.Medoids[k], stab, p.Description)
	}
	if c.Stability != nil {
		fmt.Fprintf(w, "Stability: mean Jaccard similarity to the best-matching cluster over %d bootstrap replicates\n(Hennig 2007): 0.75 or more is stable, below 0.6 doubtful.\n", c.Replicates)
	}
	if len(c.Excluded) > 0 {
		fmt.Fprintf(w, "\nLeft out (%d):\n", len(c.Excluded))
		for i, e := range c.Excluded {
			if i == printLimit {
				fmt.Fprintf(w, "  ... and %d more (clusters.csv lists every station left out, with the reason)\n", len(c.Excluded)-i)
				break
			}
			fmt.Fprintf(w, "  %s: %s\n", e.Station, e.Reason)
		}
	}
}

func methodName(m string) string {
	if m == pipeline.KMeans {
		return "k-means"
	}
	return m + " linkage"
}

// ManifestClustering is the clustering section of run.json.
type ManifestClustering struct {
	Source     string             `json:"source"`
	Features   []string           `json:"features"`
	Scale      string             `json:"scale"`
	PCA        []float64          `json:"pca_explained,omitempty"`
	Stations   int                `json:"stations"`
	Excluded   map[string]string  `json:"excluded,omitempty"`
	Method     string             `json:"method"`
	K          int                `json:"k"`
	KChosenBy  string             `json:"k_chosen_by"`
	TwoStage   bool               `json:"two_stage"`
	Silhouette map[string]float64 `json:"silhouette"`
	Cophenetic map[string]float64 `json:"cophenetic_correlation,omitempty"`
	Agreement  map[string]float64 `json:"adjusted_rand"`
	Clusters   []ManifestCluster  `json:"clusters"`
	Bootstrap  int                `json:"bootstrap_replicates"`
}

// ManifestCluster is one cluster of the partition used.
type ManifestCluster struct {
	Cluster     int      `json:"cluster"`
	Size        int      `json:"size"`
	Medoid      string   `json:"medoid"`
	Description string   `json:"description"`
	Stability   *float64 `json:"stability,omitempty"`
}

// clusterManifest summarises the clustering of a run for run.json; nil
// when the run did not cluster. NaN figures are left out.
func clusterManifest(r *pipeline.Run) *ManifestClustering {
	c := r.Clusters
	if c == nil {
		return nil
	}
	m := &ManifestClustering{Source: c.Source, Features: c.Features, Scale: c.Scale, Stations: len(c.Stations),
		Method: c.Method, K: c.K, KChosenBy: "configuration", TwoStage: c.TwoStage,
		Silhouette: map[string]float64{}, Cophenetic: map[string]float64{}, Agreement: map[string]float64{}}
	if c.Chosen {
		m.KChosenBy = "silhouette"
	}
	if c.PCA != nil {
		m.PCA = c.PCA.Explained
	}
	if len(c.Excluded) > 0 {
		m.Excluded = map[string]string{}
		for _, e := range c.Excluded {
			m.Excluded[e.Station] = e.Reason
		}
	}
	for _, p := range c.Partitions {
		if !math.IsNaN(p.Score.Silhouette) {
			m.Silhouette[p.Method] = p.Score.Silhouette
		}
		if !math.IsNaN(p.Cophenetic) {
			m.Cophenetic[p.Method] = p.Cophenetic
		}
	}
	for _, a := range c.Agreement {
		if !math.IsNaN(a.AdjustedRand) {
			m.Agreement[a.A+"-"+a.B] = a.AdjustedRand
		}
	}
	for k, p := range c.Profiles {
		mc := ManifestCluster{Cluster: k + 1, Size: p.Size, Medoid: c.Medoids[k], Description: p.Description}
		if c.Stability != nil && !math.IsNaN(c.Stability.Jaccard[k]) {
			j := c.Stability.Jaccard[k]
			mc.Stability = &j
		}
		m.Clusters = append(m.Clusters, mc)
	}
	if c.Stability != nil {
		m.Bootstrap = c.Replicates
	}
	return m
}

// clusterCell is station id's cluster (from 1) in the partition used, or
// "" for a station left out.
func clusterCell(c *pipeline.ClusterResult, id string) string {
	if l, ok := c.Label(id); ok {
		return strconv.Itoa(l + 1)
	}
	return ""
}
