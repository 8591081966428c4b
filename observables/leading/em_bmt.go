package leading

import (
	"ricochet/background/em"
	"ricochet/background/vec"
)

// BMTProbe is a spinning point probe with mass M, electric charge Q,
// magnetic charge G, gyromagnetic ratio Gyro and spin vector A = a^μ
// (A·u = 0). Its rest-frame magnetic moment is (Gyro/2) Q a and its
// electric dipole moment −(Gyro/2) G a; Gyro = 2 agrees with the root-Kerr
// probe at linear order in spin.
type BMTProbe struct {
	M, Q, G, Gyro float64
	A             vec.Vec4
}

// EMBMTImpulse returns the first-order Δp^μ and Δa^μ, to linear order in
// the probe spin, of a BMT probe with any gyromagnetic ratio passing a
// static dyon, on the straight line with four-velocity u and covariant
// impact parameter b in the dyon's rest frame.
//
// Equations (Bargmann, Michel & Telegdi 1959, Phys. Rev. Lett. 2, 435,
// with the Stern–Gerlach force of the moment; from memory), with
// 𝐅_q = Re[(q − ig)𝔽] the duality-rotated field strength and g_s = Gyro:
//
//	da/dτ = (1/m)[(g_s/2) 𝐅_q a + (g_s/2 − 1) u (u·𝐅_q a)],
//	dp/dτ = 𝐅_q u + (g_s/2) × (dipole force of the g = 2 case).
//
// The second term of da/dτ is the Thomas term that keeps a·u = 0. The
// dipole force is linear in the moment, so at linear order in spin the
// impulse is the spinless one plus g_s/2 times the linear-in-spin part of
// EMImpulse, which follows from 𝐁 = b − iΠa:
//
//	∂𝒢/∂a = (2(Q + iP)/|v|)(−i)[Πa − 2b̂(b̂·Πa)]/b².
//
// Total time derivatives in the force (hidden momentum) do not change the
// asymptotic impulse.
func EMBMTImpulse(pr BMTProbe, src em.Dyon, u, b vec.Vec4) (dp, da vec.Vec4) {
	l := newLine(u, b)
	c := complex(src.Q, src.P)
	rk := EMProbe{M: pr.M, Q: pr.Q, G: pr.G}
	W0 := emGenerator(rk, EMFieldIntegral(c, vec.Vec3{}, l.v, l.b), l.gamma)

	// Linear-in-spin field integral.
	a := pr.A.Spatial()
	vh := l.v.Unit()
	pa := a.Sub(vh.Scale(vh.Dot(a)))
	bb := l.b.Dot(l.b)
	bh := l.b.Unit()
	d := pa.Sub(bh.Scale(2 * bh.Dot(pa))).Scale(1 / bb)
	G1 := d.Lift().Scale(-1i * 2 * c / complex(l.speed, 0))
	W1 := emGenerator(rk, G1, l.gamma)

	p := u.Scale(pr.M)
	half := pr.Gyro / 2
	dp = apply(W0, p).Add(apply(W1, p).Scale(half))
	wa := apply(W0, pr.A)
	da = wa.Scale(half).Add(u.Scale((half - 1) * u.Dot(wa)))
	return dp, da
}
