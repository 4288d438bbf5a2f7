package main

import (
	"io"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
)

func cmdSensitivity(args []string, stdout, stderr io.Writer) error {
	return usageError{"sensitivity: not available yet"}
}

// renderSensitivity writes the sensitivity outputs of a run.
func renderSensitivity(r *pipeline.Run, _ *report.Manifest) ([]output, error) { return nil, nil }
