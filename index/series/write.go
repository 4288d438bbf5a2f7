package series

import (
	"bufio"
	"bytes"
	"io"
	"math"
	"slices"
	"strconv"

	"rebound/index/calendar"
)

// WriteLong writes stations in the long layout with the header
// station,date,variable,value: one row per value present, variables in name
// order within each day, values in the shortest form that reads back to the
// same float64. Missing values are left out.
func WriteLong(w io.Writer, stations []*Station) error {
	bw := bufio.NewWriter(w)
	bw.WriteString("station,date,variable,value\n")
	var b []byte
	for _, s := range stations {
		names := make([]string, 0, len(s.Vars))
		for name := range s.Vars {
			names = append(names, name)
		}
		slices.Sort(names)
		id := appendField(nil, s.ID)
		for i := range s.Days {
			for _, name := range names {
				v := s.Vars[name][i]
				if math.IsNaN(v) {
					continue
				}
				b = append(b[:0], id...)
				b = append(b, ',')
				b, _ = s.Date(i).AppendText(b)
				b = append(b, ',')
				b = appendField(b, name)
				b = append(b, ',')
				b = strconv.AppendFloat(b, v, 'g', -1, 64)
				b = append(b, '\n')
				if _, err := bw.Write(b); err != nil {
					return err
				}
			}
		}
	}
	return bw.Flush()
}

// WriteWide writes variable name of stations in the wide layout
// date,<station>,..., one row per day from the earliest to the latest day
// of any station, with empty cells where a value is missing.
func WriteWide(w io.Writer, stations []*Station, name string) error {
	bw := bufio.NewWriter(w)
	b := []byte("date")
	var lo, hi calendar.Date
	found := false
	for _, s := range stations {
		b = append(b, ',')
		b = appendField(b, s.ID)
		if s.Days > 0 && s.Vars[name] != nil {
			if !found || s.Start < lo {
				lo = s.Start
			}
			if !found || s.End() > hi {
				hi = s.End()
			}
			found = true
		}
	}
	b = append(b, '\n')
	bw.Write(b)
	for d := lo; found && d <= hi; d++ {
		b, _ = d.AppendText(b[:0])
		for _, s := range stations {
			b = append(b, ',')
			if x := s.Vars[name]; x != nil {
				if i := s.Index(d); i >= 0 && i < len(x) && !math.IsNaN(x[i]) {
					b = strconv.AppendFloat(b, x[i], 'g', -1, 64)
				}
			}
		}
		b = append(b, '\n')
		if _, err := bw.Write(b); err != nil {
			return err
		}
	}
	return bw.Flush()
}

// appendField appends s to b as a CSV field, quoted as RFC 4180 requires
// when it holds a comma, a quote or a line break, or would read as missing
// (an empty field stays empty).
func appendField(b []byte, s string) []byte {
	if !needsQuotes(s) {
		return append(b, s...)
	}
	b = append(b, '"')
	for i := range len(s) {
		if s[i] == '"' {
			b = append(b, '"')
		}
		b = append(b, s[i])
	}
	return append(b, '"')
}

func needsQuotes(s string) bool {
	return bytes.ContainsAny([]byte(s), ",\"\r\n") || (len(s) >= 3 && s[:3] == "\xef\xbb\xbf")
}
