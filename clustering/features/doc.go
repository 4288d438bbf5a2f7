// Package features computes per-station time-series features for
// clustering: summary statistics of each variable's daily record, flow
// indices of discharge, and the response of water to air temperature.
//
// A feature is named "<variable>.<statistic>", for example
// "water_temperature.mean" or "discharge.bfi". Config lists the features to
// compute (DefaultFeatures when none are listed) and the record a station
// needs; an Extractor computes them for one station (Extract), for every
// station of a long series file (FromLong) or for stations in memory
// (FromStations). Available lists the features with their units and a
// one-line definition. ReadTable and WriteTable read and write feature
// tables.
//
// # Coverage and undefined features
//
// Before computing anything, a station's record of every variable its
// features use is checked against Config.Coverage (series.Requirement:
// years with at least a fraction of days with data). A station that falls
// short is left out of the table with the reason, for example
// "water_temperature: 2 of 5 required years with >= 80% of days". A station
// for which a feature is undefined (NaN, for reasons given below) is also
// left out, with the reason "undefined: discharge.cv". Nothing is dropped
// silently: Table.Excluded lists every station left out.
//
// # Statistics of any variable
//
// Let x_1, …, x_n be the daily values present (not missing) in the record.
//
//   - mean: x̄ = (1/n) Σ x_i.
//   - sd: the sample standard deviation s = √(Σ (x_i − x̄)² / (n − 1)).
//   - cv: the coefficient of variation s / x̄, dimensionless. It is
//     undefined (NaN) unless the mean is positive and not zero up to
//     rounding (x̄ > 10⁻⁹ · mean |x_i|). It is meant for ratio-scale
//     quantities such as discharge or concentrations; for temperatures in
//     °C it depends on the arbitrary zero of the scale.
//   - skew: the adjusted Fisher–Pearson coefficient of skewness
//     G1 = √(n(n−1)) / (n−2) · m3 / m2^(3/2), with m_k = (1/n) Σ (x_i − x̄)^k,
//     as computed by pandas Series.skew, scipy.stats.skew(bias=False) and
//     Excel SKEW. Undefined for n < 3 or constant data.
//   - amplitude and phase of the annual harmonic: the least-squares fit of
//     y = m + a·cos ωt + b·sin ωt to the daily values, with ω = 2π/365.25
//     per day and t in days since 1970-01-01. amplitude = √(a² + b²) in the
//     variable's units. phase is the day of the year (1-based) of the
//     fitted maximum, t_pk + 1 where t_pk = atan2(b, a)/ω mod 365.25, so
//     that y = m + A·cos(ω(t − t_pk)). Phase is circular: day 365 lies next
//     to day 1, which a Euclidean distance does not see.
//   - lag1: the lag-1 autocorrelation of the daily anomalies (value minus
//     the fitted annual harmonic), estimated as the Pearson correlation of
//     the pairs (e_{t−1}, e_t) of calendar-consecutive days on which both
//     anomalies are present. This is pandas Series.autocorr(1) on the
//     daily-indexed anomalies; the ACF estimator of statsmodels and R,
//     Σ (e_t − ē)(e_{t+1} − ē) / Σ (e_t − ē)², gives slightly different
//     values on short records.
//   - pNN (p10 and p90 by default; any NN from 1 to 99): the NN-th
//     percentile by linear interpolation between order statistics (Hyndman
//     & Fan 1996 type 7, the default of numpy and R): with the values
//     sorted, h = (n−1)·NN/100 and p = x_(⌊h⌋) + (h − ⌊h⌋)(x_(⌊h⌋+1) − x_(⌊h⌋)).
//
// # Statistics of discharge
//
// These are meant for discharge q (m³/s) and are listed by Available for
// the variable "discharge"; Config may ask for them of any variable.
//
//   - flashiness: the Richards–Baker flashiness index (Baker, Richards,
//     Loftus & Kramer 2004), Σ |q_t − q_{t−1}| / Σ q_t, both sums over the
//     pairs of consecutive days with both flows present. The first day of
//     the record (and of each run after a gap) is not in the denominator;
//     implementations that divide by the flow of all days give a slightly
//     smaller value.
//   - bfi: the baseflow index Σ b_t / Σ q_t, with baseflow b from the
//     Lyne & Hollick (1979) recursive digital filter with α = 0.925 and
//     three passes (forward, backward, forward), as recommended by Nathan &
//     McMahon (1990) and Ladson et al. (2013). Each pass computes quickflow
//     f_k = α f_{k−1} + (1+α)/2 (x_k − x_{k−1}) and baseflow x_k − f_k where
//     f_k > 0, otherwise x_k (and never below 0). Against the warm-up of
//     the filter, 30 values are mirrored at each end of the record before
//     filtering and dropped afterwards (Ladson et al. 2013); the first pass
//     starts with quickflow equal to the first padded flow and each later
//     pass with the baseflow left at its starting end. A missing day breaks the filter: it runs on
//     each run of consecutive days with flow of at least Config.MinSegment
//     days (60 by default), and shorter runs are left out of both sums.
//   - q90_q50: the low-flow ratio Q90/Q50, where Q90 is the flow exceeded
//     on 90% of days (the 10th percentile, type 7) and Q50 the median.
//     Undefined unless Q50 > 0.
//
// # Water temperature against air temperature
//
// These need both "water_temperature" and "air_temperature" (°C).
//
//   - thermal_sensitivity: the ordinary least-squares slope of weekly mean
//     water temperature on weekly mean air temperature (°C per °C), the
//     "thermal sensitivity" of Kelleher et al. (2012; cited from memory),
//     with weekly means as in Mohseni, Stefan & Erickson (1998). Weeks are consecutive 7-day blocks from the first day
//     of the station's record; a week counts when at least 5 of its days
//     have both temperatures, and its means are over those days. Undefined
//     with fewer than 3 such weeks.
//   - air_lag: the lag k in 0..L days (L = Config.MaxLag, 10 by default)
//     that maximises the Pearson correlation of the air temperature
//     anomaly on day t with the water temperature anomaly on day t+k (water
//     lagging air), anomalies taken from each variable's annual harmonic and
//     pairs over the days with both present. Ties go to the smaller lag.
//
// # Missing days
//
// Missing days are NaN. Sums and percentiles use the days present; lag-1
// pairs, flashiness pairs and cross-correlation pairs skip any pair with a
// missing member; the baseflow filter runs on gap-free runs as described.
// Config.FillGaps interpolates short interior gaps first (series.FillGaps).
package features
