package series

import (
	"bytes"
	"math"
	"strconv"
	"unsafe"
)

// maxRecord bounds the bytes of one record, so that a file without line
// ends or with an unterminated quote cannot take all memory.
const maxRecord = 1 << 20

// scanRecord finds the end of the record at the start of data. It returns
// the record's length without its line end, the bytes to advance past it
// (line end included) and the number of line breaks inside quoted fields.
// more is true when data ends before the record does and more input may
// follow (atEOF false). A trailing '\r' is left in the record.
//
// Lines without a double quote take a fast path. Lines with one are scanned
// as RFC 4180 records, in which a quoted field may hold line breaks.
func scanRecord(data []byte, atEOF bool) (n, adv, breaks int, more bool) {
	i := bytes.IndexByte(data, '\n')
	line := data
	if i >= 0 {
		line = data[:i]
	}
	if bytes.IndexByte(line, '"') < 0 {
		if i >= 0 {
			return i, i + 1, 0, false
		}
		if !atEOF {
			return 0, 0, 0, true
		}
		return len(data), len(data), 0, false
	}
	inQuote, fieldStart := false, true
	for j := 0; j < len(data); j++ {
		c := data[j]
		if inQuote {
			switch c {
			case '"':
				if j+1 == len(data) && !atEOF {
					return 0, 0, 0, true // "" or a closing quote: cannot tell yet
				}
				if j+1 < len(data) && data[j+1] == '"' {
					j++
				} else {
					inQuote = false
				}
			case '\n':
				breaks++
			}
			continue
		}
		switch c {
		case '"':
			inQuote = fieldStart
		case ',':
			fieldStart = true
			continue
		case '\n':
			return j, j + 1, breaks, false
		}
		fieldStart = false
	}
	if !atEOF {
		return 0, 0, 0, true
	}
	return len(data), len(data), breaks, false
}

// fields holds the fields of one record, reused from record to record.
type fields struct {
	f       [][]byte // field contents, quotes removed
	off     []int    // byte offset of each field's start in the record
	scratch []byte   // unquoted copies of fields with doubled quotes
}

// quoteProblem describes a quoting error at byte offset off of a record.
type quoteProblem struct {
	off, field int
	msg        string
}

// split splits rec (without its line end) into fields. It reports the first
// quoting problem, if any; fields before it are valid.
func (fs *fields) split(rec []byte) *quoteProblem {
	if bytes.IndexByte(rec, '"') < 0 {
		fs.splitPlain(rec)
		return nil
	}
	fs.f, fs.off = fs.f[:0], fs.off[:0]
	if cap(fs.scratch) < len(rec) {
		fs.scratch = make([]byte, 0, len(rec))
	}
	fs.scratch = fs.scratch[:0]
	i := 0
	for {
		start := i
		if i < len(rec) && rec[i] == '"' {
			// Quoted field: runs to a quote not followed by another.
			j := i + 1
			escaped := false
			for {
				k := bytes.IndexByte(rec[j:], '"')
				if k < 0 {
					return &quoteProblem{start, len(fs.f), "want a closing quote, got " + quoteField(rec[start:])}
				}
				j += k
				if j+1 < len(rec) && rec[j+1] == '"' {
					escaped = true
					j += 2
					continue
				}
				break
			}
			body := rec[start+1 : j]
			if escaped {
				s := len(fs.scratch)
				for len(body) > 0 {
					k := bytes.IndexByte(body, '"')
					if k < 0 {
						fs.scratch = append(fs.scratch, body...)
						break
					}
					fs.scratch = append(fs.scratch, body[:k+1]...)
					body = body[k+2:]
				}
				body = fs.scratch[s:len(fs.scratch):len(fs.scratch)]
			}
			fs.f = append(fs.f, body)
			fs.off = append(fs.off, start)
			i = j + 1
			if i == len(rec) {
				return nil
			}
			if rec[i] != ',' {
				end := bytes.IndexByte(rec[i:], ',')
				if end < 0 {
					end = len(rec) - i
				}
				return &quoteProblem{start, len(fs.f) - 1, "want a comma or the line end after a closing quote, got " + quoteField(rec[start:i+end])}
			}
			i++
			continue
		}
		end := bytes.IndexByte(rec[i:], ',')
		if end < 0 {
			end = len(rec) - i
		}
		f := rec[i : i+end]
		if bytes.IndexByte(f, '"') >= 0 {
			return &quoteProblem{start, len(fs.f), "want quotes around the whole field, got " + quoteField(f)}
		}
		fs.f = append(fs.f, f)
		fs.off = append(fs.off, start)
		i += end
		if i == len(rec) {
			return nil
		}
		i++ // past the comma
	}
}

// splitPlain splits rec, which holds no double quote, at its commas.
func (fs *fields) splitPlain(rec []byte) {
	fs.f, fs.off = fs.f[:0], fs.off[:0]
	start := 0
	for {
		i := bytes.IndexByte(rec[start:], ',')
		if i < 0 {
			fs.f = append(fs.f, rec[start:])
			fs.off = append(fs.off, start)
			return
		}
		fs.f = append(fs.f, rec[start:start+i])
		fs.off = append(fs.off, start)
		start += i + 1
	}
}

// lineCol converts byte offset off of a record that starts on line line to
// the line and 1-based byte column, counting line breaks inside quotes.
func lineCol(rec []byte, line, off int) (int, int) {
	off = min(off, len(rec))
	nl := bytes.LastIndexByte(rec[:off], '\n')
	if nl < 0 {
		return line, off + 1
	}
	return line + bytes.Count(rec[:off], []byte{'\n'}), off - nl
}

// pow10 holds the powers of ten that float64 represents exactly.
var pow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// parseFloat parses a decimal number [+-]digits[.digits][(e|E)[+-]digits]
// (at least one digit before or after the point) without allocating. It
// accepts nothing else: no spaces, hexadecimal, underscores, Inf or NaN.
// Numbers with at most 15 significant digits and a small exponent are
// converted exactly by one multiplication or division (Clinger 1990); the
// rest go to strconv.ParseFloat. ok is false for bad syntax and for values
// too large for float64.
func parseFloat(b []byte) (x float64, ok bool) {
	i := 0
	neg := false
	if i < len(b) && (b[i] == '+' || b[i] == '-') {
		neg = b[i] == '-'
		i++
	}
	var mant uint64
	nd, ndMant, exp := 0, 0, 0 // digits seen, digits in mant, decimal exponent
	sawDot := false
	for ; i < len(b); i++ {
		c := b[i]
		if c == '.' {
			if sawDot {
				return 0, false
			}
			sawDot = true
			continue
		}
		if c < '0' || c > '9' {
			break
		}
		nd++
		if c == '0' && ndMant == 0 {
			if sawDot {
				exp--
			}
			continue // leading zero
		}
		if ndMant < 19 {
			mant = mant*10 + uint64(c-'0')
			ndMant++
			if sawDot {
				exp--
			}
		} else if !sawDot {
			exp++ // digit dropped: only the slow path is exact
		}
	}
	if nd == 0 {
		return 0, false
	}
	if i < len(b) && (b[i] == 'e' || b[i] == 'E') {
		i++
		eneg := false
		if i < len(b) && (b[i] == '+' || b[i] == '-') {
			eneg = b[i] == '-'
			i++
		}
		if i == len(b) {
			return 0, false
		}
		e := 0
		for ; i < len(b); i++ {
			c := b[i]
			if c < '0' || c > '9' {
				return 0, false
			}
			if e < 100000 {
				e = e*10 + int(c-'0')
			}
		}
		if eneg {
			e = -e
		}
		exp += e
	}
	if i != len(b) {
		return 0, false
	}
	if ndMant <= 15 && exp >= -22 && exp <= 22 {
		x = float64(mant)
		if exp < 0 {
			x /= pow10[-exp]
		} else {
			x *= pow10[exp]
		}
		if neg {
			x = -x
		}
		return x, true
	}
	x, err := strconv.ParseFloat(unsafe.String(&b[0], len(b)), 64)
	if err != nil || math.IsInf(x, 0) {
		return 0, false
	}
	return x, true
}

// isMissing reports whether a value field marks a missing value: empty,
// NA or NaN in any case.
func isMissing(b []byte) bool {
	switch len(b) {
	case 0:
		return true
	case 2:
		return (b[0]|0x20) == 'n' && (b[1]|0x20) == 'a'
	case 3:
		return (b[0]|0x20) == 'n' && (b[1]|0x20) == 'a' && (b[2]|0x20) == 'n'
	}
	return false
}
