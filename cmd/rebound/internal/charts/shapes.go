package charts

import (
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// rect is a filled rectangle in data coordinates.
type rect struct {
	X0, X1, Y0, Y1 float64
	Fill           color.Color
}

// rects draws rectangles, optionally outlined.
type rects struct {
	R       []rect
	Outline draw.LineStyle
	// Range, when false, keeps the rectangles out of the axes' ranges
	// (for background bands).
	NoRange bool
}

func (rs *rects) Plot(c draw.Canvas, p *plot.Plot) {
	tx, ty := p.Transforms(&c)
	for _, r := range rs.R {
		pts := []vg.Point{{X: tx(r.X0), Y: ty(r.Y0)}, {X: tx(r.X1), Y: ty(r.Y0)}, {X: tx(r.X1), Y: ty(r.Y1)}, {X: tx(r.X0), Y: ty(r.Y1)}}
		c.FillPolygon(r.Fill, c.ClipPolygonXY(pts))
		if rs.Outline.Width > 0 {
			out := append(pts, pts[0])
			c.StrokeLines(rs.Outline, c.ClipLinesXY(out)...)
		}
	}
}

func (rs *rects) DataRange() (xmin, xmax, ymin, ymax float64) {
	xmin, ymin = posInf, posInf
	xmax, ymax = negInf, negInf
	if rs.NoRange {
		return
	}
	for _, r := range rs.R {
		xmin, xmax = min(xmin, r.X0, r.X1), max(xmax, r.X0, r.X1)
		ymin, ymax = min(ymin, r.Y0, r.Y1), max(ymax, r.Y0, r.Y1)
	}
	return
}

// swatch is a legend thumbnail: a filled box.
type swatch struct{ Fill color.Color }

func (s swatch) Thumbnail(c *draw.Canvas) {
	pts := []vg.Point{{X: c.Min.X, Y: c.Min.Y}, {X: c.Max.X, Y: c.Min.Y}, {X: c.Max.X, Y: c.Max.Y}, {X: c.Min.X, Y: c.Max.Y}}
	c.FillPolygon(s.Fill, pts)
}

// segments draws straight line segments in data coordinates.
type segments struct {
	Lines [][]vg.Point // in data coordinates, X and Y as float64 in vg.Length
	Style []draw.LineStyle
}

func (s *segments) Plot(c draw.Canvas, p *plot.Plot) {
	tx, ty := p.Transforms(&c)
	for i, l := range s.Lines {
		pts := make([]vg.Point, len(l))
		for k, pt := range l {
			pts[k] = vg.Point{X: tx(float64(pt.X)), Y: ty(float64(pt.Y))}
		}
		c.StrokeLines(s.Style[i], c.ClipLinesXY(pts)...)
	}
}

func (s *segments) DataRange() (xmin, xmax, ymin, ymax float64) {
	xmin, ymin = posInf, posInf
	xmax, ymax = negInf, negInf
	for _, l := range s.Lines {
		for _, pt := range l {
			xmin, xmax = min(xmin, float64(pt.X)), max(xmax, float64(pt.X))
			ymin, ymax = min(ymin, float64(pt.Y)), max(ymax, float64(pt.Y))
		}
	}
	return
}

func (s *segments) add(style draw.LineStyle, xy ...float64) {
	pts := make([]vg.Point, len(xy)/2)
	for i := range pts {
		pts[i] = vg.Point{X: vg.Length(xy[2*i]), Y: vg.Length(xy[2*i+1])}
	}
	s.Lines = append(s.Lines, pts)
	s.Style = append(s.Style, style)
}

// lineThumb is a legend thumbnail: a horizontal line.
type lineThumb struct{ Style draw.LineStyle }

func (l lineThumb) Thumbnail(c *draw.Canvas) {
	y := c.Center().Y
	c.StrokeLine2(l.Style, c.Min.X, y, c.Max.X, y)
}

// glyphThumb is a legend thumbnail: one marker.
type glyphThumb struct{ Style draw.GlyphStyle }

func (g glyphThumb) Thumbnail(c *draw.Canvas) { c.DrawGlyph(g.Style, c.Center()) }

// legendBelow draws a legend of entries in columns into the strip c.
func legendBelow(c draw.Canvas, p *plot.Plot, names []string, thumbs []plot.Thumbnailer, cols int) {
	if len(names) == 0 {
		return
	}
	cols = max(1, min(cols, len(names)))
	rows := (len(names) + cols - 1) / cols
	w := (c.Max.X - c.Min.X) / vg.Length(cols)
	for col := range cols {
		l := plot.NewLegend()
		l.TextStyle = p.Legend.TextStyle
		l.Top, l.Left = true, true
		l.ThumbnailWidth = vg.Points(18)
		l.Padding = vg.Points(4)
		for r := range rows {
			k := col*rows + r
			if k < len(names) {
				l.Add(names[k], thumbs[k])
			}
		}
		sub := c
		sub.Min.X = c.Min.X + vg.Length(col)*w
		sub.Max.X = sub.Min.X + w
		l.Draw(sub)
	}
}

// legendHeight is the height legendBelow needs for n entries in cols
// columns.
func legendHeight(n, cols int) vg.Length {
	if n == 0 {
		return 0
	}
	rows := (n + max(1, cols) - 1) / max(1, cols)
	return vg.Length(rows)*vg.Points(tickSize*1.15+4) + vg.Points(3)
}

var (
	posInf = math.Inf(1)
	negInf = -posInf
)
