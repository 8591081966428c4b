package predict

import (
	"math"
	"strings"
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

// FuzzReadTable: the reader of tables of predicted values never panics,
// refuses bad input with one line, and an accepted table has one value
// per predicted column in every row, finite or NaN (an empty cell).
func FuzzReadTable(f *testing.F) {
	for _, s := range []string{
		"eps,dp_b\n0.05,0.16\n0.025,0.08\n",
		"# comment\neps,gamma,dp_l,da_n\n0.05,1.5,,1e-3\n",
		"eps,dp_b\n0.05,\"0.1\"\n",
		"eps,dp_b,dp_b\n",
		"eps,dp_b\n0.1,0.2,0.3\n",
		"dp_b\n1\n",
		"\"eps\n",
		"eps,\"dp_b\nx\",dp_b\n0.1,a,1\n",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		tab, err := ReadTable(strings.NewReader(text), "fuzz.csv")
		if err != nil {
			if strings.Contains(err.Error(), "\n") {
				t.Fatalf("%q: error of several lines: %q", text, err)
			}
			return
		}
		if len(tab.rows) == 0 || len(tab.Observables) == 0 {
			t.Fatalf("%q: accepted without rows or predicted columns", text)
		}
		for _, r := range tab.rows {
			if len(r.values) != len(tab.Observables) || len(r.params) != len(tab.Params) || !(r.eps > 0) {
				t.Fatalf("%q: row %+v", text, r)
			}
			for _, v := range r.values {
				if math.IsInf(v, 0) {
					t.Fatalf("%q: infinite value accepted", text)
				}
			}
		}
	})
}
