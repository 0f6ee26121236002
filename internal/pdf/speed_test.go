package pdf

import (
	"bytes"
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// findOutlinesRoot must find what the pattern finds over the whole file:
// the first outline dictionary, with its object number whole, or nothing.
func TestFindOutlinesRootMatchesPattern(t *testing.T) {
	filler := bytes.Repeat([]byte("0 0 m 1 1 l S\n"), 500)
	cases := [][]byte{
		nil,
		[]byte("no outline here"),
		[]byte("12 0 obj\n<</Type /Outlines /First 3 0 R\n/Last 9 0 R>>\nendobj"),
		append(append([]byte{}, filler...), []byte("123456 0 obj <</Type /Outlines /First 30 0 R /Last 90 0 R>>")...),
		// the literal without the object header before it, then a real one
		append([]byte("x <</Type /Outlines /First 1 0 R /Last 2 0 R>> "+string(filler)), []byte("7 0 obj<</Type /Outlines /First 1 0 R/Last 2 0 R>>")...),
		[]byte("<</Type /Outlines /First 1 0 R /Last 2 0 R>>"),
	}
	for i, c := range cases {
		want := reOutlinesRoot.FindSubmatchIndex(c)
		got := findOutlinesRoot(c)
		if !slices.Equal(got, want) {
			t.Errorf("case %d: got %v, want %v", i, got, want)
		}
	}
}

// num prints at most three decimals, trailing zeros and a lone point
// trimmed, no negative zero, no exponent: checked against the plain
// definition (strconv with 'f' and 3 decimals, then trimmed) on values
// around every case.
func TestNumFormatting(t *testing.T) {
	plain := func(v float64) string {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			v = 0
		}
		s := strconv.FormatFloat(v, 'f', 3, 64)
		s = strings.TrimRight(s, "0")
		s = strings.TrimSuffix(s, ".")
		if s == "" || s == "-" || s == "-0" {
			s = "0"
		}
		return s
	}
	vals := []float64{0, math.Copysign(0, -1), -0.0004, 0.0004, 0.0005, -0.0005, 1, -1, 10, 100, 1.5, 2.25, 3.125, 0.1,
		123456.789, -98765.4321, 1e15, -1e-9, math.NaN(), math.Inf(1), 595.28, 841.89}
	for i := 0; i < 2000; i++ {
		vals = append(vals, float64(i)*0.0137-13.7, float64(i*i)/7)
	}
	for _, v := range vals {
		if got, want := num(v), plain(v); got != want {
			t.Errorf("num(%v) = %q, want %q", v, got, want)
		}
		if got := string(appendNum([]byte("x "), v)); got != "x "+plain(v) {
			t.Errorf("appendNum(%v) = %q", v, got)
		}
	}
}
