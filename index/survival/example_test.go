package survival_test

import (
	"fmt"

	"rebound/index/survival"
)

// The remission times (weeks) of the 6-MP group of Freireich et al.
// (1963), the textbook Kaplan–Meier example; false marks a censored time.
// The median, 23 weeks, is the textbook value; the restricted mean to the
// last follow-up was worked by hand as the area under the steps.
func ExampleKaplanMeier() {
	weeks := []float64{6, 6, 6, 6, 7, 9, 10, 10, 11, 13, 16, 17, 19, 20, 22, 23, 25, 32, 32, 34, 35}
	relapsed := []bool{true, true, true, false, true, false, true, false, false, true, true, false, false,
		false, true, true, false, false, false, false, false}
	c := survival.KaplanMeier(weeks, relapsed)
	m, ok := c.Median()
	fmt.Println("median:", m, ok)
	fmt.Printf("S(10) = %.3f\n", c.At(10))
	fmt.Printf("RMST to %g weeks: %.2f\n", c.MaxTime, c.RMST(c.MaxTime))
	// Output:
	// median: 23 true
	// S(10) = 0.753
	// RMST to 35 weeks: 23.29
}
