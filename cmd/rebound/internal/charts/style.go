package charts

import (
	"bytes"
	"errors"
	"fmt"
	"image/color"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// Width is the width of every figure, and DPI its resolution: 6.5 inches
// at 180 dots per inch is 1170 pixels.
const (
	Width = 6.5 * vg.Inch
	DPI   = 180
)

// Font sizes, in points.
const (
	titleSize = 12
	labelSize = 10
	tickSize  = 9
)

var (
	sans     = font.Font{Typeface: "Liberation", Variant: "Sans"}
	sansBold = func() font.Font { f := sans; f.Weight = 700; return f }()
)

// ErrNoData is returned when there is nothing to draw.
var ErrNoData = errors.New("charts: nothing to draw")

// newPlot returns a plot with the package's fonts and labels.
func newPlot(title, xLabel, yLabel string) *plot.Plot {
	p := plot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font = font.From(sansBold, titleSize)
	p.Title.Padding = vg.Points(6)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Label.TextStyle.Font = font.From(sans, labelSize)
		a.Tick.Label.Font = font.From(sans, tickSize)
		a.Label.Padding = vg.Points(4)
	}
	p.X.Label.Text, p.Y.Label.Text = xLabel, yLabel
	p.Legend.TextStyle.Font = font.From(sans, tickSize)
	p.X.Tick.Marker, p.Y.Tick.Marker = numTicks{}, numTicks{}
	return p
}

func textStyle(size vg.Length, c color.Color) text.Style {
	return text.Style{Color: c, Font: font.From(sans, size), Handler: plot.DefaultTextHandler}
}

// png renders a figure of the package's width and height h, calling draw
// on the whole canvas. gonum's plot panics on some degenerate inputs; such
// a panic becomes an error.
func png(h vg.Length, drawFn func(c draw.Canvas)) (out []byte, err error) {
	defer func() {
		if v := recover(); v != nil {
			out, err = nil, fmt.Errorf("charts: %v", v)
		}
	}()
	img := vgimg.NewWith(vgimg.UseWH(Width, h), vgimg.UseDPI(DPI), vgimg.UseBackgroundColor(color.White))
	drawFn(draw.New(img))
	var buf bytes.Buffer
	if _, err := (vgimg.PngCanvas{Canvas: img}).WriteTo(&buf); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// single renders one plot over the whole figure.
func single(p *plot.Plot, h vg.Length) ([]byte, error) {
	return png(h, func(c draw.Canvas) { p.Draw(pad(c)) })
}

// pad keeps a small white margin around a figure.
func pad(c draw.Canvas) draw.Canvas {
	m := vg.Points(6)
	return draw.Crop(c, m, -m, m, -m)
}

// nominalY labels integer positions 0..len(labels)−1 of the y axis, the
// first label at the top.
func nominalY(p *plot.Plot, labels []string) {
	n := len(labels)
	ticks := make(plot.ConstantTicks, n)
	for i, l := range labels {
		ticks[i] = plot.Tick{Value: float64(n - 1 - i), Label: l}
	}
	p.Y.Tick.Marker = ticks
	p.Y.Min, p.Y.Max = -0.6, float64(n)-0.4
	p.Y.Padding = 0
}

// hideTickLabels keeps an axis's ticks but blanks their labels.
type hideTickLabels struct{ plot.Ticker }

func (h hideTickLabels) Ticks(lo, hi float64) []plot.Tick {
	t := h.Ticker.Ticks(lo, hi)
	for i := range t {
		t[i].Label = ""
	}
	return t
}

// intTicks puts ticks on whole numbers only, at most about 8 of them.
type intTicks struct{}

func (intTicks) Ticks(lo, hi float64) []plot.Tick {
	return wholeTicks(lo, hi, false)
}

func wholeTicks(lo, hi float64, abs bool) []plot.Tick {
	span := hi - lo
	step := 1.0
	for _, s := range []float64{1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000} {
		step = s
		if span/s <= 8 {
			break
		}
	}
	var out []plot.Tick
	for v := math.Ceil(lo/step) * step; v <= hi+1e-9; v += step {
		w := math.Round(v)
		if abs {
			w = math.Abs(w)
		}
		out = append(out, plot.Tick{Value: v, Label: strconv.Itoa(int(w))})
	}
	return out
}

// numTicks are gonum's default ticks labelled in the shortest form
// ("50", not "50.00").
type numTicks struct{}

func (numTicks) Ticks(lo, hi float64) []plot.Tick {
	t := plot.DefaultTicks{}.Ticks(lo, hi)
	for i := range t {
		if t[i].Label != "" {
			t[i].Label = strconv.FormatFloat(t[i].Value, 'g', 4, 64)
		}
	}
	return t
}

// absTicks labels the default ticks with absolute values (for an axis that
// runs both ways from zero).
type absTicks struct{}

func (absTicks) Ticks(lo, hi float64) []plot.Tick {
	return wholeTicks(lo, hi, true)
}

// clip shortens s to n runes with an ellipsis.
func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// finite reports whether every x is a finite number.
func finite(xs ...float64) bool {
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}
