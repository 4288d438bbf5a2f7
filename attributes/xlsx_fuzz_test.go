package attributes

import (
	"archive/zip"
	"bytes"
	"encoding/csv"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// workbookParts returns the files of a workbook holding the table good, as
// excelize writes it.
func workbookParts(f *testing.F) map[string][]byte {
	f.Helper()
	x := excelize.NewFile()
	recs, _ := csv.NewReader(strings.NewReader(good)).ReadAll()
	for i, rec := range recs {
		for j, v := range rec {
			cell, _ := excelize.CoordinatesToCellName(j+1, i+1)
			x.SetCellStr("Sheet1", cell, v)
		}
	}
	var buf bytes.Buffer
	if err := x.Write(&buf); err != nil {
		f.Fatal(err)
	}
	zr, err := zip.NewReader(bytes.NewReader(buf.Bytes()), int64(buf.Len()))
	if err != nil {
		f.Fatal(err)
	}
	parts := map[string][]byte{}
	for _, zf := range zr.File {
		rc, err := zf.Open()
		if err != nil {
			f.Fatal(err)
		}
		parts[zf.Name], err = io.ReadAll(rc)
		rc.Close()
		if err != nil {
			f.Fatal(err)
		}
	}
	return parts
}

// FuzzReadXLSX puts arbitrary sheet and shared-string XML into an
// otherwise valid workbook: reading it must not panic, every error must
// print, and an accepted table must hold unique stations within the
// coordinate ranges.
func FuzzReadXLSX(f *testing.F) {
	parts := workbookParts(f)
	const sheet, shared = "xl/worksheets/sheet1.xml", "xl/sharedStrings.xml"
	f.Add(string(parts[sheet]), string(parts[shared]))
	f.Add(`<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData><row r="1"><c r="XFD1048576" t="s"><v>99</v></c></row></sheetData></worksheet>`, string(parts[shared]))
	f.Add(`<worksheet><sheetData><row r="0"><c r="A0"><v>1e999</v></c></row></sheetData></worksheet>`, ``)
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, sheetXML, sharedXML string) {
		var buf bytes.Buffer
		zw := zip.NewWriter(&buf)
		for name, data := range parts {
			switch name {
			case sheet:
				data = []byte(sheetXML)
			case shared:
				data = []byte(sharedXML)
			}
			w, err := zw.CreateHeader(&zip.FileHeader{Name: name, Method: zip.Store})
			if err != nil {
				t.Fatal(err)
			}
			w.Write(data)
		}
		if err := zw.Close(); err != nil {
			t.Fatal(err)
		}
		path := filepath.Join(dir, "fuzz.xlsx")
		if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		tab, errs := ReadXLSX(path)
		for _, e := range errs {
			_ = e.Error()
		}
		if len(errs) == 0 {
			seen := map[string]bool{}
			for _, s := range tab.Stations {
				if seen[s.ID] || s.Latitude < -90 || s.Latitude > 90 || s.Longitude < -180 || s.Longitude > 180 {
					t.Fatalf("invalid station accepted: %+v", s)
				}
				seen[s.ID] = true
			}
		}
	})
}
