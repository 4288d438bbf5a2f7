package geojson

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"testing"

	"rebound/cmd/rebound/internal/report"
	"rebound/cmd/rebound/internal/testrun"
	"rebound/cmd/rebound/internal/view"
)

// validate checks data against the rules of RFC 7946 that a layer of
// points must follow: a FeatureCollection object (section 3.3) of Feature
// objects (3.2), each with a "geometry" that is null or a Point (3.1.2)
// whose position is [longitude, latitude] in WGS84 decimal degrees
// (3.1.1, 4), "properties" an object or null, and an "id" that is a string
// or number; no "crs" member (4: removed from the format). Properties must
// also be flat (no arrays or objects), which this layer promises.
func validate(data []byte) (features []map[string]any, err error) {
	var top map[string]any
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	if err := dec.Decode(&top); err != nil {
		return nil, fmt.Errorf("not one JSON object: %v", err)
	}
	if dec.More() {
		return nil, fmt.Errorf("data after the object")
	}
	if top["type"] != "FeatureCollection" {
		return nil, fmt.Errorf("type = %v, want FeatureCollection", top["type"])
	}
	if _, ok := top["crs"]; ok {
		return nil, fmt.Errorf(`"crs" member present`)
	}
	list, ok := top["features"].([]any)
	if !ok {
		return nil, fmt.Errorf("features: want an array, got %T", top["features"])
	}
	for k, x := range list {
		f, ok := x.(map[string]any)
		if !ok {
			return nil, fmt.Errorf("feature %d: want an object", k)
		}
		if f["type"] != "Feature" {
			return nil, fmt.Errorf("feature %d: type = %v", k, f["type"])
		}
		switch id := f["id"].(type) {
		case nil, string, json.Number:
		default:
			return nil, fmt.Errorf("feature %d: id of type %T", k, id)
		}
		g, present := f["geometry"]
		if !present {
			return nil, fmt.Errorf("feature %d: no geometry member", k)
		}
		if g != nil {
			gm, ok := g.(map[string]any)
			if !ok || gm["type"] != "Point" {
				return nil, fmt.Errorf("feature %d: geometry %v, want a Point", k, g)
			}
			pos, ok := gm["coordinates"].([]any)
			if !ok || len(pos) < 2 || len(pos) > 3 {
				return nil, fmt.Errorf("feature %d: coordinates %v, want [lon, lat]", k, gm["coordinates"])
			}
			lon, err1 := pos[0].(json.Number).Float64()
			lat, err2 := pos[1].(json.Number).Float64()
			if err1 != nil || err2 != nil || !(lon >= -180 && lon <= 180) || !(lat >= -90 && lat <= 90) {
				return nil, fmt.Errorf("feature %d: position %v out of range", k, pos)
			}
		}
		p, present := f["properties"]
		if !present {
			return nil, fmt.Errorf("feature %d: no properties member", k)
		}
		pm, ok := p.(map[string]any)
		if p != nil && !ok {
			return nil, fmt.Errorf("feature %d: properties %T", k, p)
		}
		for key, v := range pm {
			switch v.(type) {
			case nil, string, json.Number, bool:
			default:
				return nil, fmt.Errorf("feature %d: property %s is %T, want a scalar", k, key, v)
			}
		}
		features = append(features, f)
	}
	return features, nil
}

func TestValidate(t *testing.T) {
	for _, tc := range []struct {
		name, data string
		ok         bool
	}{
		{"empty collection", `{"type":"FeatureCollection","features":[]}`, true},
		{"null geometry", `{"type":"FeatureCollection","features":[{"type":"Feature","geometry":null,"properties":null}]}`, true},
		{"lat lon swapped", `{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"Point","coordinates":[-12.5,170.5]},"properties":{}}]}`, false},
		{"crs", `{"type":"FeatureCollection","crs":{},"features":[]}`, false},
		{"array property", `{"type":"FeatureCollection","features":[{"type":"Feature","geometry":null,"properties":{"f":[1]}}]}`, false},
		{"truncated", `{"type":"FeatureCollection","features":[`, false},
		{"not a collection", `{"type":"Feature","geometry":null,"properties":null}`, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := validate([]byte(tc.data))
			if (err == nil) != tc.ok {
				t.Errorf("validate: %v, want ok = %v", err, tc.ok)
			}
		})
	}
}

func TestRenderTwoStations(t *testing.T) {
	r, _ := testrun.TwoStations(t)
	data, err := Render(r)
	if err != nil {
		t.Fatal(err)
	}
	features, err := validate(data)
	if err != nil {
		t.Fatalf("%v\n%s", err, data)
	}
	if len(features) != 2 {
		t.Fatalf("%d features, want 2", len(features))
	}
	// Each position is [longitude, latitude] of its station; the second
	// station's longitude (170.5) is no valid latitude, so a swap shows.
	for _, f := range features {
		p := f["properties"].(map[string]any)
		s, ok := r.Attrs.Station(p["station"].(string))
		if !ok {
			t.Fatalf("unknown station %v", p["station"])
		}
		pos := f["geometry"].(map[string]any)["coordinates"].([]any)
		lon, _ := pos[0].(json.Number).Float64()
		lat, _ := pos[1].(json.Number).Float64()
		if lon != s.Longitude || lat != s.Latitude {
			t.Errorf("%s: position [%g, %g], want [%g, %g]", s.ID, lon, lat, s.Longitude, s.Latitude)
		}
		if p["name"] != s.Name {
			t.Errorf("name %q, want %q (user text kept as given)", p["name"], s.Name)
		}
		if p["rank_low"] != nil || p["cluster"] != nil {
			t.Errorf("%s: interval or cluster set in a run without them: %v", s.ID, p)
		}
	}
}

// TestRenderMatchesRanking checks the layer against ranking.csv of the same
// demo run: the same stations in the same order, with the same rank, score
// (to the layer's two decimals) and flags.
func TestRenderMatchesRanking(t *testing.T) {
	r, _ := testrun.Demo(t)
	data, err := Render(r)
	if err != nil {
		t.Fatal(err)
	}
	features, err := validate(data)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := report.WriteRanking(&buf, r); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	rows = rows[1:]
	if len(rows) != len(features) {
		t.Fatalf("%d features, %d ranking rows", len(features), len(rows))
	}
	for k, row := range rows { // rank, station, name, group, score, events, lat, lon, flags
		p := features[k]["properties"].(map[string]any)
		want := map[string]string{"rank": row[0], "station": row[1], "name": row[2], "group": row[3], "events": row[5]}
		for key, w := range want {
			if got := fmt.Sprint(p[key]); got != w {
				t.Errorf("row %d: %s = %s, ranking.csv has %s", k+1, key, got, w)
			}
		}
		score, _ := strconv.ParseFloat(row[4], 64)
		got, _ := p["score"].(json.Number).Float64()
		if math.Abs(got-score) > 0.005+1e-12 {
			t.Errorf("row %d: score %g, ranking.csv has %g", k+1, got, score)
		}
		if flags := p["flags"].(string); flags != "" && row[8] == "" || flags == "" && row[8] != "" {
			t.Errorf("row %d: flags %q, ranking.csv has %q", k+1, flags, row[8])
		}
	}
	again, _ := Render(r)
	if !bytes.Equal(data, again) {
		t.Error("two renders of the same run differ")
	}

	// With the optional results, each feature carries its interval and
	// cluster.
	e := view.Of(r)
	data, err = Encode(Stations(r, e))
	if err != nil {
		t.Fatal(err)
	}
	if features, err = validate(data); err != nil {
		t.Fatal(err)
	}
	for k, i := range r.Result.Order {
		p := features[k]["properties"].(map[string]any)
		want := map[string]string{"rank_low": fmt.Sprint(e.Sensitivity.Low[i]), "rank_high": fmt.Sprint(e.Sensitivity.High[i]),
			"stability": e.Sensitivity.Stability[i], "cluster": fmt.Sprint(e.Clusters.Labels[i] + 1)}
		for key, w := range want {
			if got := fmt.Sprint(p[key]); got != w {
				t.Errorf("%s: %s = %s, want %s", r.Raw.Stations[i], key, got, w)
			}
		}
	}
}

func TestEncodeOptional(t *testing.T) {
	data, err := Encode([]Station{
		{ID: "S1", Name: "One", Latitude: 10.1234567, Longitude: -20.7654321, Score: 71.236, Rank: 1,
			RankLow: 1, RankHigh: 3, Stability: "stable", Cluster: 2, Profile: "cool, steady", Flags: []string{"a", "b"}},
		{ID: "S2", Name: "Two", Latitude: math.NaN(), Longitude: 5, Score: math.NaN(), Rank: 2},
	})
	if err != nil {
		t.Fatal(err)
	}
	features, err := validate(data)
	if err != nil {
		t.Fatalf("%v\n%s", err, data)
	}
	p := features[0]["properties"].(map[string]any)
	for key, want := range map[string]string{"score": "71.24", "rank_low": "1", "rank_high": "3", "stability": "stable",
		"cluster": "2", "cluster_profile": "cool, steady", "flags": "a; b"} {
		if got := fmt.Sprint(p[key]); got != want {
			t.Errorf("%s = %s, want %s", key, got, want)
		}
	}
	if pos := fmt.Sprint(features[0]["geometry"].(map[string]any)["coordinates"]); pos != "[-20.765432 10.123457]" {
		t.Errorf("coordinates %s, want six decimals", pos)
	}
	if features[1]["geometry"] != nil || features[1]["properties"].(map[string]any)["score"] != nil {
		t.Errorf("station without position or score: %v", features[1])
	}
}

func FuzzEncode(f *testing.F) {
	f.Add("S1", "name", 45.0, -120.0, 50.0)
	f.Add("\"", "\x00<&>", math.NaN(), math.Inf(1), -0.0)
	f.Fuzz(func(t *testing.T, id, name string, lat, lon, score float64) {
		if math.IsInf(lat, 0) || math.IsInf(lon, 0) || math.IsInf(score, 0) || math.Abs(lat) > 90 || math.Abs(lon) > 180 {
			return // the attribute reader rejects these
		}
		data, err := Encode([]Station{{ID: id, Name: name, Latitude: lat, Longitude: lon, Score: score, Rank: 1}})
		if err != nil {
			t.Fatal(err)
		}
		features, err := validate(data)
		if err != nil {
			t.Fatalf("%v\n%s", err, data)
		}
		if got := features[0]["id"]; got != stringsToValid(id) {
			t.Errorf("id %q, want %q", got, id)
		}
	})
}

// stringsToValid is what encoding/json makes of a string: invalid UTF-8
// becomes U+FFFD.
func stringsToValid(s string) string {
	b, _ := json.Marshal(s)
	var out string
	json.Unmarshal(b, &out)
	return out
}
