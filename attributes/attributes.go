// Package attributes reads and validates the station and basin attribute
// table: one row per station with its identifier, name and WGS84 position,
// any number of numeric attributes (drainage area, forest cover, reservoir
// storage, ...) and an optional text peer group.
//
// The table is a CSV file (UTF-8, optional byte-order mark, LF or CRLF) or
// the first sheet of an .xlsx workbook. Required columns are station, name,
// latitude and longitude (decimal degrees); "group" is text; every other
// column must be numeric, with blank cells meaning missing.
package attributes

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"

	"github.com/xuri/excelize/v2"

	"rebound/attributes/tabular"
)

// Station is one row of the attribute table.
type Station struct {
	ID        string
	Name      string
	Latitude  float64 // decimal degrees north, WGS84
	Longitude float64 // decimal degrees east, WGS84
	Group     string  // peer group; "" when the table has none
	// Values holds one value per Table.Columns entry, NaN when blank.
	Values []float64
	Line   int // line (CSV) or row (sheet) the station was read from
}

// Table is a validated attribute table.
type Table struct {
	File     string
	Stations []Station // in file order
	Columns  []string  // numeric columns, in file order
	HasGroup bool
	Rows     int // data rows read
	byID     map[string]int
	byCol    map[string]int
}

// Station returns the station with identifier id.
func (t *Table) Station(id string) (*Station, bool) {
	i, ok := t.byID[id]
	if !ok {
		return nil, false
	}
	return &t.Stations[i], true
}

// Index returns the position of station id in Stations.
func (t *Table) Index(id string) (int, bool) {
	i, ok := t.byID[id]
	return i, ok
}

// Column returns the values of numeric column name, one per station in
// table order, NaN where blank.
func (t *Table) Column(name string) ([]float64, bool) {
	j, ok := t.byCol[name]
	if !ok {
		return nil, false
	}
	out := make([]float64, len(t.Stations))
	for i := range t.Stations {
		out[i] = t.Stations[i].Values[j]
	}
	return out, true
}

// Required lists the columns every attribute table has.
var Required = []string{"station", "name", "latitude", "longitude"}

// Load reads the table at path, as a workbook when the name ends in .xlsx
// and as CSV otherwise. It returns every problem found (up to a limit);
// the table is usable only when there are none.
func Load(path string) (*Table, []error) {
	if strings.EqualFold(filepath.Ext(path), ".xlsx") {
		return ReadXLSX(path)
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, []error{err}
	}
	defer f.Close()
	return ReadCSV(f, path)
}

// ReadCSV reads an attribute table from r; name labels error positions.
func ReadCSV(r io.Reader, name string) (*Table, []error) {
	cr := csv.NewReader(tabular.StripBOM(r))
	cr.FieldsPerRecord = -1
	var rows []row
	var errs tabular.List
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				errs.Add(&tabular.ParseError{File: name, Line: pe.Line, Col: pe.Column, Err: pe.Err})
				return nil, errs.Errors()
			}
			errs.Add(&tabular.ParseError{File: name, Err: err})
			return nil, errs.Errors()
		}
		line, _ := cr.FieldPos(0)
		r := row{line: line, cells: append([]string(nil), rec...), cols: make([]int, len(rec))}
		for i := range rec {
			_, r.cols[i] = cr.FieldPos(i)
		}
		rows = append(rows, r)
	}
	return build(name, "", rows)
}

// ReadXLSX reads the first sheet of the workbook at path.
func ReadXLSX(path string) (*Table, []error) {
	f, err := excelize.OpenFile(path)
	if err != nil {
		return nil, []error{fmt.Errorf("%s: not a readable .xlsx workbook: %w", path, err)}
	}
	defer f.Close()
	sheets := f.GetSheetList()
	if len(sheets) == 0 {
		return nil, []error{&tabular.ParseError{File: path, Err: tabular.ErrEmpty}}
	}
	// Raw values: a number formatted "0.0" must not lose its decimals.
	cells, err := f.GetRows(sheets[0], excelize.Options{RawCellValue: true})
	if err != nil {
		return nil, []error{fmt.Errorf("%s: sheet %q: %w", path, sheets[0], err)}
	}
	var rows []row
	for i, rec := range cells {
		r := row{line: i + 1, cells: rec, cols: make([]int, len(rec))}
		for j := range rec {
			r.cols[j] = j + 1
		}
		rows = append(rows, r)
	}
	// Drop trailing rows that are wholly blank (sheets often carry some).
	for len(rows) > 0 && blank(rows[len(rows)-1].cells) {
		rows = rows[:len(rows)-1]
	}
	return build(path, sheets[0], rows)
}

type row struct {
	line  int
	cells []string
	cols  []int // 1-based column of each cell
}

func blank(cells []string) bool {
	for _, c := range cells {
		if strings.TrimSpace(c) != "" {
			return false
		}
	}
	return true
}

func build(file, sheet string, rows []row) (*Table, []error) {
	var errs tabular.List
	at := func(r row, j int, column string, err error) {
		col := 0
		if j < len(r.cols) {
			col = r.cols[j]
		}
		errs.Add(&tabular.ParseError{File: file, Sheet: sheet, Line: r.line, Col: col, Column: column, Err: err})
	}
	if len(rows) == 0 {
		errs.Add(&tabular.ParseError{File: file, Sheet: sheet, Err: tabular.ErrEmpty})
		return nil, errs.Errors()
	}
	h, err := tabular.NewHeader(rows[0].cells)
	if err != nil {
		at(rows[0], 0, "", err)
		return nil, errs.Errors()
	}
	idx, err := h.Require(Required...)
	if err != nil {
		errs.Add(&tabular.ParseError{File: file, Sheet: sheet, Line: rows[0].line, Err: err})
		return nil, errs.Errors()
	}
	iStation, iName, iLat, iLon := idx[0], idx[1], idx[2], idx[3]
	iGroup := h.Index("group")
	t := &Table{File: file, HasGroup: iGroup >= 0, byID: map[string]int{}, byCol: map[string]int{}}
	var numeric []int
	for j, n := range h.Names {
		if j == iStation || j == iName || j == iLat || j == iLon || j == iGroup {
			continue
		}
		t.byCol[n] = len(t.Columns)
		t.Columns = append(t.Columns, n)
		numeric = append(numeric, j)
	}
	if len(rows) == 1 {
		errs.Add(&tabular.ParseError{File: file, Sheet: sheet, Err: tabular.ErrNoRows})
		return nil, errs.Errors()
	}
	firstLine := map[string]int{}
	for _, r := range rows[1:] {
		if blank(r.cells) {
			continue
		}
		t.Rows++
		if len(r.cells) > len(h.Names) && !blank(r.cells[len(h.Names):]) {
			at(r, len(h.Names), "", fmt.Errorf("want %d fields like the header, got %d", len(h.Names), len(r.cells)))
			continue
		}
		// A sheet leaves out the empty cells at the end of a row; a CSV
		// row with fewer fields than the header has lost a separator,
		// which would shift its values into the wrong columns.
		if sheet == "" && len(r.cells) < len(h.Names) {
			errs.Add(&tabular.ParseError{File: file, Line: r.line,
				Err: fmt.Errorf("want %d fields like the header, got %d", len(h.Names), len(r.cells))})
			continue
		}
		cell := func(j int) string {
			if j < len(r.cells) {
				return strings.TrimSpace(r.cells[j])
			}
			return ""
		}
		s := Station{ID: cell(iStation), Name: cell(iName), Line: r.line, Values: make([]float64, len(numeric))}
		if iGroup >= 0 {
			s.Group = cell(iGroup)
		}
		switch {
		case s.ID == "":
			at(r, iStation, "station", errors.New("want a station identifier, got a blank cell"))
		case firstLine[s.ID] > 0:
			at(r, iStation, "station", fmt.Errorf("%w station %q (first on line %d)", tabular.ErrDuplicate, s.ID, firstLine[s.ID]))
		default:
			firstLine[s.ID] = r.line
		}
		s.Latitude = coordinate(cell(iLat), 90, func(err error) { at(r, iLat, "latitude", err) })
		s.Longitude = coordinate(cell(iLon), 180, func(err error) { at(r, iLon, "longitude", err) })
		for k, j := range numeric {
			v, _, err := tabular.Float(cell(j))
			if err != nil {
				at(r, j, h.Names[j], err)
			}
			s.Values[k] = v
		}
		t.byID[s.ID] = len(t.Stations)
		t.Stations = append(t.Stations, s)
	}
	if t.Rows == 0 {
		errs.Add(&tabular.ParseError{File: file, Sheet: sheet, Err: tabular.ErrNoRows})
	}
	if errs.Len() > 0 {
		return nil, errs.Errors()
	}
	return t, nil
}

// coordinate parses decimal degrees within ±limit.
func coordinate(s string, limit float64, fail func(error)) float64 {
	v, ok, err := tabular.Float(s)
	switch {
	case err != nil:
		fail(fmt.Errorf("want decimal degrees, got %q", s))
	case !ok:
		fail(errors.New("want decimal degrees, got a blank cell"))
	case math.Abs(v) > limit:
		fail(fmt.Errorf("%w: want decimal degrees in [-%g, %g], got %g", tabular.ErrRange, limit, limit, v))
	}
	return v
}
