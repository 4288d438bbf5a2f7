package config

// Template returns a fully commented configuration. Every key appears with
// its default value or an example, so the file documents itself; `rebound
// init` writes it.
func Template() string { return template }

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
events = "events.csv"
# Station and basin attributes (CSV, or the first sheet of an .xlsx file).
# Columns: station,name,latitude,longitude, then numeric columns, and an
# optional text column "group" for peer groups.
attributes = "stations.csv"
# Length of record in years, used by frequency indicators (events per year).
# A station's value in the attribute column below takes precedence; 0 means
# every station must have that column filled.
record_years = 0
record_years_column = "record_years"

# Water-quality variables that events refer to. "harmful" is the direction of
# a departure from normal that harms the river: warmer and saltier water are
# harmful increases; less dissolved oxygen is a harmful decrease.
# Without any [[variable]] table these three are used.
[[variable]]
name = "water_temperature"
units = "°C"
harmful = "increase"

[[variable]]
name = "specific_conductance"
units = "µS/cm"
harmful = "increase"

[[variable]]
name = "dissolved_oxygen"
units = "mg/L"
harmful = "decrease"

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

[normalization]
# "minmax"  (x - min)/(max - min), turned round where lower is better
# "zscore"  (x - mean)/sd with the population sd, turned round likewise; the
#           score is the composite rescaled to 0-100 across stations
# "rank"    percentile rank (midranks for ties), 0 = worst, 1 = best
# "target"  1 within the tolerance of the target, falling linearly to 0 at
#           the station farthest from it
method = "minmax"
# "all" normalises over every station; "group" within the peer groups of the
# attribute table's group column.
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
