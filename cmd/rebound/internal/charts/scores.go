package charts

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Score is one station of the score chart.
type Score struct {
	Label string  // station identifier and name
	Score float64 // 0–100; NaN leaves the bar out
	Rank  int     // 1 = most resilient
	// Low and High bound the rank interval under varied weights (the
	// better and the worse end); 0 when there is none.
	Low, High int
}

// ScoresMax is the most stations the score chart shows; with more, it
// shows the first and last ScoresMax/2 and marks the gap.
const ScoresMax = 40

// Scores draws a horizontal bar per station, from rank 1 at the top, of its
// score; when any station has a rank interval, a second panel to the right
// draws each station's interval as a line with its base rank as a dot. stations must be in rank order. interval
// describes the interval for the axis label (for example "5th–95th
// percentile").
func Scores(stations []Score, interval string) ([]byte, error) {
	if len(stations) == 0 {
		return nil, ErrNoData
	}
	rows := stations
	gap := -1
	if len(rows) > ScoresMax {
		h := ScoresMax / 2
		rows = append(append(append([]Score(nil), stations[:h]...), Score{Label: fmt.Sprintf("… %d more …", len(stations)-2*h), Score: math.NaN()}), stations[len(stations)-h:]...)
		gap = h
	}
	n := len(rows)
	labels := make([]string, n)
	hasInterval := false
	for i, s := range rows {
		labels[i] = clip(s.Label, 34)
		if s.Low > 0 && i != gap {
			hasInterval = true
		}
	}
	title := "Resilience score by station"
	if len(stations) > n-1 && gap >= 0 {
		title = fmt.Sprintf("Score: top and bottom %d of %d stations", ScoresMax/2, len(stations))
	}

	left := newPlot(title, "score (0–100; higher = more resilient)", "")
	nominalY(left, labels)
	left.X.Min, left.X.Max = 0, 100
	left.X.Padding = 0
	bars := &rects{}
	var notes plotter.XYLabels
	for i, s := range rows {
		y := float64(n - 1 - i)
		if !finite(s.Score) {
			continue
		}
		bars.R = append(bars.R, rect{X0: 0, X1: s.Score, Y0: y - 0.36, Y1: y + 0.36, Fill: Ink})
		notes.XYs = append(notes.XYs, plotter.XY{X: s.Score, Y: y})
		notes.Labels = append(notes.Labels, fmt.Sprintf(" %.1f", s.Score))
	}
	left.Add(grid(true), bars)
	if len(notes.XYs) > 0 && n <= 45 {
		lab, err := plotter.NewLabels(notes)
		if err != nil {
			return nil, err
		}
		for i := range lab.TextStyle {
			lab.TextStyle[i] = textStyle(7, Slate)
			lab.TextStyle[i].YAlign = draw.YCenter
		}
		left.Add(lab)
		left.X.Max = 108 // room for the labels
		left.X.Tick.Marker = plot.ConstantTicks{{Value: 0, Label: "0"}, {Value: 25}, {Value: 50, Label: "50"},
			{Value: 75}, {Value: 100, Label: "100"}}
	}

	height := vg.Points(float64(n)*13 + 90)
	if !hasInterval {
		return single(left, height)
	}

	right := newPlot("Rank under varied weights", "rank (1 = most resilient)", "")
	nominalY(right, labels)
	right.Y.Tick.Marker = hideTickLabels{right.Y.Tick.Marker}
	right.Y.Tick.Length = 0
	right.Y.LineStyle.Width = 0
	right.X.Tick.Marker = intTicks{}
	right.X.Min, right.X.Max = 0.5, float64(len(stations))+0.5
	seg := &segments{}
	var dots plotter.XYs
	lineStyle := draw.LineStyle{Color: Ink, Width: vg.Points(1.6)}
	for i, s := range rows {
		if s.Low <= 0 || i == gap {
			continue
		}
		y := float64(n - 1 - i)
		seg.add(lineStyle, float64(s.Low), y, float64(s.High), y)
		dots = append(dots, plotter.XY{X: float64(s.Rank), Y: y})
	}
	right.Add(grid(true), seg)
	dot, err := plotter.NewScatter(dots)
	if err != nil {
		return nil, err
	}
	dot.GlyphStyle = draw.GlyphStyle{Color: Amber, Radius: vg.Points(3), Shape: draw.CircleGlyph{}}
	ring, _ := plotter.NewScatter(dots)
	ring.GlyphStyle = draw.GlyphStyle{Color: Ink, Radius: vg.Points(3), Shape: draw.RingGlyph{}}
	right.Add(dot, ring)

	names := []string{"rank interval under varied weights (" + interval + ")", "rank with the configured weights"}
	thumbs := []plot.Thumbnailer{lineThumb{lineStyle}, glyphThumb{draw.GlyphStyle{Color: Amber, Radius: vg.Points(3), Shape: draw.CircleGlyph{}}}}
	legH := legendHeight(len(names), 1)
	return png(height+legH, func(c draw.Canvas) {
		c = pad(c)
		strip := c
		strip.Max.Y = c.Min.Y + legH
		c.Min.Y += legH
		split := c.Min.X + (c.Max.X-c.Min.X)*0.64
		lc, rc := c, c
		lc.Max.X = split
		rc.Min.X = split + vg.Points(4)
		left.Draw(lc)
		right.Draw(rc)
		legendBelow(strip, left, names, thumbs, 1)
	})
}

// grid draws light grid lines at the major ticks of one axis.
func grid(vertical bool) *plotter.Grid {
	g := plotter.NewGrid()
	g.Vertical.Color = light
	g.Horizontal.Color = light
	if vertical {
		g.Horizontal.Width = 0
	} else {
		g.Vertical.Width = 0
	}
	return g
}
