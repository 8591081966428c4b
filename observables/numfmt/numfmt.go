package numfmt

import (
	"math"
	"strconv"
	"strings"
)

// Value is a number x ± σ split for printing: x ≈ Mantissa × 10^Exp with
// the uncertainty Unc in units of the last digit of Mantissa.
type Value struct {
	Mantissa string // e.g. "-1.2345"; "" when x is not finite
	Unc      string // e.g. "6"; "" when σ is zero, NaN or infinite
	Exp      int
	NaN      bool // x is NaN or infinite
}

// Split rounds x ± sigma to uncDigits significant digits of the uncertainty
// (zero means 2). Without a usable uncertainty (σ ≤ 0, NaN or infinite) x
// is given with 10 significant digits (fallback; common practice) and Unc
// is empty. The exponent is that of x (of σ when x rounds to zero).
func Split(x, sigma float64, uncDigits int) Value {
	if uncDigits <= 0 {
		uncDigits = 2
	}
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return Value{NaN: true}
	}
	haveSig := sigma > 0 && !math.IsInf(sigma, 0)
	if !haveSig {
		if x == 0 {
			return Value{Mantissa: "0"}
		}
		e := exponent(x)
		m := x / math.Pow10(e)
		s := strconv.FormatFloat(m, 'f', 9, 64)
		if strings.TrimPrefix(s, "-")[0:2] == "10" { // rounding carried
			e++
			s = strconv.FormatFloat(x/math.Pow10(e), 'f', 9, 64)
		}
		return Value{Mantissa: s, Exp: e}
	}
	e := exponent(x)
	if x == 0 || math.Abs(x) < sigma {
		e = exponent(sigma)
	}
	for try := 0; try < 2; try++ {
		ms, ss := x/math.Pow10(e), sigma/math.Pow10(e)
		// Decimals so that σ shows uncDigits significant digits.
		d := uncDigits - 1 - int(math.Floor(math.Log10(ss)))
		if d < 0 {
			d = 0
		}
		u := math.Round(ss * math.Pow10(d))
		if u >= math.Pow10(uncDigits) && d > 0 { // 9.96 → 10.0: one digit fewer
			d--
			u = math.Round(ss * math.Pow10(d))
		}
		s := strconv.FormatFloat(ms, 'f', d, 64)
		if a := strings.TrimPrefix(s, "-"); len(a) >= 2 && a[:2] == "10" && math.Abs(x) >= sigma && try == 0 {
			e++ // the mantissa rounded up to 10
			continue
		}
		return Value{Mantissa: s, Unc: strconv.FormatFloat(u, 'f', 0, 64), Exp: e}
	}
	panic("numfmt: unreachable")
}

// exponent returns floor(log10|x|), 0 for x = 0.
func exponent(x float64) int {
	if x == 0 {
		return 0
	}
	return int(math.Floor(math.Log10(math.Abs(x))))
}

func (v Value) core() string {
	if v.Unc == "" {
		return v.Mantissa
	}
	return v.Mantissa + "(" + v.Unc + ")"
}

// Plain renders 1.2345(6)e-03 (no exponent when it is zero).
func (v Value) Plain() string {
	if v.NaN {
		return "n/a"
	}
	if v.Exp == 0 {
		return v.core()
	}
	return v.core() + "e" + expString(v.Exp)
}

func expString(e int) string {
	s := strconv.Itoa(e)
	if e < 0 && e > -10 {
		return "-0" + s[1:]
	}
	if e >= 0 && e < 10 {
		return "+0" + s
	}
	if e >= 0 {
		return "+" + s
	}
	return s
}

var superscript = map[rune]rune{'0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', '-': '⁻'}

// Unicode renders 1.2345(6)×10⁻³ with a true minus sign.
func (v Value) Unicode() string {
	if v.NaN {
		return "n/a"
	}
	c := strings.Replace(v.core(), "-", "−", 1)
	if v.Exp == 0 {
		return c
	}
	var b strings.Builder
	b.WriteString(c + "×10")
	for _, r := range strconv.Itoa(v.Exp) {
		b.WriteRune(superscript[r])
	}
	return b.String()
}

// LaTeX renders 1.2345(6)\times10^{-3} for math mode ("\text{--}" is not
// used: a missing value is "\mathrm{n/a}").
func (v Value) LaTeX() string {
	if v.NaN {
		return `\mathrm{n/a}`
	}
	if v.Exp == 0 {
		return v.core()
	}
	return v.core() + `\times10^{` + strconv.Itoa(v.Exp) + `}`
}

// Parse reads back a Plain rendering and returns the value and its
// uncertainty (zero when none is shown).
func Parse(s string) (x, sigma float64, err error) {
	mant, exp := s, 0
	if i := strings.IndexByte(s, 'e'); i >= 0 {
		if exp, err = strconv.Atoi(s[i+1:]); err != nil {
			return 0, 0, err
		}
		mant = s[:i]
	}
	unc := ""
	if i := strings.IndexByte(mant, '('); i >= 0 {
		unc = strings.TrimSuffix(mant[i+1:], ")")
		mant = mant[:i]
	}
	if x, err = strconv.ParseFloat(mant, 64); err != nil {
		return 0, 0, err
	}
	if unc != "" {
		u, err := strconv.ParseFloat(unc, 64)
		if err != nil {
			return 0, 0, err
		}
		dec := 0
		if i := strings.IndexByte(mant, '.'); i >= 0 {
			dec = len(mant) - i - 1
		}
		sigma = u * math.Pow10(-dec+exp)
	}
	return x * math.Pow10(exp), sigma, nil
}

// LaTeXDigits renders x with n significant digits (n < 1 means 1) in
// LaTeX math, e.g. 1.000\times10^{-4}; NaN and ±Inf give \mathrm{n/a}.
func LaTeXDigits(x float64, n int) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return `\mathrm{n/a}`
	}
	if n < 1 {
		n = 1
	}
	e := exponent(x)
	m := strconv.FormatFloat(x/math.Pow10(e), 'f', n-1, 64)
	if a := strings.TrimPrefix(m, "-"); len(a) >= 2 && a[:2] == "10" {
		e++
		m = strconv.FormatFloat(x/math.Pow10(e), 'f', n-1, 64)
	}
	if e == 0 {
		return m
	}
	return m + `\times10^{` + strconv.Itoa(e) + `}`
}

// Positional returns v written without a power of ten when its exponent
// lies in [lo, hi] and the shift keeps every digit of the mantissa (so
// that the uncertainty stays in units of the last digit): -8.64(2) × 10⁻¹
// becomes -0.864(2), 1.25(3) × 10¹ becomes 12.5(3); other values are
// returned unchanged.
func (v Value) Positional(lo, hi int) Value {
	if v.NaN || v.Exp == 0 || v.Exp < lo || v.Exp > hi {
		return v
	}
	sign, m := "", v.Mantissa
	if strings.HasPrefix(m, "-") {
		sign, m = "-", m[1:]
	}
	whole, frac, _ := strings.Cut(m, ".")
	digits := whole + frac
	point := len(whole) + v.Exp // position of the decimal point in digits
	switch {
	case point <= 0:
		digits = strings.Repeat("0", 1-point) + digits
		point = 1
	case point > len(digits):
		return v // the shift would invent digits
	}
	out := digits[:point]
	if point < len(digits) {
		out += "." + digits[point:]
	}
	return Value{Mantissa: sign + out, Unc: v.Unc}
}
