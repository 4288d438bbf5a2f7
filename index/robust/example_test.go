package robust_test

import (
	"fmt"

	"rebound/index/robust"
)

func ExampleSelectQuantile() {
	// Ten days of invented flows (m³/s); the 10th and 90th percentiles are
	// numpy.percentile's (numpy 1.24.2, linear interpolation).
	q := []float64{10, 12, 30, 22, 15, 11, 10, 25, 18, 12}
	fmt.Println(robust.SelectQuantile(q, 0.1), robust.SelectQuantile(q, 0.9))
	// Output: 10 25.5
}

func ExampleSelection() {
	// Three percentiles of one sample (invented flows, m³/s); each
	// selection narrows the next. Values from numpy.quantile 1.24.2.
	var s robust.Selection
	s.Reset([]float64{15, 14, 13, 12, 11, 9, 8, 7, 8, 9, 11, 10.5, 9.5, 8, 6, 5, 7, 12, 14, 13})
	fmt.Println(s.Quantile(0.9), s.Quantile(0.5), s.Quantile(0.1))
	// Output: 14 10 6.9
}
