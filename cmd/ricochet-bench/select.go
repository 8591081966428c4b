package main

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"os"
	"sort"
	"strconv"
	"strings"
)

// Selection of the cheapest configuration that reaches a target accuracy,
// applied alike to every code in the measurement files (ricochet and the
// C peer).
//
// A configuration (tol, R) counts for a target only if it and every
// tighter tolerance measured at the same radius reach it: a tolerance that
// meets the target only because its integration error happens to cancel
// the truncation error of the tails, while a tighter tolerance at the same
// radius exposes that truncation error, is not a setting a user could have
// chosen in advance. The robust rule picks the loosest tolerance from
// which on the target holds for good.

// Row is one measured configuration of one code (one line under Header),
// with the wall times of all its rounds.
type Row struct {
	Code, Problem string
	Tol, R        float64
	Evals         int
	Seconds       []float64 // median wall time of each round
	AbsErr        float64
	Scattered     bool
}

// Median returns the median over the rounds of the per-round medians.
func (r Row) Median() float64 { return medianF(r.Seconds) }

type rowKey struct {
	code, problem string
	tol, r        float64
}

// ReadRows reads measurement files in the Header format (several files or
// rounds may repeat a configuration: their wall times are collected, and
// their evaluation counts and errors, which are deterministic, must
// agree).
func ReadRows(rs ...io.Reader) ([]Row, error) {
	index := map[rowKey]int{}
	var rows []Row
	for _, rd := range rs {
		sc := bufio.NewScanner(rd)
		for sc.Scan() {
			line := sc.Text()
			if line == "" || strings.HasPrefix(line, "code\t") || strings.HasPrefix(line, "#") {
				continue
			}
			f := strings.Split(line, "\t")
			if len(f) != 10 {
				return nil, fmt.Errorf("select: %d fields in %q, want 10", len(f), line)
			}
			var row Row
			var err error
			nums := []*float64{&row.Tol, &row.R, nil, nil, nil, nil, &row.AbsErr}
			for i, p := range nums {
				if p == nil {
					continue
				}
				if *p, err = strconv.ParseFloat(f[2+i], 64); err != nil && strings.Contains(strings.ToLower(f[2+i]), "nan") {
					*p, err = math.NaN(), nil
				}
				if err != nil {
					return nil, fmt.Errorf("select: field %d of %q: %v", 3+i, line, err)
				}
			}
			if row.Evals, err = strconv.Atoi(f[4]); err != nil {
				return nil, fmt.Errorf("select: evals of %q: %v", line, err)
			}
			sec, err := strconv.ParseFloat(f[5], 64)
			if err != nil {
				return nil, fmt.Errorf("select: seconds of %q: %v", line, err)
			}
			row.Code, row.Problem, row.Scattered = f[0], f[1], f[9] == "scattered"
			k := rowKey{row.Code, row.Problem, row.Tol, row.R}
			if i, ok := index[k]; ok {
				old := &rows[i]
				if old.Evals != row.Evals || old.Scattered != row.Scattered ||
					!(old.AbsErr == row.AbsErr || math.IsNaN(old.AbsErr) && math.IsNaN(row.AbsErr)) {
					return nil, fmt.Errorf("select: %s %s tol %g R %g: rounds disagree (evals %d vs %d, error %g vs %g)",
						row.Code, row.Problem, row.Tol, row.R, old.Evals, row.Evals, old.AbsErr, row.AbsErr)
				}
				old.Seconds = append(old.Seconds, sec)
				continue
			}
			row.Seconds = []float64{sec}
			index[k] = len(rows)
			rows = append(rows, row)
		}
		if err := sc.Err(); err != nil {
			return nil, err
		}
	}
	return rows, nil
}

// Robust returns the rows of one code and problem that reach the target
// under the robust rule: the row reaches it, and so does every row with a
// tighter tolerance at the same radius.
func Robust(rows []Row, code, problem string, target float64) []Row {
	byR := map[float64][]Row{}
	for _, r := range rows {
		if r.Code == code && r.Problem == problem {
			byR[r.R] = append(byR[r.R], r)
		}
	}
	var out []Row
	for _, rs := range byR {
		sort.Slice(rs, func(i, j int) bool { return rs[i].Tol < rs[j].Tol })
		for _, r := range rs { // tightest first
			if !(r.Scattered && r.AbsErr < target) {
				break
			}
			out = append(out, r)
		}
	}
	return out
}

// Cheapest returns the row of least cost (evaluations if byEvals, else
// median wall time) among rows, ties broken by the other cost; ok is
// false for none.
func Cheapest(rows []Row, byEvals bool) (Row, bool) {
	if len(rows) == 0 {
		return Row{}, false
	}
	less := func(a, b Row) bool {
		ea, eb := float64(a.Evals), float64(b.Evals)
		ta, tb := a.Median(), b.Median()
		if byEvals {
			return ea < eb || ea == eb && ta < tb
		}
		return ta < tb || ta == tb && ea < eb
	}
	best := rows[0]
	for _, r := range rows[1:] {
		if less(r, best) {
			best = r
		}
	}
	return best, true
}

// SelectTable writes, per problem and target, the cheapest robust
// configuration of the peer and of ricochet and the ratios peer/ricochet,
// once by evaluations and once by wall time. If event is non-nil, it gives
// the wall time of ricochet's full event (with its error estimate) at the
// selected configuration, and two columns compare it with the peer's
// single trajectory.
func SelectTable(w io.Writer, rows []Row, targets []float64, event func(problem string, tol, R float64) (float64, error)) error {
	var problems []string
	seen := map[string]bool{}
	for _, r := range rows {
		if !seen[r.Problem] {
			seen[r.Problem] = true
			problems = append(problems, r.Problem)
		}
	}
	sort.Strings(problems)
	head := "problem\ttarget\tby\tpeer_tol\tpeer_R\tpeer_evals\tpeer_us\tric_tol\tric_R\tric_evals\tric_us\tevals_ratio\ttime_ratio"
	if event != nil {
		head += "\tric_event_us\tevent_time_ratio"
	}
	fmt.Fprintln(w, head)
	cell := func(r Row, ok bool) string {
		if !ok {
			return "-\t-\t-\t-"
		}
		return fmt.Sprintf("%.0e\t%.0e\t%d\t%.1f", r.Tol, r.R, r.Evals, 1e6*r.Median())
	}
	for _, p := range problems {
		for _, tg := range targets {
			for _, byEvals := range []bool{true, false} {
				a, okA := Cheapest(Robust(rows, "peer", p, tg), byEvals)
				b, okB := Cheapest(Robust(rows, "ricochet", p, tg), byEvals)
				label := "time"
				if byEvals {
					label = "evals"
				}
				er, tr := "-", "-"
				if okA && okB {
					er = fmt.Sprintf("%.2f", float64(a.Evals)/float64(b.Evals))
					tr = fmt.Sprintf("%.2f", a.Median()/b.Median())
				}
				line := fmt.Sprintf("%s\t%.0e\t%s\t%s\t%s\t%s\t%s", p, tg, label, cell(a, okA), cell(b, okB), er, tr)
				if event != nil {
					eu, eratio := "-", "-"
					if okB {
						sec, err := event(p, b.Tol, b.R)
						if err != nil {
							return err
						}
						eu = fmt.Sprintf("%.1f", 1e6*sec)
						if okA {
							eratio = fmt.Sprintf("%.2f", a.Median()/sec)
						}
					}
					line += "\t" + eu + "\t" + eratio
				}
				fmt.Fprintln(w, line)
			}
		}
	}
	return nil
}

func cmdSelect(w io.Writer, targets string, eventRepeats int, files []string) error {
	ts, err := parseList("targets", targets)
	if err != nil {
		return err
	}
	if len(files) == 0 {
		return usageError{"select: no measurement files given"}
	}
	var rs []io.Reader
	for _, name := range files {
		f, err := os.Open(name)
		if err != nil {
			return err
		}
		defer f.Close()
		rs = append(rs, f)
	}
	rows, err := ReadRows(rs...)
	if err != nil {
		return err
	}
	var event func(string, float64, float64) (float64, error)
	if eventRepeats > 0 {
		event = func(problem string, tol, R float64) (float64, error) {
			p, err := problemByName(problem)
			if err != nil {
				return 0, err
			}
			r, err := MeasureEvent(p, tol, R, eventRepeats)
			return r.Median.Seconds(), err
		}
	}
	return SelectTable(w, rows, ts, event)
}
