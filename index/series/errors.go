package series

import (
	"errors"
	"fmt"
	"strconv"
	"unicode/utf8"

	"rebound/index/calendar"
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

// Daily records are taken to lie between FirstDay and LastDay. A date
// outside is almost always a typing error (0202 for 2020), and accepting it
// would stretch a station's record over centuries of empty days.
var (
	FirstDay = calendar.New(1800, 1, 1)
	LastDay  = calendar.New(2199, 12, 31)
)

// parseDay parses an ISO 8601 date of a daily record. want is "" when the
// date is good, else what was wanted, for the error message.
func parseDay(b []byte) (day calendar.Date, want string) {
	d, err := calendar.ParseBytes(b)
	switch {
	case err == calendar.ErrRange:
		return 0, "a calendar day that exists"
	case err != nil:
		return 0, "an ISO 8601 date YYYY-MM-DD"
	case d < FirstDay || d > LastDay:
		return 0, "a date from " + FirstDay.String() + " to " + LastDay.String()
	}
	return d, ""
}
