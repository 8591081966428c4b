package integrate

import (
	"math"
	"reflect"

	"ricochet/background/spacetime"
)

// Geodesic is a spinless test probe of mass M and electric charge Q in a
// stationary curved background (a spacetime.Metric with its potential A_μ):
// a geodesic for Q = 0, and otherwise a charged particle under the Lorentz
// force in curved spacetime (Misner, Thorne & Wheeler 1973, §20.6 and
// exercise 20.x; Wald 1984, §4.3; from memory):
//
//	dx^μ/dτ = p^μ/m,
//	dp^μ/dτ = −Γ^μ_αβ p^α p^β/m + (q/m) F^μ_ν p^ν,   F^μ_ν = g^{μα}F_αν,
//
// with F_μν = ∂_μA_ν − ∂_νA_μ, A_μ = (−Φ, A⃗), so that far away the
// three-force is q(E + v × B) in Gaussian units. Only Γ, g, g⁻¹, A and F
// are evaluated (an order-1 spacetime.Evaluator; no curvature); for the
// Kerr–Newman family the closed-form Kerr–Schild data
// (spacetime.KerrSchildPoint) replace the automatic differentiation.
//
// Conserved quantities. For a stationary background ∂_t is a Killing
// vector and the Killing energy
//
//	E = −(p_t + q A_t),   p_t = g_tν p^ν,
//
// is an exact constant of the motion; in asymptotically Cartesian
// coordinates it tends to p⁰ at infinity, and in the weak field
// E ≈ p⁰ + qΦ (A_t = −Φ). For an axisymmetric background about z (the
// KerrNewman and KerrNewmanNUT families) ∂_φ = x∂_y − y∂_x is Killing too,
// and AngularMomentumZ is conserved exactly.
//
// Normalize solves the mass shell g_μν p^μ p^ν = −m² for p⁰ given p⃗
// (future root). MassShell reports its violation, which the scattering
// driver monitors instead of the Minkowski one.
//
// Hazard reports capture inside the outer horizon (StatusCaptured), a
// crossing of the ring's disk of a horizonless member, or an approach to
// the ring itself (StatusCrossedDisk: the chart does not continue to the
// r < 0 sheet), and an approach to a Misner string of the
// Kerr–Newman–Taub–NUT family (StatusNearString).
//
// Linear selects the background's linearization (spacetime.Linearizable,
// NewLinearEvaluator): the geometry to first order in the couplings, for
// first-order comparisons (FirstOrder). F is then raised with η, since
// g^{μα} − η^{μα} times F is of second order. It is ignored for metrics
// without a linearization.
//
// A Geodesic holds the evaluator's work storage: it must not be used by
// several goroutines at once.
type Geodesic struct {
	Metric spacetime.Metric
	M      float64 // probe mass m > 0
	Q      float64 // probe charge q (Gaussian units); 0 for a geodesic
	Linear bool    // use the first-order geometry of a Linearizable metric
	// StringDist and StringAngle: a step passing within the distance
	// max(StringDist·|N|, StringAngle·r) of a half-axis carrying a Misner
	// string (r the distance from the origin) is reported as
	// StatusNearString. Zero values mean 20 and 1e-3: the string's
	// gravitomagnetic potential h_{0i} ~ 4|N|/ρ at distance ρ is then at
	// most 0.2, and the angle guards the far zone.
	StringDist, StringAngle float64
	// RingTol: for a horizonless member with a ring singularity, a step
	// ending within RingTol·|a| (coordinate distance) of the ring is
	// reported as StatusCrossedDisk, since the path reaches the rim of the
	// branch disk, where the integration cannot be continued; 0 means
	// 1e-6.
	RingTol float64

	ev     *spacetime.Evaluator
	evM    spacetime.Metric
	evLin  bool
	pt     spacetime.Point
	ks     spacetime.KerrSchildPoint
	ksX    [4]float64 // event of ks when ksOK (for lower)
	ksKN   spacetime.KerrNewman
	ksOK   bool
	lastX  [4]float64
	loaded bool
}

// eval evaluates the geometry at x, reusing the last evaluation at the
// same event.
func (g *Geodesic) eval(x [4]float64) *spacetime.Point {
	if g.ev == nil || g.evLin != g.Linear || !sameMetric(g.evM, g.Metric) {
		lin, ok := g.Metric.(spacetime.Linearizable)
		if g.Linear && ok {
			g.ev = spacetime.NewLinearEvaluator(lin, 1)
		} else {
			g.ev = spacetime.NewEvaluator(g.Metric, 1)
		}
		g.evM, g.evLin, g.loaded = g.Metric, g.Linear, false
	}
	if !g.loaded || x != g.lastX {
		g.ev.Eval(x, &g.pt)
		g.lastX, g.loaded = x, true
	}
	return &g.pt
}

var eta4 = [4]float64{-1, 1, 1, 1}

// linear reports whether the first-order geometry is in use.
func (g *Geodesic) linear() bool {
	_, ok := g.Metric.(spacetime.Linearizable)
	return g.Linear && ok
}

// sameMetric reports whether a and b are the same metric value.
func sameMetric(a, b spacetime.Metric) bool {
	ta, tb := reflect.TypeOf(a), reflect.TypeOf(b)
	return ta == tb && ta != nil && ta.Comparable() && a == b
}

// Name implements Model.
func (g *Geodesic) Name() string {
	s := "geodesic"
	if g.Q != 0 {
		s = "charged geodesic"
	}
	if g.Linear {
		s += " (linearized background)"
	}
	return s + " in " + g.Metric.Name()
}

// Dim implements Model.
func (g *Geodesic) Dim() int { return 8 }

// Mass implements Model.
func (g *Geodesic) Mass() float64 { return g.M }

func event(y []float64) [4]float64 { return [4]float64{y[IX], y[IX+1], y[IX+2], y[IX+3]} }

// kerrSchild returns the metric's closed-form Kerr–Schild representation,
// which Deriv and the conserved quantities use instead of the automatic
// differentiation when the exact (not the linearized) geometry is asked
// for (spacetime.KerrSchildPoint; it agrees with the automatic
// differentiation to rounding and costs a fraction of it).
func (g *Geodesic) kerrSchild() (spacetime.KerrSchildForm, bool) {
	if g.Linear {
		return nil, false
	}
	ks, ok := g.Metric.(spacetime.KerrSchildForm)
	return ks, ok
}

// Deriv implements Model.
func (g *Geodesic) Deriv(y, dy []float64) {
	if ks, ok := g.kerrSchild(); ok {
		ks.KerrSchild(event(y), &g.ks)
		g.ksOK = false
		im := 1 / g.M
		p := [4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]}
		geo, lor := g.ks.Accel(p)
		for mu := 0; mu < 4; mu++ {
			dy[IX+mu] = p[mu] * im
			dy[IP+mu] = (geo[mu] + g.Q*lor[mu]) * im
		}
		return
	}
	pt := g.eval(event(y))
	im := 1 / g.M
	p := [4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]}
	// F_αν p^ν, then raised with g^{μα}.
	var fp [4]float64
	if g.Q != 0 {
		for a := 0; a < 4; a++ {
			fp[a] = pt.F[a][0]*p[0] + pt.F[a][1]*p[1] + pt.F[a][2]*p[2] + pt.F[a][3]*p[3]
		}
	}
	for mu := 0; mu < 4; mu++ {
		dy[IX+mu] = p[mu] * im
		G := &pt.Gamma[mu]
		s := 0.0
		for a := 0; a < 4; a++ {
			s += p[a] * (G[a][0]*p[0] + G[a][1]*p[1] + G[a][2]*p[2] + G[a][3]*p[3])
		}
		acc := -s
		if g.Q != 0 {
			if g.linear() {
				// First order: F is already first order, raise with η.
				acc += g.Q * eta4[mu] * fp[mu]
			} else {
				gi := &pt.GInv[mu]
				acc += g.Q * (gi[0]*fp[0] + gi[1]*fp[1] + gi[2]*fp[2] + gi[3]*fp[3])
			}
		}
		dy[IP+mu] = acc * im
	}
}

// lower returns p_μ = g_μν p^ν and A_μ at the state's event.
func (g *Geodesic) lower(y []float64) (pl, A [4]float64) {
	if ks, ok := g.kerrSchild(); ok {
		// The conserved quantities and the mass shell are asked for at
		// the same event in turn: keep the last Kerr–Schild data.
		x := event(y)
		if kn, isKN := ks.(spacetime.KerrNewman); !isKN || !g.ksOK || x != g.ksX || kn != g.ksKN {
			ks.KerrSchild(x, &g.ks)
			g.ksX, g.ksOK = x, isKN
			if isKN {
				g.ksKN = kn
			}
		}
		return g.ks.Lower([4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]})
	}
	pt := g.eval(event(y))
	A = pt.A
	for mu := 0; mu < 4; mu++ {
		pl[mu] = pt.G[mu][0]*y[IP] + pt.G[mu][1]*y[IP+1] + pt.G[mu][2]*y[IP+2] + pt.G[mu][3]*y[IP+3]
	}
	return pl, A
}

// VelocityIsMomentum marks that Deriv sets dx^μ/dτ = p^μ/m exactly (see
// Scatter).
func (g *Geodesic) VelocityIsMomentum() {}

// Energy implements Model: the Killing energy E = −(p_t + q A_t).
func (g *Geodesic) Energy(y []float64) float64 {
	pl, A := g.lower(y)
	return -(pl[0] + g.Q*A[0])
}

// EnergyExact implements Model: the Killing energy is exact for every
// stationary background.
func (g *Geodesic) EnergyExact() bool { return true }

// AngularMomentumZ returns the conserved quantity of the rotation Killing
// vector ∂_φ = x∂_y − y∂_x of a background axisymmetric about z,
//
//	J_z = x (p_y + q A_y) − y (p_x + q A_x)   (covariant components).
func (g *Geodesic) AngularMomentumZ(y []float64) float64 {
	pl, A := g.lower(y)
	x, yy := y[IX+1], y[IX+2]
	return x*(pl[2]+g.Q*A[2]) - yy*(pl[1]+g.Q*A[1])
}

// ConservesJz reports whether AngularMomentumZ is a constant of the
// motion: for the metric families axisymmetric about z (KerrNewman,
// DyonicKerrNewman, KerrNewmanNUT, their fields included).
func (g *Geodesic) ConservesJz() bool {
	switch g.Metric.(type) {
	case spacetime.KerrNewman, spacetime.KerrNewmanNUT, spacetime.DyonicKerrNewman:
		return true
	}
	return false
}

// MassShell returns the relative mass-shell violation
// (g_μν p^μ p^ν + m²)/m² at y.
func (g *Geodesic) MassShell(y []float64) float64 {
	pl, _ := g.lower(y)
	pp := pl[0]*y[IP] + pl[1]*y[IP+1] + pl[2]*y[IP+2] + pl[3]*y[IP+3]
	return (pp + g.M*g.M) / (g.M * g.M)
}

// Normalize implements Model: it solves g_μν p^μ p^ν = −m² for p⁰,
//
//	g₀₀ (p⁰)² + 2 β p⁰ + c = 0,   β = g₀ᵢ pⁱ,   c = gᵢⱼ pⁱ pʲ + m²,
//
// taking the future root: the positive one where g₀₀ < 0 (then the roots
// have opposite signs when c > 0), and inside an ergoregion (g₀₀ > 0,
// two positive roots) the one nearer the current p⁰. The spin argument is
// ignored (spinless model). If the shell has no real root at this p⃗ the
// state is left unchanged.
func (g *Geodesic) Normalize(y []float64, _ float64) {
	var G *[4][4]float64
	if _, ok := g.kerrSchild(); ok {
		// g_μν = η_μν + f l_μ l_ν from the closed-form Kerr–Schild data:
		// no automatic-differentiation evaluator is built for it.
		g.lower(y)
		var gm [4][4]float64
		for mu := 0; mu < 4; mu++ {
			for nu := 0; nu < 4; nu++ {
				gm[mu][nu] = g.ks.F * g.ks.L[mu] * g.ks.L[nu]
			}
			gm[mu][mu] += eta4[mu]
		}
		G = &gm
	} else {
		G = &g.eval(event(y)).G
	}
	massShellP0(G, y, g.M)
}

// Hazard implements Model.
func (g *Geodesic) Hazard(y0, y1 []float64) Status {
	p, q := event(y0), event(y1)
	type horizon interface {
		Horizon() (float64, bool)
		Inside(x [4]float64) bool
	}
	type disk interface {
		CrossesDisk(p, q [4]float64) bool
	}
	type nut interface {
		NearString(x [4]float64, tol float64) bool
	}
	hasHorizon := false
	if h, ok := g.Metric.(horizon); ok {
		var rp float64
		rp, hasHorizon = h.Horizon()
		if h.Inside(q) || h.Inside(p) {
			return StatusCaptured
		}
		// Within HorizonFailReach of the outer horizon: captured, also
		// in coordinates in which the path only approaches it.
		if r, ok := g.Metric.(interface{ Radius([4]float64) float64 }); ok && hasHorizon && r.Radius(q) < rp*(1+HorizonFailReach) {
			return StatusCaptured
		}
	}
	if d, ok := g.Metric.(disk); ok && d.CrossesDisk(p, q) {
		if hasHorizon {
			// The disk lies inside the horizon: the step passed through it.
			return StatusCaptured
		}
		return StatusCrossedDisk
	}
	type ring interface {
		RingDistance(x [4]float64) float64
	}
	if rg, ok := g.Metric.(ring); ok && !hasHorizon {
		tol := g.RingTol
		if tol == 0 {
			tol = 1e-6
		}
		if a := ringRadius(g.Metric); a > 0 && rg.RingDistance(q) < tol*a {
			return StatusCrossedDisk
		}
	}
	if n, ok := g.Metric.(nut); ok {
		ang, dist := g.StringAngle, g.StringDist
		if ang == 0 {
			ang = 1e-3
		}
		if dist == 0 {
			dist = 20
		}
		c := axisClosest(p, q)
		r := math.Sqrt(c[1]*c[1] + c[2]*c[2] + c[3]*c[3])
		if n.NearString(c, math.Max(ang*r, dist*nutParameter(g.Metric))) {
			return StatusNearString
		}
	}
	return StatusRunning
}

// CaptureSphere implements CaptureSpherer for the spherically symmetric
// Kerr–Newman members (a = 0: Schwarzschild, Reissner–Nordström), where
// Hazard has no disk, ring or string to watch and, on a segment starting
// outside r₊(1 + HorizonFailReach), reports capture exactly when the
// segment ends within that radius: the capture sphere has that radius, 0
// without a horizon. In Kerr–Schild coordinates
// with a = 0 the radius of Hazard is |x⃗|.
func (g *Geodesic) CaptureSphere() (float64, bool) {
	kn, ok := g.Metric.(spacetime.KerrNewman)
	if !ok || kn.A != 0 {
		return 0, false
	}
	rp, horizon := kn.Horizon()
	if !horizon {
		return 0, true
	}
	return rp * (1 + HorizonFailReach), true
}

// axisClosest returns the point of the segment from p to q nearest the z
// axis.
func axisClosest(p, q [4]float64) [4]float64 {
	dx, dy := q[1]-p[1], q[2]-p[2]
	d2 := dx*dx + dy*dy
	s := 0.0
	if d2 > 0 {
		s = math.Max(0, math.Min(1, -(p[1]*dx+p[2]*dy)/d2))
	}
	var c [4]float64
	for i := range c {
		c[i] = p[i] + s*(q[i]-p[i])
	}
	return c
}

// ringRadius returns the ring radius |a| of a Kerr–Newman member, or 0.
func ringRadius(m spacetime.Metric) float64 {
	if k, ok := m.(spacetime.KerrNewman); ok {
		return math.Abs(k.A)
	}
	if k, ok := m.(spacetime.DyonicKerrNewman); ok {
		return math.Abs(k.A)
	}
	return 0
}

// nutParameter returns |N| of a Kerr–Newman–Taub–NUT member, or 0.
func nutParameter(m spacetime.Metric) float64 {
	if k, ok := m.(spacetime.KerrNewmanNUT); ok {
		return math.Abs(k.N)
	}
	return 0
}

// FailureStatus implements failureClassifier: when the integration
// failed at the outer horizon, the probe was captured; when it failed
// next to the ring of a horizonless Kerr–Newman background, the
// path ran into the ring or its branch disk, where the metric is not
// smooth: StatusCrossedDisk (as Hazard names a path reaching the ring)
// if the state lies within RingFailReach of the ring, or if its straight
// continuation along the momentum meets the disk within twice its
// distance from the ring (the step that failed was heading there;
// measured: a Dixon probe in the equatorial plane of a Kerr background
// with a = 1.5 b stopped 0.04 a outside the ring, moving into the disk).
func (g *Geodesic) FailureStatus(y []float64) Status {
	return ringFailureCurved(g.Metric, y)
}

// FailureStatus implements failureClassifier (see Geodesic.FailureStatus).
func (d *Dixon) FailureStatus(y []float64) Status {
	if d.Metric == nil {
		if d.Field == nil {
			return StatusIntegratorFailed
		}
		return ringFailure(fieldDisk(d.Field, [3]float64{}), y)
	}
	return ringFailureCurved(d.Metric, y)
}

// HorizonFailReach is the distance from the outer horizon, relative to
// its radius, within which a failed integration counts as captured
// (Geodesic.FailureStatus): a numerical choice, far wider than the 7e-9
// measured. Turning points of scattered paths lie outside the photon
// orbits (1.5 r₊ at a = 0); only near-extremal prograde orbits come
// closer to the horizon, and for them this reach is not tested.
const HorizonFailReach = 1e-4

func ringFailureCurved(m spacetime.Metric, y []float64) Status {
	type ring interface {
		RingDistance(x [4]float64) float64
		CrossesDisk(p, q [4]float64) bool
		Horizon() (float64, bool)
	}
	type horizon interface {
		Horizon() (float64, bool)
		Radius(x [4]float64) float64
	}
	p := event(y)
	if h, ok := m.(horizon); ok {
		// A path that freezes just outside the outer horizon (where the
		// coordinates of the Kerr–Newman–Taub–NUT family are singular
		// and the path never crosses: measured, a geodesic stalled
		// 7e-9 r₊ outside it) has fallen in.
		if rp, ok := h.Horizon(); ok && h.Radius(p) < rp*(1+HorizonFailReach) {
			return StatusCaptured
		}
	}
	rg, ok := m.(ring)
	a := ringRadius(m)
	if !ok || a == 0 {
		return StatusIntegratorFailed
	}
	if _, horizon := rg.Horizon(); horizon {
		return StatusIntegratorFailed
	}
	d := rg.RingDistance(p)
	if d < RingFailReach*a {
		return StatusCrossedDisk
	}
	dir := spatial(y, IP).Unit().Scale(2 * d)
	q := p
	for i := 1; i < 4; i++ {
		q[i] += dir[i-1]
	}
	if rg.CrossesDisk(p, q) {
		return StatusCrossedDisk
	}
	return StatusIntegratorFailed
}
