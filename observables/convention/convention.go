package convention

import (
	"fmt"
	"math"
	"strings"

	"ricochet/background/vec"
	"ricochet/observables"
)

// Signature is the metric signature used to print covariant components
// and scalar products.
type Signature int

const (
	// MostlyPlus is (−,+,+,+), the library's own signature.
	MostlyPlus Signature = iota
	// MostlyMinus is (+,−,−,−).
	MostlyMinus
)

// ParseSignature accepts "-+++", "mostly-plus", "+---" or "mostly-minus".
func ParseSignature(s string) (Signature, error) {
	switch strings.ToLower(s) {
	case "-+++", "mostly-plus", "":
		return MostlyPlus, nil
	case "+---", "mostly-minus":
		return MostlyMinus, nil
	}
	return 0, fmt.Errorf("convention: signature %q; allowed: -+++, +---", s)
}

func (s Signature) String() string {
	if s == MostlyMinus {
		return "+---"
	}
	return "-+++"
}

// Describe is the sentence printed in output headers.
func (s Signature) Describe() string {
	if s == MostlyMinus {
		return "metric signature (+,-,-,-): contravariant components v^mu as in (-,+,+,+); covariant components v_mu and dot products u.v change sign"
	}
	return "metric signature (-,+,+,+)"
}

// sign is η_{μν}(s)/η_{μν}(MostlyPlus): +1 or −1.
func (s Signature) sign() float64 {
	if s == MostlyMinus {
		return -1
	}
	return 1
}

// Lower returns the covariant components v_μ = η_{μν} v^ν in signature s.
func (s Signature) Lower(v vec.Vec4) vec.Vec4 {
	l := v.Lower()
	for i := range l {
		l[i] *= s.sign()
	}
	return l
}

// Dot returns the scalar product u·v = η_{μν} u^μ v^ν in signature s.
func (s Signature) Dot(u, v vec.Vec4) float64 { return s.sign() * u.Dot(v) }

// Units is the system of electromagnetic units.
type Units int

const (
	// Gaussian units: Coulomb field E = Q r/r³, the library's own.
	Gaussian Units = iota
	// HeavisideLorentz (rationalised) units: E = Q r/(4π r³).
	HeavisideLorentz
)

// ParseUnits accepts "gaussian" or "heaviside-lorentz" ("hl").
func ParseUnits(s string) (Units, error) {
	switch strings.ToLower(s) {
	case "gaussian", "":
		return Gaussian, nil
	case "heaviside-lorentz", "hl":
		return HeavisideLorentz, nil
	}
	return 0, fmt.Errorf("convention: units %q; allowed: gaussian, heaviside-lorentz", s)
}

func (u Units) String() string {
	if u == HeavisideLorentz {
		return "heaviside-lorentz"
	}
	return "gaussian"
}

// Describe is the sentence printed in output headers.
func (u Units) Describe() string {
	if u == HeavisideLorentz {
		return "Heaviside-Lorentz electromagnetic units: charges q_HL = sqrt(4 pi) q_G (Coulomb field Q/(4 pi r^2)), so the electromagnetic coupling eps = qQ/(m b) is 4 pi times its Gaussian value; momenta are unchanged"
	}
	return "Gaussian electromagnetic units (Coulomb field E = Q r/r^3, force q(E + v x B))"
}

// Charge converts a Gaussian charge (electric or magnetic) to u.
func (u Units) Charge(qGaussian float64) float64 {
	if u == HeavisideLorentz {
		return math.Sqrt(4*math.Pi) * qGaussian
	}
	return qGaussian
}

// Coupling converts a Gaussian coupling ε = qQ/(m b) to u. Gravitational
// couplings (electromagnetic = false), ε = M/b, are unchanged.
func (u Units) Coupling(epsGaussian float64, electromagnetic bool) float64 {
	if u == HeavisideLorentz && electromagnetic {
		return 4 * math.Pi * epsGaussian
	}
	return epsGaussian
}

// Impact is the definition of the impact parameter.
type Impact int

const (
	// Covariant: b orthogonal to both incoming four-velocities (the
	// library's own).
	Covariant Impact = iota
	// AngularMomentum: b_J = |J|/|p⃗_in|.
	AngularMomentum
	// Eikonal: the component of b orthogonal to p⃗_in + p⃗_out.
	Eikonal
)

// ParseImpact accepts "covariant", "j" (or "angular-momentum") and "eikonal".
func ParseImpact(s string) (Impact, error) {
	switch strings.ToLower(s) {
	case "covariant", "":
		return Covariant, nil
	case "j", "angular-momentum", "j/p":
		return AngularMomentum, nil
	case "eikonal":
		return Eikonal, nil
	}
	return 0, fmt.Errorf("convention: impact parameter %q; allowed: covariant, j, eikonal", s)
}

func (d Impact) String() string {
	switch d {
	case AngularMomentum:
		return "j"
	case Eikonal:
		return "eikonal"
	}
	return "covariant"
}

// Describe is the sentence printed in output headers.
func (d Impact) Describe() string {
	switch d {
	case AngularMomentum:
		return "impact parameter b_J = |J|/|p_in| (orbital angular momentum about the source); eps and first-order formulas use b_J"
	case Eikonal:
		return "eikonal impact parameter: component of b orthogonal to p_in + p_out; eps and first-order formulas use b_eik, which differs from the covariant b at next-to-leading order"
	}
	return "covariant impact parameter b (orthogonal to both incoming four-velocities, from the source to the probe)"
}

// Of returns the impact parameter of definition d for the incoming and
// outgoing momenta and the covariant impact-parameter four-vector b.
func (d Impact) Of(pin, pout, b vec.Vec4) float64 {
	switch d {
	case AngularMomentum:
		return observables.ImpactParameterJ(pin, b)
	case Eikonal:
		return observables.EikonalImpactParameter(pin, pout, b)
	}
	return b.Spatial().Norm()
}

// Spin is the form in which spin output is printed.
type Spin int

const (
	// Vector prints the spin vector a^μ = S^μ/m (the library's own).
	Vector Spin = iota
	// Tensor prints the spin tensor S^{μν}.
	Tensor
)

// ParseSpin accepts "vector" or "tensor".
func ParseSpin(s string) (Spin, error) {
	switch strings.ToLower(s) {
	case "vector", "":
		return Vector, nil
	case "tensor":
		return Tensor, nil
	}
	return 0, fmt.Errorf("convention: spin output %q; allowed: vector, tensor", s)
}

func (s Spin) String() string {
	if s == Tensor {
		return "tensor"
	}
	return "vector"
}

// Describe is the sentence printed in output headers.
func (s Spin) Describe() string {
	if s == Tensor {
		return "spin as the tensor S^{mu nu} = eps^{mu nu rho sigma} p_rho a_sigma (eps^{0123} = -1; rest-frame a along +z gives S^{xy} = m a_z); spin kick dS = S_out - S_in"
	}
	return "spin as the vector a^mu = S^mu/m (rest-frame a along +z is angular momentum along +z); spin kick da = a_out - a_in"
}

// SpinTensor returns the contravariant spin tensor
//
//	S^{μν} = ε^{μνρσ} p_ρ a_σ,   ε^{0123} = −1,
//
// of a body with four-momentum p and spin vector a (a·p = 0). Its
// contravariant components are the same in both signatures: the two
// lowered indices each change sign.
func SpinTensor(p, a vec.Vec4) [4][4]float64 {
	pl, al := p.Lower(), a.Lower()
	var s [4][4]float64
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			var x float64
			for r := 0; r < 4; r++ {
				for q := 0; q < 4; q++ {
					// ε^{μνρσ} = −ε_{μνρσ} (three spatial indices raised).
					if e := vec.Levi(mu, nu, r, q); e != 0 {
						x -= e * pl[r] * al[q]
					}
				}
			}
			s[mu][nu] = x
		}
	}
	return s
}

// Set is a complete choice of output conventions. The zero value is the
// library's own.
type Set struct {
	Signature Signature
	Units     Units
	Impact    Impact
	Spin      Spin
}

// Describe returns one sentence per convention of the set.
func (c Set) Describe() []string {
	return []string{c.Signature.Describe(), c.Units.Describe(), c.Impact.Describe(), c.Spin.Describe()}
}
