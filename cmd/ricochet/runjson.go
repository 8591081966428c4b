package main

import (
	"ricochet/background/vec"
	"ricochet/observables"
	"ricochet/observables/convention"
)

// The JSON document of `ricochet run` (schema/run.schema.json). Keys are
// snake_case; every four-vector is an object that names its frame and its
// components:
//
//	{"source_rest_frame": {"t": …, "x": …, "y": …, "z": …},
//	 "record_frame":      {"t": …, "l": …, "b": …, "n": …}}
//
// the Cartesian components in the source's rest frame and the components
// along the frame of record (l̂ incoming direction, b̂ impact direction,
// n̂ = l̂ × b̂). Antisymmetric tensors list their six independent
// components the same way ("tx" … "yz", "tl" … "bn"). A number that the
// outcome does not produce (no outgoing state after a capture) is null.

// sourceComponents is a four-vector in the source rest frame.
type sourceComponents struct {
	T float64 `json:"t"`
	X float64 `json:"x"`
	Y float64 `json:"y"`
	Z float64 `json:"z"`
}

// recordComponents is a four-vector along the frame of record.
type recordComponents struct {
	T float64 `json:"t"`
	L float64 `json:"l"`
	B float64 `json:"b"`
	N float64 `json:"n"`
}

// fourVector is a four-vector in both frames.
type fourVector struct {
	Source sourceComponents `json:"source_rest_frame"`
	Record recordComponents `json:"record_frame"`
}

func newFourVector(fr observables.Frame, v vec.Vec4) *fourVector {
	c := fr.Components(v)
	return &fourVector{
		Source: sourceComponents{v[0], v[1], v[2], v[3]},
		Record: recordComponents{c[0], c[1], c[2], c[3]},
	}
}

// newErrorVector labels the error bars e of a vector given component-wise
// in the source rest frame; the record-frame bars are those the text
// output prints, each rotated component bounded by its own rotation of the
// bars (observables.Frame.Err).
func newErrorVector(fr observables.Frame, e vec.Vec4, iso float64) *fourVector {
	c := fr.Err(e, iso)
	return &fourVector{
		Source: sourceComponents{e[0], e[1], e[2], e[3]},
		Record: recordComponents{c[0], c[1], c[2], c[3]},
	}
}

// newCovector labels covariant components v_μ = η_{μν}v^ν in signature
// sig of the contravariant v (source frame) and of its record-frame
// components.
func newCovector(fr observables.Frame, sig convention.Signature, v vec.Vec4) *fourVector {
	s, r := covariant(sig, v), covariant(sig, frameVec(fr, v))
	return &fourVector{
		Source: sourceComponents{s[0], s[1], s[2], s[3]},
		Record: recordComponents{r[0], r[1], r[2], r[3]},
	}
}

var sourceLabels = [4]string{"t", "x", "y", "z"}

// tensorComponents names the six independent components of an
// antisymmetric tensor with the given axis labels.
func tensorComponents(labels [4]string, s [4][4]float64) map[string]float64 {
	m := make(map[string]float64, 6)
	for _, ij := range tensorPairs {
		m[labels[ij[0]]+labels[ij[1]]] = s[ij[0]][ij[1]]
	}
	return m
}

// labelledTensor is an antisymmetric tensor in both frames: src in the
// source frame, rec the same tensor built from record-frame components.
func labelledTensor(src, rec [4][4]float64) map[string]any {
	return map[string]any{
		"source_rest_frame": tensorComponents(sourceLabels, src),
		"record_frame":      tensorComponents(frameLabels, rec),
	}
}

// nullable returns v, or nil (JSON null) when the event did not scatter.
func nullable[T any](ok bool, v T) any {
	if !ok {
		return nil
	}
	return v
}

// runDocument builds the JSON document of one event.
func runDocument(rep runReport) map[string]any {
	r, fr := rep.runResult, rep.fr
	ok := rep.scattered
	sig := rep.conv.Signature
	doc := map[string]any{
		"schema":                      runSchemaID,
		"program":                     r.Program,
		"scenario":                    r.Scenario,
		"conventions":                 r.Conventions,
		"signature":                   r.Signature,
		"units":                       r.Units,
		"charges":                     r.Charges,
		"epsilon":                     r.Epsilon,
		"impact_parameter_definition": r.ImpactDef,
		"impact_parameter":            r.Impact,
		"impact_parameter_covariant":  r.ImpactCov,
		"status":                      r.Status,
		"p_in":                        newFourVector(fr, r.PIn),
		"p_out":                       nullable(ok, newFourVector(fr, r.POut)),
		"impulse":                     nullable(ok, newFourVector(fr, r.Impulse)),
		"impulse_err":                 nullable(ok, newErrorVector(fr, r.ImpulseErr, rep.dpIso)),
		"impulse_covariant":           nullable(ok, newCovector(fr, sig, r.Impulse)),
		"impulse_squared":             nullable(ok, r.Transfer),
		"impulse_squared_err":         nullable(ok, r.TransferErr),
		"first_order_impulse":         newFourVector(fr, r.FirstDp),
		"first_order_source":          r.FirstSource,
		"second_order_source":         r.SecondSource,
		"scattering_angle":            nullable(ok, r.Angle),
		"scattering_angle_err":        nullable(ok, r.AngleErr),
		"in_plane_angle":              nullable(ok, r.InPlane),
		"in_plane_angle_err":          nullable(ok, r.InPlaneErr),
		"in_plane_angle_swept":        nullable(ok, r.Swept),
		"in_plane_angle_swept_err":    nullable(ok, r.InPlaneErr),
		"windings":                    nullable(ok, r.Windings),
		"out_of_plane_angle":          nullable(ok, r.OutOfPlane),
		"out_of_plane_angle_err":      nullable(ok, r.OutOfPlaneErr),
		"angle_note":                  "in_plane_angle is the signed deflection in the plane of l and b, positive towards +b (away from the source), in (-pi, pi]; in_plane_angle_swept is the same unwrapped along the path, so that an orbit whose direction turns by more than pi (zoom-whirl) is not folded, and windings counts the full turns of the position about +n; out_of_plane_angle is the elevation towards +n; each error is the first-order propagation of the impulse error bars, sum_j |d angle/d p_j| err_j",
		"drift": map[string]any{
			"mass_shell":            r.Drift.MassShell,
			"spin_orthogonality":    r.Drift.SpinOrth,
			"spin_norm":             r.Drift.SpinNorm,
			"energy":                r.Drift.Energy,
			"energy_exact":          r.Drift.EnergyExact,
			"angular_momentum_z":    r.Drift.AngularMomentumZ,
			"angular_momentum_axis": r.Drift.JAxis,
			"note":                  "largest relative violation over the path: mass shell |p.p + m^2|/m^2, spin condition |a.p|/(m|a|), spin norm |a.a - a_in.a_in|/a_in.a_in, energy |E - E_in|/E_in (energy_exact: whether the model conserves it exactly), J_z |J_z - J_z,in|/(|p_in| b) with J_z the Killing angular momentum about angular_momentum_axis (+z, or the spin axis of a turned background; null where the model has no conserved one)" + driftNoteSuffix(r.DriftNote),
		},
		"error_tolerance":  nullable(ok, r.TolErr),
		"error_truncation": nullable(ok, r.TruncErr),
		"error_note":       errorBarNote + "; error_tolerance and error_truncation are the norms of the tolerance and truncation terms over the components; record-frame bars bound each rotated component by the rotation of the source-frame bars, sum_j |e_j| err_j; bars of derived numbers (impulse_squared, angles, spin tensors) are their first-order propagation",
		"rhs_evaluations":  r.Evaluations,
		"radius_over_b":    r.Radius,
		"warnings":         warningsOrEmpty(r.Warnings),
	}
	if r.SecondDp != nil {
		doc["second_order_impulse"] = newFourVector(fr, *r.SecondDp)
		doc["second_order_impulse_err"] = newErrorVector(fr, *r.SecondDpErr, 0)
		doc["second_order_mass_shell"] = rep.second.MassShell
	}
	if !rep.spinning {
		return doc
	}
	doc["a_in"] = newFourVector(fr, r.AIn)
	doc["a_out"] = nullable(ok, newFourVector(fr, r.AOut))
	if r.SecondDa != nil {
		doc["second_order_spin_kick"] = newFourVector(fr, *r.SecondDa)
		doc["second_order_spin_kick_err"] = newErrorVector(fr, *r.SecondDaErr, 0)
	}
	if r.FirstSpinTensor != nil {
		// --spin tensor: the tensor kick and S_out in both frames, as the
		// text output builds them from the frame components.
		pin, ain := frameVec(fr, r.PIn), frameVec(fr, r.AIn)
		first := convention.SpinTensorKick1(pin, ain, frameVec(fr, rep.dp1), frameVec(fr, rep.da1))
		doc["first_order_spin_tensor_kick"] = labelledTensor(*r.FirstSpinTensor, first)
		doc["spin_tensor_err_note"] = r.SpinErrNote
		doc["spin_tensor_kick"], doc["spin_tensor_kick_err"], doc["spin_tensor_out"], doc["spin_tensor_out_err"] = nil, nil, nil, nil
		if ok {
			pout, aout := frameVec(fr, r.POut), frameVec(fr, r.AOut)
			sOut := convention.SpinTensor(pout, aout)
			kick := convention.TensorDiff(sOut, convention.SpinTensor(pin, ain))
			se := convention.SpinTensorErr(pout, aout, fr.Err(vec.Vec4(r.ImpulseErr), rep.dpIso), fr.Err(vec.Vec4(rep.spinKickErr), rep.daIso))
			doc["spin_tensor_kick"] = labelledTensor(*r.SpinTensorKick, kick)
			doc["spin_tensor_kick_err"] = labelledTensor(*r.SpinTensorErr, se)
			doc["spin_tensor_out"] = labelledTensor(*r.SpinTensorOut, sOut)
			// S_in is exact, so S_out carries the error of the kick.
			doc["spin_tensor_out_err"] = doc["spin_tensor_kick_err"]
		}
		return doc
	}
	doc["first_order_spin_kick"] = newFourVector(fr, *r.FirstDa)
	doc["spin_kick"], doc["spin_kick_err"], doc["spin_kick_covariant"] = nil, nil, nil
	if ok {
		doc["spin_kick"] = newFourVector(fr, *r.SpinKick)
		doc["spin_kick_err"] = newErrorVector(fr, *r.SpinKickErr, rep.daIso)
		doc["spin_kick_covariant"] = newCovector(fr, sig, *r.SpinKick)
	}
	return doc
}

// warningsOrEmpty returns w, or an empty list (never null) when there are
// none.
func warningsOrEmpty(w []string) []string {
	if w == nil {
		return []string{}
	}
	return w
}

// driftNoteSuffix appends a spin supplementary condition's drift note.
func driftNoteSuffix(n string) string {
	if n == "" {
		return ""
	}
	return "; " + n
}
