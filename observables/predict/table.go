package predict

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"ricochet/observables/scan"
	"ricochet/observables/scenario"
)

// Table is a table of predicted values, one row per point of the short
// scan: read from CSV with a header row first (lines starting with '#'
// are comments), a column eps (|ε| of the point, as the library defines
// it), one column per predicted observable (dp_X, da_X) and, for a
// scenario with parameter axes, one column per axis named by its param.
// An empty cell means no prediction at that point.
//
//	eps,dp_b,dp_l
//	0.05,0.16022579,-0.0067
//	0.025,0.0818667,-0.00168
//
// Rows are matched to points by eps and the parameters to 1e-9 relative.
type Table struct {
	Origin      string
	Observables []Observable
	// Params are the names of the parameter columns, in column order.
	Params []string
	rows   []tableRow
}

type tableRow struct {
	line   int
	eps    float64
	params []float64
	values []float64
}

// ReadTable reads a table of predicted values; origin names it in error
// messages (InputErrors, one line naming the line and column).
func ReadTable(r io.Reader, origin string) (*Table, error) {
	cr := csv.NewReader(r)
	cr.Comment = '#'
	cr.TrimLeadingSpace = true
	head, err := cr.Read()
	if errors.Is(err, io.EOF) {
		return nil, scenario.Badf("%s: empty table; allowed: a header row eps,dp_X,... then one row per point", origin)
	}
	if err != nil {
		return nil, scenario.Badf("%s: %v", origin, err)
	}
	t := &Table{Origin: origin}
	epsCol := -1
	type col struct {
		obs   int // index into Observables, or −1
		param int // index into Params, or −1
	}
	cols := make([]col, len(head))
	seen := map[string]bool{}
	for i, h := range head {
		h = strings.TrimSpace(h)
		if seen[h] {
			return nil, scenario.Badf("%s: column %q appears twice; allowed: each column once", origin, h)
		}
		seen[h] = true
		cols[i] = col{-1, -1}
		switch {
		case h == "eps":
			epsCol = i
		case strings.HasPrefix(h, "dp_") || strings.HasPrefix(h, "da_"):
			o, err := ParseObservable(h)
			if err != nil {
				return nil, scenario.Badf("%s: column %q; allowed: eps, dp_X, da_X (X = t, l, b, n) and the scenario's axis names", origin, h)
			}
			cols[i].obs = len(t.Observables)
			t.Observables = append(t.Observables, o)
		case h == "":
			return nil, scenario.Badf("%s: column %d has no name; allowed: eps, dp_X, da_X and the scenario's axis names", origin, i+1)
		default:
			cols[i].param = len(t.Params)
			t.Params = append(t.Params, h)
		}
	}
	if epsCol < 0 {
		return nil, scenario.Badf("%s: no column eps; allowed: a header row eps,dp_X,... (eps = |ε| of each point)", origin)
	}
	if len(t.Observables) == 0 {
		return nil, scenario.Badf("%s: no predicted column; allowed: dp_X, da_X with X in t, l, b, n", origin)
	}
	for {
		rec, err := cr.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return nil, scenario.Badf("%s: %v", origin, err)
		}
		line, _ := cr.FieldPos(0)
		row := tableRow{line: line, params: make([]float64, len(t.Params)), values: make([]float64, len(t.Observables))}
		for i, cell := range rec {
			cell = strings.TrimSpace(cell)
			if cols[i].obs >= 0 && cell == "" {
				row.values[cols[i].obs] = math.NaN()
				continue
			}
			x, err := strconv.ParseFloat(cell, 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, scenario.Badf("%s: line %d, column %q: %q; allowed: a finite number%s", origin, line, head[i], cell,
					map[bool]string{true: " or an empty cell", false: ""}[cols[i].obs >= 0])
			}
			switch {
			case i == epsCol:
				if x == 0 {
					return nil, scenario.Badf("%s: line %d, column eps: 0; allowed: |eps| > 0", origin, line)
				}
				row.eps = math.Abs(x)
			case cols[i].obs >= 0:
				row.values[cols[i].obs] = x
			default:
				row.params[cols[i].param] = x
			}
		}
		t.rows = append(t.rows, row)
	}
	if len(t.rows) == 0 {
		return nil, scenario.Badf("%s: no rows; allowed: one row per point of the short scan", origin)
	}
	return t, nil
}

// near reports whether x and y agree to 1e-9 relative (the printed
// couplings carry at least ten significant digits).
func near(x, y float64) bool { return math.Abs(x-y) <= 1e-9*math.Max(math.Abs(x), math.Abs(y)) }

// values returns column j at the points of one configuration (parameter
// values params of the axes named axes; ValidFor has checked that the
// table has one column per axis), NaN where no row matches; the rows used
// are marked.
func (t *Table) values(j int, pts []Point, axes []string, params []float64, used map[int]bool) []float64 {
	out := make([]float64, len(pts))
	for k, pt := range pts {
		out[k] = math.NaN()
		for i, row := range t.rows {
			if near(row.eps, pt.Eps) && t.sameParams(row.params, axes, params) {
				out[k] = row.values[j]
				used[i] = true
				break
			}
		}
	}
	return out
}

// sameParams compares a row's parameters (table column order) with a
// configuration's (axis order).
func (t *Table) sameParams(row []float64, axes []string, cfg []float64) bool {
	for i, name := range t.Params {
		for a, an := range axes {
			if an == name && !near(row[i], cfg[a]) {
				return false
			}
		}
	}
	return true
}

// paramNote renders a row's parameters for an error message.
func (t *Table) paramNote(params []float64) string {
	var s string
	for i, p := range t.Params {
		s += fmt.Sprintf(", %s = %g", p, params[i])
	}
	return s
}

// WriteTemplate writes the skeleton of a table of predicted values for
// the short scan s (ShortScan): '#' lines naming the configuration, a
// header row eps, the axis names and the observables, and one row per
// point with the predicted cells empty, to be filled in.
func WriteTemplate(w io.Writer, s *scenario.Scenario, obs []Observable) error {
	plan, err := scan.NewPlan(s, nil, "")
	if err != nil {
		return err
	}
	k := s.Kinematics
	fmt.Fprintf(w, "# predicted values for %s: fill in the columns %s at each point (eps = |eps|, exact)\n", s.Name, obsList(obs))
	kin := fmt.Sprintf("gamma = %.10g, v = %.10g, b = %.10g", k.Gamma, k.V, k.B)
	if len(plan.Axes) > 0 {
		kin = "the axis columns give each configuration's parameters, the rest as in the scenario"
	}
	fmt.Fprintf(w, "# %s; the source's charges, mass and NUT parameter scale with eps at fixed phases\n", kin)
	cw := csv.NewWriter(w)
	head := []string{"eps"}
	for _, a := range plan.Axes {
		head = append(head, a.Param)
	}
	for _, o := range obs {
		head = append(head, o.String())
	}
	cw.Write(head)
	for slice := 0; slice < plan.Slices(); slice++ {
		for _, e := range plan.Eps {
			row := []string{strconv.FormatFloat(e, 'g', -1, 64)}
			for _, p := range plan.Params(slice) {
				row = append(row, strconv.FormatFloat(p, 'g', -1, 64))
			}
			row = append(row, make([]string, len(obs))...)
			cw.Write(row)
		}
	}
	cw.Flush()
	return cw.Error()
}

func obsList(obs []Observable) string {
	var s []string
	for _, o := range obs {
		s = append(s, o.String())
	}
	return strings.Join(s, ", ")
}
