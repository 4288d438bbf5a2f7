package charts

import (
	"image/color"
)

// The palette. Chosen for this package: a dark and a light blue, a dark
// brick red and a light amber, a mid grey and a light lilac. Neighbours in
// the list differ strongly in lightness (dark, light, dark, light, ...), so
// adjacent categories stay distinct under deuteranopia, protanopia and
// tritanopia and in greyscale.
//
//	Ink    #1D4E89  dark blue: bars, observed series
//	Amber  #F0A33A  light amber: highlights, event windows
//	Sky    #6CB4E4  light blue: second series
//	Brick  #A63A2B  dark red: recovery, cuts, warnings
//	Slate  #6E6E6E  mid grey: normals, guides
//	Lilac  #C9A9DB  light lilac: sixth category
var (
	Ink   = hex(0x1D4E89)
	Amber = hex(0xF0A33A)
	Sky   = hex(0x6CB4E4)
	Brick = hex(0xA63A2B)
	Slate = hex(0x6E6E6E)
	Lilac = hex(0xC9A9DB)
)

// Categorical lists the palette in the order categories (clusters) use it.
var Categorical = []color.NRGBA{Ink, Amber, Sky, Brick, Slate, Lilac}

// Category returns the colour of category i, cycling through Categorical.
func Category(i int) color.NRGBA {
	return Categorical[((i%len(Categorical))+len(Categorical))%len(Categorical)]
}

// Hex returns c as "#RRGGBB".
func Hex(c color.NRGBA) string {
	const digits = "0123456789ABCDEF"
	b := []byte{'#', 0, 0, 0, 0, 0, 0}
	for i, v := range []uint8{c.R, c.G, c.B} {
		b[1+2*i], b[2+2*i] = digits[v>>4], digits[v&15]
	}
	return string(b)
}

func hex(v uint32) color.NRGBA {
	return color.NRGBA{R: uint8(v >> 16), G: uint8(v >> 8), B: uint8(v), A: 255}
}

// faded returns c with opacity a (0–255).
func faded(c color.NRGBA, a uint8) color.NRGBA {
	c.A = a
	return c
}

// light is the fill of shaded bands.
var light = color.NRGBA{R: 0xE4, G: 0xE4, B: 0xE4, A: 255}

// charcoal draws the links above a dendrogram's cut.
var charcoal = hex(0x3A3A3A)
