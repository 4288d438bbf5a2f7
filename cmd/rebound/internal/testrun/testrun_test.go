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
