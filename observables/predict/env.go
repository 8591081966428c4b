package predict

import (
	"math"
	"sort"
)

// env is what a formula sees: the named quantities of one configuration
// as complex scalars and vectors, and the orientation of the vector
// product.
type env struct {
	I, Pi, Gamma, V, P, E, B, Mass, Q, G, SrcQ, SrcP, SrcM, SrcN, Eps complex128
	A1, A2, Lhat, Bhat, Nhat, Vvec, Bvec                              vector
	// Mirror reverses the orientation of cross products.
	Mirror bool
	// sslots and vslots hold the values of let-bound names during an
	// evaluation; steps counts the operations executed.
	sslots []complex128
	vslots []vector
	steps  int
}

// scalarQuantity and vectorQuantity read a named quantity from an env.
var scalarQuantity = map[string]func(*env) complex128{
	"i": func(e *env) complex128 { return e.I }, "pi": func(e *env) complex128 { return e.Pi },
	"gamma": func(e *env) complex128 { return e.Gamma }, "v": func(e *env) complex128 { return e.V },
	"p": func(e *env) complex128 { return e.P }, "E": func(e *env) complex128 { return e.E },
	"b": func(e *env) complex128 { return e.B }, "m": func(e *env) complex128 { return e.Mass },
	"q": func(e *env) complex128 { return e.Q }, "g": func(e *env) complex128 { return e.G },
	"Q": func(e *env) complex128 { return e.SrcQ }, "P": func(e *env) complex128 { return e.SrcP },
	"M": func(e *env) complex128 { return e.SrcM }, "N": func(e *env) complex128 { return e.SrcN },
	"eps": func(e *env) complex128 { return e.Eps },
}

var vectorQuantity = map[string]func(*env) vector{
	"a1": func(e *env) vector { return e.A1 }, "a2": func(e *env) vector { return e.A2 },
	"lhat": func(e *env) vector { return e.Lhat }, "bhat": func(e *env) vector { return e.Bhat },
	"nhat": func(e *env) vector { return e.Nhat }, "vvec": func(e *env) vector { return e.Vvec },
	"bvec": func(e *env) vector { return e.Bvec },
}

// quantityNames are the identifiers a formula may read, with their
// meaning (for help texts and error messages).
var quantityNames = map[string]string{
	"i":     "imaginary unit",
	"pi":    "π",
	"gamma": "Lorentz factor γ of the incoming probe",
	"v":     "incoming speed v = √(1 − 1/γ²)",
	"p":     "incoming momentum |p⃗| = mγv",
	"E":     "incoming energy mγ",
	"b":     "impact parameter (in the declared definition)",
	"m":     "probe mass",
	"q":     "probe electric charge",
	"g":     "probe magnetic charge",
	"Q":     "source electric charge",
	"P":     "source magnetic charge",
	"M":     "source mass",
	"N":     "source NUT parameter",
	"eps":   "signed coupling ε (qQ/(mb) or M/b, scenario's definition)",
	"a1":    "probe spin vector a = S/m (rest frame), vector",
	"a2":    "source spin vector, vector",
	"lhat":  "unit vector along the incoming momentum, vector",
	"bhat":  "unit vector along the impact parameter (source to probe), vector",
	"nhat":  "lhat × bhat, vector",
	"vvec":  "incoming velocity v lhat, vector",
	"bvec":  "impact parameter vector b bhat, vector",
}

// functionNames are the functions a formula may call.
var functionNames = func() map[string]string {
	m := map[string]string{
		"cross": "cross(u, w): vector product",
		"perp":  "perp(u): part of u orthogonal to lhat",
		"dot":   "dot(u, w): bilinear scalar product Σ u_k w_k (no conjugation)",
		"norm":  "norm(u): √dot(u, u), principal branch",
		"unit":  "unit(u): u/norm(u)",
		"vec":   "vec(x, y, z): vector from components",
		"atan2": "atan2(y, x): angle of (x, y), real arguments",
	}
	for k := range scalarFuncs {
		m[k] = k + "(z): complex, principal branch"
	}
	for k := range vectorFuncs {
		m[k] = k + "(u): component-wise " + k[1:]
	}
	return m
}()

// sortedKeys returns the keys of m in order.
func sortedKeys(m map[string]string) []string {
	var k []string
	for s := range m {
		k = append(k, s)
	}
	sort.Strings(k)
	return k
}

// newEnv returns the environment of q. mirror reverses the orientation
// of the vector product and of n̂ = l̂ × b̂.
func newEnv(q Quantities, mirror bool) *env {
	c := func(x float64) complex128 { return complex(x, 0) }
	e := &env{I: 1i, Pi: c(math.Pi), Mirror: mirror}
	e.Gamma, e.V, e.B, e.Mass = c(q.Gamma), c(q.V), c(q.B), c(q.Mass)
	e.P, e.E = c(q.Mass*q.Gamma*q.V), c(q.Mass*q.Gamma)
	e.Q, e.G = c(q.Charge), c(q.MagneticCharge)
	e.SrcQ, e.SrcP, e.SrcM, e.SrcN = c(q.SourceCharge), c(q.SourceMagneticCharge), c(q.SourceMass), c(q.NUT)
	e.Eps = c(q.Eps)
	e.A1, e.A2 = lift(q.ProbeSpin), lift(q.SourceSpin)
	e.Lhat, e.Bhat, e.Nhat = lift(q.Frame.L), lift(q.Frame.B), lift(q.Frame.N)
	if mirror {
		e.Nhat = e.Nhat.scale(-1)
	}
	e.Vvec, e.Bvec = e.Lhat.scale(e.V), e.Bhat.scale(e.B)
	return e
}
