// Package tabular holds what the table readers share: positioned parse
// errors, an error list that keeps going after the first problem, a header
// index, and strict number, boolean and date parsing.
//
// Positions follow encoding/csv: lines and columns are 1-based, and the
// column counts bytes, not characters, from the start of the line to the
// start of the field. For spreadsheets the position is the sheet and cell
// reference instead (Sheet1!C14).
package tabular

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// ParseError is a problem at a place in an input table.
type ParseError struct {
	File   string
	Sheet  string // spreadsheet sheet name; "" for CSV
	Line   int    // 1-based line (CSV) or row (sheet); 0 when the file as a whole is at fault
	Col    int    // 1-based column; 0 when the whole line is at fault
	Column string // the column's header name, if known
	Err    error
}

func (e *ParseError) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	switch {
	case e.Sheet != "" && e.Line > 0 && e.Col > 0:
		fmt.Fprintf(&b, ":%s!%s%d", e.Sheet, ColumnLetters(e.Col), e.Line)
	case e.Sheet != "" && e.Line > 0:
		fmt.Fprintf(&b, ":%s!%d", e.Sheet, e.Line)
	case e.Line > 0 && e.Col > 0:
		fmt.Fprintf(&b, ":%d:%d", e.Line, e.Col)
	case e.Line > 0:
		fmt.Fprintf(&b, ":%d", e.Line)
	}
	if e.Column != "" {
		b.WriteString(": " + e.Column)
	}
	b.WriteString(": " + e.Err.Error())
	return b.String()
}

func (e *ParseError) Unwrap() error { return e.Err }

// ColumnLetters returns the spreadsheet letters of 1-based column c (1 → A,
// 27 → AA).
func ColumnLetters(c int) string {
	var s []byte
	for c > 0 {
		c--
		s = append([]byte{byte('A' + c%26)}, s...)
		c /= 26
	}
	return string(s)
}

// Sentinel kinds, for errors.Is.
var (
	ErrEmpty     = errors.New("the file is empty; want a header row and at least one data row")
	ErrNoRows    = errors.New("the file has a header row but no data rows")
	ErrMissing   = errors.New("required column is missing")
	ErrDuplicate = errors.New("duplicate")
	ErrRange     = errors.New("out of range")
)

// List collects errors up to a limit, then only counts them, so that a
// checker can report every problem in a bad file without drowning the
// user.
type List struct {
	Max     int // 0 means 50
	errs    []error
	dropped int
}

// Add records err (nil is ignored).
func (l *List) Add(err error) {
	if err == nil {
		return
	}
	limit := l.Max
	if limit == 0 {
		limit = 50
	}
	if len(l.errs) >= limit {
		l.dropped++
		return
	}
	l.errs = append(l.errs, err)
}

// Len returns how many errors were added, including dropped ones.
func (l *List) Len() int { return len(l.errs) + l.dropped }

// Errors returns the recorded errors, followed by one summary error when
// some were dropped.
func (l *List) Errors() []error {
	if l.dropped == 0 {
		return l.errs
	}
	return append(l.errs[:len(l.errs):len(l.errs)], fmt.Errorf("... and %d more problems not shown", l.dropped))
}

// StripBOM returns r without a leading UTF-8 byte-order mark.
func StripBOM(r io.Reader) io.Reader {
	buf := make([]byte, 3)
	n, err := io.ReadFull(r, buf)
	if err == nil && bytes.Equal(buf, []byte{0xEF, 0xBB, 0xBF}) {
		return r
	}
	return io.MultiReader(bytes.NewReader(buf[:n]), r)
}

// Header maps column names to their 0-based index.
type Header struct {
	Names []string
	index map[string]int
}

// NewHeader indexes names (trimmed of surrounding spaces). It reports an
// empty or duplicated name.
func NewHeader(names []string) (*Header, error) {
	h := &Header{Names: make([]string, len(names)), index: make(map[string]int, len(names))}
	for i, n := range names {
		n = strings.TrimSpace(n)
		h.Names[i] = n
		if n == "" {
			return h, fmt.Errorf("column %d has an empty name", i+1)
		}
		if j, dup := h.index[n]; dup {
			return h, fmt.Errorf("column %q appears twice (columns %d and %d): %w", n, j+1, i+1, ErrDuplicate)
		}
		h.index[n] = i
	}
	return h, nil
}

// Index returns the index of column name, or -1.
func (h *Header) Index(name string) int {
	if i, ok := h.index[name]; ok {
		return i
	}
	return -1
}

// Require returns the indices of names, and an error naming every missing
// one.
func (h *Header) Require(names ...string) ([]int, error) {
	idx := make([]int, len(names))
	var missing []string
	for i, n := range names {
		idx[i] = h.Index(n)
		if idx[i] < 0 {
			missing = append(missing, strconv.Quote(n))
		}
	}
	if len(missing) > 0 {
		return idx, fmt.Errorf("%w: %s (the header has %s)", ErrMissing, strings.Join(missing, ", "), strings.Join(h.Names, ","))
	}
	return idx, nil
}

// Float parses a finite decimal number. Blank (after trimming spaces)
// returns NaN and ok = false with a nil error; NaN, Inf and anything that
// is not a number are errors.
func Float(s string) (v float64, ok bool, err error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return math.NaN(), false, nil
	}
	v, err = strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return math.NaN(), false, fmt.Errorf("want a finite number, got %q", s)
	}
	return v, true, nil
}

// Bool parses true/false (any case) and 1/0.
func Bool(s string) (bool, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "true", "1":
		return true, nil
	case "false", "0":
		return false, nil
	}
	return false, fmt.Errorf("want true or false, got %q", s)
}
