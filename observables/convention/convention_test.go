package convention_test

import (
	"math"
	"testing"

	"ricochet/background/vec"
	"ricochet/observables/convention"
)

// boost returns the boost along +x with speed v applied to w.
func boost(w vec.Vec4, v float64) vec.Vec4 {
	g := 1 / math.Sqrt(1-v*v)
	return vec.Vec4{g * (w[0] + v*w[1]), g * (w[1] + v*w[0]), w[2], w[3]}
}

// TestSpinTensor: S^{μν} = ε^{μνρσ} p_ρ a_σ is antisymmetric, transverse
// (S^{μν}p_ν = 0, the Tulczyjew condition), has S_{μν}S^{μν} = 2 m² a·a
// (exact identity for this construction with a·p = 0), gives J_z = S^{xy} =
// m a_z at rest (the project's sense of spin), and transforms as a tensor
// under a boost.
func TestSpinTensor(t *testing.T) {
	const m = 1.7
	a := vec.Vec4{0, 0.2, -0.3, 0.5}
	p := vec.Vec4{m, 0, 0, 0}
	s := convention.SpinTensor(p, a)
	// Exact: S^{xy} = m a_z, S^{yz} = m a_x, S^{zx} = m a_y.
	if s[1][2] != m*a[3] || s[2][3] != m*a[1] || s[3][1] != m*a[2] {
		t.Errorf("rest-frame spin tensor %v, want S^{xy} = m a_z etc.", s)
	}
	const v = 0.6
	pb, ab := boost(p, v), boost(a, v)
	sb := convention.SpinTensor(pb, ab)
	eta := vec.Eta
	var contr float64
	for mu := 0; mu < 4; mu++ {
		var sp float64
		for nu := 0; nu < 4; nu++ {
			// Rounding: entries of order 1, a few ulp.
			if math.Abs(sb[mu][nu]+sb[nu][mu]) > 1e-15 {
				t.Errorf("not antisymmetric at %d%d", mu, nu)
			}
			sp += sb[mu][nu] * eta[nu] * pb[nu]
			contr += sb[mu][nu] * sb[mu][nu] * eta[mu] * eta[nu]
		}
		if math.Abs(sp) > 1e-14 {
			t.Errorf("S^{%d nu} p_nu = %g, want 0", mu, sp)
		}
	}
	if want := 2 * m * m * a.Dot(a); math.Abs(contr-want) > 1e-14*want {
		t.Errorf("S.S = %v, want 2 m² a² = %v", contr, want)
	}
	// Tensor transformation Λ^μ_α Λ^ν_β S^{αβ} of the rest-frame tensor.
	g := 1 / math.Sqrt(1-v*v)
	L := [4][4]float64{{g, g * v, 0, 0}, {g * v, g, 0, 0}, {0, 0, 1, 0}, {0, 0, 0, 1}}
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			var x float64
			for al := 0; al < 4; al++ {
				for be := 0; be < 4; be++ {
					x += L[mu][al] * L[nu][be] * s[al][be]
				}
			}
			if math.Abs(x-sb[mu][nu]) > 1e-14 {
				t.Errorf("boosted S^{%d%d} = %v, tensor law gives %v", mu, nu, sb[mu][nu], x)
			}
		}
	}
}

// TestSignature: contravariant components are signature-independent; the
// mass shell p·p = −m² becomes +m² and covariant components flip sign.
func TestSignature(t *testing.T) {
	p := vec.Vec4{1.25, 0.75, 0, 0} // m = 1
	if d := convention.MostlyMinus.Dot(p, p); math.Abs(d-1) > 1e-15 {
		t.Errorf("(+,-,-,-) p.p = %v, want +1", d)
	}
	if d := convention.MostlyPlus.Dot(p, p); math.Abs(d+1) > 1e-15 {
		t.Errorf("(-,+,+,+) p.p = %v, want -1", d)
	}
	lp, lm := convention.MostlyPlus.Lower(p), convention.MostlyMinus.Lower(p)
	if lm != (vec.Vec4{1.25, -0.75, 0, 0}) || lp != (vec.Vec4{-1.25, 0.75, 0, 0}) {
		t.Errorf("lower: %v %v", lp, lm)
	}
	for _, s := range []string{"-+++", "+---"} {
		if g, err := convention.ParseSignature(s); err != nil || g.String() != s {
			t.Errorf("round trip %q: %v %v", s, g, err)
		}
	}
}

// TestUnits: the Coulomb force between two charges is the same number in
// both systems, q_G Q_G/r² = q_HL Q_HL/(4π r²) (definition of the
// rationalised system), and the printed coupling scales by 4π.
func TestUnits(t *testing.T) {
	const q, Q, r = 0.3, -1.1, 2.5
	hl := convention.HeavisideLorentz
	fG := q * Q / (r * r)
	fHL := hl.Charge(q) * hl.Charge(Q) / (4 * math.Pi * r * r)
	if math.Abs(fG-fHL) > 1e-15*math.Abs(fG) {
		t.Errorf("force %v (Gaussian) vs %v (Heaviside–Lorentz)", fG, fHL)
	}
	if e := hl.Coupling(0.01, true); math.Abs(e-hl.Charge(1)*hl.Charge(0.01)) > 1e-16 {
		t.Errorf("coupling %v", e)
	}
	if e := hl.Coupling(0.01, false); e != 0.01 {
		t.Errorf("gravitational coupling changed: %v", e)
	}
}

// TestImpact: for the covariant b (⟂ p_in) b_J = |b|; the eikonal b is
// |b| cos(θ/2) for a deflection θ in the plane of b (geometry: b projected
// orthogonally to the bisector of p_in and p_out).
func TestImpact(t *testing.T) {
	pin := vec.Vec4{2, 1.5, 0, 0}
	b := vec.Vec4{0, 0, 1.3, 0}
	const th = 0.2
	pout := vec.Vec4{2, 1.5 * math.Cos(th), 1.5 * math.Sin(th), 0}
	if got := convention.Covariant.Of(pin, pout, b); got != 1.3 {
		t.Errorf("covariant %v", got)
	}
	if got := convention.AngularMomentum.Of(pin, pout, b); math.Abs(got-1.3) > 1e-15 {
		t.Errorf("b_J %v, want 1.3", got)
	}
	if got, want := convention.Eikonal.Of(pin, pout, b), 1.3*math.Cos(th/2); math.Abs(got-want) > 1e-15 {
		t.Errorf("b_eik %v, want %v", got, want)
	}
}
