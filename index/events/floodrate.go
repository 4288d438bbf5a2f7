package events

import (
	"errors"
	"math"

	"rebound/index/calendar"
)

// rateFloods sets the return periods and class of the floods evs from the
// annual maxima of q (the record starting on start).
func rateFloods(evs []Event, q []float64, start calendar.Date, o Severity) error {
	for k := range evs {
		evs[k].ReturnPeriod = math.NaN()
	}
	return errors.New("not yet")
}
