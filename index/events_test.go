package index

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

const eventsHeader = "station,event,kind,variable,start,end,peak_departure,recovery_days,recovered,antecedent_dryness\n"

func TestReadEvents(t *testing.T) {
	text := "\uFEFF" + strings.ReplaceAll(eventsHeader[:len(eventsHeader)-1]+",note\n"+
		"S1,HW-1,heatwave,water_temperature,2021-07-01,2021-07-09,3.2,12,true,0.4,hot\n"+
		"S1,HW-1,heatwave,dissolved_oxygen,2021-07-01,2021-07-09,-1.5,20,false,,\n"+
		"\n"+
		"S2,DR-1,drought,specific_conductance,2020-08-01,2020-09-30,150,0,TRUE,1,\n"+
		"S2,DR-1,drought,water_temperature,2020-08-01,2020-09-30,,4,false,1,\n", "\n", "\r\n")
	tab, errs := ReadEvents(strings.NewReader(text), "events.csv")
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	if len(tab.Events) != 4 || !math.IsNaN(tab.Events[3].PeakDeparture) || len(tab.Extra) != 1 || tab.Extra[0] != "note" {
		t.Fatalf("got %+v", tab)
	}
	e := tab.Events[1]
	if e.Station != "S1" || e.Kind != "heatwave" || e.PeakDeparture != -1.5 || e.Recovered || !math.IsNaN(e.Dryness) || e.Line != 3 {
		t.Errorf("row 2 = %+v", e)
	}
	if e := tab.Events[2]; e.Start.String() != "2020-08-01" || e.End.String() != "2020-09-30" || !e.Recovered || e.Line != 5 {
		t.Errorf("row 3 = %+v", e)
	}
}

func TestReadEventsErrors(t *testing.T) {
	row := func(s string) string { return eventsHeader + s + "\n" }
	tests := []struct {
		name string
		text string
		want []string
	}{
		{"empty", "", []string{"e.csv: the file is empty"}},
		{"header only", eventsHeader, []string{"e.csv: the file has a header row but no data rows"}},
		{"missing columns", "station,event,kind\nS,E,K\n", []string{`e.csv:1: required column is missing: "variable", "start"`}},
		{"bad date", row("S,E,heatwave,wt,2021-02-30,2021-03-02,1,2,true,"), []string{`e.csv:2:17: start: no such calendar day, got "2021-02-30"`}},
		{"date syntax", row("S,E,heatwave,wt,07/01/2021,2021-07-02,1,2,true,"), []string{`e.csv:2:17: start: want an ISO 8601 date YYYY-MM-DD, got "07/01/2021"`}},
		{"end before start", row("S,E,heatwave,wt,2021-07-05,2021-07-01,1,2,true,"), []string{`e.csv:2:28: end: end 2021-07-01 is before start 2021-07-05`}},
		{"negative recovery", row("S,E,heatwave,wt,2021-07-01,2021-07-05,1,-3,true,"), []string{`e.csv:2:41: recovery_days: want days >= 0, got "-3"`}},
		{"recovered not boolean", row("S,E,heatwave,wt,2021-07-01,2021-07-05,1,3,yes,"), []string{`e.csv:2:43: recovered: want true or false, got "yes"`}},
		{"NaN departure", row("S,E,heatwave,wt,2021-07-01,2021-07-05,NaN,3,true,"), []string{`e.csv:2:39: peak_departure: want a finite number, got "NaN"`}},
		{"Inf dryness", row("S,E,heatwave,wt,2021-07-01,2021-07-05,1,3,true,Inf"), []string{`antecedent_dryness: want a finite number, got "Inf"`}},
		{"blank recovery", row("S,E,heatwave,wt,2021-07-01,2021-07-05,1,,true,"), []string{`recovery_days: want a number, got a blank cell`}},
		{"blank station", row(",E,heatwave,wt,2021-07-01,2021-07-05,1,3,true,"), []string{`e.csv:2:1: station: want a value, got a blank cell`}},
		{"short row", row("S,E,heatwave"), []string{`e.csv:2: want 10 fields like the header, got 3`}},
		{"every problem", row("S,E,heatwave,wt,x,2021-07-05,1,-3,maybe,") + "T,E,flood,wt,2021-01-01,2021-01-02,z,1,true,\n",
			[]string{"e.csv:2:17: start", "e.csv:2:32: recovery_days", "e.csv:2:35: recovered", "e.csv:3:36: peak_departure"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, errs := ReadEvents(strings.NewReader(tc.text), "e.csv")
			if len(errs) == 0 {
				t.Fatal("no error")
			}
			var all []string
			for _, e := range errs {
				all = append(all, e.Error())
			}
			joined := strings.Join(all, "\n")
			for _, w := range tc.want {
				if !strings.Contains(joined, w) {
					t.Errorf("want %q in:\n%s", w, joined)
				}
			}
		})
	}
}

// FuzzReadEvents: no input panics; an accepted table holds only valid rows:
// identifiers present, end not before start, a finite recovery time >= 0,
// and departure and dryness finite or blank (NaN).
func FuzzReadEvents(f *testing.F) {
	f.Add(eventsHeader + "S1,HW-1,heatwave,water_temperature,2021-07-01,2021-07-09,3.2,12,true,0.4\n")
	f.Add(eventsHeader + "S1,\"a,b\",k,v,2021-07-01,2021-07-01,0,0,0,\r\n")
	f.Add(eventsHeader + "S2,DR-1,drought,water_temperature,2020-08-01,2020-09-30,,4,false,1\n")
	f.Add("\uFEFF" + eventsHeader)
	f.Fuzz(func(t *testing.T, text string) {
		tab, errs := ReadEvents(strings.NewReader(text), "f.csv")
		for _, e := range errs {
			_ = e.Error()
		}
		if len(errs) > 0 {
			return
		}
		for _, e := range tab.Events {
			if e.Station == "" || e.ID == "" || e.Kind == "" || e.Variable == "" || e.End < e.Start ||
				!(e.RecoveryDays >= 0) || math.IsInf(e.RecoveryDays, 0) ||
				math.IsInf(e.PeakDeparture, 0) || math.IsInf(e.Dryness, 0) {
				t.Fatalf("invalid event accepted: %+v", e)
			}
		}
	})
}

func BenchmarkReadEvents(b *testing.B) {
	for _, rows := range []int{10_000, 100_000} {
		var sb strings.Builder
		sb.WriteString(eventsHeader)
		for i := range rows {
			st := i % 500
			sb.WriteString("STN-")
			sb.WriteString(strings.Repeat("0", 3))
			sb.WriteString(string(rune('A' + st%26)))
			sb.WriteString(",HW-2019-07-")
			sb.WriteString(string(rune('0' + i%10)))
			sb.WriteString(",heatwave,water_temperature,2019-07-01,2019-07-12,2.75,14,true,0.35\n")
		}
		text := sb.String()
		b.Run(strconv.Itoa(rows), func(b *testing.B) {
			b.SetBytes(int64(len(text)))
			b.ReportAllocs()
			for b.Loop() {
				if _, errs := ReadEvents(strings.NewReader(text), "bench.csv"); errs != nil {
					b.Fatal(errs[0])
				}
			}
		})
	}
}
