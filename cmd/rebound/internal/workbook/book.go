package workbook

import (
	"fmt"
	"math"

	"github.com/xuri/excelize/v2"

	"rebound/cmd/rebound/internal/charts"
)

// Colours of the workbook, from the palette of the memo's charts (one
// palette for both): header fill #DCE6F1 with text in ink (#1D4E89), the
// colour scale on scores from amber (lowest) through white to sky blue
// (highest), and chart series in the charts' categorical order.
const (
	headerFill = "#DCE6F1"
	scaleMid   = "#FFFFFF"
)

var (
	headerText    = charts.Hex(charts.Ink)
	scaleLow      = charts.Hex(charts.Amber)
	scaleHigh     = charts.Hex(charts.Sky)
	seriesColours = func() []string {
		out := make([]string, len(charts.Categorical))
		for i, c := range charts.Categorical {
			out[i] = charts.Hex(c)
		}
		return out
	}()
)

// Number formats, by what a column holds.
const (
	fmtText   = ""
	fmtInt    = "0"
	fmtScore  = "0.0"
	fmt2      = "0.00"
	fmt3      = "0.000"
	fmt4      = "0.0000"
	fmtGen    = "General"
	fmtDate   = "yyyy-mm-dd"
	fmtWeight = "0.000"
	// fmtFeature shows up to three decimals, for values of any size.
	fmtFeature = "0.0##"
)

// book wraps an excelize file with the styles the sheets use.
type book struct {
	f      *excelize.File
	header int
	title  int
	bold   int
	wrap   int
	text   int
	num    map[string]int
	err    error
}

func newBook() (*book, error) {
	b := &book{f: excelize.NewFile(), num: map[string]int{}}
	var err error
	if b.header, err = b.f.NewStyle(&excelize.Style{
		Font:      &excelize.Font{Bold: true, Color: headerText},
		Fill:      excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{headerFill}},
		Border:    []excelize.Border{{Type: "bottom", Color: headerText, Style: 1}},
		Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"},
	}); err != nil {
		return nil, err
	}
	if b.title, err = b.f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true, Size: 14, Color: headerText}}); err != nil {
		return nil, err
	}
	if b.bold, err = b.f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}, Alignment: &excelize.Alignment{Vertical: "top"}}); err != nil {
		return nil, err
	}
	if b.wrap, err = b.f.NewStyle(&excelize.Style{Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"}}); err != nil {
		return nil, err
	}
	if b.text, err = b.f.NewStyle(&excelize.Style{NumFmt: 49, Alignment: &excelize.Alignment{Vertical: "top", Indent: 1}}); err != nil { // 49 = "@", text
		return nil, err
	}
	for _, nf := range []string{fmtInt, fmtScore, fmt2, fmt3, fmt4, fmtDate, fmtGen, fmtFeature} {
		f := nf
		id, err := b.f.NewStyle(&excelize.Style{CustomNumFmt: &f, Alignment: &excelize.Alignment{Vertical: "top"}})
		if err != nil {
			return nil, err
		}
		b.num[nf] = id
	}
	return b, nil
}

// column is one column of a table: its header (with units), its width in
// characters and its number format (fmtText for text).
type column struct {
	Header string
	Width  float64
	Format string
}

// blank is a cell left empty on purpose.
type blank struct{}

// table writes a table at the top of sheet: a header row, frozen and
// styled, then rows of cells (string, int, float64, blank or nil), with
// column widths, number formats and an autofilter. It returns the number
// of data rows. Strings are always written as text.
func (b *book) table(sheet string, cols []column, rows [][]any) {
	b.tableAt(sheet, 1, cols, rows, true)
}

// tableAt writes a table whose header is on row top; freeze freezes the
// rows above and including the header.
func (b *book) tableAt(sheet string, top int, cols []column, rows [][]any, freeze bool) {
	if b.err != nil {
		return
	}
	f := b.f
	for j, c := range cols {
		name := colName(j + 1)
		b.set(f.SetColWidth(sheet, name, name, c.Width))
		b.str(sheet, cell(j+1, top), c.Header)
	}
	last := colName(len(cols))
	b.set(f.SetCellStyle(sheet, cell(1, top), cell(len(cols), top), b.header))
	// Headers wrap; give the row the height of the longest.
	lines := 1
	for _, c := range cols {
		per := max(1, int(c.Width*1.05))
		lines = max(lines, (len([]rune(c.Header))+per-1)/per)
	}
	b.set(f.SetRowHeight(sheet, top, float64(15*lines)))
	for i, row := range rows {
		r := top + 1 + i
		for j, v := range row {
			b.value(sheet, cell(j+1, r), v)
		}
	}
	if len(rows) > 0 {
		for j, c := range cols {
			style := b.text
			if c.Format != fmtText {
				style = b.num[c.Format]
			}
			b.set(f.SetCellStyle(sheet, cell(j+1, top+1), cell(j+1, top+len(rows)), style))
		}
	}
	if freeze {
		b.set(f.SetPanes(sheet, &excelize.Panes{Freeze: true, YSplit: top, TopLeftCell: cell(1, top+1), ActivePane: "bottomLeft",
			Selection: []excelize.Selection{{SQRef: cell(1, top+1), ActiveCell: cell(1, top+1), Pane: "bottomLeft"}}}))
		b.set(f.AutoFilter(sheet, fmt.Sprintf("A%d:%s%d", top, last, top+max(len(rows), 1)), nil))
	}
}

// value writes one cell: a string as text, numbers as numbers, NaN and
// blank as an empty cell.
func (b *book) value(sheet, ref string, v any) {
	switch v := v.(type) {
	case nil, blank:
	case string:
		if v != "" {
			b.str(sheet, ref, v)
		}
	case int:
		b.set(b.f.SetCellInt(sheet, ref, int64(v)))
	case float64:
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			b.set(b.f.SetCellFloat(sheet, ref, v, -1, 64))
		}
	case bool:
		b.set(b.f.SetCellBool(sheet, ref, v))
	default:
		b.set(fmt.Errorf("workbook: cell %s!%s: unsupported value %T", sheet, ref, v))
	}
}

// str writes s as a text cell. SetCellStr stores a shared string, never a
// formula, so user text beginning with "=", "+", "-" or "@" stays text.
func (b *book) str(sheet, ref, s string) {
	b.set(b.f.SetCellStr(sheet, ref, s))
}

func (b *book) style(sheet, from, to string, id int) {
	b.set(b.f.SetCellStyle(sheet, from, to, id))
}

func (b *book) set(err error) {
	if err != nil && b.err == nil {
		b.err = err
	}
}

// cell returns the A1 reference of column c, row r (both from 1).
func cell(c, r int) string {
	return fmt.Sprintf("%s%d", colName(c), r)
}

func colName(c int) string {
	name, _ := excelize.ColumnNumberToName(c)
	return name
}

// ref returns an absolute reference to a range of sheet for chart series,
// quoting the sheet name.
func ref(sheet string, c0, r0, c1, r1 int) string {
	return fmt.Sprintf("'%s'!$%s$%d:$%s$%d", sheet, colName(c0), r0, colName(c1), r1)
}

// nanBlank turns NaN into a blank cell.
func nanBlank(x float64) any {
	if math.IsNaN(x) {
		return blank{}
	}
	return x
}
