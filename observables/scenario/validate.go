package scenario

import (
	"fmt"
	"math"
	"strings"

	"ricochet/background/vec"
	"ricochet/integrate"
)

// The ranges of validation. They keep every event computable in float64:
// squares and products of the lengths, momenta and couplings that the
// driver forms stay far from overflow and underflow, the start radius
// (up to 1e9 b, and 1e12 b when given) lies far outside the source's and
// the probe's spin rings, and the first order is finite.
const (
	// MaxScale bounds the magnitude of dimensionful inputs (b, masses,
	// charges): a nonzero one lies in [1/MaxScale, MaxScale].
	MaxScale = 1e100
	// MaxSpinOverB bounds every spin (and the charge length of a curved
	// background) in units of b. Rule of thumb: the start radius (10³ b
	// by default) must lie far outside every ring, and a spinning probe
	// much larger than its impact parameter makes the integrator fail
	// (measured: a bmt probe of spin 25 b at |ε| = 78).
	MaxSpinOverB = 10
	// MaxGamma bounds the Lorentz factor at infinity.
	MaxGamma = 1e8
	// MinV bounds the speed at infinity from below.
	MinV = 1e-6
	// MinEpsilon and MaxEpsilon bound |ε| of the scenario and of its
	// scan in flat space. Rule of thumb for the upper bound: far beyond
	// ε ~ 1 an attracted probe is captured and a repelled one turns back
	// far outside b, and spinning probes made the integrator fail
	// (measured: a bmt probe at |ε| = 78).
	MinEpsilon, MaxEpsilon = 1e-20, 10
	// MaxGravEpsilon bounds the gravitational |ε| = |M + iN|/b: b ≥ |M +
	// iN|. Closer in, a Schwarzschild probe is captured at any speed
	// (critical impact parameter 3√3 M at v → 1, larger below; from
	// memory) and perturbative checks have no meaning; measured: a
	// Dixon probe at M/b = 129 on a taub-nut background ran for tens of
	// seconds to an integrator failure.
	MaxGravEpsilon = 1
	// MaxGyro bounds |g| of a bmt probe.
	MaxGyro = 1e3
	// MinPiraniSpin bounds a nonzero probe spin under the Pirani
	// condition from below, in units of b: its helical mode of frequency
	// m/|S| sets the explicit steps, whose number grows like R/|a|
	// (measured: 6e5 evaluations per event at |a| = 0.2 b, R = 1e3 b).
	MinPiraniSpin = 0.01
	// MaxCurvedEM bounds the electromagnetic coupling |q Q|/(m b) of a
	// charged probe on a charged curved background (measured: a Dixon
	// probe with |q Q|/(m b) = 82 on a naked Reissner–Nordström
	// background made the integrator fail; the gravitational checks
	// this family serves are perturbative).
	MaxCurvedEM = 10
)

// minGamma is γ at MinV, 1 + 5e-13.
var minGamma = 1 / math.Sqrt((1-MinV)*(1+MinV))

// Validate fills defaults and checks every field, returning a one-line
// error naming the field, the value and the allowed range. A zero given
// explicitly in the scenario file (or marked by MarkGiven) where zero
// stands for a default is refused; left out, the documented default is
// filled in (probe mass 1, b = 1, g = 2, scan 1e-4 ≤ |ε| ≤ 0.1 at 13
// points). A validated scenario builds (Build) and has a finite first
// order wherever the first-order formula applies (FirstOrderApplies).
func (s *Scenario) Validate() error {
	if err := s.validateKinematics(); err != nil {
		return err
	}
	bg := &s.Background
	const kinds = "coulomb, monopole, dyon, root-kerr, schwarzschild, reissner-nordstrom, kerr, kerr-newman, taub-nut, kerr-taub-nut"
	switch bg.Kind {
	case "coulomb", "monopole", "dyon", "root-kerr":
		if err := s.validateFlat(); err != nil {
			return err
		}
	case "":
		return Badf("background.kind is missing; allowed: %s", kinds)
	default:
		if !bg.Curved() {
			return Badf("background.kind = %q; allowed: %s", bg.Kind, kinds)
		}
		if err := s.validateCurved(); err != nil {
			return err
		}
	}
	if err := s.validateSSC(); err != nil {
		return err
	}
	if err := s.validateRest(); err != nil {
		return err
	}
	return s.validateEvent()
}

// validateSSC checks probe.ssc: any condition for kind dixon on a curved
// background, Tulczyjew's only elsewhere; Pirani and
// Ohashi–Kyrian–Semerák for a neutral pole–dipole body without NUT
// charge, Pirani with no spin or |spin| ≥ MinPiraniSpin b.
func (s *Scenario) validateSSC() error {
	pr := &s.Probe
	allowed := strings.Join(integrate.SSCNames(), ", ")
	c, err := integrate.ParseSSC(pr.SSC)
	if err != nil {
		return Badf("probe.ssc = %q; allowed: %s", pr.SSC, allowed)
	}
	if c == integrate.Tulczyjew {
		if pr.Kind == "dixon" && s.Background.Curved() {
			pr.SSC = c.String() // the default, echoed with the scenario
		}
		return nil
	}
	switch {
	case pr.Kind != "dixon" || !s.Background.Curved():
		return Badf("probe.ssc = %q; allowed: tulczyjew only, but for probe kind dixon on a curved background (%s)", pr.SSC, allowed)
	case pr.Charge != 0:
		return Badf("probe.ssc = %q with probe.charge = %g; allowed: a neutral probe (charge = 0) for ssc %s", pr.SSC, pr.Charge, pr.SSC)
	case pr.CES2 != 0:
		return Badf("probe.ssc = %q with probe.ces2 = %g; allowed: the pole–dipole body (ces2 = 0) for ssc %s", pr.SSC, pr.CES2, pr.SSC)
	case pr.NUT != 0:
		return Badf("probe.ssc = %q with probe.nut = %g; allowed: nut = 0 for ssc %s", pr.SSC, pr.NUT, pr.SSC)
	}
	if n := spinNorm(pr.Spin); c == integrate.Pirani && n != 0 && n < MinPiraniSpin*s.Kinematics.B {
		return Badf("probe.spin = %v with probe.ssc = \"pirani\"; allowed: |spin| = 0 or ≥ %g b (= %g; the helical mode sets the step count, ∝ 1/|spin|)", pr.Spin, float64(MinPiraniSpin), MinPiraniSpin*s.Kinematics.B)
	}
	return nil
}

// validateKinematics checks and completes the incoming data.
func (s *Scenario) validateKinematics() error {
	k := &s.Kinematics
	switch {
	case k.Gamma != 0 && k.V != 0:
		return Badf("kinematics: gamma = %g and v = %g; allowed: one of gamma and v, not both", k.Gamma, k.V)
	case k.V != 0:
		if !(k.V >= MinV && k.V < 1) {
			return Badf("kinematics.v = %g; allowed: %g ≤ v < 1", k.V, MinV)
		}
		k.Gamma = 1 / math.Sqrt((1-k.V)*(1+k.V))
		if !(k.Gamma <= MaxGamma) {
			return Badf("kinematics.v = %v; allowed: %g ≤ v ≤ 1 − 5e-17 (gamma ≤ %g)", k.V, MinV, MaxGamma)
		}
	case k.Gamma == 0:
		return Badf("kinematics.gamma is missing; allowed: 1 + 5e-13 ≤ gamma ≤ %g (or give v, %g ≤ v < 1)", MaxGamma, MinV)
	}
	if !(k.Gamma >= minGamma && k.Gamma <= MaxGamma) {
		return Badf("kinematics.gamma = %g; allowed: 1 + 5e-13 ≤ gamma ≤ %g (speed v ≥ %g)", k.Gamma, MaxGamma, MinV)
	}
	k.V = math.Sqrt((k.Gamma-1)*(k.Gamma+1)) / k.Gamma
	if k.B == 0 && !s.given.has("kinematics.b") {
		k.B = 1
	}
	if !(k.B >= 1/MaxScale && k.B <= MaxScale) {
		return Badf("kinematics.b = %g; allowed: %g ≤ b ≤ %g (omit for 1)", k.B, 1/MaxScale, MaxScale)
	}
	return nil
}

// checkScale checks a dimensionful input: finite, and zero or of
// magnitude in [1/MaxScale, MaxScale].
func checkScale(field string, x float64) error {
	if x == 0 {
		return nil
	}
	if a := math.Abs(x); !(a >= 1/MaxScale && a <= MaxScale) {
		return Badf("%s = %g; allowed: 0 or %g ≤ |%s| ≤ %g", field, x, 1/MaxScale, leaf(field), MaxScale)
	}
	return nil
}

// checkSpin checks a spin vector: finite components, |a| ≤ MaxSpinOverB b.
func (s *Scenario) checkSpin(field string, a [3]float64) error {
	n := vec.Vec3(a).Norm()
	b := s.Kinematics.B
	if !finite(a[0]) || !finite(a[1]) || !finite(a[2]) || !(n <= MaxSpinOverB*b) {
		return Badf("%s = %v; allowed: finite components, |spin| ≤ %g b (= %g)", field, a, float64(MaxSpinOverB), MaxSpinOverB*b)
	}
	for k, x := range a {
		if err := checkScale(fmt.Sprintf("%s[%d]", field, k), x); err != nil {
			return err
		}
	}
	return nil
}

func leaf(field string) string {
	for i := len(field) - 1; i >= 0; i-- {
		if field[i] == '.' {
			return field[i+1:]
		}
	}
	return field
}

// validateFlat checks a flat-space background and its probe.
func (s *Scenario) validateFlat() error {
	bg := &s.Background
	for _, f := range []struct {
		name string
		x    float64
	}{{"background.mass", bg.Mass}, {"background.nut", bg.NUT}, {"background.string_gauge", bg.StringGauge}} {
		if f.x != 0 {
			return Badf("%s = %g; allowed: 0 for the flat kind %s (mass, nut and string_gauge are for curved kinds)", f.name, f.x, bg.Kind)
		}
	}
	if err := checkScale("background.charge", bg.Charge); err != nil {
		return err
	}
	if err := checkScale("background.magnetic_charge", bg.MagneticCharge); err != nil {
		return err
	}
	if err := s.checkSpin("background.spin", bg.Spin); err != nil {
		return err
	}
	if s.Probe.Kind == "geodesic" {
		return Badf("probe.kind = \"geodesic\" needs a curved background (background.kind = %q); allowed for a flat background: charge, dyon, bmt, root-kerr", bg.Kind)
	}
	if bg.Kind != "root-kerr" && bg.Spin != [3]float64{} {
		return Badf("background.spin = %v; allowed: [0, 0, 0] for kind %s (a spinning source is kind root-kerr)", bg.Spin, bg.Kind)
	}
	if bg.Kind == "coulomb" && bg.MagneticCharge != 0 {
		return Badf("background.magnetic_charge = %g; allowed: 0 for a coulomb source (use dyon)", bg.MagneticCharge)
	}
	if bg.Kind == "monopole" && bg.Charge != 0 {
		return Badf("background.charge = %g; allowed: 0 for a monopole (use dyon)", bg.Charge)
	}
	if err := s.validateProbe(); err != nil {
		return err
	}
	if err := s.validateHold(false); err != nil {
		return err
	}
	if s.Coupling() == 0 {
		return Badf("background.charge = 0 and background.magnetic_charge = 0: the coupling ε vanishes; allowed: a nonzero charge")
	}
	return nil
}

// validateProbeMass fills and checks the probe mass.
func (s *Scenario) validateProbeMass() error {
	pr := &s.Probe
	if pr.Mass == 0 && !s.given.has("probe.mass") {
		pr.Mass = 1
	}
	if !(pr.Mass >= 1/MaxScale && pr.Mass <= MaxScale) {
		return Badf("probe.mass = %g; allowed: %g ≤ mass ≤ %g (omit for 1)", pr.Mass, 1/MaxScale, MaxScale)
	}
	return nil
}

// validateCurved checks a curved background and its probe.
func (s *Scenario) validateCurved() error {
	bg := &s.Background
	for _, f := range []struct {
		name string
		x    float64
	}{{"background.mass", bg.Mass}, {"background.nut", bg.NUT}, {"background.charge", bg.Charge}, {"background.magnetic_charge", bg.MagneticCharge}, {"background.string_gauge", bg.StringGauge}} {
		if !finite(f.x) {
			return Badf("%s = %g; allowed: a finite number", f.name, f.x)
		}
	}
	if err := s.checkSpin("background.spin", bg.Spin); err != nil {
		return err
	}
	spin := bg.Kind == "kerr" || bg.Kind == "kerr-newman" || bg.Kind == "kerr-taub-nut"
	charge := bg.Kind == "reissner-nordstrom" || bg.Kind == "kerr-newman" || bg.Kind == "kerr-taub-nut"
	nut := bg.Kind == "taub-nut" || bg.Kind == "kerr-taub-nut"
	switch {
	case !spin && bg.Spin != [3]float64{}:
		return Badf("background.spin = %v; allowed: [0, 0, 0] for kind %s (use kerr, kerr-newman or kerr-taub-nut)", bg.Spin, bg.Kind)
	case !charge && bg.Charge != 0:
		return Badf("background.charge = %g; allowed: 0 for kind %s (use reissner-nordstrom, kerr-newman or kerr-taub-nut)", bg.Charge, bg.Kind)
	case !charge && bg.MagneticCharge != 0:
		return Badf("background.magnetic_charge = %g; allowed: 0 for kind %s (use reissner-nordstrom, kerr-newman or kerr-taub-nut)", bg.MagneticCharge, bg.Kind)
	case !nut && bg.NUT != 0:
		return Badf("background.nut = %g; allowed: 0 for kind %s (use taub-nut or kerr-taub-nut)", bg.NUT, bg.Kind)
	case !nut && bg.StringGauge != 0:
		return Badf("background.string_gauge = %g; allowed: 0 for kind %s (use taub-nut or kerr-taub-nut)", bg.StringGauge, bg.Kind)
	case bg.StringGauge < -1 || bg.StringGauge > 1:
		return Badf("background.string_gauge = %g; allowed: -1 ≤ string_gauge ≤ 1", bg.StringGauge)
	}
	if !(bg.Mass >= 0) {
		return Badf("background.mass = %g; allowed: 0 ≤ mass (with mass or nut nonzero)", bg.Mass)
	}
	for _, f := range []struct {
		name string
		x    float64
	}{{"background.mass", bg.Mass}, {"background.nut", bg.NUT}, {"background.charge", bg.Charge}, {"background.magnetic_charge", bg.MagneticCharge}} {
		if err := checkScale(f.name, f.x); err != nil {
			return err
		}
	}
	if q := math.Abs(bg.Charge); q > MaxSpinOverB*s.Kinematics.B {
		return Badf("background.charge = %g; allowed: |charge| ≤ %g b (= %g)", bg.Charge, float64(MaxSpinOverB), MaxSpinOverB*s.Kinematics.B)
	}
	if q := math.Hypot(bg.Charge, bg.MagneticCharge); q > MaxSpinOverB*s.Kinematics.B {
		return Badf("background.magnetic_charge = %g; allowed: sqrt(charge² + magnetic_charge²) ≤ %g b (= %g)", bg.MagneticCharge, float64(MaxSpinOverB), MaxSpinOverB*s.Kinematics.B)
	}
	if bg.Mass == 0 && bg.NUT == 0 {
		return Badf("background.mass = 0 and background.nut = 0: the coupling ε vanishes; allowed: mass > 0 or nut ≠ 0")
	}
	pr := &s.Probe
	switch pr.Kind {
	case "geodesic", "dixon", "kerr-probe", "kerr-probe-ks":
	case "":
		return Badf("probe.kind is missing; allowed for a curved background: geodesic, dixon, kerr-probe, kerr-probe-ks")
	default:
		return Badf("probe.kind = %q; allowed for a curved background: geodesic, dixon, kerr-probe, kerr-probe-ks", pr.Kind)
	}
	if err := s.validateProbeMass(); err != nil {
		return err
	}
	if !finite(pr.Charge) {
		return Badf("probe.charge = %g; allowed: a finite number", pr.Charge)
	}
	if err := checkScale("probe.charge", pr.Charge); err != nil {
		return err
	}
	if pr.Kind == "geodesic" {
		switch {
		case pr.MagneticCharge != 0:
			return Badf("probe.magnetic_charge = %g; allowed: 0 for kind geodesic (mass and charge only)", pr.MagneticCharge)
		case pr.Gyro != 0 || s.given.has("probe.gyro"):
			return Badf("probe.gyro = %g; allowed: none for kind geodesic (mass and charge only; use kind dixon for spin)", pr.Gyro)
		case pr.Spin != [3]float64{}:
			return Badf("probe.spin = %v; allowed: none for kind geodesic (mass and charge only; use kind dixon for spin)", pr.Spin)
		case pr.NUT != 0:
			return Badf("probe.nut = %g; allowed: 0 for kind geodesic (use kind dixon for a NUT-charged probe)", pr.NUT)
		case pr.CES2 != 0:
			return Badf("probe.ces2 = %g; allowed: 0 for kind geodesic (use kind dixon for a spin-induced quadrupole)", pr.CES2)
		}
	} else if pr.Kind == "kerr-probe" || pr.Kind == "kerr-probe-ks" {
		if err := s.validateKerrProbe(nut); err != nil {
			return err
		}
	} else if err := s.validateDixon(nut); err != nil {
		return err
	}
	if err := s.validateHold(spin); err != nil {
		return err
	}
	if e := math.Abs(pr.Charge) * math.Hypot(bg.Charge, bg.MagneticCharge) / (pr.Mass * s.Kinematics.B); e > MaxCurvedEM {
		return Badf("probe.charge = %g: the electromagnetic coupling |q (Q + iP)|/(m b) = %g on a curved background; allowed: ≤ %g", pr.Charge, e, float64(MaxCurvedEM))
	}
	return nil
}

// validateDixon checks a spinning probe (kind dixon) on a curved
// background; nut reports whether the background family has a NUT
// parameter.
func (s *Scenario) validateDixon(nut bool) error {
	pr := &s.Probe
	if err := s.checkSpin("probe.spin", pr.Spin); err != nil {
		return err
	}
	// A pole–dipole body larger than its impact parameter is outside the
	// model: the Tulczyjew momentum–velocity relation, whose denominator
	// 4m² + R_{μνρσ}S^{μν}S^{ρσ} falls with γ²a²M/r³ (the tidal field
	// seen by the moving body grows like γ²), breaks down and the
	// integration fails (measured on Kerr: M = 0.01 b, γ = 1.3, |a| up to
	// 5 b runs, 20 b fails; M = 0.07 b, γ = 70, |a| = 0.13 b fails). Rule
	// of thumb: γ|a| ≤ b, the boosted spin length below the impact
	// parameter.
	if n := vec.Vec3(pr.Spin).Norm(); s.Kinematics.Gamma*n > s.Kinematics.B {
		return Badf("probe.spin = %v; allowed for kind dixon: gamma |spin| ≤ b (gamma = %g, b = %g)", pr.Spin, s.Kinematics.Gamma, s.Kinematics.B)
	}
	if !finite(pr.NUT) {
		return Badf("probe.nut = %g; allowed: a finite number", pr.NUT)
	}
	if err := checkScale("probe.nut", pr.NUT); err != nil {
		return err

	}
	if !finite(pr.CES2) {
		return Badf("probe.ces2 = %g; allowed: a finite number", pr.CES2)
	}
	if pr.MagneticCharge != 0 {
		return Badf("probe.magnetic_charge = %g; allowed: 0 on curved backgrounds", pr.MagneticCharge)
	}
	if pr.Gyro == 0 && !s.given.has("probe.gyro") {
		pr.Gyro = 2
	}
	if !(math.Abs(pr.Gyro) <= MaxGyro) || pr.Gyro == 0 {
		return Badf("probe.gyro = %g; allowed: 0 < |gyro| ≤ %g (omit for 2)", pr.Gyro, float64(MaxGyro))
	}
	if pr.NUT != 0 && !nut {
		return Badf("probe.nut = %g; allowed: 0 for background kind %s (a NUT-charged probe needs taub-nut or kerr-taub-nut)", pr.NUT, s.Background.Kind)
	}
	if pr.NUT != 0 && pr.Charge != 0 {
		return Badf("probe.nut = %g with probe.charge = %g; allowed: a neutral NUT-charged probe (charge = 0)", pr.NUT, pr.Charge)
	}
	return nil
}

// validateKerrProbe checks the all-multipole Kerr probe (kinds kerr-probe,
// integrate.KerrDixon, and kerr-probe-ks, integrate.KerrProbe): a neutral
// spinning body without gyro or quadrupole coefficient (its multipoles are
// Kerr's), optionally NUT-charged on a background with NUT parameter (nut
// reports whether the background family has one).
func (s *Scenario) validateKerrProbe(nut bool) error {
	pr := &s.Probe
	for _, x := range pr.Spin {
		if !finite(x) {
			return Badf("probe.spin must be finite")
		}
	}
	if pr.Charge != 0 || pr.MagneticCharge != 0 || pr.Gyro != 0 || pr.CES2 != 0 {
		return Badf("probe: kind %s takes mass, spin and nut only (no charge, magnetic_charge, gyro or ces2: its multipoles are those of Kerr)", pr.Kind)
	}
	if !finite(pr.NUT) {
		return Badf("probe.nut = %g; allowed: a finite number", pr.NUT)
	}
	if err := checkScale("probe.nut", pr.NUT); err != nil {
		return err
	}
	if pr.NUT != 0 && !nut {
		return Badf("probe.nut = %g; allowed: 0 for background kind %s (a NUT-charged probe needs taub-nut or kerr-taub-nut)", pr.NUT, s.Background.Kind)
	}
	return nil
}

// validateHold checks scan.hold and fixes the spin-per-mass ratio it
// keeps; spin reports whether the background family has spin.
func (s *Scenario) validateHold(spin bool) error {
	bg := &s.Background
	switch s.Scan.Hold {
	case "", "a_over_b":
		s.Scan.Hold = "a_over_b"
	case "a_over_m":
		if !spin || !(bg.Mass > 0) {
			return Badf("scan.hold = \"a_over_m\" with background kind %s, mass = %g; allowed: a_over_m only for a spinning curved background with mass > 0 (kerr, kerr-newman, kerr-taub-nut)", bg.Kind, bg.Mass)
		}
		a := spinNorm(bg.Spin)
		s.spinPerMass, s.spinDir = a/bg.Mass, unitOrZ(bg.Spin)
	default:
		return Badf("scan.hold = %q; allowed: a_over_b, a_over_m", s.Scan.Hold)
	}
	return nil
}

// validateProbe checks a flat-space probe.
func (s *Scenario) validateProbe() error {
	pr := &s.Probe
	switch pr.Kind {
	case "charge", "dyon", "bmt", "dixon", "root-kerr", "root-kerr-body":
	case "":
		return Badf("probe.kind is missing; allowed: charge, dyon, bmt, dixon, root-kerr, root-kerr-body (flat), geodesic, dixon (curved)")
	default:
		return Badf("probe.kind = %q; allowed for a flat background: charge, dyon, bmt, dixon, root-kerr, root-kerr-body", pr.Kind)
	}
	if err := s.validateProbeMass(); err != nil {
		return err
	}
	if pr.NUT != 0 {
		return Badf("probe.nut = %g; allowed: 0 on a flat background (a NUT charge needs taub-nut or kerr-taub-nut)", pr.NUT)
	}
	if pr.CES2 != 0 {
		return Badf("probe.ces2 = %g; allowed: 0 on a flat background (the spin-induced quadrupole needs a curved background and probe kind dixon)", pr.CES2)
	}
	for _, f := range []struct {
		name string
		x    float64
	}{{"probe.charge", pr.Charge}, {"probe.magnetic_charge", pr.MagneticCharge}} {
		if err := checkScale(f.name, f.x); err != nil {
			return err
		}
	}
	if err := s.checkSpin("probe.spin", pr.Spin); err != nil {
		return err
	}
	if pr.Kind == "charge" && pr.MagneticCharge != 0 {
		return Badf("probe.magnetic_charge = %g; allowed: 0 for kind charge (use dyon)", pr.MagneticCharge)
	}
	if (pr.Kind == "charge" || pr.Kind == "dyon") && pr.Spin != [3]float64{} {
		return Badf("probe.spin = %v; allowed: [0, 0, 0] for kind %s, which is spinless (use bmt, dixon, root-kerr or root-kerr-body)", pr.Spin, pr.Kind)
	}
	gyro := pr.Kind == "bmt" || pr.Kind == "dixon"
	if (pr.Gyro != 0 || s.given.has("probe.gyro")) && !gyro {
		return Badf("probe.gyro = %g; allowed only for kinds bmt and dixon (probe kind %s)", pr.Gyro, pr.Kind)
	}
	if gyro {
		if pr.Gyro == 0 && !s.given.has("probe.gyro") {
			pr.Gyro = 2
		}
		if !(math.Abs(pr.Gyro) <= MaxGyro) || pr.Gyro == 0 {
			return Badf("probe.gyro = %g; allowed: 0 < |gyro| ≤ %g (omit for 2)", pr.Gyro, float64(MaxGyro))
		}
	}
	if pr.Charge == 0 && pr.MagneticCharge == 0 {
		return Badf("probe.charge = 0 and probe.magnetic_charge = 0: the probe does not couple; allowed: a nonzero charge")
	}
	return nil
}

// validateRest checks the coupling, the scan and the numerics.
func (s *Scenario) validateRest() error {
	maxEps := s.maxEpsilon()
	if e := math.Abs(s.Epsilon()); !(e >= MinEpsilon && e <= maxEps) {
		return Badf("%s: the coupling |ε| = %g; allowed: %g ≤ |ε| ≤ %g", s.couplingFields(), e, MinEpsilon, maxEps)
	}
	sc := &s.Scan
	if err := s.validateAxes(); err != nil {
		return err
	}
	if sc.EpsMin == 0 && !s.given.has("scan.eps_min") {
		sc.EpsMin = 1e-4
	}
	if sc.EpsMax == 0 && !s.given.has("scan.eps_max") {
		sc.EpsMax = 0.1
	}
	if sc.Points == 0 && !s.given.has("scan.points") {
		sc.Points = 13
	}
	if !(sc.EpsMin >= MinEpsilon && sc.EpsMin <= maxEps) {
		return Badf("scan.eps_min = %g; allowed: %g ≤ eps_min < eps_max ≤ %g (omit for 1e-4)", sc.EpsMin, MinEpsilon, maxEps)
	}
	if !(sc.EpsMax > sc.EpsMin && sc.EpsMax <= maxEps) {
		return Badf("scan.eps_max = %g; allowed: eps_min (%g) < eps_max ≤ %g (omit for 0.1)", sc.EpsMax, sc.EpsMin, maxEps)
	}
	if sc.Points < 2 || sc.Points > 10000 {
		return Badf("scan.points = %d; allowed: 2 ≤ points ≤ 10000 (omit for 13)", sc.Points)
	}
	n := &s.Numerics
	if n.Tol != 0 && !(n.Tol >= 1e-15 && n.Tol <= 1e-3) {
		return Badf("numerics.tol = %g; allowed: 1e-15 ≤ tol ≤ 1e-3 (0 for the default)", n.Tol)
	}
	if n.Radius != 0 && !(n.Radius >= 10 && n.Radius <= 1e12) {
		return Badf("numerics.radius = %g; allowed: 10 ≤ radius ≤ 1e12 (in units of b; 0 for automatic)", n.Radius)
	}
	if _, err := MethodByName(n.Method); err != nil {
		return err
	}
	return nil
}

// maxEpsilon is the largest |ε| allowed: MaxEpsilon in flat space,
// MaxGravEpsilon on a curved background.
func (s *Scenario) maxEpsilon() float64 {
	if s.Background.Curved() {
		return MaxGravEpsilon
	}
	return MaxEpsilon
}

// couplingFields names the fields that make up ε.
func (s *Scenario) couplingFields() string {
	if s.Background.Curved() {
		return fmt.Sprintf("background.mass = %g, nut = %g, kinematics.b = %g", s.Background.Mass, s.Background.NUT, s.Kinematics.B)
	}
	return fmt.Sprintf("probe.charge = %g, magnetic_charge = %g, mass = %g, background.charge = %g, magnetic_charge = %g, kinematics.b = %g",
		s.Probe.Charge, s.Probe.MagneticCharge, s.Probe.Mass, s.Background.Charge, s.Background.MagneticCharge, s.Kinematics.B)
}

// validateEvent builds the event at the scenario's own coupling and at
// the ends of its scan and checks that the in-state is well formed and
// the first order finite (where the formula applies): what the ranges
// above should guarantee, checked once more on the objects the
// integration will use.
func (s *Scenario) validateEvent() error {
	for _, at := range []*Scenario{s, s.WithEpsilon(s.Scan.EpsMin), s.WithEpsilon(s.Scan.EpsMax)} {
		ev, err := at.Build()
		if err == nil {
			err = ev.In.Validate()
		}
		if err != nil {
			return Badf("kinematics: the in-state cannot be formed at |ε| = %g (%v); allowed: inputs within the ranges of the README", math.Abs(at.Epsilon()), err)
		}
		if ok, _ := ev.FirstOrderApplies(at); !ok {
			continue
		}
		dp, da, _ := ev.FirstOrder(at)
		for i := range 4 {
			if !finite(dp[i]) || !finite(da[i]) {
				return Badf("the first-order prediction is not finite at |ε| = %g (dp1 = %v, da1 = %v); allowed: inputs within the ranges of the README", math.Abs(at.Epsilon()), dp, da)
			}
		}
	}
	return nil

}

// spinNorm returns |a|.
func spinNorm(a [3]float64) float64 { return math.Sqrt(a[0]*a[0] + a[1]*a[1] + a[2]*a[2]) }

// unitOrZ returns a/|a|, or +z for a = 0.
func unitOrZ(a [3]float64) [3]float64 {
	n := spinNorm(a)
	if n == 0 {
		return [3]float64{0, 0, 1}
	}
	return [3]float64{a[0] / n, a[1] / n, a[2] / n}
}
