package demo

import (
	"math"
	"math/rand/v2"
	"slices"

	"rebound/index/calendar"
	"rebound/index/series"
)

// The daily model behind the demo records. It is a caricature built to make
// each kind of station behave as the package comment says, not a
// hydrological model to learn from:
//
//   - Air temperature is a seasonal cycle plus autocorrelated weather shared
//     by the region, an offset per basin and elevation, and the heat waves of
//     the timeline added on top.
//   - Rain falls on random days, less often in summer, hardly at all during
//     droughts and heat waves, and in large amounts at the floods of the
//     timeline. Highcairn stores winter precipitation as snow and melts it
//     by degree days.
//   - Discharge is the outflow of a slow store (groundwater) plus a fast
//     store (quickflow). Their time constants set the kind: springs drain a
//     large slow store, urban reaches are almost all quickflow, lowland
//     stores drain over many months, so a long drought leaves them low for
//     a year or more. The tailwater is a regulated release.
//   - Water temperature relaxes towards an equilibrium set by air
//     temperature, groundwater, meltwater and low flow, at a rate that is
//     fast for urban reaches and slow for lowland rivers. The tailwater
//     releases cold water until a hot summer exhausts the reservoir's cold
//     pool, then warms.
//   - Conductance rises as flow falls (less dilution), more so where
//     evaporation concentrates lowland water and where winter road salt
//     washes off town streets. Dissolved oxygen follows saturation at the
//     water temperature, less deficits: low flow in the lowlands, storm
//     overflows in town, hypolimnetic water below the dam.

// Variables written by the demo, in file order.
var seriesVars = []string{"air_temperature", "discharge", "water_temperature", "water_temperature_max",
	"specific_conductance", "dissolved_oxygen"}

// noMax lists the kinds whose loggers record daily means only (their
// criteria use the 7-day mean of daily means).
var noMax = map[Kind]bool{Lowland: true}

type kindModel struct {
	airOffset  float64 // °C relative to the regional air temperature
	slowTau    float64 // days: slow store time constant
	quickTau   float64 // days: fast store time constant
	slowShare  float64 // share of effective rain to the slow store
	runoffMM   float64 // mean daily flow per km² scale
	twRate     float64 // per day: relaxation of water temperature
	diel       float64 // °C: daily maximum above the daily mean
	condBase   float64 // µS/cm at median flow
	condExp    float64 // dilution exponent
	doDeficit  float64 // mg/L below saturation, typical
	noiseTW    float64
	lowFlowHot float64 // °C added at zero flow relative to the median
	memAmp     float64 // extra warming per °C of warm-air anomaly in a fully dry basin
}

var kindModels = map[Kind]kindModel{
	Spring:    {airOffset: 0, slowTau: 160, quickTau: 2, slowShare: 0.85, twRate: 0.35, diel: 0.4, condBase: 430, condExp: 0.05, doDeficit: 0.3, noiseTW: 0.15, lowFlowHot: 0.3, memAmp: 0.05},
	Snowmelt:  {airOffset: -4, slowTau: 45, quickTau: 2, slowShare: 0.55, twRate: 0.4, diel: 1.6, condBase: 65, condExp: 0.25, doDeficit: 0.2, noiseTW: 0.15, lowFlowHot: 1.2, memAmp: 0.1},
	Tailwater: {airOffset: 1, slowTau: 90, quickTau: 4, slowShare: 0.6, twRate: 0.5, diel: 0.8, condBase: 260, condExp: 0.1, doDeficit: 0.4, noiseTW: 0.1, lowFlowHot: 0.5},
	Urban:     {airOffset: 1.5, slowTau: 25, quickTau: 0.8, slowShare: 0.2, twRate: 0.6, diel: 2.6, condBase: 720, condExp: 0.25, doDeficit: 1.0, noiseTW: 0.25, lowFlowHot: 0.8, memAmp: 0.05},
	Lowland:   {airOffset: 1.5, slowTau: 420, quickTau: 5, slowShare: 0.7, twRate: 0.12, diel: 1.5, condBase: 560, condExp: 0.35, doDeficit: 1.4, noiseTW: 0.15, lowFlowHot: 1.0, memAmp: 0.5},
}

// doSat is the dissolved-oxygen concentration at saturation (mg/L) in fresh
// water at sea level, a cubic fit good to a few hundredths of a mg/L over
// 0–30 °C (a common approximation, from memory; used only to shape the
// invented data).
func doSat(t float64) float64 {
	return 14.62 - 0.3898*t + 0.006969*t*t - 0.00005897*t*t*t
}

// region holds the drivers shared by every station.
type region struct {
	first   calendar.Date
	days    int
	weather []float64 // °C anomaly shared by the region
	heat    []float64 // °C added by heat waves
	drought []bool    // inside a drought of the timeline
	flood   []float64 // mm of flood rain on the day
}

func newRegion(ds []Disturbance, rng *rand.Rand) *region {
	first := calendar.New(FirstYear, 1, 1)
	days := int(calendar.New(LastYear, 12, 31)-first) + 1
	g := &region{first: first, days: days, weather: make([]float64, days), heat: make([]float64, days),
		drought: make([]bool, days), flood: make([]float64, days)}
	const phi, sd = 0.8, 2.4
	w := rng.NormFloat64() * sd
	for i := range days {
		w = phi*w + math.Sqrt(1-phi*phi)*sd*rng.NormFloat64()
		g.weather[i] = w
	}
	for _, d := range ds {
		a, b := int(d.Start-first), int(d.End-first)
		switch d.Kind {
		case "heatwave":
			for i := a - 2; i <= b+2; i++ {
				if i < 0 || i >= days {
					continue
				}
				ramp := 1.0
				if i < a {
					ramp = float64(i-a+3) / 3
				} else if i > b {
					ramp = float64(b+3-i) / 3
				}
				g.heat[i] = math.Max(g.heat[i], d.Intensity*ramp)
			}
		case "drought":
			for i := max(a, 0); i <= min(b, days-1); i++ {
				g.drought[i] = true
			}
		case "flood":
			for i := max(a, 0); i <= min(b, days-1); i++ {
				g.flood[i] = 25 + 35*d.Intensity*rng.Float64()
			}
		}
	}
	return g
}

func (g *region) seasonalAir(i int) float64 {
	doy := float64((g.first + calendar.Date(i)).DayOfYear())
	return 9.5 + 11*math.Cos(2*math.Pi*(doy-200)/365.25)
}

// basinRain draws one basin's daily rain in mm.
func (g *region) basinRain(rng *rand.Rand) []float64 {
	rain := make([]float64, g.days)
	for i := range rain {
		doy := float64((g.first + calendar.Date(i)).DayOfYear())
		p := 0.34 - 0.12*math.Cos(2*math.Pi*(doy-200)/365.25) // wetter in winter
		if g.drought[i] {
			p *= 0.25
		}
		if g.heat[i] > 0 {
			p *= 0.1
		}
		if rng.Float64() < p {
			rain[i] = rng.ExpFloat64() * 7
		}
		rain[i] += g.flood[i]
	}
	return rain
}

// droughtLag is how long after a regional drought ends a basin still
// behaves as dry: groundwater and soils recover slowly in the lowlands, and
// a dry winter leaves the mountains short of snow.
var droughtLag = map[Kind]int{Spring: 0, Snowmelt: 90, Tailwater: 0, Urban: 0, Lowland: 240}

// dryMemory returns, for every day, the fraction of the previous 365 days
// that a basin of kind k spent in (or still recovering from) a regional
// drought.
func (g *region) dryMemory(k Kind) []float64 {
	dry := make([]bool, g.days)
	for i := range dry {
		if g.drought[i] {
			for j := i; j < min(g.days, i+droughtLag[k]+1); j++ {
				dry[j] = true
			}
		}
	}
	out := make([]float64, g.days)
	count := 0
	for i := range out {
		if i > 0 && dry[i-1] {
			count++
		}
		if i > 365 && dry[i-366] {
			count--
		}
		out[i] = float64(count) / 365
	}
	return out
}

// seriesStations generates every station's daily record.
func seriesStations(stations []Station, ds []Disturbance, rng *rand.Rand) []*series.Station {
	g := newRegion(ds, rng)
	basinRain := map[string][]float64{}
	basinNoise := map[string][]float64{}
	for _, b := range []string{"Fenwater", "Highcairn", "Bratton", "Lowmere"} {
		basinRain[b] = g.basinRain(rng)
		n := make([]float64, g.days)
		x := 0.0
		for i := range n {
			x = 0.6*x + 0.5*rng.NormFloat64()
			n[i] = x
		}
		basinNoise[b] = n
	}
	var out []*series.Station
	for k, s := range stations {
		out = append(out, stationSeries(g, s, k, basinRain[s.Basin], basinNoise[s.Basin], rng))
	}
	return out
}

func stationSeries(g *region, s Station, index int, rain, noise []float64, rng *rand.Rand) *series.Station {
	m := kindModels[s.Kind]
	n := g.days
	air := make([]float64, n)
	lapse := -0.0055 * (s.Elevation - 200) // °C per m, common practice
	for i := range n {
		air[i] = g.seasonalAir(i) + m.airOffset + lapse*0.3 + g.weather[i] + noise[i] + g.heat[i]
	}

	// Hydrology: snow, a slow and a fast store.
	q := make([]float64, n)
	slowFrac := make([]float64, n) // slow store relative to its long-run mean
	var snow, slow, quick float64
	slow = m.slowTau * 1.2 // start near equilibrium
	for i := range n {
		water := rain[i]
		melt := 0.0
		if s.Kind == Snowmelt {
			if air[i] < 0.5 {
				snow += water
				water = 0
			}
			melt = math.Min(snow, 3.5*math.Max(0, air[i]-0.5))
			snow -= melt
		}
		et := 0.09 * math.Max(0, air[i]) // mm/day lost from the slow store
		eff := water + melt
		slow = math.Max(0, slow+m.slowShare*eff-slow/m.slowTau-et*math.Min(1, slow/(m.slowTau*0.8)))
		quick += (1 - m.slowShare) * eff
		out := quick / (m.quickTau + 1)
		quick -= out
		mm := slow/m.slowTau + out
		q[i] = mm * s.Area * 1000 / 86400 // mm/day over km² → m³/s
		slowFrac[i] = slow / (m.slowTau * 1.2)
	}
	if s.Kind == Urban {
		// Treated wastewater keeps town streams flowing in droughts.
		mean := meanOf(q)
		for i := range q {
			q[i] += 0.25 * mean
		}
	}
	if s.Kind == Tailwater {
		// A regulated release: a steady base flow plus an attenuated share
		// of the inflow.
		mean := meanOf(q)
		sm := 0.0
		for i := range q {
			sm += (q[i] - sm) / 20
			q[i] = 0.55*mean + 0.35*sm + 0.1*q[i]
		}
	}
	qMed := medianOf(q)

	memory := g.dryMemory(s.Kind)

	// Water temperature.
	tw := make([]float64, n)
	twMax := make([]float64, n)
	cond := make([]float64, n)
	do := make([]float64, n)
	airSmooth := air[0]
	t := 8.0
	coldPool := 1.0
	// Distance below the dam: the farther, the more the river warms
	// towards the air on its way.
	mix := map[string]float64{"BRT-01": 0.1, "BRT-02": 0.25, "BRT-03": 0.4}[s.ID]
	heatStore := 0.0 // lowland: heat held by shallow backwaters and slow flow
	for i := range n {
		airSmooth += (air[i] - airSmooth) / 5
		lowFlow := math.Max(0, 1-q[i]/qMed)
		var eq float64
		switch s.Kind {
		case Spring:
			eq = 10.5 + 0.1*(airSmooth-10.5) + m.lowFlowHot*lowFlow
		case Snowmelt:
			eq = 0.5 + 0.7*math.Max(0, airSmooth) + m.lowFlowHot*lowFlow
			if snow > 20 {
				eq -= math.Min(4, snow/100) // meltwater keeps the stream cold
			}
		case Tailwater:
			date := g.first + calendar.Date(i)
			if date.DayOfYear() == 300 {
				coldPool = 1 // autumn turnover refills the cold pool
			}
			if date.DayOfYear() > 120 && date.DayOfYear() < 300 {
				coldPool -= 0.0025 + 0.009*math.Max(0, air[i]-22)
			}
			coldPool = math.Max(0, coldPool)
			release := 8.0 + 2*(1-coldPool)
			if coldPool < 0.2 {
				release += (0.65*airSmooth + 3 - release) * (0.2 - coldPool) / 0.2
			}
			eq = release + mix*(0.9*airSmooth+1-release)
		case Urban:
			eq = 1.5 + 0.95*airSmooth + 0.04*s.Impervious + m.lowFlowHot*lowFlow
		case Lowland:
			// Heat waves charge a store that drains over a month; a dry
			// basin (depleted slow store) charges it faster.
			heatStore = heatStore*(1-1.0/30) + 0.012*g.heat[i]*(1+2.5*memory[i])
			eq = 1.0 + 0.85*airSmooth + m.lowFlowHot*lowFlow + heatStore
		}
		// A dry basin (shallow, slow water; depleted groundwater) warms more
		// for the same warm spell: the memory of drought.
		eq += m.memAmp * memory[i] * math.Max(0, airSmooth-g.seasonalAir(i)-m.airOffset)
		t += m.twRate * (eq - t)
		t = math.Max(0, t)
		tw[i] = t + m.noiseTW*rng.NormFloat64()
		twMax[i] = tw[i] + m.diel*(0.8+0.4*rng.Float64())

		c := m.condBase * math.Pow(math.Max(q[i], 0.02*qMed)/qMed, -m.condExp)
		if s.Kind == Lowland {
			c += 220 * math.Max(0, 0.7-slowFrac[i])
		}
		if s.Kind == Urban {
			doy := (g.first + calendar.Date(i)).DayOfYear()
			if (doy < 80 || doy > 340) && rain[i] > 3 && air[i] < 3 {
				c += 350 * rng.Float64() // road salt washed off
			}
		}
		cond[i] = c * (1 + 0.02*rng.NormFloat64())

		deficit := m.doDeficit
		switch s.Kind {
		case Lowland:
			deficit += 2.8*lowFlow + 0.08*math.Max(0, tw[i]-16)*4
		case Urban:
			if rain[i] > 25 {
				deficit += 3.5 // storm overflows
			} else if i > 0 && rain[i-1] > 25 {
				deficit += 2
			}
		case Tailwater:
			if coldPool < 0.2 {
				deficit += 2.5 * (0.2 - coldPool) / 0.2 / (1 + 2*mix)
			}
		}
		do[i] = math.Max(0.5, doSat(tw[i])-deficit+0.15*rng.NormFloat64())
	}

	// Records: the late starters, sensor outages, and what is not logged.
	first := calendar.New(LastYear-int(s.RecordYears)+1, 1, 1)
	skip := int(first - g.first)
	st := &series.Station{ID: s.ID, Start: first, Days: n - skip, Vars: map[string][]float64{}}
	put := func(name string, x []float64, digits int) {
		y := make([]float64, n-skip)
		for i := range y {
			y[i] = round(x[i+skip], digits)
		}
		// Sporadic lost days (filled by interpolation when short) and one
		// or two outages of 4 to 40 days per sensor.
		for i := range y {
			if rng.Float64() < 0.003 {
				y[i] = math.NaN()
			}
		}
		for range rng.IntN(3) {
			a := rng.IntN(len(y))
			for i := a; i < min(len(y), a+4+rng.IntN(37)); i++ {
				y[i] = math.NaN()
			}
		}
		st.Vars[name] = y
	}
	put("air_temperature", air, 1)
	put("discharge", q, 3)
	put("water_temperature", tw, 2)
	if !noMax[s.Kind] {
		put("water_temperature_max", twMax, 2)
	}
	put("specific_conductance", cond, 0)
	if !noDO[s.ID] {
		put("dissolved_oxygen", do, 2)
	}
	return st
}

func meanOf(x []float64) float64 {
	s := 0.0
	for _, v := range x {
		s += v
	}
	return s / float64(len(x))
}

func medianOf(x []float64) float64 {
	y := slices.Clone(x)
	slices.Sort(y)
	return y[len(y)/2]
}

// noDO lists stations without an oxygen sensor.
var noDO = map[string]bool{"FEN-05": true, "HIC-05": true, "LOW-07": true}
