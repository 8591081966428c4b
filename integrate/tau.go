package integrate

import "ricochet/integrate/rk"

// solveTau integrates a model in proper time from y0 over tau with the
// default Runge–Kutta pair at tolerance tol and returns the final state.
// It is meant for bound or uniform-field motion, where the scattering
// driver does not apply.
func solveTau(m Model, y0 []float64, tau, tol float64) []float64 {
	s := rk.NewSolver(len(y0), &rk.Settings{RelTol: tol, AbsTol: tol})
	res := s.Solve(func(_ float64, y, dy []float64) { m.Deriv(y, dy) }, 0, y0, tau, nil)
	out := make([]float64, len(y0))
	copy(out, res.Y)
	return out
}
