package main

import (
	"bytes"
	"fmt"
	"io"
	"path/filepath"
	"slices"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/config"
)

func cmdCluster(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("cluster")
	cfgPath := fs.String("config", "", "configuration file")
	featPath := fs.String("features", "", "precomputed feature table")
	k := fs.Int("k", 0, "number of clusters (0 = choose)")
	method := fs.String("method", "", "partition used for peer groups")
	scale := fs.String("scale", "", "zscore, robust or none")
	out := fs.String("out", "", "output folder")
	quiet := fs.Bool("quiet", false, "no progress on stderr")
	if help, err := parse(fs, args, stdout); help || err != nil {
		return err
	}
	if *cfgPath == "" && *featPath == "" {
		return usageError{"cluster: -config FILE (or -features FILE) is required"}
	}
	if *k < 0 || *k == 1 {
		return usageError{fmt.Sprintf("cluster: -k: want a number of clusters >= 2 (or 0 to choose it), got %d", *k)}
	}
	if *method != "" && !slices.Contains(config.ClusterMethods, *method) {
		return usageError{fmt.Sprintf("cluster: -method: want one of %v, got %q", config.ClusterMethods, *method)}
	}
	if *scale != "" && !slices.Contains(config.ClusterScales, *scale) {
		return usageError{fmt.Sprintf("cluster: -scale: want one of %v, got %q", config.ClusterScales, *scale)}
	}
	abs := ""
	if *featPath != "" {
		var err error
		if abs, err = filepath.Abs(*featPath); err != nil {
			return err
		}
	}
	override := func(c *config.Clustering) {
		if *k > 0 {
			c.K = *k
		}
		if *method != "" {
			c.Method = *method
		}
		if *scale != "" {
			c.Scale = *scale
		}
		if abs != "" {
			c.FeaturesFile, c.Features = abs, nil
		}
	}

	prog := newProgress(stderr, *quiet)
	opt := pipeline.Options{Progress: prog.stations, ClusterProgress: prog.stage, Clustering: override, OnlyClusters: true}
	var r *pipeline.Run
	var errs []error
	if *cfgPath != "" {
		r, errs = pipeline.LoadInputs(*cfgPath, opt)
	} else {
		r, errs = pipeline.ClusterFile(abs, opt)
	}
	prog.done()
	if len(errs) > 0 {
		return reportProblems(stderr, errs)
	}
	dir := r.OutputDir(*out)
	outs, err := renderClusters(r, nil)
	if err != nil {
		return err
	}
	if err := writeRendered(r, dir, outs); err != nil {
		return err
	}
	report.PrintClusters(stdout, r.Clusters)
	fmt.Fprintln(stdout)
	for _, o := range outs {
		fmt.Fprintf(stdout, "Wrote %s\n", filepath.Join(dir, o.Name))
	}
	if len(r.Clusters.Warnings) > 0 {
		fmt.Fprintf(stdout, "%d warnings:\n", len(r.Clusters.Warnings))
		for _, w := range r.Clusters.Warnings {
			fmt.Fprintln(stdout, "  "+w.Error())
		}
	}
	return nil
}

// renderClusters writes the clustering outputs of a run.
func renderClusters(r *pipeline.Run, _ *report.Manifest) ([]output, error) {
	if r.Clusters == nil {
		return nil, nil
	}
	var outs []output
	for _, name := range report.ClusterFiles {
		var buf bytes.Buffer
		ok, err := report.WriteClusterFile(&buf, name, r.Clusters)
		if err != nil {
			return nil, fmt.Errorf("%s: %w", name, err)
		}
		if ok {
			outs = append(outs, output{name, buf.Bytes()})
		}
	}
	return outs, nil
}

// stage shows the progress of a clustering stage.
func (p *progress) stage(name string, done, total int) {
	if !p.on {
		return
	}
	if p.printed {
		fmt.Fprint(p.w, "\r\033[K")
	}
	fmt.Fprintf(p.w, "\rclustering: %s %d/%d", name, done, total)
	p.printed = true
}
