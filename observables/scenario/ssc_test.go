package scenario

import (
	"strings"
	"testing"

	"ricochet/integrate"
)

// TestSSCScenario: probe.ssc selects the Dixon body's spin supplementary
// condition (integrate.SSC) and the model name shows it (the default
// tulczyjew keeps the plain name). The physics of the conditions is
// tested in integrate (ssc_test.go).
func TestSSCScenario(t *testing.T) {
	for _, c := range []struct{ key, name string }{
		{"", "dixon in"},
		{`ssc = "tulczyjew"` + "\n", "dixon in"},
		{`ssc = "pirani"` + "\n", "dixon (pirani) in"},
		{`ssc = "ohashi-kyrian-semerak"` + "\n", "dixon (ohashi-kyrian-semerak) in"},
	} {
		text := strings.Replace(kerrDixon, `kind = "dixon"`+"\n", `kind = "dixon"`+"\n"+c.key, 1)
		s, err := parseValid(t, text)
		if err != nil {
			t.Fatalf("%q: %v", c.key, err)
		}
		ev, err := s.Build()
		if err != nil {
			t.Fatal(err)
		}
		d, ok := ev.Model.(*integrate.Dixon)
		if !ok || !strings.HasPrefix(d.Name(), c.name) {
			t.Errorf("%q: model %s, want a Dixon body named %q…", c.key, ev.Model.Name(), c.name)
			continue
		}
		if want, _ := integrate.ParseSSC(s.Probe.SSC); d.SSC != want {
			t.Errorf("%q: condition %v, want %v", c.key, d.SSC, want)
		}
	}
}
