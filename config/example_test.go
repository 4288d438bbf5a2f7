package config_test

import (
	"fmt"

	"rebound/config"
)

// Decode fills in the defaults and Validate lists every problem, each
// placed at its line and column with the closest valid choice.
func ExampleDecode() {
	text := `[inputs]
events = "events.csv"
attributes = "stations.csv"

[[indicator]]
name = "recovery"
measure = "recovry"
weight = 1
`
	cfg, errs := config.Decode(text, "study.toml")
	if len(errs) == 0 {
		errs = cfg.Validate()
	}
	for _, err := range errs {
		fmt.Println(err)
	}
	fmt.Println(cfg.Normalization.Method, cfg.Aggregation.Method, cfg.Missing.Policy)
	// Output:
	// study.toml:7:11: indicator[1].measure: want one of "magnitude", "recovery", "memory", "response_slope", "frequency", "attribute", "criterion", got "recovry" (did you mean "recovery"?)
	// minmax arithmetic renormalize
}
