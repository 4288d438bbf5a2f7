package main

import (
	"errors"
	"fmt"
	"os"
)

func main() {
	err := run(os.Args[1:], os.Stdout, os.Stderr)
	if err == nil {
		return
	}
	var ue usageError
	if errors.As(err, &ue) {
		if ue.msg != "" {
			fmt.Fprintln(os.Stderr, "rebound: "+ue.msg)
		}
		fmt.Fprintln(os.Stderr, "run 'rebound help' for usage")
		os.Exit(2)
	}
	var reported errReported
	if !errors.As(err, &reported) {
		fmt.Fprintln(os.Stderr, "rebound: "+err.Error())
	}
	os.Exit(1)
}
