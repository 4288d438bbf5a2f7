// Package index turns per-event water-quality departures and basin
// attributes into a resilience score and ranking for every station.
//
// The steps, each a function of plain data:
//
//   - ReadEvents reads the events table (one row per station × event ×
//     variable) and validates every row.
//   - Compute derives the raw indicator values per station: the median
//     harmful peak departure (magnitude), the Kaplan–Meier median recovery
//     time over right-censored recovery times (recovery; the restricted mean
//     survival time when the median is undefined), the Theil–Sen slope of
//     magnitude against antecedent dryness (memory; Theil 1950, Sen 1968),
//     events per year (frequency), and attribute columns.
//   - Weights sets the weights: explicit, equal, or the principal
//     eigenvector of Saaty's pairwise comparison matrix (AHP; Saaty 1980)
//     with its consistency ratio.
//   - Score normalises each indicator (min–max, z-score, percentile rank or
//     distance to a target; over all stations or within peer groups),
//     handles missing values (renormalise, impute or refuse), aggregates
//     (weighted arithmetic or geometric mean) and ranks. The normalisation
//     and aggregation choices follow the OECD/JRC Handbook on Constructing
//     Composite Indicators (Nardo et al. 2008).
//
// Conventions: normalised values are oriented so that higher means more
// resilient; the score runs from 0 to 100 (higher = more resilient); rank 1
// is the most resilient, ties share the lower rank number (1, 2, 2, 4), and
// listings break ties by station identifier. NaN means undefined and always
// travels with a reason.
package index
