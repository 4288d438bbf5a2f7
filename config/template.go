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
#   driver     the kind of event ("heatwave", "drought", "flood" or "none")
#              a day counts for when the peak windows of two events of
#              different kinds overlap, so one peak is not counted twice;
#              empty = heatwave for water temperature and dissolved oxygen,
#              drought for specific conductance, else the later event
# Without any [[variable]] table these six are used.
[[variable]]
name = "water_temperature"
units = "degC"
harmful = "increase"
tolerance = 0.0
range = [-1.0, 40.0]
driver = "heatwave"

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
#             response_slope  Theil-Sen slope of magnitude against the
#                        driver's intensity (heat waves: mean air-temperature
#                        anomaly, °C; droughts: 1 - lowest flow/threshold;
#                        floods: peak/threshold): the response per unit of
#                        disturbance, which compares stations that faced
#                        different heat waves like for like (one kind, one
#                        variable; needs memory.min_events)
#             frequency  events per year of record
#             attribute  a numeric column of the attribute table
#             criterion  performance against a [[criterion]] (needs series):
#                        statistic = "reliability", "resilience",
#                        "vulnerability" or "days_above" (per year)
#   kinds, variables   filter the events a measure uses (empty = all)
#   min_severity       the least severity class counted: 1 moderate (every
#                      event), 2 strong, 3 severe, 4 extreme. The default is
#                      2 for magnitude, recovery and frequency, so that a
#                      station is judged on the disturbances that stress a
#                      river and not on how many mild ones it happened to
#                      have, and 1 for the slopes, which need the spread
#                      from mild to severe. Events of user kinds have no
#                      class and always count.
#   event_weights      "none" (every event counts once) or "severity" (an
#                      event of class c counts c times)
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
label = "Median peak warming in strong heat waves (°C)"
measure = "magnitude"
kinds = ["heatwave"]
variables = ["water_temperature"]
min_severity = 2
event_weights = "none"
weight = 0.25

[[indicator]]
name = "heat_response"
label = "Water warming per °C of air-temperature anomaly (°C/°C)"
measure = "response_slope"
kinds = ["heatwave"]
variables = ["water_temperature"]
min_severity = 1
weight = 0.1

[[indicator]]
name = "recovery"
label = "Median recovery time after strong heat waves and droughts (days)"
measure = "recovery"
kinds = ["heatwave", "drought"]
variables = []
weight = 0.2

[[indicator]]
name = "flood_recovery"
label = "Median recovery time after floods of 2 years and more (days)"
measure = "recovery"
kinds = ["flood"]
variables = []
weight = 0.1

[[indicator]]
name = "drought_memory"
label = "Extra warming per unit of antecedent dryness (°C)"
measure = "memory"
variables = ["water_temperature"]
weight = 0.15

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

[comparison]
# "station" scores every station on its own events. "shared" scores the
# stations only on the regional events, so that each is measured on the same
# storms, droughts and heat waves: an event counts when it overlaps a run of
# days on which at least min_share of the stations (of the normalisation
# group, with a record on those days) were in an event of the same kind.
# With normalization.scope = "cluster" the regional events are found over
# all stations. The memo says which basis was used.
basis = "station"
min_share = 0.5

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

# Every derived event gets a severity class: 1 moderate, 2 strong, 3 severe,
# 4 extreme (heat waves by Hobday et al. 2018 category, floods by return
# period, droughts by probability; see below). Indicators count the events
# of a class and above (indicator min_severity).

[events.heatwave]
# Air temperature strictly above its seasonally varying percentile for at
# least min_days days; events max_gap_days or less apart are joined.
# Reported when the hottest day falls in one of months (the northern warm
# season June-September; [12, 1, 2, 3] south of the equator; [] = all
# year). Class: the Hobday et al. (2018) category, the floor of the largest
# daily (T - normal)/(threshold - normal), capped at 4.
enabled = true
variable = "air_temperature"
percentile = 90.0
min_days = 3
max_gap_days = 2
months = [6, 7, 8, 9]

[events.drought]
# Threshold level method: discharge strictly below the percentile of the
# reference flows (20 = Q80, the flow exceeded 80% of the time), "daily" (of
# each calendar day's flows, so the usual summer or winter low flow is not a
# drought) or "fixed" (one flow all year). Runs pool_days or less apart are
# pooled when the flow volume above the threshold between them is at most
# pool_volume_ratio of the deficit before (the IC method; 0 = days only);
# events shorter than min_days, or with a deficit below
# min_deficit_fraction of the station's largest, are dropped. months as for
# heat waves, on the day of lowest flow ([] = all year). Class: the larger of
# the empirical non-exceedance probabilities of deficit and duration among
# the station's droughts (count <= x over n + 1); strong from the first of
# severity_probabilities, severe from the second, extreme from the third.
enabled = true
variable = "discharge"
percentile = 20.0
threshold = "daily"
min_days = 5
pool_days = 5
pool_volume_ratio = 0.1
min_deficit_fraction = 0.005
months = []
severity_probabilities = [0.5, 0.8, 0.95]

[events.flood]
# Discharge strictly above the percentile (95 = Q5). Peaks closer than
# separation_days, or between which the flow stays above trough x the
# smaller peak, are one event.
# months as for heat waves, on the day of the peak ([] = all year). Class:
# the return period of the peak in the generalised extreme value
# distribution fitted by L-moments (Hosking 1990) to the station's annual
# maxima (water years with water_year = true), over years with at least
# fit_year_coverage of their days; strong from the first of
# severity_return_periods (years), severe from the second, extreme from the
# third. With fewer than fit_min_years annual maxima the floods are
# unrated (class 0, with a warning).
enabled = true
variable = "discharge"
percentile = 95.0
separation_days = 7
trough = 0.75
months = []
severity_return_periods = [2.0, 10.0, 50.0]
fit_min_years = 10
fit_year_coverage = 0.9

[events.recovery]
# The peak departure is sought from the event start to lag_days after its
# end. Recovery is the first day after the end that starts run_days days in
# a row within +/- tolerance_sd standard deviations of the normal departures
# (or the variable's fixed tolerance). A gap longer than max_gap_days, the
# end of the record or the next event that censor_by names first censors it
# (and ends the peak window): "same_kind_or_severe" (an event of the same
# kind, or of class censor_min_severity or above), "same_kind", "severe" or
# "any". User events always censor. A mild flood a week after a heat wave
# does not end the heat wave's recovery.
lag_days = 14
run_days = 7
tolerance_sd = 1.0
max_gap_days = 3
censor_by = "same_kind_or_severe"
censor_min_severity = 2

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
