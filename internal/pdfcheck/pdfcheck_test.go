package pdfcheck

import (
	"strconv"
	"strings"
	"testing"
)

// A hand-written minimal PDF with one empty page, after the example file
// of ISO 32000-1:2008 Annex H.2 ("Minimal PDF file", from memory), passes;
// a file that is no PDF does not. The cross-reference offsets are the
// byte positions of each "N 0 obj" line.
func TestStrictAcceptsMinimalAndRefusesBroken(t *testing.T) {
	if err := Strict([]byte(minimal(""))); err != nil {
		t.Errorf("the Annex H minimal file is refused: %v", err)
	}
	if err := Strict([]byte("%PDF-1.4\nnot a pdf")); err == nil {
		t.Errorf("garbage passed strict validation")
	}
}

// minimal builds the Annex H.2 file with extra catalogue entries.
func minimal(extra string) string {
	objs := []string{
		"<< /Type /Catalog /Pages 2 0 R" + extra + " >>",
		"<< /Type /Pages /Kids [3 0 R] /Count 1 >>",
		"<< /Type /Page /Parent 2 0 R /MediaBox [0 0 612 792] /Resources << >> >>",
	}
	var b strings.Builder
	b.WriteString("%PDF-1.4\n")
	var offs []int
	for i, o := range objs {
		offs = append(offs, b.Len())
		b.WriteString(strconv.Itoa(i+1) + " 0 obj\n" + o + "\nendobj\n")
	}
	xref := b.Len()
	b.WriteString("xref\n0 " + strconv.Itoa(len(objs)+1) + "\n0000000000 65535 f \n")
	for _, off := range offs {
		s := strconv.Itoa(off)
		b.WriteString(strings.Repeat("0", 10-len(s)) + s + " 00000 n \n")
	}
	b.WriteString("trailer\n<< /Size " + strconv.Itoa(len(objs)+1) + " /Root 1 0 R >>\nstartxref\n" + strconv.Itoa(xref) + "\n%%EOF\n")
	return b.String()
}
