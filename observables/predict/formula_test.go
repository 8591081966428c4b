package predict_test

import (
	"math"
	"strings"
	"testing"

	"ricochet/background/vec"
	"ricochet/observables/predict"
)

// sample is a configuration for formula evaluation: γ = 1.25 (v = 0.6),
// b = 1, spins along z, the frame of record.
func sample() predict.Quantities {
	q := predict.Quantities{Gamma: 1.25, V: 0.6, B: 2, Mass: 1.5, Charge: 1, MagneticCharge: 0.25,
		SourceCharge: 0.05, SourceMagneticCharge: 0.02, SourceMass: 0.01, NUT: 0.003, Eps: 0.05,
		ProbeSpin: vec.Vec3{0.1, 0.2, 0.3}, SourceSpin: vec.Vec3{0, 0, 0.4}}
	q.Frame.L, q.Frame.B, q.Frame.N = vec.Vec3{1, 0, 0}, vec.Vec3{0, 1, 0}, vec.Vec3{0, 0, 1}
	return q
}

// TestFormulaValues: the language computes what the same expression does
// in Go (exact arithmetic identities and math/cmplx at the same inputs).
func TestFormulaValues(t *testing.T) {
	q := sample()
	cases := []struct {
		src  string
		want complex128
	}{
		{"2*q*Q/(v*b)", complex(2*1*0.05/(0.6*2), 0)},
		{"gamma^2 - 1/(1 - v^2)", 0}, // exact: γ² = 1/(1 − v²), to rounding
		{"p - m*gamma*v", 0},
		{"E", complex(1.5*1.25, 0)},
		{"sqrt(-4)", 2i},
		{"(q - i*g)*(Q + i*P)", complex(1, -0.25) * complex(0.05, 0.02)},
		{"dot(a1, a1)", complex(0.14, 0)},
		{"cross(lhat, bhat).z", 1},
		{"dot(nhat, cross(lhat, bhat))", 1},
		{"dot(perp(a1), lhat)", 0},
		{"perp(a1).y", complex(0.2, 0)},
		{"let B = bvec - i*perp(a1 + a2); dot(B, B)", complex(4-0.04-0.49, -2*2*0.2)},
		{"norm(vec(3, 4, 0))", 5},
		{"unit(bvec).y", 1},
		{"re(exp(i*pi))", -1},
		{"abs(3 + 4*i)", 5},
		{"arg(i)", complex(math.Pi/2, 0)},
		{"conj(1 + 2*i)", 1 - 2i},
		{"vim(a1*i).z", complex(0.3, 0)},
		{"-(-a1).x", complex(0.1, 0)},
		{"+b", 2},
		{"2**3 + 2^-1", 8.5},
		{"1e-3*1000", 1},
		{"atan2(1, -1)", complex(3*math.Pi/4, 0)},
		{"let x = 2; let y = x*x; let x2 = y*y; x2", 16},
		{"eps*M*N*a2.z", complex(0.05*0.01*0.003*0.4, 0)},
	}
	for _, c := range cases {
		f, err := predict.Compile("test", c.src)
		if err != nil {
			t.Errorf("%q: %v", c.src, err)
			continue
		}
		z, _ := f.Eval(q, false)
		// Rounding: a few units in the last place of the inputs.
		if d := z - c.want; math.Hypot(real(d), imag(d)) > 1e-15*math.Max(1, math.Hypot(real(c.want), imag(c.want))) {
			t.Errorf("%q = %v, want %v", c.src, z, c.want)
		}
	}
	// The orientation switch reverses cross products and n̂.
	f, _ := predict.Compile("test", "cross(lhat, bhat).z + 10*nhat.z")
	if z, _ := f.Eval(q, true); z != -11 {
		t.Errorf("mirrored: %v, want -11", z)
	}
}

// TestFormulaErrors: bad formulas are refused with one line naming the
// column of the fault.
func TestFormulaErrors(t *testing.T) {
	cases := []struct{ src, want string }{
		{"b + a1", "column 3"},
		{"b +* 2", "column 4"},
		{"foo(b)", "unknown function foo"},
		{"x + 1", "unknown name x"},
		{"sqrt", "sqrt is a function"},
		{"a1", "the value is a vector"},
		{"a1*a1", "use dot(u, w) or cross(u, w)"},
		{"b.x", "component .x of a scalar"},
		{"a1.w", "only the components .x, .y, .z"},
		{`"text"`, "string expressions are not part"},
		{"b > 1 ? 1 : 2", "not part of the formula language"},
		{"[1, 2]", "array expressions are not part"},
		{"b == 1", "operator == is not part"},
		{"let b = 2; b", "would hide the quantity b"},
		{"dot(a1)", "dot(vector): wrong arguments"},
		{"sqrt(a1)", "sqrt(vector): wrong arguments"},
		{"a1 ^ 2", "operator ^ is not defined for vector and scalar"},
		{"", "empty formula"},
		{"(b", "column"},
		{strings.Repeat("b+", predict.MaxFormulaNodes) + "b", "formula too long"},
		{strings.Repeat("1", predict.MaxFormulaLen+1), "allowed: at most"},
	}
	for _, c := range cases {
		_, err := predict.Compile("dp_b", c.src)
		if err == nil {
			t.Errorf("%q: no error", c.src)
			continue
		}
		msg := err.Error()
		if !strings.Contains(msg, c.want) || strings.Contains(msg, "\n") || !strings.HasPrefix(msg, "predict: dp_b: ") {
			t.Errorf("%q: error %q, want one line containing %q", c.src, msg, c.want)
		}
	}
	// A value that is not real at the configuration is an error at
	// evaluation, not a silent real part.
	f, _ := predict.Compile("dp_b", "b + i")
	if _, err := f.Real(sample(), false); err == nil || !strings.Contains(err.Error(), "re(...)") {
		t.Errorf("complex value: %v", err)
	}
	f, _ = predict.Compile("dp_b", "1/(b - b)")
	if _, err := f.Real(sample(), false); err == nil || !strings.Contains(err.Error(), "not finite") {
		t.Errorf("division by zero: %v", err)
	}
}

// TestFormulasMatchClosedForms (internal consistency): the formula
// strings the classifier tests use as correct predictions equal the
// library's closed forms (leading.EMImpulse, leading.Impulse1PM) to
// rounding, at the test configurations and, for the NUT formula, with a
// source spin as well.
func TestFormulasMatchClosedForms(t *testing.T) {
	type item struct {
		cfg     config
		obs     string
		formula string
	}
	kerrNUT := gravConfig("kerr-taub-nut", 1.5, 0.01, 0.005, 0.3)
	items := []item{
		{dyonic, "dp_b", rk(nil)}, {dyonic, "dp_n", rk(map[string]string{"AXIS": "nhat"})},
		{dyonic, "dp_l", rk(map[string]string{"AXIS": "lhat"})},
		{dyonic, "da_t", fill(rootKerrDaT, rootKerrDefaults, nil)},
		{dyonic, "da_l", rka(map[string]string{"AXIS": "lhat"})}, {dyonic, "da_b", rka(nil)},
		{dyonic, "da_n", rka(map[string]string{"AXIS": "nhat"})},
		{nut, "dp_n", nd(nil)}, {nut, "dp_b", nd(map[string]string{"AXIS": "bhat"})},
		{kerrNUT, "dp_n", nd(nil)}, {kerrNUT, "dp_b", nd(map[string]string{"AXIS": "bhat"})},
		{kerrNUT, "dp_l", nd(map[string]string{"AXIS": "lhat"})},
	}
	for _, it := range items {
		m, in, q := it.cfg.build(1)
		dp, da := it.cfg.first(m, in, q)
		o, _ := predict.ParseObservable(it.obs)
		want := [2]vec.Vec4{dp, da}[o.Kick]
		w := q.Frame.Components(want)[o.Comp]
		f, err := predict.Compile(it.obs, it.formula)
		if err != nil {
			t.Fatal(err)
		}
		got, err := f.Real(q, false)
		if err != nil {
			t.Fatal(err)
		}
		// Rounding of two evaluations of the same closed form.
		if math.Abs(got-w) > 1e-14*math.Max(math.Abs(w), want.Spatial().Norm()) {
			t.Errorf("%s %s: formula %.16g, closed form %.16g", it.cfg.name, it.obs, got, w)
		}
	}
}
