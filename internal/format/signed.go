package format

import "math"

// SignedNumber prints v at the decimals with an explicit sign and the
// Unicode minus sign: "+1.25", "−0.40", and "0.00" for a value that
// rounds to zero (no sign on zero, so a reader never sees "−0.00"). NaN
// and infinities print as an en dash. Z-scores and other unitless
// differences use it.
func SignedNumber(v float64, decimals int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "–"
	}
	r := Round(v, decimals)
	s := Number(math.Abs(r), decimals)
	switch {
	case r > 0:
		return "+" + s
	case r < 0:
		return "−" + s
	}
	return s
}

// SignedPercent prints a relative change in per cent with one decimal and
// an explicit sign: "+12.5%", "−3.0%".
func SignedPercent(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "–"
	}
	return SignedNumber(v, 1) + "%"
}
