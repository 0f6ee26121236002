package tabular

import (
	"math/rand/v2"
	"testing"
	"unicode/utf8"
)

// Checking in pieces must agree with the standard library's utf8.Valid
// (the reference, Go's unicode/utf8, after RFC 3629) on valid text with
// multi-byte characters and on text broken at every kind of place: a
// lone continuation byte, a truncated sequence, an overlong form, a
// surrogate, bytes never valid in UTF-8 (RFC 3629 section 3).
func TestValidUTF8InPiecesAgrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(3629, 1))
	alphabet := []string{"a", ",", "\n", "7", "é", "ø", "ł", "€", "😀", "ß"}
	broken := []string{"\x80", "\xc3", "\xe2\x82", "\xc0\xaf", "\xed\xa0\x80", "\xff", "\xf8\x88\x80\x80\x80"}
	for trial := 0; trial < 400; trial++ {
		n := rng.IntN(300)
		var b []byte
		for range n {
			b = append(b, alphabet[rng.IntN(len(alphabet))]...)
		}
		if trial%2 == 1 && len(b) > 0 {
			at := rng.IntN(len(b))
			bad := broken[rng.IntN(len(broken))]
			b = append(b[:at], append([]byte(bad), b[at:]...)...)
		}
		want := utf8.Valid(b)
		for pieces := 1; pieces <= 9; pieces++ {
			if got := validUTF8In(b, pieces); got != want {
				t.Fatalf("%q in %d pieces: %v, utf8.Valid says %v", b, pieces, got, want)
			}
		}
	}
}
