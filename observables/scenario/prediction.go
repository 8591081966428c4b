package scenario

import (
	"bytes"
	"strings"

	"github.com/BurntSushi/toml"
)

// PredictionSpec is a [prediction] table: the user's own prediction of
// components of the impulse and spin kick, as formulas or a table of
// values, and the conventions it is written in. Package predict compiles
// and checks it; here it is only decoded (strictly: unknown keys are
// errors). Empty strings mean the library's own conventions.
//
//	[prediction]
//	signature = "-+++"        # -+++ or +--- (with index = "lower")
//	index = "upper"           # upper (contravariant) or lower (covariant)
//	units = "gaussian"        # gaussian or heaviside-lorentz
//	impact = "covariant"      # covariant, j (|J|/|p|) or eikonal
//	spin_sign = "+"           # + (a spin along +z is angular momentum along +z) or -
//	body = "probe"            # probe or source: which body's impulse is predicted
//	order = "first"           # first, or next (the prediction includes the next order)
//	dp_b = "2*q*Q/(v*b)"      # formulas, one per component dp_X, da_X (X = t, l, b, n)
//	table = "values.csv"      # or a CSV table of predicted values (path relative to the file)
type PredictionSpec struct {
	Signature string `toml:"signature" json:"signature,omitempty"`
	Index     string `toml:"index" json:"index,omitempty"`
	Units     string `toml:"units" json:"units,omitempty"`
	Impact    string `toml:"impact" json:"impact,omitempty"`
	SpinSign  string `toml:"spin_sign" json:"spin_sign,omitempty"`
	Body      string `toml:"body" json:"body,omitempty"`
	Order     string `toml:"order" json:"order,omitempty"`
	Table     string `toml:"table" json:"table,omitempty"`

	DpT string `toml:"dp_t" json:"dp_t,omitempty"`
	DpL string `toml:"dp_l" json:"dp_l,omitempty"`
	DpB string `toml:"dp_b" json:"dp_b,omitempty"`
	DpN string `toml:"dp_n" json:"dp_n,omitempty"`
	DaT string `toml:"da_t" json:"da_t,omitempty"`
	DaL string `toml:"da_l" json:"da_l,omitempty"`
	DaB string `toml:"da_b" json:"da_b,omitempty"`
	DaN string `toml:"da_n" json:"da_n,omitempty"`
}

// Formulas returns the formulas given, keyed by observable name (dp_t …
// da_n), in the order t, l, b, n of the impulse, then of the spin kick.
func (p *PredictionSpec) Formulas() (names, formulas []string) {
	for _, f := range []struct{ name, src string }{
		{"dp_t", p.DpT}, {"dp_l", p.DpL}, {"dp_b", p.DpB}, {"dp_n", p.DpN},
		{"da_t", p.DaT}, {"da_l", p.DaL}, {"da_b", p.DaB}, {"da_n", p.DaN},
	} {
		if strings.TrimSpace(f.src) != "" {
			names = append(names, f.name)
			formulas = append(formulas, f.src)
		}
	}
	return names, formulas
}

// ParsePrediction decodes a predictions file: a TOML file holding one
// [prediction] table (PredictionSpec) and nothing else, strictly. origin
// names the input in error messages, which are InputErrors.
func ParsePrediction(data []byte, origin string) (*PredictionSpec, error) {
	var f struct {
		Prediction *PredictionSpec `toml:"prediction"`
	}
	md, err := toml.NewDecoder(bytes.NewReader(data)).Decode(&f)
	if err != nil {
		return nil, Badf("%s: %v", origin, err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		keys := make([]string, len(und))
		for i, k := range und {
			keys[i] = k.String()
		}
		return nil, Badf("%s: unknown key %s; allowed: a [prediction] table with signature, index, units, impact, spin_sign, body, order, table and dp_X, da_X (X = t, l, b, n)", origin, strings.Join(keys, ", "))
	}
	if f.Prediction == nil {
		return nil, Badf("%s: no [prediction] table", origin)
	}
	return f.Prediction, nil
}
