package charts

import (
	"bytes"
	"fmt"
	stdpng "image/png"
	"os"
	"path/filepath"
	"testing"
)

// check decodes a PNG and checks its width (6.5 in at DPI) and that its
// height lies in [minH, maxH] inches. With REBOUND_CHARTS=dir set, it also
// writes the image there, for looking at it.
func check(t *testing.T, name string, data []byte, minH, maxH float64) {
	t.Helper()
	img, err := stdpng.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	b := img.Bounds()
	if b.Dx() != 1170 {
		t.Errorf("%s: %d px wide, want 1170 (6.5 in at 180 dpi)", name, b.Dx())
	}
	if h := float64(b.Dy()) / DPI; h < minH || h > maxH {
		t.Errorf("%s: %.2f in tall, want %.1f to %.1f", name, h, minH, maxH)
	}
	if dir := os.Getenv("REBOUND_CHARTS"); dir != "" {
		os.WriteFile(filepath.Join(dir, name+".png"), data, 0o644)
	}
}

func TestDeterministic(t *testing.T) {
	a, err := Scores(scores(20, true), "5th–95th percentile")
	if err != nil {
		t.Fatal(err)
	}
	b, _ := Scores(scores(20, true), "5th–95th percentile")
	if !bytes.Equal(a, b) {
		t.Error("the same data gave different bytes")
	}
}

func BenchmarkScores(b *testing.B) {
	for _, n := range []int{32, 1000} {
		data := scores(n, true)
		b.Run(fmt.Sprint("stations=", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Scores(data, "5th–95th percentile"); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
