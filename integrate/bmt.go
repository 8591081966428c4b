package integrate

import (
	"ricochet/background/em"
	"ricochet/background/vec"
)

// BMT is a spinning charge (electric Q, magnetic G, mass M) with
// gyromagnetic ratio Gyro in a static flat-space field, to linear order in
// its spin — non-canonical beyond first order in the coupling (the
// directional force with dx/dτ = p/m weights the probe spin like the
// source spin at second order and drifts the total angular momentum; Dixon
// is the consistent spinning charge): the Bargmann–Michel–Telegdi precession (Bargmann, Michel &
// Telegdi 1959, Phys. Rev. Lett. 2, 435) and the Stern–Gerlach force of its
// magnetic dipole μ = (Gyro/2) Q a. In our signature (−,+,+,+), with
// u = p/M and 𝕂 = (Q − iG)/M 𝔽 the self-dual generator of the field,
//
//	dx^μ/dτ = u^μ,
//	dp^μ/dτ = Re[𝕂 − i (Gyro/2) (a⃗·∇)𝕂]^μ_ν p^ν,
//	da^μ/dτ = (Gyro/2) Re[𝕂]^μ_ν a^ν + (1 − Gyro/2) u^μ a_ν Re[𝕂]^ν_ρ u^ρ
//	          + u^μ (a·f_SG)/M,
//
// where f_SG = Re[−i (Gyro/2)(a⃗·∇)𝕂] p is the Stern–Gerlach force. The
// force is written in directional-derivative form, (a·∂)F_μν u^ν, which
// differs from the gradient form ∂_μ(F_αβ S^αβ)/2 by a total τ-derivative
// (a hidden-momentum term) when Maxwell's equations hold, so both give the
// same asymptotic impulse; the directional form is a Lorentz generator
// acting on p and keeps p·p exact. The last spin term keeps a·p = 0 under
// the Stern–Gerlach force (it is of second order in the spin). At Gyro = 2
// the model is the first-order-in-spin truncation of the root-Kerr probe.
//
// The energy E = p⁰ + Re[(Q − iG)(𝒱 + i (Gyro/2) a⃗·𝐅)] is conserved to
// first order in the coupling and the spin.
type BMT struct {
	Field em.Field
	M     float64 // mass
	Q     float64 // electric charge
	G     float64 // magnetic charge
	Gyro  float64 // gyromagnetic ratio g (2 for the root-Kerr and Dirac values)
}

// Name implements Model.
func (b *BMT) Name() string { return "bmt" }

// Dim implements Model.
func (b *BMT) Dim() int { return 12 }

// Mass implements Model.
func (b *BMT) Mass() float64 { return b.M }

// Deriv implements Model.
func (b *BMT) Deriv(y, dy []float64) {
	im := 1 / b.M
	for i := 0; i < 4; i++ {
		dy[IX+i] = y[IP+i] * im
	}
	F, D := b.Field.At(spatial(y, IX).Lift())
	c := complex(b.Q, -b.G) * complex(im, 0)
	k0 := F.Scale(c)
	a := spatial(y, IA)
	// Directional derivative (a⃗·∇)𝐅_i = Σ_j D[i][j] a_j.
	var da vec.CVec3
	for i := 0; i < 3; i++ {
		da[i] = D[i][0]*complex(a[0], 0) + D[i][1]*complex(a[1], 0) + D[i][2]*complex(a[2], 0)
	}
	kSG := da.Scale(-1i * complex(b.Gyro/2, 0) * c)
	var f0, fsg, fa [4]float64
	applyGenerator(k0, y[IP:IP+4], f0[:])
	applyGenerator(kSG, y[IP:IP+4], fsg[:])
	for i := 0; i < 4; i++ {
		dy[IP+i] = f0[i] + fsg[i]
	}
	applyGenerator(k0, y[IA:IA+4], fa[:])
	av := Spin(y)
	aFu := av.Dot(vec.Vec4(f0)) * im // a_ν Re[𝕂]^ν_ρ u^ρ
	aFsg := av.Dot(vec.Vec4(fsg))
	h := b.Gyro / 2
	for i := 0; i < 4; i++ {
		u := y[IP+i] * im
		dy[IA+i] = h*fa[i] + (1-h)*u*aFu + u*aFsg*im
	}
}

// VelocityIsMomentum marks that Deriv sets dx^μ/dτ = p^μ/m exactly (see
// Scatter).
func (b *BMT) VelocityIsMomentum() {}

// Energy implements Model.
func (b *BMT) Energy(y []float64) float64 {
	x := spatial(y, IX).Lift()
	F, _ := b.Field.At(x)
	a := spatial(y, IA).Lift()
	return y[IP] + real(complex(b.Q, -b.G)*(b.Field.Potential(x)+1i*complex(b.Gyro/2, 0)*a.Dot(F)))
}

// EnergyExact implements Model: false (first order in coupling and spin).
func (b *BMT) EnergyExact() bool { return false }

// Normalize implements Model.
func (b *BMT) Normalize(y []float64, a2 float64) { flatNormalize(y, b.M, a2) }

// HazardFree implements HazardFreer: a field without a branch disk has
// no forbidden passage.
func (b *BMT) HazardFree() bool { return !(fieldDisk(b.Field, vec.Vec3{}).Radius > 0) }

// Hazard implements Model.
func (b *BMT) Hazard(y0, y1 []float64) Status {
	return diskHazard(fieldDisk(b.Field, vec.Vec3{}), y0, y1)
}

// FailureStatus implements failureClassifier: a failure at the ring of
// the source's branch disk is the path reaching the ring.
func (b *BMT) FailureStatus(y []float64) Status {
	return ringFailure(fieldDisk(b.Field, vec.Vec3{}), y)
}
