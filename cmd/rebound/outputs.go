package main

import (
	"bytes"
	"fmt"
	"io"
	"path/filepath"
	"slices"

	"rebound/cmd/rebound/internal/geojson"
	"rebound/cmd/rebound/internal/memo"
	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
	"rebound/cmd/rebound/internal/workbook"
)

// output is one rendered output file; Name may contain a folder
// ("figures/scores.png").
type output struct {
	Name string
	Data []byte
}

// renderer renders some of a run's outputs. Renderers run in order; each
// sees the manifest, whose output list names every file of the run.
type renderer func(r *pipeline.Run, man *report.Manifest) ([]output, error)

// renderers lists what a run writes. The manifest (run.json) is rendered
// last, after every other output is known.
var renderers = []renderer{
	renderTables,
	renderDerived,
	renderClusters,
	renderSensitivity,
	renderDeliverables,
}

func renderTables(r *pipeline.Run, _ *report.Manifest) ([]output, error) {
	var outs []output
	for _, t := range []struct {
		name  string
		write func(io.Writer, *pipeline.Run) error
	}{
		{"ranking.csv", report.WriteRanking},
		{"indicators.csv", report.WriteIndicators},
	} {
		var buf bytes.Buffer
		if err := t.write(&buf, r); err != nil {
			return nil, fmt.Errorf("%s: %w", t.name, err)
		}
		outs = append(outs, output{t.name, buf.Bytes()})
	}
	return outs, nil
}

// renderDerived writes what the pass over the daily series found: the
// derived events and the criteria performance.
func renderDerived(r *pipeline.Run, _ *report.Manifest) ([]output, error) {
	var outs []output
	if r.Config.DeriveEvents() {
		var buf bytes.Buffer
		if err := report.WriteDerivedEvents(&buf, r); err != nil {
			return nil, fmt.Errorf("events.csv: %w", err)
		}
		outs = append(outs, output{"events.csv", buf.Bytes()})
	}
	if len(r.Config.Criteria) > 0 && r.Stations != nil {
		var buf bytes.Buffer
		if err := report.WriteCriteria(&buf, r); err != nil {
			return nil, fmt.Errorf("criteria.csv: %w", err)
		}
		outs = append(outs, output{"criteria.csv", buf.Bytes()})
	}
	return outs, nil
}

// renderDeliverables writes what planners open: the workbook, the memo
// with its figures, and the map layer, all from the same results.
func renderDeliverables(r *pipeline.Run, man *report.Manifest) ([]output, error) {
	book, err := workbook.Render(r, man)
	if err != nil {
		return nil, fmt.Errorf("rebound.xlsx: %w", err)
	}
	text, figures, err := memo.Render(r, man)
	if err != nil {
		return nil, fmt.Errorf("memo.md: %w", err)
	}
	layer, err := geojson.Render(r)
	if err != nil {
		return nil, fmt.Errorf("stations.geojson: %w", err)
	}
	outs := []output{{"rebound.xlsx", book}, {"memo.md", text}}
	names := make([]string, 0, len(figures))
	for name := range figures {
		names = append(names, name)
	}
	slices.Sort(names)
	for _, name := range names {
		outs = append(outs, output{name, figures[name]})
	}
	return append(outs, output{"stations.geojson", layer}), nil
}

// writeOutputs renders every output in memory, then writes each file
// atomically into dir. A failure while rendering leaves dir as it was.
func writeOutputs(r *pipeline.Run, dir string) (names []string, err error) {
	man, err := report.BuildManifest(r, report.Meta{Version: version, RunDate: runDate()})
	if err != nil {
		return nil, err
	}
	var outs []output
	for _, render := range renderers {
		o, err := render(r, man)
		if err != nil {
			return nil, err
		}
		outs = append(outs, o...)
	}
	for _, o := range outs {
		names = append(names, o.Name)
	}
	names = append(names, "run.json")
	man.Outputs = names
	var buf bytes.Buffer
	if err := report.WriteManifest(&buf, man); err != nil {
		return nil, err
	}
	outs = append(outs, output{"run.json", buf.Bytes()})

	if err := writeRendered(r, dir, outs); err != nil {
		return nil, err
	}
	return names, nil
}

// writeRendered writes rendered outputs into dir, after checking that none
// would overwrite an input. Every file is written to a temporary file
// first and renamed into place only when all of them have been written.
func writeRendered(r *pipeline.Run, dir string, outs []output) error {
	files := make([]report.File, len(outs))
	paths := make([]string, len(outs))
	for i, o := range outs {
		paths[i] = filepath.Join(dir, filepath.FromSlash(o.Name))
		files[i] = report.File{Path: paths[i], Data: o.Data}
	}
	if err := r.CheckOutputs(paths); err != nil {
		return err
	}
	return report.WriteFiles(files)
}
