package predict

import (
	"math"
)

// Transform is one entry of the catalogue of convention changes: how a
// prediction written in another convention is brought to the library's.
// Input changes act on the quantities the formula reads; output factors
// multiply the predicted components. Zero factors mean 1.
type Transform struct {
	Name string
	// Family groups entries that are never combined with each other (the
	// two directions of one factor).
	Family string
	// Explain is the advice printed when the entry restores agreement.
	Explain string

	// ProbeSpin, SourceSpin multiply the spin vectors a₁, a₂.
	ProbeSpin, SourceSpin float64
	// ProbeMagnetic, SourceMagnetic and NUT multiply g, P and N.
	ProbeMagnetic, SourceMagnetic, NUT float64
	// Charges multiplies every electric and magnetic charge, and an
	// electromagnetic ε by its square (a change of unit system).
	Charges float64
	// Coupling multiplies the source's charges, mass and NUT parameter and
	// ε (a normalisation of the coupling).
	Coupling float64
	// SpinNorm multiplies both spin vectors and divides the spin kick (a
	// normalisation of the spin vector).
	SpinNorm float64
	// Mirror reverses the orientation: cross products and n̂ change sign.
	Mirror bool
	// FlipB reverses b̂ (and so n̂ = l̂ × b̂).
	FlipB bool
	// Canonical replaces the covariant impact parameter by the canonical
	// one (see canonicalShift).
	Canonical bool
	// OutP and OutA multiply the t, l, b, n components of Δp and Δa.
	OutP, OutA [4]float64
}

var (
	flipAll     = [4]float64{-1, -1, -1, -1}
	flipSpatial = [4]float64{1, -1, -1, -1}
	flipTime    = [4]float64{-1, 1, 1, 1}
	flipN       = [4]float64{1, 1, 1, -1}
	flipBN      = [4]float64{1, 1, -1, -1}
	sqrt4pi     = math.Sqrt(4 * math.Pi)
)

// Catalogue lists the convention changes tried, alone and in pairs, when
// a prediction disagrees at first order, simplest and most common first.
var Catalogue = []Transform{
	{Name: "probe spin sign", Family: "spin1", ProbeSpin: -1, OutA: flipAll,
		Explain: "the probe spin enters with the opposite sign: check that a = S/m and that a spin along +z means angular momentum along +z, and the sign relating a^mu to S^{mu nu}"},
	{Name: "source spin sign", Family: "spin2", SourceSpin: -1,
		Explain: "the source spin enters with the opposite sign: check the sense of rotation of your source and the sign of the shift b -/+ i Pi a"},
	{Name: "probe magnetic charge sign", Family: "g", ProbeMagnetic: -1,
		Explain: "the probe's magnetic charge enters with the opposite sign: check the orientation of your dual field strength and the duality phase (q - i g)"},
	{Name: "source magnetic charge sign", Family: "P", SourceMagnetic: -1,
		Explain: "the source's magnetic charge enters with the opposite sign: check the orientation of your dual field strength and the duality phase (Q + i P)"},
	{Name: "NUT parameter sign", Family: "N", NUT: -1,
		Explain: "the NUT parameter enters with the opposite sign: check the mass-NUT phase (M -/+ i N) and the sign of the gravitomagnetic term of your metric"},
	{Name: "orientation of epsilon", Family: "parity", Mirror: true, OutP: flipN, OutA: flipN,
		Explain: "your Levi-Civita symbol has the opposite orientation (cross products and n = l x b change sign): check eps_{0123} = +1 against eps^{0123} = +1 and the handedness of your frame"},
	{Name: "in and out swapped", Family: "time", OutP: flipAll, OutA: flipAll,
		Explain: "your kick is initial minus final (time-reversed set-up): check the limits of your time integral"},
	{Name: "impulse on the other body", Family: "body", OutP: flipAll,
		Explain: "your impulse is the one the source receives, minus the probe's"},
	{Name: "covariant components in (+,-,-,-)", Family: "index", OutP: flipSpatial, OutA: flipSpatial,
		Explain: "your components carry a lower index in signature (+,-,-,-): the spatial components change sign; give upper-index components or declare index = lower"},
	{Name: "covariant components in (-,+,+,+)", Family: "index", OutP: flipTime, OutA: flipTime,
		Explain: "your components carry a lower index in signature (-,+,+,+): the time component changes sign; give upper-index components or declare index = lower"},
	{Name: "Heaviside-Lorentz formula", Family: "units", Charges: sqrt4pi,
		Explain: "your formula is in Heaviside-Lorentz units (Coulomb field Q/(4 pi r^2)) but reads Gaussian charges: declare units = heaviside-lorentz, or remove the 4 pi"},
	{Name: "Gaussian formula", Family: "units", Charges: 1 / sqrt4pi,
		Explain: "your formula is in Gaussian units (Coulomb field Q/r^2) but reads Heaviside-Lorentz charges: declare units = gaussian, or add the 4 pi"},
	{Name: "coupling doubled", Family: "coupling", Coupling: 2,
		Explain: "a factor 2 is missing in your coupling (e.g. r_s = 2M written as M, or a field normalised with 1/2)"},
	{Name: "coupling halved", Family: "coupling", Coupling: 0.5,
		Explain: "your coupling is twice too large (e.g. M written for r_s = 2M, or a coupling counted twice)"},
	{Name: "spin doubled", Family: "spinnorm", SpinNorm: 2,
		Explain: "your spin vector is normalised to twice ours (e.g. a = 2S/m, or a spin tensor S^{mu nu} with a factor 1/2)"},
	{Name: "spin halved", Family: "spinnorm", SpinNorm: 0.5,
		Explain: "your spin vector is normalised to half of ours (e.g. a = S/(2m))"},
	{Name: "sign of b", Family: "b", FlipB: true, OutP: flipBN, OutA: flipBN,
		Explain: "your impact parameter points from the probe to the source: b and n = l x b are reversed"},
	{Name: "canonical impact parameter", Family: "impact", Canonical: true,
		Explain: "your impact parameter is the canonical (Newton-Wigner) one, b_can = b + gamma/(gamma+1) v x a1, not the covariant one orthogonal to both velocities"},
}

// one returns x, or 1 for the zero value.
func one(x float64) float64 {
	if x == 0 {
		return 1
	}
	return x
}

// compose returns the change t followed by u.
func compose(t, u Transform) Transform {
	c := Transform{Name: t.Name + " + " + u.Name, Family: t.Family + "+" + u.Family, Explain: t.Explain + "; and " + u.Explain}
	c.ProbeSpin = one(t.ProbeSpin) * one(u.ProbeSpin)
	c.SourceSpin = one(t.SourceSpin) * one(u.SourceSpin)
	c.ProbeMagnetic = one(t.ProbeMagnetic) * one(u.ProbeMagnetic)
	c.SourceMagnetic = one(t.SourceMagnetic) * one(u.SourceMagnetic)
	c.NUT = one(t.NUT) * one(u.NUT)
	c.Charges = one(t.Charges) * one(u.Charges)
	c.Coupling = one(t.Coupling) * one(u.Coupling)
	c.SpinNorm = one(t.SpinNorm) * one(u.SpinNorm)
	c.Mirror = t.Mirror != u.Mirror
	c.FlipB = t.FlipB != u.FlipB
	c.Canonical = t.Canonical || u.Canonical
	for i := 0; i < 4; i++ {
		c.OutP[i] = one(t.OutP[i]) * one(u.OutP[i])
		c.OutA[i] = one(t.OutA[i]) * one(u.OutA[i])
	}
	return c
}

// OutputOnly reports whether t changes only the predicted values, so that
// it applies to a table of values without a formula. A coupling or unit
// change counts as a scaling of the values, exact at first order.
func (t Transform) OutputOnly() bool {
	return one(t.ProbeSpin) == 1 && one(t.SourceSpin) == 1 && one(t.ProbeMagnetic) == 1 &&
		one(t.SourceMagnetic) == 1 && one(t.NUT) == 1 && one(t.SpinNorm) == 1 && !t.Mirror && !t.FlipB && !t.Canonical
}

// inputs applies the input changes of t to q.
func (t Transform) inputs(q Quantities) Quantities {
	q.ProbeSpin = q.ProbeSpin.Scale(one(t.ProbeSpin) * one(t.SpinNorm))
	q.SourceSpin = q.SourceSpin.Scale(one(t.SourceSpin) * one(t.SpinNorm))
	q.MagneticCharge *= one(t.ProbeMagnetic)
	q.SourceMagneticCharge *= one(t.SourceMagnetic)
	q.NUT *= one(t.NUT)
	if k := one(t.Charges); k != 1 {
		q.Charge *= k
		q.MagneticCharge *= k
		q.SourceCharge *= k
		q.SourceMagneticCharge *= k
		if q.Electromagnetic {
			q.Eps *= k * k
		}
	}
	if k := one(t.Coupling); k != 1 {
		q.SourceCharge *= k
		q.SourceMagneticCharge *= k
		q.SourceMass *= k
		q.NUT *= k
		q.Eps *= k
	}
	if t.FlipB {
		q.Frame.B = q.Frame.B.Scale(-1)
		q.Frame.N = q.Frame.N.Scale(-1)
	}
	if t.Canonical {
		q = canonicalShift(q)
	}
	return q
}

// canonicalShift moves the impact parameter from the covariant
// (Tulczyjew) centroid of the probe to its canonical (Newton–Wigner)
// centroid,
//
//	b_can = b + (p⃗ × S⃗)/(m(E + m)) = b + γ/(γ + 1) v⃗ × a₁,
//
// (Hanson & Regge 1974, Ann. Phys. 87, 498, from memory; the sign follows
// from the centre of energy of a moving spinning body lying on the side
// that moves faster, v⃗ × a⃗ from the proper centroid, with the canonical
// centroid between the two), and rescales ε = C/b to the new |b|.
func canonicalShift(q Quantities) Quantities {
	f := q.Frame
	bv := f.B.Scale(q.B).Add(f.L.Cross(q.ProbeSpin).Scale(q.Gamma * q.V / (q.Gamma + 1)))
	// Keep the part orthogonal to l̂ (a shift along l̂ only moves the time
	// origin; v × a has none).
	bv = bv.Sub(f.L.Scale(f.L.Dot(bv)))
	nb := bv.Norm()
	if !(nb > 0) {
		return q
	}
	q.Eps *= q.B / nb
	q.B = nb
	f.B = bv.Scale(1 / nb)
	f.N = f.L.Cross(f.B)
	q.Frame = f
	return q
}

// output returns the factor t applies to a predicted component of o.
func (t Transform) output(o Observable) float64 {
	f := one(t.OutP[o.Comp])
	if o.Kick == 1 {
		f = one(t.OutA[o.Comp]) / one(t.SpinNorm)
	}
	return f
}

// tableScale is the factor by which an output-only change scales a table
// value at first order (coupling and unit changes scale the first-order
// kick linearly in the coupling).
func (t Transform) tableScale(o Observable, electromagnetic bool) float64 {
	f := t.output(o) * one(t.Coupling)
	if electromagnetic {
		f *= one(t.Charges) * one(t.Charges)
	}
	return f
}

// pairs returns the catalogue's singles followed by all pairs of entries
// of different families.
func pairs(cat []Transform) (singles, doubles []Transform) {
	singles = cat
	for i := range cat {
		for j := i + 1; j < len(cat); j++ {
			if cat[i].Family != cat[j].Family {
				doubles = append(doubles, compose(cat[i], cat[j]))
			}
		}
	}
	return singles, doubles
}
