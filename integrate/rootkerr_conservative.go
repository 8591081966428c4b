package integrate

import "ricochet/background/em"

// RootKerrConservative is the all-multipole root-Kerr probe in its
// conservative completion, a non-canonical member of the root-Kerr family
// (exact energy, but the second order is a completion choice and the total
// angular momentum drifts; RootKerrBody is the consistent form): the same first-order coupling as RootKerr (the
// field evaluated at the Newman–Janis shifted position x⃗ − i a⃗, Newman &
// Janis 1965; Arkani-Hamed, Huang & O'Connell 2020, from memory), completed
// beyond first order in the field as the flow of the Hamiltonian
//
//	H(x⃗, p⃗, a⃗) = √(M² + p⃗²) + U(x⃗, a⃗),   U = Re[(Q − iG) 𝒱(x⃗ − i a⃗)],
//
// under the antisymmetric bracket (a⁰ ≡ a⃗·p⃗/p⁰, all others zero)
//
//	{x_i, p_j} = δ_ij,         {p_i, p_j} = ε_ijk 𝔅_k,
//	{x_i, a_j} = (a⁰/p⁰) δ_ij,  {a_i, a_j} = ε_ijk a_k/p⁰,
//
// with 𝔈 = −∇ₓU = Re[(Q − iG)𝐅(x⃗ − i a⃗)] and 𝔅 = −∇ₐU = Im[(Q − iG)𝐅(x⃗ − i a⃗)].
// See the package documentation for the derivation. In the evolution
// parameter τ with dx⁰/dτ = p⁰/M the equations are
//
//	dx⃗/dτ   = p⃗/M − a⁰ 𝔅/M,
//	dp^μ/dτ = ω^μ_ν p^ν,   da^μ/dτ = ω^μ_ν a^ν,   ω = Re[(Q − iG)/M 𝔽(x⃗ − i a⃗)],
//
// i.e. RootKerr's momentum and spin laws with a velocity term −a⁰𝔅/M that
// is of first order in the field and so changes observables only at second
// order in the coupling. The energy E = H = p⁰ + U is conserved exactly
// (a property of any antisymmetric bracket), while p·p = −M², a·p = 0 and
// a·a are kept exactly by the Lorentz generator, which is what Normalize
// enforces. The bracket does not satisfy the Jacobi identity (its spin
// part is not the rest-frame spin algebra), so the flow conserves the
// energy but is not symplectic; in the aligned configuration (a⁰ = 0 all
// along) it coincides with RootKerr.
//
// τ is the proper time only up to second order in the coupling: with the
// velocity term the worldline's tangent is not exactly p/M, so the model
// does not declare dx/dτ = p/M to the scattering driver.
type RootKerrConservative struct {
	Field em.Field
	M     float64 // mass
	Q     float64 // electric charge
	G     float64 // magnetic charge
}

// Name implements Model.
func (r *RootKerrConservative) Name() string { return "root-kerr-conservative" }

// Dim implements Model.
func (r *RootKerrConservative) Dim() int { return 12 }

// Mass implements Model.
func (r *RootKerrConservative) Mass() float64 { return r.M }

// Deriv implements Model.
func (r *RootKerrConservative) Deriv(y, dy []float64) {
	im := 1 / r.M
	F := em.Value(r.Field, shifted(y))
	c := complex(r.Q, -r.G)
	k := F.Scale(c * complex(im, 0))
	applyGenerator(k, y[IP:IP+4], dy[IP:IP+4])
	applyGenerator(k, y[IA:IA+4], dy[IA:IA+4])
	// a⁰ from the constraint a·p = 0 (equal to y[IA] on the constraint
	// surface; forming it from the spatial parts keeps the velocity term
	// consistent with the bracket's definition of a⁰).
	a0 := (y[IA+1]*y[IP+1] + y[IA+2]*y[IP+2] + y[IA+3]*y[IP+3]) / y[IP]
	dy[IX] = y[IP] * im
	for i := 0; i < 3; i++ {
		B := imag(c * F[i])
		dy[IX+1+i] = (y[IP+1+i] - a0*B) * im
	}
}

// Energy implements Model: H = p⁰ + Re[(Q − iG) 𝒱(x⃗ − i a⃗)].
func (r *RootKerrConservative) Energy(y []float64) float64 {
	return shiftedEnergy(r.Field, r.Q, r.G, y)
}

// EnergyExact implements Model: true.
func (r *RootKerrConservative) EnergyExact() bool { return true }

// Normalize implements Model.
func (r *RootKerrConservative) Normalize(y []float64, a2 float64) { flatNormalize(y, r.M, a2) }

// Hazard implements Model: as for RootKerr, the shifted position must not
// cross the branch disk of radius |a_source + a⃗| normal to a_source + a⃗.
func (r *RootKerrConservative) Hazard(y0, y1 []float64) Status {
	return shiftedHazard(r.Field, y0, y1)
}

// RootKerrFamily returns the members of the root-Kerr family of probes of
// mass m, electric charge q and magnetic charge g in the static field f,
// in a fixed order with distinct names:
//
//	0  RootKerr              Lorentz-generator completion ("root-kerr"; non-canonical)
//	1  RootKerrConservative  conservative completion ("root-kerr-conservative"; non-canonical)
//	2  BMT with Gyro = 2     dipole truncation, directional force ("bmt"; non-canonical)
//	3  Dixon with Gyro = 2   the physical O(a) member ("dixon")
//	4  RootKerrBody          the physical all-multipole member ("root-kerr-body")
//	5  RootKerrBody with Contact = 1
//	                         the same with a spin-induced polarisability
//	                         ("root-kerr-body-contact"; coefficient of our
//	                         own choosing, to show what is left free)
//
// All share the first-order coupling (the dipole members to first order in
// spin). Members 0–2 are not consistent bodies beyond first order in the
// coupling (their directional force and p/m velocity weight the probe spin
// like the source spin at second order and drift J); members 3–5 conserve
// E and J, and their second order linear in spin is physical (their
// differences, O(a²), are what the first-order coupling leaves free) (see "What is
// physical at second order" in the package documentation). Canonical
// reports which is which.
func RootKerrFamily(f em.Field, m, q, g float64) []Model {
	return []Model{
		&RootKerr{Field: f, M: m, Q: q, G: g},
		&RootKerrConservative{Field: f, M: m, Q: q, G: g},
		&BMT{Field: f, M: m, Q: q, G: g, Gyro: 2},
		&Dixon{Field: f, M: m, Q: q, G: g, Gyro: 2},
		&RootKerrBody{Field: f, M: m, Q: q, G: g},
		&RootKerrBody{Field: f, M: m, Q: q, G: g, Contact: 1},
	}
}

// FailureStatus implements failureClassifier: a failure at the ring of
// the source's branch disk is the path reaching the ring.
func (r *RootKerrConservative) FailureStatus(y []float64) Status {
	return ringFailure(fieldDisk(r.Field, spatial(y, IA)), y)
}

// Canonical reports whether a model is a consistent body beyond first
// order in the coupling: derived from one interaction with exact energy,
// angular momentum and Tulczyjew condition (Dixon, RootKerrBody, and the
// spinless models), as opposed to the non-canonical completions RootKerr,
// RootKerrConservative and BMT, whose second order is a choice.
func Canonical(m Model) bool {
	switch m.(type) {
	case *RootKerr, *RootKerrConservative, *BMT:
		return false
	}
	return true
}
