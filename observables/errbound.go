package observables

import (
	"math"

	"ricochet/background/vec"
)

// FrameErr bounds the frame components (t, l, b, n) of an error vector
// given component-wise in the source frame: the time part is unchanged,
// and the Euclidean norm of the spatial part bounds every rotated spatial
// component.
func FrameErr(e vec.Vec4) vec.Vec4 {
	n := e.Spatial().Norm()
	return vec.Vec4{math.Abs(e[0]), n, n, n}
}
