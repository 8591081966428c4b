package exact

import (
	"math"
	"testing"

	"ricochet/background/vec"
)

// lorentzRHS is the force law of Dyon for a probe of unit mass:
// dp/dt = κ r/r³ + μ v×r/r³, p = γ v, state (r, p).
func lorentzRHS(kappa, mu float64) func(y [6]float64) [6]float64 {
	return func(y [6]float64) [6]float64 {
		r := vec.Vec3{y[0], y[1], y[2]}
		p := vec.Vec3{y[3], y[4], y[5]}
		g := math.Sqrt(1 + p.Dot(p))
		v := p.Scale(1 / g)
		r3 := math.Pow(r.Dot(r), 1.5)
		f := r.Scale(kappa / r3).Add(v.Cross(r).Scale(mu / r3))
		return [6]float64{v[0], v[1], v[2], f[0], f[1], f[2]}
	}
}

// rk4 integrates y' = g(y) × dt/ds over s with the classical fourth-order
// Runge–Kutta method (Kutta 1901), a reference independent of the module's
// integrators, on a reparametrised time s with uniform steps.
func rk4(f func(s float64, y [6]float64) [6]float64, y [6]float64, s0, s1 float64, n int) [6]float64 {
	h := (s1 - s0) / float64(n)
	add := func(a, b [6]float64, c float64) [6]float64 {
		for i := range a {
			a[i] += c * b[i]
		}
		return a
	}
	for i := 0; i < n; i++ {
		s := s0 + float64(i)*h
		k1 := f(s, y)
		k2 := f(s+h/2, add(y, k1, h/2))
		k3 := f(s+h/2, add(y, k2, h/2))
		k4 := f(s+h, add(y, k3, h))
		for j := range y {
			y[j] += h / 6 * (k1[j] + 2*k2[j] + 2*k3[j] + k4[j])
		}
	}
	return y
}

// TestPoincareTrajectory checks the closed-form orbit (Poincaré 1896)
// against a direct integration of the Lorentz force from the exact state at
// t0 to t1, and the asymptotic direction against the orbit at late times.
func TestPoincareTrajectory(t *testing.T) {
	for _, c := range []struct{ v, b, qP float64 }{{0.5, 1, 0.3}, {0.9, 2, -1.7}, {0.2, 1, 0.05}} {
		g := 1 / math.Sqrt(1-c.v*c.v)
		T := c.b / c.v
		t0, t1 := -3*T, 5*T
		r0, v0, err := PoincareState(c.v, c.b, 1, c.qP, t0)
		if err != nil {
			t.Fatal(err)
		}
		rhs := lorentzRHS(0, c.qP)
		// t = T tan s resolves the encounter with uniform steps in s.
		f := func(s float64, y [6]float64) [6]float64 {
			d := rhs(y)
			dt := T / (math.Cos(s) * math.Cos(s))
			for i := range d {
				d[i] *= dt
			}
			return d
		}
		y := [6]float64{r0[0], r0[1], r0[2], g * v0[0], g * v0[1], g * v0[2]}
		y = rk4(f, y, math.Atan(t0/T), math.Atan(t1/T), 4000)
		r1, v1, _ := PoincareState(c.v, c.b, 1, c.qP, t1)
		// RK4 global error ~ (h/scale)^4 with 4000 steps: below 1e-11 b.
		for i := 0; i < 3; i++ {
			if math.Abs(y[i]-r1[i]) > 1e-10*c.b || math.Abs(y[3+i]/g-v1[i]) > 1e-10 {
				t.Errorf("%+v: t1 state (%v, %v), exact (%v, %v)", c, y[:3], y[3:], r1, v1.Scale(g))
				break
			}
		}
		// Conservation: |v| and J = r × p − qP r̂ at t1 (Poincaré 1896).
		if math.Abs(v1.Norm()-c.v) > 1e-14 {
			t.Errorf("speed not constant: %v", v1.Norm())
		}
		s, _ := Poincare(c.v, c.b, 1, c.qP)
		J := r1.Cross(v1.Scale(g)).Sub(r1.Unit().Scale(c.qP))
		Jin := vec.Vec3{c.qP, 0, -g * c.v * c.b}
		if J.Sub(Jin).Norm() > 1e-13*Jin.Norm() {
			t.Errorf("J = %v, want %v", J, Jin)
		}
		// Cone: n̂_out·Ĵ = −qP/|J|.
		if math.Abs(s.Dir.Dot(Jin.Unit())+c.qP/Jin.Norm()) > 1e-15 {
			t.Errorf("outgoing direction off the cone")
		}
		// Late-time position direction approaches Dir as b/(v t).
		rl, _, _ := PoincareState(c.v, c.b, 1, c.qP, 1e9*T)
		if rl.Unit().Sub(s.Dir).Norm() > 1e-8 {
			t.Errorf("late direction %v, Dir %v", rl.Unit(), s.Dir)
		}
	}
}

// TestPoincareFirstOrder checks the weak-coupling impulse against the
// straight-line integral of the magnetic force, Δp_z = 2qP/b (Gaussian
// units; from the integral ∫ qP v b/(b² + v²t²)^{3/2} dt, exact).
func TestPoincareFirstOrder(t *testing.T) {
	for _, v := range []float64{0.3, 0.8} {
		const b = 1.0
		qP := 1e-6
		s, _ := Poincare(v, b, 1, qP)
		want := 2 * qP / b
		// Next order is O((qP/L)²) relative in the z-component.
		if math.Abs(s.ImpulsePerMass[3]-want) > 1e-9*want {
			t.Errorf("v=%g: Δp_z = %.12g, first order %.12g", v, s.ImpulsePerMass[3], want)
		}
	}
}

// TestDyonLimits: μ = 0 is Darwin, κ = 0 is Poincaré, and a generic dyon
// agrees with a direct integration of the force law.
func TestDyonLimits(t *testing.T) {
	const v, b = 0.6, 1.0
	// Electric-only source and probe: qQ = 0.2 (μ = 0).
	d, err := Dyon(v, b, 1, Charge{Electric: 0.5}, Charge{Electric: 0.4})
	if err != nil {
		t.Fatal(err)
	}
	dd, _ := Darwin(v, 0.2)
	if d.Dir.Sub(dd.Dir).Norm() > 1e-15 {
		t.Errorf("μ = 0: Dyon %v, Darwin %v", d.Dir, dd.Dir)
	}
	// Duality-rotated pair with κ = 0: q = 1, g = 0.5, Q = 0.5, P = −1 gives κ = 0, μ = −1.25.
	p, _ := Dyon(v, b, 1, Charge{1, 0.5}, Charge{0.5, -1})
	pp, _ := Poincare(v, b, 1, -1.25)
	if p.Dir.Sub(pp.Dir).Norm() > 1e-15 {
		t.Errorf("κ = 0: Dyon %v, Poincaré %v", p.Dir, pp.Dir)
	}
}

func TestDyonIntegration(t *testing.T) {
	const v, b = 0.7, 1.0
	probe, source := Charge{0.8, 0.3}, Charge{-0.4, 0.9}
	kappa := probe.Electric*source.Electric + probe.Magnetic*source.Magnetic
	mu := probe.Electric*source.Magnetic - probe.Magnetic*source.Electric
	ex, err := Dyon(v, b, 1, probe, source)
	if err != nil {
		t.Fatal(err)
	}
	g := 1 / math.Sqrt(1-v*v)
	const R = 1e8 // start and stop radius in units of b; tail errors O(ε b/R)
	T := b / v
	// Start on the straight line with the energy set to its asymptotic
	// value, γ(r0) + κ/r0 = γ.
	x0 := -R * b
	r0 := math.Hypot(x0, b)
	g0 := g - kappa/r0
	p0 := math.Sqrt(g0*g0 - 1)
	y := [6]float64{x0, b, 0, p0, 0, 0}
	rhs := lorentzRHS(kappa, mu)
	// t = T sinh σ: each step changes r by a fixed factor far out.
	f := func(s float64, y [6]float64) [6]float64 {
		d := rhs(y)
		dt := T * math.Cosh(s)
		for i := range d {
			d[i] *= dt
		}
		return d
	}
	y = rk4(f, y, math.Asinh(x0/(v*T)), -math.Asinh(x0/(v*T)), 40000)
	dir := vec.Vec3{y[3], y[4], y[5]}.Unit()
	// Tail errors O(|κ|,|μ| b/(p R)) ~ 1e-8; RK4 error far below.
	if dir.Sub(ex.Dir).Norm() > 1e-7 {
		t.Errorf("integrated direction %v, exact %v (diff %.2g)", dir, ex.Dir, dir.Sub(ex.Dir).Norm())
	}
	t.Logf("dyon: |n̂_int − n̂_exact| = %.2g", dir.Sub(ex.Dir).Norm())
}
