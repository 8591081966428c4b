package integrate

import (
	"math"
	"testing"
)

// TestAlongTrack: the along-track variable ζ = tan(½ atan(λ/b)) and its
// inverse λ = 2bζ/(1 − ζ²) with dλ/dζ agree with the same maps formed
// from math.Atan and math.Tan (λ = b tan(2 atan ζ), dλ/dζ =
// 2b sec²(2 atan ζ)/(1 + ζ²)) over λ = ±1e-12 … ±1e12 b. The round trip
// λ → ζ → λ holds λ to a relative 4.5e-16·(1 + |λ|/b) (2 ulp) (ζ near ±1 holds
// 1 − |ζ| ≈ b/(2|λ|) to an absolute rounding), the along-track shift that
// the error weights allow for (osculating.go).
func TestAlongTrack(t *testing.T) {
	const b = 3.0
	var lams []float64
	for e := -12.0; e <= 12; e += 0.25 {
		l := b * math.Pow(10, e)
		lams = append(lams, l, -l)
	}
	lams = append(lams, 0)
	for _, lam := range lams {
		z := zetaOf(b, lam)
		if ref := math.Tan(0.5 * math.Atan(lam/b)); math.Abs(z-ref) > 4e-16*math.Max(math.Abs(ref), 1e-300) && math.Abs(z-ref) > 2.3e-16 {
			t.Errorf("ζ(λ = %g) = %.17g, tan(½ atan(λ/b)) = %.17g", lam, z, ref)
		}
		l2, dl := alongTrack(b, z)
		if d := math.Abs(l2 - lam); d > 4.5e-16*(1+math.Abs(lam)/b)*math.Abs(lam) {
			t.Errorf("λ(ζ(%g)) = %.17g", lam, l2)
		}
		th := 2 * math.Atan(z)
		if math.Abs(lam) < 1e6*b {
			// The reference's cos θ near θ = ±π/2 carries the rounding
			// of θ relative to cos θ ≈ b/|λ|: 1e-15(1 + |λ|/b).
			c := math.Cos(th)
			if ref := 2 * b / (c * c * (1 + z*z)); math.Abs(dl-ref) > 1e-15*(1+math.Abs(lam)/b)*ref {
				t.Errorf("dλ/dζ at λ = %g: %.17g, reference %.17g", lam, dl, ref)
			}
		}
	}
}
