package main

import (
	"io"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/report"
)

func cmdCluster(args []string, stdout, stderr io.Writer) error {
	return usageError{"cluster: not available yet"}
}

// renderClusters writes the clustering outputs of a run.
func renderClusters(r *pipeline.Run, _ *report.Manifest) ([]output, error) { return nil, nil }
