// Package sensitivity measures how robust a composite-indicator ranking of
// stations is to the choice of weights, following the uncertainty and
// sensitivity analysis of the OECD/JRC Handbook on Constructing Composite
// Indicators (Nardo, Saisana, Saltelli, Tarantola, Hoffmann & Giovannini
// 2008) and Saltelli et al. (2008), Global Sensitivity Analysis: The
// Primer.
//
// # The model
//
// A Model holds n stations × k normalised indicator values (row-major,
// higher = more resilient, NaN = missing) and k non-negative weights.
// Composite aggregates a station's values by the weighted arithmetic mean,
// or the weighted geometric mean of the values raised to a floor, over the
// values present; stations are then ranked with rankstat.Ranks (1 = highest
// composite, ties share the lower rank, NaN last). The analyses compute
// their composites exactly as Composite does, so their base ranking is
// rankstat.Ranks(Composite(...)).
//
// # The analyses
//
//   - OneAtATime moves one weight at a time by ±δ (relative) and rescales
//     the others, giving each station's new rank and, per indicator, the
//     largest and the mean absolute rank change: the data of a tornado
//     chart.
//   - MonteCarlo draws weight vectors from a Dirichlet distribution centred
//     on the base weights (or uniformly over the simplex), optionally
//     within bounds, and reports each station's median rank, 5th–95th
//     percentile interval, probability of the top and bottom bands and a
//     stability class, plus Spearman's rho and Kendall's tau-b of every
//     sampled ranking against the base ranking. Dirichlet vectors are
//     normalised gamma variates (Marsaglia & Tsang 2000, "A simple method
//     for generating gamma variables", ACM TOMS 26:363–372, as implemented
//     by gonum's distuv.Gamma). Ranks are streamed into per-station
//     histograms, so memory does not grow with the number of samples.
//   - Structural compares the rankings of alternative ways of building the
//     composite that the caller computes (normalisation × aggregation ×
//     scope) and reports each station's rank range.
//   - Sobol estimates first-order and total Sobol indices of any model with
//     independent uniform inputs and vector output: the first-order
//     estimator of Saltelli et al. (2010, Comput. Phys. Commun.
//     181:259–270) and the total estimator of Jansen (1999, Comput. Phys.
//     Commun. 117:35–43), with bootstrap percentile intervals.
//     WeightIndices applies it to the weights, with every station's
//     composite and the mean absolute rank shift as outputs.
//
// Every analysis takes a Settings whose zero fields stand for documented
// defaults. Random draws come from streams derived from Settings.Seed and
// the sample index, and parallel work is merged in a fixed order, so the
// same Seed gives the same results at any number of workers.
package sensitivity
