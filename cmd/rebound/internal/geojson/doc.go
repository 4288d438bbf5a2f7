// Package geojson writes the stations of a finished run as a map layer: a
// GeoJSON FeatureCollection (RFC 7946, Butler et al. 2016) of points in
// WGS84 longitude–latitude order, one feature per station, in rank order,
// with the score, rank, rank interval, cluster and flags as properties, so
// that any GIS can open it and colour or label the stations.
//
// Properties are flat (strings, numbers, null), because many GIS formats
// that a layer is converted to cannot hold arrays: flags are joined by
// "; ". Undefined numbers (a station without a score, a rank interval when
// no sensitivity analysis ran) are null. Coordinates keep six decimals
// (about 0.1 m), as RFC 7946 section 11.2 suggests.
package geojson
