// Package demo generates rebound's demonstration scenario: an invented
// region with stations of contrasting behaviour, its attribute table, its
// disturbance events and a configuration, all from a fixed seed, so that
// every run writes the same files and the story planted in the data shows
// in the ranking.
//
// The region, Caldermoor, does not exist. Its coordinates place it in the
// open North Atlantic so that no map can mistake it for a real place. The
// demo writes fifteen years (2010–2024) of daily records, and rebound
// derives the events from them. Four basins hold five kinds of station:
//
//   - Fenwater: spring-fed upland creeks. Groundwater buffers them: small,
//     quick departures and little drought memory.
//   - Highcairn: snowmelt headwaters. Cold, but a dry winter leaves little
//     snowpack, so heat after drought warms them noticeably.
//   - Bratton: a dam tailwater below Corran Reservoir (cold releases hold
//     temperature down until a long heat wave, as in 2018, exhausts the cold
//     pool; then it warms far above normal) and the flashy urban reaches of
//     Bratton town (large departures that follow every warm spell, salt in
//     winter, oxygen sags when storms overflow the sewers).
//   - Lowmere: lowland agricultural rivers. Slow to recover and with strong
//     drought memory: the same heat wave does much more harm after the
//     multi-year drought.
package demo

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strconv"

	"rebound/index/calendar"
	"rebound/index/series"
)

// Region is the name of the invented region.
const Region = "Caldermoor, an invented region"

// ConfigName is the configuration file the demo writes.
const ConfigName = "rebound.toml"

// Seed fixes the demo data.
const Seed = 20240611

// File is one file of the scenario.
type File struct {
	Name string
	Data []byte
}

// Kind is a station's behaviour type.
type Kind int

const (
	Spring Kind = iota
	Snowmelt
	Tailwater
	Urban
	Lowland
)

func (k Kind) String() string {
	return [...]string{"spring-fed", "snowmelt headwater", "dam tailwater", "urban", "lowland agricultural"}[k]
}

// Station is one invented station.
type Station struct {
	ID, Name, Basin string
	Kind            Kind
	Lat, Lon        float64
	Elevation       float64 // m
	Area            float64 // km²
	Forest          float64 // %
	Impervious      float64 // %
	Storage         float64 // reservoir storage / mean annual flow
	BFI             float64 // baseflow index
	RecordYears     float64
}

// FirstYear and LastYear bound the demo record.
const (
	FirstYear = 2010
	LastYear  = 2024
)

var names = []struct {
	id, name, basin string
	kind            Kind
}{
	{"FEN-01", "Fenwater at Mossbank Spring", "Fenwater", Spring},
	{"FEN-02", "Fenwater below Greyling Pool", "Fenwater", Spring},
	{"FEN-03", "Tansy Brook at Holloway", "Fenwater", Spring},
	{"FEN-04", "Fenwater at Quarry Lane", "Fenwater", Spring},
	{"FEN-05", "Cresset Spring Run", "Fenwater", Spring},
	{"FEN-06", "Fenwater at Oxley Mill", "Fenwater", Spring},
	{"FEN-07", "Wickham Beck at Fenwater", "Fenwater", Spring},
	{"HIC-01", "Highcairn Burn at Scree Gap", "Highcairn", Snowmelt},
	{"HIC-02", "Corrie Water above Falls", "Highcairn", Snowmelt},
	{"HIC-03", "Highcairn Burn at Shieling", "Highcairn", Snowmelt},
	{"HIC-04", "Eskin Water at Bothy Ford", "Highcairn", Snowmelt},
	{"HIC-05", "Lantern Burn", "Highcairn", Snowmelt},
	{"HIC-06", "Highcairn Burn at Stane Bridge", "Highcairn", Snowmelt},
	{"HIC-07", "Ptarmigan Water", "Highcairn", Snowmelt},
	{"BRT-01", "Bratton below Corran Dam", "Bratton", Tailwater},
	{"BRT-02", "Bratton at Weir House", "Bratton", Tailwater},
	{"BRT-03", "Bratton at Sluice Farm", "Bratton", Tailwater},
	{"BRT-04", "Bratton at Market Bridge", "Bratton", Urban},
	{"BRT-05", "Tannery Cut at Bratton", "Bratton", Urban},
	{"BRT-06", "Gasworks Drain", "Bratton", Urban},
	{"BRT-07", "Bratton at Canal Basin", "Bratton", Urban},
	{"BRT-08", "Ropewalk Brook", "Bratton", Urban},
	{"BRT-09", "Bratton at Railway Arches", "Bratton", Urban},
	{"LOW-01", "Lowmere at Dykeside", "Lowmere", Lowland},
	{"LOW-02", "Lowmere at Sedge Fen", "Lowmere", Lowland},
	{"LOW-03", "Marram Drain at Pumping Station", "Lowmere", Lowland},
	{"LOW-04", "Lowmere at Barley Hithe", "Lowmere", Lowland},
	{"LOW-05", "Hollin River at Carr End", "Lowmere", Lowland},
	{"LOW-06", "Lowmere at Staithe", "Lowmere", Lowland},
	{"LOW-07", "Sallow Drain", "Lowmere", Lowland},
	{"LOW-08", "Lowmere at Outfall Sluice", "Lowmere", Lowland},
	{"LOW-09", "Hollin River at Witham Cross", "Lowmere", Lowland},
}

// Stations returns the invented stations with their attributes, drawn
// from rng.
func Stations(rng *rand.Rand) []Station {
	centre := map[string][2]float64{"Fenwater": {47.32, -38.41}, "Highcairn": {47.58, -38.05}, "Bratton": {47.10, -37.86}, "Lowmere": {46.88, -38.22}}
	var out []Station
	for _, n := range names {
		c := centre[n.basin]
		s := Station{ID: n.id, Name: n.name, Basin: n.basin, Kind: n.kind,
			Lat: round(c[0]+rng.NormFloat64()*0.06, 4), Lon: round(c[1]+rng.NormFloat64()*0.08, 4),
			RecordYears: float64(LastYear - FirstYear + 1)}
		u := rng.Float64
		switch n.kind {
		case Spring:
			s.Elevation, s.Area, s.Forest, s.Impervious, s.BFI = 180+120*u(), 15+60*u(), 55+30*u(), 1+3*u(), 0.72+0.15*u()
		case Snowmelt:
			s.Elevation, s.Area, s.Forest, s.Impervious, s.BFI = 650+500*u(), 20+120*u(), 30+30*u(), 0.2+0.8*u(), 0.45+0.15*u()
		case Tailwater:
			s.Elevation, s.Area, s.Forest, s.Impervious, s.BFI = 90+40*u(), 400+300*u(), 35+15*u(), 4+4*u(), 0.55+0.1*u()
			s.Storage = round(0.35+0.25*u(), 3)
		case Urban:
			s.Elevation, s.Area, s.Forest, s.Impervious, s.BFI = 40+40*u(), 8+40*u(), 5+12*u(), 28+30*u(), 0.18+0.12*u()
		case Lowland:
			s.Elevation, s.Area, s.Forest, s.Impervious, s.BFI = 5+30*u(), 150+500*u(), 4+10*u(), 3+5*u(), 0.3+0.15*u()
		}
		s.Elevation, s.Area, s.Forest, s.Impervious, s.BFI = round(s.Elevation, 0), round(s.Area, 1), round(s.Forest, 1), round(s.Impervious, 1), round(s.BFI, 2)
		out = append(out, s)
	}
	// Two stations started late: shorter records.
	out[12].RecordYears = 6 // HIC-06
	out[30].RecordYears = 8 // LOW-08
	return out
}

func round(x float64, d int) float64 {
	p := math.Pow(10, float64(d))
	return math.Round(x*p) / p
}

// Files generates every file of the scenario.
func Files() ([]File, error) {
	stations := Stations(rand.New(rand.NewPCG(Seed, 1)))
	timeline := Timeline(rand.New(rand.NewPCG(Seed, 2)))
	records := seriesStations(stations, timeline, rand.New(rand.NewPCG(Seed, 3)))

	var files []File
	attrs, err := attributesCSV(stations)
	if err != nil {
		return nil, err
	}
	files = append(files, File{"stations.csv", attrs})
	for _, v := range seriesVars {
		var buf bytes.Buffer
		var with []*series.Station
		for _, r := range records {
			if r.Vars[v] != nil {
				with = append(with, r)
			}
		}
		if err := series.WriteWide(&buf, with, v); err != nil {
			return nil, err
		}
		files = append(files, File{"series/" + v + ".csv", buf.Bytes()})
	}
	files = append(files, File{"user_events.csv", []byte(userEvents)})
	files = append(files, File{ConfigName, []byte(configText)})
	files = append(files, File{"README.txt", []byte(readme)})
	return files, nil
}

// userEvents lists a disturbance no series shows: a drawdown of Corran
// Reservoir for dam maintenance, which sends warm surface water downstream.
const userEvents = `kind,start,end,station
# A maintenance drawdown of Corran Reservoir (invented), felt below the dam.
drawdown,2015-09-01,2015-09-21,BRT-01
drawdown,2015-09-01,2015-09-21,BRT-02
drawdown,2015-09-01,2015-09-21,BRT-03
`

func attributesCSV(stations []Station) ([]byte, error) {
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	w.Write([]string{"station", "name", "latitude", "longitude", "elevation_m", "drainage_area_km2", "forest_pct",
		"impervious_pct", "reservoir_storage_ratio", "baseflow_index", "record_years", "group"})
	f := func(x float64) string { return strconv.FormatFloat(x, 'f', -1, 64) }
	for _, s := range stations {
		storage := ""
		if s.Storage > 0 {
			storage = f(s.Storage)
		}
		w.Write([]string{s.ID, s.Name, f(s.Lat), f(s.Lon), f(s.Elevation), f(s.Area), f(s.Forest),
			f(s.Impervious), storage, f(s.BFI), f(s.RecordYears), s.Basin})
	}
	w.Flush()
	return buf.Bytes(), w.Error()
}

// Disturbance is one region-wide disturbance.
type Disturbance struct {
	ID        string
	Kind      string // heatwave, drought, flood
	Start     calendar.Date
	End       calendar.Date
	Intensity float64 // heat: air anomaly °C; drought: severity 0–1; flood: peak index
}

// Timeline draws the region's disturbances. It plants a long heat wave in
// 2018, a multi-year drought from spring 2020 to autumn 2022 and a severe
// heat wave in July 2023 that strikes the still-dry lowlands.
func Timeline(rng *rand.Rand) []Disturbance {
	var ds []Disturbance
	add := func(kind string, start calendar.Date, days int, intensity float64) {
		prefix := map[string]string{"heatwave": "HW", "drought": "DR", "flood": "FL"}[kind]
		ds = append(ds, Disturbance{ID: fmt.Sprintf("%s-%s", prefix, start), Kind: kind, Start: start,
			End: start + calendar.Date(days-1), Intensity: round(intensity, 2)})
	}
	for y := FirstYear; y <= LastYear; y++ {
		// One to three summer heat waves.
		n := 1 + rng.IntN(3)
		day := calendar.New(y, 6, 5) + calendar.Date(rng.IntN(20))
		if y == 2018 || y == 2023 {
			n = 1 // the planted July heat wave follows
		}
		for range n {
			days := 4 + rng.IntN(9)
			add("heatwave", day, days, 2+3*rng.Float64())
			day += calendar.Date(days + 12 + rng.IntN(20))
		}
		// Spring and autumn floods.
		add("flood", calendar.New(y, 3, 1)+calendar.Date(rng.IntN(50)), 2+rng.IntN(4), 1+rng.Float64())
		if rng.Float64() < 0.6 {
			add("flood", calendar.New(y, 10, 10)+calendar.Date(rng.IntN(40)), 2+rng.IntN(3), 1+rng.Float64())
		}
	}
	// Planted: the long heat wave of 2018 and the one after the drought.
	add("heatwave", calendar.New(2018, 7, 20), 24, 4.5)
	add("heatwave", calendar.New(2023, 7, 8), 16, 6.0)
	// Droughts: two short ones and the multi-year drought.
	add("drought", calendar.New(2012, 7, 1), 75, 0.4)
	add("drought", calendar.New(2016, 6, 20), 90, 0.5)
	add("drought", calendar.New(2020, 4, 1), int(calendar.New(2022, 10, 15)-calendar.New(2020, 4, 1)), 0.9)
	slices.SortFunc(ds, func(a, b Disturbance) int { return int(a.Start - b.Start) })
	return ds
}
