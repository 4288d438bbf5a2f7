package workbook

import (
	"archive/zip"
	"bytes"
	"io"
	"regexp"
	"slices"
)

var defaultRE = regexp.MustCompile(`<Default [^>]*>(?:</Default>)?`)

// canonical rewrites an xlsx package so that the same workbook always
// gives the same bytes: excelize lists the default content types of
// [Content_Types].xml in map order, so they are sorted here. Every other
// part is copied unchanged, in the same order.
func canonical(data []byte) ([]byte, error) {
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		return nil, err
	}
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	for _, f := range zr.File {
		rc, err := f.Open()
		if err != nil {
			return nil, err
		}
		b, err := io.ReadAll(rc)
		rc.Close()
		if err != nil {
			return nil, err
		}
		if f.Name == "[Content_Types].xml" {
			b = sortDefaults(b)
		}
		w, err := zw.CreateHeader(&zip.FileHeader{Name: f.Name, Method: zip.Deflate})
		if err != nil {
			return nil, err
		}
		if _, err := w.Write(b); err != nil {
			return nil, err
		}
	}
	if err := zw.Close(); err != nil {
		return nil, err
	}
	return out.Bytes(), nil
}

// sortDefaults sorts the run of <Default> elements of a content types part
// in place.
func sortDefaults(b []byte) []byte {
	locs := defaultRE.FindAllIndex(b, -1)
	if len(locs) < 2 {
		return b
	}
	start, end := locs[0][0], locs[len(locs)-1][1]
	elems := make([]string, len(locs))
	for i, l := range locs {
		elems[i] = string(b[l[0]:l[1]])
	}
	slices.Sort(elems)
	var buf bytes.Buffer
	buf.Write(b[:start])
	for i, l := range locs {
		buf.WriteString(elems[i])
		if i+1 < len(locs) {
			buf.Write(b[l[1]:locs[i+1][0]]) // whatever lies between (nothing)
		}
	}
	buf.Write(b[end:])
	return buf.Bytes()
}
