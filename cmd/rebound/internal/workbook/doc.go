// Package workbook writes the results of a finished run as an Excel
// workbook (rebound.xlsx) with github.com/xuri/excelize/v2, for planners
// who read results in a spreadsheet rather than in CSV files.
//
// The workbook opens on a summary (what was run, the top and bottom
// stations, the cautions) followed by the ranking, the indicators and the
// weights actually used, then, when the run computed them, the events,
// criteria, clusters, cluster profiles and sensitivity tables, a method
// sheet that documents every step with the values this run used, and the
// inputs with their SHA-256 digests. Each table has a frozen, styled header
// row whose headers name their units, per-column number formats and
// widths, and an autofilter; the ranking's scores carry a colour scale.
// Native charts (scores with rank intervals, the one-at-a-time tornado, a
// scatter of the two leading features by cluster) point at the cells of
// the tables they draw.
//
// Text that comes from users (station names, groups, notes) is always
// written as a string cell, never as a formula, whatever character it
// begins with. Undefined numbers are blank cells, with the reason in a
// note or flag column. The same run gives the same bytes: the document's
// created and modified times are the run date of the manifest, and nothing
// depends on the clock or on map order.
package workbook
