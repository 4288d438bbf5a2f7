package main

import (
	"bytes"
	"fmt"
	"io"
	"strconv"
	"strings"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/config"
)

// summaryWidth is the width the sensitivity summary is wrapped to.
const summaryWidth = 78

func cmdSensitivity(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("sensitivity")
	cfgPath := fs.String("config", "", "configuration file")
	out := fs.String("out", "", "output folder")
	seed := fs.String("seed", "", "seed (overrides the configuration)")
	samples := fs.String("samples", "", "Monte Carlo weight samples (overrides sensitivity.samples)")
	quiet := fs.Bool("quiet", false, "no progress on stderr")
	if help, err := parse(fs, args, stdout); help || err != nil {
		return err
	}
	if *cfgPath == "" {
		return usageError{"sensitivity: -config FILE is required"}
	}
	seedOverride, err := parseSeed("sensitivity", *seed)
	if err != nil {
		return err
	}
	nSamples := 0
	if *samples != "" {
		n, err := strconv.Atoi(*samples)
		if err != nil || n < 1 {
			return usageError{fmt.Sprintf("sensitivity: -samples: want a whole number of samples >= 1, got %q", *samples)}
		}
		nSamples = n
	}

	prog := newProgress(stderr, *quiet)
	r, errs := pipeline.LoadWith(*cfgPath, pipeline.Options{Progress: prog.stations, ClusterProgress: prog.stage, Seed: seedOverride})
	prog.done()
	if len(errs) > 0 {
		return reportProblems(stderr, errs)
	}
	defaults := r.Config.Sensitivity == nil
	if defaults {
		r.Config.Sensitivity = config.DefaultSensitivity()
	}
	if nSamples > 0 {
		r.Config.Sensitivity.Samples = nSamples
	}
	if err := r.Score(); err != nil {
		return err
	}
	if r.Sensitivity == nil {
		return fmt.Errorf("sensitivity: %s", r.SensitivitySkipped)
	}
	dir := r.OutputDir(*out)
	outs, err := renderSensitivity(r, nil)
	if err != nil {
		return err
	}
	if err := writeRendered(r, dir, outs); err != nil {
		return err
	}

	if defaults {
		fmt.Fprintf(stdout, "%s has no [sensitivity] section: the defaults are used (rebound init shows them).\n\n", *cfgPath)
	}
	report.PrintSensitivity(stdout, r, summaryWidth)
	fmt.Fprintf(stdout, "\n%s\n", report.Caution)
	var names []string
	for _, o := range outs {
		names = append(names, o.Name)
	}
	fmt.Fprintf(stdout, "\nWrote %s to %s\n", strings.Join(names, ", "), dir)
	// The run's other warnings belong to rebound run and check.
	for _, w := range r.Sensitivity.Warnings {
		fmt.Fprintln(stdout, "warning: "+w.Error())
	}
	return nil
}

// renderSensitivity writes the sensitivity outputs of a run: sensitivity.csv
// (per station), sensitivity_oat.csv (one-at-a-time runs),
// sensitivity_structural.csv (when there are structural alternatives) and
// sensitivity_sobol.csv (when the Sobol indices ran).
func renderSensitivity(r *pipeline.Run, _ *report.Manifest) ([]output, error) {
	writers := report.SensitivityWriters(r)
	var outs []output
	for _, name := range report.SensitivityOutputs(r) {
		var buf bytes.Buffer
		if err := writers[name](&buf, r); err != nil {
			return nil, fmt.Errorf("%s: %w", name, err)
		}
		outs = append(outs, output{name, buf.Bytes()})
	}
	return outs, nil
}
