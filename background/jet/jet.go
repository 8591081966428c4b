package jet

import "math"

const (
	// NumVars is the number of independent variables.
	NumVars = 4
	// MaxOrder is the highest supported truncation order.
	MaxOrder = 4
	// Size is the number of Taylor coefficients at MaxOrder, C(8,4).
	Size = 70
)

// Jet is a truncated Taylor polynomial in four variables. The zero value is
// the order-0 constant 0.
type Jet struct {
	order int
	c     [Size]float64
}

// Index tables, built once by init.
var (
	lens     [MaxOrder + 1]int  // Len(K): number of coefficients of order ≤ K
	alphas   [Size][NumVars]int // multi-index of each coefficient
	degree   [Size]int          // |α|
	indexOf  [MaxOrder + 1][MaxOrder + 1][MaxOrder + 1][MaxOrder + 1]int
	pairOff  [Size + 1]int          // pairs for output k are pairs[pairOff[k]:pairOff[k+1]]
	pairs    [][2]uint8             // (i, j) with α_i + α_j = α_k
	derivIdx [NumVars][Size]int     // index of α + e_v (or −1)
	derivFac [NumVars][Size]float64 // α_v + 1
	alphaFac [Size]float64          // α! = Π α_v!
	binomK   [MaxOrder + 1]float64  // scratch-free factorials
)

func init() {
	n := 0
	for d := 0; d <= MaxOrder; d++ {
		for a := d; a >= 0; a-- {
			for b := d - a; b >= 0; b-- {
				for c := d - a - b; c >= 0; c-- {
					e := d - a - b - c
					alphas[n] = [NumVars]int{a, b, c, e}
					degree[n] = d
					indexOf[a][b][c][e] = n
					n++
				}
			}
		}
		lens[d] = n
	}
	if n != Size {
		panic("jet: internal table size mismatch")
	}
	for k := 0; k < Size; k++ {
		pairOff[k] = len(pairs)
		ak := alphas[k]
		for i := 0; i < lens[degree[k]]; i++ {
			ai := alphas[i]
			var aj [NumVars]int
			ok := true
			for v := range aj {
				aj[v] = ak[v] - ai[v]
				if aj[v] < 0 {
					ok = false
				}
			}
			if ok {
				pairs = append(pairs, [2]uint8{uint8(i), uint8(indexOf[aj[0]][aj[1]][aj[2]][aj[3]])})
			}
		}
		f := 1.0
		for _, a := range ak {
			for m := 2; m <= a; m++ {
				f *= float64(m)
			}
		}
		alphaFac[k] = f
	}
	pairOff[Size] = len(pairs)
	for v := 0; v < NumVars; v++ {
		for k := 0; k < Size; k++ {
			a := alphas[k]
			a[v]++
			if degree[k]+1 > MaxOrder {
				derivIdx[v][k] = -1
				continue
			}
			derivIdx[v][k] = indexOf[a[0]][a[1]][a[2]][a[3]]
			derivFac[v][k] = float64(a[v])
		}
	}
	f := 1.0
	for k := 0; k <= MaxOrder; k++ {
		if k > 0 {
			f *= float64(k)
		}
		binomK[k] = f
	}
}

// Len returns the number of Taylor coefficients of a jet of the given
// order, C(order+4, 4).
func Len(order int) int { return lens[order] }

// Index returns the storage index of the multi-index α.
func Index(alpha [NumVars]int) int {
	return indexOf[alpha[0]][alpha[1]][alpha[2]][alpha[3]]
}

// Order returns the truncation order of x.
func (x *Jet) Order() int { return x.order }

// Value returns f(x₀).
func (x *Jet) Value() float64 { return x.c[0] }

// Coeff returns the Taylor coefficient c_α = ∂^α f/α!, or 0 if |α| exceeds
// the order of x.
func (x *Jet) Coeff(alpha [NumVars]int) float64 {
	d := alpha[0] + alpha[1] + alpha[2] + alpha[3]
	if d > x.order {
		return 0
	}
	return x.c[Index(alpha)]
}

// Partial returns ∂^α f at the expansion point, or 0 if |α| exceeds the
// order of x.
func (x *Jet) Partial(alpha [NumVars]int) float64 {
	d := alpha[0] + alpha[1] + alpha[2] + alpha[3]
	if d > x.order {
		return 0
	}
	k := Index(alpha)
	return alphaFac[k] * x.c[k]
}

// D returns the first derivative ∂f/∂xᵛ (0 at order 0).
func (x *Jet) D(v int) float64 {
	if x.order == 0 {
		return 0
	}
	return x.c[1+v]
}

// Coeffs returns the slice of the Len(Order()) stored Taylor coefficients.
// It aliases x.
func (x *Jet) Coeffs() []float64 { return x.c[:lens[x.order]] }

func checkOrder(order int) {
	if order < 0 || order > MaxOrder {
		panic("jet: order out of range")
	}
}

// SetConst sets z to the constant v at the given order.
func (z *Jet) SetConst(order int, v float64) *Jet {
	checkOrder(order)
	z.order = order
	n := lens[order]
	z.c[0] = v
	for k := 1; k < n; k++ {
		z.c[k] = 0
	}
	return z
}

// SetVar sets z to the independent variable xᵛ expanded about the value v:
// z = v + (xᵛ − v).
func (z *Jet) SetVar(order int, v float64, i int) *Jet {
	z.SetConst(order, v)
	if order > 0 {
		z.c[1+i] = 1
	}
	return z
}

// Set sets z = x.
func (z *Jet) Set(x *Jet) *Jet {
	if z == x {
		return z
	}
	z.order = x.order
	copy(z.c[:lens[x.order]], x.c[:lens[x.order]])
	return z
}

// Truncate sets z to x truncated to order min(order, x.Order()).
func (z *Jet) Truncate(x *Jet, order int) *Jet {
	if order > x.order {
		order = x.order
	}
	z.order = order
	if z != x {
		copy(z.c[:lens[order]], x.c[:lens[order]])
	}
	return z
}

func minOrder(a, b int) int {
	if a < b {
		return a
	}
	return b
}

// Add sets z = x + y.
func (z *Jet) Add(x, y *Jet) *Jet {
	o := minOrder(x.order, y.order)
	n := lens[o]
	for k := 0; k < n; k++ {
		z.c[k] = x.c[k] + y.c[k]
	}
	z.order = o
	return z
}

// Sub sets z = x − y.
func (z *Jet) Sub(x, y *Jet) *Jet {
	o := minOrder(x.order, y.order)
	n := lens[o]
	for k := 0; k < n; k++ {
		z.c[k] = x.c[k] - y.c[k]
	}
	z.order = o
	return z
}

// Neg sets z = −x.
func (z *Jet) Neg(x *Jet) *Jet { return z.Scale(-1, x) }

// Scale sets z = s·x.
func (z *Jet) Scale(s float64, x *Jet) *Jet {
	n := lens[x.order]
	for k := 0; k < n; k++ {
		z.c[k] = s * x.c[k]
	}
	z.order = x.order
	return z
}

// AddConst sets z = x + s.
func (z *Jet) AddConst(x *Jet, s float64) *Jet {
	z.Set(x)
	z.c[0] += s
	return z
}

// AddScaled sets z = x + s·y.
func (z *Jet) AddScaled(x *Jet, s float64, y *Jet) *Jet {
	o := minOrder(x.order, y.order)
	n := lens[o]
	for k := 0; k < n; k++ {
		z.c[k] = x.c[k] + s*y.c[k]
	}
	z.order = o
	return z
}

// Mul sets z = x·y, truncated.
func (z *Jet) Mul(x, y *Jet) *Jet {
	o := minOrder(x.order, y.order)
	switch o {
	case 0:
		z.c[0] = x.c[0] * y.c[0]
	case 1:
		x0, y0 := x.c[0], y.c[0]
		c1 := x0*y.c[1] + x.c[1]*y0
		c2 := x0*y.c[2] + x.c[2]*y0
		c3 := x0*y.c[3] + x.c[3]*y0
		c4 := x0*y.c[4] + x.c[4]*y0
		z.c[0], z.c[1], z.c[2], z.c[3], z.c[4] = x0*y0, c1, c2, c3, c4
	default:
		// Outputs in decreasing degree: c_k depends only on inputs of
		// degree ≤ |α_k|, and the only input of equal degree is index k
		// itself, so writing in place is safe.
		for k := lens[o] - 1; k >= 0; k-- {
			s := 0.0
			for _, p := range pairs[pairOff[k]:pairOff[k+1]] {
				s += x.c[p[0]] * y.c[p[1]]
			}
			z.c[k] = s
		}
	}
	z.order = o
	return z
}

// AddMul sets z = z + x·y. The result order is the smallest of the three
// orders. z must not alias x or y.
func (z *Jet) AddMul(x, y *Jet) *Jet {
	if z == x || z == y {
		panic("jet: AddMul receiver aliases an operand")
	}
	o := minOrder(z.order, minOrder(x.order, y.order))
	switch o {
	case 0:
		z.c[0] += x.c[0] * y.c[0]
	case 1:
		x0, y0 := x.c[0], y.c[0]
		z.c[0] += x0 * y0
		z.c[1] += x0*y.c[1] + x.c[1]*y0
		z.c[2] += x0*y.c[2] + x.c[2]*y0
		z.c[3] += x0*y.c[3] + x.c[3]*y0
		z.c[4] += x0*y.c[4] + x.c[4]*y0
	default:
		for k := lens[o] - 1; k >= 0; k-- {
			s := 0.0
			for _, p := range pairs[pairOff[k]:pairOff[k+1]] {
				s += x.c[p[0]] * y.c[p[1]]
			}
			z.c[k] += s
		}
	}
	z.order = o
	return z
}

// Deriv sets z = ∂x/∂xᵛ, a jet of order x.Order()−1. x must have order ≥ 1.
func (z *Jet) Deriv(x *Jet, v int) *Jet {
	if x.order == 0 {
		panic("jet: derivative of an order-0 jet")
	}
	o := x.order - 1
	n := lens[o]
	if z == x {
		// Increasing k reads indices of larger degree only, never
		// written before being read.
		for k := 0; k < n; k++ {
			z.c[k] = derivFac[v][k] * x.c[derivIdx[v][k]]
		}
	} else {
		for k := 0; k < n; k++ {
			z.c[k] = derivFac[v][k] * x.c[derivIdx[v][k]]
		}
	}
	z.order = o
	return z
}

// series sets z = Σ_{k=0}^{K} t[k]·hᵏ with h = x − x₀, where K is the order
// of x and t[k] = f⁽ᵏ⁾(x₀)/k!.
func (z *Jet) series(x *Jet, t *[MaxOrder + 1]float64) *Jet {
	o := x.order
	switch o {
	case 0:
		z.c[0] = t[0]
	case 1:
		z.c[1] = t[1] * x.c[1]
		z.c[2] = t[1] * x.c[2]
		z.c[3] = t[1] * x.c[3]
		z.c[4] = t[1] * x.c[4]
		z.c[0] = t[0]
	default:
		var h Jet
		h.Set(x)
		h.c[0] = 0
		// Horner: z = ((t_K h + t_{K−1}) h + …) h + t_0.
		z.SetConst(o, t[o])
		for k := o - 1; k >= 0; k-- {
			z.Mul(z, &h)
			z.c[0] += t[k]
		}
	}
	z.order = o
	return z
}

// InvSeries returns the Taylor coefficients t_k = f⁽ᵏ⁾(x₀)/k!, k ≤ order,
// of f(x) = 1/x about x₀ (the coefficients Inv composes).
func InvSeries(x0 float64, order int) (t [MaxOrder + 1]float64) {
	u := 1 / x0
	p := u
	for k := 0; k <= order; k++ {
		if k%2 == 0 {
			t[k] = p
		} else {
			t[k] = -p
		}
		p *= u
	}
	return t
}

// SqrtSeries returns the Taylor coefficients of √x about x₀ > 0 up to the
// given order (the coefficients Sqrt composes).
func SqrtSeries(x0 float64, order int) (t [MaxOrder + 1]float64) {
	s := math.Sqrt(x0)
	t[0] = s
	u := 1 / x0
	b, p := 1.0, s
	for k := 1; k <= order; k++ {
		b *= (0.5 - float64(k-1)) / float64(k)
		p *= u
		t[k] = b * p
	}
	return t
}

// Inv sets z = 1/x.
func (z *Jet) Inv(x *Jet) *Jet {
	t := InvSeries(x.c[0], x.order)
	return z.series(x, &t)
}

// Div sets z = x/y.
func (z *Jet) Div(x, y *Jet) *Jet {
	if minOrder(x.order, y.order) <= 1 {
		o := minOrder(x.order, y.order)
		q := x.c[0] / y.c[0]
		if o == 1 {
			u := 1 / y.c[0]
			for k := 1; k <= 4; k++ {
				z.c[k] = (x.c[k] - q*y.c[k]) * u
			}
		}
		z.c[0] = q
		z.order = o
		return z
	}
	var w Jet
	w.Inv(y)
	return z.Mul(x, &w)
}

// Pow sets z = x^p for real p; x must be positive unless p is an integer.
func (z *Jet) Pow(x *Jet, p float64) *Jet {
	var t [MaxOrder + 1]float64
	x0 := x.c[0]
	t[0] = math.Pow(x0, p)
	b := 1.0 // binomial coefficient C(p, k)
	for k := 1; k <= x.order; k++ {
		b *= (p - float64(k-1)) / float64(k)
		t[k] = b * math.Pow(x0, p-float64(k))
	}
	return z.series(x, &t)
}

// Sqrt sets z = √x.
func (z *Jet) Sqrt(x *Jet) *Jet {
	t := SqrtSeries(x.c[0], x.order)
	return z.series(x, &t)
}

// Square sets z = x².
func (z *Jet) Square(x *Jet) *Jet { return z.Mul(x, x) }

// Exp sets z = eˣ.
func (z *Jet) Exp(x *Jet) *Jet {
	var t [MaxOrder + 1]float64
	e := math.Exp(x.c[0])
	for k := 0; k <= x.order; k++ {
		t[k] = e / binomK[k]
	}
	return z.series(x, &t)
}

// Log sets z = ln x.
func (z *Jet) Log(x *Jet) *Jet {
	var t [MaxOrder + 1]float64
	t[0] = math.Log(x.c[0])
	u := 1 / x.c[0]
	p := 1.0
	for k := 1; k <= x.order; k++ {
		p *= u
		if k%2 == 1 {
			t[k] = p / float64(k)
		} else {
			t[k] = -p / float64(k)
		}
	}
	return z.series(x, &t)
}

// Sin sets z = sin x.
func (z *Jet) Sin(x *Jet) *Jet {
	var t [MaxOrder + 1]float64
	s, c := math.Sincos(x.c[0])
	d := [4]float64{s, c, -s, -c}
	for k := 0; k <= x.order; k++ {
		t[k] = d[k%4] / binomK[k]
	}
	return z.series(x, &t)
}

// Cos sets z = cos x.
func (z *Jet) Cos(x *Jet) *Jet {
	var t [MaxOrder + 1]float64
	s, c := math.Sincos(x.c[0])
	d := [4]float64{c, -s, -c, s}
	for k := 0; k <= x.order; k++ {
		t[k] = d[k%4] / binomK[k]
	}
	return z.series(x, &t)
}

// atanSeries holds the Taylor coefficients of arctan about 0.
var atanSeries = [MaxOrder + 1]float64{0, 1, 0, -1.0 / 3, 0}

// Atan sets z = arctan x, using arctan x = arctan x₀ + arctan((x − x₀)/(1 + x x₀)).
func (z *Jet) Atan(x *Jet) *Jet {
	x0 := x.c[0]
	var num, den Jet
	num.Set(x)
	num.c[0] = 0
	den.Scale(x0, x)
	den.c[0] += 1
	num.Div(&num, &den)
	t := atanSeries
	z.series(&num, &t)
	z.c[0] = math.Atan(x0)
	return z
}

// Atan2 sets z = atan2(y, x), the angle of the point (x, y), using
//
//	atan2(y, x) = θ₀ + arctan((x₀y − y₀x)/(x₀x + y₀y)),  θ₀ = atan2(y₀, x₀),
//
// where the argument of arctan has zero value. (x₀, y₀) must not be (0, 0).
func (z *Jet) Atan2(y, x *Jet) *Jet {
	x0, y0 := x.c[0], y.c[0]
	var num, den Jet
	num.Scale(x0, y)
	num.AddScaled(&num, -y0, x)
	num.c[0] = 0
	den.Scale(x0, x)
	den.AddScaled(&den, y0, y)
	num.Div(&num, &den)
	t := atanSeries
	z.series(&num, &t)
	z.c[0] = math.Atan2(y0, x0)
	return z
}
