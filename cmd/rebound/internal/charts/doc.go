// Package charts draws the figures of rebound's planning memo as PNG images
// with gonum.org/v1/plot: station scores with their rank intervals, the
// one-at-a-time tornado, the dendrogram with its cut, the cluster profiles,
// and one station's departure from normal and recovery around an event.
//
// Every function takes plain data and returns the PNG bytes; nothing is
// read from or written to disk. Figures are 6.5 inches wide (a printed page
// less its margins) at 180 dots per inch, with text of 9 to 12 points, so
// they stay legible when printed at full width. Every axis names its
// quantity and unit. The colours (see the palette in palette.go) differ in
// lightness as well as in hue, so that they stay apart for readers with the
// common colour-vision deficiencies and in greyscale print; series that
// must be told apart also differ in marker shape or line dash.
//
// The same data give the same bytes: no clock, no map iteration, and the
// fonts are the Liberation fonts embedded in gonum's plot package.
package charts
