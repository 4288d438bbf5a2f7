package geojson

import (
	"bytes"
	"encoding/json"
	"math"
	"strings"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/cmd/rebound/internal/view"
)

// Station is one feature of the layer.
type Station struct {
	ID, Name, Group string
	// Latitude and Longitude are WGS84 decimal degrees; a NaN gives the
	// feature a null geometry (RFC 7946 section 3.2).
	Latitude, Longitude float64
	Score               float64 // 0–100; NaN when the station has no score
	Rank                int     // 1 = most resilient
	// RankLow and RankHigh bound the station's rank under the weight
	// sensitivity analysis (the better and the worse end of its interval);
	// 0 when no such analysis ran or the station has no score. Stability
	// is its class there ("unranked" for a station without a score; ""
	// when the analysis did not run).
	RankLow, RankHigh int
	Stability         string
	// Cluster is the station's cluster, numbered from 1; 0 when the run
	// did not cluster or left the station out. Profile describes the
	// cluster in words.
	Cluster int
	Profile string
	Events  int // events recorded or derived at the station
	Flags   []string
}

// Render returns the map layer of a finished run (stations.geojson).
func Render(r *pipeline.Run) ([]byte, error) {
	return Encode(Stations(r, view.Of(r)))
}

// Stations collects the layer's features from a finished run and its
// optional results, in rank order.
func Stations(r *pipeline.Run, e view.Extras) []Station {
	res := r.Result
	out := make([]Station, 0, len(res.Order))
	for _, i := range res.Order {
		s := r.Attrs.Stations[i]
		out = append(out, Station{
			ID: s.ID, Name: s.Name, Group: s.Group,
			Latitude: s.Latitude, Longitude: s.Longitude,
			Score: res.Score[i], Rank: res.Rank[i],
			Events: r.Raw.Events[i], Flags: res.Flags[i],
		})
		st := &out[len(out)-1]
		if s := e.Sensitivity; s != nil {
			st.RankLow, st.RankHigh, st.Stability = s.Low[i], s.High[i], s.Stability[i]
		}
		if c := e.Clusters; c != nil && c.Labels[i] >= 0 {
			st.Cluster = c.Labels[i] + 1
			st.Profile = c.Profiles[c.Labels[i]].Description
		}
	}
	return out
}

type feature struct {
	Type       string     `json:"type"`
	ID         string     `json:"id"`
	Geometry   *point     `json:"geometry"`
	Properties properties `json:"properties"`
}

type point struct {
	Type        string     `json:"type"`
	Coordinates [2]float64 `json:"coordinates"`
}

type properties struct {
	Station   string   `json:"station"`
	Name      string   `json:"name"`
	Group     string   `json:"group,omitempty"`
	Rank      int      `json:"rank"`
	Score     *float64 `json:"score"`
	RankLow   *int     `json:"rank_low"`
	RankHigh  *int     `json:"rank_high"`
	Stability *string  `json:"stability"`
	Cluster   *int     `json:"cluster"`
	Profile   *string  `json:"cluster_profile"`
	Events    int      `json:"events"`
	Flags     string   `json:"flags"`
}

// Encode writes the stations as a FeatureCollection, one feature per line.
func Encode(stations []Station) ([]byte, error) {
	features := make([]feature, 0, len(stations))
	for _, s := range stations {
		f := feature{Type: "Feature", ID: s.ID, Properties: properties{
			Station: s.ID, Name: s.Name, Group: s.Group, Rank: s.Rank,
			Events: s.Events, Flags: strings.Join(s.Flags, "; "),
		}}
		if !math.IsNaN(s.Latitude) && !math.IsNaN(s.Longitude) {
			f.Geometry = &point{Type: "Point", Coordinates: [2]float64{round(s.Longitude, 6), round(s.Latitude, 6)}}
		}
		if !math.IsNaN(s.Score) {
			v := round(s.Score, 2)
			f.Properties.Score = &v
		}
		if s.RankLow > 0 {
			lo, hi := s.RankLow, s.RankHigh
			f.Properties.RankLow, f.Properties.RankHigh = &lo, &hi
		}
		if s.Stability != "" {
			st := s.Stability
			f.Properties.Stability = &st
		}
		if s.Cluster > 0 {
			cl, p := s.Cluster, s.Profile
			f.Properties.Cluster, f.Properties.Profile = &cl, &p
		}
		features = append(features, f)
	}
	// One feature per line: small diffs between runs, and still one
	// valid JSON document.
	var buf bytes.Buffer
	buf.WriteString(`{"type":"FeatureCollection","features":[`)
	for k, f := range features {
		b, err := marshal(f)
		if err != nil {
			return nil, err
		}
		if k > 0 {
			buf.WriteByte(',')
		}
		buf.WriteString("\n")
		buf.Write(b)
	}
	buf.WriteString("\n]}\n")
	return buf.Bytes(), nil
}

func marshal(v any) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimRight(buf.Bytes(), "\n"), nil
}

func round(x float64, d int) float64 {
	p := math.Pow(10, float64(d))
	r := math.Round(x*p) / p
	if r == 0 {
		return 0 // no -0
	}
	return r
}
