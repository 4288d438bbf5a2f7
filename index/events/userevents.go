package events

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"
	"unicode"

	"rebound/attributes/tabular"
	"rebound/index/calendar"
	"rebound/index/series"
)

// UserEvent is a disturbance listed by the user rather than detected.
type UserEvent struct {
	Kind       string        // letters, digits, '_' and '-', e.g. "spill"
	Start, End calendar.Date // both included
	Station    string        // "" means every station
}

// userHeader is the header of a user-events file; the station column may
// be left out.
var userHeader = []string{"kind", "start", "end", "station"}

// ReadUserEvents reads a CSV list of user events with the header
// kind,start,end or kind,start,end,station, in UTF-8 with or without a
// byte-order mark. Dates are ISO 8601 (YYYY-MM-DD), end >= start; an empty
// or missing station means every station. Lines starting with '#' are
// comments and spaces around fields are ignored. name is the file name
// used in errors, which are *series.ParseError values of the form
// "events.csv:4:10: end: want a date >= start 2019-07-03, got
// "2019-07-01"", of kind series.ErrHeader, ErrFieldCount, ErrField,
// ErrDate or ErrQuote. ReadUserEvents stops at the first problem.
func ReadUserEvents(r io.Reader, name string) ([]UserEvent, error) {
	cr := csv.NewReader(tabular.StripBOM(r))
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	cr.ReuseRecord = true
	fail := func(field, col int, kind error, msg string) error {
		line, c := cr.FieldPos(field)
		f := ""
		if col >= 0 {
			f = userHeader[col]
		}
		return &series.ParseError{File: name, Line: line, Column: c, ColumnName: f, Msg: msg, Err: kind}
	}
	rec, err := cr.Read()
	if err == io.EOF {
		return nil, &series.ParseError{File: name, Line: 1, Column: 1, Msg: "want a header kind,start,end[,station], got an empty file", Err: series.ErrHeader}
	}
	if err != nil {
		return nil, csvError(name, err)
	}
	if len(rec) < 3 || len(rec) > 4 {
		return nil, fail(0, -1, series.ErrHeader, fmt.Sprintf("want a header kind,start,end[,station], got %q", strings.Join(rec, ",")))
	}
	ncol := len(rec)
	for i, h := range rec {
		if !strings.EqualFold(strings.TrimSpace(h), userHeader[i]) {
			return nil, fail(i, -1, series.ErrHeader, fmt.Sprintf("header column %d: want %q, got %q", i+1, userHeader[i], h))
		}
	}
	var out []UserEvent
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return out, nil
		}
		if err != nil {
			return nil, csvError(name, err)
		}
		if len(rec) != ncol {
			return nil, fail(0, -1, series.ErrFieldCount, fmt.Sprintf("want %d fields as in the header, got %d", ncol, len(rec)))
		}
		var e UserEvent
		e.Kind = strings.TrimSpace(rec[0])
		if !validKind(e.Kind) {
			return nil, fail(0, 0, series.ErrField, fmt.Sprintf("want a kind of letters, digits, '_' or '-', got %q", rec[0]))
		}
		if e.Start, err = calendar.Parse(strings.TrimSpace(rec[1])); err != nil {
			return nil, fail(1, 1, series.ErrDate, fmt.Sprintf("%v, got %q", err, rec[1]))
		}
		if e.End, err = calendar.Parse(strings.TrimSpace(rec[2])); err != nil {
			return nil, fail(2, 2, series.ErrDate, fmt.Sprintf("%v, got %q", err, rec[2]))
		}
		if e.End < e.Start {
			return nil, fail(2, 2, series.ErrDate, fmt.Sprintf("want a date >= start %v, got %q", e.Start, rec[2]))
		}
		if ncol == 4 {
			e.Station = strings.TrimSpace(rec[3])
			if strings.ContainsFunc(e.Station, unicode.IsControl) {
				return nil, fail(3, 3, series.ErrField, fmt.Sprintf("want a station ID without control characters, got %q", rec[3]))
			}
		}
		out = append(out, e)
	}
}

// csvError places an error of encoding/csv.
func csvError(name string, err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return &series.ParseError{File: name, Line: pe.Line, Column: pe.Column, Msg: pe.Err.Error(), Err: series.ErrQuote}
	}
	return err
}

func validKind(k string) bool {
	if k == "" {
		return false
	}
	for _, c := range []byte(k) {
		if !('a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || '0' <= c && c <= '9' || c == '_' || c == '-') {
			return false
		}
	}
	return true
}

// WriteUserEvents writes evs in the form ReadUserEvents reads, with the
// station column.
func WriteUserEvents(w io.Writer, evs []UserEvent) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(userHeader); err != nil {
		return err
	}
	for _, e := range evs {
		if err := cw.Write([]string{e.Kind, e.Start.String(), e.End.String(), e.Station}); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
