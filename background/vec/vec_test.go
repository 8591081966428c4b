package vec

import (
	"math"
	"math/rand"
	"testing"
)

func TestEpsRestFrame(t *testing.T) {
	// Exact identity for ε_{0123} = +1: ε^i_{0jk} b^j c^k = −(b×c)^i.
	b := Vec3{0.3, -1.2, 2.5}
	c := Vec3{-0.7, 0.4, 1.1}
	w := Eps(Vec4{1, 0, 0, 0}, FromSpatial(0, b), FromSpatial(0, c))
	want := b.Cross(c).Scale(-1)
	for i := 0; i < 3; i++ {
		if math.Abs(w[i+1]-want[i]) > 1e-15 {
			t.Fatalf("component %d: got %v want %v", i, w[i+1], want[i])
		}
	}
	if w[0] != 0 {
		t.Fatalf("time component %v, want 0", w[0])
	}
}

func TestLeviParity(t *testing.T) {
	cases := []struct {
		i    [4]int
		want float64
	}{
		{[4]int{0, 1, 2, 3}, 1}, {[4]int{1, 0, 2, 3}, -1}, {[4]int{1, 2, 3, 0}, -1},
		{[4]int{3, 2, 1, 0}, 1}, {[4]int{0, 0, 2, 3}, 0},
	}
	for _, c := range cases {
		if got := Levi(c.i[0], c.i[1], c.i[2], c.i[3]); got != c.want {
			t.Errorf("Levi%v = %v, want %v", c.i, got, c.want)
		}
	}
}

func TestVelocityMassShell(t *testing.T) {
	u := Velocity(Vec3{0.3, 0.4, -0.5})
	if math.Abs(u.Dot(u)+1) > 1e-14 {
		t.Fatalf("u·u = %v, want −1", u.Dot(u))
	}
}

// TestNorm: |v| agrees with the overflow-safe nested math.Hypot (which
// rounds twice) to 4 ulp over magnitudes 1e-150 … 1e150 (where the squares
// are formed directly), and equals it exactly where the squares would
// overflow or underflow, and for zero, infinite and NaN components.
func TestNorm(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	ref := func(v Vec3) float64 { return math.Hypot(math.Hypot(v[0], v[1]), v[2]) }
	for i := 0; i < 20000; i++ {
		sc := math.Pow(10, 300*rng.Float64()-150)
		v := Vec3{sc * rng.NormFloat64(), sc * rng.NormFloat64(), sc * rng.NormFloat64()}
		if d := math.Abs(v.Norm() - ref(v)); d > 9e-16*ref(v) {
			t.Fatalf("|%v| = %.17g, math.Hypot %.17g", v, v.Norm(), ref(v))
		}
	}
	for _, v := range []Vec3{{}, {1e200, 1e200, 0}, {1e-200, 0, 3e-200}, {math.Inf(1), math.NaN(), 0}, {math.NaN(), 1, 2}, {math.MaxFloat64, 0, 0}} {
		if n, r := v.Norm(), ref(v); n != r && !(math.IsNaN(n) && math.IsNaN(r)) {
			t.Errorf("|%v| = %g, math.Hypot %g", v, n, r)
		}
	}
}
