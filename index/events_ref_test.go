package index

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"slices"
	"strings"
	"testing"
	"testing/iotest"

	"rebound/attributes/tabular"
	"rebound/index/calendar"
)

// readEventsCSV is ReadEvents as it was written on encoding/csv alone,
// kept as the reference that the faster reader must agree with on every
// input: the same events and the same errors at the same positions.
func readEventsCSV(r io.Reader, name string) (*EventTable, []error) {
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
	in := refInterner{}
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
		e.Start, startOK = refDate(field(4), func(err error) { bad(4, err) })
		e.End, endOK = refDate(field(5), func(err error) { bad(5, err) })
		if startOK && endOK && e.End < e.Start {
			bad(5, fmt.Errorf("end %s is before start %s", e.End, e.Start))
		}
		e.PeakDeparture = refNumber(field(6), false, func(err error) { bad(6, err) })
		e.RecoveryDays = refNumber(field(7), true, func(err error) { bad(7, err) })
		if e.RecoveryDays < 0 {
			bad(7, fmt.Errorf("want days >= 0, got %q", field(7)))
		}
		if e.Recovered, err = tabular.Bool(field(8)); err != nil {
			bad(8, err)
		}
		e.Dryness = refNumber(field(9), false, func(err error) { bad(9, err) })
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

func refDate(s string, fail func(error)) (calendar.Date, bool) {
	d, err := calendar.Parse(s)
	if err != nil {
		fail(fmt.Errorf("%w, got %q", err, s))
		return 0, false
	}
	return d, true
}

func refNumber(s string, required bool, fail func(error)) float64 {
	v, ok, err := tabular.Float(s)
	switch {
	case err != nil:
		fail(err)
	case !ok && required:
		fail(errors.New("want a number, got a blank cell"))
	}
	return v
}

type refInterner map[string]string

func (in refInterner) get(s string) string {
	if v, ok := in[s]; ok {
		return v
	}
	s = strings.Clone(s)
	in[s] = s
	return s
}

// sameCases are inputs on which ReadEvents and readEventsCSV must agree:
// quoting of every kind, line ends, blank lines, a long line, numbers,
// booleans and dates at the edges of the fast paths.
func sameCases() map[string]string {
	row := "S1,HW-1,heatwave,water_temperature,2021-07-01,2021-07-09,3.2,12,true,0.4"
	long := strings.Repeat("x", 70_000)
	var big strings.Builder
	big.WriteString(eventsHeader[:len(eventsHeader)-1] + ",note\n")
	for i := range 3000 {
		switch i % 7 {
		case 0:
			fmt.Fprintf(&big, "\"S%d\",\"HW-%d\",\"heatwave\",\"water_temperature\",\"2021-07-01\",\"2021-07-09\",%d.25,%d,TRUE,,\"a\r\nb\"\r\n", i%13, i, i, i%40)
		case 1:
			fmt.Fprintf(&big, "S%d,HW-%d,heatwave,dissolved_oxygen,2021-07-01,2021-07-0%d,-%d.5,%d,false,0.%d,\"say \"\"hi\"\"\"\n", i%13, i, 1+i%9, i, i%40, i)
		case 2:
			big.WriteString("\n  \n\r\n")
		default:
			fmt.Fprintf(&big, "S%d,DR-%d,drought,discharge,2020-08-01,2020-09-30,%de-1,%d,1,1,n%d\n", i%13, i, i, i%40, i)
		}
	}
	return map[string]string{
		"plain":            eventsHeader + row + "\n",
		"no final newline": eventsHeader + row,
		"crlf and bom":     "\uFEFF" + strings.ReplaceAll(eventsHeader+row+"\n"+row+"\n", "\n", "\r\n"),
		"cr at end":        eventsHeader + row + "\r",
		"cr inside":        eventsHeader + "S1\r,HW-1,heatwave,wt,2021-07-01,2021-07-09,3.2,12,true,0.4\r\r\n",
		"blank lines":      "\n\r\n" + eventsHeader + "\n   \n" + row + "\n\n\t\n" + row + "\n\r",
		"quoted header":    `"station","event","kind","variable","start","end","peak_departure","recovery_days","recovered","antecedent_dryness"` + "\n" + row + "\n",
		"quoted all":       eventsHeader + `"S1","HW-1","heatwave","water_temperature","2021-07-01","2021-07-09","3.2","12","true",""` + "\n",
		"quoted blank":     eventsHeader + `"",HW-1,heatwave,wt,2021-07-01,2021-07-09,"",12,true,""` + "\n",
		"doubled quote":    eventsHeader + `"S""1",HW-1,heatwave,wt,2021-07-01,2021-07-09,3.2,12,true,` + "\n" + row + ",x\n",
		"multiline field":  eventsHeader + `S1,"HW` + "\n\n" + `1",heatwave,wt,2021-07-01,2021-07-09,3.2,12,maybe,` + "\n" + "S2,E,k,v,2021-07-02,2021-07-01,x,-1,true,\n",
		"bare quote":       eventsHeader + row + "\n" + `S1,H"W,heatwave,wt,2021-07-01,2021-07-09,3.2,12,true,` + "\n",
		"quote then text":  eventsHeader + row + "\n" + `S1,"HW"x,heatwave,wt,2021-07-01,2021-07-09,3.2,12,true,` + "\n",
		"open quote":       eventsHeader + row + "\nS2,x,y\n" + `S1,"HW,heatwave,wt` + "\n" + row + "\n",
		"quote at end":     eventsHeader + row + `,"` + "\n" + row + "\n",
		"bad header quote": `station,"event` + "\n",
		"long line":        eventsHeader[:len(eventsHeader)-1] + ",note\n" + row + "," + long + "\n" + row + "\n" + "S1,E,k,v,x,2021-07-01,1,1,1,1," + long + "\n" + "S1,E,k,v,2021-07-01,x,1,1,1,1,\"" + long + "\"\n" + row + ",\"" + long + "\n",
		"many chunks":      big.String() + "S1,E,k,v,bad,2021-07-01,1,1,1,1,\n",
		"numbers": eventsHeader + strings.Join([]string{
			"S,E,k,v,2021-07-01,2021-07-01,+1.5,1.,true,.5",
			"S,E,k,v,2021-07-01,2021-07-01,1e3,0x1p-2,true,1_0",
			"S,E,k,v,2021-07-01,2021-07-01,-0,-0.0,true,00012.5000",
			"S,E,k,v,2021-07-01,2021-07-01,9007199254740993,9007199254740992,true,18446744073709551616",
			"S,E,k,v,2021-07-01,2021-07-01,0.1234567890123456789012,0.12345678901234567890123,true,1234567890123456789",
			"S,E,k,v,2021-07-01,2021-07-01, 12 ,\u00a012\u00a0,true,\u0661",
			"S,E,k,v,2021-07-01,2021-07-01,Infinity,nan,true,-",
			"S,E,k,v,2021-07-01,2021-07-01,.,-.5,true,1..2",
			"S,E,k,v,2021-07-01,2021-07-01,123456789012345678901234,0.000000000000000000000000001,true,1e400",
		}, "\n") + "\n",
		"booleans": eventsHeader + strings.Join([]string{
			"S,E,k,v,2021-07-01,2021-07-01,1,1,True,", "S,E,k,v,2021-07-01,2021-07-01,1,1,tRuE,",
			"S,E,k,v,2021-07-01,2021-07-01,1,1,FALSE,", "S,E,k,v,2021-07-01,2021-07-01,1,1, 0 ,",
			"S,E,k,v,2021-07-01,2021-07-01,1,1,fal\u017fe,", "S,E,k,v,2021-07-01,2021-07-01,1,1,\uff54rue,",
			"S,E,k,v,2021-07-01,2021-07-01,1,1,yes,", "S,E,k,v,2021-07-01,2021-07-01,1,1,,",
			"S,E,k,v,2021-07-01,2021-07-01,1,1,tru\u00e9,", "S,E,k,v,2021-07-01,2021-07-01,1,1,2,",
		}, "\n") + "\n",
		"dates": eventsHeader + strings.Join([]string{
			"S,E,k,v, 2021-07-01 ,2021-7-1,1,1,1,", "S,E,k,v,2021-02-29,2020-02-29,1,1,1,",
			"S,E,k,v,\uff12021-07-01,2021-07-01T00:00,1,1,1,", "S,E,k,v,,0000-01-01,1,1,1,",
		}, "\n") + "\n",
		"field counts":  eventsHeader + "S,E\n" + row + ",extra\n,\n" + row + "\n",
		"only header":   "\n\n" + eventsHeader + "\n\n",
		"only blanks":   "\n\r\n\n",
		"empty":         "",
		"bom only":      "\uFEFF",
		"duplicate col": "station,station\n",
		"interning":     eventsHeader + row + "\n" + strings.Replace(row, "S1", "S2", 1) + "\n" + row + "\n",
	}
}

// sameRead reports how ReadEvents and readEventsCSV differ on text read
// through wrap, "" when they agree.
func sameRead(text string, wrap func(io.Reader) io.Reader) string {
	got, gotErrs := ReadEvents(wrap(strings.NewReader(text)), "f.csv")
	want, wantErrs := readEventsCSV(wrap(strings.NewReader(text)), "f.csv")
	if g, w := errorText(gotErrs), errorText(wantErrs); g != w {
		return fmt.Sprintf("errors:\n%s\nwant:\n%s", g, w)
	}
	if (got == nil) != (want == nil) {
		return fmt.Sprintf("table %v, want %v", got, want)
	}
	if got == nil {
		return ""
	}
	if got.File != want.File || !slices.Equal(got.Extra, want.Extra) || len(got.Events) != len(want.Events) {
		return fmt.Sprintf("table %s %q %d rows, want %s %q %d rows", got.File, got.Extra, len(got.Events), want.File, want.Extra, len(want.Events))
	}
	for i, g := range got.Events {
		w := want.Events[i]
		same := func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
		if g.Station != w.Station || g.ID != w.ID || g.Kind != w.Kind || g.Variable != w.Variable || g.Start != w.Start || g.End != w.End ||
			!same(g.PeakDeparture, w.PeakDeparture) || !same(g.RecoveryDays, w.RecoveryDays) || g.Recovered != w.Recovered ||
			!same(g.Dryness, w.Dryness) || g.Line != w.Line {
			return fmt.Sprintf("row %d: %+v, want %+v", i, g, w)
		}
	}
	return ""
}

func errorText(errs []error) string {
	var b strings.Builder
	for _, e := range errs {
		b.WriteString(e.Error())
		b.WriteByte('\n')
	}
	return b.String()
}

// TestReadEventsSame checks the reader against encoding/csv on inputs that
// reach every path, whole and in one-byte and half reads.
func TestReadEventsSame(t *testing.T) {
	wraps := map[string]func(io.Reader) io.Reader{
		"whole":    func(r io.Reader) io.Reader { return r },
		"one byte": iotest.OneByteReader,
		"half":     iotest.HalfReader,
		"then error": func(r io.Reader) io.Reader {
			return io.MultiReader(r, iotest.ErrReader(errors.New("device gone")))
		},
	}
	for name, text := range sameCases() {
		for wn, wrap := range wraps {
			if wn == "one byte" && len(text) > 10_000 {
				continue
			}
			t.Run(name+"/"+wn, func(t *testing.T) {
				if d := sameRead(text, wrap); d != "" {
					t.Error(d)
				}
			})
		}
	}
}

// FuzzReadEventsSame: ReadEvents and encoding/csv agree on any input.
func FuzzReadEventsSame(f *testing.F) {
	for _, text := range sameCases() {
		if len(text) < 4096 {
			f.Add(text)
		}
	}
	f.Fuzz(func(t *testing.T, text string) {
		if d := sameRead(text, func(r io.Reader) io.Reader { return r }); d != "" {
			t.Fatal(d)
		}
	})
}
