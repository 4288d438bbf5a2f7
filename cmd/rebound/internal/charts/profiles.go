package charts

import (
	"fmt"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Profile is one cluster of the profile chart.
type Profile struct {
	Label string    // e.g. "cluster 1 (7 stations): cool, steady"
	Z     []float64 // mean of each standardised feature; NaN leaves a bar out
}

// Profiles draws, for each feature (one row, first at the top), a bar per
// cluster of the cluster's mean standardised value: how many standard
// deviations its stations lie above or below the mean of all stations.
// Every profile must have len(features) values; Profiles panics otherwise.
func Profiles(features []string, profiles []Profile) ([]byte, error) {
	if len(features) == 0 || len(profiles) == 0 {
		return nil, ErrNoData
	}
	k := len(profiles)
	n := len(features)
	labels := make([]string, n)
	for j, f := range features {
		labels[j] = clip(f, 36)
	}
	p := newPlot("Cluster profiles", "cluster mean (standard deviations from the mean of all stations)", "")
	nominalY(p, labels)
	bars := &rects{Outline: draw.LineStyle{Color: charcoal, Width: vg.Points(0.4)}}
	span := 0.8 / float64(k)
	lim := 1.0
	for c, pr := range profiles {
		if len(pr.Z) != n {
			panic("charts: profile length mismatch")
		}
		for j, z := range pr.Z {
			if !finite(z) {
				continue
			}
			lim = max(lim, z, -z)
			y := float64(n-1-j) + 0.4 - span*(float64(c)+0.5) // first cluster on top
			bars.R = append(bars.R, rect{X0: 0, X1: z, Y0: y - span*0.45, Y1: y + span*0.45, Fill: Category(c)})
		}
	}
	zero := &segments{}
	zero.add(draw.LineStyle{Color: Slate, Width: vg.Points(0.8)}, 0, -0.6, 0, float64(n)-0.4)
	// Faint separators between features.
	sep := &segments{}
	for j := 1; j < n; j++ {
		sep.add(draw.LineStyle{Color: light, Width: vg.Points(0.6)}, -lim*2, float64(j)-0.5, lim*2, float64(j)-0.5)
	}
	p.Add(grid(true), sep, bars, zero)
	p.X.Min, p.X.Max = -lim*1.08, lim*1.08
	p.X.Tick.Marker = intTicks{}

	var names []string
	var thumbs []plot.Thumbnailer
	for c, pr := range profiles {
		names = append(names, clip(pr.Label, 100))
		thumbs = append(thumbs, swatch{Category(c)})
	}
	cols := 1
	legH := legendHeight(len(names), cols)
	// Rows of 8 + 4k points, but no taller than a printed page allows.
	h := min(vg.Points(float64(n)*(8+4*float64(k))+80), 8.2*vg.Inch-legendHeight(len(names), cols))
	return png(h+legH, func(c draw.Canvas) {
		c = pad(c)
		strip := c
		strip.Max.Y = c.Min.Y + legH
		c.Min.Y += legH
		p.Draw(c)
		legendBelow(strip, p, names, thumbs, cols)
	})
}

// ProfileLabel is the legend text of cluster c (0-based) of size stations
// described in words.
func ProfileLabel(c, size int, words string) string {
	s := fmt.Sprintf("cluster %d (%d station", c+1, size)
	if size != 1 {
		s += "s"
	}
	s += ")"
	if words != "" {
		s += ": " + words
	}
	return s
}
