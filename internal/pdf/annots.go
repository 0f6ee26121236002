package pdf

import (
	"bytes"
	"fmt"
	"strconv"
)

// fpdf writes a page's link annotations as direct dictionaries inside
// its /Annots array; ISO 32000-1:2008, 7.7.3.3 (Table 30) asks for an
// array of indirect references to annotation dictionaries, and pdfcpu's
// strict mode refuses the direct form. annotationEdits moves each
// dictionary into an object of its own (numbered from len(offs) on, in
// page order, so builds stay byte-identical) and leaves references in
// the page.
func annotationEdits(pdf []byte, offs []int, xrefAt int) ([]edit, [][]byte, error) {
	var edits []edit
	var objs [][]byte
	for n, at := range offs {
		if at <= 0 || at >= xrefAt {
			continue
		}
		end := bytes.Index(pdf[at:xrefAt], []byte("endobj"))
		if end < 0 {
			return nil, nil, fmt.Errorf("object %d has no endobj", n)
		}
		body := pdf[at : at+end]
		// Only the dictionary before any stream: page objects have none.
		if s := bytes.Index(body, []byte("stream")); s >= 0 {
			body = body[:s]
		}
		if !bytes.Contains(body, []byte("<</Type /Page\n")) {
			continue
		}
		a := bytes.Index(body, []byte("/Annots ["))
		if a < 0 {
			continue
		}
		i := a + len("/Annots [")
		var refs []byte
		for {
			for i < len(body) && isPDFSpace(body[i]) {
				i++
			}
			if i >= len(body) {
				return nil, nil, fmt.Errorf("object %d: /Annots array not closed", n)
			}
			if body[i] == ']' {
				break
			}
			if !bytes.HasPrefix(body[i:], []byte("<<")) {
				return nil, nil, fmt.Errorf("object %d: unexpected %q in /Annots", n, body[i])
			}
			j, err := dictEnd(body, i)
			if err != nil {
				return nil, nil, fmt.Errorf("object %d: %w", n, err)
			}
			if len(refs) > 0 {
				refs = append(refs, ' ')
			}
			refs = append(refs, strconv.Itoa(len(offs)+len(objs))+" 0 R"...)
			objs = append(objs, append([]byte(nil), body[i:j]...))
			i = j
		}
		start := a + len("/Annots [")
		edits = append(edits, edit{at: at + start, n: i - start, repl: refs})
	}
	return edits, objs, nil
}

func isPDFSpace(c byte) bool {
	return c == ' ' || c == '\n' || c == '\r' || c == '\t' || c == '\f' || c == 0
}

// dictEnd returns the index just past the dictionary that starts at i
// ("<<"), skipping literal strings (with their escapes and balanced
// parentheses, ISO 32000-1, 7.3.4.2) and hexadecimal strings.
func dictEnd(b []byte, i int) (int, error) {
	depth := 0
	for i < len(b) {
		switch {
		case bytes.HasPrefix(b[i:], []byte("<<")):
			depth++
			i += 2
		case bytes.HasPrefix(b[i:], []byte(">>")):
			depth--
			i += 2
			if depth == 0 {
				return i, nil
			}
		case b[i] == '(':
			nest := 0
			for i < len(b) {
				c := b[i]
				i++
				if c == '\\' {
					i++
					continue
				}
				if c == '(' {
					nest++
				} else if c == ')' {
					nest--
					if nest == 0 {
						break
					}
				}
			}
		case b[i] == '<':
			k := bytes.IndexByte(b[i:], '>')
			if k < 0 {
				return 0, fmt.Errorf("hexadecimal string not closed")
			}
			i += k + 1
		default:
			i++
		}
	}
	return 0, fmt.Errorf("dictionary not closed")
}
