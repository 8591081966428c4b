package rk

import (
	"math"
	"testing"
)

// rootedTree is a rooted tree given by the indices of its subtrees (in a
// global list ordered by order), non-decreasing so that every tree appears
// once.
type rootedTree struct {
	order    int
	children []int
	gamma    float64 // density γ(t) = |t| Π γ(t_k)
}

// rootedTrees returns all rooted trees with at most maxOrder vertices,
// ordered by order (Butcher 2008, Numerical Methods for ODEs, §30; Hairer,
// Nørsett & Wanner 1993, §II.2).
func rootedTrees(maxOrder int) []rootedTree {
	trees := []rootedTree{{order: 1, gamma: 1}}
	for n := 2; n <= maxOrder; n++ {
		known := len(trees)
		var gen func(remaining, minIdx int, cur []int)
		gen = func(remaining, minIdx int, cur []int) {
			if remaining == 0 {
				g := float64(n)
				for _, c := range cur {
					g *= trees[c].gamma
				}
				trees = append(trees, rootedTree{order: n, children: append([]int(nil), cur...), gamma: g})
				return
			}
			for i := minIdx; i < known; i++ {
				if trees[i].order > remaining {
					break
				}
				gen(remaining-trees[i].order, i, append(cur, i))
			}
		}
		gen(n-1, 0, nil)
	}
	return trees
}

func TestRootedTreeCounts(t *testing.T) {
	// Number of rooted trees with n vertices: OEIS A000081 (Cayley 1857);
	// Hairer, Nørsett & Wanner 1993, Table II.2.1.
	want := []int{0, 1, 1, 2, 4, 9, 20, 48, 115, 286}
	count := make([]int, 10)
	for _, tr := range rootedTrees(9) {
		count[tr.order]++
	}
	for n := 1; n <= 9; n++ {
		if count[n] != want[n] {
			t.Errorf("order %d: %d trees, want %d", n, count[n], want[n])
		}
	}
	// γ of the tall tree of order n is n!, of the bushy tree n.
	// (Hairer, Nørsett & Wanner 1993, §II.2, Definition 2.10.)
}

// extendedA returns the full coupling matrix of the main and the dense
// output stages, and the nodes.
func extendedA(tab *Tableau) ([][]float64, []float64) {
	ns := tab.Stages()
	total := ns + len(tab.DenseC)
	a := make([][]float64, total)
	c := make([]float64, total)
	for i := 0; i < total; i++ {
		a[i] = make([]float64, total)
		var row []float64
		if i < ns {
			row, c[i] = tab.A[i], tab.C[i]
		} else {
			row, c[i] = tab.DenseA[i-ns], tab.DenseC[i-ns]
		}
		copy(a[i], row)
	}
	return a, c
}

// elementaryWeights returns Φ_i(t) for every tree and stage i:
// Φ_i(•) = 1, Φ_i([t_1 … t_m]) = Π_k Σ_j a_ij Φ_j(t_k).
func elementaryWeights(a [][]float64, trees []rootedTree) [][]float64 {
	n := len(a)
	phi := make([][]float64, len(trees))
	aphi := make([][]float64, len(trees))
	for ti, tr := range trees {
		p := make([]float64, n)
		for i := range p {
			p[i] = 1
			for _, c := range tr.children {
				p[i] *= aphi[c][i]
			}
		}
		phi[ti] = p
		ap := make([]float64, n)
		for i := range ap {
			for j := range ap {
				ap[i] += a[i][j] * p[j]
			}
		}
		aphi[ti] = ap
	}
	return phi
}

// orderResiduals returns, per tree up to maxOrder, Σ b_i Φ_i(t) − θ^|t|/γ(t)
// and the rounding scale Σ |b_i Φ_i(t)|.
func orderResiduals(b []float64, phi [][]float64, trees []rootedTree, theta float64) (res, scale []float64) {
	res = make([]float64, len(trees))
	scale = make([]float64, len(trees))
	for ti, tr := range trees {
		var s, abs float64
		for i, bi := range b {
			s += bi * phi[ti][i]
			abs += math.Abs(bi * phi[ti][i])
		}
		res[ti] = s - math.Pow(theta, float64(tr.order))/tr.gamma
		scale[ti] = abs
	}
	return res, scale
}

func methods() []*Tableau {
	return []*Tableau{DormandPrince54(), Tsitouras54(), DormandPrince853()}
}

// roundTol is the order-condition tolerance: the coefficients are
// float64 roundings of exact (or 16-to-30-digit) values, so a residual may
// be a few ulp of the largest partial sum Σ|b_i Φ_i|; 1e-13 of that scale
// (≈ 450 ulp) absorbs the ~16 rounded products per sum with margin while
// still catching any wrong digit of a coefficient before the 13th.
const roundTol = 1e-13

func TestRowSums(t *testing.T) {
	// Row-sum condition c_i = Σ_j a_ij (Hairer, Nørsett & Wanner 1993,
	// eq. (II.1.9)); FSAL: last row equals b and c = 1.
	for _, tab := range methods() {
		a, c := extendedA(tab)
		for i := range a {
			var s, abs float64
			for _, v := range a[i] {
				s += v
				abs += math.Abs(v)
			}
			if d := math.Abs(s - c[i]); d > roundTol*math.Max(1, abs) {
				t.Errorf("%s: row %d sums to %.17g, c = %.17g", tab.Name, i, s, c[i])
			}
		}
		if tab.FSAL {
			ns := tab.Stages()
			if tab.C[ns-1] != 1 || tab.B[ns-1] != 0 {
				t.Errorf("%s: FSAL stage not at c = 1 with b = 0", tab.Name)
			}
			for j, v := range tab.A[ns-1] {
				if v != tab.B[j] {
					t.Errorf("%s: FSAL row differs from b at %d", tab.Name, j)
				}
			}
		}
	}
}

func TestOrderConditions(t *testing.T) {
	// Butcher's order conditions Σ b_i Φ_i(t) = 1/γ(t) for all rooted trees
	// with |t| ≤ p (Butcher 1963; Hairer, Nørsett & Wanner 1993, Theorem
	// II.2.13). Checked for the propagated and each embedded solution, and
	// that the propagated solution does not satisfy order p+1 (the claimed
	// order is exact, not an understatement).
	trees := rootedTrees(9)
	for _, tab := range methods() {
		a, _ := extendedA(tab)
		phi := elementaryWeights(a, trees)
		pad := func(b []float64) []float64 {
			out := make([]float64, len(a))
			copy(out, b)
			return out
		}
		cases := []struct {
			name  string
			b     []float64
			order int
		}{
			{"B", tab.B, tab.Order},
			{"BHat", tab.BHat, tab.EmbeddedOrder},
		}
		if tab.BHat3 != nil {
			cases = append(cases, struct {
				name  string
				b     []float64
				order int
			}{"BHat3", tab.BHat3, 3})
		}
		for _, c := range cases {
			res, scale := orderResiduals(pad(c.b), phi, trees, 1)
			worst := 0.0
			failsNext := false
			for ti, tr := range trees {
				r := math.Abs(res[ti]) / math.Max(1, scale[ti])
				switch {
				case tr.order <= c.order:
					worst = math.Max(worst, r)
					if r > roundTol {
						t.Errorf("%s %s: tree %d (order %d) residual %.3g", tab.Name, c.name, ti, tr.order, res[ti])
					}
				case tr.order == c.order+1 && r > 1e-8:
					failsNext = true
				}
			}
			if !failsNext && c.order < 9 {
				t.Errorf("%s %s: satisfies order %d, claimed %d", tab.Name, c.name, c.order+1, c.order)
			}
			t.Logf("%s %s: order %d, worst scaled residual %.2g", tab.Name, c.name, c.order, worst)
		}
	}
}

func TestDenseOrderConditions(t *testing.T) {
	// A continuous extension of order q satisfies Σ b_i(θ) Φ_i(t) = θ^|t|/γ(t)
	// for all |t| ≤ q and all θ (Hairer, Nørsett & Wanner 1993, §II.6,
	// Theorem 6.1), and b_i(1) = b_i (continuity with the step).
	trees := rootedTrees(9)
	for _, tab := range methods() {
		a, _ := extendedA(tab)
		phi := elementaryWeights(a, trees)
		for _, theta := range []float64{0.1, 0.25, 0.5, 0.8, 1} {
			w := make([]float64, len(a))
			for i, p := range tab.Dense {
				for m := len(p) - 1; m >= 0; m-- {
					w[i] = w[i]*theta + p[m]
				}
				w[i] *= theta
			}
			res, scale := orderResiduals(w, phi, trees, theta)
			worst := 0.0
			for ti, tr := range trees {
				if tr.order > tab.DenseOrder {
					continue
				}
				r := math.Abs(res[ti]) / math.Max(1, scale[ti])
				worst = math.Max(worst, r)
				if r > roundTol {
					t.Errorf("%s θ=%g: tree %d (order %d) residual %.3g", tab.Name, theta, ti, tr.order, res[ti])
				}
			}
			if theta == 1 {
				for i := range tab.B {
					if d := math.Abs(w[i] - tab.B[i]); d > roundTol*math.Max(1, absSum(tab.Dense[i])) {
						t.Errorf("%s: b_%d(1) = %.17g, b_%d = %.17g", tab.Name, i, w[i], i, tab.B[i])
					}
				}
			}
			t.Logf("%s dense θ=%g: order %d, worst scaled residual %.2g", tab.Name, theta, tab.DenseOrder, worst)
		}
	}
}

func absSum(v []float64) float64 {
	var s float64
	for _, x := range v {
		s += math.Abs(x)
	}
	return s
}
