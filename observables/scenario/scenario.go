package scenario

import (
	"bytes"
	"fmt"
	"strings"

	"github.com/BurntSushi/toml"
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
	// Prediction is the user's own prediction of some observables, with
	// its conventions (nil when the file has no [prediction] table). It
	// does not change the numbers, so it is not part of a scan's hash.
	Prediction *PredictionSpec `toml:"prediction" json:"-"`

	// spinPerMass, when set (a_over_m axis or scan.hold = "a_over_m"),
	// keeps the curved background's spin at spinPerMass × mass along
	// spinDir as WithEpsilon rescales the
	// mass.
	spinPerMass float64
	spinDir     [3]float64
	// given marks the keys that a scenario file or a command-line
	// override set explicitly (givenKeys), so that an explicit zero is
	// refused instead of being read as "use the default".
	given givenSet
}

// BackgroundSpec describes the source at rest at the origin.
type BackgroundSpec struct {
	// Kind: flat space coulomb | monopole | dyon | root-kerr; curved
	// schwarzschild | reissner-nordstrom | kerr | kerr-newman | taub-nut |
	// kerr-taub-nut.
	Kind           string     `toml:"kind"`
	Charge         float64    `toml:"charge"`          // Q (Gaussian)
	MagneticCharge float64    `toml:"magnetic_charge"` // P (flat; reissner-nordstrom, kerr-newman, kerr-taub-nut)
	Spin           [3]float64 `toml:"spin"`            // a (ring radius vector; any direction, also for curved kinds)
	Mass           float64    `toml:"mass"`            // M (curved kinds)
	NUT            float64    `toml:"nut"`             // NUT parameter N (taub-nut, kerr-taub-nut)
	StringGauge    float64    `toml:"string_gauge"`    // Misner-string gauge C ∈ [−1, 1] (NUT kinds)
}

// Curved reports whether the background is a spacetime.
func (b BackgroundSpec) Curved() bool {
	switch b.Kind {
	case "schwarzschild", "reissner-nordstrom", "kerr", "kerr-newman", "taub-nut", "kerr-taub-nut":
		return true
	}
	return false
}

// ProbeSpec describes the probe.
type ProbeSpec struct {
	// Kind: charge | dyon | bmt | dixon | root-kerr | root-kerr-body
	// (flat); geodesic (curved, charged if charge ≠ 0); dixon (curved: the
	// spinning Mathisson–Papapetrou–Dixon pole–dipole body; flat: the
	// Dixon body with its electromagnetic dipole, integrate.Dixon);
	// kerr-probe (curved, no NUT: the all-multipole Kerr probe at linear
	// order in the curvature on the Dixon core, integrate.KerrDixon);
	// kerr-probe-ks (its completion by the Kerr–Schild densities alone,
	// integrate.KerrProbe).
	Kind           string     `toml:"kind"`
	Mass           float64    `toml:"mass"`
	Charge         float64    `toml:"charge"`
	MagneticCharge float64    `toml:"magnetic_charge"`
	Gyro           float64    `toml:"gyro"` // g for kinds bmt and dixon (0 means 2)
	Spin           [3]float64 `toml:"spin"` // rest-frame spin vector a
	// NUT is the probe's NUT charge n (kinds dixon, kerr-probe and
	// kerr-probe-ks off a taub-nut or
	// kerr-taub-nut background; see Build for what is integrated).
	NUT float64 `toml:"nut"`
	// CES2 is the spin-induced quadrupole coefficient C_ES² of kind dixon
	// (1 for a Kerr black hole; 0, the default, is the pole–dipole body).
	CES2 float64 `toml:"ces2"`
	// SSC is the spin supplementary condition of kind dixon on a curved
	// background: "tulczyjew" (the default, S^{μν}p_ν = 0), "pirani"
	// (S^{μν}u_ν = 0, non-helical solution) or "ohashi-kyrian-semerak"
	// (S^{μν}w_ν = 0, w parallel transported); the last two for a neutral
	// pole–dipole body (charge, ces2 and nut zero). See integrate.SSC.
	SSC string `toml:"ssc"`
}

// KinematicsSpec gives the incoming asymptotic data.
type KinematicsSpec struct {
	Gamma float64 `toml:"gamma"` // Lorentz factor (or give v)
	V     float64 `toml:"v"`     // speed at infinity
	B     float64 `toml:"b"`     // impact parameter (0 means 1)
}

// ScanSpec gives the coupling scan of `ricochet scan` and, for a
// multi-parameter scan, its further axes ([[scan.axis]] tables, AxisSpec).
type ScanSpec struct {
	EpsMin float64 `toml:"eps_min"` // smallest |ε| (0 means 1e-4)
	// Hold says which spin ratio of a curved background stays fixed as the
	// scan varies ε = M/b: "a_over_b" (the default; the first-order formula
	// is then exact in spin at every point, and the background is
	// super-extremal where ε < |a|/b) or "a_over_m" (the spin follows the
	// mass, a physical black hole at every point when |a|/M < 1).
	Hold   string  `toml:"hold"`
	EpsMax float64 `toml:"eps_max"` // largest |ε| (0 means 0.1)
	Points int     `toml:"points"`  // number of log-spaced points (0 means 13)
	// Axes are the axes of a multi-parameter scan, in the order given;
	// an axis with param = "coupling" replaces eps_min, eps_max and
	// points. The coupling always varies fastest (Grid order).
	Axes []AxisSpec `toml:"axis" json:",omitempty"`
}

// NumericsSpec gives the integrator settings.
type NumericsSpec struct {
	Tol    float64 `toml:"tol"`    // 0 means the driver default
	Radius float64 `toml:"radius"` // start/stop radius in b; 0 means automatic
	Method string  `toml:"method"` // dormand-prince-8 | dormand-prince-5 | tsitouras-5
}

// Parse decodes a scenario from TOML strictly: unknown keys are errors.
// origin names the input in error messages. The result is not validated.
func Parse(data []byte, origin string) (*Scenario, error) {
	var s Scenario
	md, err := toml.NewDecoder(bytes.NewReader(data)).Decode(&s)
	if err != nil {
		// One line always: the decoder's message may quote the input,
		// newlines included.
		return nil, fmt.Errorf("%s: %s", origin, oneLine(err.Error()))
	}
	for k, key := range givenKeys {
		if md.IsDefined(strings.Split(key, ".")...) {
			s.given |= 1 << k
		}
	}
	if und := md.Undecoded(); len(und) > 0 {
		keys := make([]string, len(und))
		for i, k := range und {
			keys[i] = k.String()
		}
		return nil, fmt.Errorf("%s: unknown key %s", origin, oneLine(strings.Join(keys, ", ")))
	}
	return &s, nil
}

// givenKeys are the keys whose zero value would otherwise stand for a
// default (probe mass 1, b = 1, g = 2, the default scan): given
// explicitly, zero is out of range.
var givenKeys = []string{"probe.mass", "kinematics.b", "probe.gyro", "scan.eps_min", "scan.eps_max", "scan.points"}

// givenSet is a set of givenKeys, one bit each.
type givenSet uint

func (g givenSet) has(key string) bool {
	for k, x := range givenKeys {
		if x == key {
			return g&(1<<k) != 0
		}
	}
	return false
}

// MarkGiven records that the keys (of givenKeys, e.g. "scan.eps_min")
// were set explicitly, as by a command-line override: Validate then
// refuses a zero there instead of filling the default.
func (s *Scenario) MarkGiven(keys ...string) {
	for _, key := range keys {
		for k, x := range givenKeys {
			if x == key {
				s.given |= 1 << k
			}
		}
	}
}

// oneLine replaces line breaks in a message by the escape \n.
func oneLine(msg string) string {
	return strings.NewReplacer("\r\n", `\n`, "\n", `\n`, "\r", `\n`).Replace(msg)
}
