package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"

	"github.com/spf13/pflag"

	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
)

var runFlags struct {
	common
	format string
}

var cmdRun = &Command{
	Name:      "run",
	UsageLine: "run [flags] [scenario.toml]",
	Short:     "integrate one scattering event and compare with first order",
	Long: `Run integrates one scattering event of the scenario (a TOML file, or a
built-in scenario) from the far past to the far future and prints the
asymptotic impulse and spin kick with their numerical error estimates, the
first-order prediction and the residual, the scattering angles, the drift of
the constraints and conserved quantities, and the conventions used.

The error estimate of each component is the change under a 20-fold tighter
integrator tolerance plus twice the change under a doubled start/stop
radius.`,
	Example: `ricochet run
ricochet run --scenario coulomb-darwin --gamma 2
ricochet run --format json my-scenario.toml`,
	Flags: pflag.NewFlagSet("run", pflag.ContinueOnError),
	Run:   runRun,
}

func init() {
	runFlags.register(cmdRun.Flags)
	cmdRun.Flags.StringVar(&runFlags.format, "format", "text", "output format: text or json")
}

// runResult is the JSON form of a run.
type runResult struct {
	Program     string     `json:"program"`
	Scenario    string     `json:"scenario"`
	Conventions []string   `json:"conventions"`
	Epsilon     float64    `json:"epsilon"`
	Status      string     `json:"status"`
	Impulse     [4]float64 `json:"impulse"`
	ImpulseErr  [4]float64 `json:"impulse_err"`
	SpinKick    [4]float64 `json:"spin_kick"`
	SpinKickErr [4]float64 `json:"spin_kick_err"`
	FirstDp     [4]float64 `json:"first_order_impulse"`
	FirstDa     [4]float64 `json:"first_order_spin_kick"`
	FirstSource string     `json:"first_order_source"`
	Angle       float64    `json:"scattering_angle"`
	AngleErr    float64    `json:"scattering_angle_err"`
	OutOfPlane  float64    `json:"out_of_plane_angle"`
	Drift       integrate.Drift
	Evaluations int     `json:"rhs_evaluations"`
	Radius      float64 `json:"radius_over_b"`
}

func runRun(cmd *Command, args []string, w io.Writer) error {
	if runFlags.format != "text" && runFlags.format != "json" {
		return badf("--format = %q; allowed: text, json", runFlags.format)
	}
	s, _, err := runFlags.load(args)
	if err != nil {
		return err
	}
	ev, err := s.Build()
	if err != nil {
		return err
	}
	out, err := integrate.Scatter(ev.Model, ev.In, s.settings())
	if err != nil {
		return badf("%v", err)
	}
	dp1, da1, src := ev.FirstOrder(s)
	fr := observables.NewFrame(ev.In.P, ev.In.B)
	res := runResult{
		Program: versionString(), Scenario: s.Name, Conventions: conventions(runFlags.conv),
		Epsilon: s.Epsilon(), Status: out.Status.String(),
		Impulse: out.Impulse, ImpulseErr: out.ImpulseErr, SpinKick: out.SpinKick, SpinKickErr: out.SpinKickErr,
		FirstDp: dp1, FirstDa: da1, FirstSource: src,
		Drift: out.Drift, Evaluations: out.Stats.Evaluations, Radius: out.Radius,
	}
	if out.Status == integrate.StatusScattered {
		res.Angle = observables.ScatteringAngle(ev.In.P, out.POut)
		res.AngleErr = norm3(out.ImpulseErr) / norm3(ev.In.P)
		res.OutOfPlane = fr.OutOfPlaneAngle(out.POut)
	}
	if runFlags.format == "json" {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		if out.Status != integrate.StatusScattered {
			res.Impulse, res.ImpulseErr, res.SpinKick, res.SpinKickErr = [4]float64{}, [4]float64{}, [4]float64{}, [4]float64{}
		}
		if err := enc.Encode(nanFree(res)); err != nil {
			return err
		}
		return out.Status.Err()
	}
	fmt.Fprintf(w, "ricochet run: %s\n", s.Name)
	for _, c := range conventions(runFlags.conv) {
		fmt.Fprintf(w, "# %s\n", c)
	}
	fmt.Fprintf(w, "\nprobe %s (m = %g) past %s; gamma = %.6g, v = %.6g, b = %g, eps = %.6g\n",
		ev.Model.Name(), s.Probe.Mass, s.Background.Kind, s.Kinematics.Gamma, s.Kinematics.V, s.Kinematics.B, s.Epsilon())
	if warn := s.superExtremal(); warn != "" {
		fmt.Fprintf(w, "warning: %s\n", warn)
	}
	fmt.Fprintf(w, "status: %s\n", out.Status)
	if out.Status != integrate.StatusScattered {
		return out.Status.Err()
	}
	comp := func(name string, v, e, f vec.Vec4) {
		vc, ec, fc := fr.Components(v), fr.Components(e), fr.Components(f)
		fmt.Fprintf(w, "\n%-4s %22s %9s %22s %12s\n", name, "numeric", "± error", "first order", "residual")
		labels := []string{"t", "l", "b", "n"}
		for i := 0; i < 4; i++ {
			// Error of a frame component: the estimate is component-wise in
			// the source frame; its norm bounds each rotated component.
			ei := ec[i]
			if i > 0 {
				ei = norm3(e)
			}
			fmt.Fprintf(w, "  %s  %22.15e %9s %22.15e %12.4e\n", labels[i], vc[i], fmtErr(math.Abs(ei)), fc[i], vc[i]-fc[i])
		}
	}
	comp("dp", out.Impulse, out.ImpulseErr, dp1)
	if ev.Model.Dim() > 8 {
		comp("da", out.SpinKick, out.SpinKickErr, da1)
	}
	fmt.Fprintf(w, "\nfirst order: %s\n", src)
	fmt.Fprintf(w, "scattering angle %.15e rad ± %s; in-plane %.15e (positive towards +b, away from the source); out-of-plane %.15e (positive towards +n)\n",
		res.Angle, fmtErr(res.AngleErr), fr.InPlaneAngle(out.POut), res.OutOfPlane)
	d := out.Drift
	fmt.Fprintf(w, "drift (max over the path, relative): mass shell %.1e, a.p %.1e, a.a %.1e, energy %.1e", d.MassShell, d.SpinOrth, d.SpinNorm, d.Energy)
	if !d.EnergyExact {
		fmt.Fprintf(w, " (this model conserves energy to first order only)")
	}
	fmt.Fprintf(w, "\nerror budget: tolerance %.1e, radius %.1e; cost: %d right-hand-side evaluations (main run), R = %.3g b\n",
		out.TolErr, out.RadiusErr, out.Stats.Evaluations, out.Radius)
	return nil
}
