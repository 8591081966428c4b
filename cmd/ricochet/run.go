package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/spf13/pflag"

	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/observables/convention"
)

var runFlags struct {
	common
	format     string
	plot       string
	projection string
	extent     float64
}

var cmdRun = &Command{
	Name:      "run",
	UsageLine: "run [flags] [scenario.toml]",
	Short:     "integrate one scattering event and compare with first order",
	Long: `Run integrates one scattering event of the scenario (a TOML file, or a
built-in scenario) from the far past to the far future and prints the
asymptotic impulse and spin kick with their numerical error estimates, the
first-order prediction and the residual, the prediction through second
order with its error estimate and the residual after it, the scattering
angles, the drift of the constraints and conserved quantities, and the
conventions used.

The second order comes from iterating the equations of motion once about
the straight line (see README, Second order); it is given at the covariant
impact parameter only, with its checks dp2^0 = 0 (static source, conserved
energy) and the mass shell p_in.dp2 + dp1.dp1/2 = 0.

Each number carries an error bar that bounds its numerical error: the event
is integrated twice, at the requested tolerance (the numbers printed) and at
a 5-fold looser tolerance with twice the start/stop radius; the bar is their
difference, or the accumulated local error bound of the steps if larger,
plus a bound on the tail truncation and a rounding floor. Bars of frame
components bound each rotated component; bars of dp.dp, the angles and the
spin tensors are first-order propagations of the component bars.

Every printed number follows the convention flags. Four-vectors are printed
as contravariant components, which no signature changes; with --signature
the covariant components v_mu and the invariant dp.dp are printed as well,
and these change sign under +---. --units heaviside-lorentz converts the
printed charges (by sqrt(4 pi)) and the electromagnetic coupling (by 4 pi).
--impact chooses the impact parameter at which eps and the first-order
prediction are evaluated; its value is printed. --spin tensor prints the
spin-tensor kick dS^{XY} and S_out^{XY} instead of the spin vector, with the
error bars of p_out and a_out propagated linearly through the bilinear S.

--plot FILE draws the path of the probe (.png, .svg, .pdf or .eps by
extension) projected on a coordinate plane of the source's rest frame
(--projection; default xy, the plane of the incoming motion), with equal
axis scales, the incoming asymptote, the source's horizon or branch disk,
over a window of --extent impact parameters around the source.`,
	Example: `ricochet run
ricochet run --scenario coulomb-darwin --gamma 2
ricochet run --spin tensor --signature +--- --units heaviside-lorentz
ricochet run --format json my-scenario.toml
ricochet run --plot path.pdf --projection xz --extent 5`,
	Flags: pflag.NewFlagSet("run", pflag.ContinueOnError),
	Run:   runRun,
}

func init() {
	f := cmdRun.Flags
	runFlags.register(f)
	f.StringVar(&runFlags.format, "format", "text", "output format: text, json, or json-schema (the JSON Schema of the json output)")
	f.StringVar(&runFlags.plot, "plot", "", "draw the path of the probe to FILE (.png, .svg, .pdf or .eps)")
	f.StringVar(&runFlags.projection, "projection", "xy", "coordinate plane of the --plot figure: xy, xz or yz (source rest frame)")
	floatFlag(f, &runFlags.extent, "extent", 3, "1 ≤ extent ≤ 1000", "half-width of the --plot window in impact parameters (1..1000)")
}

// runResult holds the numbers of a run in the output conventions (the
// JSON document is built from it by runDocument, runjson.go). Four-vectors
// are contravariant components in the source rest frame; the *Cov fields
// are η_{μν}v^ν in the chosen signature. Charges and ε are in the chosen
// units; ε and the first order use the chosen impact parameter.
type runResult struct {
	Program         string
	Scenario        string
	Warnings        []string // e.g. a super-extremal background
	Conventions     []string
	Signature       string
	Units           string
	Charges         map[string]float64
	Epsilon         float64
	ImpactDef       string
	Impact          float64
	ImpactCov       float64
	Status          string
	PIn             [4]float64
	AIn             [4]float64
	POut            [4]float64
	AOut            [4]float64
	Impulse         [4]float64
	ImpulseErr      [4]float64
	ImpulseCov      [4]float64
	Transfer        float64
	SpinKick        *[4]float64
	SpinKickErr     *[4]float64
	SpinKickCov     *[4]float64
	FirstDp         [4]float64
	FirstDa         *[4]float64
	SpinTensorKick  *[4][4]float64
	SpinTensorErr   *[4][4]float64
	SpinTensorOut   *[4][4]float64
	FirstSpinTensor *[4][4]float64
	SpinErrNote     string
	FirstSource     string
	// The second-order terms (to be added to the first order) from
	// integrate.SecondOrder, at the covariant impact parameter only.
	SecondDp      *[4]float64
	SecondDpErr   *[4]float64
	SecondDa      *[4]float64
	SecondDaErr   *[4]float64
	SecondSource  string
	Angle         float64
	AngleErr      float64
	InPlaneErr    float64
	OutOfPlaneErr float64
	TransferErr   float64
	InPlane       float64 // signed, positive towards +b
	OutOfPlane    float64 // positive towards +n
	// Swept is the in-plane deflection (positive towards +b, away from
	// the source) unwrapped along the path, so that orbits turning by
	// more than π are not folded; Windings counts the full turns of the
	// position about n (observables.Sweep). Its error is InPlaneErr.
	Swept    float64
	Windings int
	Drift    integrate.Drift
	// DriftNote says what the mass-shell and spin-condition drifts are
	// under a spin supplementary condition other than Tulczyjew ("" for
	// the default).
	DriftNote   string
	TolErr      float64
	TruncErr    float64
	Evaluations int
	Radius      float64
}

// errorBarNote says what an error bar is, for the output headers.
const errorBarNote = "error bars bound the numerical error of each component (met in >= 99 % of components against exact solutions, median 5-10x the actual error): |x(tol) - x(5 tol, 2R)| of a second, looser run, or the accumulated local error bound 0.03 N tol |dp| if larger, plus a tail-truncation bound and a rounding floor"

const spinErrNote = "error of S^{mu nu} = eps^{mu nu rho sigma} p_rho a_sigma: |dS/dp| dp + |dS/da| da, component-wise, from the error bars of p_out and a_out (linear propagation)"

// runReport is one event in the output conventions.
type runReport struct {
	runResult
	fr       observables.Frame
	bdef     float64
	spinning bool
	dp1, da1 vec.Vec4
	second   *integrate.SecondOrderResult // nil when not available
	conv     convention.Set
	// scattered: the event has an out-state (otherwise the outgoing
	// numbers are absent, null in JSON).
	scattered   bool
	spinKickErr vec.Vec4
	// Parts of the spatial bars that bound the norm of the error
	// (integrate.Outcome.ImpulseErrIso), for the record-frame bars.
	dpIso, daIso float64
}

// report converts an outcome into the output conventions conv.
func report(s *Scenario, ev Event, out integrate.Outcome, conv convention.Set) runReport {
	r := runReport{fr: observables.NewFrame(ev.In.P, ev.In.B), spinning: ev.Model.Dim() > 8, conv: conv,
		scattered: out.Status == integrate.StatusScattered, spinKickErr: out.SpinKickErr,
		dpIso: out.ImpulseErrIso, daIso: out.SpinKickErrIso}
	bcov := ev.In.B.Spatial().Norm()
	r.bdef = bcov
	if out.Status == integrate.StatusScattered {
		if b := conv.Impact.Of(ev.In.P, out.POut, ev.In.B); b > 0 {
			r.bdef = b
		}
	}
	// The first-order prediction at the chosen impact parameter: the same
	// formula with b rescaled to b_def (spins and charges fixed).
	e := ev
	e.In.B = ev.In.B.Scale(r.bdef / bcov)
	dp1, da1, src := e.FirstOrder(s)
	r.dp1, r.da1 = dp1, da1
	em := s.Electromagnetic()
	eps := conv.Units.Coupling(s.Epsilon()*bcov/r.bdef, em)
	res := runResult{
		Program: versionString(), Scenario: s.Name, Conventions: conventions(conv),
		Signature: conv.Signature.String(), Units: conv.Units.String(),
		Charges: map[string]float64{
			"probe_charge": conv.Units.Charge(s.Probe.Charge), "probe_magnetic_charge": conv.Units.Charge(s.Probe.MagneticCharge),
			"source_charge": conv.Units.Charge(s.Background.Charge), "source_magnetic_charge": conv.Units.Charge(s.Background.MagneticCharge),
		},
		Epsilon: eps, ImpactDef: conv.Impact.String(), Impact: r.bdef, ImpactCov: bcov,
		Status: out.Status.String(), PIn: ev.In.P, AIn: ev.In.A,
		FirstDp: dp1, FirstSource: src,
		Drift: out.Drift, DriftNote: sscDriftNote(s.Probe.SSC), Evaluations: out.Stats.Evaluations, Radius: out.Radius,
	}
	// Without a scattered outcome there are no numbers: NaN here, null
	// in JSON (nanFree), a named status in the text.
	nan := math.NaN()
	nan4 := [4]float64{nan, nan, nan, nan}
	res.POut, res.AOut, res.Impulse, res.ImpulseErr, res.ImpulseCov = nan4, nan4, nan4, nan4, nan4
	res.Transfer, res.Angle, res.AngleErr, res.OutOfPlane, res.Swept = nan, nan, nan, nan, nan
	if w := s.SuperExtremal(); w != "" {
		res.Warnings = []string{w}
	}
	if out.Status == integrate.StatusScattered {
		res.POut, res.AOut = out.POut, out.AOut
		res.Impulse, res.ImpulseErr = out.Impulse, out.ImpulseErr
		res.ImpulseCov = covariant(conv.Signature, out.Impulse)
		res.Transfer = conv.Signature.Dot(out.Impulse, out.Impulse)
		res.Angle = observables.ScatteringAngle(ev.In.P, out.POut)
		res.TransferErr = observables.SquareErr(out.Impulse, out.ImpulseErr)
		res.AngleErr = observables.ScatteringAngleErr(ev.In.P, out.POut, out.ImpulseErr, out.ImpulseErrIso)
		res.InPlaneErr = r.fr.InPlaneAngleErr(out.POut, out.ImpulseErr, out.ImpulseErrIso)
		res.OutOfPlaneErr = r.fr.OutOfPlaneAngleErr(out.POut, out.ImpulseErr, out.ImpulseErrIso)
		res.InPlane = r.fr.InPlaneAngle(out.POut)
		res.OutOfPlane = r.fr.OutOfPlaneAngle(out.POut)
		res.TolErr, res.TruncErr = out.TolErr, out.TruncErr
	}
	if r.spinning {
		if conv.Spin == convention.Tensor {
			st1 := convention.SpinTensorKick1(ev.In.P, ev.In.A, dp1, da1)
			res.FirstSpinTensor = &st1
			res.SpinErrNote = spinErrNote
			if out.Status == integrate.StatusScattered {
				sOut := convention.SpinTensor(out.POut, out.AOut)
				kick := convention.TensorDiff(sOut, convention.SpinTensor(ev.In.P, ev.In.A))
				se := convention.SpinTensorErr(out.POut, out.AOut, absVec(out.ImpulseErr), absVec(out.SpinKickErr))
				res.SpinTensorKick, res.SpinTensorOut, res.SpinTensorErr = &kick, &sOut, &se
			} else {
				n := [4][4]float64{nan4, nan4, nan4, nan4}
				res.SpinTensorKick, res.SpinTensorOut, res.SpinTensorErr = &n, &n, &n
			}
		} else {
			d1 := [4]float64(da1)
			res.FirstDa = &d1
			if out.Status == integrate.StatusScattered {
				k, ke, kc := [4]float64(out.SpinKick), [4]float64(out.SpinKickErr), [4]float64(covariant(conv.Signature, out.SpinKick))
				res.SpinKick, res.SpinKickErr, res.SpinKickCov = &k, &ke, &kc
			} else {
				res.SpinKick, res.SpinKickErr, res.SpinKickCov = &nan4, &nan4, &nan4
			}
		}
	}
	res.SecondSource = "not available for b_J or the eikonal b (the conversion changes the second order)"
	if conv.Impact == convention.Covariant {
		if so, err := integrate.SecondOrder(ev.Model, ev.In, nil); err != nil {
			res.SecondSource = "not available: " + err.Error()
		} else if so.Status != integrate.StatusScattered {
			res.SecondSource = "not available: the straight line meets a hazard (" + so.Status.String() + ")"
		} else {
			r.second = &so
			d, e := [4]float64(so.Impulse2), [4]float64(so.Impulse2Err)
			res.SecondDp, res.SecondDpErr = &d, &e
			if r.spinning {
				a, ae := [4]float64(so.SpinKick2), [4]float64(so.SpinKick2Err)
				res.SecondDa, res.SecondDaErr = &a, &ae
			}
			how := "finite differences in the coupling"
			if so.Exact {
				how = "exact coupling derivatives"
			}
			res.SecondSource = fmt.Sprintf("iterated straight-line quadrature (%s; %d nodes, %d evaluations)", how, so.Nodes, so.Evals)
		}
	}
	r.runResult = res
	return r
}

// numOrNA formats x, or "n/a" when it is not a number (a first order
// that does not apply).
func numOrNA(x float64, format string) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return "n/a"
	}
	return fmt.Sprintf(format, x)
}

func absVec(v vec.Vec4) vec.Vec4 {
	return vec.Vec4{math.Abs(v[0]), math.Abs(v[1]), math.Abs(v[2]), math.Abs(v[3])}
}

func runRun(cmd *Command, args []string, w io.Writer) error {
	switch runFlags.format {
	case "text", "json":
	case "json-schema":
		return writeSchema(w, "run")
	default:
		return badf("--format = %q; allowed: text, json, json-schema", runFlags.format)
	}
	if cmd.Flags.Changed("plot") {
		if err := checkPlotExt("plot", runFlags.plot); err != nil {
			return err
		}
		if err := checkOutputPath("plot", runFlags.plot); err != nil {
			return err
		}
	}
	proj, err := parseProjection(runFlags.projection)
	if err != nil {
		return err
	}
	if !(runFlags.extent >= 1 && runFlags.extent <= 1000) {
		return badf("--extent = %g; allowed: 1 ≤ extent ≤ 1000 (impact parameters)", runFlags.extent)
	}
	s, _, err := runFlags.load(args)
	if err != nil {
		return err
	}
	ev, err := s.Build()
	if err != nil {
		return err
	}
	set := s.Settings()
	var path []pathPoint
	sweep := observables.NewSweep(observables.NewFrame(ev.In.P, ev.In.B))
	set.Observe = func(_ float64, y []float64) {
		sweep.Add(integrate.Pos(y).Spatial())
		if runFlags.plot != "" {
			path = append(path, newPathPoint(y))
		}
	}
	out, err := integrate.Scatter(ev.Model, ev.In, set)
	if err != nil {
		return badf("%v", err)
	}
	conv := runFlags.conv
	rep := report(s, ev, out, conv)
	if out.Status == integrate.StatusScattered {
		rep.Swept, rep.Windings = sweep.Deflection(out.POut)
	}
	if runFlags.plot != "" {
		fig := trajectoryFigure{Scenario: s, Event: ev, Out: out, Path: path, Proj: proj, Extent: runFlags.extent, Angle: rep.Angle}
		if err := fig.save(runFlags.plot); err != nil {
			return fmt.Errorf("--plot: %v", err)
		}
	}
	if runFlags.format == "json" {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		if err := enc.Encode(nanFree(runDocument(rep))); err != nil {
			return err
		}
		return outcomeErr(out.Status)
	}
	writeRunText(w, s, ev, out, conv, rep)
	return outcomeErr(out.Status)
}

// outcomeErr returns the error of an event's status: none for every
// computed outcome, physical ones (capture, disk crossing, ...) included,
// which are reported as statuses with exit 0; a failure of the integrator
// is a program failure (exit 1).
func outcomeErr(st integrate.Status) error {
	if st == integrate.StatusIntegratorFailed {
		return st.Err()
	}
	return nil
}

// writeRunText prints the event in the terminal format.
func writeRunText(w io.Writer, s *Scenario, ev Event, out integrate.Outcome, conv convention.Set, rep runReport) {
	fmt.Fprintf(w, "ricochet run: %s\n", s.Name)
	for _, c := range conventions(conv) {
		fmt.Fprintf(w, "# %s\n", c)
	}
	fmt.Fprintf(w, "# run output: tables give contravariant components (the same in both signatures); the covariant components v_mu = eta_{mu nu} v^nu and dp.dp below are in signature %s\n", sigParen(conv.Signature))
	fmt.Fprintf(w, "# %s\n", errorBarNote)
	fmt.Fprintf(w, "\nprobe %s (m = %g%s) past %s%s; gamma = %.6g, v = %.6g\n",
		ev.Model.Name(), s.Probe.Mass, probeCharges(s, conv), s.Background.Kind, sourceCharges(s, conv), s.Kinematics.Gamma, s.Kinematics.V)
	fmt.Fprintf(w, "impact parameter: %s = %.15g%s, used by eps = %.6g (%s) and by the first-order prediction\n",
		impactName(conv.Impact), rep.bdef, covNote(conv.Impact, rep.ImpactCov), rep.Epsilon, unitsShort(s, conv))
	if warn := s.SuperExtremal(); warn != "" {
		fmt.Fprintf(w, "warning: %s\n", warn)
	}
	fmt.Fprintf(w, "status: %s\n", out.Status)
	if out.Status != integrate.StatusScattered {
		// No outgoing state, no numbers; what the first order is (or
		// why it does not apply) still informs.
		fmt.Fprintf(w, "first order: %s\n", rep.FirstSource)
		return
	}
	fr := rep.fr
	comp := func(name string, v, e vec.Vec4, iso float64, f vec.Vec4, f2, e2 *vec.Vec4) {
		vc, ec, fc := frameVec(fr, v), fr.Err(e, iso), frameVec(fr, f)
		fmt.Fprintf(w, "\n%-4s %22s %9s %22s %12s %22s %9s %12s\n", name, "numeric", "± error", "first order", "residual", "to second order", "± error", "residual")
		for i := 0; i < 4; i++ {
			fmt.Fprintf(w, "  %s  %22.15e %9s %22s %12s", frameLabels[i], vc[i], fmtErr(ec[i]), numOrNA(fc[i], "%22.15e"), numOrNA(vc[i]-fc[i], "%12.4e"))
			if f2 != nil {
				sc, se := frameVec(fr, *f2), fr.Err(*e2, 0)
				fmt.Fprintf(w, " %22s %9s %12s", numOrNA(fc[i]+sc[i], "%22.15e"), fmtErr(se[i]), numOrNA(vc[i]-fc[i]-sc[i], "%12.4e"))
			}
			fmt.Fprintln(w)
		}
		lc := covariant(conv.Signature, vc)
		fmt.Fprintf(w, "  covariant %s_mu (t, l, b, n), signature %s: %.15e %.15e %.15e %.15e\n", name, sigParen(conv.Signature), lc[0], lc[1], lc[2], lc[3])
	}
	var dp2, dp2e, da2, da2e *vec.Vec4
	if so := rep.second; so != nil {
		dp2, dp2e, da2, da2e = &so.Impulse2, &so.Impulse2Err, &so.SpinKick2, &so.SpinKick2Err
	}
	comp("dp", out.Impulse, out.ImpulseErr, out.ImpulseErrIso, rep.dp1, dp2, dp2e)
	fmt.Fprintf(w, "  dp.dp = %.15e ± %s (signature %s; spacelike momentum transfer)\n", rep.Transfer, fmtErr(rep.TransferErr), sigParen(conv.Signature))
	if rep.spinning {
		if conv.Spin == convention.Tensor {
			writeTensorRows(w, fr, out, ev, rep)
		} else {
			comp("da", out.SpinKick, out.SpinKickErr, out.SpinKickErrIso, rep.da1, da2, da2e)
		}
	}
	fmt.Fprintf(w, "\nfirst order: %s\n", rep.FirstSource)
	fmt.Fprintf(w, "second order: %s\n", rep.SecondSource)
	if so := rep.second; so != nil {
		fmt.Fprintf(w, "second-order checks: dp2^0 = %.3e (zero for a static source with conserved energy), p_in.dp2 + dp1.dp1/2 = %.3e (mass shell)\n", so.Impulse2[0], so.MassShell)
	}
	fmt.Fprintf(w, "scattering angle %.15e rad ± %s (between p_in and p_out, in [0, pi]); in-plane %.15e ± %s (positive towards +b, away from the source), swept along the path %.15e (full turns of the position about n: %d); out-of-plane %.15e ± %s (positive towards +n)\n",
		rep.Angle, fmtErr(rep.AngleErr), rep.InPlane, fmtErr(rep.InPlaneErr), rep.Swept, rep.Windings, rep.OutOfPlane, fmtErr(rep.OutOfPlaneErr))
	if math.Abs(rep.Swept) > math.Pi {
		fmt.Fprintf(w, "deflection past pi: the direction of motion turned by %.15e rad ± %s (the position swept %.6g rad about the source, %d full turns); the angle between p_in and p_out folds it to %.15e\n",
			math.Abs(rep.Swept), fmtErr(rep.InPlaneErr), math.Abs(rep.Swept-math.Pi), rep.Windings, rep.Angle)
	}
	d := out.Drift
	fmt.Fprintf(w, "drift (max over the path, relative): mass shell %.1e, a.p %.1e, a.a %.1e, energy %.1e", d.MassShell, d.SpinOrth, d.SpinNorm, d.Energy)
	turned := d.JAxis != (vec.Vec3{0, 0, 1}) && d.JAxis != (vec.Vec3{})
	if !math.IsNaN(d.AngularMomentumZ) && d.AngularMomentumZ != 0 {
		if turned {
			fmt.Fprintf(w, ", J_n %.1e (n = background spin axis [%.4g %.4g %.4g])", d.AngularMomentumZ, d.JAxis[0], d.JAxis[1], d.JAxis[2])
		} else {
			fmt.Fprintf(w, ", J_z %.1e", d.AngularMomentumZ)
		}
	}
	if rep.spinning && s.Background.Curved() {
		j := "J_z"
		if turned {
			j = "J_n"
		}
		cond := "a.p is the Tulczyjew condition"
		if n := sscDriftNote(s.Probe.SSC); n != "" {
			cond = n
		}
		fmt.Fprintf(w, " (energy and %s are the Killing charges with their spin terms ½S^{μν}∇_μξ_ν; %s)", j, cond)
	}
	if !d.EnergyExact {
		fmt.Fprintf(w, " (this model conserves energy to first order only)")
	}
	fmt.Fprintf(w, "\nerror budget: tolerance %.1e (change to a %d-fold looser run), tail truncation %.1e; cost: %d right-hand-side evaluations (%d with the error run), R = %.3g b\n",
		out.TolErr, integrate.LooseFactor, out.TruncErr, out.Evals, out.EventEvals, out.Radius)
}

// writeTensorRows prints the spin-tensor kick ΔS^{XY} and S_out^{XY} in
// the frame of record (t, l, b, n), whose spatial triad is right-handed,
// so the components are those of S built from the frame components of p
// and a.
func writeTensorRows(w io.Writer, fr observables.Frame, out integrate.Outcome, ev Event, rep runReport) {
	pin, ain := frameVec(fr, ev.In.P), frameVec(fr, ev.In.A)
	pout, aout := frameVec(fr, out.POut), frameVec(fr, out.AOut)
	sOut := convention.SpinTensor(pout, aout)
	kick := convention.TensorDiff(sOut, convention.SpinTensor(pin, ain))
	first := convention.SpinTensorKick1(pin, ain, frameVec(fr, rep.dp1), frameVec(fr, rep.da1))
	se := convention.SpinTensorErr(pout, aout, fr.Err(out.ImpulseErr, out.ImpulseErrIso), fr.Err(out.SpinKickErr, out.SpinKickErrIso))
	fmt.Fprintf(w, "\n%-6s %22s %9s %22s %12s %22s %9s\n", "dS^XY", "numeric", "± error", "first order", "residual", "S_out^XY", "± error")
	for _, ij := range tensorPairs {
		i, j := ij[0], ij[1]
		// S_in is exact: S_out carries the error of the kick.
		fmt.Fprintf(w, "  %s%s    %22.15e %9s %22.15e %12.4e %22.15e %9s\n", frameLabels[i], frameLabels[j],
			kick[i][j], fmtErr(se[i][j]), first[i][j], kick[i][j]-first[i][j], sOut[i][j], fmtErr(se[i][j]))
	}
	fmt.Fprintf(w, "  (contravariant, the same in both signatures; first order S(dp1, a_in) + S(p_in, da1); %s)\n", spinErrNote)
}

func sigParen(s convention.Signature) string {
	if s == convention.MostlyMinus {
		return "(+,-,-,-)"
	}
	return "(-,+,+,+)"
}

func impactName(d convention.Impact) string {
	switch d {
	case convention.AngularMomentum:
		return "b_J = |J|/|p_in|"
	case convention.Eikonal:
		return "eikonal b_eik"
	}
	return "covariant b"
}

func covNote(d convention.Impact, bcov float64) string {
	if d == convention.Covariant {
		return ""
	}
	return fmt.Sprintf(" (covariant b = %.15g)", bcov)
}

func unitsShort(s *Scenario, conv convention.Set) string {
	if !s.Electromagnetic() {
		return "gravitational, the same in all units"
	}
	if conv.Units == convention.HeavisideLorentz {
		return "Heaviside-Lorentz, 4 pi times the Gaussian value"
	}
	return "Gaussian"
}

func unitsTag(conv convention.Set) string {
	if conv.Units == convention.HeavisideLorentz {
		return "HL"
	}
	return "Gaussian"
}

func probeCharges(s *Scenario, conv convention.Set) string {
	u := conv.Units
	var b strings.Builder
	if s.Probe.Charge != 0 || !s.Background.Curved() {
		fmt.Fprintf(&b, ", q = %.6g", u.Charge(s.Probe.Charge))
	}
	if s.Probe.MagneticCharge != 0 {
		fmt.Fprintf(&b, ", g = %.6g", u.Charge(s.Probe.MagneticCharge))
	}
	if b.Len() > 0 {
		fmt.Fprintf(&b, " %s", unitsTag(conv))
	}
	if s.Probe.Spin != [3]float64{} {
		fmt.Fprintf(&b, ", rest-frame spin a = %v", s.Probe.Spin)
	}
	if s.Probe.NUT != 0 {
		fmt.Fprintf(&b, ", NUT charge n = %.6g, integrated through the background rotated to M' - iN' = (m + in)(M - iN)/m", s.Probe.NUT)
	}
	return b.String()
}

func sourceCharges(s *Scenario, conv convention.Set) string {
	u, bg := conv.Units, s.Background
	var parts []string
	if bg.Curved() {
		parts = append(parts, fmt.Sprintf("M = %g", bg.Mass))
		if bg.NUT != 0 {
			parts = append(parts, fmt.Sprintf("N = %g", bg.NUT))
		}
	}
	if bg.Charge != 0 {
		parts = append(parts, fmt.Sprintf("Q = %.6g %s", u.Charge(bg.Charge), unitsTag(conv)))
	}
	if bg.MagneticCharge != 0 {
		parts = append(parts, fmt.Sprintf("P = %.6g %s", u.Charge(bg.MagneticCharge), unitsTag(conv)))
	}
	if bg.Spin != [3]float64{} {
		parts = append(parts, fmt.Sprintf("a = %v", bg.Spin))
	}
	if len(parts) == 0 {
		return ""
	}
	return " (" + strings.Join(parts, ", ") + ")"
}

// sscDriftNote says what the drifts of mass shell, spin condition and
// spin norm measure under the spin supplementary condition ssc of a
// Dixon probe (integrate.Dixon.SpinConstraints, MassShell); "" for the
// default Tulczyjew condition.
func sscDriftNote(ssc string) string {
	switch ssc {
	case "pirani":
		return "under the Pirani condition mass shell is |−p.u − m|/m, a.p the largest of |a.p|/(𝓜|a|), |a.u|/|a| and |u.u + 1|, a.a the change of S² = ½S_{μν}S^{μν}"
	case "ohashi-kyrian-semerak":
		return "under the Ohashi–Kyrian–Semerák condition mass shell is |𝓜 − m|/m, a.p the larger of |a.p|/(𝓜|a|) and |a.d|/(𝓜 a.a) (S simple), a.a the change of S² = ½S_{μν}S^{μν}"
	}
	return ""
}
