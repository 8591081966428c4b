package leading

import (
	"fmt"
	"math"

	"ricochet/background/vec"
	"ricochet/observables/convention"
)

// GravBody selects the spin multipoles of a spinning test body in gravity.
type GravBody int

const (
	// KerrBody is a Kerr black hole: all spin multipoles, the mass
	// multipoles M_ℓ + iS_ℓ = m(ia)^ℓ (Hansen 1974, from memory); exact in
	// the probe spin. The zero value.
	KerrBody GravBody = iota
	// DipoleBody is the Mathisson–Papapetrou–Dixon pole–dipole body
	// (Mathisson 1937; Papapetrou 1951; Dixon 1970; from memory): linear in
	// the probe spin.
	DipoleBody
	// QuadrupoleBody is the pole–dipole body with the spin-induced
	// quadrupole of coefficient C_ES² (GravSpinProbe.CES2): quadratic in the
	// probe spin.
	QuadrupoleBody
)

func (k GravBody) String() string {
	switch k {
	case KerrBody:
		return "Kerr"
	case DipoleBody:
		return "pole–dipole"
	case QuadrupoleBody:
		return "pole–dipole–quadrupole"
	}
	return fmt.Sprintf("GravBody(%d)", int(k))
}

// GravSpinProbe is a spinning, neutral test body in gravity:
//
//	M     mass m > 0
//	N     NUT charge n of the probe (zero: an ordinary body)
//	A     spin vector a^μ = S^μ/m, the Pauli–Lubanski vector of the
//	      Tulczyjew–Dixon spin tensor (S^{μν}p_ν = 0) divided by m², with
//	      a·p = 0: a^μ = −(1/2m²) ε^μ_{νρσ} p^ν S^{ρσ}, so that a rest-frame
//	      a along +z is angular momentum along +z; any length and direction
//	Body  the multipole structure (zero value: KerrBody)
//	CES2  the spin-induced quadrupole coefficient C_ES² of QuadrupoleBody
//	      (1 for a Kerr black hole; the zero value is 0, the pole–dipole
//	      body); ignored by the other bodies
//
// The position of the probe is that of the Tulczyjew–Dixon centroid.
type GravSpinProbe struct {
	M, N float64
	A    vec.Vec4
	Body GravBody
	CES2 float64
}

// gravCVec is a complex four-vector.
type gravCVec [4]complex128

func (x gravCVec) add(y gravCVec) gravCVec {
	return gravCVec{x[0] + y[0], x[1] + y[1], x[2] + y[2], x[3] + y[3]}
}

func (x gravCVec) scale(s complex128) gravCVec {
	return gravCVec{s * x[0], s * x[1], s * x[2], s * x[3]}
}

// dot is the complex-bilinear Minkowski product.
func (x gravCVec) dot(y gravCVec) complex128 {
	return -x[0]*y[0] + x[1]*y[1] + x[2]*y[2] + x[3]*y[3]
}

func (x gravCVec) re() (v vec.Vec4) {
	for i := range x {
		v[i] = real(x[i])
	}
	return v
}

func (x gravCVec) im() (v vec.Vec4) {
	for i := range x {
		v[i] = imag(x[i])
	}
	return v
}

func gravComplex(re, im vec.Vec4) (z gravCVec) {
	for i := range z {
		z[i] = complex(re[i], im[i])
	}
	return z
}

// gravNumerator returns N(𝐁) = (2γ²−1) 𝐁^μ − 2iγ ε^μ_{νρσ} 𝐁^ν u^ρ u₂^σ,
// linear in 𝐁.
func gravNumerator(B gravCVec, u, u2 vec.Vec4, gam float64) gravCVec {
	er := vec.Eps(B.re(), u, u2)
	ei := vec.Eps(B.im(), u, u2)
	e := gravComplex(er, ei)
	return B.scale(complex(2*gam*gam-1, 0)).add(e.scale(complex(0, -2*gam)))
}

// gravComplexImpulse returns the complex 1PM impulse
//
//	𝒫^μ(𝐁) = −(2/√(γ²−1)) (m + in)(M − iN) N^μ(𝐁)/(𝐁·𝐁)
//
// and its first and second derivatives along 𝐁 → 𝐁 + εδ at ε = 0, for a
// probe of four-velocity u off a source of four-velocity u₂.
func gravComplexImpulse(c complex128, u, u2 vec.Vec4, B, d gravCVec) (P0, P1, P2 gravCVec) {
	gam := -u.Dot(u2)
	k := complex(-2/math.Sqrt(gam*gam-1), 0) * c
	N0 := gravNumerator(B, u, u2, gam)
	Nd := gravNumerator(d, u, u2, gam)
	D0 := B.dot(B)
	D1 := 2 * B.dot(d)
	D2 := 2 * d.dot(d)
	iD := 1 / D0
	P0 = N0.scale(k * iD)
	// (N/D)' = N'/D − N D'/D².
	P1 = Nd.scale(k * iD).add(N0.scale(-k * D1 * iD * iD))
	// (N/D)'' = −2N'D'/D² − N D''/D² + 2N D'²/D³  (N'' = 0).
	P2 = Nd.scale(-2 * k * D1 * iD * iD).add(N0.scale(k * (2*D1*D1*iD - D2) * iD * iD))
	return P0, P1, P2
}

// SpinImpulse1PM returns the first-order (1PM) impulse Δp^μ and spin kick
// Δa^μ of a spinning, possibly NUT-charged test body passing a stationary
// Kerr–Taub–NUT source (mass M, NUT parameter N, spin a₂ = src.A, any
// orientation) on the straight line x(τ) = b + u τ, in the source rest
// frame, exact in the source spin; exact in the probe spin for KerrBody,
// linear in it for DipoleBody and quadratic for QuadrupoleBody. The source
// charges Q, P are ignored: a neutral probe feels them only at second
// order (through the Q², P² terms of the metric).
//
// Variables: u is the probe's incoming four-velocity (unit, future, γ > 1)
// and b its covariant impact parameter, the displacement of the
// incoming asymptote of the probe's Tulczyjew–Dixon centroid from the
// source, orthogonal to u and to the source's u₂ = (1, 0, 0, 0) (only that
// part of b is used); a₁ = pr.A is the Tulczyjew–Dixon spin vector (see
// GravSpinProbe), spatial parts of a₂ as in GravSource.
//
// Closed form. With 𝐁 = b − iΠ(a₁ + a₂) (Π the projection orthogonal to u
// and u₂) and the complex impulse
//
//	𝒫^μ(𝐁) = −(2/√(γ²−1)) (m + in)(M − iN) [(2γ²−1) 𝐁^μ − 2iγ ε^μ_{νρσ}𝐁^ν u^ρ u₂^σ]/(𝐁·𝐁),
//
// the Kerr body has
//
//	Δp = Re 𝒫,   Δa₁^μ = (1/m) ε^μ_{νρσ} u^ν (Im 𝒫)^ρ a₁^σ + u^μ (a₁·Δp)/m.
//
// The impulse is the 1PM result for two spinning black holes of Vines 2017
// (Class. Quantum Grav. 35, 084002, arXiv:1709.06016, from memory; there
// written with b + iΠa and the conjugate phase) with the mass–NUT phase of
// Impulse1PM. The spin kick is written here (our derivation; Vines 2017
// gives the O(G) spin changes too, in another form) as the rotation
// generated by the 1PM eikonal: N/(𝐁·𝐁) is the gradient of the
// holomorphic ½Σ_±(γ ± √(γ²−1))² log(𝐁·e ∓ i𝐁·ê), with e, ê = ε(e, u,
// u₂)/√(γ²−1) an orthonormal basis of the transverse plane, so
// Re 𝒫 = ∂χ/∂b and Im 𝒫 = ∂χ/∂a₁ for the eikonal χ = Re[(m + in)(M − iN)F(𝐁)],
// and Δa₁ is the rest-frame rotation a₁ × ∂χ/∂a₁/m, the last term keeping
// a₁·p = 0. The tests check it against the MPD quadrature to O(a₁²). Probe and source spins enter Δp only through
// their sum: the impulse of a Kerr probe equals that of a spinless probe off
// a source of spin a₁ + a₂.
//
// The MPD bodies are the Taylor truncations in the probe spin: writing
// 𝒫(ε) for 𝐁 = b − iΠ(a₂ + εa₁) and 𝒫_k for its k-th derivative at ε = 0,
//
//	DipoleBody:      Δp = Re(𝒫₀ + 𝒫₁),              Im 𝒫 → Im 𝒫₀,
//	QuadrupoleBody:  Δp = Re(𝒫₀ + 𝒫₁ + ½C_ES² 𝒫₂),   Im 𝒫 → Im(𝒫₀ + C_ES² 𝒫₁),
//
// with Δa₁ from the same formula. The pole–dipole force −½R^μ_νρσu^νS^ρσ
// is linear in a₁, so its O(a₁) term must equal the O(a₁) term of the Kerr
// body, which is fixed by the source-spin dependence; the spin-induced
// quadrupole enters through the interaction Lagrangian
// L = (C_ES²/2m) R_μανβ u^α u^β S^μ S^ν (signature −+++; Porto 2006,
// Levi & Steinhoff 2015, from memory, there in +−−−), which for C_ES² = 1 is
// the O(a₁²) part of the Kerr body (the quadrupole of Kerr, M₂ = −ma²). The
// tests check every one of these against a straight-line quadrature of
// the MPD force and torque in the linearized Kerr–Newman–Taub–NUT metric.
//
// The probe's NUT charge enters through the factor (m + in): requiring
// Δp₁ = −Δp₂ at 1PM (the impulse of the source on the probe, computed in
// either rest frame) fixes its phase relative to the source's (M − iN).
// A common duality rotation (m + in) → e^{−iθ}(m + in),
// (M − iN) → e^{iθ}(M − iN) changes nothing.
//
// The formulas hold for lines that do not pierce the branch disk of the
// combined spin; |Π(a₁ + a₂)| < |b| is sufficient.
func SpinImpulse1PM(pr GravSpinProbe, src GravSource, u, b vec.Vec4) (dp, da vec.Vec4) {
	u2 := vec.Vec4{1, 0, 0, 0}
	return spinImpulse(pr, complex(src.M, -src.N), vec.FromSpatial(0, src.A), u, u2, b)
}

// spinImpulse is SpinImpulse1PM for a source of four-velocity u2, spin
// four-vector a2 (a2·u2 = 0) and complex mass cs = M − iN, all covariant.
func spinImpulse(pr GravSpinProbe, cs complex128, a2, u, u2, b vec.Vec4) (dp, da vec.Vec4) {
	c := complex(pr.M, pr.N) * cs
	bp := gravProject(b, u, u2)
	a1p := gravProject(pr.A, u, u2)
	a2p := gravProject(a2, u, u2)
	var sum vec.Vec4
	if pr.Body == KerrBody {
		sum = a1p
	}
	B := gravComplex(bp, a2p.Add(sum).Scale(-1))
	d := gravComplex(vec.Vec4{}, a1p.Scale(-1))
	P0, P1, P2 := gravComplexImpulse(c, u, u2, B, d)
	var pRe, gen vec.Vec4 // Δp and the rotation generator ∂χ/∂a₁
	switch pr.Body {
	case KerrBody:
		pRe, gen = P0.re(), P0.im()
	case DipoleBody:
		pRe, gen = P0.add(P1).re(), P0.im()
	case QuadrupoleBody:
		C := complex(pr.CES2, 0)
		pRe = P0.add(P1).add(P2.scale(C / 2)).re()
		gen = P0.add(P1.scale(C)).im()
	default:
		panic("leading: unknown GravBody")
	}
	m := pr.M
	da = vec.Eps(u, gen, pr.A).Scale(1 / m).Add(u.Scale(pr.A.Dot(pRe) / m))
	return pRe, da
}

// SpinTensorKick returns the first-order change of the spin tensor
// S^{μν} = ε^{μνρσ} p_ρ a_σ (convention.SpinTensor) from the impulse and
// spin kick of a body of incoming momentum p and spin vector a:
//
//	ΔS^{μν} = ε^{μνρσ} (Δp_ρ a_σ + p_ρ Δa_σ),
//
// exact to first order since S is bilinear in p and a.
func SpinTensorKick(p, a, dp, da vec.Vec4) [4][4]float64 {
	s1 := convention.SpinTensor(dp, a)
	s2 := convention.SpinTensor(p, da)
	for i := range s1 {
		for j := range s1[i] {
			s1[i][j] += s2[i][j]
		}
	}
	return s1
}
