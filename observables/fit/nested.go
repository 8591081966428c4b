package fit

import "math"

// nestedLS accumulates a weighted linear least-squares problem row by row
// by Givens rotations (sequential QR; Golub & Van Loan, Matrix
// Computations, 4th ed., §5.1.8 and §6.5; Gentleman 1973; from memory),
// so that one pass over the points, in order of ε, yields every prefix of
// the points (a window) and, for each, every model made of the first m
// columns of the design (a nested family: polynomial degrees, numbers of
// correction terms). For the model of the first m columns
//
//	R_m c = (Qᵀy)_{0…m−1},   χ²_m = rss + Σ_{j≥m} (Qᵀy)_j²,
//
// and the covariance of c is (R_mᵀR_m)⁻¹. Givens QR is backward stable
// column by column, so the very different scales of the columns (powers of
// ε) cost no accuracy.
type nestedLS struct {
	k     int       // number of columns
	r     []float64 // k×k upper triangle, row-major
	qty   []float64 // Qᵀy, length k
	qt1   []float64 // Qᵀ1: the weighted design's response to a shift of every point by its σ
	rss   float64   // squared residual left over by the full design
	norm2 []float64 // squared column norms of the weighted design
	rows  int
}

func newNestedLS(k int) *nestedLS {
	return &nestedLS{k: k, r: make([]float64, k*k), qty: make([]float64, k), qt1: make([]float64, k), norm2: make([]float64, k)}
}

// add appends one row (x, y), both already divided by the point's σ. x is
// overwritten.
func (q *nestedLS) add(x []float64, y float64) {
	k := q.k
	one := 1.0
	for j := 0; j < k; j++ {
		q.norm2[j] += x[j] * x[j]
	}
	for j := 0; j < k; j++ {
		xj := x[j]
		if xj == 0 {
			continue
		}
		rjj := q.r[j*k+j]
		rho := math.Hypot(rjj, xj)
		c, s := rjj/rho, xj/rho
		q.r[j*k+j] = rho
		row := q.r[j*k : (j+1)*k]
		for l := j + 1; l < k; l++ {
			rl, xl := row[l], x[l]
			row[l] = c*rl + s*xl
			x[l] = -s*rl + c*xl
		}
		qy := q.qty[j]
		q.qty[j] = c*qy + s*y
		y = -s*qy + c*y
		q1 := q.qt1[j]
		q.qt1[j] = c*q1 + s*one
		one = -s*q1 + c*one
	}
	q.rss += y * y
	q.rows++
}

// clone returns a copy (a snapshot at a window end).
func (q *nestedLS) clone() *nestedLS {
	c := *q
	c.r = append([]float64(nil), q.r...)
	c.qty = append([]float64(nil), q.qty...)
	c.qt1 = append([]float64(nil), q.qt1...)
	c.norm2 = append([]float64(nil), q.norm2...)
	return &c
}

// rankTol is the numerical-rank criterion: column j adds nothing
// resolvable once the part of it orthogonal to the earlier columns,
// |R_jj|, falls below rankTol times its norm (rounding makes R_jj
// uncertain by about 1e-16 of the column norm; common practice).
const rankTol = 1e-10

// rank returns the number of leading columns that are numerically
// independent.
func (q *nestedLS) rank() int {
	for j := 0; j < q.k; j++ {
		if !(math.Abs(q.r[j*q.k+j]) > rankTol*math.Sqrt(q.norm2[j])) {
			return j
		}
	}
	return q.k
}

// nestedFit is the least-squares fit of the first m columns.
type nestedFit struct {
	m    int
	c    []float64 // coefficients
	chi2 float64
	dof  int
	// varc[j] is the variance of c[j] from (R_mᵀR_m)⁻¹ (not inflated),
	// for the j requested.
	varc map[int]float64
	// shift is the change of the coefficients when every point moves by
	// its own σ (in the same direction).
	shift []float64
}

// back solves R_m c = b[:m] by back substitution.
func (q *nestedLS) back(m int, b []float64) []float64 {
	k := q.k
	c := make([]float64, m)
	for i := m - 1; i >= 0; i-- {
		s := b[i]
		for l := i + 1; l < m; l++ {
			s -= q.r[i*k+l] * c[l]
		}
		c[i] = s / q.r[i*k+i]
	}
	return c
}

// solve fits the first m ≤ rank() columns and returns the variances of
// the coefficients listed in want.
func (q *nestedLS) solve(m int, want ...int) nestedFit {
	k := q.k
	f := nestedFit{m: m, dof: q.rows - m, varc: map[int]float64{}}
	f.c, f.shift = q.back(m, q.qty), q.back(m, q.qt1)
	f.chi2 = q.rss
	for j := m; j < k; j++ {
		f.chi2 += q.qty[j] * q.qty[j]
	}
	// Var(c_j) = |R_m⁻ᵀ e_j|²: forward substitution with R_mᵀ.
	z := make([]float64, m)
	for _, j := range want {
		if j >= m {
			continue
		}
		for i := range z {
			z[i] = 0
		}
		v := 0.0
		for i := j; i < m; i++ {
			s := 0.0
			if i == j {
				s = 1
			}
			for l := j; l < i; l++ {
				s -= q.r[l*k+i] * z[l]
			}
			z[i] = s / q.r[i*k+i]
			v += z[i] * z[i]
		}
		f.varc[j] = v
	}
	return f
}
