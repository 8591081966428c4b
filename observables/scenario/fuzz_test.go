package scenario

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// FuzzScenario: decoding and validation never panic; every error is one
// line; a scenario that validates builds its event with a well-formed
// in-state at its own coupling and at both ends of its scan, and has a
// finite first order there unless the formula does not apply
// (FirstOrderApplies, which then says why), as do the slices of its
// parameter axes. The seed corpus (testdata/fuzz/FuzzScenario) holds the
// built-in scenarios and damaged variants; the built-ins are added here
// too.
func FuzzScenario(f *testing.F) {
	for _, name := range BuiltinNames() {
		b, _ := Builtin(name)
		f.Add(b)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := Parse(data, "fuzz.toml")
		if err != nil {
			if strings.ContainsAny(err.Error(), "\n\r") {
				t.Fatalf("decoder error of two lines: %q", err)
			}
			return
		}
		err = s.Validate()
		if err != nil {
			var ie InputError
			if !errors.As(err, &ie) || strings.ContainsAny(err.Error(), "\n\r") || !strings.Contains(err.Error(), "allowed") {
				t.Fatalf("validation error %q: want one line of an InputError saying what is allowed", err)
			}
			return
		}
		checkEvent(t, s)
		// The slices of a multi-parameter scan, when few enough to check.
		n := 1
		for _, a := range s.ParamAxes() {
			n *= len(a.Grid())
		}
		if n > 64 {
			return
		}
		sl, err := s.ValidateSlices()
		if err != nil {
			if strings.ContainsAny(err.Error(), "\n\r") {
				t.Fatalf("slice error of two lines: %q", err)
			}
			return
		}
		for _, c := range sl {
			checkEvent(t, c)
		}
	})
}

// checkEvent asserts what validation promises of a scenario.
func checkEvent(t *testing.T, s *Scenario) {
	t.Helper()
	for _, at := range []*Scenario{s, s.WithEpsilon(s.Scan.EpsMin), s.WithEpsilon(s.Scan.EpsMax)} {
		ev, err := at.Build()
		if err != nil {
			t.Fatalf("validated scenario does not build: %v", err)
		}
		if err := ev.In.Validate(); err != nil {
			t.Fatalf("validated scenario's in-state: %v", err)
		}
		dp, da, src := ev.FirstOrder(at)
		ok, why := ev.FirstOrderApplies(at)
		if !ok {
			if why == "" || !strings.HasPrefix(src, "not applicable") {
				t.Fatalf("first order not applicable without a reason: %q", src)
			}
			continue
		}
		for i := range 4 {
			if math.IsNaN(dp[i]) || math.IsInf(dp[i], 0) || math.IsNaN(da[i]) || math.IsInf(da[i], 0) {
				t.Fatalf("first order not finite at |ε| = %g: dp1 = %v, da1 = %v (%s)", math.Abs(at.Epsilon()), dp, da, src)
			}
		}
	}
}
