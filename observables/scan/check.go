package scan

import (
	"fmt"
	"math"
	"slices"

	"ricochet/background/vec"
	"ricochet/integrate"
)

// outcomes are the statuses a record may carry.
var outcomes = func() []string {
	out := []string{StatusFailed}
	for s := integrate.StatusScattered; s.String() != "unknown status"; s++ {
		out = append(out, s.String())
	}
	return out
}()

// Check verifies that a record read from a file belongs to this plan and
// shard and is well formed: its index is in range and in the shard, its
// hash is the plan's, its coupling, model and parameters are those of its
// index, its status is an outcome (failed with a reason, or an
// integrate.Status), its in-state is the one the scenario builds for the
// point (to 1e-12 relative: shards may run on machines whose floating
// point differs in the last bits), and a scattered record carries finite
// results with non-negative error estimates and Δp = p_out − p_in.
func (p *Plan) Check(r Record, shard Shard) error {
	n := p.Jobs()
	if r.Index < 0 || r.Index >= n {
		return fmt.Errorf("index %d outside 0..%d", r.Index, n-1)
	}
	if !shard.Has(r.Index) {
		return fmt.Errorf("index %d is not in shard %s", r.Index, shard)
	}
	if r.Hash != p.Hash {
		return fmt.Errorf("hash %q is not this scan's %q", r.Hash, p.Hash)
	}
	member, slice, e := p.Locate(r.Index)
	if float64(r.Eps) != p.Eps[e] {
		return fmt.Errorf("eps = %v at index %d; the grid has %v", float64(r.Eps), r.Index, p.Eps[e])
	}
	model := ""
	if member >= 0 {
		model = p.Members[member]
	}
	if r.Model != model {
		return fmt.Errorf("model %q at index %d; want %q", r.Model, r.Index, model)
	}
	want := p.Params(slice)
	if len(r.Params) != len(want) {
		return fmt.Errorf("%d parameters at index %d; want %d", len(r.Params), r.Index, len(want))
	}
	for k, x := range want {
		if float64(r.Params[k]) != x {
			return fmt.Errorf("%s = %v at index %d; want %v", p.Axes[k].Param, float64(r.Params[k]), r.Index, x)
		}
	}
	if !slices.Contains(outcomes, r.Status) {
		return fmt.Errorf("status %q is not an outcome (allowed: %q)", r.Status, outcomes)
	}
	if (r.Status == StatusFailed) != (r.Error != "") {
		return fmt.Errorf("status %q with error %q", r.Status, r.Error)
	}
	if r.Status == StatusFailed {
		return nil
	}
	ev, err := p.slices[slice].WithEpsilon(p.Eps[e]).BuildMember(member)
	if err != nil {
		return fmt.Errorf("point %d cannot be built: %v", r.Index, err)
	}
	for _, c := range []struct {
		name      string
		got, want vec.Vec4
	}{{"p_in", vec.Vec4(r.PIn), ev.In.P}, {"a_in", vec.Vec4(r.AIn), ev.In.A}, {"b", vec.Vec4(r.B), ev.In.B}} {
		if !close4(c.got, c.want, 1e-12) {
			return fmt.Errorf("%s = %v at index %d; the scenario gives %v", c.name, c.got, r.Index, c.want)
		}
	}
	if r.Status != integrate.StatusScattered.String() {
		return nil
	}
	for _, v := range []Vec4{r.POut, r.AOut, r.Impulse, r.SpinKick} {
		for _, x := range v {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return fmt.Errorf("non-finite result at index %d", r.Index)
			}
		}
	}
	// A first order is finite, or NaN in every component where the
	// formula does not apply (scenario.Event.FirstOrderApplies).
	for _, v := range []Vec4{r.FirstDp[0], r.FirstDp[1], r.FirstDp[2], r.FirstDa[0], r.FirstDa[1], r.FirstDa[2]} {
		nans := 0
		for _, x := range v {
			if math.IsInf(x, 0) {
				return fmt.Errorf("non-finite first order at index %d", r.Index)
			}
			if math.IsNaN(x) {
				nans++
			}
		}
		if nans != 0 && nans != 4 {
			return fmt.Errorf("partly non-finite first order at index %d", r.Index)
		}
	}
	for _, v := range []Vec4{r.ImpulseErr, r.SpinKickErr} {
		for _, x := range v {
			if !(x >= 0) || math.IsInf(x, 0) {
				return fmt.Errorf("error estimate %v at index %d; want finite and ≥ 0", x, r.Index)
			}
		}
	}
	for _, x := range []Float{r.TolErr, r.TruncErr, r.ImpulseErrIso, r.SpinKickErrIso, r.Drift} {
		if !(x >= 0) || math.IsInf(float64(x), 0) {
			return fmt.Errorf("error or drift %v at index %d; want finite and ≥ 0", float64(x), r.Index)
		}
	}
	if !(r.Radius > 0) || !(r.BJ > 0) || !(r.BEik > 0) || r.Evals <= 0 {
		return fmt.Errorf("radius, b_j, b_eik or evals not positive at index %d", r.Index)
	}
	if !close4(vec.Vec4(r.Impulse), vec.Vec4(r.POut).Sub(vec.Vec4(r.PIn)), 1e-9) {
		return fmt.Errorf("dp ≠ p_out − p_in at index %d", r.Index)
	}
	return nil
}

// close4 reports whether a and b agree to rel times the larger norm
// (absolute near zero).
func close4(a, b vec.Vec4, rel float64) bool {
	scale := 0.0
	for i := range a {
		scale = math.Max(scale, math.Max(math.Abs(a[i]), math.Abs(b[i])))
	}
	for i := range a {
		if !(math.Abs(a[i]-b[i]) <= rel*scale) {
			return false
		}
	}
	return true
}
