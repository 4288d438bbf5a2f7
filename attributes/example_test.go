package attributes_test

import (
	"fmt"
	"strings"

	"rebound/attributes"
)

// An invented attribute table: every problem is reported at its line and
// column; a valid table gives each numeric column by name.
func ExampleReadCSV() {
	bad := "station,name,latitude,longitude,forest_pct\n" +
		"S1,One,45.1,-30.2,61\n" +
		"S2,Two,95.0,-30.4,high\n"
	_, errs := attributes.ReadCSV(strings.NewReader(bad), "stations.csv")
	for _, err := range errs {
		fmt.Println(err)
	}

	good := "station,name,latitude,longitude,forest_pct\n" +
		"S1,One,45.1,-30.2,61\n" +
		"S2,Two,45.0,-30.4,\n"
	tab, _ := attributes.ReadCSV(strings.NewReader(good), "stations.csv")
	forest, _ := tab.Column("forest_pct")
	fmt.Println(tab.Columns, forest)
	// Output:
	// stations.csv:3:8: latitude: out of range: want decimal degrees in [-90, 90], got 95
	// stations.csv:3:19: forest_pct: want a finite number, got "high"
	// [forest_pct] [61 NaN]
}
