package predict_test

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"ricochet/observables/predict"
	"ricochet/observables/scan"
	"ricochet/observables/scenario"
	"ricochet/validate/exact"
)

// darwinAxis is Darwin's problem (coulomb-darwin: v = 0.6, ε = 0.05) with
// a parameter axis over γ: two configurations of our own.
const darwinAxis = `name = "darwin-axis"
[background]
kind = "coulomb"
charge = 0.05
[probe]
kind = "charge"
charge = 1.0
[kinematics]
v = 0.6
[[scan.axis]]
param = "gamma"
values = [1.25, 2.0]
[[scan.axis]]
param = "coupling"
values = [0.001, 0.3]
[prediction]
dp_b = "2*q*Q/(v*b)"
`

func loadScenario(t *testing.T, text string) *scenario.Scenario {
	t.Helper()
	s, err := scenario.Parse([]byte(text), "test.toml")
	if err != nil {
		t.Fatal(err)
	}
	if err := s.Validate(); err != nil {
		t.Fatal(err)
	}
	return s
}

// TestShortScan: the couplings are the scenario's |ε| and exact
// halvings; a coupling axis is replaced, other axes kept; a size outside
// the allowed range is an InputError naming it.
func TestShortScan(t *testing.T) {
	s := loadScenario(t, darwinAxis)
	short, err := predict.ShortScan(s, 6)
	if err != nil {
		t.Fatal(err)
	}
	g := short.CouplingGrid()
	for k, e := range g {
		if want := 0.05 / float64(int(1)<<(5-k)); e != want {
			t.Errorf("coupling %d = %.17g, want %.17g", k, e, want)
		}
	}
	if axes := short.ParamAxes(); len(axes) != 1 || axes[0].Param != "gamma" {
		t.Errorf("axes %+v", axes)
	}
	if s.Scan.Axes[1].Values[1] != 0.3 {
		t.Errorf("the scenario itself was changed: %+v", s.Scan.Axes)
	}
	for _, n := range []int{4, 41} {
		_, err := predict.ShortScan(s, n)
		var ie scenario.InputError
		if !errors.As(err, &ie) || !strings.Contains(err.Error(), fmt.Sprintf("couplings = %d; allowed: 5 ≤ couplings ≤ 40", n)) {
			t.Errorf("n = %d: %v", n, err)
		}
	}
}

// TestEvaluateAxes: each combination of the parameter axes is one
// configuration with its own verdicts. The first-order Coulomb impulse
// (2qQ/(v b); Rutherford, from memory) agrees at first order at both γ;
// a table of Darwin's exact impulse (Darwin 1913; exact.Darwin) with one
// column per axis agrees to all orders at both.
func TestEvaluateAxes(t *testing.T) {
	s := loadScenario(t, darwinAxis)
	short, err := predict.ShortScan(s, 0)
	if err != nil {
		t.Fatal(err)
	}
	recs, err := scan.Run(context.Background(), short, nil)
	if err != nil {
		t.Fatal(err)
	}
	var csv strings.Builder
	csv.WriteString("dp_l,gamma,eps\n")
	for _, gamma := range []float64{1.25, 2} {
		v := math.Sqrt(1 - 1/(gamma*gamma))
		for _, eps := range short.CouplingGrid() {
			d, err := exact.Darwin(v, eps)
			if err != nil {
				t.Fatal(err)
			}
			fmt.Fprintf(&csv, "%.17g,%g,%.17g\n", d.ImpulsePerMass[1], gamma, eps)
		}
	}
	sp, err := predict.CompileSpec(s.Prediction, "")
	if err != nil {
		t.Fatal(err)
	}
	tab, err := predict.ReadTable(strings.NewReader(csv.String()), "darwin.csv")
	if err != nil {
		t.Fatal(err)
	}
	if err := sp.AddTable(tab); err != nil {
		t.Fatal(err)
	}
	cfgs, err := predict.Evaluate(short, recs, sp, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(cfgs) != 2 {
		t.Fatalf("%d configurations, want 2", len(cfgs))
	}
	for k, c := range cfgs {
		if want := []float64{1.25, 2}[k]; c.Params[0] != want || c.Label() != fmt.Sprintf("gamma = %g", want) {
			t.Errorf("configuration %d: %v %q", k, c.Params, c.Label())
		}
		if len(c.Results) != 2 || c.Results[0].Verdict != predict.AgreesFirst || c.Results[1].Verdict != predict.AgreesAll {
			for _, r := range c.Results {
				t.Errorf("%s: %s: %s", c.Label(), r.Observable, r.Verdict)
			}
		}
	}
	// Every row of a table must be a point of the scan.
	tab, _ = predict.ReadTable(strings.NewReader("eps,gamma,dp_b\n0.05,1.5,0.1\n"), "off.csv")
	sp, _ = predict.CompileSpec(&scenario.PredictionSpec{}, "")
	sp.AddTable(tab)
	if _, err := predict.Evaluate(short, recs, sp, nil); err == nil || !strings.Contains(err.Error(), "off.csv: line 2: eps = 0.05, gamma = 1.5 is not a point of the short scan") {
		t.Errorf("row off the scan: %v", err)
	}
}

// TestReadTableErrors: a bad table is refused with one line naming the
// line and column.
func TestReadTableErrors(t *testing.T) {
	cases := []struct{ text, want string }{
		{"", "t.csv: empty table"},
		{"eps,dp_x\n", `t.csv: column "dp_x"; allowed: eps, dp_X, da_X`},
		{"eps,dp_b,dp_b\n", `column "dp_b" appears twice`},
		{"eps,dp_b\n", "t.csv: no rows"},
		{"eps,dp_b\n0,1\n", "t.csv: line 2, column eps: 0; allowed: |eps| > 0"},
		{"eps,dp_b\n0.1,inf\n", `t.csv: line 2, column "dp_b": "inf"; allowed: a finite number or an empty cell`},
		{"# comment\neps,dp_b\n0.1\n", "t.csv: record on line 3: wrong number of fields"},
		{"eps\n0.1\n", "t.csv: no predicted column"},
	}
	for _, c := range cases {
		_, err := predict.ReadTable(strings.NewReader(c.text), "t.csv")
		if err == nil || !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), "\n") {
			t.Errorf("%q: %v, want one line containing %q", c.text, err, c.want)
		}
	}
}
