package config

import (
	"reflect"
	"regexp"
	"strings"
	"testing"
)

func TestTemplateDecodesAndValidates(t *testing.T) {
	cfg, errs := Decode(Template(), "rebound.toml")
	errs = append(errs, cfg.Validate()...)
	for _, e := range errs {
		t.Error(e)
	}
	if cfg.Title != "Resilience screening" || len(cfg.Indicators) != 6 || len(cfg.Variables) != 6 {
		t.Fatalf("template decoded to %+v", cfg)
	}
	if got := cfg.Indicators[0].Better; got != Lower {
		t.Errorf("event measure default better = %q, want lower", got)
	}
}

// Every key of the schema appears in the template, so the template
// documents every key.
func TestTemplateCoversSchema(t *testing.T) {
	// Keys shown commented out ("# target = 60.0") count as documented.
	uncommented := regexp.MustCompile(`(?m)^# ?([a-z_]+ =|\[)`).ReplaceAllString(Template(), "$1")
	have := map[string]bool{}
	for k := range keyLines(uncommented) {
		have[indexRE.ReplaceAllString(k, "")] = true
	}
	var walk func(t reflect.Type, prefix string, f func(string))
	walk = func(t reflect.Type, prefix string, f func(string)) {
		t = deref(t)
		for i := range t.NumField() {
			tag := strings.Split(t.Field(i).Tag.Get("toml"), ",")[0]
			if tag == "" || tag == "-" {
				continue
			}
			key := tag
			if prefix != "" {
				key = prefix + "." + tag
			}
			ft := deref(t.Field(i).Type)
			if ft.Kind() == reflect.Struct {
				walk(ft, key, f)
				continue
			}
			f(key)
		}
	}
	walk(reflect.TypeOf(Config{}), "", func(key string) {
		if !have[key] {
			t.Errorf("template does not show key %q", key)
		}
	})
}

func TestDefaultsFromEmptyFile(t *testing.T) {
	cfg, errs := Decode("", "empty.toml")
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	want := Default()
	want.File = "empty.toml"
	want.Lines = cfg.Lines
	want.Events, want.Clustering, want.Sensitivity = nil, nil, nil // optional sections absent
	if !reflect.DeepEqual(cfg, want) {
		t.Fatalf("empty file: got %+v, want %+v", cfg, want)
	}
}

const base = `
[inputs]
events = "e.csv"
attributes = "a.csv"
`

func TestErrors(t *testing.T) {
	tests := []struct {
		name string
		toml string
		want []string // substrings of the errors, in order
	}{
		{"unknown key with suggestion", base + "atributes = \"x\"\n",
			[]string{`c.toml:5: inputs.atributes: unknown key (did you mean "attributes"?)`}},
		{"unknown key in array table", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nwieght = 1\n",
			[]string{`c.toml:8: indicator.wieght: unknown key (did you mean "weight"?)`}},
		{"unknown section", "[normalisation]\nmethod = \"minmax\"\n",
			[]string{`c.toml:2: normalisation.method: unknown key`}},
		{"wrong type", base + "[output]\nprint = \"ten\"\n",
			[]string{`c.toml:6:9: output.print: want an integer, got a string`}},
		{"bad choice names line, column and a suggestion", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovry\"\nweight = 1\n",
			[]string{`c.toml:7:11: indicator[1].measure: want one of "magnitude", "recovery", "memory", "response_slope", "frequency", "attribute", "criterion", got "recovry" (did you mean "recovery"?)`}},
		{"negative weight", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = -0.5\n",
			[]string{`c.toml:8:10: indicator[1].weight: want a number >= 0, got -0.5`}},
		{"all weights zero", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 0\n",
			[]string{`all weights are zero`}},
		{"missing weight", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\n",
			[]string{`indicator[1].weight: missing`, `all weights are zero`}},
		{"no indicators", base, []string{`no [[indicator]] defined`}},
		{"magnitude needs one variable", base + "[[indicator]]\nname = \"a\"\nmeasure = \"magnitude\"\nweight = 1\n",
			[]string{`indicator[1].variables: measure "magnitude" compares departures`}},
		{"unknown variable", base + "[[indicator]]\nname = \"a\"\nmeasure = \"magnitude\"\nvariables = [\"ph\"]\nweight = 1\n",
			[]string{`c.toml:8:13: indicator[1].variables: variable "ph" is not defined`}},
		{"zscore with geometric", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\n[normalization]\nmethod = \"zscore\"\n[aggregation]\nmethod = \"geometric\"\n",
			[]string{`c.toml:10:10: normalization.method: z-scores can be negative`}},
		{"zscore override with geometric", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\nnormalize = \"zscore\"\n[aggregation]\nmethod = \"geometric\"\n",
			[]string{`c.toml:9:13: indicator[1].normalize: z-scores can be negative`}},
		{"unknown key repeated in two array tables", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nwieght = 1\n[[indicator]]\nname = \"b\"\nmeasure = \"recovery\"\nwieght = 1\n",
			[]string{`c.toml:8: indicator.wieght: unknown key`, `c.toml:12: indicator.wieght: unknown key`}},
		{"target without target", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\nnormalize = \"target\"\n",
			[]string{`indicator[1].target: missing`}},
		{"duplicate names", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\n[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\n",
			[]string{`c.toml:10:8: indicator[2].name: indicator "a" is defined twice`}},
		{"ahp not reciprocal", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\n[[indicator]]\nname = \"b\"\nmeasure = \"frequency\"\n" +
			"[weighting]\nmethod = \"ahp\"\n[weighting.ahp]\norder = [\"a\", \"b\"]\nmatrix = [[1, 3], [3, 1]]\n",
			[]string{`weighting.ahp.matrix: not reciprocal: entry (1,2) = 3 but (2,1) = 3`}},
		{"ahp order and shape", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\n" +
			"[weighting]\nmethod = \"ahp\"\n[weighting.ahp]\norder = [\"a\", \"z\"]\nmatrix = [[1, \"1/x\"], [1, 1]]\n",
			[]string{`row 1, column 2: want a positive number or a fraction`, `"z" is not an indicator name`}},
		{"every problem is listed", base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovry\"\nweight = -1\n[missing]\npolicy = \"drop\"\n",
			[]string{`indicator[1].measure`, `indicator[1].weight`, `missing.policy: want one of "renormalize", "impute", "error", got "drop"`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			cfg, errs := Decode(tc.toml, "c.toml")
			if len(errs) == 0 {
				errs = cfg.Validate()
			}
			var got []string
			for _, e := range errs {
				got = append(got, e.Error())
			}
			all := strings.Join(got, "\n")
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("missing error %q; got:\n%s", w, all)
				}
			}
			if len(got) == 0 {
				t.Fatal("no error")
			}
		})
	}
}

func TestFractionsInAHPMatrix(t *testing.T) {
	text := base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\n[[indicator]]\nname = \"b\"\nmeasure = \"recovery\"\n" +
		"[weighting]\nmethod = \"ahp\"\n[weighting.ahp]\norder = [\"a\", \"b\"]\nmatrix = [[1, 3], [\"1/3\", 1]]\n"
	cfg, errs := Decode(text, "c.toml")
	if errs = append(errs, cfg.Validate()...); len(errs) > 0 {
		t.Fatal(errs)
	}
	if got := float64(cfg.Weighting.AHP.Matrix[1][0]); got != 1.0/3 {
		t.Fatalf("\"1/3\" decoded to %v", got)
	}
}

func TestPath(t *testing.T) {
	c := &Config{File: "/data/study/rebound.toml"}
	if got := c.Path("events.csv"); got != "/data/study/events.csv" {
		t.Errorf("relative: %s", got)
	}
	if got := c.Path("/abs/x.csv"); got != "/abs/x.csv" {
		t.Errorf("absolute: %s", got)
	}
}

func TestClosest(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"wieght", "weight"}, {"atributes", "attributes"}, {"xyz", ""}, {"Method", "method"},
	} {
		if got := closest(tc.in, []string{"weight", "attributes", "method", "measure"}); got != tc.want {
			t.Errorf("closest(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

// FuzzDecode: no input panics, and every error prints.
func FuzzDecode(f *testing.F) {
	f.Add(Template())
	f.Add(base + "[[indicator]]\nname = \"a\"\nmeasure = \"recovery\"\nweight = 1\n")
	f.Add("[weighting.ahp]\nmatrix = [[1, \"1/0\"], [\"x\", 1]]\norder=[\"a\"]\n[weighting]\nmethod=\"ahp\"\n")
	f.Fuzz(func(t *testing.T, text string) {
		cfg, errs := Decode(text, "f.toml")
		if len(errs) == 0 {
			errs = cfg.Validate()
		}
		for _, e := range errs {
			_ = e.Error()
		}
	})
}

func TestCanonicalUnits(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"degF", "°C"}, {"degC", "°C"}, {"ft3/s", "m³/s"}, {"cms", "m³/s"}, {"uS/cm", "µS/cm"}, {"mg/L", "mg/L"},
	} {
		if got := (Variable{Units: tc.in}).CanonicalUnits(); got != tc.want {
			t.Errorf("%s: %s, want %s", tc.in, got, tc.want)
		}
	}
}
