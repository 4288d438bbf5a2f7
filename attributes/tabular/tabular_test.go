package tabular

import (
	"errors"
	"io"
	"math"
	"strings"
	"testing"
)

func TestParseErrorFormat(t *testing.T) {
	tests := []struct {
		e    ParseError
		want string
	}{
		{ParseError{File: "events.csv", Line: 14, Col: 7, Column: "recovery_days", Err: errors.New(`want days >= 0, got "-3"`)},
			`events.csv:14:7: recovery_days: want days >= 0, got "-3"`},
		{ParseError{File: "s.xlsx", Sheet: "Sheet1", Line: 14, Col: 3, Column: "latitude", Err: errors.New("bad")},
			`s.xlsx:Sheet1!C14: latitude: bad`},
		{ParseError{File: "e.csv", Err: ErrEmpty}, `e.csv: ` + ErrEmpty.Error()},
	}
	for _, tc := range tests {
		if got := tc.e.Error(); got != tc.want {
			t.Errorf("got %q, want %q", got, tc.want)
		}
	}
}

func TestColumnLetters(t *testing.T) {
	// Spreadsheet column naming, common practice.
	for c, want := range map[int]string{1: "A", 26: "Z", 27: "AA", 52: "AZ", 53: "BA", 702: "ZZ", 703: "AAA"} {
		if got := ColumnLetters(c); got != want {
			t.Errorf("ColumnLetters(%d) = %s, want %s", c, got, want)
		}
	}
}

func TestFloat(t *testing.T) {
	tests := []struct {
		in   string
		v    float64
		ok   bool
		fail bool
	}{
		{"1.5", 1.5, true, false}, {" -3e2 ", -300, true, false}, {"", math.NaN(), false, false},
		{"  ", math.NaN(), false, false}, {"NaN", 0, false, true}, {"inf", 0, false, true}, {"1,5", 0, false, true},
	}
	for _, tc := range tests {
		v, ok, err := Float(tc.in)
		if (err != nil) != tc.fail || ok != tc.ok || (ok && v != tc.v) {
			t.Errorf("Float(%q) = %v, %v, %v", tc.in, v, ok, err)
		}
	}
}

func TestStripBOM(t *testing.T) {
	for _, in := range []string{"\uFEFFa,b\n", "a,b\n", "a", ""} {
		b, _ := io.ReadAll(StripBOM(strings.NewReader(in)))
		if want := strings.TrimPrefix(in, "\uFEFF"); string(b) != want {
			t.Errorf("StripBOM(%q) = %q", in, b)
		}
	}
}

func TestListLimit(t *testing.T) {
	l := List{Max: 2}
	for range 5 {
		l.Add(errors.New("x"))
	}
	l.Add(nil)
	if l.Len() != 5 || len(l.Errors()) != 3 || !strings.Contains(l.Errors()[2].Error(), "3 more") {
		t.Fatalf("got %d, %v", l.Len(), l.Errors())
	}
}

func TestHeader(t *testing.T) {
	h, err := NewHeader([]string{"station", " name ", "latitude"})
	if err != nil {
		t.Fatal(err)
	}
	if h.Index("name") != 1 || h.Index("x") != -1 {
		t.Fatal("index")
	}
	if _, err := h.Require("station", "longitude", "group"); !errors.Is(err, ErrMissing) || !strings.Contains(err.Error(), `"longitude", "group"`) {
		t.Fatalf("Require: %v", err)
	}
	if _, err := NewHeader([]string{"a", "b", "a"}); !errors.Is(err, ErrDuplicate) {
		t.Fatalf("duplicate: %v", err)
	}
}
