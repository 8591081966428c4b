package spacetime

import "ricochet/background/jet"

// Static Taylor arithmetic.
//
// The metrics of this package do not depend on t, so their derivatives
// need only the three spatial variables. tay is a Taylor polynomial in
// (x, y, z) truncated at total order k ≤ 3, with fixed storage and
// unrolled products (taylor_mul.go, generated): the fast counterpart of
// package jet, to which the tests compare it. Coefficients are Taylor
// coefficients c_α = ∂^α f/α!, ordered by total degree and, within a
// degree, lexicographically decreasing in the exponents of (x, y, z):
//
//	0: 1
//	1–3: x, y, z
//	4–9: xx, xy, xz, yy, yz, zz
//	10–19: xxx, xxy, xxz, xyy, xyz, xzz, yyy, yyz, yzz, zzz
//
// Elementary functions are composed through their univariate series in the
// nilpotent part, as in package jet (Griewank & Walther 2008, Ch. 13, from
// memory).

const (
	tayMaxOrder = 3
	taySize     = 20
)

// tayLen[k] is the number of coefficients of order ≤ k.
var tayLen = [tayMaxOrder + 1]int{1, 4, 10, 20}

// Index tables for second and third partial derivatives: the storage index
// of e_i + e_j (+ e_l) and the factorial α! that turns the coefficient
// into the partial derivative.
var (
	tayIdx2 [3][3]int
	tayFac2 [3][3]float64
	tayIdx3 [3][3][3]int
	tayFac3 [3][3][3]float64
)

func init() {
	index := map[[3]int]int{}
	n := 0
	for d := 0; d <= tayMaxOrder; d++ {
		for a := d; a >= 0; a-- {
			for b := d - a; b >= 0; b-- {
				index[[3]int{a, b, d - a - b}] = n
				n++
			}
		}
	}
	fac := func(m [3]int) float64 {
		f := 1.0
		for _, e := range m {
			for q := 2; q <= e; q++ {
				f *= float64(q)
			}
		}
		return f
	}
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			var m [3]int
			m[i]++
			m[j]++
			tayIdx2[i][j] = index[m]
			tayFac2[i][j] = fac(m)
			for l := 0; l < 3; l++ {
				m3 := m
				m3[l]++
				tayIdx3[i][j][l] = index[m3]
				tayFac3[i][j][l] = fac(m3)
			}
		}
	}
}

type tay struct {
	k int
	c [taySize]float64
}

func minK(a, b int) int {
	if a < b {
		return a
	}
	return b
}

func (z *tay) setConst(k int, v float64) *tay {
	z.k = k
	z.c = [taySize]float64{}
	z.c[0] = v
	return z
}

// setVar sets z to the coordinate x^{i+1} (i = 0, 1, 2 for x, y, z)
// expanded about v.
func (z *tay) setVar(k int, v float64, i int) *tay {
	z.setConst(k, v)
	if k > 0 {
		z.c[1+i] = 1
	}
	return z
}

func (z *tay) set(x *tay) *tay { *z = *x; return z }

func (z *tay) add(x, y *tay) *tay {
	k := minK(x.k, y.k)
	for i := 0; i < tayLen[k]; i++ {
		z.c[i] = x.c[i] + y.c[i]
	}
	z.k = k
	return z
}

func (z *tay) sub(x, y *tay) *tay {
	k := minK(x.k, y.k)
	for i := 0; i < tayLen[k]; i++ {
		z.c[i] = x.c[i] - y.c[i]
	}
	z.k = k
	return z
}

func (z *tay) scale(s float64, x *tay) *tay {
	for i := 0; i < tayLen[x.k]; i++ {
		z.c[i] = s * x.c[i]
	}
	z.k = x.k
	return z
}

func (z *tay) addConst(x *tay, s float64) *tay {
	z.set(x)
	z.c[0] += s
	return z
}

// addScaled sets z = x + s·y.
func (z *tay) addScaled(x *tay, s float64, y *tay) *tay {
	k := minK(x.k, y.k)
	for i := 0; i < tayLen[k]; i++ {
		z.c[i] = x.c[i] + s*y.c[i]
	}
	z.k = k
	return z
}

func (z *tay) mul(x, y *tay) *tay {
	k := minK(x.k, y.k)
	switch k {
	case 0:
		z.c[0] = x.c[0] * y.c[0]
	case 1:
		mul1(&z.c, &x.c, &y.c)
	case 2:
		mul2(&z.c, &x.c, &y.c)
	default:
		mul3(&z.c, &x.c, &y.c)
	}
	z.k = k
	return z
}

// series sets z = Σ_{j≤k} t[j] hʲ with h = x − x(0), by Horner's rule.
func (z *tay) series(x *tay, t *[tayMaxOrder + 1]float64) *tay {
	k := x.k
	if k == 0 {
		z.c[0] = t[0]
		return z
	}
	if k == 1 {
		z.c[1], z.c[2], z.c[3] = t[1]*x.c[1], t[1]*x.c[2], t[1]*x.c[3]
		z.c[0] = t[0]
		z.k = 1
		return z
	}
	var h tay
	h.set(x)
	h.c[0] = 0
	var s tay
	s.setConst(k, t[k])
	for j := k - 1; j >= 0; j-- {
		s.mul(&s, &h)
		s.c[0] += t[j]
	}
	*z = s
	return z
}

func (z *tay) inv(x *tay) *tay {
	s := jet.InvSeries(x.c[0], x.k)
	return z.series(x, (*[tayMaxOrder + 1]float64)(s[:tayMaxOrder+1]))
}

func (z *tay) div(x, y *tay) *tay {
	var w tay
	w.inv(y)
	return z.mul(x, &w)
}

func (z *tay) sqrt(x *tay) *tay {
	s := jet.SqrtSeries(x.c[0], x.k)
	return z.series(x, (*[tayMaxOrder + 1]float64)(s[:tayMaxOrder+1]))
}

// d1 returns ∂f/∂x^{i+1}.
func (x *tay) d1(i int) float64 { return x.c[1+i] }

// d2 returns ∂²f/∂x^{i+1}∂x^{j+1}.
func (x *tay) d2(i, j int) float64 { return tayFac2[i][j] * x.c[tayIdx2[i][j]] }

// d3 returns ∂³f/∂x^{i+1}∂x^{j+1}∂x^{l+1}.
func (x *tay) d3(i, j, l int) float64 { return tayFac3[i][j][l] * x.c[tayIdx3[i][j][l]] }
