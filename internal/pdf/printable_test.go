package pdf

import (
	"bytes"
	"testing"
)

// Characters beyond the Basic Multilingual Plane (an emoji, a mathematical
// letter) become U+FFFD rather than crash fpdf's 16-bit glyph table
// (found by FuzzRenderBody).
func TestPrintableOutsideTheBMP(t *testing.T) {
	cases := map[string]string{
		"Université de Saint-Éluard": "Université de Saint-Éluard",
		"top 😀 quarter":              "top \uFFFD quarter",
		"\U0007871c":                 "\uFFFD",
		"bad \xff byte":              "bad \uFFFD byte",
	}
	for in, want := range cases {
		if got := Printable(in); got != want {
			t.Errorf("Printable(%q) = %q, want %q", in, got, want)
		}
	}
	d := New(Options{Title: "Pack 😀"})
	d.AddPage()
	d.SetFont(Font{Family: Sans, Style: Regular, Size: 10})
	d.Text(20, 20, "Høgskolen i Vårdø 😀 \U0001D518")
	if w := d.StringWidth("😀"); w <= 0 {
		t.Errorf("width of a replaced character is %v", w)
	}
	out, err := d.Bytes()
	if err != nil || !bytes.HasPrefix(out, []byte("%PDF-")) {
		t.Fatalf("no PDF: %v", err)
	}
}
