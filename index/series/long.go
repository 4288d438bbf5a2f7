package series

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"runtime"
	"slices"
	"strings"
	"sync"

	"rebound/index/calendar"
)

// Summary says what a reader did with a file.
type Summary struct {
	Rows     int // data rows read; the header and empty lines are not rows
	BadRows  int // rows skipped because of a problem (with Options.MaxErrors != 0)
	Stations int // stations delivered
	// Vars adds up the delivered stations' Counts per variable. For Map
	// the counts are taken after f has run, so days that f filled with
	// Station.FillGaps are included.
	Vars map[string]*Counts
	// Skipped counts the rows of variables not in Options.Vars, by name.
	Skipped map[string]int
}

func (s *Summary) addStation(st *Station) {
	s.Stations++
	if s.Vars == nil {
		s.Vars = map[string]*Counts{}
	}
	for name, c := range st.Counts {
		t := s.Vars[name]
		if t == nil {
			t = &Counts{}
			s.Vars[name] = t
		}
		t.Add(c)
	}
}

func (s *Summary) addSkipped(m map[string]int) {
	for k, v := range m {
		if s.Skipped == nil {
			s.Skipped = map[string]int{}
		}
		s.Skipped[k] += v
	}
}

// Add adds the counts of c to t.
func (t *Counts) Add(c *Counts) {
	t.Rows += c.Rows
	t.Kept += c.Kept
	t.Blank += c.Blank
	t.Excluded += c.Excluded
	t.Filled += c.Filled
	t.Converted += c.Converted
	t.OutOfRange += c.OutOfRange
}

// Long-layout column names.
const (
	colStation   = "station"
	colDate      = "date"
	colVariable  = "variable"
	colValue     = "value"
	colQualifier = "qualifier"
)

// layout is where the columns of a long file are.
type layout struct {
	n                                         int // fields per record
	station, date, variable, value, qualifier int // indices; qualifier -1 if absent
	names                                     []string
}

func (l *layout) name(i int) string {
	if i >= 0 && i < len(l.names) {
		return l.names[i]
	}
	return ""
}

// varSpec is an Options variable ready for matching rows.
type varSpec struct {
	name   string
	src    []byte
	unit   Unit
	rng    Range
	checks bool // rng is not the zero Range
}

// reader holds what the workers share: the layout and the options.
type reader struct {
	name    string
	lay     layout
	vars    []varSpec
	exclude [][]byte
	maxErrs int // problems a block collects before it stops: 0 means no limit
}

func newReader(name string, opt Options) *reader {
	rd := &reader{name: name}
	for _, v := range opt.Vars {
		rd.vars = append(rd.vars, varSpec{
			name: v.Name, src: []byte(v.source()), unit: LookupUnit(v.Units),
			rng: v.Range, checks: !v.Range.IsZero(),
		})
	}
	for _, e := range opt.Exclude {
		rd.exclude = append(rd.exclude, []byte(e))
	}
	switch {
	case opt.MaxErrors == 0:
		rd.maxErrs = 1
	case opt.MaxErrors > 0:
		rd.maxErrs = opt.MaxErrors + 1
	}
	return rd
}

func (rd *reader) errorf(line, col int, column string, kind error, msg string) *ParseError {
	return &ParseError{File: rd.name, Line: line, Column: col, ColumnName: column, Msg: msg, Err: kind}
}

// parseHeader sets the layout from the header record.
func (rd *reader) parseHeader(rec []byte, ignore []string) error {
	if i := bytes.IndexByte(rec, '\r'); i >= 0 {
		return rd.errorf(1, i+1, "", ErrHeader, "want LF or CRLF line ends, got a lone CR")
	}
	var fs fields
	if q := fs.split(rec); q != nil {
		return rd.errorf(1, q.off+1, "", ErrQuote, q.msg)
	}
	l := layout{n: len(fs.f), station: -1, date: -1, variable: -1, value: -1, qualifier: -1}
	seen := map[string]int{}
	for i, f := range fs.f {
		name := string(f)
		l.names = append(l.names, name)
		if j, ok := seen[name]; ok {
			return rd.errorf(1, fs.off[i]+1, "", ErrHeader,
				fmt.Sprintf("want each column once, got %s again (first in column %d)", quoteField(f), j+1))
		}
		seen[name] = i
		switch name {
		case colStation:
			l.station = i
		case colDate:
			l.date = i
		case colVariable:
			l.variable = i
		case colValue:
			l.value = i
		case colQualifier:
			l.qualifier = i
		default:
			if !slices.Contains(ignore, name) {
				return rd.errorf(1, fs.off[i]+1, "", ErrHeader,
					"want station, date, variable, value, qualifier or a column listed to ignore, got "+quoteField(f))
			}
		}
	}
	var missing []string
	for _, c := range []struct {
		name string
		i    int
	}{{colStation, l.station}, {colDate, l.date}, {colVariable, l.variable}, {colValue, l.value}} {
		if c.i < 0 {
			missing = append(missing, c.name)
		}
	}
	if len(missing) > 0 {
		return rd.errorf(1, 1, "", ErrHeader, fmt.Sprintf("want columns station, date, variable and value, got %s without %s",
			quoteField(rec), strings.Join(missing, ", ")))
	}
	rd.lay = l
	return nil
}

// block is the records of one station, or a problem found while splitting.
type block struct {
	seq  int
	data []byte // complete records of one station
	buf  []byte // the buffer data lives in, for reuse
	line int    // line of the first record
	id   string
	prob *ParseError // a problem with the block as a whole
	err  error       // a read error: nothing after it can be read
	eof  bool        // the end of the input: no data
}

// splitter cuts the input into station blocks.
type splitter struct {
	rd     *reader
	r      io.Reader
	buf    []byte
	n      int // valid bytes in buf
	pos    int // start of the next record
	bstart int // start of the current block
	line   int // line of the record at pos
	bline  int // line of the block's first record
	eof    bool
	rerr   error
	fs     fields
	id     string // station of the current block
	cur    []byte // raw station field of the current block's last record
	seen   map[string]int
	prev   string
	// plainEnd is the offset of the first double quote in buf at or after
	// pos, or n when there is none: lines before it need no quote handling.
	plainEnd int
	pool     chan []byte
	done     bool
}

const (
	readChunk = 256 << 10
	firstBuf  = 1 << 20
)

// fill reads more input, making room when the buffer is full.
func (s *splitter) fill() {
	if len(s.buf)-s.n < readChunk/4 {
		if s.bstart >= len(s.buf)/2 {
			copy(s.buf, s.buf[s.bstart:s.n])
		} else {
			nb := make([]byte, 2*len(s.buf))
			copy(nb, s.buf[s.bstart:s.n])
			s.buf = nb
		}
		s.n -= s.bstart
		s.pos -= s.bstart
		s.bstart = 0
	}
	s.plainEnd = 0
	for {
		k, err := s.r.Read(s.buf[s.n:min(len(s.buf), s.n+readChunk)])
		s.n += k
		if err == io.EOF {
			s.eof = true
		} else if err != nil {
			s.eof, s.rerr = true, err
		}
		if k > 0 || s.eof {
			return
		}
	}
}

// record returns the next record (line end and trailing '\r' removed) and
// advances past it. ok is false at the end of the input or on an error,
// which is then in s.rerr or returned as a problem.
// at is the record's offset in s.buf, valid until the next call.
func (s *splitter) record() (rec []byte, at, breaks int, prob *ParseError, ok bool) {
	for {
		var n, adv, br int
		more := false
		if s.pos >= s.plainEnd {
			s.plainEnd = s.n
			if q := bytes.IndexByte(s.buf[s.pos:s.n], '"'); q >= 0 {
				s.plainEnd = s.pos + q
			}
		}
		if i := bytes.IndexByte(s.buf[s.pos:s.plainEnd], '\n'); i >= 0 {
			n, adv = i, i+1 // a line without quotes
		} else {
			n, adv, br, more = scanRecord(s.buf[s.pos:s.n], s.eof)
		}
		if more {
			if s.n-s.pos >= maxRecord {
				return nil, s.pos, 0, s.rd.errorf(s.line, 1, "", ErrTooLong,
					fmt.Sprintf("want a record of at most %d bytes (is a quote unterminated?), got more", maxRecord)), false
			}
			s.fill()
			continue
		}
		if adv == 0 {
			return nil, s.pos, 0, nil, false
		}
		rec = s.buf[s.pos : s.pos+n]
		if len(rec) > 0 && rec[len(rec)-1] == '\r' {
			rec = rec[:len(rec)-1]
		}
		at = s.pos
		s.pos += adv
		return rec, at, br, nil, true
	}
}

// header reads the header record, after an optional byte-order mark.
func (s *splitter) header(ignore []string) error {
	for s.n < 3 && !s.eof {
		s.fill()
	}
	if bytes.HasPrefix(s.buf[:s.n], []byte("\xef\xbb\xbf")) {
		s.pos, s.bstart = 3, 3
	}
	rec, _, br, prob, ok := s.record()
	if prob != nil {
		if i := bytes.IndexByte(s.buf[s.pos:s.n], '\r'); i >= 0 {
			return s.rd.errorf(1, i+1, "", ErrHeader, "want LF or CRLF line ends, got a lone CR")
		}
		return prob
	}
	if !ok {
		if s.rerr != nil {
			return s.rerr
		}
		return s.rd.errorf(1, 1, "", ErrHeader, "want a header line station,date,variable,value, got an empty file")
	}
	s.line = 2 + br
	s.bstart = s.pos
	return s.rd.parseHeader(rec, ignore)
}

// stationOf returns the station field of rec, or ok false when it cannot be
// found (the worker reports the problem).
func (s *splitter) stationOf(rec []byte) (id []byte, ok bool) {
	if s.rd.lay.station == 0 && (len(rec) == 0 || rec[0] != '"') {
		if i := bytes.IndexByte(rec, ','); i >= 0 {
			return rec[:i], true
		}
		return rec, true
	}
	if s.fs.split(rec) != nil || len(s.fs.f) <= s.rd.lay.station {
		return nil, false
	}
	return s.fs.f[s.rd.lay.station], true
}

// next returns the next block; the last one has eof or err set.
func (s *splitter) next() *block {
	if s.done {
		return &block{eof: true}
	}
	for {
		s.skipSame()
		line := s.line
		rec, at, br, prob, ok := s.record()
		if prob != nil || !ok {
			if s.bstart < at {
				return s.cut(at) // deliver the block first
			}
			s.done = true
			if prob != nil {
				return &block{line: line, err: prob}
			}
			if s.rerr != nil {
				return &block{line: line, err: fmt.Errorf("%s: line %d: %w", s.rd.name, line, s.rerr)}
			}
			return &block{eof: true}
		}
		s.line += 1 + br
		if len(rec) == 0 {
			if s.bstart == at {
				s.bstart = s.pos // an empty line before a block's first record
			}
			continue
		}
		raw, found := s.stationOf(rec)
		if !found {
			if s.bstart == at {
				s.id, s.cur, s.bline = "", s.cur[:0], line
			}
			continue
		}
		if s.bstart == at { // first record of a block
			s.cur = append(s.cur[:0], raw...)
			s.id, s.bline = string(raw), line
			continue
		}
		if bytes.Equal(raw, s.cur) {
			continue
		}
		if string(raw) == s.id { // same station, quoted differently
			s.cur = append(s.cur[:0], raw...)
			continue
		}
		s.pos, s.line = at, line
		return s.cut(at)
	}
}

// skipSame moves past the buffered lines that start with the current
// block's station field, when that field is first, unquoted, and the lines
// hold no quote: the common case, in a tight loop.
func (s *splitter) skipSame() {
	cur := s.cur
	if s.bstart == s.pos || s.rd.lay.station != 0 || len(cur) == 0 || cur[0] == '"' {
		return
	}
	if s.pos >= s.plainEnd {
		return // record sets plainEnd
	}
	buf := s.buf[:s.plainEnd]
	pos, line, k := s.pos, s.line, len(cur)
	for {
		rest := buf[pos:]
		if len(rest) <= k || rest[k] != ',' || !bytes.Equal(rest[:k], cur) {
			break
		}
		i := bytes.IndexByte(rest[k+1:], '\n')
		if i < 0 {
			break
		}
		pos += k + 2 + i
		line++
	}
	s.pos, s.line = pos, line
}

// cut ends the current block at offset p and moves the rest of the buffer
// to a fresh one.
func (s *splitter) cut(p int) *block {
	b := &block{data: s.buf[s.bstart:p], buf: s.buf, line: s.bline, id: s.id}
	if s.id != "" {
		if first, ok := s.seen[s.id]; ok {
			b.prob = s.rd.errorf(s.bline, s.fieldCol(b.data), colStation, ErrUnsorted,
				fmt.Sprintf("want the rows of each station together (sort the file by station), got %s again after %s (first on line %d)",
					quoteField([]byte(s.id)), quoteField([]byte(s.prev)), first))
		} else {
			s.seen[s.id] = s.bline
		}
		s.prev = s.id
	}
	var nb []byte
	select {
	case nb = <-s.pool:
		nb = nb[:cap(nb)]
	default:
	}
	if len(nb) < len(s.buf) {
		nb = make([]byte, len(s.buf))
	}
	copy(nb, s.buf[p:s.n])
	s.buf = nb
	s.n -= p
	s.pos -= p
	s.bstart = 0
	s.plainEnd = 0
	return b
}

// fieldCol returns the column of the station field in a block's first record.
func (s *splitter) fieldCol(data []byte) int {
	n, _, _, _ := scanRecord(data, true)
	var fs fields
	if fs.split(data[:n]) == nil && s.rd.lay.station < len(fs.off) {
		return fs.off[s.rd.lay.station] + 1
	}
	return 1
}

// row is one parsed row of a kept variable.
type row struct {
	val  float64
	day  calendar.Date
	line int32 // line, relative to the block's first
	col  int32 // column of the date field
	v    uint8
	kind uint8
}

const (
	kindKept = iota
	kindBlank
	kindExcluded
	kindOutOfRange
)

// worker parses blocks into stations.
type worker struct {
	rd      *reader
	fs      fields
	rows    []row
	slot    []int32
	probs   []*ParseError
	skipped map[string]int
	nrows   int
	bad     int
	// lastDate is the date field of the last row and lastDay its Date:
	// rows of several variables share a date.
	lastDate []byte
	lastDay  calendar.Date
}

func (w *worker) problem(p *ParseError) {
	w.probs = append(w.probs, p)
	w.bad++
}

func (w *worker) full() bool { return w.rd.maxErrs > 0 && len(w.probs) >= w.rd.maxErrs }

// parse parses the records of a block into a Station.
func (w *worker) parse(b *block) *Station {
	w.rows, w.probs, w.skipped, w.nrows, w.bad = w.rows[:0], w.probs[:0], nil, 0, 0
	data, pos, line := b.data, 0, b.line
	plainBlock := bytes.IndexByte(data, '"') < 0
	for pos < len(data) && !w.full() {
		rest := data[pos:]
		n, adv, br := len(rest), len(rest), 0
		if i := bytes.IndexByte(rest, '\n'); i >= 0 {
			n, adv = i, i+1
		}
		plain := plainBlock || bytes.IndexByte(rest[:n], '"') < 0
		if !plain {
			n, adv, br, _ = scanRecord(rest, true)
		}
		rec := rest[:n]
		if len(rec) > 0 && rec[len(rec)-1] == '\r' {
			rec = rec[:len(rec)-1]
		}
		if len(rec) > 0 {
			w.nrows++
			w.record(b, rec, plain, br > 0, line)
		}
		pos += adv
		line += 1 + br
	}
	if b.id == "" {
		return nil
	}
	return w.assemble(b)
}

// record parses one record into w.rows or a problem.
func (w *worker) record(b *block, rec []byte, plain, multiline bool, line int) {
	rd, lay := w.rd, &w.rd.lay
	if plain {
		w.fs.splitPlain(rec)
	} else if q := w.fs.split(rec); q != nil {
		l, c := lineCol(rec, line, q.off)
		w.problem(rd.errorf(l, c, lay.name(q.field), ErrQuote, q.msg))
		return
	}
	f := w.fs.f
	if len(f) != lay.n {
		col := len(rec) + 1
		if len(f) > lay.n {
			col = w.fs.off[lay.n] + 1
		}
		l, c := lineCol(rec, line, col-1)
		w.problem(rd.errorf(l, c, "", ErrFieldCount, fmt.Sprintf("want %d fields, got %d", lay.n, len(f))))
		return
	}
	pos := func(i int) (int, int) { return lineCol(rec, line, w.fs.off[i]) }
	if len(f[lay.station]) == 0 {
		l, c := pos(lay.station)
		w.problem(rd.errorf(l, c, colStation, ErrField, `want a station ID, got ""`))
		return
	}
	vname := f[lay.variable]
	v := -1
	for i := range rd.vars {
		if bytes.Equal(rd.vars[i].src, vname) {
			v = i
			break
		}
	}
	if v < 0 {
		if len(vname) == 0 {
			l, c := pos(lay.variable)
			w.problem(rd.errorf(l, c, colVariable, ErrField, `want a variable name, got ""`))
			return
		}
		if w.skipped == nil {
			w.skipped = map[string]int{}
		}
		w.skipped[string(vname)]++
		return
	}
	day, want := w.lastDay, ""
	if !bytes.Equal(f[lay.date], w.lastDate) {
		day, want = parseDay(f[lay.date])
		if want == "" {
			w.lastDate, w.lastDay = append(w.lastDate[:0], f[lay.date]...), day
		}
	}
	if want != "" {
		l, c := pos(lay.date)
		w.problem(rd.errorf(l, c, colDate, ErrDate, wantGot(want, f[lay.date])))
		return
	}
	dcol := w.fs.off[lay.date] + 1
	if multiline {
		_, dcol = pos(lay.date)
	}
	r := row{day: day, line: int32(line - b.line), col: int32(dcol), v: uint8(v), val: math.NaN()}
	spec := &rd.vars[v]
	val := f[lay.value]
	if isMissing(val) {
		r.kind = kindBlank
	} else {
		x, ok := parseFloat(val)
		if !ok {
			l, c := pos(lay.value)
			w.problem(rd.errorf(l, c, colValue, ErrValue, wantGot("a finite decimal number, or empty, NA or NaN if missing", val)))
			return
		}
		x = spec.unit.Convert(x)
		switch {
		case lay.qualifier >= 0 && w.excluded(f[lay.qualifier]):
			r.kind = kindExcluded
		case spec.checks && !spec.rng.Contains(x):
			r.kind = kindOutOfRange
		default:
			r.kind, r.val = kindKept, x
		}
	}
	w.rows = append(w.rows, r)
}

// excluded reports whether a qualifier field holds a code to exclude.
func (w *worker) excluded(q []byte) bool {
	if len(q) == 0 || len(w.rd.exclude) == 0 {
		return false
	}
	for code := range bytes.FieldsSeq(q) {
		for _, e := range w.rd.exclude {
			if bytes.Equal(code, e) {
				return true
			}
		}
	}
	return false
}

// assemble places the rows on the station's days, finding duplicates.
func (w *worker) assemble(b *block) *Station {
	st := &Station{ID: b.id, Vars: map[string][]float64{}, Counts: map[string]*Counts{}}
	if len(w.rows) == 0 {
		return st
	}
	lo, hi := w.rows[0].day, w.rows[0].day
	var used [256]bool
	for _, r := range w.rows {
		lo, hi = min(lo, r.day), max(hi, r.day)
		used[r.v] = true
	}
	days := int(hi-lo) + 1
	st.Start, st.Days = lo, days
	nv := len(w.rd.vars)
	if n := nv * days; cap(w.slot) < n {
		w.slot = make([]int32, n)
	} else {
		w.slot = w.slot[:n]
		clear(w.slot)
	}
	nused := 0
	for v := range nv {
		if used[v] {
			nused++
		}
	}
	backing := make([]float64, nused*days)
	for i := range backing {
		backing[i] = math.NaN()
	}
	vals := make([][]float64, nv)
	counts := make([]*Counts, nv)
	k := 0
	for v := range nv {
		if used[v] {
			vals[v] = backing[k*days : (k+1)*days : (k+1)*days]
			counts[v] = &Counts{}
			st.Vars[w.rd.vars[v].name] = vals[v]
			st.Counts[w.rd.vars[v].name] = counts[v]
			k++
		}
	}
	for _, r := range w.rows {
		i := int(r.day - lo)
		s := &w.slot[int(r.v)*days+i]
		if *s != 0 {
			first := b.line + int(*s-1)
			w.problem(w.rd.errorf(b.line+int(r.line), int(r.col), colDate, ErrDuplicate,
				fmt.Sprintf("want one row per station, date and variable, got a second row for %s, %s, %s (first on line %d)",
					quoteField([]byte(b.id)), r.day, w.rd.vars[r.v].name, first)))
			continue
		}
		*s = r.line + 1
		c := counts[r.v]
		c.Rows++
		switch r.kind {
		case kindKept:
			c.Kept++
			vals[r.v][i] = r.val
		case kindBlank:
			c.Blank++
		case kindExcluded:
			c.Excluded++
		case kindOutOfRange:
			c.OutOfRange++
		}
		if r.kind == kindKept || r.kind == kindOutOfRange || r.kind == kindExcluded {
			if w.rd.vars[r.v].unit.Converts() {
				c.Converted++
			}
		}
	}
	return st
}

// result is what a worker hands back for one block.
type result[T any] struct {
	seq     int
	st      *Station
	val     T
	ferr    error
	probs   []*ParseError
	err     error
	eof     bool
	rows    int
	bad     int
	skipped map[string]int
}

// Map reads a long-layout file (see the package documentation) and calls
// f on each station, on up to workers goroutines at once (workers <= 0
// means GOMAXPROCS). f must be safe for concurrent use; each call gets a
// Station of its own, which f may keep. emit is called on the calling
// goroutine with f's results in file order, so the output does not depend
// on workers. name is used in error messages.
//
// Map stops at the first error from f or emit and returns it as is. Input
// problems are returned as *ParseError values: the first one, or with
// Options.MaxErrors != 0 all of them (up to the limit) joined with
// errors.Join, in line order; rows with problems are then skipped and the
// rest of the file is read. A station that reappears after another is
// reported and not delivered; every other station in the file is delivered
// once, even when none of its rows was kept (Days is then 0).
//
// Memory holds about four station blocks per worker. Map returns after its
// goroutines have stopped.
func Map[T any](r io.Reader, name string, opt Options, workers int, f func(*Station) (T, error), emit func(T) error) (Summary, error) {
	var sum Summary
	if err := opt.Validate(); err != nil {
		return sum, err
	}
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	rd := newReader(name, opt)
	inflight := 4 * workers
	sp := &splitter{rd: rd, r: r, buf: make([]byte, firstBuf), seen: map[string]int{},
		pool: make(chan []byte, inflight+1)}
	if err := sp.header(opt.Ignore); err != nil {
		return sum, err
	}
	tokens := make(chan struct{}, inflight)
	blocks := make(chan *block, workers)
	results := make(chan *result[T], inflight)
	stop := make(chan struct{})
	var wg sync.WaitGroup
	wg.Go(func() {
		defer close(blocks)
		for seq := 0; ; seq++ {
			select {
			case tokens <- struct{}{}:
			case <-stop:
				return
			}
			b := sp.next()
			b.seq = seq
			if b.eof || b.err != nil {
				results <- &result[T]{seq: seq, eof: b.eof, err: b.err}
				return
			}
			select {
			case blocks <- b:
			case <-stop:
				return
			}
		}
	})
	for range workers {
		wg.Go(func() {
			w := &worker{rd: rd}
			for b := range blocks {
				results <- work(w, b, f, opt.MaxErrors, sp.pool, stop)
			}
		})
	}

	var probs []error
	finish := func(err error) (Summary, error) {
		close(stop)
		wg.Wait()
		if err != nil {
			return sum, err
		}
		return sum, errors.Join(probs...)
	}
	pending := map[int]*result[T]{}
	for next := 0; ; {
		res := <-results
		pending[res.seq] = res
		for {
			res, ok := pending[next]
			if !ok {
				break
			}
			delete(pending, next)
			next++
			<-tokens
			sum.Rows += res.rows
			sum.BadRows += res.bad
			sum.addSkipped(res.skipped)
			for _, p := range res.probs {
				if opt.MaxErrors == 0 {
					return finish(p)
				}
				if opt.MaxErrors > 0 && len(probs) == opt.MaxErrors {
					probs = append(probs, fmt.Errorf("%s: %w: stopped after %d", name, ErrTooMany, opt.MaxErrors))
					return finish(nil)
				}
				probs = append(probs, p)
			}
			if res.err != nil {
				if opt.MaxErrors == 0 {
					return finish(res.err)
				}
				probs = append(probs, res.err)
				return finish(nil)
			}
			if res.ferr != nil {
				return finish(res.ferr)
			}
			if res.st != nil {
				sum.addStation(res.st)
				if err := emit(res.val); err != nil {
					return finish(err)
				}
			}
			if res.eof {
				return finish(nil)
			}
		}
	}
}

// work parses one block and runs f on its station.
func work[T any](w *worker, b *block, f func(*Station) (T, error), maxErrors int, pool chan []byte, stop chan struct{}) *result[T] {
	res := &result[T]{seq: b.seq}
	select {
	case <-stop:
		return res
	default:
	}
	var st *Station
	if b.prob != nil {
		res.probs = []*ParseError{b.prob}
		n := 0
		for pos := 0; pos < len(b.data); {
			k, adv, _, _ := scanRecord(b.data[pos:], true)
			if k > 1 || (k == 1 && b.data[pos] != '\r') {
				n++
			}
			pos += adv
		}
		res.rows, res.bad = n, n
	} else {
		st = w.parse(b)
		res.rows, res.bad, res.skipped = w.nrows, w.bad, w.skipped
		if len(w.probs) > 0 {
			slices.SortStableFunc(w.probs, func(a, b *ParseError) int {
				if a.Line != b.Line {
					return a.Line - b.Line
				}
				return a.Column - b.Column
			})
			res.probs = slices.Clone(w.probs)
		}
	}
	select {
	case pool <- b.buf:
	default:
	}
	if st == nil || (maxErrors == 0 && len(res.probs) > 0) {
		return res
	}
	res.st = st
	res.val, res.ferr = f(st)
	return res
}

// ReadAll reads every station of a long-layout file into memory, in file
// order. It suits small files and tests; use Map for large ones.
func ReadAll(r io.Reader, name string, opt Options) ([]*Station, Summary, error) {
	var all []*Station
	sum, err := Map(r, name, opt, 1,
		func(s *Station) (*Station, error) { return s, nil },
		func(s *Station) error { all = append(all, s); return nil })
	return all, sum, err
}
