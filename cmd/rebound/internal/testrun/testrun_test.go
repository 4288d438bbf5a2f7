package testrun

import "testing"

func TestTwoStations(t *testing.T) {
	r, man := TwoStations(t)
	if len(r.Attrs.Stations) != 2 || man.Stations != 2 {
		t.Fatalf("got %d stations", len(r.Attrs.Stations))
	}
	if r.Attrs.Stations[0].Name[0] != '=' {
		t.Errorf("name %q lost its leading =", r.Attrs.Stations[0].Name)
	}
}

func TestDemo(t *testing.T) {
	r, man := Demo(t)
	if man.Scored != len(r.Attrs.Stations) || man.Scored < 10 {
		t.Errorf("scored %d of %d stations", man.Scored, len(r.Attrs.Stations))
	}
}

func TestExtras(t *testing.T) {
	r, _ := Demo(t)
	e := Extras(t, r, 4)
	if len(e.Sensitivity.Low) != len(r.Attrs.Stations) || len(e.Sensitivity.Swings) != len(r.Raw.Indicators) {
		t.Errorf("sensitivity sizes: %d stations, %d swings", len(e.Sensitivity.Low), len(e.Sensitivity.Swings))
	}
	if len(e.Clusters.Profiles) != 4 {
		t.Errorf("%d profiles, want 4", len(e.Clusters.Profiles))
	}
}
