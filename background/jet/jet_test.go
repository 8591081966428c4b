package jet

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/num/dual"
	"gonum.org/v1/gonum/num/hyperdual"
)

// testFunc is a composite of every elementary operation of the package,
//
//	f(t,x,y,z) = sin(x·y)·exp(z/3) / √(1 + x² + y² + z²) + log(2 + t²)·(1 + y²)^0.7
//	             − cos(x − z)·atan(y) + atan2(y, x)/(1 + z²),
//
// written three times: for jets, for gonum dual numbers and for gonum
// hyperdual numbers.
func testFuncJet(v *[4]Jet) Jet {
	t, x, y, z := &v[0], &v[1], &v[2], &v[3]
	var a, b, c, d, r Jet
	a.Mul(x, y)
	a.Sin(&a)
	b.Scale(1.0/3, z)
	b.Exp(&b)
	a.Mul(&a, &b)
	c.Mul(x, x)
	c.AddMul(y, y)
	c.AddMul(z, z)
	c.AddConst(&c, 1)
	c.Sqrt(&c)
	r.Div(&a, &c)
	a.Mul(t, t)
	a.AddConst(&a, 2)
	a.Log(&a)
	b.Mul(y, y)
	b.AddConst(&b, 1)
	b.Pow(&b, 0.7)
	a.Mul(&a, &b)
	r.Add(&r, &a)
	a.Sub(x, z)
	a.Cos(&a)
	b.Atan(y)
	a.Mul(&a, &b)
	r.Sub(&r, &a)
	a.Atan2(y, x)
	d.Mul(z, z)
	d.AddConst(&d, 1)
	a.Div(&a, &d)
	r.Add(&r, &a)
	return r
}

func testFuncDual(t, x, y, z dual.Number) dual.Number {
	one := dual.Number{Real: 1}
	two := dual.Number{Real: 2}
	a := dual.Mul(dual.Sin(dual.Mul(x, y)), dual.Exp(dual.Scale(1.0/3, z)))
	c := dual.Sqrt(dual.Add(one, dual.Add(dual.Mul(x, x), dual.Add(dual.Mul(y, y), dual.Mul(z, z)))))
	r := dual.Mul(a, dual.Inv(c))
	r = dual.Add(r, dual.Mul(dual.Log(dual.Add(two, dual.Mul(t, t))), dual.PowReal(dual.Add(one, dual.Mul(y, y)), 0.7)))
	r = dual.Sub(r, dual.Mul(dual.Cos(dual.Sub(x, z)), dual.Atan(y)))
	// atan2(y, x) = atan(y/x) for x > 0 (the tests keep x > 0 here).
	r = dual.Add(r, dual.Mul(dual.Atan(dual.Mul(y, dual.Inv(x))), dual.Inv(dual.Add(one, dual.Mul(z, z)))))
	return r
}

func testFuncHyper(t, x, y, z hyperdual.Number) hyperdual.Number {
	one := hyperdual.Number{Real: 1}
	two := hyperdual.Number{Real: 2}
	a := hyperdual.Mul(hyperdual.Sin(hyperdual.Mul(x, y)), hyperdual.Exp(hyperdual.Scale(1.0/3, z)))
	c := hyperdual.Sqrt(hyperdual.Add(one, hyperdual.Add(hyperdual.Mul(x, x), hyperdual.Add(hyperdual.Mul(y, y), hyperdual.Mul(z, z)))))
	r := hyperdual.Mul(a, hyperdual.Inv(c))
	r = hyperdual.Add(r, hyperdual.Mul(hyperdual.Log(hyperdual.Add(two, hyperdual.Mul(t, t))), hyperdual.PowReal(hyperdual.Add(one, hyperdual.Mul(y, y)), 0.7)))
	r = hyperdual.Sub(r, hyperdual.Mul(hyperdual.Cos(hyperdual.Sub(x, z)), hyperdual.Atan(y)))
	r = hyperdual.Add(r, hyperdual.Mul(hyperdual.Atan(hyperdual.Mul(y, hyperdual.Inv(x))), hyperdual.Inv(hyperdual.Add(one, hyperdual.Mul(z, z)))))
	return r
}

var testPoints = [][4]float64{
	{0.3, 0.7, -0.4, 1.1},
	{-1.2, 2.5, 0.9, -0.6},
	{0.0, 0.1, 3.0, 0.2},
}

func relClose(got, want, tol float64) bool {
	return math.Abs(got-want) <= tol*math.Max(1, math.Abs(want))
}

// Gradient against gonum num/dual (first-order forward mode).
func TestGradientAgainstGonumDual(t *testing.T) {
	for _, p := range testPoints {
		for order := 1; order <= MaxOrder; order++ {
			var v [4]Jet
			for i := range v {
				v[i].SetVar(order, p[i], i)
			}
			f := testFuncJet(&v)
			for dir := 0; dir < 4; dir++ {
				var d [4]dual.Number
				for i := range d {
					d[i].Real = p[i]
				}
				d[dir].Emag = 1
				want := testFuncDual(d[0], d[1], d[2], d[3])
				// Both are exact to rounding; the operations differ in
				// order, so agreement is to a few ulps of the terms.
				const tol = 1e-13
				if !relClose(f.Value(), want.Real, tol) || !relClose(f.D(dir), want.Emag, tol) {
					t.Errorf("p=%v order %d dir %d: jet (%v, %v), dual (%v, %v)", p, order, dir, f.Value(), f.D(dir), want.Real, want.Emag)
				}
			}
		}
	}
}

// Second derivatives against gonum num/hyperdual: E1E2mag = ∂²f/∂xⁱ∂xʲ.
func TestHessianAgainstGonumHyperdual(t *testing.T) {
	for _, p := range testPoints {
		for order := 2; order <= MaxOrder; order++ {
			var v [4]Jet
			for i := range v {
				v[i].SetVar(order, p[i], i)
			}
			f := testFuncJet(&v)
			for i := 0; i < 4; i++ {
				for j := 0; j < 4; j++ {
					var h [4]hyperdual.Number
					for k := range h {
						h[k].Real = p[k]
					}
					h[i].E1mag = 1
					h[j].E2mag = 1
					want := testFuncHyper(h[0], h[1], h[2], h[3]).E1E2mag
					var alpha [4]int
					alpha[i]++
					alpha[j]++
					// Exact to rounding on both sides; see gradient test.
					if got := f.Partial(alpha); !relClose(got, want, 1e-12) {
						t.Errorf("p=%v order %d ∂%d∂%d: jet %v, hyperdual %v", p, order, i, j, got, want)
					}
				}
			}
		}
	}
}

// Univariate derivatives up to fourth order against closed forms
// (elementary calculus).
func TestUnivariateClosedForms(t *testing.T) {
	const x0 = 0.8
	type fn struct {
		name  string
		apply func(z, x *Jet)
		deriv func(k int, x float64) float64
	}
	fact := func(k int) float64 { return [...]float64{1, 1, 2, 6, 24}[k] }
	cases := []fn{
		{"exp", func(z, x *Jet) { z.Exp(x) }, func(k int, x float64) float64 { return math.Exp(x) }},
		{"log", func(z, x *Jet) { z.Log(x) }, func(k int, x float64) float64 {
			if k == 0 {
				return math.Log(x)
			}
			return math.Pow(-1, float64(k+1)) * fact(k-1) / math.Pow(x, float64(k))
		}},
		{"sin", func(z, x *Jet) { z.Sin(x) }, func(k int, x float64) float64 { return math.Sin(x + float64(k)*math.Pi/2) }},
		{"cos", func(z, x *Jet) { z.Cos(x) }, func(k int, x float64) float64 { return math.Cos(x + float64(k)*math.Pi/2) }},
		{"pow-1.3", func(z, x *Jet) { z.Pow(x, -1.3) }, func(k int, x float64) float64 {
			c := 1.0
			for m := 0; m < k; m++ {
				c *= -1.3 - float64(m)
			}
			return c * math.Pow(x, -1.3-float64(k))
		}},
		{"sqrt", func(z, x *Jet) { z.Sqrt(x) }, func(k int, x float64) float64 {
			c := 1.0
			for m := 0; m < k; m++ {
				c *= 0.5 - float64(m)
			}
			return c * math.Pow(x, 0.5-float64(k))
		}},
		{"inv", func(z, x *Jet) { z.Inv(x) }, func(k int, x float64) float64 {
			return math.Pow(-1, float64(k)) * fact(k) / math.Pow(x, float64(k+1))
		}},
		{"atan", func(z, x *Jet) { z.Atan(x) }, func(k int, x float64) float64 {
			q := 1 + x*x
			return [...]float64{math.Atan(x), 1 / q, -2 * x / (q * q), (6*x*x - 2) / (q * q * q), 24 * x * (1 - x*x) / (q * q * q * q)}[k]
		}},
	}
	for _, c := range cases {
		for v := 0; v < 4; v++ {
			var x, z Jet
			x.SetVar(MaxOrder, x0, v)
			c.apply(&z, &x)
			for k := 0; k <= MaxOrder; k++ {
				var alpha [4]int
				alpha[v] = k
				// Closed forms evaluated in float64: a few ulps.
				if got, want := z.Partial(alpha), c.deriv(k, x0); !relClose(got, want, 1e-13) {
					t.Errorf("%s d^%d/dx%d^%d: got %v, want %v", c.name, k, v, k, got, want)
				}
			}
		}
	}
}

// Exact multivariate Taylor coefficients: 1/(1 − t − x − y − z) has
// coefficients |α|!/α! (multinomial theorem).
func TestMultinomial(t *testing.T) {
	var s, v Jet
	s.SetConst(MaxOrder, 1)
	for i := 0; i < 4; i++ {
		v.SetVar(MaxOrder, 0, i)
		s.Sub(&s, &v)
	}
	s.Inv(&s)
	for k := 0; k < Size; k++ {
		want := [...]float64{1, 1, 2, 6, 24}[degree[k]] / alphaFac[k]
		if got := s.c[k]; got != want { // small integers: exact
			t.Errorf("coefficient %v: got %v, want %v", alphas[k], got, want)
		}
	}
}

// atan2 in all four quadrants against its closed-form derivatives
//
//	∂ₓθ = −y/ρ²,  ∂ᵧθ = x/ρ²,  ∂ₓ²θ = 2xy/ρ⁴,  ∂ₓ∂ᵧθ = (y² − x²)/ρ⁴.
func TestAtan2Quadrants(t *testing.T) {
	for _, p := range [][2]float64{{1, 2}, {-1, 2}, {-1.5, -0.5}, {0.3, -2}, {-2, 1e-3}} {
		x0, y0 := p[0], p[1]
		var x, y, th Jet
		x.SetVar(3, x0, 1)
		y.SetVar(3, y0, 2)
		th.Atan2(&y, &x)
		r2 := x0*x0 + y0*y0
		checks := []struct {
			alpha [4]int
			want  float64
		}{
			{[4]int{}, math.Atan2(y0, x0)},
			{[4]int{0, 1, 0, 0}, -y0 / r2},
			{[4]int{0, 0, 1, 0}, x0 / r2},
			{[4]int{0, 2, 0, 0}, 2 * x0 * y0 / (r2 * r2)},
			{[4]int{0, 1, 1, 0}, (y0*y0 - x0*x0) / (r2 * r2)},
		}
		for _, c := range checks {
			if got := th.Partial(c.alpha); !relClose(got, c.want, 1e-13) {
				t.Errorf("atan2 at %v, α=%v: got %v want %v", p, c.alpha, got, c.want)
			}
		}
	}
}

// Receivers aliasing operands give the same results as fresh receivers.
func TestAliasing(t *testing.T) {
	var x, y Jet
	x.SetVar(4, 0.7, 0)
	y.SetVar(4, 1.3, 1)
	y.AddMul(&x, &x)
	var want, got Jet
	want.Mul(&x, &y)
	got.Set(&x)
	got.Mul(&got, &y)
	if got != want {
		t.Error("Mul with z == x differs")
	}
	want.Mul(&y, &y)
	got.Set(&y)
	got.Mul(&got, &got)
	if got != want {
		t.Error("Mul with z == x == y differs")
	}
	want.Div(&x, &y)
	got.Set(&y)
	got.Div(&x, &got)
	if got != want {
		t.Error("Div with z == y differs")
	}
	want.Deriv(&y, 0)
	got.Set(&y)
	got.Deriv(&got, 0)
	if got.Order() != 3 {
		t.Error("Deriv order")
	}
	for k := 0; k < Len(3); k++ {
		if got.c[k] != want.c[k] {
			t.Error("Deriv with z == x differs")
		}
	}
}

// MatInv4 satisfies G·G⁻¹ = I as jets, and its first derivative matches
// ∂(G⁻¹) = −G⁻¹ (∂G) G⁻¹ (matrix calculus identity).
func TestMatInv4(t *testing.T) {
	var x [4]Jet
	for i := range x {
		x[i].SetVar(3, 0.2*float64(i+1), i)
	}
	var g, inv [4][4]Jet
	for a := 0; a < 4; a++ {
		for b := 0; b < 4; b++ {
			var e Jet
			e.Scale(0.3*float64(a+2*b+1), &x[(a+b)%4])
			e.Sin(&e)
			g[a][b].Mul(&e, &x[(a*b)%4])
			if a == b {
				g[a][b].AddConst(&g[a][b], float64(2*a-3))
			}
		}
	}
	if !MatInv4(&inv, &g) {
		t.Fatal("singular")
	}
	for a := 0; a < 4; a++ {
		for b := 0; b < 4; b++ {
			var s Jet
			s.SetConst(3, 0)
			for m := 0; m < 4; m++ {
				s.AddMul(&g[a][m], &inv[m][b])
			}
			for k := 0; k < Len(3); k++ {
				want := 0.0
				if k == 0 && a == b {
					want = 1
				}
				// Cancellation in sums of O(1) products: ~1e-15.
				if math.Abs(s.c[k]-want) > 1e-13 {
					t.Errorf("(G G⁻¹)[%d][%d] coefficient %d = %v", a, b, k, s.c[k])
				}
			}
		}
	}
	var g0 [4][4]float64
	for a := range g0 {
		for b := range g0 {
			g0[a][b] = g[a][b].Value()
		}
	}
	i0, _ := Inverse4(g0)
	for v := 0; v < 4; v++ {
		for a := 0; a < 4; a++ {
			for b := 0; b < 4; b++ {
				want := 0.0
				for m := 0; m < 4; m++ {
					for n := 0; n < 4; n++ {
						want -= i0[a][m] * g[m][n].D(v) * i0[n][b]
					}
				}
				if got := inv[a][b].D(v); !relClose(got, want, 1e-12) {
					t.Errorf("∂%d(G⁻¹)[%d][%d] = %v, want %v", v, a, b, got, want)
				}
			}
		}
	}
}

func BenchmarkMulOrder(b *testing.B) {
	for order := 1; order <= MaxOrder; order++ {
		b.Run(string(rune('0'+order)), func(b *testing.B) {
			var x, y Jet
			x.SetVar(order, 0.3, 0)
			y.SetVar(order, 0.4, 1)
			for i := 0; i < b.N; i++ {
				x.Mul(&x, &y)
			}
		})
	}
}
