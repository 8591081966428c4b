package integrate

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// TestVelocityCorrectionClosedForm checks the closed-form solution of the
// Tulczyjew momentum–velocity relation (bodyState.velocityCorrection)
// against the LU solution of the 4 × 4 system (𝓜² δ + S C) w = −T p −
// S (f₀ + C p/𝓜) by gonum (reference library), at random states of the
// Dixon body: in Kerr with the spin-induced quadrupole, charged in
// Kerr–Newman, and in flat space in a root-Kerr field, with spins up to
// the size of the distance to the source (strong coupling of the spin to
// the curvature).
func TestVelocityCorrectionClosedForm(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	kn := spacetime.KerrNewman{M: 0.4, A: 0.5, Q: 0.3}
	worst := 0.0
	for _, d := range []*Dixon{
		{Metric: spacetime.Kerr(0.5, 0.4), M: 1, Gyro: 2, CES2: 1},
		{Metric: kn, M: 1, Q: 0.7, Gyro: 2.4},
		{Field: em.RootKerr{Q: 0.5, A: vec.Vec3{0.1, 0.2, 0.4}}, M: 1, Q: 1, G: 0.3, Gyro: 2},
	} {
		for k := 0; k < 300; k++ {
			y := randomBodyState(rng, d)
			l := d.local(y)
			var b bodyState
			var f0 [4]float64
			var T, C [4][4]float64
			b.load(l, y)
			b.dipole(l, d.kappa(), &f0, &T)
			if d.CES2 != 0 {
				b.quadrupole(l, d.CES2, &f0, &T)
			}
			b.lorentzCurvature(l, &C)
			got := b.velocityCorrection(l, &f0, &T, &C)

			A := mat.NewDense(4, 4, nil)
			rhs := mat.NewVecDense(4, nil)
			M := b.mass
			for mu := 0; mu < 4; mu++ {
				s := 0.0
				for nu := 0; nu < 4; nu++ {
					X := f0[nu]
					for la := 0; la < 4; la++ {
						X += C[nu][la] * b.p[la] / M
					}
					s -= T[mu][nu]*b.pl[nu] + b.Sm[mu][nu]*X
					v := 0.0
					for k := 0; k < 4; k++ {
						v += b.Sm[mu][k] * C[k][nu]
					}
					if mu == nu {
						v += M * M
					}
					A.Set(mu, nu, v)
				}
				rhs.SetVec(mu, s)
			}
			var want mat.VecDense
			if err := want.SolveVec(A, rhs); err != nil {
				t.Fatal(err)
			}
			scale := 0.0
			for mu := 0; mu < 4; mu++ {
				scale = math.Max(scale, math.Abs(want.AtVec(mu)))
			}
			for mu := 0; mu < 4; mu++ {
				e := math.Abs(got[mu]-want.AtVec(mu)) / scale
				worst = math.Max(worst, e)
				// Both exact up to the simplicity of S, which holds to
				// rounding; a well-conditioned 4 × 4 system (𝓜² ≫ |S C|
				// here) loses a few digits at most.
				if e > 1e-12 {
					t.Errorf("%s: w[%d] = %v, LU %v (relative %.2g)", d.Name(), mu, got[mu], want.AtVec(mu), e)
				}
			}
		}
	}
	t.Logf("closed form vs LU: worst relative difference %.2g", worst)
}

// jetMetric hides the type of a metric from the evaluator, which then
// differentiates it in jet arithmetic (the reference path).
type jetMetric struct{ spacetime.Metric }

// TestDixonContractedGeometry: the Tulczyjew pole–dipole right-hand side
// in Kerr, which reads the geometry through the contracted mode of the
// evaluator (closed-form Christoffel and curvature contractions), against
// the same body on the jet path (automatic differentiation of the metric,
// full tensors) at random states, and the Killing energy and J_z, which
// fill the Christoffel symbols on demand.
func TestDixonContractedGeometry(t *testing.T) {
	rng := rand.New(rand.NewPCG(33, 34))
	worst := 0.0
	for _, m := range []spacetime.KerrNewman{spacetime.Kerr(0.5, 0.4), spacetime.Kerr(0.3, -0.9), spacetime.Schwarzschild(0.2)} {
		fast := &Dixon{Metric: m, M: 1, Gyro: 2}
		ref := &Dixon{Metric: jetMetric{m}, M: 1, Gyro: 2}
		for k := 0; k < 200; k++ {
			y := randomBodyState(rng, fast)
			if !fast.local(y).contracted {
				t.Fatalf("%s: the contracted mode is not taken", m.Name())
			}
			dy1, dy2 := make([]float64, len(y)), make([]float64, len(y))
			fast.Deriv(y, dy1)
			ref.Deriv(y, dy2)
			for _, blk := range []int{IX, IP, IA} {
				scale := 0.0
				for i := blk; i < blk+4; i++ {
					scale = math.Max(scale, math.Abs(dy2[i]))
				}
				for i := blk; i < blk+4; i++ {
					e := math.Abs(dy1[i]-dy2[i]) / scale
					worst = math.Max(worst, e)
					// Both exact: rounding of the curvature and
					// Christoffel sums (~10² terms).
					if e > 1e-12 {
						t.Errorf("%s: dy[%d] = %v, jet path %v (relative %.2g)", m.Name(), i, dy1[i], dy2[i], e)
					}
				}
			}
			for _, q := range []struct {
				name   string
				f1, f2 float64
			}{
				{"energy", fast.Energy(y), ref.Energy(y)},
				{"J_z", fast.AngularMomentumZ(y), ref.AngularMomentumZ(y)},
			} {
				if e := math.Abs(q.f1-q.f2) / math.Max(1, math.Abs(q.f2)); e > 1e-13 {
					t.Errorf("%s: %s %v, jet path %v", m.Name(), q.name, q.f1, q.f2)
				}
			}
		}
	}
	t.Logf("contracted vs jet path: worst relative difference %.2g", worst)
}

// randomBodyState returns a state of d at distance 1.5–7.5 from the
// origin in a random direction, with a random momentum on the mass shell
// (m = 1) and a spin orthogonal to it of size up to the distance.
func randomBodyState(rng *rand.Rand, d *Dixon) []float64 {
	y := make([]float64, d.Dim())
	r := 1.5 + 6*rng.Float64()
	n := vec.Vec3{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()}
	n = n.Scale(r / n.Norm())
	y[IX+1], y[IX+2], y[IX+3] = n[0], n[1], n[2]
	for i := 1; i < 4; i++ {
		y[IP+i] = rng.NormFloat64()
		y[IA+i] = rng.NormFloat64()
	}
	l := d.local(y)
	massShellP0(&l.g, y, 1)
	normalizeSpin(&l.g, y, math.Pow(0.2+r*rng.Float64(), 2))
	return y
}
