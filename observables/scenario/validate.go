package scenario

import (
	"math"
)

// Validate fills defaults and checks every field, returning a one-line
// error naming the field and the allowed range.
func (s *Scenario) Validate() error {
	bg := &s.Background
	const kinds = "coulomb, monopole, dyon, root-kerr, schwarzschild, reissner-nordstrom, kerr, kerr-newman, taub-nut, kerr-taub-nut"
	switch bg.Kind {
	case "coulomb", "monopole", "dyon", "root-kerr":
		if bg.Mass != 0 || bg.NUT != 0 || bg.StringGauge != 0 {
			return Badf("background.mass, nut and string_gauge are for curved kinds only (kind = %q)", bg.Kind)
		}
	case "":
		return Badf("background.kind is missing; allowed: %s", kinds)
	default:
		if !bg.Curved() {
			return Badf("background.kind = %q; allowed: %s", bg.Kind, kinds)
		}
		return s.validateCurved()
	}
	for _, x := range []float64{bg.Charge, bg.MagneticCharge, bg.Spin[0], bg.Spin[1], bg.Spin[2]} {
		if !finite(x) {
			return Badf("background: charges and spin must be finite")
		}
	}
	if s.Probe.Kind == "geodesic" {
		return Badf("probe.kind = \"geodesic\" needs a curved background (background.kind = %q)", bg.Kind)
	}
	if bg.Kind != "root-kerr" && bg.Spin != [3]float64{} {
		return Badf("background.spin = %v is only allowed for kind root-kerr", bg.Spin)
	}
	if bg.Kind == "coulomb" && bg.MagneticCharge != 0 {
		return Badf("background.magnetic_charge = %g: a coulomb source has none (use dyon)", bg.MagneticCharge)
	}
	if bg.Kind == "monopole" && bg.Charge != 0 {
		return Badf("background.charge = %g: a monopole has none (use dyon)", bg.Charge)
	}
	if err := s.validateProbe(); err != nil {
		return err
	}
	if err := s.validateHold(false); err != nil {
		return err
	}
	if err := s.validateRest(); err != nil {
		return err
	}
	if s.Coupling() == 0 {
		return Badf("background: charge and magnetic_charge are both zero, the coupling ε vanishes")
	}
	return nil
}

// validateCurved checks a curved background and its probe.
func (s *Scenario) validateCurved() error {
	bg := &s.Background
	for _, x := range []float64{bg.Mass, bg.NUT, bg.Charge, bg.StringGauge, bg.Spin[0], bg.Spin[1], bg.Spin[2]} {
		if !finite(x) {
			return Badf("background: mass, nut, charge, string_gauge and spin must be finite")
		}
	}
	if bg.MagneticCharge != 0 {
		return Badf("background.magnetic_charge = %g: not available for curved kinds", bg.MagneticCharge)
	}
	spin := bg.Kind == "kerr" || bg.Kind == "kerr-newman" || bg.Kind == "kerr-taub-nut"
	charge := bg.Kind == "reissner-nordstrom" || bg.Kind == "kerr-newman" || bg.Kind == "kerr-taub-nut"
	nut := bg.Kind == "taub-nut" || bg.Kind == "kerr-taub-nut"
	switch {
	case !spin && bg.Spin != [3]float64{}:
		return Badf("background.spin = %v: kind %s has no spin (use kerr, kerr-newman or kerr-taub-nut)", bg.Spin, bg.Kind)
	case !charge && bg.Charge != 0:
		return Badf("background.charge = %g: kind %s has no charge (use reissner-nordstrom or kerr-newman)", bg.Charge, bg.Kind)
	case !nut && (bg.NUT != 0 || bg.StringGauge != 0):
		return Badf("background.nut/string_gauge: kind %s has no NUT parameter (use taub-nut or kerr-taub-nut)", bg.Kind)
	case bg.StringGauge < -1 || bg.StringGauge > 1:
		return Badf("background.string_gauge = %g; allowed: -1 ≤ string_gauge ≤ 1", bg.StringGauge)
	}
	if !(bg.Mass >= 0) {
		return Badf("background.mass = %g; allowed: 0 ≤ mass < ∞", bg.Mass)
	}
	if bg.Mass == 0 && bg.NUT == 0 {
		return Badf("background.mass and background.nut are both zero, the coupling ε vanishes")
	}
	pr := &s.Probe
	switch pr.Kind {
	case "geodesic", "dixon":
	case "":
		return Badf("probe.kind is missing; allowed for a curved background: geodesic, dixon")
	default:
		return Badf("probe.kind = %q; allowed for a curved background: geodesic, dixon", pr.Kind)
	}
	if pr.Mass == 0 {
		pr.Mass = 1
	}
	if !(pr.Mass > 0) || !finite(pr.Mass) || !finite(pr.Charge) {
		return Badf("probe.mass = %g; allowed: 0 < mass < ∞ (and a finite charge)", pr.Mass)
	}
	if pr.Kind == "geodesic" {
		if pr.MagneticCharge != 0 || pr.Gyro != 0 || pr.Spin != [3]float64{} || pr.NUT != 0 || pr.CES2 != 0 {
			return Badf("probe: kind geodesic takes mass and charge only (no magnetic_charge, gyro, spin, nut or ces2; use kind dixon for spin)")
		}
	} else if err := s.validateDixon(nut); err != nil {
		return err
	}
	if err := s.validateHold(spin); err != nil {
		return err
	}
	return s.validateRest()
}

// validateDixon checks a spinning probe (kind dixon) on a curved
// background; nut reports whether the background family has a NUT
// parameter.
func (s *Scenario) validateDixon(nut bool) error {
	pr := &s.Probe
	for _, x := range []float64{pr.Spin[0], pr.Spin[1], pr.Spin[2], pr.Gyro, pr.NUT, pr.CES2} {
		if !finite(x) {
			return Badf("probe: spin, gyro, nut and ces2 must be finite")
		}
	}
	if pr.MagneticCharge != 0 {
		return Badf("probe.magnetic_charge = %g: not available on curved backgrounds", pr.MagneticCharge)
	}
	if pr.Gyro == 0 {
		pr.Gyro = 2
	}
	if pr.NUT != 0 && !nut {
		return Badf("probe.nut = %g needs a background with a NUT parameter (taub-nut or kerr-taub-nut), not %s", pr.NUT, s.Background.Kind)
	}
	if pr.NUT != 0 && pr.Charge != 0 {
		return Badf("probe: nut = %g and charge = %g; a NUT-charged probe must be neutral", pr.NUT, pr.Charge)
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
			return Badf("scan.hold = \"a_over_m\" needs a spinning curved background with mass > 0 (kerr, kerr-newman, kerr-taub-nut); kind = %s, mass = %g", bg.Kind, bg.Mass)
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
	if pr.Mass == 0 {
		pr.Mass = 1
	}
	if !(pr.Mass > 0) || !finite(pr.Mass) {
		return Badf("probe.mass = %g; allowed: 0 < mass < ∞", pr.Mass)
	}
	if pr.NUT != 0 {
		return Badf("probe.nut = %g: a NUT charge needs a curved background (taub-nut or kerr-taub-nut)", pr.NUT)
	}
	if pr.CES2 != 0 {
		return Badf("probe.ces2 = %g: the spin-induced quadrupole needs a curved background and probe kind dixon", pr.CES2)
	}
	if pr.Kind == "charge" && pr.MagneticCharge != 0 {
		return Badf("probe.magnetic_charge = %g: kind charge has none (use dyon)", pr.MagneticCharge)
	}
	if (pr.Kind == "charge" || pr.Kind == "dyon") && pr.Spin != [3]float64{} {
		return Badf("probe.spin = %v: kind %s is spinless (use bmt, dixon, root-kerr or root-kerr-body)", pr.Spin, pr.Kind)
	}
	if pr.Gyro != 0 && pr.Kind != "bmt" && pr.Kind != "dixon" {
		return Badf("probe.gyro = %g is only allowed for kinds bmt and dixon", pr.Gyro)
	}
	if (pr.Kind == "bmt" || pr.Kind == "dixon") && pr.Gyro == 0 {
		pr.Gyro = 2
	}
	if !finite(pr.Gyro) || !finite(pr.Charge) || !finite(pr.MagneticCharge) {
		return Badf("probe: charges and gyro must be finite")
	}
	if pr.Charge == 0 && pr.MagneticCharge == 0 {
		return Badf("probe.charge = 0 and probe.magnetic_charge = 0: the probe does not couple")
	}
	return nil
}

// validateRest checks kinematics, scan and numerics.
func (s *Scenario) validateRest() error {
	k := &s.Kinematics
	switch {
	case k.Gamma != 0 && k.V != 0:
		return Badf("kinematics: give gamma or v, not both")
	case k.V != 0:
		if !(k.V > 0 && k.V < 1) {
			return Badf("kinematics.v = %g; allowed: 0 < v < 1", k.V)
		}
		k.Gamma = 1 / math.Sqrt((1-k.V)*(1+k.V))
	case k.Gamma == 0:
		return Badf("kinematics.gamma is missing; allowed: 1 < gamma < ∞ (or give v)")
	}
	if !(k.Gamma > 1) || !finite(k.Gamma) {
		return Badf("kinematics.gamma = %g; allowed: 1 < gamma < ∞", k.Gamma)
	}
	k.V = math.Sqrt((k.Gamma-1)*(k.Gamma+1)) / k.Gamma
	if k.B == 0 {
		k.B = 1
	}
	if !(k.B > 0) || !finite(k.B) {
		return Badf("kinematics.b = %g; allowed: 0 < b < ∞", k.B)
	}
	sc := &s.Scan
	if err := s.validateAxes(); err != nil {
		return err
	}
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
		return Badf("scan.eps_min = %g; allowed: 0 < eps_min < eps_max", sc.EpsMin)
	}
	if !(sc.EpsMax > sc.EpsMin) || !finite(sc.EpsMax) {
		return Badf("scan.eps_max = %g; allowed: eps_min (%g) < eps_max < ∞", sc.EpsMax, sc.EpsMin)
	}
	if sc.Points < 2 || sc.Points > 10000 {
		return Badf("scan.points = %d; allowed: 2 ≤ points ≤ 10000", sc.Points)
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
