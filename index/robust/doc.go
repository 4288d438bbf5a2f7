// Package robust holds order statistics and rank-based estimators that
// resist outliers: the median and sample quantiles by linear interpolation
// between order statistics (Hyndman & Fan 1996, "Sample quantiles in
// statistical packages", The American Statistician 50(4):361–365, type 7,
// with numpy's arithmetic), selection of order statistics (Hoare 1961,
// FIND) in place of sorting, and the Theil–Sen slope (Theil 1950; Sen
// 1968).
//
// Quantile copies its input; SelectQuantile reorders it instead, and a
// Selection gives several quantiles of one sample for little more than the
// cost of one. All of them give the same value to the last bit.
package robust
