package observables

import (
	"math"
	"testing"

	"ricochet/background/vec"
)

func TestAngles(t *testing.T) {
	// Exact: a momentum turned by 0.3 rad towards +y and lifted by 0.1 rad
	// towards +z.
	pin := vec.Vec4{2, 1.5, 0, 0}
	c, s := math.Cos(0.3), math.Sin(0.3)
	ce, se := math.Cos(0.1), math.Sin(0.1)
	pout := vec.Vec4{2, 1.5 * c * ce, 1.5 * s * ce, 1.5 * se}
	f := NewFrame(pin, vec.Vec4{0, 0, 1, 0})
	if got := f.InPlaneAngle(pout); math.Abs(got-0.3) > 1e-15 {
		t.Errorf("in-plane angle %v, want 0.3", got)
	}
	if got := f.OutOfPlaneAngle(pout); math.Abs(got-0.1) > 1e-15 {
		t.Errorf("out-of-plane angle %v, want 0.1", got)
	}
	// Spherical law of cosines: cos θ = cos 0.3 cos 0.1.
	if got := ScatteringAngle(pin, pout); math.Abs(got-math.Acos(c*ce)) > 1e-15 {
		t.Errorf("scattering angle %v, want %v", got, math.Acos(c*ce))
	}
	// For an in-plane deflection θ with b ⊥ p_in, b_eik = b cos(θ/2).
	pout = vec.Vec4{2, 1.5 * c, 1.5 * s, 0}
	if got := EikonalImpactParameter(pin, pout, vec.Vec4{0, 0, 1, 0}); math.Abs(got-math.Cos(0.15)) > 1e-15 {
		t.Errorf("eikonal b %v, want cos(θ/2) = %v", got, math.Cos(0.15))
	}
	if got := ImpactParameterJ(pin, vec.Vec4{0, 0, 1, 0}); math.Abs(got-1) > 1e-15 {
		t.Errorf("b_J = %v, want 1", got)
	}
}
