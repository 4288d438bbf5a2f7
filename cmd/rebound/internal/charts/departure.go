package charts

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"rebound/index/calendar"
)

// Window is one variable's daily record at one station around one event.
type Window struct {
	Station  string // identifier and name, for the title
	Variable string // e.g. "water temperature"
	Units    string // e.g. "°C"
	Event    string // e.g. "heat wave HW-2023-07-08"
	// First is the date of Observed[0] and Normal[0]; day i is First+i.
	First    calendar.Date
	Observed []float64 // NaN where missing
	Normal   []float64 // the day-of-year normal; NaN where undefined
	// Tolerance is the half-width of the recovery band around the normal,
	// in Units; 0 draws no band.
	Tolerance float64
	// Start and End bound the event; Recovered says whether the variable
	// came back within the band, RecoveryDays days after End.
	Start, End   calendar.Date
	Recovered    bool
	RecoveryDays int
}

// Departure draws the observed series and its normal with the recovery
// band around it, the event shaded and the day of recovery marked.
func Departure(w Window) ([]byte, error) {
	n := len(w.Observed)
	if n == 0 {
		return nil, ErrNoData
	}
	if len(w.Normal) != n {
		panic("charts: observed and normal differ in length")
	}
	title := fmt.Sprintf("%s\n%s around the %s", clip(w.Station, 60), w.Variable, w.Event)
	p := newPlot(title, "date", fmt.Sprintf("%s (%s)", w.Variable, w.Units))
	day := func(i int) float64 { return float64(int(w.First) + i) }

	lo, hi := math.Inf(1), math.Inf(-1)
	var obs, norm []plotter.XYs
	var bands []*band
	var curB *band
	var cur, curN plotter.XYs
	for i := range n {
		if v := w.Observed[i]; finite(v) {
			cur = append(cur, plotter.XY{X: day(i), Y: v})
			lo, hi = min(lo, v), max(hi, v)
		} else if len(cur) > 0 {
			obs, cur = append(obs, cur), nil
		}
		if v := w.Normal[i]; finite(v) {
			curN = append(curN, plotter.XY{X: day(i), Y: v})
			lo, hi = min(lo, v-w.Tolerance), max(hi, v+w.Tolerance)
			if w.Tolerance > 0 {
				if curB == nil {
					curB = &band{Fill: light}
					bands = append(bands, curB)
				}
				curB.X = append(curB.X, day(i))
				curB.Lo = append(curB.Lo, v-w.Tolerance)
				curB.Hi = append(curB.Hi, v+w.Tolerance)
			}
		} else {
			if len(curN) > 0 {
				norm, curN = append(norm, curN), nil
			}
			curB = nil
		}
	}
	if len(cur) > 0 {
		obs = append(obs, cur)
	}
	if len(curN) > 0 {
		norm = append(norm, curN)
	}
	if math.IsInf(lo, 0) {
		return nil, ErrNoData
	}
	margin := (hi - lo) * 0.08
	if margin == 0 {
		margin = 1
	}
	lo, hi = lo-margin, hi+margin
	p.Y.Min, p.Y.Max = lo, hi
	p.X.Min, p.X.Max = day(0)-0.5, day(n-1)+0.5
	p.X.Tick.Marker = monthTicks{}

	event := &rects{NoRange: true, R: []rect{{X0: float64(w.Start) - 0.5, X1: float64(w.End) + 0.5, Y0: lo, Y1: hi, Fill: faded(Amber, 90)}}}
	p.Add(event)
	for _, b := range bands {
		p.Add(b)
	}
	p.Add(grid(false))
	normalStyle := draw.LineStyle{Color: Slate, Width: vg.Points(1.3), Dashes: []vg.Length{vg.Points(4), vg.Points(2.5)}}
	obsStyle := draw.LineStyle{Color: Ink, Width: vg.Points(1.6)}
	for _, xy := range norm {
		l, err := plotter.NewLine(xy)
		if err != nil {
			return nil, err
		}
		l.LineStyle = normalStyle
		p.Add(l)
	}
	for _, xy := range obs {
		l, err := plotter.NewLine(xy)
		if err != nil {
			return nil, err
		}
		l.LineStyle = obsStyle
		p.Add(l)
	}
	names := []string{"observed", "normal for the day of year"}
	thumbs := []plot.Thumbnailer{lineThumb{obsStyle}, lineThumb{normalStyle}}
	if w.Tolerance > 0 {
		names = append(names, fmt.Sprintf("recovery band (normal ± %.3g %s)", w.Tolerance, w.Units))
		thumbs = append(thumbs, swatch{light})
	}
	names = append(names, "event")
	thumbs = append(thumbs, swatch{faded(Amber, 90)})
	recStyle := draw.LineStyle{Color: Brick, Width: vg.Points(1.4)}
	if w.Recovered {
		rx := float64(int(w.End) + w.RecoveryDays)
		mark := &segments{}
		mark.add(recStyle, rx, lo, rx, hi)
		p.Add(mark)
		names = append(names, fmt.Sprintf("recovered (%d days after the event)", w.RecoveryDays))
		thumbs = append(thumbs, lineThumb{recStyle})
	} else {
		p.Title.Text += "\nnot back within the recovery band before the next event or the record's end"
	}
	legH := legendHeight(len(names), 2)
	h := 3.4 * vg.Inch
	return png(h+legH, func(c draw.Canvas) {
		c = pad(c)
		strip := c
		strip.Max.Y = c.Min.Y + legH
		c.Min.Y += legH
		p.Draw(c)
		legendBelow(strip, p, names, thumbs, 2)
	})
}

// monthTicks marks the first of each month, labelled in ISO 8601 form
// (YYYY-MM), every second or third month when the window is long.
type monthTicks struct{}

func (monthTicks) Ticks(lo, hi float64) []plot.Tick {
	first := calendar.Date(math.Ceil(lo))
	last := calendar.Date(math.Floor(hi))
	var starts []calendar.Date
	y, m, _ := first.Civil()
	for {
		d := calendar.New(y, m, 1)
		if d > last {
			break
		}
		if d >= first {
			starts = append(starts, d)
		}
		if m++; m > 12 {
			y, m = y+1, 1
		}
	}
	step := 1
	for len(starts)/step > 7 {
		step++
	}
	var out []plot.Tick
	for i, d := range starts {
		t := plot.Tick{Value: float64(d)}
		if i%step == 0 {
			yy, mm, _ := d.Civil()
			t.Label = fmt.Sprintf("%04d-%02d", yy, mm)
		}
		out = append(out, t)
	}
	if len(out) < 2 { // a short window: label its ends by day
		out = append(out[:0], plot.Tick{Value: float64(first), Label: first.String()}, plot.Tick{Value: float64(last), Label: last.String()})
	}
	return out
}

// band fills the area between two curves over the same x.
type band struct {
	X, Lo, Hi []float64
	Fill      color.Color
}

func (b *band) Plot(c draw.Canvas, p *plot.Plot) {
	tx, ty := p.Transforms(&c)
	pts := make([]vg.Point, 0, 2*len(b.X))
	for i, x := range b.X {
		pts = append(pts, vg.Point{X: tx(x), Y: ty(b.Hi[i])})
	}
	for i := len(b.X) - 1; i >= 0; i-- {
		pts = append(pts, vg.Point{X: tx(b.X[i]), Y: ty(b.Lo[i])})
	}
	c.FillPolygon(b.Fill, c.ClipPolygonXY(pts))
}
