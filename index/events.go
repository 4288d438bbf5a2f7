package index

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
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
	// Severity is the disturbance's class, 1 moderate to 4 extreme, 0
	// when unrated (user events, floods without a fit, or a table without
	// the column).
	Severity int
	// DriverIntensity is the disturbance's strength on its kind's scale
	// (see index/events), NaN when unknown.
	DriverIntensity float64
	// Censor is why recovery was not observed: "" (recovered or not
	// said), "record_end", "gap" or "next_event".
	Censor string
	// Regional is the identifier of the regional event this station event
	// belongs to under comparison.basis = "shared", "" otherwise.
	Regional string
	Line     int // line in the events file
}

// EventColumns are the required columns of the events table, in the
// documented order.
var EventColumns = []string{"station", "event", "kind", "variable", "start", "end",
	"peak_departure", "recovery_days", "recovered", "antecedent_dryness"}

// OptionalEventColumns are read when the header has them: the severity
// class (0–4 or its name: unrated, moderate, strong, severe, extreme), the
// driver intensity (a number) and the censoring reason (blank,
// record_end, gap or next_event). events.csv written by rebound has them.
var OptionalEventColumns = []string{"severity", "driver_intensity", "censor_reason"}

// SeverityNames name the severity classes 0–4.
var SeverityNames = []string{"unrated", "moderate", "strong", "severe", "extreme"}

// CensorReasons are the values of the censor_reason column.
var CensorReasons = []string{"record_end", "gap", "next_event"}

// EventTable is a validated events table.
type EventTable struct {
	File   string
	Events []Event
	Extra  []string // columns beyond EventColumns, which are kept in the file but not read
	// Has says which of OptionalEventColumns the table has.
	Has map[string]bool
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
//
// Quoting follows RFC 4180 as encoding/csv reads it, and so do the
// positions of errors: lines and byte columns, 1-based.
func ReadEvents(r io.Reader, name string) (*EventTable, []error) {
	sizeHint := int64(-1)
	switch f := r.(type) {
	case interface{ Stat() (os.FileInfo, error) }:
		if fi, err := f.Stat(); err == nil && fi.Mode().IsRegular() {
			sizeHint = fi.Size()
		}
	case interface{ Size() int64 }: // strings.Reader, bytes.Reader
		sizeHint = f.Size()
	}
	rs := newRecords(tabular.StripBOM(r))
	var errs tabular.List
	fail := func(line, col int, column string, err error) {
		errs.Add(&tabular.ParseError{File: name, Line: line, Col: col, Column: column, Err: err})
	}
	err := rs.next()
	if err == io.EOF {
		fail(0, 0, "", tabular.ErrEmpty)
		return nil, errs.Errors()
	}
	if err != nil {
		return nil, []error{csvError(name, err)}
	}
	names := make([]string, len(rs.fields))
	for i, f := range rs.fields {
		names[i] = string(f)
	}
	h, err := tabular.NewHeader(names)
	if err != nil {
		fail(1, 0, "", err)
		return nil, errs.Errors()
	}
	idx, err := h.Require(EventColumns...)
	if err != nil {
		fail(1, 0, "", err)
		return nil, errs.Errors()
	}
	t := &EventTable{File: name, Has: map[string]bool{}}
	required := map[int]bool{}
	for _, i := range idx {
		required[i] = true
	}
	for _, c := range OptionalEventColumns {
		i := slices.Index(h.Names, c)
		idx = append(idx, i)
		if i >= 0 {
			t.Has[c] = true
			required[i] = true
		}
	}
	for i, n := range h.Names {
		if !required[i] {
			t.Extra = append(t.Extra, n)
		}
	}
	p := rowParser{rs: rs, idx: idx, name: name, errs: &errs, in: interner{m: map[string]string{}}}
	for {
		err := rs.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			errs.Add(csvError(name, err))
			return nil, errs.Errors()
		}
		if len(rs.fields) != len(h.Names) {
			if len(rs.fields) == 1 && len(bytes.TrimSpace(rs.fields[0])) == 0 {
				continue // a blank line
			}
			fail(rs.recLine, 0, "", fmt.Errorf("want %d fields like the header, got %d", len(h.Names), len(rs.fields)))
			continue
		}
		e := p.event()
		if len(t.Events) == 256 && sizeHint > 0 {
			// Size the table once from the bytes per row seen so far: a
			// million-row table grown by doubling spends most of its load
			// time copying.
			perRow := float64(rs.off) / float64(len(t.Events)+1)
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

// rowParser turns the current record of rs into an Event, reporting each
// bad cell at its line and column.
type rowParser struct {
	rs   *records
	idx  []int // the record index of each of EventColumns
	name string
	errs *tabular.List
	in   interner
	// The last start and end read without error: the rows of an event's
	// variables share them.
	lastDate [2][]byte
	lastDay  [2]calendar.Date
}

// field returns column k of EventColumns then OptionalEventColumns,
// trimmed of surrounding spaces; nil for an optional column the table
// lacks.
func (p *rowParser) field(k int) []byte {
	if p.idx[k] < 0 {
		return nil
	}
	return bytes.TrimSpace(p.rs.fields[p.idx[k]])
}

// bad reports err in column k of EventColumns then OptionalEventColumns.
func (p *rowParser) bad(k int, err error) {
	name := ""
	if k < len(EventColumns) {
		name = EventColumns[k]
	} else {
		name = OptionalEventColumns[k-len(EventColumns)]
	}
	p.errs.Add(&tabular.ParseError{File: p.name, Line: p.rs.recLine, Col: p.rs.cols[p.idx[k]], Column: name, Err: err})
}

func (p *rowParser) event() Event {
	e := Event{Line: p.rs.recLine}
	for k, dst := range [...]*string{&e.Station, &e.ID, &e.Kind, &e.Variable} {
		if *dst = p.in.get(k, p.field(k)); *dst == "" {
			p.bad(k, errors.New("want a value, got a blank cell"))
		}
	}
	var startOK, endOK bool
	e.Start, startOK = p.date(4)
	e.End, endOK = p.date(5)
	if startOK && endOK && e.End < e.Start {
		p.bad(5, fmt.Errorf("end %s is before start %s", e.End, e.Start))
	}
	e.PeakDeparture = p.number(6, false)
	e.RecoveryDays = p.number(7, true)
	if e.RecoveryDays < 0 {
		p.bad(7, fmt.Errorf("want days >= 0, got %q", p.field(7)))
	}
	var err error
	if e.Recovered, err = parseBool(p.field(8)); err != nil {
		p.bad(8, err)
	}
	e.Dryness = p.number(9, false)
	n := len(EventColumns)
	e.DriverIntensity = math.NaN()
	if p.idx[n] >= 0 {
		e.Severity = p.severity(n)
	}
	if p.idx[n+1] >= 0 {
		e.DriverIntensity = p.number(n+1, false)
	}
	if p.idx[n+2] >= 0 {
		if c := p.field(n + 2); len(c) > 0 {
			i := slices.Index(CensorReasons, string(c))
			if i < 0 {
				p.bad(n+2, fmt.Errorf("want blank or one of %q, got %q", CensorReasons, c))
			} else {
				e.Censor = CensorReasons[i]
			}
		}
	}
	return e
}

// severity parses a severity class: blank (unrated), 0–4 or a class name.
func (p *rowParser) severity(k int) int {
	s := p.field(k)
	if len(s) == 0 {
		return 0
	}
	if len(s) == 1 && s[0] >= '0' && s[0] <= '4' {
		return int(s[0] - '0')
	}
	if i := slices.Index(SeverityNames, strings.ToLower(string(s))); i >= 0 {
		return i
	}
	p.bad(k, fmt.Errorf("want a severity class 0-4 or one of %q, got %q", SeverityNames, s))
	return 0
}

func (p *rowParser) date(k int) (calendar.Date, bool) {
	s := p.field(k)
	c := k - 4 // start or end
	if bytes.Equal(s, p.lastDate[c]) && len(s) > 0 {
		return p.lastDay[c], true
	}
	d, err := calendar.ParseBytes(s)
	if err != nil {
		p.bad(k, fmt.Errorf("%w, got %q", err, s))
		return 0, false
	}
	p.lastDate[c], p.lastDay[c] = append(p.lastDate[c][:0], s...), d
	return d, true
}

// number parses column k as tabular.Float does; a blank cell is NaN, and
// an error when required.
func (p *rowParser) number(k int, required bool) float64 {
	s := p.field(k)
	if v, ok := parseDecimal(s); ok {
		return v
	}
	v, ok, err := tabular.Float(string(s))
	switch {
	case err != nil:
		p.bad(k, err)
	case !ok && required:
		p.bad(k, errors.New("want a number, got a blank cell"))
	}
	return v
}

// parseDecimal parses the common plain decimals, an optional sign, digits
// and an optional fraction (-1.25, 14, 0.375), without allocating. The
// digits without the point must make an integer below 2⁵³ and the
// fraction have at most 22 digits: both the integer and the power of ten
// are then exact, and one division rounds correctly, which is what
// strconv.ParseFloat returns (Clinger 1990, the exact case). ok is false
// for anything else, which the caller parses in full.
func parseDecimal(s []byte) (v float64, ok bool) {
	neg := false
	if len(s) > 0 && (s[0] == '-' || s[0] == '+') {
		neg = s[0] == '-'
		s = s[1:]
	}
	var m uint64
	digits, frac := 0, -1
	for i, c := range s {
		switch {
		case c >= '0' && c <= '9':
			m = m*10 + uint64(c-'0')
			digits++
			if digits > 19 {
				return 0, false
			}
		case c == '.' && frac < 0 && i > 0:
			frac = i + 1
		default:
			return 0, false
		}
	}
	scale := 0
	if frac >= 0 {
		scale = len(s) - frac
		if scale == 0 {
			return 0, false // "1." is left to strconv
		}
	}
	if digits == 0 || m >= 1<<53 || scale > 22 {
		return 0, false
	}
	v = float64(m)
	if scale > 0 {
		v /= pow10[scale]
	}
	if neg {
		v = -v
	}
	return v, true
}

// pow10 holds the powers of ten that are exact in a float64.
var pow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// parseBool is tabular.Bool for bytes; it allocates only for a cell that
// is not plain ASCII true/false/1/0 (in any case).
func parseBool(s []byte) (bool, error) {
	switch len(s) {
	case 1:
		switch s[0] {
		case '1':
			return true, nil
		case '0':
			return false, nil
		}
	case 4:
		if s[0]|0x20 == 't' && s[1]|0x20 == 'r' && s[2]|0x20 == 'u' && s[3]|0x20 == 'e' {
			return true, nil
		}
	case 5:
		if s[0]|0x20 == 'f' && s[1]|0x20 == 'a' && s[2]|0x20 == 'l' && s[3]|0x20 == 's' && s[4]|0x20 == 'e' {
			return false, nil
		}
	}
	return tabular.Bool(string(s))
}

func csvError(name string, err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return &tabular.ParseError{File: name, Line: pe.Line, Col: pe.Column, Err: pe.Err}
	}
	return &tabular.ParseError{File: name, Err: err}
}

// interner shares the storage of repeated strings (station, kind and
// variable names repeat on every row, event identifiers on the rows of
// each variable). Each column remembers its last few values, which are
// usually the next ones too, before asking the map.
type interner struct {
	m      map[string]string
	recent [4][4]string // per column, filled round robin
	next   [4]int
}

// get returns s as a string, the same storage for the same text.
func (in *interner) get(col int, s []byte) string {
	r := &in.recent[col]
	for _, v := range r {
		if string(s) == v {
			return v
		}
	}
	v, ok := in.m[string(s)]
	if !ok {
		v = string(s)
		in.m[v] = v
	}
	r[in.next[col]] = v
	in.next[col] = (in.next[col] + 1) % len(r)
	return v
}

// records splits CSV input into records. A line without a double quote,
// or whose quoted fields are plain (a quote at each end, none inside, on
// one line), is split here without allocating: nearly every line of an
// events table. Any other record is read by encoding/csv from the same
// buffer, so the quoting rules, the errors and their positions are
// encoding/csv's (RFC 4180; lines and byte columns from 1).
type records struct {
	br  *bufio.Reader
	cr  *csv.Reader // made on the first record that needs it
	eof bool        // br holds the rest of the input

	line int   // line number of the next line to read
	off  int64 // bytes read up to the end of the current record

	// The current record: its fields (valid until the next call of
	// next), the byte column at which each starts, and the line of its
	// first field.
	fields  [][]byte
	cols    []int
	recLine int
	scratch []byte // the fields of a record read by encoding/csv
}

func newRecords(r io.Reader) *records {
	return &records{br: bufio.NewReaderSize(r, 64<<10), line: 1}
}

// next reads the next record that is not an empty line. It returns io.EOF
// at the end of the input, a *csv.ParseError for bad quoting, and read
// errors as they are.
func (rs *records) next() error {
	for {
		buf, _ := rs.br.Peek(rs.br.Buffered())
		i := bytes.IndexByte(buf, '\n')
		n := i + 1 // the line's bytes, its end included
		if i < 0 {
			if !rs.eof {
				if len(buf) == rs.br.Size() {
					return rs.viaCSV() // a line longer than the buffer
				}
				switch _, err := rs.br.Peek(len(buf) + 1); err {
				case nil:
				case io.EOF:
					rs.eof = true
				default:
					return err
				}
				continue
			}
			if len(buf) == 0 {
				return io.EOF
			}
			i, n = len(buf), len(buf) // the last line has no line end
		}
		line := buf[:i]
		if k := len(line) - 1; k >= 0 && line[k] == '\r' {
			line = line[:k] // CRLF, or CR at the end of the input
		}
		if len(line) == 0 {
			rs.br.Discard(n)
			rs.line++
			rs.off += int64(n)
			continue
		}
		if !rs.split(line) {
			return rs.viaCSV()
		}
		rs.recLine = rs.line
		rs.line++
		rs.off += int64(n)
		rs.br.Discard(n) // the fields stay valid: only a read moves the buffer
		return nil
	}
}

// split splits line, without its line end, into fields at commas. A field
// in double quotes with no quote inside is taken without its quotes. It
// returns false, having split nothing, when the line needs encoding/csv:
// a quote elsewhere, a doubled quote, or a quoted field that goes on to
// the next line.
func (rs *records) split(line []byte) bool {
	rs.fields, rs.cols = rs.fields[:0], rs.cols[:0]
	plain := bytes.IndexByte(line, '"') < 0
	for i := 0; ; {
		if !plain && i < len(line) && line[i] == '"' {
			j := bytes.IndexByte(line[i+1:], '"')
			if j < 0 {
				return false
			}
			end := i + 1 + j // the closing quote
			if end+1 < len(line) && line[end+1] != ',' {
				return false
			}
			rs.fields = append(rs.fields, line[i+1:end])
			rs.cols = append(rs.cols, i+1)
			if end+1 == len(line) {
				return true
			}
			i = end + 2
			continue
		}
		f := line[i:]
		j := bytes.IndexByte(f, ',')
		if j >= 0 {
			f = f[:j]
		}
		if !plain && bytes.IndexByte(f, '"') >= 0 {
			return false
		}
		rs.fields = append(rs.fields, f)
		rs.cols = append(rs.cols, i+1)
		if j < 0 {
			return true
		}
		i += j + 1
	}
}

// viaCSV reads the next record with encoding/csv, which reads it from
// rs.br, and renumbers its lines: encoding/csv counts only the lines it
// has read itself.
func (rs *records) viaCSV() error {
	if rs.cr == nil {
		rs.cr = csv.NewReader(rs.br) // rs.br is large enough to be used as it is
		rs.cr.ReuseRecord = true
		rs.cr.FieldsPerRecord = -1
	}
	before := rs.cr.InputOffset()
	rec, err := rs.cr.Read()
	rs.off += rs.cr.InputOffset() - before
	if err != nil {
		if pe, ok := err.(*csv.ParseError); ok {
			shift := rs.line - pe.StartLine // the record starts on rs.line
			return &csv.ParseError{StartLine: pe.StartLine + shift, Line: pe.Line + shift, Column: pe.Column, Err: pe.Err}
		}
		return err
	}
	first, _ := rs.cr.FieldPos(0)
	shift := rs.line - first
	rs.scratch = rs.scratch[:0]
	rs.cols = rs.cols[:0]
	for k, f := range rec {
		rs.scratch = append(rs.scratch, f...)
		_, col := rs.cr.FieldPos(k)
		rs.cols = append(rs.cols, col)
	}
	rs.fields = rs.fields[:0]
	at := 0
	for _, f := range rec {
		rs.fields = append(rs.fields, rs.scratch[at:at+len(f):at+len(f)])
		at += len(f)
	}
	last, _ := rs.cr.FieldPos(len(rec) - 1)
	rs.recLine = rs.line
	rs.line = last + shift + strings.Count(rec[len(rec)-1], "\n") + 1
	return nil
}
