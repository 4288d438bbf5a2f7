package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"rebound/cmd/rebound/internal/demo"
	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/config"
)

const version = "0.1.0"

// usageError is a mistake on the command line (exit status 2).
type usageError struct{ msg string }

func (e usageError) Error() string { return e.msg }

// errReported is a failure whose details were already written to stderr
// (exit status 1, nothing more to print).
type errReported struct{ n int }

func (e errReported) Error() string { return fmt.Sprintf("%d problems", e.n) }

// run is the whole command: it parses args, does the work, writes results to
// stdout and problems to stderr, and returns an error that main turns into
// an exit status.
func run(args []string, stdout, stderr io.Writer) error {
	if len(args) == 0 {
		fmt.Fprint(stderr, usage)
		return usageError{}
	}
	cmd, rest := args[0], args[1:]
	switch cmd {
	case "run":
		return cmdRun(rest, stdout, stderr)
	case "check":
		return cmdCheck(rest, stdout, stderr)
	case "events":
		return cmdEvents(rest, stdout, stderr)
	case "cluster":
		return cmdCluster(rest, stdout, stderr)
	case "sensitivity":
		return cmdSensitivity(rest, stdout, stderr)
	case "init":
		return cmdInit(rest, stdout, stderr)
	case "demo":
		return cmdDemo(rest, stdout, stderr)
	case "version", "-version", "--version":
		fmt.Fprintf(stdout, "rebound %s\n", version)
		return nil
	case "help", "-h", "-help", "--help":
		return cmdHelp(rest, stdout)
	}
	return usageError{fmt.Sprintf("unknown command %q", cmd)}
}

const usage = `rebound ranks river stations by the resilience of their water quality to
heat waves, droughts and floods.

Usage:
  rebound run -config FILE [-out DIR] [-seed N] [-all] [-quiet]
                                                         score and rank, write every output
  rebound check -config FILE                             validate the configuration and inputs
  rebound events -config FILE [-out DIR] [-quiet]        derive events and criteria from daily series
  rebound sensitivity -config FILE [-out DIR] [-seed N] [-samples N] [-quiet]
                                                         how robust the ranking is to the weights
  rebound cluster -config FILE [-k N] [-method M] [-out DIR]
                  [-features FILE] [-scale S] [-quiet]   cluster stations by features of their series
  rebound init [-o FILE] [-force]                        write a commented configuration template
  rebound demo [-out DIR] [-force] [-quiet]              write an invented demo region and run it
  rebound version                                        print the version
  rebound help [command]                                 show help

Flags may be written -flag or --flag. Exit status: 0 ok, 1 bad input or
failed check, 2 usage error. The ranking is a screening aid, not a
regulatory determination.
`

var helpText = map[string]string{
	"run": `rebound run -config FILE [-out DIR] [-seed N] [-all] [-quiet]

Reads the configuration and every input it names, derives the indicators,
scores and ranks every station, prints the ranking (the top and bottom
output.print stations) and writes into DIR:
  ranking.csv       rank, station, name, group, score, events, latitude,
                    longitude, flags (and the rank interval and cluster
                    when computed)
  indicators.csv    raw, normalised value, weight and contribution per
                    station and indicator
  events.csv, criteria.csv
                    the derived events and the criteria performance, when
                    events are derived from daily series
  rebound.xlsx      the workbook: summary, ranking, indicators, weights,
                    events, clusters, sensitivity, method, inputs, warnings
  memo.md, figures/*.png
                    the planning memo and its charts
  stations.geojson  the stations as a map layer, in rank order
  run.json          manifest: versions, resolved configuration, SHA-256 of
                    every input, row counts, weights used, every warning
With a [clustering] section it also clusters the stations (see rebound help
cluster): the ranking gains a cluster column and the clustering files are
written too.
With a [sensitivity] section it also runs the sensitivity analysis (see
rebound help sensitivity): the ranking gains each station's rank interval,
the summary of the analysis is printed, and its files are written too.
Nothing is written when an input is bad; outputs replace earlier ones
only once every one of them is written, and an output path equal to an
input is refused.
  -out DIR   output folder (default: output.dir beside the configuration)
  -seed N    seed for every random choice (default: the configuration's)
  -all       print every station, not only the top and bottom
  -quiet     no progress on stderr
The results are a screening aid, not a regulatory determination.
`,
	"sensitivity": `rebound sensitivity -config FILE [-out DIR] [-seed N] [-samples N] [-quiet]

Scores and ranks the stations as rebound run does, then measures how
robust the ranking is, with the [sensitivity] section of the configuration
(its defaults when there is none): each weight moved one at a time;
-samples (default sensitivity.samples) weight vectors drawn at random,
giving every station its median rank and 5th-95th percentile interval;
every other normalisation, aggregation and scope; and the Sobol indices of
the weights. Prints in plain words which stations are robustly in the top
and bottom groups, which depend on the weighting and which weights matter
most, and writes into DIR (default: output.dir) only:
  sensitivity.csv             per station: rank, median, p5, p95, best, worst,
                              P(top), P(bottom), stability, largest
                              one-at-a-time change, structural rank range
  sensitivity_oat.csv         one row per weight moved, step and station
  sensitivity_structural.csv  each station's rank under each alternative
  sensitivity_sobol.csv       first-order and total Sobol indices with
                              their intervals
The same inputs and seed give the same results on any number of cores.
`,
	"check": `rebound check -config FILE

Validates the configuration and every input and lists all problems found,
one per line, each with its file and line (or configuration key). Exit
status 1 when there is any problem.
`,
	"events": `rebound events -config FILE [-out DIR] [-quiet]

Reads the daily series the configuration names, finds the disturbances
(heat waves, droughts, floods and the user's listed events), measures each
water-quality variable's response to each one, evaluates the
water-temperature criteria, and writes into DIR (default: output.dir):
  events.csv    one row per station, event and variable: the events table
                rebound run reads (peak departure, recovery days, recovered,
                antecedent dryness), plus mean and cumulative departure, peak
                date, censoring reason, duration and driver figures
  criteria.csv  per station and criterion: the 7-day statistic used (7DADM or
                7-day mean), days above, reliability, resilience, vulnerability
Progress is shown on stderr when it is a terminal; -quiet silences it.
`,
	"cluster": `rebound cluster -config FILE [-k N] [-method M] [-out DIR] [-features FILE] [-scale S] [-quiet]

Groups the stations by features of their daily series (or the columns of a
feature table), with the configuration's [clustering] settings or their
defaults, and writes into DIR (default: output.dir; "out" without -config):
  features.csv           station x feature, original units (readable by -features)
  clusters.csv           each station's cluster for every method, its silhouette
                         width, its item in linkage.csv, or why it was left out
  cluster_scores.csv     silhouette, Calinski-Harabasz, Davies-Bouldin and
                         within-cluster sum of squares per method and k
  linkage.csv            merge tables of ward, average, complete and single
                         linkage, in scipy's linkage-matrix conventions
  cluster_profiles.csv   per cluster: size, medoid, description, stability,
                         mean and median of each feature
  cluster_agreement.csv  adjusted Rand index between every two methods
  cluster_pca.csv        explained variance and loadings (with PCA only)
and prints the chosen k, the clusters with their descriptions and
stability, the agreement between methods and the stations left out.
  -k N           number of clusters (default: clustering.k; 0 chooses it by
                 the silhouette)
  -method M      partition used for peer groups and profiles: kmeans, ward,
                 average, complete or single
  -features FILE cluster a feature table (CSV: station, then numeric columns)
                 instead of the series; -config may then be left out
  -scale S       zscore, robust or none
  -quiet         no progress on stderr
`,
	"init": `rebound init [-o FILE] [-force]

Writes a fully commented configuration template to FILE (default
rebound.toml). An existing file is not overwritten unless -force is given.
`,
	"demo": `rebound demo [-out DIR] [-force] [-quiet]

Writes an invented demonstration region (stations, fifteen years of daily
records, user events, configuration) into DIR (default rebound-demo) and
runs the whole pipeline on it, writing outputs into DIR/out. The data are
generated from a fixed seed, so every run writes the same files. Files that
exist with other content (say, an edited configuration) are not
overwritten unless -force is given; -quiet silences the progress on stderr.
`,
}

func cmdHelp(args []string, stdout io.Writer) error {
	if len(args) == 0 {
		fmt.Fprint(stdout, usage)
		return nil
	}
	text, ok := helpText[args[0]]
	if !ok {
		return usageError{fmt.Sprintf("no help for %q", args[0])}
	}
	fmt.Fprint(stdout, text)
	return nil
}

// newFlags returns a silent FlagSet for a subcommand; parse reports -h as
// a request for help (exit 0) and other problems as usage errors.
func newFlags(name string) *flag.FlagSet {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	return fs
}

func parse(fs *flag.FlagSet, args []string, stdout io.Writer) (help bool, err error) {
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			fmt.Fprint(stdout, helpText[fs.Name()])
			return true, nil
		}
		return false, usageError{fmt.Sprintf("%s: %v", fs.Name(), err)}
	}
	if fs.NArg() > 0 {
		return false, usageError{fmt.Sprintf("%s: unexpected argument %q", fs.Name(), fs.Arg(0))}
	}
	return false, nil
}

// parseSeed reads a -seed flag: nil when not given.
func parseSeed(cmd, s string) (*uint64, error) {
	if s == "" {
		return nil, nil
	}
	n, err := strconv.ParseUint(s, 10, 64)
	if err != nil {
		return nil, usageError{fmt.Sprintf("%s: -seed: want a non-negative integer, got %q", cmd, s)}
	}
	return &n, nil
}

// reportProblems writes each problem on its own line and returns errReported.
func reportProblems(stderr io.Writer, errs []error) error {
	for _, e := range errs {
		fmt.Fprintln(stderr, e.Error())
	}
	return errReported{len(errs)}
}

func cmdRun(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("run")
	cfgPath := fs.String("config", "", "configuration file")
	out := fs.String("out", "", "output folder")
	seed := fs.String("seed", "", "seed (overrides the configuration)")
	all := fs.Bool("all", false, "print every station")
	quiet := fs.Bool("quiet", false, "no progress on stderr")
	if help, err := parse(fs, args, stdout); help || err != nil {
		return err
	}
	if *cfgPath == "" {
		return usageError{"run: -config FILE is required"}
	}
	seedOverride, err := parseSeed("run", *seed)
	if err != nil {
		return err
	}
	return runPipeline(*cfgPath, *out, seedOverride, *all, *quiet, stdout, stderr)
}

func runPipeline(cfgPath, out string, seed *uint64, all, quiet bool, stdout, stderr io.Writer) error {
	prog := newProgress(stderr, quiet)
	r, errs := pipeline.LoadWith(cfgPath, pipeline.Options{Progress: prog.stations, ClusterProgress: prog.stage, Seed: seed})
	prog.done()
	if len(errs) > 0 {
		return reportProblems(stderr, errs)
	}
	if seed != nil {
		r.Config.Seed = *seed
	}
	if err := r.Score(); err != nil {
		return err
	}
	dir := r.OutputDir(out)
	names, err := writeOutputs(r, dir)
	if err != nil {
		return err
	}
	report.PrintRanking(stdout, r, r.Config.Output.Print, all)
	if r.Sensitivity != nil {
		fmt.Fprintln(stdout)
		report.PrintSensitivity(stdout, r, summaryWidth)
	} else if r.SensitivitySkipped != "" {
		fmt.Fprintf(stdout, "\nThe sensitivity analysis was skipped: %s.\n", r.SensitivitySkipped)
	}
	fmt.Fprintf(stdout, "\nWrote %s to %s", strings.Join(names, ", "), dir)
	if len(r.Warnings) > 0 {
		fmt.Fprintf(stdout, " (%d warnings: see run.json)", len(r.Warnings))
	}
	fmt.Fprintln(stdout)
	return nil
}

// runDate is the date recorded in the outputs: the day given by the
// SOURCE_DATE_EPOCH environment variable (seconds since 1970, the
// reproducible-builds convention) when it is set, else today (UTC). Outputs
// are byte-identical for the same inputs, seed and run date.
func runDate() string {
	if s := os.Getenv("SOURCE_DATE_EPOCH"); s != "" {
		if sec, err := strconv.ParseInt(s, 10, 64); err == nil {
			return time.Unix(sec, 0).UTC().Format("2006-01-02")
		}
	}
	return time.Now().UTC().Format("2006-01-02")
}

func cmdCheck(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("check")
	cfgPath := fs.String("config", "", "configuration file")
	if help, err := parse(fs, args, stdout); help || err != nil {
		return err
	}
	if *cfgPath == "" {
		return usageError{"check: -config FILE is required"}
	}
	r, errs := pipeline.LoadWith(*cfgPath, pipeline.Options{Checking: true})
	if len(errs) > 0 {
		reportProblems(stderr, errs)
		if len(errs) == 1 {
			fmt.Fprintln(stderr, "1 problem found")
		} else {
			fmt.Fprintf(stderr, "%d problems found\n", len(errs))
		}
		return errReported{len(errs)}
	}
	events := 0
	if r.Events != nil {
		events = len(r.Events.Events)
	}
	fmt.Fprintf(stdout, "%s: ok: %d stations, %d event rows, %d indicators, weights %s\n",
		*cfgPath, len(r.Attrs.Stations), events, len(r.Config.Indicators), r.Weights.Method)
	for _, w := range r.Warnings {
		fmt.Fprintln(stdout, "warning: "+w.Error())
	}
	return nil
}

func cmdInit(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("init")
	out := fs.String("o", "rebound.toml", "file to write")
	force := fs.Bool("force", false, "overwrite an existing file")
	if help, err := parse(fs, args, stdout); help || err != nil {
		return err
	}
	if _, err := os.Stat(*out); err == nil && !*force {
		return fmt.Errorf("%s exists; not overwriting it (use -force to replace it)", *out)
	}
	if err := report.WriteFile(*out, func(w io.Writer) error { _, err := io.WriteString(w, config.Template()); return err }); err != nil {
		return err
	}
	fmt.Fprintf(stdout, "Wrote %s; edit it, then run: rebound check -config %s\n", *out, *out)
	return nil
}

func cmdDemo(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("demo")
	out := fs.String("out", "rebound-demo", "folder for the demo inputs and outputs")
	force := fs.Bool("force", false, "overwrite demo files that were changed")
	quiet := fs.Bool("quiet", false, "no progress on stderr")
	if help, err := parse(fs, args, stdout); help || err != nil {
		return err
	}
	files, err := demo.Files()
	if err != nil {
		return err
	}
	for _, f := range files {
		p := filepath.Join(*out, f.Name)
		if old, err := os.ReadFile(p); err == nil && !bytes.Equal(old, f.Data) && !*force {
			return fmt.Errorf("%s exists and differs from the demo's version (edited?); not overwriting it (use -force, or another -out)", p)
		}
	}
	var set []report.File
	for _, f := range files {
		set = append(set, report.File{Path: filepath.Join(*out, f.Name), Data: f.Data})
	}
	if err := report.WriteFiles(set); err != nil {
		return err
	}
	fmt.Fprintf(stdout, "Wrote the demo region (%s) to %s\n\n", demo.Region, *out)
	return runPipeline(filepath.Join(*out, demo.ConfigName), "", nil, false, *quiet, stdout, stderr)
}
