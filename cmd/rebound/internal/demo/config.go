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
events = "events.csv"
attributes = "stations.csv"
record_years_column = "record_years"

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

[[indicator]]
name = "heat_warming"
label = "Median peak warming in heat waves (°C)"
measure = "magnitude"
kinds = ["heatwave"]
variables = ["water_temperature"]
weight = 0.25

[[indicator]]
name = "recovery"
label = "Median days to recover, all events and variables (Kaplan–Meier)"
measure = "recovery"
weight = 0.20

[[indicator]]
name = "drought_memory"
label = "Extra warming per unit of antecedent dryness (°C)"
measure = "memory"
kinds = ["heatwave", "drought"]
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
label = "Median dissolved-oxygen drop, all events (mg/L)"
measure = "magnitude"
variables = ["dissolved_oxygen"]
weight = 0.10

[[indicator]]
name = "heat_frequency"
label = "Heat waves with a recorded response per year of record"
measure = "frequency"
kinds = ["heatwave"]
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
`

const readme = `Caldermoor: rebound's demonstration region
==========================================

Everything in this folder is invented. Caldermoor does not exist; its
coordinates put it in the open North Atlantic so that no map mistakes it for
a real place. The files are generated from a fixed seed by "rebound demo".

  stations.csv   32 stations in four basins, with invented attributes
  events.csv     per-event water-quality departures, 2010-2024
  rebound.toml   the configuration used for the demo run
  out/           the outputs of the run

The story planted in the data:
  Fenwater   spring-fed creeks: small, quick departures; groundwater buffers them.
  Highcairn  snowmelt headwaters: cold, but warmer after a dry winter.
  Bratton    a dam tailwater (cold releases, then late warming in long heat
             waves such as July-August 2018, and slow recovery) and flashy
             urban reaches (large but brief departures, oxygen sags in floods).
  Lowmere    lowland agricultural rivers: slow recovery and strong drought
             memory; the July 2023 heat wave after the 2020-2022 drought
             hits them hardest.

The ranking is a screening aid, not a regulatory determination.
`
