// Package series holds daily station records and reads them from the long
// and wide CSV layouts.
//
// A Station is one station's complete daily record: every variable is a
// slice of daily values aligned on the same first day, in canonical units,
// with NaN where no usable value exists. Readers deliver stations one at a
// time so that memory holds a few stations' records, never a whole file.
//
// # Long layout
//
// One row per station, day and variable, with a header naming the columns
// in any order:
//
//	station,date,variable,value[,qualifier]
//
// The file is UTF-8, with or without a byte-order mark, with LF or CRLF line
// ends, quoted as in RFC 4180 (a field in double quotes may hold commas,
// line breaks and doubled quotes ""). Dates are ISO 8601 calendar dates
// (YYYY-MM-DD). An empty value, NA or NaN (any case) is a missing value and
// is counted as Blank. Other columns are an error unless Options.Ignore
// names them: a units or flag column that the reader silently dropped could
// change the meaning of the values.
//
// The rows of one station must be contiguous (the file sorted by station);
// within a station, dates and variables may come in any order. A station
// that reappears after another is an error naming the line, as is a second
// row for the same station, date and variable (naming both lines). Rows of
// variables not listed in Options.Vars are skipped and counted per variable
// name in the Summary.
//
// Each kept row goes through these steps, and Counts records the outcome:
// an empty value is Blank; a row whose qualifier holds a code listed in
// Options.Exclude is Excluded; the value is converted to canonical units
// (Converted); a value outside the variable's plausible Range is dropped
// (OutOfRange); the rest are Kept.
//
// Map reads a long file in one pass. One goroutine splits the input into
// station blocks, workers parse the blocks and run the caller's function on
// each Station, and the results are handed back in file order, so the output
// does not depend on the number of workers. Memory holds a bounded number of
// station blocks (about four per worker), whatever the number of stations.
//
// # Wide layout
//
// One file per variable, one row per day and one column per station:
//
//	date,<station>,<station>,...
//
// The caller says which variable and units the file holds. A wide file is
// read whole (ReadWide); Merge joins the stations of several wide files and
// MapStations runs a function on stations in parallel with ordered results.
//
// # Units
//
// Temperatures are kept in °C (input "degC", "°C" or "C"; "degF", "°F" or
// "F" are converted by (F − 32)·5/9) and discharge in m³/s (input "m3/s",
// "m³/s" or "cms"; "ft3/s", "ft³/s" or "cfs" are converted by
// 1 ft³/s = 0.028316846592 m³/s, exact since the international foot is
// 0.3048 m). Any other units, such as "uS/cm" or "mg/L", are passed through.
//
// # Errors
//
// A problem in the input is a *ParseError that prints as
//
//	file:line:col: column: want ..., got "..."
//
// with the 1-based line and the 1-based byte column where the field starts.
// With Options.MaxErrors > 0 a reader skips the bad rows, keeps going and
// returns every problem found (up to the limit) joined into one error, which
// suits a command that checks a file. Nothing in the input makes a reader
// panic.
//
// # Coverage and gaps
//
// FillGaps interpolates linearly across short interior gaps. Coverage counts
// the days with data per calendar year or water year (October–September),
// and Requirement.Check says whether a station has enough complete years,
// with a reason when it has not.
package series
