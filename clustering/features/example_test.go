package features_test

import (
	"fmt"
	"strings"

	"rebound/clustering/features"
	"rebound/index/series"
)

func ExampleExtractor_FromLong() {
	// Ten days of invented discharge at two stations; the second has too
	// little data for the coverage asked for.
	in := `station,date,variable,value
MC-01,2021-05-01,discharge,10
MC-01,2021-05-02,discharge,12
MC-01,2021-05-03,discharge,30
MC-01,2021-05-04,discharge,22
MC-01,2021-05-05,discharge,15
MC-01,2021-05-06,discharge,11
MC-01,2021-05-07,discharge,10
MC-01,2021-05-08,discharge,25
MC-01,2021-05-09,discharge,18
MC-01,2021-05-10,discharge,12
MC-02,2021-05-01,discharge,4
`
	e, err := features.New(features.Config{
		Features: []string{"discharge.mean", "discharge.flashiness", "discharge.p90"},
		Coverage: series.Requirement{MinFraction: 0.02, MinYears: 1},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	opt := series.Options{Vars: []series.Var{{Name: series.Discharge, Units: "m3/s"}}}
	tab, _, err := e.FromLong(strings.NewReader(in), "example.csv", opt, 2)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, id := range tab.Stations {
		fmt.Printf("%s %.4f\n", id, tab.Row(i))
	}
	for _, x := range tab.Excluded {
		fmt.Printf("%s left out: %s\n", x.Station, x.Reason)
	}
	// Output:
	// MC-01 [16.5000 0.4387 25.5000]
	// MC-02 left out: discharge: 0 of 1 required years with >= 2% of days
}

func ExampleAvailable() {
	for _, f := range features.Available(series.Var{Name: series.Discharge, Units: "cfs"})[9:] {
		fmt.Printf("%s (%s): %s\n", f.Name, f.Units, f.Definition)
	}
	// Output:
	// discharge.flashiness (1): Richards–Baker flashiness index
	// discharge.bfi (1): baseflow index by the Lyne–Hollick filter
	// discharge.q90_q50 (1): low-flow ratio Q90/Q50 (flow exceeded 90% / 50% of days)
}
