package main

import (
	"fmt"
	"io"
	"maps"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"rebound/cmd/rebound/internal/pipeline"
)

func cmdEvents(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("events")
	cfgPath := fs.String("config", "", "configuration file")
	out := fs.String("out", "", "output folder")
	quiet := fs.Bool("quiet", false, "no progress on stderr")
	if help, err := parse(fs, args, stdout); help || err != nil {
		return err
	}
	if *cfgPath == "" {
		return usageError{"events: -config FILE is required"}
	}
	prog := newProgress(stderr, *quiet)
	r, errs := pipeline.LoadInputs(*cfgPath, pipeline.Options{Progress: prog.stations, NoClusters: true})
	prog.done()
	if len(errs) > 0 {
		return reportProblems(stderr, errs)
	}
	if !r.Config.HasSeries() {
		return fmt.Errorf("%s: events are derived from daily series: name them in inputs.series or inputs.wide", *cfgPath)
	}
	if !r.Config.DeriveEvents() {
		return fmt.Errorf("%s: inputs.events names an events table, so no events are derived; set events = \"\" to derive them from the series", *cfgPath)
	}
	dir := r.OutputDir(*out)
	outs, err := renderDerived(r, nil)
	if err != nil {
		return err
	}
	if err := writeRendered(r, dir, outs); err != nil {
		return err
	}
	rows, stations := 0, 0
	kinds := map[string]int{}
	for _, s := range r.Stations {
		if len(s.Rows) > 0 {
			stations++
		}
		seen := map[string]bool{}
		for _, row := range s.Rows {
			rows++
			if !seen[row.EventID] {
				seen[row.EventID] = true
				kinds[row.Kind]++
			}
		}
	}
	var parts []string
	for _, k := range slices.Sorted(maps.Keys(kinds)) {
		parts = append(parts, fmt.Sprintf("%d %s", kinds[k], k))
	}
	fmt.Fprintf(stdout, "%s read; %s at %s", count(len(r.Stations), "station"), count(rows, "event row"), count(stations, "station"))
	if len(parts) > 0 {
		fmt.Fprintf(stdout, " (%s)", strings.Join(parts, ", "))
	}
	fmt.Fprintln(stdout)
	for _, o := range outs {
		fmt.Fprintf(stdout, "Wrote %s\n", filepath.Join(dir, o.Name))
	}
	if len(r.Warnings) > 0 {
		fmt.Fprintf(stdout, "%d warnings:\n", len(r.Warnings))
		for _, w := range r.Warnings {
			fmt.Fprintln(stdout, "  "+w.Error())
		}
	}
	return nil
}

// progress prints a running count on stderr while series are read, when
// stderr is a terminal and progress is not silenced.
type progress struct {
	w       io.Writer
	on      bool
	printed bool
}

func newProgress(stderr io.Writer, quiet bool) *progress {
	p := &progress{w: stderr}
	if f, ok := stderr.(*os.File); ok && !quiet {
		if fi, err := f.Stat(); err == nil && fi.Mode()&os.ModeCharDevice != 0 {
			p.on = true
		}
	}
	return p
}

func (p *progress) stations(n int) {
	if p.on && (n < 100 || n%100 == 0) {
		fmt.Fprintf(p.w, "\rreading series: %d stations", n)
		p.printed = true
	}
}

func (p *progress) done() {
	if p.printed {
		fmt.Fprintln(p.w)
	}
}

// count is "1 station", "2 stations".
func count(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}
