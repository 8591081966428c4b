package integrate

import (
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// KerrDixon is the all-multipole Kerr probe completed on the Dixon body:
// the Mathisson–Papapetrou–Dixon pole–dipole body with the Tulczyjew
// condition (Dixon, the exact covariant spin–curvature force −½R(u, S)
// and its momentum–velocity relation) plus the multipoles ℓ ≥ 2 of Kerr at
// linear order in the curvature, taken from the Kerr–Schild densities of
// KerrProbe with the part of the force linear in the probe spin removed.
// With A(λ) = a₂ + λ a⃗₁ and the densities f(λ), 𝒢(λ) of KerrProbe (force
// and spin generator of the linearized Kerr–Schild metric of spin A(λ)
// minus that of a₂),
//
//	f_{≥2} = f(1) − f′(0),   𝒢_{≥1} = 𝒢(1),
//
// the derivative at λ = 0 by a complex step (exact to rounding, the
// densities being analytic in A). The pole–dipole body's spin kick has no
// generator beyond the parallel transport (the O(a₁⁰) rotation), so the
// whole of 𝒢 — from the quadrupole on — is added; its force, −½R(u, S),
// is the O(a₁) part, so f′(0) is removed. They enter the Dixon body as the
// u-independent force f_{≥2} + p (f_{≥2}·p)/𝓜² and the torque
// T^{ρσ} = −(𝓜/M)(𝒢^ρ a^σ − 𝒢^σ a^ρ) with 𝒢 made orthogonal to p (so that
// T p = 0 and the spin vector turns by (1/M) ε(u, 𝒢, a), as in KerrProbe).
//
// Off a Kerr–Newman–Taub–NUT background the NUT parts of KerrProbe enter
// the same way: the harmonic-gauge NUT force without its part linear in
// a⃗₁ (whose derivative is taken in closed form, nutSpin), the whole NUT
// generator −N[f⃗₁]_δ, and −N p⁰[U]_{≥2} in the energy; Dixon's core carries
// the O(a₁) NUT coupling through the background's curvature.
//
// So the O(a₁) dynamics is exactly Dixon's, whose second order linear in
// the probe spin carries the published 3 : 4 weighting of probe and
// background spin, while the first-order impulse and spin kick are still
// those of the Kerr body exact in both spins (the dipole parts of the
// densities and of −½R(u, S) have the same line integrals). The multipoles
// from ℓ = 2 on keep the Kerr–Schild densities' completion, a choice;
// the Killing energy is corrected to first order in the coupling
// (EnergyExact false); S² and the Tulczyjew condition stay exact, while
// 𝓜 drifts at O(ε²) (the torque enters the momentum–velocity relation).
type KerrDixon struct {
	Dixon
	kp KerrProbe
}

// NewKerrDixon returns the probe of mass m in the background metric
// (KerrNewman, DyonicKerrNewman or KerrNewmanNUT; Linear: its first-order
// geometry).
func NewKerrDixon(metric spacetime.Metric, m float64, linear bool) *KerrDixon {
	k := &KerrDixon{Dixon: Dixon{Metric: metric, M: m, Gyro: 2, Linear: linear}}
	k.kp = KerrProbe{Metric: metric, M: m}
	k.Dixon.extra = k
	return k
}

// Name implements Model.
func (k *KerrDixon) Name() string {
	return kerrProbeName("kerr-probe (Dixon core)", k.Metric, k.Linear)
}

// complexStep is the relative size of the imaginary spin step h|a⃗₁|/|x|.
const complexStep = 1e-20

// higher returns f_{≥2} (η-raised, not yet projected), 𝒢_{≥1} and the
// energy terms [M f w]_{≥2}, [f w²]_{≥2} and [p⁰-coefficient of the NUT
// part] e3 = N [U]_{≥2} at x for u (see KerrProbe.coupling and nutSpin).
func (k *KerrDixon) higher(x vec.Vec3, u [4]float64, a1 vec.Vec3) (f, gen [4]float64, e1, e2, e3 float64) {
	M, N, a := k.kp.background()
	a2 := vec.Vec3{0, 0, a}
	h := complexStep * x.Norm() / a1.Norm()
	var s1, s0, sd kerrSchildSpin
	s1.at(x, cspin(a2.Add(a1), vec.Vec3{}, 0), 1)
	s0.at(x, cspin(a2, vec.Vec3{}, 0), 1)
	sd.at(x, cspin(a2, a1, h), 1)
	f1, g1 := s1.force(u, k.M)
	f0, g0 := s0.force(u, k.M)
	fd, _ := sd.force(u, k.M)
	for mu := 0; mu < 4; mu++ {
		f[mu] = M * (real(f1[mu]-f0[mu]) - imag(fd[mu])/h)
	}
	for j := 0; j < 3; j++ {
		gen[j+1] = M * real(g1[j]-g0[j])
	}
	h1, q1 := s1.energyTerms(u, k.M)
	h0, q0 := s0.energyTerms(u, k.M)
	hd, qd := sd.energyTerms(u, k.M)
	e1 = M * (real(h1-h0) - imag(hd)/h)
	e2 = M * (real(q1-q0) - imag(qd)/h)
	if N == 0 {
		return f, gen, e1, e2, 0
	}
	// The NUT parts: the harmonic-gauge force without its O(a₁) part (its
	// derivative along a⃗₁ in closed form, see nutSpin), the whole
	// generator −N[f]_δ (see KerrProbe.coupling).
	var n1, n0, nd nutSpin
	n1.at(x, a2.Add(a1), vec.Vec3{}, false)
	n0.at(x, a2, vec.Vec3{}, false)
	nd.at(x, a2, a1, true)
	k1, k0, kd := n1.force(u, k.M), n0.force(u, k.M), nd.force(u, k.M)
	for j := 1; j < 4; j++ {
		f[j] += N * (k1[j] - k0[j] - kd[j])
		gen[j] -= N * real(f1[j]-f0[j])
	}
	e3 = N * (n1.u - n0.u - nd.u)
	return f, gen, e1, e2, e3
}

// add implements multipoleCoupling.
func (k *KerrDixon) add(l *bodyLocal, b *bodyState, f0 *[4]float64, T *[4][4]float64) {
	a1 := vec.Vec3{b.a[1], b.a[2], b.a[3]}
	if a1 == (vec.Vec3{}) {
		return
	}
	x := vec.Vec3{l.x[1], l.x[2], l.x[3]}
	var u [4]float64
	for i := range u {
		u[i] = b.p[i] / k.M
	}
	f, gen, _, _, _ := k.higher(x, u, a1)
	M2 := b.mass * b.mass
	fp := (f[0]*b.pl[0] + f[1]*b.pl[1] + f[2]*b.pl[2] + f[3]*b.pl[3]) / M2
	gp := (gen[0]*b.pl[0] + gen[1]*b.pl[1] + gen[2]*b.pl[2] + gen[3]*b.pl[3]) / M2
	c := -b.mass / k.M
	for mu := 0; mu < 4; mu++ {
		f0[mu] += f[mu] + b.p[mu]*fp
		gen[mu] += b.p[mu] * gp
	}
	for mu := 0; mu < 4; mu++ {
		for nu := mu + 1; nu < 4; nu++ {
			v := c * (gen[mu]*b.a[nu] - gen[nu]*b.a[mu])
			T[mu][nu] += v
			T[nu][mu] -= v
		}
	}
}

// Energy implements Model: Dixon's Killing energy with the first-order
// correction of the higher multipoles, −[M f w]_{≥2} + (p⁰/2)[f w²]_{≥2}
// (as for KerrProbe).
func (k *KerrDixon) Energy(y []float64) float64 {
	E := k.Dixon.Energy(y)
	a1 := vec.Vec3{y[IA+1], y[IA+2], y[IA+3]}
	if a1 == (vec.Vec3{}) {
		return E
	}
	var u [4]float64
	for i := range u {
		u[i] = y[IP+i] / k.M
	}
	_, _, e1, e2, e3 := k.higher(vec.Vec3{y[IX+1], y[IX+2], y[IX+3]}, u, a1)
	return E - e1 + 0.5*y[IP]*e2 - y[IP]*e3
}

// EnergyExact implements Model: false (conserved to first order).
func (k *KerrDixon) EnergyExact() bool { return false }

// ConservesJz reports false: the higher multipoles' densities do not keep
// the Killing angular momentum exactly.
func (k *KerrDixon) ConservesJz() bool { return false }

// OutMass returns the dynamical mass 𝓜 = √(−p·p) at y, which the
// densities of the higher multipoles change at second order in the
// coupling (see outMassModel).
func (k *KerrDixon) OutMass(y []float64) (float64, bool) { return k.Dixon.DynamicalMass(y), true }

// Deriv implements Model.
func (k *KerrDixon) Deriv(y, dy []float64) { k.Dixon.Deriv(y, dy) }

// Hazard implements Model: as KerrProbe (the background and the disk of
// the spin a₂ + a⃗₁).
func (k *KerrDixon) Hazard(y0, y1 []float64) Status { return k.kp.Hazard(y0, y1) }

// ScaleCoupling implements CouplingScaler: the background's mass and
// charge scaled by λ.
func (k *KerrDixon) ScaleCoupling(lambda float64) Model {
	return NewKerrDixon(scaleMetric(k.Metric, lambda), k.M, k.Linear)
}
