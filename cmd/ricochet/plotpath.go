package main

import (
	"fmt"
	"image/color"
	"math"
	"path/filepath"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate"
)

// pathPoint is one accepted state of the main run, as drawn: coordinate
// time, position and coordinate velocity dx/dt = p⃗/p⁰.
type pathPoint struct {
	T    float64
	X, V vec.Vec3
}

func newPathPoint(y []float64) pathPoint {
	p := integrate.Mom(y)
	x := integrate.Pos(y)
	return pathPoint{T: x[0], X: x.Spatial(), V: p.Spatial().Scale(1 / p[0])}
}

// projection is a coordinate plane of the source rest frame.
type projection struct {
	Name string
	I, J int // spatial coordinate indices of the horizontal and vertical axes
}

var projections = []projection{{"xy", 0, 1}, {"xz", 0, 2}, {"yz", 1, 2}}

func parseProjection(s string) (projection, error) {
	for _, p := range projections {
		if p.Name == s {
			return p, nil
		}
	}
	return projection{}, badf("--projection = %q; allowed: xy, xz, yz", s)
}

func (p projection) at(x vec.Vec3) plotter.XY { return plotter.XY{X: x[p.I], Y: x[p.J]} }

// pathAngle returns the angle between the incoming momentum and the chord
// through the last two collected positions: the direction in which the
// drawn path leaves. At the stop radius r the chord differs from the
// asymptotic direction by O(θ b/r) for a deflection θ (1/r² forces).
func pathAngle(path []pathPoint, pin vec.Vec4) float64 {
	n := len(path)
	if n < 2 {
		return math.NaN()
	}
	d := path[n-1].X.Sub(path[n-2].X)
	l := pin.Spatial()
	c := d.Dot(l) / (d.Norm() * l.Norm())
	return math.Acos(math.Max(-1, math.Min(1, c)))
}

// hermite samples the cubic Hermite interpolant of the path between two
// accepted states from their positions and velocities in coordinate time
// (common practice for drawing ODE solutions between steps); it fills the
// steps of the angle clock, which near the source span a fair
// fraction of b, so that the drawn curve is smooth. The samples exclude
// the left end.
func hermite(a, b pathPoint, n int) []vec.Vec3 {
	h := b.T - a.T
	out := make([]vec.Vec3, 0, n)
	for k := 1; k <= n; k++ {
		s := float64(k) / float64(n)
		h00 := (1 + 2*s) * (1 - s) * (1 - s)
		h10 := s * (1 - s) * (1 - s)
		h01 := s * s * (3 - 2*s)
		h11 := s * s * (s - 1)
		out = append(out, a.X.Scale(h00).Add(a.V.Scale(h10*h)).Add(b.X.Scale(h01)).Add(b.V.Scale(h11*h)))
	}
	return out
}

// trajectoryFigure is the figure of one event.
type trajectoryFigure struct {
	Scenario *Scenario
	Event    Event
	Out      integrate.Outcome
	Path     []pathPoint
	Proj     projection
	Extent   float64 // half-width of the window in impact parameters
	Angle    float64 // printed scattering angle
}

// lengthUnit returns the unit of the axes and its name: b in flat space,
// the mass M for curved backgrounds (|M + iN| when M = 0).
func (f trajectoryFigure) lengthUnit() (float64, string) {
	bg := f.Scenario.Background
	if bg.Curved() {
		if bg.Mass > 0 {
			return bg.Mass, "M"
		}
		return math.Hypot(bg.Mass, bg.NUT), "|M + iN|"
	}
	return f.Scenario.Kinematics.B, "b"
}

// polyline returns the drawn path in axis units: the collected states with
// Hermite samples between them, restricted to the neighbourhood of the
// window (segments with both ends beyond twice the window's radius are
// dropped; the window clips the rest).
func (f trajectoryFigure) polyline(unit, half float64) plotter.XYs {
	var xy plotter.XYs
	far := 2 * math.Sqrt2 * half * unit
	step := half * unit / 150
	add := func(x vec.Vec3) {
		q := f.Proj.at(x.Scale(1 / unit))
		xy = append(xy, q)
	}
	for k := 1; k < len(f.Path); k++ {
		a, b := f.Path[k-1], f.Path[k]
		if a.X.Norm() > far && b.X.Norm() > far {
			continue
		}
		if len(xy) == 0 {
			add(a.X)
		}
		n := int(math.Ceil(b.X.Sub(a.X).Norm() / step))
		n = max(1, min(n, 400))
		for _, x := range hermite(a, b, n) {
			add(x)
		}
	}
	return xy
}

// ellipse returns the outline of the projection of the disk (or, with
// third ≠ 0, the spheroid of equatorial radius rho and polar semi-axis
// third) centred at the origin and normal to nrm.
func (f trajectoryFigure) outline(nrm vec.Vec3, rho, third, unit float64) plotter.XYs {
	// Orthonormal e1, e2 spanning the disk.
	e1 := vec.Vec3{1, 0, 0}
	if math.Abs(nrm[0]) > 0.9 {
		e1 = vec.Vec3{0, 1, 0}
	}
	e1 = e1.Sub(nrm.Scale(e1.Dot(nrm)))
	e1 = e1.Scale(1 / e1.Norm())
	e2 := nrm.Cross(e1)
	const n = 240
	var xy plotter.XYs
	if third > 0 {
		// Spheroid with symmetry axis nrm: the projection is the ellipse
		// with semi-axes rho along the projected equator and
		// √(rho² cos² + third² sin²) … obtained exactly as the outline of
		// the image of the unit sphere under diag(rho, rho, third).
		ax := [3]vec.Vec3{e1.Scale(rho), e2.Scale(rho), nrm.Scale(third)}
		// Image of the unit sphere under A = [ax] projected to the plane:
		// the ellipse with matrix M = P A Aᵀ Pᵀ.
		var m [2][2]float64
		idx := [2]int{f.Proj.I, f.Proj.J}
		for r := 0; r < 2; r++ {
			for c := 0; c < 2; c++ {
				for k := 0; k < 3; k++ {
					m[r][c] += ax[k][idx[r]] * ax[k][idx[c]]
				}
			}
		}
		// Square root of the symmetric 2×2 matrix M maps the unit circle
		// onto the outline.
		tr, det := m[0][0]+m[1][1], m[0][0]*m[1][1]-m[0][1]*m[1][0]
		s := math.Sqrt(math.Max(det, 0))
		t := math.Sqrt(tr + 2*s)
		r := [2][2]float64{{(m[0][0] + s) / t, m[0][1] / t}, {m[1][0] / t, (m[1][1] + s) / t}}
		for k := 0; k <= n; k++ {
			c, sn := math.Cos(2*math.Pi*float64(k)/n), math.Sin(2*math.Pi*float64(k)/n)
			xy = append(xy, plotter.XY{X: (r[0][0]*c + r[0][1]*sn) / unit, Y: (r[1][0]*c + r[1][1]*sn) / unit})
		}
		return xy
	}
	for k := 0; k <= n; k++ {
		t := 2 * math.Pi * float64(k) / n
		x := e1.Scale(rho * math.Cos(t)).Add(e2.Scale(rho * math.Sin(t)))
		xy = append(xy, f.Proj.at(x.Scale(1/unit)))
	}
	return xy
}

// sourceGeometry adds the source: the outer horizon of a black hole (the
// Kerr–Schild spheroid r = r₊: equatorial radius √(r₊² + a²), polar
// semi-axis r₊), the branch disk (ring of radius |a| normal to the spin)
// of a root-Kerr source or of a black hole without horizon, or a marker for
// a point source.
func (f trajectoryFigure) sourceGeometry(p *plot.Plot, leg *legendStrip, unit float64) error {
	bg := f.Scenario.Background
	var horizon float64
	var hasHorizon bool
	var a vec.Vec3
	switch m := f.Event.Model.(type) {
	case *integrate.Geodesic:
		switch g := m.Metric.(type) {
		case spacetime.KerrNewman:
			horizon, hasHorizon = g.Horizon()
		case spacetime.KerrNewmanNUT:
			horizon, hasHorizon = g.Horizon()
		case spacetime.DyonicKerrNewman:
			horizon, hasHorizon = g.Horizon()
		}
		a = vec.Vec3(bg.Spin)
	default:
		a = vec.Vec3(f.Event.Source.A)
	}
	ra := a.Norm()
	nrm := vec.Vec3{0, 0, 1}
	if ra > 0 {
		nrm = a.Scale(1 / ra)
	}
	switch {
	case hasHorizon:
		pg, err := plotter.NewPolygon(f.outline(nrm, math.Sqrt(horizon*horizon+ra*ra), horizon, unit))
		if err != nil {
			return err
		}
		pg.Color = color.Gray{Y: 30}
		pg.LineStyle.Width = 0
		p.Add(pg)
		leg.add(fmt.Sprintf("outer horizon r_{+} = %.3g %s", horizon/unit, f.unitName()), pg)
	case ra > 0:
		d := em.Disk{Normal: nrm, Radius: ra}
		pg, err := plotter.NewPolygon(f.outline(d.Normal, d.Radius, 0, unit))
		if err != nil {
			return err
		}
		pg.Color = color.NRGBA{R: 120, G: 120, B: 120, A: 90}
		pg.LineStyle.Color = color.Gray{Y: 40}
		pg.LineStyle.Width = vg.Points(1)
		p.Add(pg)
		label := "branch disk"
		if bg.Curved() {
			label = "ring singularity and disk (no horizon)"
		}
		leg.add(fmt.Sprintf("%s, radius |a| = %.3g %s", label, ra/unit, f.unitName()), pg)
	default:
		sc, err := plotter.NewScatter(plotter.XYs{{X: 0, Y: 0}})
		if err != nil {
			return err
		}
		sc.GlyphStyle.Shape = draw.PlusGlyph{}
		sc.GlyphStyle.Radius = vg.Points(5)
		sc.GlyphStyle.Color = color.Black
		p.Add(sc)
		leg.add("source", sc)
	}
	return nil
}

func (f trajectoryFigure) unitName() string { _, n := f.lengthUnit(); return n }

// line returns the straight line x0 + s d, s ∈ [−L, L], in axis units.
func (f trajectoryFigure) line(x0, d vec.Vec3, L, unit float64) plotter.XYs {
	d = d.Scale(1 / d.Norm())
	return plotter.XYs{f.Proj.at(x0.Sub(d.Scale(L)).Scale(1 / unit)), f.Proj.at(x0.Add(d.Scale(L)).Scale(1 / unit))}
}

// save draws the figure to path (format by extension).
func (f trajectoryFigure) save(path string) error {
	if len(f.Path) < 2 {
		return fmt.Errorf("no path to draw (status %s, %d states)", f.Out.Status, len(f.Path))
	}
	s := f.Scenario
	unit, uname := f.lengthUnit()
	b := s.Kinematics.B
	half := f.Extent * b / unit // half-width in axis units
	p := newPanel()
	leg := newLegend()
	ax := "xyz"
	p.X.Label.Text = fmt.Sprintf("%c / %s", ax[f.Proj.I], uname)
	p.Y.Label.Text = fmt.Sprintf("%c / %s", ax[f.Proj.J], uname)
	if uname != "b" {
		p.X.Label.Text += fmt.Sprintf("   (b = %.4g %s)", b/unit, uname)
	}
	// The set-up in the legend strip above the panel (no title: a paper
	// figure's caption holds it).
	leg.add(fmt.Sprintf("%s: %s probe past a %s source", filepath.Base(s.Name), s.Probe.Kind, s.Background.Kind))
	l2 := fmt.Sprintf("ε = %.4g, γ = %.4g", s.Epsilon(), s.Kinematics.Gamma)
	if f.Out.Status == integrate.StatusScattered {
		l2 += fmt.Sprintf(", scattering angle χ = %.5g rad", f.Angle)
	} else {
		l2 += fmt.Sprintf("; %s: drawn up to the event", f.Out.Status)
	}
	leg.add(l2)
	leg.add(fmt.Sprintf("%s plane of the source rest frame (in along +x, b along +y)", f.Proj.Name))
	grid := plotter.NewGrid()
	grid.Vertical.Color, grid.Horizontal.Color = color.Gray{Y: 225}, color.Gray{Y: 225}
	p.Add(grid)
	if err := f.sourceGeometry(p, leg, unit); err != nil {
		return err
	}
	in := f.Event.In
	L := 10 * half * unit
	inLine, err := plotter.NewLine(f.line(in.B.Spatial(), in.P.Spatial(), L, unit))
	if err != nil {
		return err
	}
	inLine.LineStyle.Dashes = []vg.Length{vg.Points(6), vg.Points(4)}
	inLine.LineStyle.Color = color.Gray{Y: 100}
	inLine.LineStyle.Width = vg.Points(1)
	p.Add(inLine)
	leg.add("incoming asymptote", inLine)
	if f.Out.Status == integrate.StatusScattered {
		last := f.Path[len(f.Path)-1]
		outLine, err := plotter.NewLine(f.line(last.X, last.V, L+last.X.Norm(), unit))
		if err != nil {
			return err
		}
		outLine.LineStyle.Dashes = []vg.Length{vg.Points(1.5), vg.Points(3)}
		outLine.LineStyle.Color = color.Gray{Y: 100}
		outLine.LineStyle.Width = vg.Points(1)
		p.Add(outLine)
		leg.add("outgoing asymptote (tangent at the stop radius)", outLine)
	}
	xy := f.polyline(unit, half)
	if len(xy) < 2 {
		return fmt.Errorf("the path does not come within %g impact parameters of the source (widen --extent)", f.Extent)
	}
	pl, err := plotter.NewLine(xy)
	if err != nil {
		return err
	}
	pl.LineStyle.Color = palette[0]
	pl.LineStyle.Width = vg.Points(1.2)
	p.Add(pl)
	leg.add("probe path", pl)
	if f.Out.Status != integrate.StatusScattered {
		end, err := plotter.NewScatter(plotter.XYs{xy[len(xy)-1]})
		if err != nil {
			return err
		}
		end.GlyphStyle.Shape = draw.CrossGlyph{}
		end.GlyphStyle.Radius = vg.Points(4)
		end.GlyphStyle.Color = palette[1]
		p.Add(end)
		leg.add(f.Out.Status.String(), end)
	}
	// The probe starts at the left edge of the window on its incoming
	// asymptote: centre the window on the source.
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = -half, half, -half, half
	p.X.Tick.Marker, p.Y.Tick.Marker = mathTicks{linearTicks{}}, mathTicks{linearTicks{}}
	// One column wide, a square panel below the legend strip.
	w, margin := columnWidth, vg.Points(4) // room for the last tick label
	equalScales(p, w-margin, w)
	lh := leg.height()
	return saveFigure(path, w, w+lh, func(c draw.Canvas) {
		leg.Draw(draw.Crop(c, vg.Points(2), 0, w, 0))
		p.Draw(draw.Crop(c, 0, -margin, 0, -lh))
	})
}

// equalScales widens the x or y range so that one unit has the same length
// on both axes of the data area of a w×h figure (the data area depends on
// the tick labels, so the adjustment is repeated until it settles).
func equalScales(p *plot.Plot, w, h vg.Length) {
	for it := 0; it < 4; it++ {
		dc := p.DataCanvas(draw.New(vgimg.New(w, h)))
		dw, dh := float64(dc.Max.X-dc.Min.X), float64(dc.Max.Y-dc.Min.Y)
		if dw <= 0 || dh <= 0 {
			return
		}
		sx, sy := (p.X.Max-p.X.Min)/dw, (p.Y.Max-p.Y.Min)/dh
		sc := math.Max(sx, sy)
		cx, cy := (p.X.Max+p.X.Min)/2, (p.Y.Max+p.Y.Min)/2
		p.X.Min, p.X.Max = cx-sc*dw/2, cx+sc*dw/2
		p.Y.Min, p.Y.Max = cy-sc*dh/2, cy+sc*dh/2
		if math.Abs(sx/sy-1) < 1e-3 {
			return
		}
	}
}

// linearTicks marks a linear axis at 1, 2 or 5 × 10^k steps, about six
// labelled ticks per axis, with unlabelled minor ticks between them.
type linearTicks struct{}

func (linearTicks) Ticks(min, max float64) []plot.Tick {
	span := max - min
	if !(span > 0) {
		return nil
	}
	raw := span / 6
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	step := p
	for _, m := range []float64{1, 2, 5, 10} {
		if m*p >= raw {
			step = m * p
			break
		}
	}
	minor := step / 5
	if step/p == 2 {
		minor = step / 4
	}
	var t []plot.Tick
	for k := math.Ceil(min / minor); k*minor <= max; k++ {
		v := k * minor
		if r := v / step; math.Abs(r-math.Round(r)) < 1e-9 {
			v = math.Round(r) * step
			t = append(t, plot.Tick{Value: v, Label: strconv.FormatFloat(v, 'g', 6, 64)})
		} else {
			t = append(t, plot.Tick{Value: v})
		}
	}
	return t
}
