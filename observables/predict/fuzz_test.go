package predict

import (
	"testing"

	"ricochet/background/vec"
)

// FuzzCompile: the formula front end never panics, and an evaluation runs
// at most one operation per node of the syntax tree (so it cannot hang or
// grow: the language has no loops), whatever the input.
func FuzzCompile(f *testing.F) {
	for _, s := range []string{
		"2*q*Q/(v*b)",
		"let B = bvec - i*perp(a1 + a2); re((q - i*g)*(Q + i*P)*dot(B, bhat)/dot(B, B))",
		"-p*(2*(2*gamma^2-1)/(gamma^2-1)*eps)",
		"cross(vvec, a1).z + norm(a2) - unit(bvec).y",
		"let x = 1; let y = x*x; y^y^y",
		"sqrt(-1)**i",
		"b > 1 ? 1 : 2",
		"[1,2,3] | map(# * 2)",
		"1..1000000000",
		"\"a\" + \"b\"",
	} {
		f.Add(s)
	}
	q := Quantities{Gamma: 1.5, V: 0.745, B: 1, Mass: 1, Charge: 1, SourceCharge: 0.05, Eps: 0.05,
		ProbeSpin: vec.Vec3{0.2, 0, 0.1}, SourceSpin: vec.Vec3{0, 0.15, 0.3}}
	q.Frame.L, q.Frame.B, q.Frame.N = vec.Vec3{1, 0, 0}, vec.Vec3{0, 1, 0}, vec.Vec3{0, 0, 1}
	f.Fuzz(func(t *testing.T, src string) {
		form, err := Compile("fuzz", src)
		if err != nil {
			return
		}
		if form.Nodes() > MaxFormulaNodes {
			t.Fatalf("%q: %d nodes accepted, limit %d", src, form.Nodes(), MaxFormulaNodes)
		}
		for _, mirror := range []bool{false, true} {
			_, steps := form.eval(q, mirror)
			if steps > form.Nodes() {
				t.Fatalf("%q: %d operations for %d nodes", src, steps, form.Nodes())
			}
		}
		_, _ = form.Real(q, false)
	})
}
