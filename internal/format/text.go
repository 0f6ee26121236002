package format

import (
	"fmt"
	"unicode"
	"unicode/utf8"
)

// Capitalise upper-cases the first letter of s (any script: "éluard" gives
// "Éluard"), leaving the rest as written.
func Capitalise(s string) string {
	r, n := utf8.DecodeRuneInString(s)
	if r == utf8.RuneError || unicode.IsUpper(r) {
		return s
	}
	return string(unicode.ToUpper(r)) + s[n:]
}

// Bytes prints a file size for a person: "812 bytes", "187 KiB",
// "1.2 MiB" (binary multiples, IEC 80000-13).
func Bytes(n int) string {
	switch {
	case n >= 1<<20:
		return fmt.Sprintf("%.1f MiB", float64(n)/(1<<20))
	case n >= 1<<10:
		return fmt.Sprintf("%.0f KiB", float64(n)/(1<<10))
	}
	return fmt.Sprintf("%d bytes", n)
}
