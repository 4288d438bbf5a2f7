package series

import (
	"errors"
	"fmt"
	"strconv"
	"unicode/utf8"
)

// Kinds of problem in an input file; a *ParseError unwraps to one of them.
var (
	ErrHeader     = errors.New("bad header")
	ErrFieldCount = errors.New("wrong number of fields")
	ErrQuote      = errors.New("bad quoting")
	ErrDate       = errors.New("bad date")
	ErrValue      = errors.New("bad value")
	ErrField      = errors.New("bad field")
	ErrDuplicate  = errors.New("duplicate row")
	ErrUnsorted   = errors.New("file not sorted by station")
	ErrTooLong    = errors.New("record too long")
	// ErrTooMany ends the list of problems when a reader stopped after
	// Options.MaxErrors of them.
	ErrTooMany = errors.New("too many problems")
)

// ParseError is a problem at a place in an input file. It prints as
//
//	file:line:col: column: want ..., got "..."
type ParseError struct {
	File       string // the input's name, as given to the reader
	Line       int    // 1-based line where the record (or field) starts
	Column     int    // 1-based byte column where the field starts
	ColumnName string // the column's header name; empty for the whole record
	Msg        string // what was expected and what was found
	Err        error  // the kind of problem: ErrDate, ErrValue, ...
}

func (e *ParseError) Error() string {
	b := make([]byte, 0, 64+len(e.Msg))
	b = append(b, e.File...)
	b = append(b, ':')
	b = strconv.AppendInt(b, int64(e.Line), 10)
	b = append(b, ':')
	b = strconv.AppendInt(b, int64(e.Column), 10)
	b = append(b, ": "...)
	if e.ColumnName != "" {
		b = append(b, e.ColumnName...)
		b = append(b, ": "...)
	}
	b = append(b, e.Msg...)
	return string(b)
}

// Unwrap returns the kind of problem.
func (e *ParseError) Unwrap() error { return e.Err }

// maxQuoted is how much of an offending field an error message shows.
const maxQuoted = 40

// quoteField quotes b for an error message, shortened to maxQuoted bytes.
func quoteField(b []byte) string {
	if len(b) <= maxQuoted {
		return strconv.Quote(string(b))
	}
	n := maxQuoted
	for n > 0 && !utf8.RuneStart(b[n]) {
		n--
	}
	return strconv.Quote(string(b[:n])) + "..."
}

func wantGot(want string, got []byte) string {
	return fmt.Sprintf("want %s, got %s", want, quoteField(got))
}
