// Package memo writes a planning memo from a finished run: a Markdown file
// (memo.md) that a planner can edit and convert (for example with pandoc),
// and its PNG figures (figures/*.png, drawn by package charts).
//
// The memo states its purpose, the data used and the method in brief,
// gives the ranking as a table and a chart, says which stations are
// robustly most and least resilient and which depend on the weighting
// (when the weight sensitivity analysis ran), describes the clusters in
// words (when the stations were clustered), reports the heat-wave and
// drought-memory findings, and ends with the limitations and cautions.
// Every number and station name in it comes from the run; a section whose
// data the run lacks says so in a sentence or is left out, so the memo
// reads sensibly for two stations without events as for hundreds.
package memo
