package fit_test

import (
	"fmt"
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables/fit"
	"ricochet/validate/exact"
)

// source is a background with a known series of the impulse in the
// coupling ε (probe of unit mass and charge, b = 1, incoming along +x,
// impact parameter along +y).
type source int

const (
	coulombRepulsive  source = iota // Coulomb field Q = +ε
	coulombAttractive               // Coulomb field Q = −ε
	monopole                        // magnetic monopole P = ε
	schwarzschild                   // Schwarzschild mass M = ε
)

func (s source) String() string {
	return [...]string{"Coulomb+", "Coulomb-", "monopole", "Schwarzschild"}[s]
}

// model returns the probe in the background of coupling eps > 0.
func (s source) model(eps float64) integrate.Model {
	switch s {
	case coulombRepulsive:
		return &integrate.Charge{Field: em.Coulomb{Q: eps}, M: 1, Q: 1}
	case coulombAttractive:
		return &integrate.Charge{Field: em.Coulomb{Q: -eps}, M: 1, Q: 1}
	case monopole:
		return &integrate.Charge{Field: em.Monopole{P: eps}, M: 1, Q: 1}
	}
	return &integrate.Geodesic{Metric: spacetime.Schwarzschild(eps), M: 1}
}

// series returns the coefficients d1, d2, d3 of the spatial impulse
// component comp (1 = along the incoming motion, 2 = along b, 3 = normal
// to the plane) per unit mass, Δp_comp/m = d1 ε + d2 ε² + d3 ε³ + O(ε⁴),
// at speed v, and the order of the first non-zero term after d1 ε.
func (s source) series(comp int, v float64) (d [4]float64, order int) {
	g := 1 / math.Sqrt((1-v)*(1+v))
	gv := g * v
	switch s {
	case coulombRepulsive, coulombAttractive:
		// Δp/m = γv (cos χ − 1, sin χ, 0) with Darwin's χ (Darwin 1913;
		// series in exact.DarwinSeries); the attractive case is χ(−ε).
		c1, c2, c3 := exact.DarwinSeries(v)
		if s == coulombAttractive {
			c1, c3 = -c1, -c3
		}
		switch comp {
		case 1: // γv(−χ²/2 + …): ε² and ε³ terms of −χ²/2
			return [4]float64{0, 0, -gv * c1 * c1 / 2, -gv * c1 * c2}, 2
		case 2: // γv(χ − χ³/6 + …)
			return [4]float64{0, gv * c1, gv * c2, gv * (c3 - c1*c1*c1/6)}, 2
		}
	case schwarzschild:
		// Δp/m = −γv (1 − cos χ, sin χ, 0), χ = χ1 ε + χ2 ε² + χ3 ε³ with
		// the test-mass PM coefficients of exact.SchwarzschildPM (1PM
		// Einstein; 2PM Westpfahl 1985; 3PM from the expansion of the exact
		// deflection integral, checked there against the quadrature).
		x1, x2, x3 := exact.SchwarzschildPM(v)
		switch comp {
		case 1:
			return [4]float64{0, 0, -gv * x1 * x1 / 2, -gv * x1 * x2}, 2
		case 2:
			return [4]float64{0, -gv * x1, -gv * x2, -gv * (x3 - x1*x1*x1/6)}, 2
		}
	case monopole:
		// Poincaré's cone (Poincaré 1896; exact.Poincare): with η = ε/(γv)
		// the outgoing direction is ((1 − η²)/(1 + η²) + O(η⁴),
		// −πη²/2 + 3πη⁴/8 + O(η⁶), 2η − 2η³ + O(η⁵)) (expanded here from
		// the closed form of exact.Dyon at κ = 0: Φ = π√(1 + η²)).
		switch comp {
		case 1: // γv(−2η² + 0·η³)
			return [4]float64{0, 0, -2 / gv, 0}, 2
		case 2: // γv(−πη²/2 + 0·η³)
			return [4]float64{0, 0, -math.Pi / (2 * gv), 0}, 2
		case 3: // γv(2η − 2η³)
			return [4]float64{0, 2, 0, -2 / (gv * gv)}, 3
		}
	}
	panic(fmt.Sprintf("series: no component %d for %v", comp, s))
}

// exactImpulse returns the exact Δp/m from validate/exact.
func (s source) exactImpulse(v, eps float64) (vec.Vec4, error) {
	var sc exact.Scattering
	var err error
	switch s {
	case coulombRepulsive:
		sc, err = exact.Darwin(v, eps)
	case coulombAttractive:
		sc, err = exact.Darwin(v, -eps)
	case monopole:
		sc, err = exact.Poincare(v, 1, 1, eps)
	default:
		sc, err = exact.Schwarzschild(v, 1, eps)
	}
	return sc.ImpulsePerMass, err
}

// scanSpec is a coupling scan of one background at one speed.
type scanSpec struct {
	Source         source
	Gamma          float64
	EpsMin, EpsMax float64
	Points         int
	Tol            float64 // integrator tolerance; 0 means the default
}

// event is one integrated point of a scan: the impulse per unit mass and
// its component-wise error estimate; OK is false when the probe did not
// scatter (capture).
type event struct {
	Eps       float64
	Dp, DpErr vec.Vec4
	OK        bool
}

// runScan integrates every point of the scan with integrate.Scatter.
func runScan(t testing.TB, sp scanSpec) []event {
	t.Helper()
	var out []event
	for i := 0; i < sp.Points; i++ {
		eps := sp.EpsMin * math.Pow(sp.EpsMax/sp.EpsMin, float64(i)/float64(sp.Points-1))
		if i == sp.Points-1 {
			eps = sp.EpsMax
		}
		in, err := integrate.Incoming(1, sp.Gamma, 1, vec.Vec3{})
		if err != nil {
			t.Fatal(err)
		}
		o, err := integrate.Scatter(sp.Source.model(eps), in, &integrate.Settings{Tol: sp.Tol})
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, event{Eps: eps, Dp: o.Impulse, DpErr: o.ImpulseErr, OK: o.Status == integrate.StatusScattered})
	}
	return out
}

// points returns the fit input of component comp: residual against the
// exact first-order term and σ = the error estimate with a floor of one
// unit in the last place of the value (as the scan command does).
func points(ev []event, src source, comp int, v float64) []fit.Point {
	d, _ := src.series(comp, v)
	var pts []fit.Point
	for _, e := range ev {
		if !e.OK {
			continue
		}
		first := d[1] * e.Eps
		val := e.Dp[comp]
		// The event's error bar is a bound; its standard error for the
		// fit is the bar over integrate.BoundSigmas.
		sig := math.Max(e.DpErr[comp]/integrate.BoundSigmas, 0x1p-52*math.Abs(val))
		f := first
		if f == 0 {
			f = e.Eps // a non-zero scale for Breakdown
		}
		pts = append(pts, fit.Point{Eps: e.Eps, First: f, Residual: val - first, Sigma: sig})
	}
	return pts
}

// TestSeriesAgainstExact: the series of source.series agree with the
// exact impulses of validate/exact through ε³: the remainder exact −
// series shrinks like ε⁴ (or ε⁵ where the ε⁴ term vanishes) when ε is
// halved (internal consistency of the expansions above).
func TestSeriesAgainstExact(t *testing.T) {
	for _, src := range []source{coulombRepulsive, coulombAttractive, monopole, schwarzschild} {
		for _, v := range []float64{0.3, 0.6, 0.9} {
			for _, comp := range []int{1, 2, 3} {
				if comp == 3 && src != monopole {
					continue
				}
				d, _ := src.series(comp, v)
				var rem [2]float64
				for k, eps := range []float64{2e-3, 1e-3} {
					dp, err := src.exactImpulse(v, eps)
					if err != nil {
						t.Fatal(err)
					}
					rem[k] = dp[comp] - (d[1]*eps + d[2]*eps*eps + d[3]*eps*eps*eps)
				}
				// log2 of the ratio: 4 for an ε⁴ remainder, 5 for ε⁵; the
				// next terms of a series in ε/(γv²) ≤ 0.03 shift it by
				// less than 0.3.
				o := math.Log2(math.Abs(rem[0] / rem[1]))
				if math.Abs(o-4) > 0.3 && math.Abs(o-5) > 0.3 {
					t.Errorf("%v v=%g comp %d: remainder %.3g → %.3g, order %.2f, want 4 or 5", src, v, comp, rem[0], rem[1], o)
				}
			}
		}
	}
}
