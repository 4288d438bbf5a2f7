// Package clustering groups stations by their standardised time-series
// features. Rows of a matrix are stations and columns are features; every
// distance is Euclidean and, unless a name says "squared", not squared.
//
// # Methods
//
//   - Standardize puts features on a common scale: z-scores with the
//     population standard deviation, or median and MAD × 1.4826.
//   - KMeans: k-means++ seeding (Arthur & Vassilvitskii 2007) in its greedy
//     form, Lloyd's iterations, several restarts; optionally weighted.
//   - Agglomerate: single, complete, average (UPGMA) and Ward (Ward 1963, J. Am. Stat. Assoc. 58:236–244)
//     linkage, by the nearest-neighbour chain and by Prim's minimum
//     spanning tree (Müllner 2011, arXiv:1109.2378), in O(n²) time and one
//     condensed distance matrix of memory. A Dendrogram follows scipy's
//     linkage-matrix conventions and is cut by number of clusters or by
//     height; CopheneticCorrelation measures how well it keeps distances.
//   - TwoStage builds Ward trees of more rows than a distance matrix
//     allows: k-means groups first, then Ward on the weighted groups.
//   - Silhouette (Rousseeuw 1987), CalinskiHarabasz (Caliński & Harabasz
//     1974), DaviesBouldin (Davies & Bouldin 1979) and WithinSS judge a
//     partition; AdjustedRand (Hubert & Arabie 1985) compares two.
//   - ChooseK tabulates those indices over a range of k for k-means and
//     each linkage and picks k by the silhouette.
//   - Bootstrap assesses the stability of each cluster by the mean best
//     Jaccard similarity over resampled data (Hennig 2007).
//   - PrincipalComponents projects rows for plotting; Profiles and
//     Describe summarise each cluster in original units and in words.
//
// # Conventions
//
// Functions take data and return results; nothing prints or reads global
// state. Input with NaN or ±Inf is an error where a method needs every
// value (a *ValueError names the element); indices of a partition pass NaN
// along. Random draws come from a Seed field, and parallel work is split
// into fixed blocks reduced in block order, so the same seed gives the same
// result at any GOMAXPROCS. Labels are 0, 1, ... numbered in order of each
// cluster's first row, so equal partitions have equal labels. Panics are
// kept for calls that break a documented contract, such as slices of the
// wrong length.
package clustering
