package numfmt_test

import (
	"math"
	"testing"

	"ricochet/observables/numfmt"
)

// TestSplit: hand-worked cases of the concise notation (JCGM 100:2008
// §7.2.2 writes m = 100.02147(35) g for σ = 0.35 mg; from memory).
func TestSplit(t *testing.T) {
	cases := []struct {
		x, s    float64
		n       int
		plain   string
		unicode string
		latex   string
	}{
		{100.02147, 0.00035, 2, "1.0002147(35)e+02", "1.0002147(35)×10²", `1.0002147(35)\times10^{2}`},
		{1.23456e-3, 6e-8, 1, "1.23456(6)e-03", "1.23456(6)×10⁻³", `1.23456(6)\times10^{-3}`},
		{-23.1259393, 3.7e-7, 2, "-2.312593930(37)e+01", "−2.312593930(37)×10¹", `-2.312593930(37)\times10^{1}`},
		{9.9996, 0.0003, 1, "9.9996(3)", "9.9996(3)", "9.9996(3)"},
		{9.99996, 0.003, 1, "1.0000(3)e+01", "1.0000(3)×10¹", `1.0000(3)\times10^{1}`}, // mantissa carries to 10
		{1.5, 0.0996, 2, "1.50(10)", "1.50(10)", "1.50(10)"},                           // σ rounds up a decade
		{0.0, 2e-5, 1, "0(2)e-05", "0(2)×10⁻⁵", `0(2)\times10^{-5}`},
		{math.Pi, 0, 2, "3.141592654", "3.141592654", "3.141592654"},
	}
	for _, c := range cases {
		v := numfmt.Split(c.x, c.s, c.n)
		if v.Plain() != c.plain || v.Unicode() != c.unicode || v.LaTeX() != c.latex {
			t.Errorf("Split(%v, %v, %d) = %q %q %q, want %q %q %q", c.x, c.s, c.n, v.Plain(), v.Unicode(), v.LaTeX(), c.plain, c.unicode, c.latex)
		}
	}
}

// TestRoundTrip: Parse(Plain) returns the value to within half a unit of
// the last digit shown and the uncertainty to within its own rounding.
func TestRoundTrip(t *testing.T) {
	for _, c := range [][2]float64{{-1.234567e-7, 3.3e-12}, {4.2e5, 17}, {0.5, 0.02}} {
		s := numfmt.Split(c[0], c[1], 2).Plain()
		x, sig, err := numfmt.Parse(s)
		if err != nil {
			t.Fatal(err)
		}
		// Two significant digits of σ: relative rounding of σ ≤ 5 %; x is
		// rounded to the last digit of σ, i.e. within σ/10 (half a unit of
		// the second digit, ≤ 0.05 σ, plus rounding).
		if math.Abs(x-c[0]) > 0.06*c[1] || math.Abs(sig-c[1]) > 0.05*c[1] {
			t.Errorf("%v ± %v → %q → %v ± %v", c[0], c[1], s, x, sig)
		}
	}
}

// TestPositional: shifting the decimal point keeps the value and the
// digits (hand-worked cases); a shift that would invent digits is refused.
func TestPositional(t *testing.T) {
	cases := []struct {
		v    numfmt.Value
		want string
	}{
		{numfmt.Value{Mantissa: "-8.6381416", Unc: "2", Exp: -1}, "-0.86381416(2)"},
		{numfmt.Value{Mantissa: "1.25", Unc: "3", Exp: 1}, "12.5(3)"},
		{numfmt.Value{Mantissa: "1.25", Unc: "3", Exp: 2}, "125(3)"},
		{numfmt.Value{Mantissa: "3.5", Exp: -3}, "0.0035"},
		{numfmt.Value{Mantissa: "1.25", Unc: "3", Exp: 3}, "1.25(3)e+03"}, // 1250 would invent a digit
		{numfmt.Value{Mantissa: "4.5", Unc: "1", Exp: -4}, "4.5(1)e-04"},  // outside [lo, hi]
	}
	for _, c := range cases {
		if got := c.v.Positional(-3, 3).Plain(); got != c.want {
			t.Errorf("%+v: %s, want %s", c.v, got, c.want)
		}
		x, s, err := numfmt.Parse(c.v.Plain())
		y, u, err2 := numfmt.Parse(c.v.Positional(-3, 3).Plain())
		// The same decimal digits: equal to rounding of the parse.
		if err != nil || err2 != nil || math.Abs(x-y) > 1e-15*math.Abs(x) || math.Abs(s-u) > 1e-15*s {
			t.Errorf("%+v: %v ± %v, positional %v ± %v (%v %v)", c.v, x, s, y, u, err, err2)
		}
	}
}
