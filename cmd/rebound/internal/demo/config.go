package demo

const configText = `# rebound configuration for the demo region (Caldermoor, invented).
# Every key not set here takes its documented default; run "rebound init"
# for a template that shows them all.
#
# The result is a screening aid, not a regulatory determination. Use the
# water-quality standards that apply where you work and licensed
# professional judgement before acting on it.

title = "Caldermoor resilience screening (invented demo data)"
seed = 20240611

[inputs]
# No events table: the events are derived from the daily records below.
events = ""
attributes = "stations.csv"
record_years_column = "record_years"
user_events = "user_events.csv"
fill_gap_days = 2

[[inputs.wide]]
path = "series/air_temperature.csv"
variable = "air_temperature"

[[inputs.wide]]
path = "series/discharge.csv"
variable = "discharge"

[[inputs.wide]]
path = "series/water_temperature.csv"
variable = "water_temperature"

[[inputs.wide]]
path = "series/water_temperature_max.csv"
variable = "water_temperature_max"

[[inputs.wide]]
path = "series/specific_conductance.csv"
variable = "specific_conductance"

[[inputs.wide]]
path = "series/dissolved_oxygen.csv"
variable = "dissolved_oxygen"

# The recovery band is a fixed tolerance around normal here ("back within
# 1 °C of normal"), rather than the default of one standard deviation of
# the station's own departures, so that stations are held to the same mark.
[[variable]]
name = "water_temperature"
units = "degC"
harmful = "increase"
tolerance = 1.0
range = [-1.0, 40.0]

[[variable]]
name = "water_temperature_max"
units = "degC"
range = [-1.0, 45.0]

[[variable]]
name = "specific_conductance"
units = "uS/cm"
harmful = "increase"
tolerance = 40.0
range = [0.0, 5000.0]

[[variable]]
name = "dissolved_oxygen"
units = "mg/L"
harmful = "decrease"
tolerance = 0.8
range = [0.0, 20.0]

[[variable]]
name = "air_temperature"
units = "degC"

[[variable]]
name = "discharge"
units = "m3/s"
range = [0.0, 10000.0]

# How events are found in the records and how recovery is measured: the
# defaults, written out.
[events]
min_years = 5
half_window_days = 5
smooth_days = 31

[events.heatwave]
# Heat waves of the warm season only: a warm spell in January does not
# stress a river the way July heat does. Every heat wave gets its Hobday
# category (moderate, strong, severe, extreme) in events.csv, and the
# indicators below count the strong ones and above unless they say
# otherwise, so a station is not rated on how many mild spells it had.
percentile = 90.0
min_days = 3
max_gap_days = 2
months = [6, 7, 8, 9]

[events.drought]
# A threshold by calendar day, so the usual late-summer low flow is not
# itself a drought; pooled by the inter-event time and volume criteria.
percentile = 20.0
threshold = "daily"
min_days = 5
pool_days = 5
pool_volume_ratio = 0.1
min_deficit_fraction = 0.005
severity_probabilities = [0.5, 0.8, 0.95]

[events.flood]
# Flood severity is the return period of the peak in a GEV fitted by
# L-moments to each station's 15 annual maxima.
percentile = 95.0
separation_days = 7
trough = 0.75
severity_return_periods = [2.0, 10.0, 50.0]
fit_min_years = 10

[events.recovery]
# A recovery is cut short only by an event of the same kind or a strong
# one, not by a minor flood that happens to follow a heat wave.
lag_days = 14
run_days = 7
tolerance_sd = 1.0
censor_by = "same_kind_or_severe"
censor_min_severity = 2

[events.dryness]
measure = "fraction"
days = 365

# An example criterion for the 7-day statistic. It is NOT a standard: use
# the criteria that apply where you work.
[[criterion]]
name = "example_rearing_18C"
limit = 18.0

[[indicator]]
name = "heat_warming"
label = "Median peak warming in strong heat waves (°C)"
measure = "magnitude"
kinds = ["heatwave"]
variables = ["water_temperature"]
min_severity = 2
weight = 0.20

[[indicator]]
name = "heat_response"
label = "Water warming per °C of air-temperature anomaly, all heat waves (°C/°C)"
measure = "response_slope"
kinds = ["heatwave"]
variables = ["water_temperature"]
min_severity = 1
weight = 0.05

[[indicator]]
name = "recovery"
label = "Median days for water temperature to return within 1 °C of normal after heat waves and droughts (Kaplan–Meier)"
measure = "recovery"
kinds = ["heatwave", "drought"]
variables = ["water_temperature"]
weight = 0.20

[[indicator]]
name = "drought_memory"
label = "Extra heat-wave warming per unit of antecedent dryness (°C)"
measure = "memory"
kinds = ["heatwave"]
variables = ["water_temperature"]
weight = 0.15

[[indicator]]
name = "drought_salinity"
label = "Median conductance rise in droughts (µS/cm)"
measure = "magnitude"
kinds = ["drought"]
variables = ["specific_conductance"]
weight = 0.10

[[indicator]]
name = "oxygen_sag"
label = "Median dissolved-oxygen drop in strong heat waves (mg/L)"
measure = "magnitude"
kinds = ["heatwave"]
variables = ["dissolved_oxygen"]
weight = 0.05

[[indicator]]
name = "flood_oxygen"
label = "Median dissolved-oxygen drop in floods of 2 years and more (mg/L)"
measure = "magnitude"
kinds = ["flood"]
variables = ["dissolved_oxygen"]
weight = 0.05

[[indicator]]
name = "criterion_reliability"
label = "Share of days meeting the example 18 °C criterion (7-day statistic)"
measure = "criterion"
criterion = "example_rearing_18C"
statistic = "reliability"
weight = 0.05

[[indicator]]
name = "forest_cover"
label = "Forest cover of the basin (%)"
measure = "attribute"
attribute = "forest_pct"
better = "higher"
weight = 0.10

[[indicator]]
name = "baseflow"
label = "Baseflow index (share of flow from groundwater)"
measure = "attribute"
attribute = "baseflow_index"
better = "higher"
weight = 0.05

[normalization]
method = "minmax"
# "all" ranks every station against every other. scope = "cluster" would
# normalise within the clusters found below instead, comparing each station
# with stations that behave alike (a spring-fed creek with spring-fed
# creeks): a screening of how each fares among its peers, not across the
# region.
scope = "all"

[weighting]
method = "explicit"

[aggregation]
method = "arithmetic"

[missing]
policy = "renormalize"
min_events = 5

[memory]
min_events = 5
dryness = "fraction"

[output]
dir = "out"
print = 8

# Clustering of the stations by features of their daily records ("rebound
# cluster" runs it alone). The features describe each station's water
# temperature and flow regime. Statistics of air temperature itself are left
# out: within one small region they differ between stations mostly by the
# years each record covers, not by how the rivers behave.
[clustering]
features = [
  "water_temperature.mean", "water_temperature.sd", "water_temperature.skew",
  "water_temperature.lag1", "water_temperature.amplitude", "water_temperature.phase",
  "water_temperature.p10", "water_temperature.p90",
  "water_temperature.thermal_sensitivity", "water_temperature.air_lag",
  "discharge.mean", "discharge.cv", "discharge.skew", "discharge.lag1",
  "discharge.amplitude", "discharge.phase",
  "discharge.flashiness", "discharge.bfi", "discharge.q90_q50",
]
scale = "zscore"
method = "ward"
# k = 0 chooses the number of clusters by the silhouette, from k_min to k_max.
k = 0
k_min = 2
k_max = 10
bootstrap = 100
min_coverage = 0.8
min_years = 5

# How robust the ranking is to the weights, the normalisation, the
# aggregation and the scope ("rebound sensitivity" runs it alone). 2000
# weight samples instead of the default 10000 keep the demo quick; each
# station's 5th and 95th percentile ranks still rest on 100 samples in each
# tail. The top and bottom groups are the best and worst four stations (an
# eighth of the 32).
[sensitivity]
samples = 2000
sampling = "dirichlet"
concentration = 50.0
top_n = 4
deltas = [0.2, 0.5]
# A severity floor tried as a structural alternative: every event, instead
# of each indicator's min_severity. (No demo heat wave reaches category III,
# so a floor of 3 would leave heat_warming without a value anywhere.)
severities = [1]

[sensitivity.sobol]
enabled = true
base_samples = 4096
bootstrap = 1000
spread = 0.5
`

const readme = `Caldermoor: rebound's demonstration region
==========================================

Everything in this folder is invented. Caldermoor does not exist; its
coordinates put it in the open North Atlantic so that no map mistakes it for
a real place. The files are generated from a fixed seed by "rebound demo".

  stations.csv     32 stations in four basins, with invented attributes
  series/*.csv     daily records 2010-2024, one file per variable (wide
                   layout; the lowland loggers record daily means only)
  user_events.csv  a reservoir drawdown that no series shows
  rebound.toml     the configuration used for the demo run
  out/             the outputs of the run, including the derived events

The story planted in the data (rebound has to find it on its own):
  Fenwater   spring-fed creeks: small, quick departures; groundwater buffers them.
  Highcairn  snowmelt headwaters: cold, but warmer after a dry winter.
  Bratton    a dam tailwater: cold releases keep it cool until a long heat
             wave (late July 2018) exhausts the reservoir's cold pool, then
             it runs far above normal; and flashy urban reaches: large
             departures with every warm spell, road salt in winter, oxygen
             sags when storms overflow the sewers. A maintenance drawdown
             of the reservoir in September 2015 is listed in user_events.csv.
  Lowmere    lowland agricultural rivers: slow recovery and strong drought
             memory; the July 2023 heat wave after the 2020-2022 drought
             warms them far more than the longer heat wave of 2018 did.

What severity adds. Every derived event in out/events.csv has a severity
class (1 moderate, 2 strong, 3 severe, 4 extreme): heat waves by their
Hobday et al. (2018) category, floods by the return period of their peak in
a GEV fitted to the station's annual maxima, droughts by how their deficit
and duration rank among the station's droughts. Heat waves are counted in
June-September only, and droughts against a threshold for each calendar
day, so neither a mild winter nor the usual late-summer low flow counts as
a disturbance. The magnitude and recovery indicators take the strong events
and above: the spring-fed Fenwater creeks and the tailwater are compared on
the heat waves that matter, not on how many mild ones each happened to
have. The tailwater is the clearest case: mild heat waves leave it cold,
the strong ones of 2018 and 2023 warm it by 9 to 11 degrees C for weeks,
and it falls well down the ranking once those are what its median is taken
over. heat_response compares stations per degree of air-temperature
anomaly, whatever heat waves each saw; flood_oxygen scores the urban sewer
overflows in floods of two years and more.

The ranking is a screening aid, not a regulatory determination.
`
