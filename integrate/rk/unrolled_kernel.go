package rk

// unrolled is a generated stepper for one tableau (unrolled.go, written by
// gen_unrolled.go): the stage combinations and error vectors of one step
// with the coefficients as literals.
type unrolled struct {
	coef   []float64 // the coefficients it was generated from (flattenTableau)
	stages func(s *Solver, f Func, t, h float64)
	errs   func(k [][]float64, e5, e3 []float64)
	fixed  []fixedKernel // fixed-size steppers, by dimension
}

// fixedKernel is a generated stepper for one state dimension: stages as
// unrolled.stages, and norm the two sums of squares of the weighed error
// vectors of weighedNorm over the first controlled components, for
// Settings.Weights.
type fixedKernel struct {
	dim, controlled int
	stages          func(s *Solver, f Func, t, h float64)
	norm            func(s *Solver, w []float64) (sum5, sum3 float64)
}

// fixedFor returns the fixed-size stepper of u for dim components of
// which controlled are under error control, or nil.
func (u *unrolled) fixedFor(dim, controlled int) *fixedKernel {
	if u == nil {
		return nil
	}
	for i := range u.fixed {
		if f := &u.fixed[i]; f.dim == dim && f.controlled == controlled {
			return f
		}
	}
	return nil
}

// kernelFor returns the generated stepper of tab, or nil: the coefficients
// must match exactly, so a modified or hand-made tableau runs on the
// generic stepper. The comparison walks the tableau in the order of
// flattenTableau without building the list (it runs once per Solver).
func kernelFor(tab *Tableau) *unrolled {
	for i := range unrolledKernels {
		if k := &unrolledKernels[i]; sameCoefficients(tab, k.coef) {
			return k
		}
	}
	return nil
}

func sameCoefficients(tab *Tableau, c []float64) bool {
	match := func(v []float64) bool {
		if len(v) > len(c) {
			return false
		}
		for j, x := range v {
			if c[j] != x {
				return false
			}
		}
		c = c[len(v):]
		return true
	}
	if !match(tab.C) {
		return false
	}
	for _, row := range tab.A {
		if !match(row) {
			return false
		}
	}
	if !match(tab.B) || !match(tab.BHat) || !match(tab.BHat3) {
		return false
	}
	if tab.FSAL {
		return len(c) == 1 && c[0] == 1
	}
	return len(c) == 0
}

// flattenTableau lists the coefficients that define a step: C, A, B, BHat,
// BHat3 and the FSAL flag (as a trailing 1).
func flattenTableau(tab *Tableau) []float64 {
	var out []float64
	out = append(out, tab.C...)
	for _, row := range tab.A {
		out = append(out, row...)
	}
	out = append(out, tab.B...)
	out = append(out, tab.BHat...)
	out = append(out, tab.BHat3...)
	if tab.FSAL {
		out = append(out, 1)
	}
	return out
}
