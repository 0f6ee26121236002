// Package format turns the figures model's unrounded numbers into the text
// a pack prints. It is the one place where rounding happens, so that a
// table, a chart label and a sentence show the same digits for the same
// figure.
package format

import (
	"math"
	"strconv"
	"strings"

	"peerpack/internal/dataset"
)

// Round rounds v to the given number of decimals exactly as Number prints
// it, so comparisons of rounded values agree with the printed text.
//
// Rounding is half away from zero on the shortest decimal form of v (the
// digits strconv prints for it, which are the digits as written in the
// data file): 2.675 rounds to 2.68 and -1234.5 to -1235, as a reader doing
// it by hand would, rather than by the binary value (2.67499999...).
func Round(v float64, decimals int) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return v
	}
	d, a := clampDecimals(decimals), math.Abs(v)
	// By arithmetic where that is sure to give the digit rounding's
	// result (a value already at its decimals included); else a value
	// already at its decimals beyond roundNear's range is itself; else
	// by digits.
	r, ok := roundNear(a, d)
	if !ok {
		if atPrecision(a, d) {
			r = a
		} else {
			r, _ = strconv.ParseFloat(roundString(a, d), 64)
		}
	}
	if r == 0 {
		return 0 // no negative zero
	}
	if v < 0 {
		return -r
	}
	return r
}

// pow10 holds the exact powers of ten up to the largest decimals.
var pow10 = [...]float64{1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9}

// atPrecision reports, without formatting, that v is already what Round
// returns: v is the float nearest to some whole r divided by 10^decimals
// (r/10^decimals is correctly rounded as parsing is, and r is exact below
// 2^53), so a decimal string of at most that many decimals reads back as
// v, its shortest form has no more decimals, and rounding there changes
// nothing. A fast path for data already at their declared decimals; it
// never changes a result (TestRoundFastPathAgrees).
func atPrecision(v float64, decimals int) bool {
	p := pow10[decimals]
	r := math.Round(v * p)
	return math.Abs(r) < MaxExact && r/p == v
}

// roundNear rounds a non-negative a to the decimals without formatting,
// and reports false when it cannot be sure of giving what roundString
// gives. Let D be a's shortest decimal form and x = a·10^d as computed:
// |D − a| ≤ a·2^-53 (D reads back as a, so it lies within half an ulp),
// and the product adds at most x·2^-53, so x is within x·2^-52 of D·10^d.
// Only when x's fraction lies that close to one half can the two
// disagree on rounding up; there (with a sixteenfold margin) the digit
// rounding decides. Elsewhere the whole number r is the same, and r/10^d,
// r below 2^52 and 10^d exact, is correctly rounded as parsing is.
// TestRoundFastPathAgrees checks it bit for bit against the digits.
func roundNear(a float64, decimals int) (float64, bool) {
	p := pow10[decimals]
	x := a * p
	if !(x < 1<<52) {
		return 0, false
	}
	f := math.Floor(x)
	frac := x - f // exact: f and x share their leading bits
	if math.Abs(frac-0.5) <= x*0x1p-48 {
		return 0, false
	}
	if frac > 0.5 {
		f++
	}
	return f / p, true
}

// roundString rounds a non-negative v half up at the decimals on its
// shortest decimal representation and returns it with exactly that many
// decimals.
func roundString(v float64, decimals int) string {
	s := strconv.FormatFloat(v, 'f', -1, 64)
	intPart, frac := s, ""
	if i := strings.IndexByte(s, '.'); i >= 0 {
		intPart, frac = s[:i], s[i+1:]
	}
	if len(frac) <= decimals {
		frac += strings.Repeat("0", decimals-len(frac))
		if decimals == 0 {
			return intPart
		}
		return intPart + "." + frac
	}
	roundUp := frac[decimals] >= '5'
	digits := []byte(intPart + frac[:decimals])
	if roundUp {
		i := len(digits) - 1
		for ; i >= 0; i-- {
			if digits[i] == '9' {
				digits[i] = '0'
				continue
			}
			digits[i]++
			break
		}
		if i < 0 {
			digits = append([]byte{'1'}, digits...)
		}
	}
	ip := string(digits[:len(digits)-decimals])
	if decimals == 0 {
		return ip
	}
	return ip + "." + string(digits[len(digits)-decimals:])
}

func clampDecimals(d int) int {
	if d < 0 {
		return 0
	}
	if d > 9 {
		return 9
	}
	return d
}

// Number prints v with the decimals and a thousands separator (comma) in
// the integer part: 12345.678 with 1 decimal is "12,345.7". Minus signs use
// the Unicode minus sign so they do not break across lines or look like
// hyphens. Missing values (NaN) print as an en dash.
func Number(v float64, decimals int) string {
	if math.IsNaN(v) {
		return "–"
	}
	if math.IsInf(v, 0) {
		return "–"
	}
	if math.Abs(v) >= MaxExact {
		return scientific(v)
	}
	r := Round(v, decimals)
	s := roundString(math.Abs(r), clampDecimals(decimals))
	intPart, frac := s, ""
	if i := strings.IndexByte(s, '.'); i >= 0 {
		intPart, frac = s[:i], s[i:]
	}
	var b strings.Builder
	if r < 0 {
		b.WriteString("−")
	}
	for i, c := range intPart {
		if i > 0 && (len(intPart)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(c)
	}
	b.WriteString(frac)
	return b.String()
}

// MaxExact is 2^53: up to it every whole number is held exactly by a
// float64 (IEEE 754-2008 binary64, 53-bit significand) and printed digit
// for digit; from it on Number prints four significant digits in
// scientific form, since the further digits are not in the data
// (123456789012345678 is stored as 123456789012345680).
const MaxExact = 1 << 53

// scientific prints v as "1.235 × 10^17" (four significant digits, no-break
// spaces around the sign so it never breaks across lines; the
// exponent after a caret: the embedded fonts lack superscript 0 and 9).
func scientific(v float64) string {
	s := strconv.FormatFloat(math.Abs(v), 'e', 3, 64) // "1.235e+17"
	mant, exp, _ := strings.Cut(s, "e")
	e, _ := strconv.Atoi(exp)
	sign := ""
	if v < 0 {
		sign = "−"
	}
	return sign + mant + "\u00a0×\u00a010^" + strconv.Itoa(e)
}

// Int prints a whole number with thousands separators.
func Int(n int) string { return Number(float64(n), 0) }

// Value prints an indicator value with its declared decimals and unit:
// percent "23.4%", currency in international dollars "PPP$ 182,300"
// (converted, or derived from converted amounts), others as the bare
// number.
func Value(ind dataset.Indicator, v float64) string {
	if math.IsNaN(v) {
		return "–"
	}
	n := Number(v, ind.Decimals)
	switch ind.Unit {
	case dataset.UnitPercent:
		return n + "%"
	case dataset.UnitCurrency:
		if InDollars(ind) {
			return "PPP$ " + n
		}
		return n
	}
	return n
}

// InDollars reports whether an indicator's values are international
// dollars: converted with PPP, or derived from converted amounts.
func InDollars(ind dataset.Indicator) bool {
	return ind.Unit == dataset.UnitCurrency && (ind.Currency || ind.InternationalDollars)
}

// Difference prints the size of a difference between two values of an
// indicator, with the unit a reader expects: "3.6 percentage points" for
// percent, "PPP$ 12,000" for currency, else the number. The sign is dropped:
// the words around it say which way it goes.
func Difference(ind dataset.Indicator, d float64) string {
	n := Number(math.Abs(d), ind.Decimals)
	switch ind.Unit {
	case dataset.UnitPercent:
		if n == "1" {
			return n + " percentage point"
		}
		return n + " percentage points"
	case dataset.UnitCurrency:
		if InDollars(ind) {
			return "PPP$ " + n
		}
	}
	return n
}

// Signed prints a change with an explicit sign: "+3.6", "−0.2", "0.0".
func Signed(ind dataset.Indicator, d float64) string {
	r := Round(d, ind.Decimals)
	n := Number(math.Abs(r), ind.Decimals)
	switch {
	case r > 0:
		n = "+" + n
	case r < 0:
		n = "−" + n
	}
	if ind.Unit == dataset.UnitPercent {
		return n + " pp"
	}
	return n
}

// SignedValue is Signed with the unit a value carries when it stands
// alone in prose, where no column heading gives it: "+PPP$ 21,916" for
// international dollars, "+3.6 pp" for percent, else the signed number.
func SignedValue(ind dataset.Indicator, d float64) string {
	n := Signed(ind, d)
	if !InDollars(ind) {
		return n
	}
	if r := []rune(n); len(r) > 0 && (r[0] == '+' || r[0] == '−') {
		return string(r[0]) + "PPP$ " + string(r[1:])
	}
	return "PPP$ " + n
}

// Percent prints a percentage with the decimals: Percent(12.345, 1) is
// "12.3%".
func Percent(p float64, decimals int) string {
	if math.IsNaN(p) {
		return "–"
	}
	return Number(p, decimals) + "%"
}

// Percentile prints a percentile rank as a whole number with its ordinal
// suffix: "73rd percentile".
func Percentile(p float64) string {
	if math.IsNaN(p) || math.IsInf(p, 0) {
		return "–"
	}
	return Ordinal(PercentileRank(p)) + " percentile"
}

// PercentileRank is a percentile rank as printed: rounded to a whole
// number and kept within 1 to 99. A mid-rank percentile is never 0 or 100
// (100 x (below + ties/2) / n lies strictly between), so a printed "0th"
// or "100th" would only be rounding, and reads as "below everyone" or
// "above everyone including itself" (common practice, no source).
func PercentileRank(p float64) int {
	return min(max(int(Round(p, 0)), 1), 99)
}

// Ordinal prints 1st, 2nd, 3rd, 4th, 11th, 12th, 13th, 21st, 112th.
func Ordinal(n int) string {
	suffix := "th"
	switch n % 100 {
	case 11, 12, 13:
	default:
		switch n % 10 {
		case 1:
			suffix = "st"
		case 2:
			suffix = "nd"
		case 3:
			suffix = "rd"
		}
	}
	return Int(n) + suffix
}

// RankBand returns the band a rank falls in when ranks beyond the threshold
// are to be reported as bands: exact up to the threshold, then bands of 50
// up to 200 and of 100 beyond (common practice, no source). The band is
// empty when the rank is within the threshold.
func RankBand(rank, threshold int) (lo, hi int, banded bool) {
	if threshold <= 0 || rank <= threshold {
		return rank, rank, false
	}
	width := 100
	if rank <= 200 {
		width = 50
	}
	lo = ((rank-1)/width)*width + 1
	if lo <= threshold {
		lo = threshold + 1
	}
	hi = ((rank-1)/width + 1) * width
	return lo, hi, true
}

// Rank prints a rank as "6th" or, beyond the threshold, its band "201–300".
func Rank(rank, threshold int) string {
	lo, hi, banded := RankBand(rank, threshold)
	if !banded {
		return Ordinal(rank)
	}
	return Int(lo) + "–" + Int(hi)
}

// Plural picks the singular or plural form by count: Plural(1, "member",
// "members").
func Plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
