package tabular

import (
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

func TestParseNumber(t *testing.T) {
	for _, tc := range []struct {
		in    string
		want  float64
		empty bool
		err   string // prefix of the message; "" for a number
		token bool
	}{
		// Plain numbers: values as strconv.ParseFloat reads them (Go
		// standard library, IEEE 754 round-to-nearest).
		{in: "12345", want: 12345},
		{in: " -0.45 ", want: -0.45},
		{in: "+3", want: 3},
		{in: ".5", want: 0.5},
		{in: "5.", want: 5},
		{in: "1.5e3", want: 1500},
		{in: "2E-2", want: 0.02},
		{in: "", empty: true},
		{in: "   ", empty: true},
		// Rejected forms; the messages are our own.
		{in: "12,345", err: `"12,345" looks like a number with a thousands separator; write it as 12345`},
		{in: "1,234,567.5", err: `"1,234,567.5" looks like a number with thousands separators; write it as 1234567.5`},
		{in: "0,45", err: `"0,45" looks like a number with a decimal comma; write it with a dot: 0.45`},
		{in: "12,5", err: `"12,5" looks like a number with a decimal comma; write it with a dot: 12.5`},
		{in: "1.234,5", err: `"1.234,5" looks like a number with dots between thousands and a decimal comma; write it as 1234.5`},
		{in: "12 345", err: `"12 345" looks like a number with thousands separators; write it as 12345`},
		{in: "45%", err: `"45%" has a percent sign`},
		{in: "$1200", err: `"$1200" has a currency sign`},
		{in: "NaN", err: `"NaN" is not a number`, token: true},
		{in: "inf", err: `"inf" is not a number`, token: true},
		{in: "-Inf", err: `"-Inf" is not a number`, token: true},
		{in: "-", err: `"-" is not a number`, token: true},
		{in: "n/a", err: `"n/a" is not a number`, token: true},
		{in: "0x1F", err: `"0x1F" is not a number`},
		{in: "1_000", err: `"1_000" looks like a number with thousands separators`},
		{in: "1e", err: `"1e" is not a number`},
		{in: "1e999", err: `"1e999" is too large`},
	} {
		v, empty, err := ParseNumber(tc.in)
		if tc.err != "" {
			if err == nil || !strings.HasPrefix(err.Error(), tc.err) {
				t.Errorf("%q: got %v, want %s", tc.in, err, tc.err)
				continue
			}
			ne := err.(*NumberError)
			if (ne.Token != "") != tc.token {
				t.Errorf("%q: token %q, want token %v", tc.in, ne.Token, tc.token)
			}
			continue
		}
		if err != nil || empty != tc.empty || (!empty && v != tc.want) {
			t.Errorf("%q: got %v %v %v, want %v %v", tc.in, v, empty, err, tc.want, tc.empty)
		}
	}
}

func FuzzNumber(f *testing.F) {
	for _, s := range []string{"-0.0", "0.1", "123456789012345", "1234567890123456", "9007199254740993", "0.000000000000001", "+.5", "5.", ".", "+", "12345", "-0.45", "12,345", "0,45", "1.234,5", "NaN", "inf", "-", "n/a", "1e5", "", " 7 ", "45%"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, empty, err := ParseNumber(s)
		switch {
		case err != nil:
			if err.Error() == "" {
				t.Fatal("empty message")
			}
		case empty:
			if strings.TrimSpace(s) != "" {
				t.Fatalf("%q read as empty", s)
			}
		default:
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("%q read as %v", s, v)
			}
			// Every accepted text is one strconv also reads, to the same
			// value.
			w, perr := strconv.ParseFloat(strings.TrimSpace(s), 64)
			if perr != nil || math.Float64bits(w) != math.Float64bits(v) {
				t.Fatalf("%q: %v, strconv %v %v", s, v, w, perr)
			}
		}
	})
}

// The short-decimal path agrees bit for bit with strconv.ParseFloat (the Go
// standard library, correctly rounded IEEE 754) on decimals of every length
// around its 15-digit limit, both signs, zeros and the usual value shapes.
func TestShortDecimalAgreesWithStrconv(t *testing.T) {
	rng := rand.New(rand.NewPCG(754, 1990))
	check := func(s string) {
		t.Helper()
		v, empty, err := ParseNumber(s)
		w, perr := strconv.ParseFloat(s, 64)
		if err != nil || empty || perr != nil || math.Float64bits(v) != math.Float64bits(w) {
			t.Fatalf("%q: %v (%v), strconv %v (%v)", s, v, err, w, perr)
		}
	}
	for _, s := range []string{"0", "-0", "-0.0", "0.1", "0.3", "1.5721", "74629.95", "9.536", "999999999999999", "0.000000000000001", "123456789012345.", ".123456789012345", "1234567890123456", "9007199254740993", "0.1234567890123456789"} {
		check(s)
	}
	for range 200000 {
		n := 1 + rng.IntN(18)
		b := make([]byte, 0, n+2)
		if rng.IntN(3) == 0 {
			b = append(b, "+-"[rng.IntN(2)])
		}
		dot := rng.IntN(n + 1)
		for i := range n {
			if i == dot {
				b = append(b, '.')
			}
			b = append(b, byte('0'+rng.IntN(10)))
		}
		check(string(b))
	}
}
