package observables

import (
	"math"
	"math/rand"
	"testing"

	"gonum.org/v1/gonum/diff/fd"

	"ricochet/background/vec"
)

// rotatedFrame is a frame of record tilted against the source axes, so
// that every rotated component mixes all three source components.
func rotatedFrame() (Frame, vec.Vec4) {
	pin := vec.Vec4{3, 1.2, -0.7, 0.4}
	b := vec.Vec4{0, 0.3, 0.9, 0.2}
	return NewFrame(pin, b), pin
}

// TestFrameErrCorners: the rotated bars of Frame.Err are the largest
// change of each frame component over the corners of the box of source
// errors (exact for a linear map: the maximum of |ê·δ| over the box sits
// at a corner), and never exceed the norm bound of FrameErr.
func TestFrameErrCorners(t *testing.T) {
	fr, _ := rotatedFrame()
	e := vec.Vec4{1e-3, 2e-3, 5e-4, 3e-3}
	got := fr.Err(e, 0)
	var want vec.Vec4
	for c := 0; c < 16; c++ {
		var d vec.Vec4
		for i := 0; i < 4; i++ {
			d[i] = e[i]
			if c&(1<<i) != 0 {
				d[i] = -e[i]
			}
		}
		comp := fr.Components(d)
		for i := 0; i < 4; i++ {
			want[i] = math.Max(want[i], math.Abs(comp[i]))
		}
	}
	norm := FrameErr(e)
	for i := 0; i < 4; i++ {
		// Tolerance: rounding of a three-term sum.
		if math.Abs(got[i]-want[i]) > 1e-15 {
			t.Errorf("component %d: bar %.6g, largest corner change %.6g", i, got[i], want[i])
		}
		if got[i] > norm[i]*(1+1e-15) {
			t.Errorf("component %d: bar %.6g above the norm bound %.6g", i, got[i], norm[i])
		}
	}
	// The default frame keeps the source bars.
	def := NewFrame(vec.Vec4{2, 1, 0, 0}, vec.Vec4{0, 0, 1, 0})
	if g := def.Err(e, 0); g != e {
		t.Errorf("default frame: bars %v, want %v", g, e)
	}
}

// TestAngleErrGradients checks the first-order bars of the three angles
// against gradients by finite differences (gonum diff/fd, central
// differences): each bar must equal Σ_j |∂f/∂p_j| e_j, and a random error
// inside the bars must not change the angle by more than the bar (up to
// the second-order terms, of relative size e/|p|).
func TestAngleErrGradients(t *testing.T) {
	fr, pin := rotatedFrame()
	rng := rand.New(rand.NewSource(3))
	angles := []struct {
		name string
		f    func(p vec.Vec4) float64
		err  func(p, e vec.Vec4) float64
	}{
		{"scattering", func(p vec.Vec4) float64 { return ScatteringAngle(pin, p) }, func(p, e vec.Vec4) float64 { return ScatteringAngleErr(pin, p, e, 0) }},
		{"in-plane", fr.InPlaneAngle, func(p, e vec.Vec4) float64 { return fr.InPlaneAngleErr(p, e, 0) }},
		{"out-of-plane", fr.OutOfPlaneAngle, func(p, e vec.Vec4) float64 { return fr.OutOfPlaneAngleErr(p, e, 0) }},
	}
	for trial := 0; trial < 20; trial++ {
		// An outgoing momentum turned by up to ~1 rad from p_in.
		d := vec.Vec3{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()}.Scale(0.5)
		pout := vec.FromSpatial(pin[0], pin.Spatial().Add(d))
		e := vec.Vec4{0, 1e-7 * (1 + rng.Float64()), 1e-7 * (1 + rng.Float64()), 1e-7 * (1 + rng.Float64())}
		for _, a := range angles {
			g := fd.Gradient(nil, func(x []float64) float64 {
				return a.f(vec.Vec4{pout[0], x[0], x[1], x[2]})
			}, []float64{pout[1], pout[2], pout[3]}, &fd.Settings{Formula: fd.Central, Step: 1e-5})
			want := math.Abs(g[0])*e[1] + math.Abs(g[1])*e[2] + math.Abs(g[2])*e[3]
			got := a.err(pout, e)
			// Tolerance: central differences with step 1e-5 on O(1)
			// second derivatives, ~1e-9 relative.
			if math.Abs(got-want) > 1e-7*want {
				t.Errorf("%s angle, trial %d: bar %.9g, finite-difference bound %.9g", a.name, trial, got, want)
			}
			for k := 0; k < 20; k++ {
				dp := vec.Vec4{0, e[1] * (2*rng.Float64() - 1), e[2] * (2*rng.Float64() - 1), e[3] * (2*rng.Float64() - 1)}
				ch := math.Abs(a.f(pout.Add(dp)) - a.f(pout))
				// Second-order terms: relative e/|p| ≈ 1e-7.
				if ch > got*(1+1e-6) {
					t.Errorf("%s angle: change %.6g above the bar %.6g", a.name, ch, got)
				}
			}
		}
	}
}

// TestSquareErr: the bar of v·v bounds its change over the corners of the
// box of component errors (Minkowski square, exact arithmetic identity
// (v+δ)² − v² = 2v·δ + δ²).
func TestSquareErr(t *testing.T) {
	v := vec.Vec4{1e-3, -0.02, 0.3, 1e-4}
	e := vec.Vec4{1e-6, 2e-6, 3e-6, 5e-4}
	bar := SquareErr(v, e)
	var worst float64
	for c := 0; c < 16; c++ {
		var d vec.Vec4
		for i := 0; i < 4; i++ {
			d[i] = e[i]
			if c&(1<<i) != 0 {
				d[i] = -e[i]
			}
		}
		w := v.Add(d)
		worst = math.Max(worst, math.Abs(w.Dot(w)-v.Dot(v)))
	}
	// The bound is attained up to the quadratic term of the time
	// component, whose sign is opposite (2e₀² relative to the bar here,
	// ~1e-6 relative; 1e-9 for rounding).
	if worst > bar*(1+1e-12) || worst < bar-2*e[0]*e[0]-1e-9*bar {
		t.Errorf("largest change %.9g, bar %.9g", worst, bar)
	}
}

// TestFrameErrIso: with a part iso of each bar bounding the norm of the
// error, the rotated bars of Frame.Err still bound every error made of a
// component-wise part (|δ_j| ≤ e_j − iso) and a part of norm ≤ iso in any
// direction, and are smaller than the bars without the split.
func TestFrameErrIso(t *testing.T) {
	fr, _ := rotatedFrame()
	rng := rand.New(rand.NewSource(5))
	e := vec.Vec4{1e-3, 2e-3, 1.5e-3, 3e-3}
	const iso = 1e-3
	bar, plain := fr.Err(e, iso), fr.Err(e, 0)
	for i := 1; i < 4; i++ {
		if !(bar[i] < plain[i]) {
			t.Errorf("component %d: bar with the split %.6g not below %.6g", i, bar[i], plain[i])
		}
	}
	for k := 0; k < 10000; k++ {
		u := vec.Vec3{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()}.Unit().Scale(iso * rng.Float64())
		var d vec.Vec4
		for j := 1; j < 4; j++ {
			d[j] = (e[j]-iso)*(2*rng.Float64()-1) + u[j-1]
		}
		c := fr.Components(d)
		for i := 1; i < 4; i++ {
			// Tolerance: rounding of a few terms.
			if math.Abs(c[i]) > bar[i]*(1+1e-14) {
				t.Fatalf("component %d: change %.6g above the bar %.6g", i, c[i], bar[i])
			}
		}
	}
}
