package events

import (
	"bytes"
	"errors"
	"slices"
	"strings"
	"testing"

	"rebound/index/series"
)

func TestReadUserEvents(t *testing.T) {
	for _, tc := range []struct {
		name string
		in   string
		want []UserEvent
		err  string
	}{
		{
			name: "with station",
			in:   "kind,start,end,station\nspill,2019-07-03,2019-07-05,R1\n# a comment\nworks, 2020-01-01 ,2020-01-01,\n",
			want: []UserEvent{
				{Kind: "spill", Start: date("2019-07-03"), End: date("2019-07-05"), Station: "R1"},
				{Kind: "works", Start: date("2020-01-01"), End: date("2020-01-01")},
			},
		},
		{
			name: "without station",
			in:   "Kind,Start,End\r\nspill,2019-07-03,2019-07-05\r\n",
			want: []UserEvent{{Kind: "spill", Start: date("2019-07-03"), End: date("2019-07-05")}},
		},
		{
			// A spreadsheet's "CSV UTF-8" begins with a byte-order mark.
			name: "byte-order mark",
			in:   "\uFEFFkind,start,end\r\nspill,2019-07-03,2019-07-05\r\n",
			want: []UserEvent{{Kind: "spill", Start: date("2019-07-03"), End: date("2019-07-05")}},
		},
		{name: "header only", in: "kind,start,end\n"},
		{name: "empty", in: "", err: `ev.csv:1:1: want a header kind,start,end[,station], got an empty file`},
		{name: "bad header", in: "kind,begin,end\n", err: `ev.csv:1:6: header column 2: want "start", got "begin"`},
		{name: "short header", in: "kind,start\n", err: `ev.csv:1:1: want a header kind,start,end[,station], got "kind,start"`},
		{name: "bad date", in: "kind,start,end\nspill,2019-7-3,2019-07-05\n",
			err: `ev.csv:2:7: start: want an ISO 8601 date YYYY-MM-DD, got "2019-7-3"`},
		{name: "no such day", in: "kind,start,end\nspill,2019-07-03,2023-02-29\n",
			err: `ev.csv:2:18: end: no such calendar day, got "2023-02-29"`},
		{name: "end before start", in: "kind,start,end\nspill,2019-07-03,2019-07-01\n",
			err: `ev.csv:2:18: end: want a date >= start 2019-07-03, got "2019-07-01"`},
		{name: "bad kind", in: "kind,start,end\nheat wave,2019-07-03,2019-07-05\n",
			err: `ev.csv:2:1: kind: want a kind of letters, digits, '_' or '-', got "heat wave"`},
		{name: "field count", in: "kind,start,end\nspill,2019-07-03\n",
			err: `ev.csv:2:1: want 3 fields as in the header, got 2`},
		{name: "bare quote", in: "kind,start,end\nsp\"ill,2019-07-03,2019-07-05\n",
			err: `ev.csv:2:3: bare " in non-quoted-field`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got, err := ReadUserEvents(strings.NewReader(tc.in), "ev.csv")
			if tc.err != "" {
				if err == nil || err.Error() != tc.err {
					t.Fatalf("error %v, want %s", err, tc.err)
				}
				var pe *series.ParseError
				if !errors.As(err, &pe) {
					t.Errorf("error %T, want *series.ParseError", err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if !slices.Equal(got, tc.want) {
				t.Errorf("got %+v, want %+v", got, tc.want)
			}
		})
	}
	_, err := ReadUserEvents(strings.NewReader("kind,start,end\ns,2019-7-3,2019-07-05\n"), "ev.csv")
	if !errors.Is(err, series.ErrDate) {
		t.Errorf("error %v is not a series.ErrDate", err)
	}
}

// FuzzReadUserEvents checks that no input makes the reader panic, that
// every error is placed in the file, and that what it reads survives a
// write and a second read unchanged.
func FuzzReadUserEvents(f *testing.F) {
	for _, s := range []string{
		"kind,start,end,station\nspill,2019-07-03,2019-07-05,R1\nworks,2020-01-01,2020-01-01,\n",
		"kind,start,end\nheatwave,2019-07-03,2019-07-05\n",
		"kind,start,end,station\nx,2019-07-03,2019-07-05,\"a,b\"\n",
		"kind,start,end\n# c\nx,0001-01-01,9999-12-31\n",
		"",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, in string) {
		evs, err := ReadUserEvents(strings.NewReader(in), "f.csv")
		if err != nil {
			if !strings.HasPrefix(err.Error(), "f.csv:") {
				t.Fatalf("error not placed: %v", err)
			}
			return
		}
		var buf bytes.Buffer
		if err := WriteUserEvents(&buf, evs); err != nil {
			t.Fatal(err)
		}
		again, err := ReadUserEvents(&buf, "g.csv")
		if err != nil {
			t.Fatalf("reading what was written: %v\n%s", err, buf.String())
		}
		if !slices.Equal(evs, again) {
			t.Fatalf("round trip: %+v, then %+v", evs, again)
		}
	})
}
