package scenario

import (
	"strings"

	"ricochet/integrate"
	"ricochet/integrate/rk"
)

// MethodByName returns the Runge–Kutta pair named by numerics.method:
// dop853 (the default, also for ""), dopri5 or tsit5.
func MethodByName(name string) (*rk.Tableau, error) {
	switch strings.ToLower(name) {
	case "", "dop853":
		return rk.DOP853(), nil
	case "dopri5":
		return rk.DormandPrince54(), nil
	case "tsit5":
		return rk.Tsitouras54(), nil
	}
	return nil, Badf("numerics.method = %q; allowed: dop853, dopri5, tsit5", name)
}

// Settings returns the integrator settings of a validated scenario.
func (s *Scenario) Settings() *integrate.Settings {
	m, _ := MethodByName(s.Numerics.Method)
	return &integrate.Settings{Method: m, Tol: s.Numerics.Tol, Radius: s.Numerics.Radius}
}

// Spinning reports whether the probe carries spin.
func (s *Scenario) Spinning() bool {
	switch s.Probe.Kind {
	case "bmt", "dixon", "root-kerr", "root-kerr-body":
		return true
	}
	return false
}

// Electromagnetic reports whether ε is an electromagnetic coupling (flat
// backgrounds) rather than a gravitational one.
func (s *Scenario) Electromagnetic() bool { return !s.Background.Curved() }
