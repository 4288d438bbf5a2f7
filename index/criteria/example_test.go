package criteria_test

import (
	"fmt"

	"rebound/index/calendar"
	"rebound/index/criteria"
	"rebound/index/series"
)

func ExampleEvaluate() {
	s := &series.Station{
		ID:    "RIVER-A",
		Start: calendar.New(2021, 7, 1),
		Days:  10,
		Vars: map[string][]float64{
			"water_temperature_max": {14.2, 15.1, 16.8, 17.5, 18.9, 19.4, 18.1, 17.0, 16.2, 15.5},
		},
	}
	o := criteria.DefaultOptions()
	o.Criteria = []criteria.Criterion{{Name: "core juvenile rearing", Limit: 16}}
	r, err := criteria.Evaluate(s, o)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: max %s %.2f °C on %v\n", r.Station, r.Basis, r.Max, r.MaxDate)
	for _, p := range r.Criteria {
		fmt.Printf("%s (%g °C): %d of %d days above, reliability %.2f, vulnerability %.2f °C\n",
			p.Name, p.Limit, p.DaysAbove, p.Days, p.Reliability, p.Vulnerability)
	}
	// Output:
	// RIVER-A: max 7DADM 17.70 °C on 2021-07-09
	// core juvenile rearing (16 °C): 4 of 4 days above, reliability 0.00, vulnerability 1.70 °C
}

func ExampleHashimoto() {
	tmax := []float64{18, 19, 21, 22, 20, 19, 23, 24, 22, 19, 18, 21, 19, 18, 17, 22, 23, 21, 20, 19}
	r := criteria.Hashimoto(tmax, 20)
	fmt.Printf("reliability %.2f, resilience %.4f, vulnerability %.1f °C (mean per day %.4f, largest %g)\n",
		r.Reliability, r.Resilience, r.Vulnerability, r.MeanExcess, r.MaxExcess)
	// Output:
	// reliability 0.55, resilience 0.4444, vulnerability 2.5 °C (mean per day 2.1111, largest 4)
}
