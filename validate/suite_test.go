package validate

import "testing"

// TestSuite runs every reference case (each cites its source and states
// the kind of its reference) and requires it to pass within its stated
// tolerance.
func TestSuite(t *testing.T) {
	for _, c := range Suite(testing.Short()) {
		switch c.Kind {
		case Published, Derived, Consistency:
		default:
			t.Errorf("%s: reference kind %q", c.Name, c.Kind)
		}
		r := c.Check()
		if r.Err != nil {
			t.Errorf("%s: %v", c.Name, r.Err)
			continue
		}
		t.Logf("%-70s rel. diff %.2e (tol %.0e)", c.Name, r.RelDiff, c.Tol)
		if !r.Pass {
			t.Errorf("%s [%s]: relative difference %.3g > %.0e", c.Name, c.Source, r.RelDiff, c.Tol)
		}
	}
}
