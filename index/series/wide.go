package series

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"runtime"
	"sync"
	"unsafe"

	"rebound/index/calendar"
)

// ReadWide reads a wide-layout file of one variable,
//
//	date,<station>,<station>,...
//
// holding v in v.Units, and returns one Station per station column, in
// header order, each with the single variable v.Name. Of opt only MaxErrors
// is used. The file is read whole: memory holds every value of the file
// twice while it is read. Rows may come in any date order; a repeated date
// is an error naming both lines. Empty cells, NA and NaN are missing. A
// station's record runs from its first to its last non-empty cell, and only
// empty cells inside that span count as Blank. The quoting and error
// conventions are those of the long layout.
func ReadWide(r io.Reader, name string, v Var, opt Options) ([]*Station, Summary, error) {
	var sum Summary
	if v.Name == "" {
		return nil, sum, errors.New("series: wide file variable has no name")
	}
	if err := v.validate(); err != nil {
		return nil, sum, err
	}
	rd := newReader(name, Options{Vars: []Var{v}})
	br := bufio.NewReaderSize(r, 1<<16)
	if b, _ := br.Peek(3); string(b) == "\xef\xbb\xbf" {
		br.Discard(3)
	}
	cr := csv.NewReader(br)
	cr.ReuseRecord = true

	var probs []error
	stopped := false
	problem := func(p *ParseError) {
		if stopped {
			return
		}
		sum.BadRows++
		if opt.MaxErrors > 0 && len(probs) == opt.MaxErrors {
			probs = append(probs, fmt.Errorf("%s: %w: stopped after %d", name, ErrTooMany, opt.MaxErrors))
			stopped = true
			return
		}
		probs = append(probs, p)
		if opt.MaxErrors == 0 {
			stopped = true
		}
	}
	csvProblem := func(err error, rec []string, want int) *ParseError {
		var pe *csv.ParseError
		if !errors.As(err, &pe) {
			return nil
		}
		if errors.Is(pe.Err, csv.ErrFieldCount) {
			return rd.errorf(pe.StartLine, 1, "", ErrFieldCount, fmt.Sprintf("want %d fields, got %d", want, len(rec)))
		}
		return rd.errorf(pe.Line, pe.Column, "", ErrQuote, "want RFC 4180 quoting, got "+pe.Err.Error())
	}

	head, err := cr.Read()
	if err != nil {
		if err == io.EOF {
			return nil, sum, rd.errorf(1, 1, "", ErrHeader, "want a header line date,<station>,..., got an empty file")
		}
		if p := csvProblem(err, head, 0); p != nil {
			return nil, sum, p
		}
		return nil, sum, err
	}
	if head[0] != colDate {
		return nil, sum, rd.errorf(1, 1, "", ErrHeader, wantGot(`"date" as the first column`, []byte(head[0])))
	}
	ids := make([]string, len(head)-1)
	seen := map[string]int{}
	for j, h := range head[1:] {
		_, col := cr.FieldPos(j + 1)
		if h == "" {
			return nil, sum, rd.errorf(1, col, "", ErrHeader, `want a station ID, got ""`)
		}
		if k, ok := seen[h]; ok {
			return nil, sum, rd.errorf(1, col, "", ErrHeader,
				fmt.Sprintf("want each station once, got %s again (first in column %d)", quoteField([]byte(h)), k+2))
		}
		seen[h] = j
		ids[j] = h
	}
	ns := len(ids)
	spec := &rd.vars[0]

	var (
		dates []calendar.Date
		vals  []float64
		kinds []uint8
		lines = map[calendar.Date]int{}
	)
	const kindNone = 255 // empty cell, or a cell with a problem
	for !stopped {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			p := csvProblem(err, rec, ns+1)
			if p == nil {
				return nil, sum, fmt.Errorf("%s: %w", name, err)
			}
			sum.Rows++
			problem(p)
			continue
		}
		sum.Rows++
		line, _ := cr.FieldPos(0)
		day, want := parseDay(bytesOf(rec[0]))
		if want != "" {
			problem(rd.errorf(line, 1, colDate, ErrDate, wantGot(want, []byte(rec[0]))))
			continue
		}
		if first, ok := lines[day]; ok {
			problem(rd.errorf(line, 1, colDate, ErrDuplicate,
				fmt.Sprintf("want one row per date, got %s again (first on line %d)", day, first)))
			continue
		}
		lines[day] = line
		dates = append(dates, day)
		for j, cell := range rec[1:] {
			b := bytesOf(cell)
			x, k := math.NaN(), uint8(kindNone)
			if !isMissing(b) {
				y, ok := parseFloat(b)
				if !ok {
					_, col := cr.FieldPos(j + 1)
					problem(rd.errorf(line, col, ids[j], ErrValue,
						wantGot("a finite decimal number, or empty, NA or NaN if missing", b)))
				} else {
					y = spec.unit.Convert(y)
					if spec.checks && !spec.rng.Contains(y) {
						k = kindOutOfRange
					} else {
						x, k = y, kindKept
					}
				}
			}
			vals = append(vals, x)
			kinds = append(kinds, k)
		}
	}

	out := make([]*Station, ns)
	for j := range ns {
		st := &Station{ID: ids[j], Vars: map[string][]float64{}, Counts: map[string]*Counts{}}
		out[j] = st
		var lo, hi calendar.Date
		found := false
		for i, d := range dates {
			if kinds[i*ns+j] != kindNone {
				if !found || d < lo {
					lo = d
				}
				if !found || d > hi {
					hi = d
				}
				found = true
			}
		}
		if !found {
			sum.addStation(st)
			continue
		}
		days := int(hi-lo) + 1
		x := make([]float64, days)
		for i := range x {
			x[i] = math.NaN()
		}
		c := &Counts{}
		for i, d := range dates {
			if d < lo || d > hi {
				continue
			}
			c.Rows++
			switch kinds[i*ns+j] {
			case kindKept:
				c.Kept++
				x[d-lo] = vals[i*ns+j]
			case kindOutOfRange:
				c.OutOfRange++
			default:
				c.Blank++
			}
		}
		if spec.unit.Converts() {
			c.Converted = c.Kept + c.OutOfRange
		}
		st.Start, st.Days = lo, days
		st.Vars[spec.name] = x
		st.Counts[spec.name] = c
		sum.addStation(st)
	}
	return out, sum, errors.Join(probs...)
}

// bytesOf returns the bytes of s without copying; they must not be changed.
func bytesOf(s string) []byte { return unsafe.Slice(unsafe.StringData(s), len(s)) }

// Merge adds the variables of src to dst, extending both records to the
// days either covers, and returns dst. The two must be the same station and
// share no variable.
func Merge(dst, src *Station) (*Station, error) {
	if dst.ID != src.ID {
		return dst, fmt.Errorf("series: merge: station %q with station %q", dst.ID, src.ID)
	}
	for name := range src.Vars {
		if _, ok := dst.Vars[name]; ok {
			return dst, fmt.Errorf("series: merge: station %q has variable %q twice", dst.ID, name)
		}
	}
	lo, hi := dst.Start, dst.End()
	switch {
	case dst.Days == 0 && src.Days == 0:
		hi = lo - 1
	case dst.Days == 0:
		lo, hi = src.Start, src.End()
	case src.Days > 0:
		lo, hi = min(lo, src.Start), max(hi, src.End())
	}
	days := int(hi-lo) + 1
	if dst.Vars == nil {
		dst.Vars = map[string][]float64{}
	}
	if dst.Counts == nil {
		dst.Counts = map[string]*Counts{}
	}
	move := func(s *Station, name string, x []float64) {
		y := x
		if lo != s.Start || days != s.Days {
			y = make([]float64, days)
			for i := range y {
				y[i] = math.NaN()
			}
			if len(x) > 0 {
				copy(y[int(s.Start-lo):], x)
			}
		}
		dst.Vars[name] = y
	}
	for name, x := range dst.Vars {
		move(dst, name, x)
	}
	for name, x := range src.Vars {
		move(src, name, x)
		if c := src.Counts[name]; c != nil {
			cc := *c
			dst.Counts[name] = &cc
		}
	}
	dst.Start, dst.Days = lo, days
	return dst, nil
}

// MapStations calls f on every station, on up to workers goroutines at once
// (workers <= 0 means GOMAXPROCS), and emit with the results in the order of
// stations, on the calling goroutine. It stops at the first error from f or
// emit and returns it.
func MapStations[T any](stations []*Station, workers int, f func(*Station) (T, error), emit func(T) error) error {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	type res struct {
		i   int
		val T
		err error
	}
	inflight := 4 * workers
	jobs := make(chan int)
	results := make(chan res, inflight)
	tokens := make(chan struct{}, inflight)
	stop := make(chan struct{})
	var wg sync.WaitGroup
	wg.Go(func() {
		defer close(jobs)
		for i := range stations {
			select {
			case tokens <- struct{}{}:
			case <-stop:
				return
			}
			select {
			case jobs <- i:
			case <-stop:
				return
			}
		}
	})
	for range workers {
		wg.Go(func() {
			for i := range jobs {
				v, err := f(stations[i])
				results <- res{i, v, err}
			}
		})
	}
	finish := func(err error) error {
		close(stop)
		wg.Wait()
		return err
	}
	pending := map[int]res{}
	for next := 0; next < len(stations); {
		r := <-results
		pending[r.i] = r
		for {
			r, ok := pending[next]
			if !ok {
				break
			}
			delete(pending, next)
			next++
			<-tokens
			if r.err != nil {
				return finish(r.err)
			}
			if err := emit(r.val); err != nil {
				return finish(err)
			}
		}
	}
	return finish(nil)
}
