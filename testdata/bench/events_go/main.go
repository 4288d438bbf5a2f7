// Command events_go times index/events and index/criteria with their
// default options on a long CSV of daily series, for comparison with
// events_pandas.py on the same file. It is not part of the build (it lives
// under testdata) and not run in CI.
//
//	go run ./testdata/bench/events_go [-workers n] [-out dir] [-cpuprofile f] SERIES.csv
package main

import (
	"bufio"
	"flag"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"runtime/pprof"
	"strconv"
	"sync"
	"time"

	"rebound/index/criteria"
	"rebound/index/events"
	"rebound/index/series"
)

type result struct {
	rows []events.Row
	crit criteria.Result
}

func main() {
	workers := flag.Int("workers", runtime.GOMAXPROCS(0), "goroutines")
	out := flag.String("out", ".", "directory for events_go.csv and criteria_go.csv")
	prof := flag.String("cpuprofile", "", "write a CPU profile to this file")
	flag.Parse()
	if *prof != "" {
		pf, err := os.Create(*prof)
		if err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(1)
		}
		if err := pprof.StartCPUProfile(pf); err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(1)
		}
		defer pprof.StopCPUProfile()
	}
	if flag.NArg() != 1 {
		fmt.Fprintln(os.Stderr, "usage: events_go [-workers n] [-out dir] SERIES.csv")
		os.Exit(2)
	}
	if err := run(flag.Arg(0), *out, *workers); err != nil {
		fmt.Fprintln(os.Stderr, err)
		pprof.StopCPUProfile()
		os.Exit(1)
	}
}

func run(path, out string, workers int) error {
	t0 := time.Now()
	f, err := os.Open(path)
	if err != nil {
		return err
	}
	defer f.Close()
	eo := events.DefaultOptions()
	eo.Responses = eo.Responses[:1] // water_temperature
	co := criteria.DefaultOptions()
	co.Criteria = []criteria.Criterion{{Name: "18C", Limit: 18}}
	pool := sync.Pool{New: func() any { return new(events.Analyzer) }}

	ef, err := os.Create(filepath.Join(out, "events_go.csv"))
	if err != nil {
		return err
	}
	defer ef.Close()
	cf, err := os.Create(filepath.Join(out, "criteria_go.csv"))
	if err != nil {
		return err
	}
	defer cf.Close()
	ew, cw := bufio.NewWriter(ef), bufio.NewWriter(cf)
	fmt.Fprintln(ew, "station,kind,start,end,duration_days,driver_peak,variable,peak_departure,time_to_peak_days,mean_departure,cumulative_departure,recovered,recovery_days,censor_reason,antecedent_dryness")
	fmt.Fprintln(cw, "station,days,days_above,reliability,resilience,vulnerability")
	nst, nrows := 0, 0
	opt := series.Options{Vars: []series.Var{
		{Name: series.WaterTemperature}, {Name: series.AirTemperature}, {Name: series.Discharge}}}
	_, err = series.Map(f, path, opt, workers,
		func(s *series.Station) (result, error) {
			a := pool.Get().(*events.Analyzer)
			defer pool.Put(a)
			r, err := a.Analyze(s, nil, eo)
			if err != nil {
				return result{}, err
			}
			c, err := criteria.Evaluate(s, co)
			c.Weekly = nil
			return result{rows: r.Rows(nil), crit: c}, err
		},
		func(r result) error {
			nst++
			for _, x := range r.rows {
				nrows++
				fmt.Fprintf(ew, "%s,%s,%v,%v,%d,%s,%s,%s,%d,%s,%s,%s,%d,%s,%s\n", x.Station, x.Kind, x.Start, x.End,
					x.Duration, g(x.DriverPeak), x.Variable, g(x.PeakDeparture), x.TimeToPeak, g(x.MeanDeparture),
					g(x.CumDeparture), pyBool(x.Recovered), x.RecoveryDays, x.Censor, g(x.AntecedentDryness))
			}
			c := r.crit
			if len(c.Criteria) > 0 {
				p := c.Criteria[0]
				fmt.Fprintf(cw, "%s,%d,%d,%s,%s,%s\n", c.Station, p.Days, p.DaysAbove, g(p.Reliability), g(p.Resilience), g(p.Vulnerability))
			}
			return nil
		})
	if err != nil {
		return err
	}
	if err := ew.Flush(); err != nil {
		return err
	}
	if err := cw.Flush(); err != nil {
		return err
	}
	fmt.Fprintf(os.Stderr, "total %.2f s; %d stations, %d event rows\n", time.Since(t0).Seconds(), nst, nrows)
	return nil
}

func g(x float64) string {
	if math.IsNaN(x) {
		return ""
	}
	return strconv.FormatFloat(x, 'f', 6, 64)
}

func pyBool(b bool) string {
	if b {
		return "True"
	}
	return "False"
}
