package scan

import (
	"math"

	"ricochet/observables/scenario"
)

// SpreadMember is one completion's fits in a spread scan.
type SpreadMember struct {
	Model string `json:"model"`
	// Canonical marks a consistent body (exact energy, angular momentum
	// and spin condition), whose second order linear in spin is physical;
	// false for the non-canonical completions (scenario.CanonicalMember).
	Canonical bool `json:"canonical"`
	// Exponent n of |residual| ~ A ε^n and its uncertainty (NaN if the
	// fit failed).
	Exponent      float64 `json:"exponent"`
	SigmaExponent float64 `json:"exponent_sigma"`
	// NextOrder is lim residual/ε² against the member's own first order.
	NextOrder      float64 `json:"next_order"`
	SigmaNextOrder float64 `json:"next_order_sigma"`
}

// SpreadSummary is the model spread of one observable: the members side
// by side and max − min of their next-order coefficients, with the
// uncertainty √(σ_max² + σ_min²) of that difference.
type SpreadSummary struct {
	Observable  string         `json:"observable"`
	Params      []float64      `json:"params,omitempty"`
	Members     []SpreadMember `json:"members"`
	Spread      float64        `json:"spread"`
	SigmaSpread float64        `json:"spread_sigma"`
}

// spreadOf summarises the series of one observable, one per member.
func spreadOf(obs string, group []Series) SpreadSummary {
	sum := SpreadSummary{Observable: obs, Spread: math.NaN(), SigmaSpread: math.NaN()}
	lo, hi := -1, -1
	for k, sr := range group {
		m := SpreadMember{Model: sr.Model, Canonical: scenario.CanonicalMember(sr.Model), Exponent: math.NaN(), SigmaExponent: math.NaN(), NextOrder: math.NaN(), SigmaNextOrder: math.NaN()}
		if e := sr.Fits.Exponent; e != nil {
			m.Exponent, m.SigmaExponent = e.N, e.SigmaN
		}
		if n := sr.Fits.NextOrder; n != nil {
			m.NextOrder, m.SigmaNextOrder = n.C2, n.SigmaC2
			if lo < 0 || n.C2 < sum.Members[lo].NextOrder {
				lo = k
			}
			if hi < 0 || n.C2 > sum.Members[hi].NextOrder {
				hi = k
			}
		}
		sum.Members = append(sum.Members, m)
	}
	if lo >= 0 && hi >= 0 {
		a, b := sum.Members[hi], sum.Members[lo]
		sum.Spread = a.NextOrder - b.NextOrder
		sum.SigmaSpread = math.Hypot(a.SigmaNextOrder, b.SigmaNextOrder)
	}
	return sum
}
