package index

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"slices"
	"strings"

	"rebound/attributes/tabular"
	"rebound/index/calendar"
)

// Event is one row of the events table: the response of one water-quality
// variable at one station to one disturbance.
type Event struct {
	Station  string
	ID       string // the disturbance's identifier, shared by its variables
	Kind     string // e.g. heatwave, drought, flood
	Variable string // e.g. water_temperature
	Start    calendar.Date
	End      calendar.Date
	// PeakDeparture is the signed departure from normal at the worst point,
	// in the variable's units; NaN when unknown (no value in the window).
	PeakDeparture float64
	// RecoveryDays is the time to recovery when Recovered, else the time
	// observed without recovery (right-censored).
	RecoveryDays float64
	Recovered    bool
	// Dryness is the antecedent dryness before the event, NaN when unknown.
	Dryness float64
	Line    int // line in the events file
}

// EventColumns are the required columns of the events table, in the
// documented order.
var EventColumns = []string{"station", "event", "kind", "variable", "start", "end",
	"peak_departure", "recovery_days", "recovered", "antecedent_dryness"}

// EventTable is a validated events table.
type EventTable struct {
	File   string
	Events []Event
	Extra  []string // columns beyond EventColumns, which are kept in the file but not read
}

// LoadEvents reads the events table at path.
func LoadEvents(path string) (*EventTable, []error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, []error{err}
	}
	defer f.Close()
	return ReadEvents(f, path)
}

// ReadEvents reads an events table: CSV, UTF-8 with an optional byte-order
// mark, LF or CRLF line ends, a header row naming at least EventColumns (in
// any order). Dates are ISO 8601 (YYYY-MM-DD); recovered is true/false (or
// 1/0); antecedent_dryness may be blank (unknown). Every problem is
// returned (up to a limit), each at its line and column; the table is
// usable only when there are none. name labels error positions.
func ReadEvents(r io.Reader, name string) (*EventTable, []error) {
	cr := csv.NewReader(tabular.StripBOM(r))
	cr.ReuseRecord = true
	cr.FieldsPerRecord = -1
	var errs tabular.List
	fail := func(line, col int, column string, err error) {
		errs.Add(&tabular.ParseError{File: name, Line: line, Col: col, Column: column, Err: err})
	}
	rec, err := cr.Read()
	if err == io.EOF {
		fail(0, 0, "", tabular.ErrEmpty)
		return nil, errs.Errors()
	}
	if err != nil {
		return nil, []error{csvError(name, err)}
	}
	h, err := tabular.NewHeader(rec)
	if err != nil {
		fail(1, 0, "", err)
		return nil, errs.Errors()
	}
	idx, err := h.Require(EventColumns...)
	if err != nil {
		fail(1, 0, "", err)
		return nil, errs.Errors()
	}
	t := &EventTable{File: name}
	required := map[int]bool{}
	for _, i := range idx {
		required[i] = true
	}
	for i, n := range h.Names {
		if !required[i] {
			t.Extra = append(t.Extra, n)
		}
	}
	in := interner{}
	sizeHint := int64(-1)
	switch f := r.(type) {
	case interface{ Stat() (os.FileInfo, error) }:
		if fi, err := f.Stat(); err == nil && fi.Mode().IsRegular() {
			sizeHint = fi.Size()
		}
	case interface{ Size() int64 }: // strings.Reader, bytes.Reader
		sizeHint = f.Size()
	}
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			errs.Add(csvError(name, err))
			return nil, errs.Errors()
		}
		line, _ := cr.FieldPos(0)
		if len(rec) != len(h.Names) {
			if len(rec) == 1 && strings.TrimSpace(rec[0]) == "" {
				continue // a blank line
			}
			fail(line, 0, "", fmt.Errorf("want %d fields like the header, got %d", len(h.Names), len(rec)))
			continue
		}
		bad := func(k int, err error) {
			_, col := cr.FieldPos(idx[k])
			fail(line, col, EventColumns[k], err)
		}
		field := func(k int) string { return strings.TrimSpace(rec[idx[k]]) }
		e := Event{Line: line}
		for k, dst := range []*string{&e.Station, &e.ID, &e.Kind, &e.Variable} {
			if *dst = in.get(field(k)); *dst == "" {
				bad(k, errors.New("want a value, got a blank cell"))
			}
		}
		var startOK, endOK bool
		e.Start, startOK = date(field(4), func(err error) { bad(4, err) })
		e.End, endOK = date(field(5), func(err error) { bad(5, err) })
		if startOK && endOK && e.End < e.Start {
			bad(5, fmt.Errorf("end %s is before start %s", e.End, e.Start))
		}
		e.PeakDeparture = number(field(6), false, func(err error) { bad(6, err) })
		e.RecoveryDays = number(field(7), true, func(err error) { bad(7, err) })
		if e.RecoveryDays < 0 {
			bad(7, fmt.Errorf("want days >= 0, got %q", field(7)))
		}
		if e.Recovered, err = tabular.Bool(field(8)); err != nil {
			bad(8, err)
		}
		e.Dryness = number(field(9), false, func(err error) { bad(9, err) })
		if len(t.Events) == 256 && sizeHint > 0 {
			// Size the table once from the bytes per row seen so far: a
			// million-row table grown by doubling spends most of its load
			// time copying.
			perRow := float64(cr.InputOffset()) / float64(len(t.Events)+1)
			t.Events = slices.Grow(t.Events, int(float64(sizeHint)/perRow*1.05))
		}
		t.Events = append(t.Events, e)
	}
	if len(t.Events) == 0 && errs.Len() == 0 {
		fail(0, 0, "", tabular.ErrNoRows)
	}
	if errs.Len() > 0 {
		return nil, errs.Errors()
	}
	return t, nil
}

func csvError(name string, err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return &tabular.ParseError{File: name, Line: pe.Line, Col: pe.Column, Err: pe.Err}
	}
	return &tabular.ParseError{File: name, Err: err}
}

func date(s string, fail func(error)) (calendar.Date, bool) {
	d, err := calendar.Parse(s)
	if err != nil {
		fail(fmt.Errorf("%w, got %q", err, s))
		return 0, false
	}
	return d, true
}

func number(s string, required bool, fail func(error)) float64 {
	v, ok, err := tabular.Float(s)
	switch {
	case err != nil:
		fail(err)
	case !ok && required:
		fail(errors.New("want a number, got a blank cell"))
	}
	return v
}

// interner shares the storage of repeated strings (station, kind and
// variable names repeat on every row).
type interner map[string]string

func (in interner) get(s string) string {
	if v, ok := in[s]; ok {
		return v
	}
	s = strings.Clone(s)
	in[s] = s
	return s
}
