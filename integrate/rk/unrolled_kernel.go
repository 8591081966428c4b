package rk

// unrolled is a generated stepper for one tableau (unrolled.go, written by
// gen_unrolled.go): the stage combinations and error vectors of one step
// with the coefficients as literals.
type unrolled struct {
	coef   []float64 // the coefficients it was generated from (flattenTableau)
	stages func(s *Solver, f Func, t, h float64)
	errs   func(k [][]float64, e5, e3 []float64)
}

// kernelFor returns the generated stepper of tab, or nil: the coefficients
// must match exactly, so a modified or hand-made tableau runs on the
// generic stepper.
func kernelFor(tab *Tableau) *unrolled {
	c := flattenTableau(tab)
	for i := range unrolledKernels {
		k := &unrolledKernels[i]
		if len(k.coef) != len(c) {
			continue
		}
		same := true
		for j := range c {
			if c[j] != k.coef[j] {
				same = false
				break
			}
		}
		if same {
			return k
		}
	}
	return nil
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
