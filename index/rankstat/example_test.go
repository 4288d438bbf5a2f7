package rankstat_test

import (
	"fmt"

	"rebound/index/rankstat"
)

func ExampleRanks() {
	scores := []float64{0.61, 0.94, 0.61, 0.05}
	fmt.Println(rankstat.Ranks(nil, scores))
	fmt.Println(rankstat.Order(nil, scores))
	// Output:
	// [2 1 2 4]
	// [1 0 2 3]
}

func ExampleSpearman() {
	// Two rankings of the same ten stations, with ties.
	x := []float64{1, 2, 2, 3, 4, 5, 5, 5, 6, 7}
	y := []float64{2, 1, 3, 3, 5, 4, 6, 6, 8, 7}
	fmt.Printf("rho = %.4f\n", rankstat.Spearman(x, y))
	fmt.Printf("tau-b = %.4f\n", rankstat.KendallTauB(x, y))
	// Output:
	// rho = 0.9257
	// tau-b = 0.8098
}
