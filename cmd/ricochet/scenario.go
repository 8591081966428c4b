package main

import (
	"bytes"
	"embed"
	"fmt"
	"math"
	"math/cmplx"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"ricochet/background/em"
	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables/leading"
)

// Scenario is a scattering set-up as read from a TOML file. Unknown keys
// are errors. Lengths are in units where the impact parameter b is given
// by kinematics.b (default 1); spins are lengths (a = S/m).
type Scenario struct {
	Name        string         `toml:"name"`
	Description string         `toml:"description"`
	Background  BackgroundSpec `toml:"background"`
	Probe       ProbeSpec      `toml:"probe"`
	Kinematics  KinematicsSpec `toml:"kinematics"`
	Scan        ScanSpec       `toml:"scan"`
	Numerics    NumericsSpec   `toml:"numerics"`
}

// BackgroundSpec describes the source at rest at the origin.
type BackgroundSpec struct {
	Kind           string     `toml:"kind"`            // coulomb | monopole | dyon | root-kerr
	Charge         float64    `toml:"charge"`          // Q (Gaussian)
	MagneticCharge float64    `toml:"magnetic_charge"` // P
	Spin           [3]float64 `toml:"spin"`            // a (ring radius vector)
}

// ProbeSpec describes the probe.
type ProbeSpec struct {
	Kind           string     `toml:"kind"` // charge | dyon | bmt | root-kerr
	Mass           float64    `toml:"mass"`
	Charge         float64    `toml:"charge"`
	MagneticCharge float64    `toml:"magnetic_charge"`
	Gyro           float64    `toml:"gyro"` // g for kind = "bmt" (0 means 2)
	Spin           [3]float64 `toml:"spin"` // rest-frame spin vector a
}

// KinematicsSpec gives the incoming asymptotic data.
type KinematicsSpec struct {
	Gamma float64 `toml:"gamma"` // Lorentz factor (or give v)
	V     float64 `toml:"v"`     // speed at infinity
	B     float64 `toml:"b"`     // impact parameter (0 means 1)
}

// ScanSpec gives the coupling scan of `ricochet scan`.
type ScanSpec struct {
	EpsMin float64 `toml:"eps_min"` // smallest |ε| (0 means 1e-4)
	EpsMax float64 `toml:"eps_max"` // largest |ε| (0 means 0.1)
	Points int     `toml:"points"`  // number of log-spaced points (0 means 13)
}

// NumericsSpec gives the integrator settings.
type NumericsSpec struct {
	Tol    float64 `toml:"tol"`    // 0 means the driver default
	Radius float64 `toml:"radius"` // start/stop radius in b; 0 means automatic
	Method string  `toml:"method"` // dop853 | dopri5 | tsit5
}

//go:embed scenarios/*.toml
var builtinFS embed.FS

// builtinNames lists the built-in scenarios.
func builtinNames() []string {
	ents, _ := builtinFS.ReadDir("scenarios")
	var names []string
	for _, e := range ents {
		names = append(names, strings.TrimSuffix(e.Name(), ".toml"))
	}
	sort.Strings(names)
	return names
}

// loadBuiltin returns the named built-in scenario's TOML text.
func loadBuiltin(name string) ([]byte, error) {
	b, err := builtinFS.ReadFile("scenarios/" + name + ".toml")
	if err != nil {
		return nil, fmt.Errorf("no built-in scenario %q (have: %s)", name, strings.Join(builtinNames(), ", "))
	}
	return b, nil
}

// parseScenario decodes TOML strictly.
func parseScenario(data []byte, origin string) (*Scenario, error) {
	var s Scenario
	md, err := toml.NewDecoder(bytes.NewReader(data)).Decode(&s)
	if err != nil {
		return nil, fmt.Errorf("%s: %v", origin, err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		keys := make([]string, len(und))
		for i, k := range und {
			keys[i] = k.String()
		}
		return nil, fmt.Errorf("%s: unknown key %s", origin, strings.Join(keys, ", "))
	}
	return &s, nil
}

// inputError marks bad user input (exit status 2).
type inputError struct{ msg string }

func (e inputError) Error() string { return e.msg }

func badf(format string, args ...any) error { return inputError{fmt.Sprintf(format, args...)} }

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// validate fills defaults and checks every field, returning a one-line
// error naming the field and the allowed range.
func (s *Scenario) validate() error {
	bg := &s.Background
	switch bg.Kind {
	case "coulomb", "monopole", "dyon", "root-kerr":
	case "":
		return badf("background.kind is missing; allowed: coulomb, monopole, dyon, root-kerr")
	default:
		return badf("background.kind = %q; allowed: coulomb, monopole, dyon, root-kerr", bg.Kind)
	}
	for _, x := range []float64{bg.Charge, bg.MagneticCharge, bg.Spin[0], bg.Spin[1], bg.Spin[2]} {
		if !finite(x) {
			return badf("background: charges and spin must be finite")
		}
	}
	if bg.Kind != "root-kerr" && bg.Spin != [3]float64{} {
		return badf("background.spin = %v is only allowed for kind root-kerr", bg.Spin)
	}
	if bg.Kind == "coulomb" && bg.MagneticCharge != 0 {
		return badf("background.magnetic_charge = %g: a coulomb source has none (use dyon)", bg.MagneticCharge)
	}
	if bg.Kind == "monopole" && bg.Charge != 0 {
		return badf("background.charge = %g: a monopole has none (use dyon)", bg.Charge)
	}
	pr := &s.Probe
	switch pr.Kind {
	case "charge", "dyon", "bmt", "root-kerr":
	case "":
		return badf("probe.kind is missing; allowed: charge, dyon, bmt, root-kerr")
	default:
		return badf("probe.kind = %q; allowed: charge, dyon, bmt, root-kerr", pr.Kind)
	}
	if pr.Mass == 0 {
		pr.Mass = 1
	}
	if !(pr.Mass > 0) || !finite(pr.Mass) {
		return badf("probe.mass = %g; allowed: 0 < mass < ∞", pr.Mass)
	}
	if pr.Kind == "charge" && pr.MagneticCharge != 0 {
		return badf("probe.magnetic_charge = %g: kind charge has none (use dyon)", pr.MagneticCharge)
	}
	if (pr.Kind == "charge" || pr.Kind == "dyon") && pr.Spin != [3]float64{} {
		return badf("probe.spin = %v: kind %s is spinless (use bmt or root-kerr)", pr.Spin, pr.Kind)
	}
	if pr.Gyro != 0 && pr.Kind != "bmt" {
		return badf("probe.gyro = %g is only allowed for kind bmt", pr.Gyro)
	}
	if pr.Kind == "bmt" && pr.Gyro == 0 {
		pr.Gyro = 2
	}
	if !finite(pr.Gyro) || !finite(pr.Charge) || !finite(pr.MagneticCharge) {
		return badf("probe: charges and gyro must be finite")
	}
	if pr.Charge == 0 && pr.MagneticCharge == 0 {
		return badf("probe.charge = 0 and probe.magnetic_charge = 0: the probe does not couple")
	}
	k := &s.Kinematics
	switch {
	case k.Gamma != 0 && k.V != 0:
		return badf("kinematics: give gamma or v, not both")
	case k.V != 0:
		if !(k.V > 0 && k.V < 1) {
			return badf("kinematics.v = %g; allowed: 0 < v < 1", k.V)
		}
		k.Gamma = 1 / math.Sqrt((1-k.V)*(1+k.V))
	case k.Gamma == 0:
		return badf("kinematics.gamma is missing; allowed: 1 < gamma < ∞ (or give v)")
	}
	if !(k.Gamma > 1) || !finite(k.Gamma) {
		return badf("kinematics.gamma = %g; allowed: 1 < gamma < ∞", k.Gamma)
	}
	k.V = math.Sqrt((k.Gamma-1)*(k.Gamma+1)) / k.Gamma
	if k.B == 0 {
		k.B = 1
	}
	if !(k.B > 0) || !finite(k.B) {
		return badf("kinematics.b = %g; allowed: 0 < b < ∞", k.B)
	}
	sc := &s.Scan
	if sc.EpsMin == 0 {
		sc.EpsMin = 1e-4
	}
	if sc.EpsMax == 0 {
		sc.EpsMax = 0.1
	}
	if sc.Points == 0 {
		sc.Points = 13
	}
	if !(sc.EpsMin > 0) || !finite(sc.EpsMin) {
		return badf("scan.eps_min = %g; allowed: 0 < eps_min < eps_max", sc.EpsMin)
	}
	if !(sc.EpsMax > sc.EpsMin) || !finite(sc.EpsMax) {
		return badf("scan.eps_max = %g; allowed: eps_min (%g) < eps_max < ∞", sc.EpsMax, sc.EpsMin)
	}
	if sc.Points < 2 || sc.Points > 10000 {
		return badf("scan.points = %d; allowed: 2 ≤ points ≤ 10000", sc.Points)
	}
	n := &s.Numerics
	if n.Tol != 0 && !(n.Tol >= 1e-15 && n.Tol <= 1e-3) {
		return badf("numerics.tol = %g; allowed: 1e-15 ≤ tol ≤ 1e-3 (0 for the default)", n.Tol)
	}
	if n.Radius != 0 && !(n.Radius >= 10 && n.Radius <= 1e12) {
		return badf("numerics.radius = %g; allowed: 10 ≤ radius ≤ 1e12 (in units of b; 0 for automatic)", n.Radius)
	}
	if _, err := methodByName(n.Method); err != nil {
		return err
	}
	if s.coupling() == 0 {
		return badf("background: charge and magnetic_charge are both zero, the coupling ε vanishes")
	}
	return nil
}

// coupling returns the complex coupling (q − ig)(Q + iP)/(m b), whose
// modulus (signed by its real part, or + when that is zero) is ε.
func (s *Scenario) coupling() complex128 {
	c := complex(s.Probe.Charge, -s.Probe.MagneticCharge) * complex(s.Background.Charge, s.Background.MagneticCharge)
	return c / complex(s.Probe.Mass*s.Kinematics.B, 0)
}

// Epsilon returns the signed coupling ε of the scenario as given.
func (s *Scenario) Epsilon() float64 {
	c := s.coupling()
	e := cmplx.Abs(c)
	if real(c) < 0 {
		e = -e
	}
	return e
}

// WithEpsilon returns a copy with the background's charges scaled so that
// |ε| = eps, keeping the duality phase, the sign, γ and all spin-to-b
// ratios fixed.
func (s *Scenario) WithEpsilon(eps float64) *Scenario {
	c := *s
	f := eps / math.Abs(s.Epsilon())
	c.Background.Charge *= f
	c.Background.MagneticCharge *= f
	return &c
}

// Event is a scenario turned into library objects.
type Event struct {
	Model  integrate.Model
	In     integrate.InState
	Source em.RootKerr
}

// Build constructs the model and the in-state.
func (s *Scenario) Build() (Event, error) {
	bg := s.Background
	src := em.RootKerr{Q: bg.Charge, P: bg.MagneticCharge, A: vec.Vec3(bg.Spin).Scale(s.Kinematics.B / s.Kinematics.B)}
	var field em.Field = src
	pr := s.Probe
	var m integrate.Model
	switch pr.Kind {
	case "charge", "dyon":
		m = &integrate.Charge{Field: field, M: pr.Mass, Q: pr.Charge, G: pr.MagneticCharge}
	case "bmt":
		m = &integrate.BMT{Field: field, M: pr.Mass, Q: pr.Charge, G: pr.MagneticCharge, Gyro: pr.Gyro}
	case "root-kerr":
		m = &integrate.RootKerr{Field: field, M: pr.Mass, Q: pr.Charge, G: pr.MagneticCharge}
	}
	spin := vec.Vec3(pr.Spin)
	in, err := integrate.Incoming(pr.Mass, s.Kinematics.Gamma, s.Kinematics.B, spin)
	if err != nil {
		return Event{}, badf("%v", err)
	}
	if m.Dim() == 8 {
		in.A = vec.Vec4{}
	}
	return Event{Model: m, In: in, Source: src}, nil
}

// FirstOrder returns the first-order prediction and the formula used.
func (ev Event) FirstOrder(s *Scenario) (dp, da vec.Vec4, source string) {
	switch s.Probe.Kind {
	case "charge", "dyon", "root-kerr":
		pr := leading.EMProbe{M: s.Probe.Mass, Q: s.Probe.Charge, G: s.Probe.MagneticCharge, A: ev.In.A}
		src := leading.EMSource{Q: ev.Source.Q, P: ev.Source.P, A: ev.Source.A}
		u := ev.In.P.Scale(1 / s.Probe.Mass)
		if !leading.EMCrossesDisk(pr, src, u, ev.In.B) {
			dp, da = leading.EMImpulse(pr, src, u, ev.In.B)
			return dp, da, "closed form: complex-shifted impact parameter b − iΠ(a₁+a₂), dyonic phase (q−ig)(Q+iP)"
		}
	}
	dp, da = integrate.FirstOrder(ev.Model, ev.In, 0)
	return dp, da, "quadrature of the first-order force and torque along the straight line"
}
