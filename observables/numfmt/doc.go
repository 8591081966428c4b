// Package numfmt writes numbers with uncertainties in the concise notation
// of physics tables, 1.2345(6)×10⁻³, where the digits in parentheses are
// the standard uncertainty in units of the last digit shown (BIPM, Guide to
// the Expression of Uncertainty in Measurement, JCGM 100:2008, §7.2.2,
// from memory).
//
// A Value is split once into mantissa, uncertainty digits and a decimal
// exponent, then rendered as plain text (1.2345(6)e-03), Unicode
// (1.2345(6)×10⁻³) or LaTeX math (1.2345(6)\times10^{-3}). The uncertainty
// is rounded to a fixed number of significant digits (two by default, the
// usual choice when the leading digit is small; common practice) and the
// value is rounded to the same decimal place.
package numfmt
