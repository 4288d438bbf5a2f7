package features

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"

	"rebound/index/series"
)

// Table is a feature table: one row per station, one column per feature.
type Table struct {
	Names    []string  // feature names, one per column
	Stations []string  // station IDs, one per row
	Data     []float64 // row-major values, len(Stations)·len(Names); NaN = missing
	// Excluded lists the stations left out of the table and why, in input
	// order. It is empty for a table read from a file.
	Excluded []Exclusion
}

// Exclusion is a station left out of a feature table.
type Exclusion struct {
	Station string
	Reason  string
}

// Row returns the values of row i, sharing Data.
func (t *Table) Row(i int) []float64 {
	d := len(t.Names)
	return t.Data[i*d : (i+1)*d : (i+1)*d]
}

// FromLong reads a long-layout series file (see series.Map) and computes
// the features of every station on up to workers goroutines (workers <= 0
// means GOMAXPROCS). Rows come in file order. opt must keep every variable
// the features use (Extractor.Vars).
func (e *Extractor) FromLong(r io.Reader, name string, opt series.Options, workers int) (*Table, series.Summary, error) {
	for _, v := range e.vars {
		if !slices.ContainsFunc(opt.Vars, func(o series.Var) bool { return o.Name == v }) {
			return nil, series.Summary{}, fmt.Errorf("features: the features use %q, which the series options do not keep", v)
		}
	}
	t := &Table{Names: e.Names()}
	type out struct {
		id     string
		vals   []float64
		reason string
	}
	sum, err := series.Map(r, name, opt, workers,
		func(s *series.Station) (out, error) {
			v, reason := e.Extract(nil, s)
			return out{s.ID, v, reason}, nil
		},
		func(o out) error {
			t.add(o.id, o.vals, o.reason)
			return nil
		})
	return t, sum, err
}

// FromStations computes the features of stations on up to workers
// goroutines (workers <= 0 means GOMAXPROCS), rows in the order of
// stations.
func (e *Extractor) FromStations(stations []*series.Station, workers int) *Table {
	t := &Table{Names: e.Names()}
	type out struct {
		vals   []float64
		reason string
	}
	i := 0
	series.MapStations(stations, workers,
		func(s *series.Station) (out, error) {
			v, reason := e.Extract(nil, s)
			return out{v, reason}, nil
		},
		func(o out) error {
			t.add(stations[i].ID, o.vals, o.reason)
			i++
			return nil
		})
	return t
}

func (t *Table) add(id string, vals []float64, reason string) {
	if reason != "" {
		t.Excluded = append(t.Excluded, Exclusion{id, reason})
		return
	}
	t.Stations = append(t.Stations, id)
	t.Data = append(t.Data, vals...)
}

// ReadTable reads a feature table in CSV: a header "station" followed by
// feature names, then one row per station with its ID and numbers. Empty
// cells, NA and NaN are missing (NaN). A repeated station or feature name is
// an error, as is a cell that is not a finite decimal number; errors are
// *series.ParseError values placed at file:line:col.
func ReadTable(r io.Reader, name string) (*Table, error) {
	br := bufio.NewReaderSize(r, 1<<16)
	if b, _ := br.Peek(3); string(b) == "\xef\xbb\xbf" {
		br.Discard(3)
	}
	cr := csv.NewReader(br)
	cr.ReuseRecord = true
	perr := func(line, col int, column string, kind error, msg string) error {
		return &series.ParseError{File: name, Line: line, Column: col, ColumnName: column, Msg: msg, Err: kind}
	}
	csvErr := func(err error, rec []string, want int) error {
		var pe *csv.ParseError
		if !errors.As(err, &pe) {
			return fmt.Errorf("%s: %w", name, err)
		}
		if errors.Is(pe.Err, csv.ErrFieldCount) {
			return perr(pe.StartLine, 1, "", series.ErrFieldCount, fmt.Sprintf("want %d fields, got %d", want, len(rec)))
		}
		return perr(pe.Line, pe.Column, "", series.ErrQuote, "want RFC 4180 quoting, got "+pe.Err.Error())
	}
	head, err := cr.Read()
	if err == io.EOF {
		return nil, perr(1, 1, "", series.ErrHeader, "want a header line station,<feature>,..., got an empty file")
	}
	if err != nil {
		return nil, csvErr(err, head, 0)
	}
	if head[0] != "station" {
		return nil, perr(1, 1, "", series.ErrHeader, fmt.Sprintf("want \"station\" as the first column, got %q", head[0]))
	}
	t := &Table{}
	cols := map[string]int{}
	for j, h := range head[1:] {
		_, col := cr.FieldPos(j + 1)
		if h == "" {
			return nil, perr(1, col, "", series.ErrHeader, `want a feature name, got ""`)
		}
		if k, ok := cols[h]; ok {
			return nil, perr(1, col, "", series.ErrHeader,
				fmt.Sprintf("want each feature once, got %q again (first in column %d)", h, k+2))
		}
		cols[h] = j
		t.Names = append(t.Names, h)
	}
	rows := map[string]int{}
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return t, nil
		}
		if err != nil {
			return nil, csvErr(err, rec, len(head))
		}
		line, _ := cr.FieldPos(0)
		id := rec[0]
		if id == "" {
			return nil, perr(line, 1, "station", series.ErrField, `want a station ID, got ""`)
		}
		if first, ok := rows[id]; ok {
			return nil, perr(line, 1, "station", series.ErrDuplicate,
				fmt.Sprintf("want one row per station, got %q again (first on line %d)", id, first))
		}
		rows[id] = line
		t.Stations = append(t.Stations, id)
		for j, cell := range rec[1:] {
			x, ok := parseCell(cell)
			if !ok {
				_, col := cr.FieldPos(j + 1)
				return nil, perr(line, col, t.Names[j], series.ErrValue,
					fmt.Sprintf("want a finite decimal number, or empty, NA or NaN if missing, got %q", cell))
			}
			t.Data = append(t.Data, x)
		}
	}
}

// parseCell parses a table cell: a finite decimal number, or a missing
// value (empty, NA, NaN in any case) as NaN.
func parseCell(s string) (float64, bool) {
	switch s {
	case "", "NA", "na", "Na", "nA":
		return math.NaN(), true
	}
	if len(s) == 3 && (s[0]|0x20) == 'n' && (s[1]|0x20) == 'a' && (s[2]|0x20) == 'n' {
		return math.NaN(), true
	}
	for i := range len(s) {
		c := s[i]
		if !(c >= '0' && c <= '9' || c == '.' || c == '-' || c == '+' || c == 'e' || c == 'E') {
			return 0, false // no hexadecimal, underscores, Inf or spaces
		}
	}
	x, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(x, 0) {
		return 0, false
	}
	return x, true
}

// WriteTable writes t as CSV in the layout ReadTable reads: missing values
// as empty cells, numbers in the shortest form that reads back the same.
// Excluded stations are not written.
func WriteTable(w io.Writer, t *Table) error {
	cw := csv.NewWriter(w)
	cw.Write(append([]string{"station"}, t.Names...))
	rec := make([]string, len(t.Names)+1)
	for i, id := range t.Stations {
		rec[0] = id
		for j, x := range t.Row(i) {
			rec[j+1] = ""
			if !math.IsNaN(x) {
				rec[j+1] = strconv.FormatFloat(x, 'g', -1, 64)
			}
		}
		cw.Write(rec)
	}
	cw.Flush()
	return cw.Error()
}
