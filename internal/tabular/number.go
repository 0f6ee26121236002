package tabular

import (
	"fmt"
	"strconv"
	"strings"
)

// NumberError says why a cell is not a plain number and how to write it.
type NumberError struct {
	// Token is set when the cell is a word or symbol that people use for
	// "no value" (n/a, -, NaN, inf); an indicator may accept it as missing.
	Token string
	Msg   string
}

func (e *NumberError) Error() string { return e.Msg }

// missingTokens are the spellings of "no value" seen in exported data; each
// is refused unless an indicator's missing: list names it.
var missingTokens = map[string]bool{
	"nan": true, "inf": true, "+inf": true, "-inf": true, "infinity": true, "-infinity": true,
	"-": true, "--": true, "n/a": true, "na": true, "#n/a": true, "..": true, "...": true,
	"null": true, "none": true, "missing": true, "?": true, "x": true, "#div/0!": true,
	"#value!": true, "#ref!": true, "#num!": true, "nd": true, "n.a.": true,
}

// ParseNumber reads a value cell. A number is written plainly with a dot
// for decimals: 12345, -0.45, 1.5e3; surrounding spaces are ignored. An
// empty cell is missing (empty true), never zero. Everything else is a
// *NumberError that names what the text looks like and the fix: thousands
// separators, decimal commas, percent and currency signs, and the usual
// "no value" tokens.
func ParseNumber(text string) (v float64, empty bool, err error) {
	s := strings.TrimSpace(text)
	if s == "" {
		return 0, true, nil
	}
	if f, ok := shortDecimal(s); ok {
		return f, false, nil
	}
	if plainNumber(s) {
		f, perr := strconv.ParseFloat(s, 64)
		if perr == nil {
			return f, false, nil
		}
		return 0, false, &NumberError{Msg: fmt.Sprintf("%q is too large to be a number here", s)}
	}
	return 0, false, explainNumber(s)
}

// pow10 holds the powers of ten that a float64 holds exactly.
var pow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// shortDecimal reads the commonest value text, [+-]? digits [. digits]
// with at most 15 digits in all, without strconv's general machinery: the
// digits form an integer below 2^53 and the divisor a power of ten up to
// 10^15, both exact in a float64, so the one IEEE 754 division is
// correctly rounded and gives the value strconv.ParseFloat gives (Clinger,
// "How to Read Floating Point Numbers Accurately", PLDI 1990, the "fast
// path"; strconv's atof64exact takes the same path). ok is false for any
// other text, which the caller reads as before.
func shortDecimal(s string) (float64, bool) {
	i, neg := 0, false
	if s[0] == '+' || s[0] == '-' {
		neg, i = s[0] == '-', 1
	}
	var m uint64
	digits, frac, dot := 0, 0, false
	for ; i < len(s); i++ {
		c := s[i]
		switch {
		case c >= '0' && c <= '9':
			m = m*10 + uint64(c-'0')
			digits++
			if dot {
				frac++
			}
		case c == '.' && !dot:
			dot = true
		default:
			return 0, false
		}
	}
	if digits == 0 || digits > 15 {
		return 0, false
	}
	f := float64(m) / pow10[frac]
	if neg {
		f = -f
	}
	return f, true
}

// plainNumber matches [+-]? digits [. digits] [e [+-] digits], with at
// least one digit in the mantissa.
func plainNumber(s string) bool {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
			digits++
		}
	}
	if digits == 0 {
		return false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			i++
		}
		exp := 0
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
			exp++
		}
		if exp == 0 {
			return false
		}
	}
	return i == len(s)
}

func explainNumber(s string) *NumberError {
	low := strings.ToLower(s)
	if missingTokens[low] {
		return &NumberError{Token: s, Msg: fmt.Sprintf("%q is not a number; leave the cell empty for a missing value", s)}
	}
	if grouped(s, ',') {
		plain := strings.ReplaceAll(s, ",", "")
		if strings.Count(s, ",") == 1 && !strings.Contains(s, ".") {
			return &NumberError{Msg: fmt.Sprintf("%q looks like a number with a thousands separator; write it as %s (if the comma is a decimal comma, write %s: numbers use a dot for decimals)", s, plain, strings.Replace(s, ",", ".", 1))}
		}
		return &NumberError{Msg: fmt.Sprintf("%q looks like a number with thousands separators; write it as %s, without separators", s, plain)}
	}
	if grouped(s, ' ') || grouped(s, '\u00a0') || grouped(s, '\'') || grouped(s, '_') {
		plain := strings.NewReplacer(" ", "", "\u00a0", "", "'", "", "_", "").Replace(s)
		return &NumberError{Msg: fmt.Sprintf("%q looks like a number with thousands separators; write it as %s, without separators", s, plain)}
	}
	if europeanGrouped(s) {
		plain := strings.ReplaceAll(s, ".", "")
		plain = strings.Replace(plain, ",", ".", 1)
		return &NumberError{Msg: fmt.Sprintf("%q looks like a number with dots between thousands and a decimal comma; write it as %s", s, plain)}
	}
	if strings.Count(s, ",") == 1 && plainNumber(strings.Replace(s, ",", ".", 1)) {
		return &NumberError{Msg: fmt.Sprintf("%q looks like a number with a decimal comma; write it with a dot: %s", s, strings.Replace(s, ",", ".", 1))}
	}
	if strings.HasSuffix(s, "%") && plainNumber(strings.TrimSpace(strings.TrimSuffix(s, "%"))) {
		return &NumberError{Msg: fmt.Sprintf("%q has a percent sign; write the number alone (%s): the dictionary's unit says it is a percent", s, strings.TrimSpace(strings.TrimSuffix(s, "%")))}
	}
	for _, sym := range []string{"$", "€", "£", "¥", "₹", "US$"} {
		rest := strings.TrimSpace(strings.TrimPrefix(strings.TrimSuffix(s, sym), sym))
		if rest != s && plainNumber(rest) {
			return &NumberError{Msg: fmt.Sprintf("%q has a currency sign; write the number alone (%s): the dictionary's unit says it is money", s, rest)}
		}
	}
	if len(s) > 40 {
		s = s[:37] + "..."
	}
	return &NumberError{Msg: fmt.Sprintf("%q is not a number; write numbers plainly with a dot for decimals, e.g. 1234.5", s)}
}

// grouped reports whether s is digits in groups of three separated by sep
// (12,345 or 1,234,567.8), optionally signed.
func grouped(s string, sep rune) bool {
	s = strings.TrimLeft(s, "+-")
	intPart, frac, hasFrac := strings.Cut(s, ".")
	if hasFrac && (frac == "" || !allDigits(frac)) {
		return false
	}
	parts := strings.Split(intPart, string(sep))
	if len(parts) < 2 {
		return false
	}
	if len(parts[0]) < 1 || len(parts[0]) > 3 || !allDigits(parts[0]) || parts[0] == "0" {
		return false
	}
	for _, p := range parts[1:] {
		if len(p) != 3 || !allDigits(p) {
			return false
		}
	}
	return true
}

// europeanGrouped matches 1.234.567,89 and 1.234,5.
func europeanGrouped(s string) bool {
	s = strings.TrimLeft(s, "+-")
	intPart, frac, ok := strings.Cut(s, ",")
	if !ok || frac == "" || !allDigits(frac) || !strings.Contains(intPart, ".") {
		return false
	}
	parts := strings.Split(intPart, ".")
	if len(parts[0]) < 1 || len(parts[0]) > 3 || !allDigits(parts[0]) {
		return false
	}
	for _, p := range parts[1:] {
		if len(p) != 3 || !allDigits(p) {
			return false
		}
	}
	return true
}

func allDigits(s string) bool {
	if s == "" {
		return false
	}
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return false
		}
	}
	return true
}
