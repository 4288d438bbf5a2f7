// Package rankstat ranks score vectors and measures how far two rankings
// agree.
//
// Ranks and Order put the highest score first. Ties share the lowest rank
// number of their group (competition ranking, 1, 2, 2, 4), NaN scores come
// after every number and share one rank, and tied stations are listed in
// index order. A Ranker distributes the scores over about n buckets by
// value and sorts each bucket by a 64-bit key that orders like the float64
// score, falling back to a least-significant-digit radix sort on the keys
// when a score is infinite or the scores crowd into few buckets; either way
// it ranks n scores in O(n) time and, reused, without allocating.
//
// Agreement between rankings:
//   - Spearman's rho: the Pearson correlation of midranks (average ranks of
//     ties), not the no-ties shortcut 1 − 6Σd²/(n(n²−1)), which is wrong
//     when there are ties.
//   - Kendall's tau-b, (C − D)/√((n0 − n1)(n0 − n2)), computed in O(n log n)
//     time by sorting on one variable and counting the exchanges a merge
//     sort on the other makes (Knight 1966, "A computer method for
//     calculating Kendall's tau with ungrouped data", JASA 61:436–439).
//
// Slices that a function writes are called dst, come first and are also
// returned; a nil dst is allocated.
package rankstat
