package main

import (
	"ricochet/background/vec"
	"ricochet/observables"
	"ricochet/observables/convention"
)

// Output-convention helpers of the run command. The library computes
// contravariant components in signature (−,+,+,+) and Gaussian units; these
// functions re-express its numbers for printing.

// frameVec returns the contravariant components (v^t, v^l, v^b, v^n) of v
// in the orthonormal frame of record.
func frameVec(fr observables.Frame, v vec.Vec4) vec.Vec4 { return vec.Vec4(fr.Components(v)) }

// covariant returns the covariant components v_μ = η_{μν} v^ν in signature
// sig of contravariant components v^ν given in an orthonormal frame.
func covariant(sig convention.Signature, v vec.Vec4) vec.Vec4 { return sig.Lower(v) }

// tensorPairs are the independent components of an antisymmetric tensor
// in the frame of record, with their labels.
var tensorPairs = [6][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}}

var frameLabels = [4]string{"t", "l", "b", "n"}
