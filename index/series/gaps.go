package series

import "math"

// FillGaps fills interior runs of at most maxGap NaN values in x by linear
// interpolation between the values on either side, and returns the number
// of values filled. Runs at the start or end of x are never filled (no
// extrapolation), nor are longer runs. maxGap <= 0 fills nothing.
func FillGaps(x []float64, maxGap int) (filled int) {
	if maxGap <= 0 {
		return 0
	}
	last := -1 // index of the last value seen
	for i, v := range x {
		if math.IsNaN(v) {
			continue
		}
		if gap := i - last - 1; last >= 0 && gap > 0 && gap <= maxGap {
			a, b := x[last], v
			for j := last + 1; j < i; j++ {
				w := float64(j-last) / float64(i-last)
				x[j] = a + w*(b-a)
			}
			filled += gap
		}
		last = i
	}
	return filled
}

// FillGaps fills the short interior gaps of every variable of s with
// FillGaps, adds the days filled to Counts.Filled and returns their total.
func (s *Station) FillGaps(maxGap int) int {
	total := 0
	for name, x := range s.Vars {
		n := FillGaps(x, maxGap)
		if n > 0 {
			c := s.Counts[name]
			if c == nil {
				c = &Counts{}
				if s.Counts == nil {
					s.Counts = map[string]*Counts{}
				}
				s.Counts[name] = c
			}
			c.Filled += n
		}
		total += n
	}
	return total
}
