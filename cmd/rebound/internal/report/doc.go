// Package report writes rebound's outputs from a finished pipeline run: the
// ranking and indicator tables (CSV), the run manifest (JSON) and the
// terminal ranking table. Every file is written to a temporary file in the
// output folder, synced and renamed into place, so a reader never sees a
// half-written output and a failed run leaves earlier outputs intact.
package report
