package scan

import (
	"fmt"

	"ricochet/observables/scenario"
)

// Plan enumerates the points of a scan. Job i of a scan with M models
// (1 without a spread), S slices and E couplings is
//
//	i = (member × S + slice) × E + e,
//
// so the coupling varies fastest, then the parameter axes in reverse order
// of declaration (the last declared axis fastest, row-major), then the
// model. The slice index runs over the parameter axes row-major:
//
//	slice = ((k₁ × n₂ + k₂) × n₃ + k₃) …,
//
// for axis values k_j of n_j. A plain coupling scan has S = 1 and i = e
// (member × E + e for a spread). The order depends only on the scenario and
// the models, never on workers, shards or interruptions.
type Plan struct {
	Scenario *scenario.Scenario
	// Members are the models of a spread scan (nil: the scenario's own).
	Members []string
	// Eps is the coupling grid; Axes the parameter axes (without the
	// coupling) and Grids their values.
	Eps   []float64
	Axes  []scenario.AxisSpec
	Grids [][]float64
	// Hash identifies the scenario, grid, models and program version.
	Hash string

	slices []*scenario.Scenario
}

// NewPlan enumerates the scan of a validated scenario, validating every
// combination of its parameter axes (an InputError names the first bad
// one). version is the program version that enters the hash.
func NewPlan(s *scenario.Scenario, members []string, version string) (*Plan, error) {
	sl, err := s.ValidateSlices()
	if err != nil {
		return nil, err
	}
	p := &Plan{Scenario: s, Members: members, Eps: s.CouplingGrid(), Axes: s.ParamAxes(), slices: sl}
	for _, a := range p.Axes {
		p.Grids = append(p.Grids, a.Grid())
	}
	p.Hash, _ = Hash(s, members, version)
	return p, nil
}

// Models returns the number of models (1 without a spread).
func (p *Plan) Models() int { return max(1, len(p.Members)) }

// Slices returns the number of parameter combinations.
func (p *Plan) Slices() int { return len(p.slices) }

// Jobs returns the number of points.
func (p *Plan) Jobs() int { return p.Models() * p.Slices() * len(p.Eps) }

// Locate splits a job index into model (−1 without a spread), slice and
// coupling index.
func (p *Plan) Locate(i int) (member, slice, e int) {
	e = i % len(p.Eps)
	rest := i / len(p.Eps)
	slice = rest % p.Slices()
	member = rest / p.Slices()
	if len(p.Members) == 0 {
		member = -1
	}
	return member, slice, e
}

// Params returns the parameter values of a slice, in axis order (nil for
// a plain coupling scan).
func (p *Plan) Params(slice int) []float64 {
	if len(p.Axes) == 0 {
		return nil
	}
	vals := make([]float64, len(p.Axes))
	for k := len(p.Axes) - 1; k >= 0; k-- {
		vals[k] = p.Grids[k][slice%len(p.Grids[k])]
		slice /= len(p.Grids[k])
	}
	return vals
}

// Slice returns the validated scenario of a slice (at its given coupling).
func (p *Plan) Slice(slice int) *scenario.Scenario { return p.slices[slice] }

// Point integrates job i.
func (p *Plan) Point(i int) Record {
	member, slice, e := p.Locate(i)
	eps := p.Eps[e]
	r := RunPoint(p.slices[slice].WithEpsilon(eps), i, eps, member)
	r.Hash = p.Hash
	for _, x := range p.Params(slice) {
		r.Params = append(r.Params, Float(x))
	}
	return r
}

// Shard is a deterministic subset of the jobs of a scan: shard K of N
// (1 ≤ K ≤ N) holds the jobs i with i mod N = K − 1, so that every shard
// gets a share of every part of the parameter space. The zero value is
// the whole scan.
type Shard struct{ K, N int }

// Has reports whether job i belongs to the shard.
func (s Shard) Has(i int) bool { return s.N <= 1 || i%s.N == s.K-1 }

// String returns "K/N", or "" for the whole scan.
func (s Shard) String() string {
	if s.N == 0 {
		return ""
	}
	return fmt.Sprintf("%d/%d", s.K, s.N)
}

// ParseShard parses "K/N" with 1 ≤ K ≤ N ≤ 100000.
func ParseShard(text string) (Shard, error) {
	var s Shard
	var rest string
	if n, _ := fmt.Sscanf(text+" end", "%d/%d %s", &s.K, &s.N, &rest); n != 3 || rest != "end" || s.N < 1 || s.N > 100000 || s.K < 1 || s.K > s.N {
		return Shard{}, fmt.Errorf("shard = %q; allowed: K/N with 1 ≤ K ≤ N ≤ 100000", text)
	}
	return s, nil
}

// Count returns the number of jobs of a plan that belong to the shard.
func (s Shard) Count(jobs int) int {
	if s.N <= 1 {
		return jobs
	}
	n := jobs / s.N
	if s.K-1 < jobs%s.N {
		n++
	}
	return n
}
