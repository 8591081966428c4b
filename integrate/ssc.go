package integrate

import (
	"fmt"
	"math"
)

// SSC selects the spin supplementary condition of the Dixon body: the
// choice of centroid that closes the Mathisson–Papapetrou–Dixon equations
// (which leave the velocity undetermined). The zero value is Tulczyjew.
//
// The conditions name different centroids of the same body, equally
// valid descriptions whose equivalence holds to dipole order (Costa &
// Natário 2015, "Center of mass, spin supplementary conditions, and the
// momentum of spinning particles", in Equations of Motion in Relativistic
// Gravity, Fund. Theor. Phys. 179, 215, arXiv:1410.6443: abstract read,
// details from memory): the equations they give differ at O(S²), beyond
// the accuracy of the pole–dipole truncation (Lukes-Gerakopoulos, Harms,
// Bernuzzi & Nagar 2017, Phys. Rev. D 96, 064051, compare the conditions
// numerically; from memory). The measured differences of the asymptotic Δp and Δa are
// in the tests (ssc_test.go) and README.md.
//
// Initial data. All conditions start from the same incoming asymptotic
// data: momentum p_in, Pauli–Lubanski spin vector a_in (Δa is always the
// kick of a^μ = −(1/(2𝓜²)) ε^μ_{νρσ} p^ν S^{ρσ}, which does not depend on
// the centroid), and the same incoming asymptote x = b + p_in τ/m of the
// centroid, with b the covariant impact parameter of the Tulczyjew
// centroid (orthogonal to p_in and to the background's velocity).
//
// Why one b serves all conditions: in flat space the total angular
// momentum J^{μν} = x^μp^ν − x^νp^μ + S^{μν} does not depend on the
// centroid, so the centroid fixed by S^{μν}v_ν = 0 for a timelike v lies
// at
//
//	Δx^μ = x_v^μ − x_T^μ = S_T^{μν} v_ν/(p·v)   (mod p),
//
// from the Tulczyjew centroid (derived here from J; the same shift in
// Costa & Natário 2015, sec. 3, from memory). For Pirani, v = u:
// Δx^μ = S_T^{μν}(p_ν − m u_ν)/m² with m = −p·u; for OKS, v = w. Both
// vanish for v = p/m, which is the incoming state of the non-helical
// Pirani solution and of the OKS solution with w_in = p_in/m. The three
// centroids therefore share the incoming asymptote, J^{μν}_in and p_in,
// and b is the covariant b of the Tulczyjew centroid for every
// condition. At a finite distance the centroids separate at first order
// in the coupling (their hidden velocities differ); each condition's
// asymptotic tail carries its own centroid in from infinity.
type SSC int

const (
	// Tulczyjew is the Tulczyjew–Dixon condition S^{μν}p_ν = 0 with the
	// momentum–velocity relation of Ehlers & Rudolph (see Dixon).
	Tulczyjew SSC = iota
	// Pirani is the condition S^{μν}u_ν = 0 with its non-helical
	// solution (dixon_pirani.go).
	Pirani
	// OhashiKyrianSemerak is S^{μν}w_ν = 0 with w parallel transported,
	// for which u = p/m (dixon_oks.go).
	OhashiKyrianSemerak
)

// sscNames are the names of the conditions in scenarios and output.
var sscNames = [...]string{"tulczyjew", "pirani", "ohashi-kyrian-semerak"}

// String returns the condition's name: tulczyjew, pirani or
// ohashi-kyrian-semerak.
func (c SSC) String() string {
	if c >= 0 && int(c) < len(sscNames) {
		return sscNames[c]
	}
	return fmt.Sprintf("SSC(%d)", int(c))
}

// SSCNames lists the names ParseSSC accepts, the default first.
func SSCNames() []string { return append([]string(nil), sscNames[:]...) }

// ParseSSC returns the condition of a name of SSCNames ("" is Tulczyjew).
func ParseSSC(s string) (SSC, error) {
	if s == "" {
		return Tulczyjew, nil
	}
	for i, n := range sscNames {
		if n == s {
			return SSC(i), nil
		}
	}
	return 0, fmt.Errorf("integrate: spin supplementary condition %q; allowed: %v", s, sscNames)
}

// IE is the offset of the condition's extra block in the state of a Dixon
// body under a condition other than Tulczyjew (four components: the mass
// dipole d of Ohashi–Kyrian–Semerák, the hidden velocity v of Pirani).
// Scatter integrates the block as it is, with its own error scale
// (extraModel), and adds its first-order tail on the incoming leg.
const IE = 12

// extraModel is implemented by models whose state carries a block at IE
// beyond the spin: extraScale returns the error scale of its components
// for the scales of the momentum and spin deviations (the first-order
// impulse and spin kick), and slaveExtra, if it does anything, sets the
// block from the rest of the state where the block is not a free
// variable but fixed by it (the non-helical Pirani velocity); Scatter
// calls it at the nodes of the asymptotic tails.
type extraModel interface {
	extraScale(pscale, amag, mass, b float64) float64
	slaveExtra(y []float64)
}

// extraScale implements extraModel: the mass dipole of OKS is of order
// |a| |Δp| (d = S·p/𝓜 with p changed by Δp), the Pirani hidden velocity
// is held like the velocity error of the momentum deviation, |Δp|/m.
func (d *Dixon) extraScale(pscale, amag, mass, b float64) float64 {
	if d.SSC == OhashiKyrianSemerak {
		return math.Max(amag, 1e-6*b) * pscale
	}
	return pscale / mass
}

// slaveExtra implements extraModel: under Pirani the non-helical hidden
// velocity at y; nothing for the other conditions.
func (d *Dixon) slaveExtra(y []float64) {
	if d.SSC != Pirani {
		return
	}
	l := d.local(y)
	v := d.piraniVelocity(l, y)
	copy(y[IE:IE+4], v[:])
}

// generalSpin sets the state's spin tensor to that of the condition in
// use from y (after load, which built the Tulczyjew S = ε p a) and
// returns the extra block.
func (d *Dixon) generalSpin(l *bodyLocal, b *bodyState, y []float64) (e [4]float64) {
	copy(e[:], y[IE:IE+4])
	switch d.SSC {
	case OhashiKyrianSemerak:
		b.addMassDipole(l, e)
	case Pirani:
		b.piraniSpin(l, e, d.M)
	}
	return e
}

// setSm fills S^μ_ν from S^{μν}.
func (b *bodyState) setSm(l *bodyLocal) {
	g := &l.g
	for mu := 0; mu < 4; mu++ {
		S := &b.S[mu]
		for nu := 0; nu < 4; nu++ {
			b.Sm[mu][nu] = g[nu][0]*S[0] + g[nu][1]*S[1] + g[nu][2]*S[2] + g[nu][3]*S[3]
		}
	}
}

// dual returns ε^{μνρσ} x_ρ y_σ for lower-index x and y
// (ε^{μνρσ} = −[μνρσ]/√−g, as in bodyState.load).
func dual(l *bodyLocal, xl, yl [4]float64) (D [4][4]float64) {
	is := -1 / l.sqrtg
	w := func(r, s int) float64 { return is * (xl[r]*yl[s] - xl[s]*yl[r]) }
	s01, s02, s03 := w(2, 3), w(3, 1), w(1, 2)
	s12, s13, s23 := w(0, 3), w(2, 0), w(0, 1)
	return [4][4]float64{
		{0, s01, s02, s03},
		{-s01, 0, s12, s13},
		{-s02, -s12, 0, s23},
		{-s03, -s13, -s23, 0},
	}
}

// spinVectorRate returns Da^μ/dτ of the Pauli–Lubanski vector
// a_μ = −(1/(2𝓜²)) ε_{μνρσ} p^ν S^{ρσ} for a force f and a spin tensor
// with DS^{μν}/dτ ∝ p ∧ (something) (pure gravity, any condition):
//
//	Da_μ/dτ = (2 p·f/𝓜²) a_μ − (1/(2𝓜²)) ε_{μνρσ} f^ν S^{ρσ}
//
// (differentiating the definition with D𝓜²/dτ = −2 p·f; the spin
// equation's p ∧ u term drops out of ε p DS). For S = ε p a it is the
// Tulczyjew form (1/𝓜²)[p^μ (f·a) + a^μ (f·p)] of Dixon.
func (b *bodyState) spinVectorRate(l *bodyLocal, f [4]float64) (da [4]float64) {
	M2 := b.mass * b.mass
	fl := lowerVec(&l.g, f)
	fp := fl[0]*b.p[0] + fl[1]*b.p[1] + fl[2]*b.p[2] + fl[3]*b.p[3]
	var tl [4]float64
	for k := range perms4 {
		pm := &perms4[k]
		i := &pm.i
		if s := b.S[i[2]][i[3]]; s != 0 {
			tl[i[0]] += pm.sign * f[i[1]] * s
		}
	}
	c := -0.5 * l.sqrtg / M2
	for mu := 0; mu < 4; mu++ {
		da[mu] = 2*fp/M2*b.a[mu] + c*(l.gi[mu][0]*tl[0]+l.gi[mu][1]*tl[1]+l.gi[mu][2]*tl[2]+l.gi[mu][3]*tl[3])
	}
	return da
}

// connection subtracts Γ^μ_αβ u^α v^β from dv (the coordinate rate of a
// vector from its covariant one).
func connection(l *bodyLocal, u, v [4]float64, dv []float64) {
	if !l.curved {
		return
	}
	for mu := 0; mu < 4; mu++ {
		G := &l.gam[mu]
		s := 0.0
		for al := 0; al < 4; al++ {
			if u[al] == 0 {
				continue
			}
			s += u[al] * (G[al][0]*v[0] + G[al][1]*v[1] + G[al][2]*v[2] + G[al][3]*v[3])
		}
		dv[mu] -= s
	}
}

// spinSquare returns S² = ½ S_{μν} S^{μν}.
func (b *bodyState) spinSquare(l *bodyLocal) float64 {
	s := 0.0
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			var low float64 // S_{μν} = g_{μα} S^α_ν
			for al := 0; al < 4; al++ {
				low += l.g[mu][al] * b.Sm[al][nu]
			}
			s += 0.5 * low * b.S[mu][nu]
		}
	}
	return s
}

// sscFinite reports whether every component of v is finite.
func sscFinite(v [4]float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}
