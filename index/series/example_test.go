package series_test

import (
	"fmt"
	"strings"

	"rebound/index/series"
)

func ExampleMap() {
	in := `station,date,variable,value,qualifier
MC-01,2021-07-01,water_temperature,68.0,
MC-01,2021-07-02,water_temperature,,
MC-01,2021-07-03,water_temperature,71.6,P
MC-01,2021-07-01,discharge,1.5,
MC-02,2021-07-01,water_temperature,64.4,
`
	opt := series.Options{
		Vars: []series.Var{
			{Name: series.WaterTemperature, Units: "degF"},
			{Name: series.Discharge, Units: "m3/s"},
		},
		Exclude: []string{"P"},
	}
	sum, err := series.Map(strings.NewReader(in), "example.csv", opt, 2,
		func(s *series.Station) (string, error) {
			return fmt.Sprintf("%s from %v, %d days: %.1f", s.ID, s.Start, s.Days, s.Vars[series.WaterTemperature]), nil
		},
		func(line string) error { fmt.Println(line); return nil })
	if err != nil {
		fmt.Println(err)
	}
	c := sum.Vars[series.WaterTemperature]
	fmt.Printf("water temperature: %d rows, %d kept, %d blank, %d excluded\n", c.Rows, c.Kept, c.Blank, c.Excluded)
	// Output:
	// MC-01 from 2021-07-01, 3 days: [20.0 NaN NaN]
	// MC-02 from 2021-07-01, 1 days: [18.0]
	// water temperature: 4 rows, 2 kept, 1 blank, 1 excluded
}

func ExampleRequirement_Check() {
	st := &series.Station{ID: "MC-01", Vars: map[string][]float64{}}
	ok, reason := series.Requirement{MinFraction: 0.8, MinYears: 5}.Check(st, series.Discharge)
	fmt.Println(ok, reason)
	// Output:
	// false discharge: no data
}
