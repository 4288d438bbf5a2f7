package rankstat

import (
	"encoding/binary"
	"math"
	"slices"
	"testing"
)

// FuzzRanks reads scores as raw float64 bits (any NaN payload, signed
// zeros, subnormals, infinities) and checks Ranks and Order against the
// definition of competition ranking, and MidRanks against its sum.
func FuzzRanks(f *testing.F) {
	seed := func(x ...float64) []byte {
		var b []byte
		for _, v := range x {
			b = binary.LittleEndian.AppendUint64(b, math.Float64bits(v))
		}
		return b
	}
	f.Add(seed(1, 2, 2, 3))
	f.Add(seed(math.NaN(), math.Copysign(0, -1), 0, math.Inf(-1), 5e-324))
	f.Add(append(seed(0.5), 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff)) // a negative NaN
	f.Fuzz(func(t *testing.T, data []byte) {
		x := make([]float64, 0, len(data)/8)
		for len(data) >= 8 && len(x) < 600 {
			x = append(x, math.Float64frombits(binary.LittleEndian.Uint64(data)))
			data = data[8:]
		}
		var r Ranker
		got := r.Ranks(nil, x)
		if want := naiveRanks(x); !slices.Equal(got, want) {
			t.Fatalf("Ranks(%v) = %v, want %v", x, got, want)
		}
		order := r.Order()
		for i := 1; i < len(order); i++ {
			a, b := order[i-1], order[i]
			if got[a] > got[b] || got[a] == got[b] && a > b {
				t.Fatalf("Order puts %d before %d", a, b)
			}
		}
		// Midranks of the m non-NaN scores sum to m(m+1)/2.
		var sum float64
		m := 0
		for _, v := range MidRanks(nil, x) {
			if !math.IsNaN(v) {
				sum += v
				m++
			}
		}
		if want := float64(m*(m+1)) / 2; sum != want {
			t.Fatalf("midranks sum to %v, want %v", sum, want)
		}
	})
}
