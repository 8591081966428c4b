package scan

import "math"

// TrendRow is the fits of one slice of a multi-parameter scan.
type TrendRow struct {
	Params []float64 `json:"params"`
	// Gamma and V are the slice's kinematics.
	Gamma float64 `json:"gamma"`
	V     float64 `json:"v"`
	// NextOrder is lim residual/ε² with its uncertainty, Exponent the
	// fitted n of |residual| ~ ε^n (NaN where the fit failed).
	NextOrder      float64 `json:"next_order"`
	SigmaNextOrder float64 `json:"next_order_sigma"`
	Exponent       float64 `json:"exponent"`
	SigmaExponent  float64 `json:"exponent_sigma"`
	// Expected is the value of Options.Expect at the slice (NaN without
	// one), Pull (NextOrder − Expected)/SigmaNextOrder.
	Expected float64 `json:"expected"`
	Pull     float64 `json:"pull"`
}

// Trend is the next-order coefficient of one observable and model across
// the slices of a multi-parameter scan, in slice order.
type Trend struct {
	Observable string     `json:"observable"`
	Model      string     `json:"model"`
	Axes       []string   `json:"axes"`
	Expect     string     `json:"expected_formula,omitempty"`
	Rows       []TrendRow `json:"rows"`
}

// Trends collects the fits of every series of a multi-parameter result by
// observable and model (none for a plain coupling scan).
func Trends(res Result) []Trend {
	if len(res.Axes) == 0 {
		return nil
	}
	var out []Trend
	at := map[[2]string]int{}
	for _, sr := range res.Series {
		key := [2]string{sr.Observable, sr.Model}
		k, ok := at[key]
		if !ok {
			k = len(out)
			at[key] = k
			out = append(out, Trend{Observable: sr.Observable, Model: sr.Model, Axes: res.Axes})
			if res.Expect != nil {
				out[k].Expect = res.Expect.Text
			}
		}
		row := TrendRow{Params: sr.Params, NextOrder: math.NaN(), SigmaNextOrder: math.NaN(), Exponent: math.NaN(), SigmaExponent: math.NaN(), Expected: math.NaN(), Pull: math.NaN()}
		if sr.Scenario != nil {
			row.Gamma, row.V = sr.Scenario.Kinematics.Gamma, sr.Scenario.Kinematics.V
		}
		if n := sr.Fits.NextOrder; n != nil {
			row.NextOrder, row.SigmaNextOrder = n.C2, n.SigmaC2
		}
		if e := sr.Fits.Exponent; e != nil {
			row.Exponent, row.SigmaExponent = e.N, e.SigmaN
		}
		if res.Expect != nil && sr.Scenario != nil {
			if x, err := res.Expect.Eval(SliceVars(res.Axes, sr)); err == nil {
				row.Expected = x
				row.Pull = (row.NextOrder - x) / row.SigmaNextOrder
			}
		}
		out[k].Rows = append(out[k].Rows, row)
	}
	return out
}

// SliceVars returns the variables a Formula sees at a series' slice:
// gamma, v and b of the slice and the value of every parameter axis.
func SliceVars(axes []string, sr Series) map[string]float64 {
	k := sr.Scenario.Kinematics
	vars := map[string]float64{"gamma": k.Gamma, "v": k.V, "b": k.B}
	for i, a := range axes {
		vars[a] = sr.Params[i]
	}
	return vars
}
