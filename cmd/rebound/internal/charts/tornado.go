package charts

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Swing is one indicator of the tornado chart: the largest change in any
// station's rank when the indicator's weight is lowered (Down) and raised
// (Up) by a relative step, the other weights rescaled to keep the sum.
type Swing struct {
	Label    string
	Down, Up float64 // ranks, >= 0; NaN when the run could not be made
}

// Tornado draws one row per indicator, from the top in the order given
// (the caller puts the largest swing first): a bar to the left for the
// weight lowered and one to the right for the weight raised, each as long
// as the largest rank change it caused. step describes the relative step
// (for example "±25 %").
func Tornado(swings []Swing, step string) ([]byte, error) {
	if len(swings) == 0 {
		return nil, ErrNoData
	}
	rows := swings
	labels := make([]string, len(rows))
	top := 1.0
	for i, s := range rows {
		labels[i] = clip(s.Label, 34)
		top = max(top, nanZero(s.Down), nanZero(s.Up))
	}
	p := newPlot("Rank changes when one weight moves ("+step+")", "largest rank change of any station (ranks)", "")
	nominalY(p, labels)
	p.X.Min, p.X.Max = -top*1.15, top*1.15
	p.X.Tick.Marker = absTicks{}
	bars := &rects{}
	var notes plotter.XYLabels
	n := len(rows)
	for i, s := range rows {
		y := float64(n - 1 - i)
		if finite(s.Down) {
			bars.R = append(bars.R, rect{X0: -s.Down, X1: 0, Y0: y - 0.34, Y1: y + 0.34, Fill: Sky})
			notes.XYs = append(notes.XYs, plotter.XY{X: -s.Down, Y: y})
			notes.Labels = append(notes.Labels, fmt.Sprintf("%g ", s.Down))
		}
		if finite(s.Up) {
			bars.R = append(bars.R, rect{X0: 0, X1: s.Up, Y0: y - 0.34, Y1: y + 0.34, Fill: Ink})
			notes.XYs = append(notes.XYs, plotter.XY{X: s.Up, Y: y})
			notes.Labels = append(notes.Labels, fmt.Sprintf(" %g", s.Up))
		}
	}
	zero := &segments{}
	zero.add(draw.LineStyle{Color: Slate, Width: vg.Points(0.8)}, 0, -0.6, 0, float64(n)-0.4)
	p.Add(grid(true), bars, zero)
	if len(notes.XYs) > 0 {
		lab, err := plotter.NewLabels(notes)
		if err != nil {
			return nil, err
		}
		for i := range lab.TextStyle {
			lab.TextStyle[i] = textStyle(8, Slate)
			lab.TextStyle[i].YAlign = draw.YCenter
			if notes.XYs[i].X < 0 || (notes.XYs[i].X == 0 && notes.Labels[i][0] != ' ') {
				lab.TextStyle[i].XAlign = draw.XRight
			}
		}
		p.Add(lab)
	}
	names := []string{"weight lowered", "weight raised"}
	thumbs := []plot.Thumbnailer{swatch{Sky}, swatch{Ink}}
	legH := legendHeight(2, 2)
	h := vg.Points(float64(n)*22 + 80)
	return png(h+legH, func(c draw.Canvas) {
		c = pad(c)
		strip := c
		strip.Max.Y = c.Min.Y + legH
		c.Min.Y += legH
		p.Draw(c)
		legendBelow(strip, p, names, thumbs, 2)
	})
}

func nanZero(x float64) float64 {
	if math.IsNaN(x) {
		return 0
	}
	return x
}
