package charts

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"rebound/clustering"
)

// DendrogramLabelsMax is the most leaves the dendrogram labels; beyond it
// the leaves are drawn without names.
const DendrogramLabelsMax = 80

// Dendrogram draws the tree d of hierarchical clustering with its leaves
// (labels, one per item) along the bottom and merge heights up the side,
// cut into k clusters: a dashed line marks the cut, and the branches below
// it take their cluster's colour (clusters numbered as d.Cut numbers them).
// yLabel names the height's quantity and unit (for example "Ward linkage
// distance (standardised features)"). It panics if len(labels) != d.N.
func Dendrogram(d *clustering.Dendrogram, labels []string, k int, yLabel string) ([]byte, error) {
	if d == nil || d.N == 0 {
		return nil, ErrNoData
	}
	if len(labels) != d.N {
		panic("charts: dendrogram labels length mismatch")
	}
	n := d.N
	if len(d.Merges) != n-1 {
		return nil, fmt.Errorf("charts: dendrogram of %d items has %d merges, want %d", n, len(d.Merges), n-1)
	}
	cut := d.Cut(nil, k)

	// Leaf order: depth-first from the root, left child first, as scipy's
	// dendrogram draws it; a node sits midway over its children.
	x := make([]float64, 2*n-1)
	h := make([]float64, 2*n-1)
	leafOf := make([]int, 2*n-1) // any leaf below the node, for its cluster
	order := make([]int, 0, n)
	var walk func(node int)
	walk = func(node int) {
		if node < n {
			x[node] = float64(len(order))
			leafOf[node] = node
			order = append(order, node)
			return
		}
		m := d.Merges[node-n]
		walk(m.A)
		walk(m.B)
		x[node] = (x[m.A] + x[m.B]) / 2
		h[node] = m.Height
		leafOf[node] = leafOf[m.A]
	}
	if n == 1 {
		walk(0)
	} else {
		walk(2*n - 2)
	}
	for _, v := range h {
		if !finite(v) {
			return nil, fmt.Errorf("charts: dendrogram height %g", v)
		}
	}

	// The cut lies between the merge that stays and the first one undone.
	k = min(max(k, 1), n)
	top := 1.0
	if n > 1 {
		top = d.Merges[n-2].Height
	}
	cutH := math.NaN()
	if k > 1 && n > 1 {
		below := 0.0
		if n-k-1 >= 0 {
			below = d.Merges[n-k-1].Height
		}
		cutH = (below + d.Merges[n-k].Height) / 2
	}

	p := newPlot(fmt.Sprintf("Hierarchical clustering of %d stations, cut into %d clusters", n, k), "", yLabel)
	seg := &segments{}
	above := draw.LineStyle{Color: charcoal, Width: vg.Points(1)}
	for i, m := range d.Merges {
		node := n + i
		style := above
		if !(m.Height > cutH) {
			style = draw.LineStyle{Color: Category(cut[leafOf[node]]), Width: vg.Points(1.6)}
		}
		seg.add(style, x[m.A], h[m.A], x[m.A], m.Height, x[m.B], m.Height, x[m.B], h[m.B])
	}
	p.Add(grid(false), seg)
	if !math.IsNaN(cutH) {
		line := &segments{}
		line.add(draw.LineStyle{Color: Brick, Width: vg.Points(1.2), Dashes: []vg.Length{vg.Points(5), vg.Points(3)}}, -0.5, cutH, float64(n)-0.5, cutH)
		p.Add(line)
	}
	p.X.Min, p.X.Max = -0.6, float64(n)-0.4
	p.Y.Min, p.Y.Max = 0, top*1.05
	if top == 0 {
		p.Y.Max = 1
	}
	ticks := plot.ConstantTicks{}
	if n <= DendrogramLabelsMax {
		for pos, leaf := range order {
			ticks = append(ticks, plot.Tick{Value: float64(pos), Label: clip(labels[leaf], 16)})
		}
		p.X.Tick.Label.Rotation = math.Pi / 2
		p.X.Tick.Label.XAlign = draw.XRight
		p.X.Tick.Label.YAlign = draw.YCenter
		if n > 40 {
			p.X.Tick.Label.Font.Size = 7
		}
	} else {
		p.X.Label.Text = fmt.Sprintf("%d stations (too many to name)", n)
	}
	p.X.Tick.Marker = ticks

	var names []string
	var thumbs []plot.Thumbnailer
	sizes := make([]int, k)
	for _, c := range cut {
		sizes[c]++
	}
	for c := range k {
		names = append(names, fmt.Sprintf("cluster %d (%d stations)", c+1, sizes[c]))
		thumbs = append(thumbs, lineThumb{draw.LineStyle{Color: Category(c), Width: vg.Points(2.5)}})
	}
	if !math.IsNaN(cutH) {
		names = append(names, fmt.Sprintf("cut at height %.3g", cutH))
		thumbs = append(thumbs, lineThumb{draw.LineStyle{Color: Brick, Width: vg.Points(1.2), Dashes: []vg.Length{vg.Points(5), vg.Points(3)}}})
	}
	legH := legendHeight(len(names), 3)
	height := 3.6 * vg.Inch
	return png(height+legH, func(c draw.Canvas) {
		c = pad(c)
		strip := c
		strip.Max.Y = c.Min.Y + legH
		c.Min.Y += legH
		p.Draw(c)
		legendBelow(strip, p, names, thumbs, 3)
	})
}
