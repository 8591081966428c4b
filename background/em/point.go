package em

import "ricochet/background/vec"

// Coulomb is the field of an electric point charge Q at the origin,
//
//	𝐅 = Q z/(z·z)^{3/2},  𝒱 = Q/(z·z)^{1/2}
//
// (Coulomb's law in Gaussian units; Jackson, Classical Electrodynamics,
// 3rd ed., §1.2, from memory). It is RootKerr with a = 0.
type Coulomb struct {
	Q float64
}

// RootKerr returns the equivalent RootKerr field with a = 0.
func (c Coulomb) RootKerr() RootKerr { return RootKerr{Q: c.Q} }

// At returns 𝐅(z) and its Jacobian.
func (c Coulomb) At(z vec.CVec3) (vec.CVec3, [3]vec.CVec3) { return c.RootKerr().At(z) }

// Value implements Valuer.
func (c Coulomb) Value(z vec.CVec3) vec.CVec3 { return c.RootKerr().Value(z) }

// Potential returns 𝒱(z) = Q/√(z·z).
func (c Coulomb) Potential(z vec.CVec3) complex128 { return c.RootKerr().Potential(z) }

// Name returns "coulomb".
func (Coulomb) Name() string { return "coulomb" }

// Monopole is the field of a magnetic point charge P at the origin,
//
//	B = P x/|x|³,  𝐅 = iP z/(z·z)^{3/2},  𝒱 = iP/(z·z)^{1/2}
//
// (Dirac 1931, Proc. R. Soc. A 133, 60, from memory). It is RootKerr with
// Q = 0 and a = 0.
type Monopole struct {
	P float64
}

// RootKerr returns the equivalent RootKerr field with Q = 0 and a = 0.
func (m Monopole) RootKerr() RootKerr { return RootKerr{P: m.P} }

// At returns 𝐅(z) and its Jacobian.
func (m Monopole) At(z vec.CVec3) (vec.CVec3, [3]vec.CVec3) { return m.RootKerr().At(z) }

// Value implements Valuer.
func (m Monopole) Value(z vec.CVec3) vec.CVec3 { return m.RootKerr().Value(z) }

// Potential returns 𝒱(z) = iP/√(z·z).
func (m Monopole) Potential(z vec.CVec3) complex128 { return m.RootKerr().Potential(z) }

// Name returns "monopole".
func (Monopole) Name() string { return "monopole" }

// Dyon is the field of a point particle with electric charge Q and magnetic
// charge P at the origin,
//
//	𝐅 = (Q + iP) z/(z·z)^{3/2},  𝒱 = (Q + iP)/(z·z)^{1/2}
//
// (Schwinger 1969, Science 165, 757, from memory). It is RootKerr with
// a = 0.
type Dyon struct {
	Q, P float64
}

// RootKerr returns the equivalent RootKerr field with a = 0.
func (d Dyon) RootKerr() RootKerr { return RootKerr{Q: d.Q, P: d.P} }

// At returns 𝐅(z) and its Jacobian.
func (d Dyon) At(z vec.CVec3) (vec.CVec3, [3]vec.CVec3) { return d.RootKerr().At(z) }

// Value implements Valuer.
func (d Dyon) Value(z vec.CVec3) vec.CVec3 { return d.RootKerr().Value(z) }

// Potential returns 𝒱(z) = (Q + iP)/√(z·z).
func (d Dyon) Potential(z vec.CVec3) complex128 { return d.RootKerr().Potential(z) }

// Name returns "dyon".
func (Dyon) Name() string { return "dyon" }
