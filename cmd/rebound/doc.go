// Command rebound ranks river monitoring stations by the resilience of
// their water quality to heat waves, droughts and floods, and documents the
// ranking for planners.
//
// Usage:
//
//	rebound run -config FILE [-out DIR] [-seed N] [-all] [-quiet]
//	rebound check -config FILE
//	rebound events -config FILE [-out DIR] [-quiet]
//	rebound cluster -config FILE [-k N] [-method M] [-out DIR] [-features FILE] [-scale S] [-quiet]
//	rebound sensitivity -config FILE [-out DIR] [-seed N] [-samples N] [-quiet]
//	rebound init [-o FILE] [-force]
//	rebound demo [-out DIR] [-force] [-quiet]
//	rebound version
//	rebound help [command]
//
// run reads the configuration (TOML) and every input it names: an events
// table or the daily station records to derive it from, and the station
// attribute table. It derives the indicators, normalises, weights,
// aggregates and ranks them, and writes the ranking, the indicator table,
// the derived events and criteria, the clusters and the sensitivity
// analysis when configured, the planner's workbook, memo and map layer, and
// run.json, a manifest of everything the run used. check lists every
// problem in the configuration and inputs without writing anything. events
// derives only the events and criteria; cluster only the station clusters;
// sensitivity only the robustness of the ranking to the weights. init
// writes a commented configuration template; demo writes an invented demo
// region and runs it.
//
// Flags may be written -flag or --flag. The exit status is 0 on success,
// 1 when an input is bad or a check fails, 2 for a usage error. Problems
// are written to standard error, one per line, each beginning with the
// file, line and column (or the configuration key) it concerns.
//
// Outputs are written to temporary files and renamed into place, so no
// output is ever half-written, and an output path that equals an input is
// refused. The same inputs and seed give byte-identical outputs; the run
// date recorded in them is today's, or the day given by SOURCE_DATE_EPOCH.
//
// The ranking is a screening aid, not a regulatory determination: use the
// water-quality standards that apply locally and licensed professional
// judgement before acting on it. The README describes every input, formula
// and output.
package main
