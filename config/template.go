package config

// Template returns a fully commented configuration. Every key appears with
// its default value or an example, so the file documents itself; `rebound
// init` writes it.
func Template() string {
	return template + templateEvents + templateClustering + templateSensitivity
}

const template = `# rebound configuration
#
# rebound ranks stations by how well their water quality withstands and
# recovers from heat waves, droughts and floods. This file says which inputs
# to read, which indicators make up the resilience score, and how they are
# normalised, weighted and combined. Paths are relative to this file.
#
# The result is a screening aid, not a regulatory determination. Use the
# water-quality standards that apply where you work, and have results
# reviewed with licensed professional judgement before acting on them.

# Title of the study, shown in every output.
title = "Resilience screening"

# Seed for every random choice. The same inputs and seed give the same outputs.
seed = 1

[inputs]
# Per-event departures: one row per station x event x water-quality variable.
# Columns: station,event,kind,variable,start,end,peak_departure,recovery_days,
#          recovered,antecedent_dryness
# Leave it empty ("") and name daily series below to derive the events from
# the records instead (see [events]).
events = "events.csv"
# Daily station records, long layout: station,date,variable,value[,qualifier],
# sorted by station. Used to derive events, criteria and clustering features.
series = []
# Disturbances the series do not show: kind,start,end[,station].
user_events = ""
# Series rows whose qualifier holds one of these codes are dropped and
# counted, e.g. ["P", "E"] for provisional and estimated values.
exclude_qualifiers = []
# Gaps in a daily series up to this many days are filled by linear
# interpolation; longer gaps stay missing. Every filled day is counted.
fill_gap_days = 2
# Station and basin attributes (CSV, or the first sheet of an .xlsx file).
# Columns: station,name,latitude,longitude, then numeric columns, and an
# optional text column "group" for peer groups.
attributes = "stations.csv"
# Length of record in years, used by frequency indicators (events per year).
# A station's value in the attribute column below takes precedence; 0 means
# every station must have that column filled.
record_years = 0
record_years_column = "record_years"
# Daily records in the wide layout (date,<station>,<station>,...), one file
# per variable:
# [[inputs.wide]]
# path = "water_temperature.csv"
# variable = "water_temperature"

# Variables of the series and the events table.
#   units      units of the values in the series files: temperatures in "degC"
#              or "degF" become °C, discharge in "m3/s" or "ft3/s" becomes
#              m³/s; other units pass through. The events table is always in
#              °C, m³/s and the other units as given.
#   harmful    the direction of a departure from normal that harms the river:
#              warmer and saltier water are harmful increases; less dissolved
#              oxygen is a harmful decrease. Leave it out for drivers (air
#              temperature, discharge), which are not water-quality responses.
#   tolerance  a fixed half-width of the recovery band, in the variable's
#              units; 0 means events.recovery.tolerance_sd standard deviations
#   range      plausible [low, high] in °C, m³/s, ...; values outside are
#              dropped from the series and counted
# Without any [[variable]] table these six are used.
[[variable]]
name = "water_temperature"
units = "degC"
harmful = "increase"
tolerance = 0.0
range = [-1.0, 40.0]

[[variable]]
name = "specific_conductance"
units = "uS/cm"
harmful = "increase"

[[variable]]
name = "dissolved_oxygen"
units = "mg/L"
harmful = "decrease"

[[variable]]
name = "water_temperature_max"
units = "degC"

[[variable]]
name = "air_temperature"
units = "degC"

[[variable]]
name = "discharge"
units = "m3/s"

# Indicators. Each one is a column of the score.
#   measure   magnitude  median harmful peak departure over the events (units
#                        of the variable; name exactly one variable)
#             recovery   median recovery time in days, Kaplan-Meier estimate
#                        over right-censored recovery times; when the median
#                        is undefined, the restricted mean up to the longest
#                        follow-up, flagged
#             memory     Theil-Sen slope of magnitude against antecedent
#                        dryness: how much worse a departure is after a dry
#                        spell (one variable; needs memory.min_events)
#             frequency  events per year of record
#             attribute  a numeric column of the attribute table
#             criterion  performance against a [[criterion]] (needs series):
#                        statistic = "reliability", "resilience",
#                        "vulnerability" or "days_above" (per year)
#   kinds, variables   filter the events a measure uses (empty = all)
#   attribute          the column, for measure = "attribute"
#   transform          "none", "log" or "sqrt", applied to attribute values
#   better             "higher" or "lower": which raw values are more
#                      resilient (event measures default to "lower")
#   weight             for weighting.method = "explicit"; normalised to sum 1
#   normalize          overrides normalization.method for this indicator
#   target, tolerance  for normalize = "target": values within tolerance of
#                      the target score best
#   label              a description with units, for reports
[[indicator]]
name = "heat_magnitude"
label = "Median peak warming in heat waves (°C)"
measure = "magnitude"
kinds = ["heatwave"]
variables = ["water_temperature"]
weight = 0.3

[[indicator]]
name = "recovery"
label = "Median recovery time (days)"
measure = "recovery"
kinds = []
variables = []
weight = 0.3

[[indicator]]
name = "drought_memory"
label = "Extra warming per unit of antecedent dryness (°C)"
measure = "memory"
variables = ["water_temperature"]
weight = 0.2

[[indicator]]
name = "forest_cover"
label = "Forest cover (%)"
measure = "attribute"
attribute = "forest_pct"
transform = "none"
better = "higher"
weight = 0.2
normalize = "minmax"
# target = 60.0
tolerance = 0.0

# A criterion indicator (with a [[criterion]] named "rearing" below):
# [[indicator]]
# name = "rearing_reliability"
# measure = "criterion"
# criterion = "rearing"
# statistic = "reliability"
# weight = 0.1

[normalization]
# "minmax"  (x - min)/(max - min), turned round where lower is better
# "zscore"  (x - mean)/sd with the population sd, turned round likewise; the
#           score is the composite rescaled to 0-100 across stations
# "rank"    percentile rank (midranks for ties), 0 = worst, 1 = best
# "target"  1 within the tolerance of the target, falling linearly to 0 at
#           the station farthest from it
method = "minmax"
# "all" normalises over every station; "group" within the peer groups of the
# attribute table's group column; "cluster" within the clusters found by
# [clustering].
scope = "all"

[weighting]
# "explicit" uses each indicator's weight; "equal" gives every indicator the
# same weight; "ahp" derives weights from pairwise comparisons (below).
method = "explicit"

[weighting.ahp]
# Saaty's pairwise comparisons: matrix[i][j] says how much more important
# order[i] is than order[j] (1 equal, 3 moderately, 5 strongly, 7 very
# strongly, 9 extremely more important). Fractions may be written "1/3".
# The weights are the principal eigenvector; a consistency ratio above
# max_cr is an error unless accept_inconsistent = true.
order = []
matrix = []
max_cr = 0.1
accept_inconsistent = false

[aggregation]
# "arithmetic": weighted mean of normalised values (a poor indicator can be
# offset by a good one); "geometric": weighted product (less compensation,
# favours balanced profiles).
method = "arithmetic"
# Geometric only: each value v in [0,1] enters as floor + (1 - floor)*v, so a
# zero does not wipe out the score. 0.1 matches the common 1-10 rescaling.
floor = 0.1

[missing]
# What to do when a station lacks an indicator value:
# "renormalize" drops it for that station and rescales the other weights,
# "impute" uses the median of the station's normalisation group,
# "error" stops. Every renormalised or imputed cell is flagged.
policy = "renormalize"
# Stations with fewer events than this are flagged "few_events".
min_events = 3

[memory]
# Fewest events with a known antecedent dryness for a drought-memory slope.
min_events = 5
# What antecedent_dryness holds: "fraction" (share of the prior period in
# drought, 0-1) or "index" (a standardized index, any sign).
dryness = "fraction"

[output]
# Output folder, relative to this file.
dir = "out"
# How many stations from the top and from the bottom to print.
print = 10
`

const templateEvents = `
# Deriving events from daily series (used when inputs.events is empty and
# inputs.series names the records). Defaults are shown.
[events]
# Reference period of the day-of-year normals (0 = first/last year of record)
# and the fewest reference years with data (at least half the days).
reference_first_year = 0
reference_last_year = 0
min_years = 5
# Normals pool every value within +/- half_window_days (1 to 60) of each
# calendar day (an 11-day window for 5), then a smooth_days moving average
# (odd, 1 = none; Hobday et al. 2016). Departure = observed - normal.
half_window_days = 5
smooth_days = 31
# Count record coverage by October-September water years.
water_year = false

[events.heatwave]
# Air temperature strictly above its seasonally varying percentile for at
# least min_days days; events max_gap_days or less apart are joined.
enabled = true
variable = "air_temperature"
percentile = 90.0
min_days = 3
max_gap_days = 2

[events.drought]
# Threshold level method: discharge strictly below the percentile of the
# reference flows (20 = Q80, the flow exceeded 80% of the time), "fixed" or
# "daily" (by calendar day); runs pool_days or less apart are pooled; events
# shorter than min_days, or with a deficit below min_deficit_fraction of the
# station's largest, are dropped.
enabled = true
variable = "discharge"
percentile = 20.0
threshold = "fixed"
min_days = 5
pool_days = 5
min_deficit_fraction = 0.0

[events.flood]
# Discharge strictly above the percentile (95 = Q5). Peaks closer than
# separation_days, or between which the flow stays above trough x the
# smaller peak, are one event.
enabled = true
variable = "discharge"
percentile = 95.0
separation_days = 7
trough = 0.75

[events.recovery]
# The peak departure is sought from the event start to lag_days after its
# end. Recovery is the first day after the end that starts run_days days in
# a row within +/- tolerance_sd standard deviations of the normal departures
# (or the variable's fixed tolerance). A gap longer than max_gap_days, the
# end of the record or the next event first censors it.
lag_days = 14
run_days = 7
tolerance_sd = 1.0
max_gap_days = 3

[events.dryness]
# Antecedent dryness over the days before each event: "fraction" of days in
# drought, or "index", the standardized cumulative flow deficit. Blank when
# fewer than min_coverage of those days have a flow.
measure = "fraction"
days = 365
min_coverage = 0.8

# Water-temperature criteria for the 7-day statistic: the 7DADM (7-day
# average of daily maxima, from water_temperature_max) or, where a station
# has no daily maxima, the 7-day mean of daily means. A day fails when the
# statistic is strictly greater than the limit. Use the criteria of the
# standards that apply where you work; the value below is only an example.
# [[criterion]]
# name = "rearing"
# limit = 16.0
`
