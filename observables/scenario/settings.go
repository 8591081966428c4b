package scenario

import (
	"strings"

	"ricochet/integrate"
	"ricochet/integrate/rk"
)

// Names of the Runge–Kutta pairs in numerics.method and --method.
const (
	MethodDormandPrince8 = "dormand-prince-8" // Dormand–Prince 8(5,3), rk.DormandPrince853
	MethodDormandPrince5 = "dormand-prince-5" // Dormand–Prince 5(4), rk.DormandPrince54
	MethodTsitouras5     = "tsitouras-5"      // Tsitouras 5(4), rk.Tsitouras54
)

// MethodNames lists the accepted numerics.method values, the default first.
var MethodNames = []string{MethodDormandPrince8, MethodDormandPrince5, MethodTsitouras5}

// MethodByName returns the Runge–Kutta pair named by numerics.method:
// dormand-prince-8 (Dormand–Prince 8(5,3), the default, also for ""),
// dormand-prince-5 (Dormand–Prince 5(4)) or tsitouras-5 (Tsitouras 5(4)).
func MethodByName(name string) (*rk.Tableau, error) {
	switch strings.ToLower(name) {
	case "", MethodDormandPrince8:
		return rk.DormandPrince853(), nil
	case MethodDormandPrince5:
		return rk.DormandPrince54(), nil
	case MethodTsitouras5:
		return rk.Tsitouras54(), nil
	}
	return nil, Badf("numerics.method = %q; allowed: %s", name, strings.Join(MethodNames, ", "))
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
