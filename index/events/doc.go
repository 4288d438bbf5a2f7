// Package events finds the disturbances in a station's daily record (heat
// waves, droughts, floods, and events listed by the user) and measures the
// water-quality departure from normal during and after each one.
//
// Analyze takes one station at a time; the functions it is built from
// (Climate.Compute, HeatWaves, Droughts, Floods) work on plain slices and
// can be called on their own.
//
// # Normal
//
// The normal of a variable is its day-of-year climatology over a reference
// period (the whole record by default): the mean and, where a threshold is
// needed, a percentile of all values within ±5 days of each calendar day,
// both smoothed by a 31-day moving average that wraps around the year, as
// in Hobday et al. (2016), "A hierarchical approach to defining marine
// heatwaves", Progress in Oceanography 141:227–238. The calendar has 366
// days with 29 February as day 60; that day's values are interpolated from
// 28 February and 1 March (see Climate.Compute for every detail).
// Percentiles interpolate linearly between order statistics, type 7 of
// Hyndman & Fan (1996). A departure is the observed value minus the
// climatological mean of its calendar day.
//
// # Disturbances
//
//   - Heat wave: air temperature strictly above its seasonally varying 90th
//     percentile for at least 3 days; then events separated by 2 days or
//     fewer are joined (Hobday et al. 2016, whose marine definition uses a
//     5-day minimum). Short runs are dropped before joining.
//   - Drought: the threshold level method (Yevjevich 1967; Tallaksen,
//     Madsen & Clausen 1997): discharge strictly below Q80, the flow
//     exceeded 80% of the time (the 20th percentile of the reference
//     flows, fixed or by calendar day); runs separated by 5 days or fewer
//     pooled (inter-event time criterion); events shorter than 5 days, and
//     optionally those with a small deficit, removed. Both 5-day defaults
//     are choices of this package, made configurable because published
//     values vary with the river.
//   - Flood: discharge strictly above Q5 (the 95th percentile); runs whose
//     peaks are less than 7 days apart, or between which the flow stays
//     above 75% of the smaller peak, form one event (a peaks-over-threshold
//     independence rule; see Floods).
//   - User events: kind, start, end and optionally a station, read by
//     ReadUserEvents.
//
// # Responses
//
// For every event and water-quality variable: the departure on the most
// harmful day of the window from the event start to 14 days after its end
// (the response of a river can lag its driver), the mean and cumulative
// departure over the event, the time to the peak, and the recovery time:
// the days from the end of the event to the first day of 7 consecutive
// days within ±1 standard deviation of the reference-period departures.
// Recovery is right-censored, with a reason, when the record ends, a data
// gap longer than 3 days intervenes or the next disturbance starts first:
// the first event of any kind, detected or listed, that starts after this
// one ends. See Response for the exact day counts.
//
// # Antecedent dryness
//
// The memory of prior drought is measured over the 365 days before each
// event, either as the fraction of those days spent in drought (Fraction)
// or as the standardized cumulative flow deficit below the drought
// threshold (Index); see Antecedent.
//
// # Missing data
//
// Values are NaN where missing. Short gaps should be filled beforehand
// where interpolation is defensible (series.FillGaps); Analyze fills
// nothing. Remaining NaN never count as exceedances,
// are left out of means and sums, break recovery runs and, when long,
// censor recovery.
package events
