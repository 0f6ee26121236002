package pdf

import (
	"bytes"
	"hash/fnv"
)

// fpdf names a UTF-8 font "utf8" + family + style and writes only the
// glyphs used (it subsets), but without the subset tag that ISO 32000-1,
// 9.6.4 asks for: six upper-case letters and a plus sign before the name.
// Readers and checkers (pdffonts' "sub" column) rely on the tag. Our
// families are registered with a three-letter pad, so "utf8" + pad is
// seven bytes, exactly the length of "TAGTAG+": the tag is written over
// them in place and no byte offset of the file moves.
const familyPad = "ppx"

func fpdfFamily(f Family) string { return familyPad + "liberation" + string(f) }

var untagged = []byte("/utf8" + familyPad)

// tagSubsets rewrites every "/utf8ppx<name>" to "/<TAG>+<name>", the tag
// derived from the name so that builds stay byte-identical.
func tagSubsets(pdf []byte) []byte {
	out := pdf
	for i := 0; ; {
		j := bytes.Index(out[i:], untagged)
		if j < 0 {
			return out
		}
		at := i + j + 1 // first byte of "utf8ppx"
		end := at + len(untagged) - 1
		for end < len(out) && isNameChar(out[end]) {
			end++
		}
		name := out[at+len(untagged)-1 : end]
		h := fnv.New32a()
		h.Write(name)
		v := h.Sum32()
		for k := 0; k < 6; k++ {
			out[at+k] = byte('A' + v%26)
			v /= 26
		}
		out[at+6] = '+'
		i = end
	}
}

func isNameChar(c byte) bool {
	return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9'
}
