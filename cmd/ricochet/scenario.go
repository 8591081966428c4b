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
	"ricochet/background/spacetime"
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
	// Kind: flat space coulomb | monopole | dyon | root-kerr; curved
	// schwarzschild | reissner-nordstrom | kerr | kerr-newman | taub-nut |
	// kerr-taub-nut.
	Kind           string     `toml:"kind"`
	Charge         float64    `toml:"charge"`          // Q (Gaussian)
	MagneticCharge float64    `toml:"magnetic_charge"` // P (flat space only)
	Spin           [3]float64 `toml:"spin"`            // a (ring radius vector; along +z for curved kinds)
	Mass           float64    `toml:"mass"`            // M (curved kinds)
	NUT            float64    `toml:"nut"`             // NUT parameter N (taub-nut, kerr-taub-nut)
	StringGauge    float64    `toml:"string_gauge"`    // Misner-string gauge C ∈ [−1, 1] (NUT kinds)
}

// curved reports whether the background is a spacetime.
func (b BackgroundSpec) curved() bool {
	switch b.Kind {
	case "schwarzschild", "reissner-nordstrom", "kerr", "kerr-newman", "taub-nut", "kerr-taub-nut":
		return true
	}
	return false
}

// ProbeSpec describes the probe.
type ProbeSpec struct {
	Kind           string     `toml:"kind"` // charge | dyon | bmt | root-kerr (flat); geodesic (curved, charged if charge ≠ 0)
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
	const kinds = "coulomb, monopole, dyon, root-kerr, schwarzschild, reissner-nordstrom, kerr, kerr-newman, taub-nut, kerr-taub-nut"
	switch bg.Kind {
	case "coulomb", "monopole", "dyon", "root-kerr":
		if bg.Mass != 0 || bg.NUT != 0 || bg.StringGauge != 0 {
			return badf("background.mass, nut and string_gauge are for curved kinds only (kind = %q)", bg.Kind)
		}
	case "":
		return badf("background.kind is missing; allowed: %s", kinds)
	default:
		if !bg.curved() {
			return badf("background.kind = %q; allowed: %s", bg.Kind, kinds)
		}
		return s.validateCurved()
	}
	for _, x := range []float64{bg.Charge, bg.MagneticCharge, bg.Spin[0], bg.Spin[1], bg.Spin[2]} {
		if !finite(x) {
			return badf("background: charges and spin must be finite")
		}
	}
	if s.Probe.Kind == "geodesic" {
		return badf("probe.kind = \"geodesic\" needs a curved background (background.kind = %q)", bg.Kind)
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
	if err := s.validateProbe(); err != nil {
		return err
	}
	if err := s.validateRest(); err != nil {
		return err
	}
	if s.coupling() == 0 {
		return badf("background: charge and magnetic_charge are both zero, the coupling ε vanishes")
	}
	return nil
}

// validateCurved checks a curved background and its probe.
func (s *Scenario) validateCurved() error {
	bg := &s.Background
	for _, x := range []float64{bg.Mass, bg.NUT, bg.Charge, bg.StringGauge, bg.Spin[0], bg.Spin[1], bg.Spin[2]} {
		if !finite(x) {
			return badf("background: mass, nut, charge, string_gauge and spin must be finite")
		}
	}
	if bg.MagneticCharge != 0 {
		return badf("background.magnetic_charge = %g: not available for curved kinds", bg.MagneticCharge)
	}
	if bg.Spin[0] != 0 || bg.Spin[1] != 0 {
		return badf("background.spin = %v: curved backgrounds spin along +z; give [0, 0, a]", bg.Spin)
	}
	spin := bg.Kind == "kerr" || bg.Kind == "kerr-newman" || bg.Kind == "kerr-taub-nut"
	charge := bg.Kind == "reissner-nordstrom" || bg.Kind == "kerr-newman" || bg.Kind == "kerr-taub-nut"
	nut := bg.Kind == "taub-nut" || bg.Kind == "kerr-taub-nut"
	switch {
	case !spin && bg.Spin[2] != 0:
		return badf("background.spin = %v: kind %s has no spin (use kerr, kerr-newman or kerr-taub-nut)", bg.Spin, bg.Kind)
	case !charge && bg.Charge != 0:
		return badf("background.charge = %g: kind %s has no charge (use reissner-nordstrom or kerr-newman)", bg.Charge, bg.Kind)
	case !nut && (bg.NUT != 0 || bg.StringGauge != 0):
		return badf("background.nut/string_gauge: kind %s has no NUT parameter (use taub-nut or kerr-taub-nut)", bg.Kind)
	case bg.StringGauge < -1 || bg.StringGauge > 1:
		return badf("background.string_gauge = %g; allowed: -1 ≤ string_gauge ≤ 1", bg.StringGauge)
	}
	if !(bg.Mass >= 0) {
		return badf("background.mass = %g; allowed: 0 ≤ mass < ∞", bg.Mass)
	}
	if bg.Mass == 0 && bg.NUT == 0 {
		return badf("background.mass and background.nut are both zero, the coupling ε vanishes")
	}
	pr := &s.Probe
	if pr.Kind != "geodesic" {
		return badf("probe.kind = %q: a curved background takes probe kind geodesic", pr.Kind)
	}
	if pr.Mass == 0 {
		pr.Mass = 1
	}
	if !(pr.Mass > 0) || !finite(pr.Mass) || !finite(pr.Charge) {
		return badf("probe.mass = %g; allowed: 0 < mass < ∞ (and a finite charge)", pr.Mass)
	}
	if pr.MagneticCharge != 0 || pr.Gyro != 0 || pr.Spin != [3]float64{} {
		return badf("probe: kind geodesic takes mass and charge only (no magnetic_charge, gyro or spin)")
	}
	return s.validateRest()
}

// validateProbe checks a flat-space probe.
func (s *Scenario) validateProbe() error {
	pr := &s.Probe
	switch pr.Kind {
	case "charge", "dyon", "bmt", "root-kerr":
	case "":
		return badf("probe.kind is missing; allowed: charge, dyon, bmt, root-kerr (flat), geodesic (curved)")
	default:
		return badf("probe.kind = %q; allowed for a flat background: charge, dyon, bmt, root-kerr", pr.Kind)
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
	return nil
}

// validateRest checks kinematics, scan and numerics.
func (s *Scenario) validateRest() error {
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
	return nil
}

// coupling returns the complex coupling whose modulus (signed by its real
// part, or + when that is zero) is ε: (q − ig)(Q + iP)/(m b) in flat space
// and (M + iN)/b for curved backgrounds.
func (s *Scenario) coupling() complex128 {
	if s.Background.curved() {
		return complex(s.Background.Mass, s.Background.NUT) / complex(s.Kinematics.B, 0)
	}
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
	c.Background.Mass *= f
	c.Background.NUT *= f
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
	if bg.curved() {
		var metric spacetime.Metric
		if bg.Kind == "taub-nut" || bg.Kind == "kerr-taub-nut" {
			metric = spacetime.KerrNewmanNUT{M: bg.Mass, A: bg.Spin[2], Q: bg.Charge, N: bg.NUT, StringGauge: bg.StringGauge}
		} else {
			metric = spacetime.KerrNewman{M: bg.Mass, A: bg.Spin[2], Q: bg.Charge}
		}
		in, err := integrate.Incoming(s.Probe.Mass, s.Kinematics.Gamma, s.Kinematics.B, vec.Vec3{})
		if err != nil {
			return Event{}, badf("%v", err)
		}
		return Event{Model: &integrate.Geodesic{Metric: metric, M: s.Probe.Mass, Q: s.Probe.Charge}, In: in}, nil
	}
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

// BuildMember is Build with the probe replaced by member k of the
// root-Kerr family (integrate.RootKerrFamily) in the same field; k < 0
// keeps the scenario's own probe.
func (s *Scenario) BuildMember(k int) (Event, error) {
	ev, err := s.Build()
	if err != nil || k < 0 {
		return ev, err
	}
	fam := integrate.RootKerrFamily(ev.Source, s.Probe.Mass, s.Probe.Charge, s.Probe.MagneticCharge)
	if k >= len(fam) {
		return ev, fmt.Errorf("no member %d of the root-Kerr family", k)
	}
	ev.Model = fam[k]
	return ev, nil
}

// familyNames returns the names of the root-Kerr family's members.
func (s *Scenario) familyNames() []string {
	var names []string
	for _, m := range integrate.RootKerrFamily(em.RootKerr{}, 1, 1, 0) {
		names = append(names, m.Name())
	}
	return names
}

// FirstOrder returns the first-order prediction and the formula used: the
// closed form where one applies to the event's model, else quadrature of
// the model's own first-order force and torque. The two full completions
// of the root-Kerr probe share the closed form; the dipole truncation
// (BMT) takes its own first order by quadrature.
func (ev Event) FirstOrder(s *Scenario) (dp, da vec.Vec4, source string) {
	if bg := s.Background; bg.curved() {
		u := ev.In.P.Scale(1 / s.Probe.Mass)
		dp = leading.Impulse1PM(leading.GravProbe{M: s.Probe.Mass, Q: s.Probe.Charge},
			leading.GravSource{M: bg.Mass, N: bg.NUT, Q: bg.Charge, A: vec.Vec3(bg.Spin)}, u, ev.In.B)
		return dp, vec.Vec4{}, "closed form: 1PM impulse, complex impact parameter b − iΠa, mass–NUT phase (Vines 2017; Emond et al. 2020)"
	}
	kind := s.Probe.Kind
	if _, ok := ev.Model.(*integrate.BMT); ok {
		kind = "bmt"
	}
	switch kind {
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

// superExtremal returns a warning for curved backgrounds without a horizon
// (a² + Q² > M² + N² in the Kerr–Newman–NUT family: Δ has no real root),
// which are allowed because perturbative checks need them.
func (s *Scenario) superExtremal() string {
	bg := s.Background
	if !bg.curved() {
		return ""
	}
	a := bg.Spin[2]
	if a*a+bg.Charge*bg.Charge > bg.Mass*bg.Mass+bg.NUT*bg.NUT {
		return fmt.Sprintf("super-extremal background (a² + Q² = %.4g > M² + N² = %.4g): no horizon; a naked ring singularity is reported if reached", a*a+bg.Charge*bg.Charge, bg.Mass*bg.Mass+bg.NUT*bg.NUT)
	}
	return ""
}
