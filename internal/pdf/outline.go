package pdf

import (
	"bytes"
	"fmt"
	"regexp"
	"slices"
	"strconv"
)

// fpdf writes "/Count 0" in every outline item. ISO 32000-1:2008, 12.3.3
// (Table 153) asks an item with descendants for a nonzero /Count: the
// number of visible descendants when the item is open, its negation when
// closed; and the outline dictionary (Table 152) for the total of visible
// items. fixOutlineCounts writes those counts with every item open, so
// the reader's bookmark pane shows the whole heading tree, as the
// contents page does. Counts can be longer than the "0" they replace, so
// the cross-reference table's offsets are rewritten to match.

var (
	reOutlinesRoot = regexp.MustCompile(`(\d+) 0 obj\s*<</Type /Outlines /First (\d+) 0 R\s*/Last (\d+) 0 R>>`)
	reParent       = regexp.MustCompile(`/Parent (\d+) 0 R`)
	countZero      = []byte("/Count 0>>")
)

// outlinesKey is the literal every outline dictionary holds: the pattern
// is tried only around it, not over every byte of a file of megabytes.
var outlinesKey = []byte("<</Type /Outlines /First ")

// findOutlinesRoot is reOutlinesRoot.FindSubmatchIndex(pdf): the pattern
// is matched in a window around each place the literal part occurs (the
// object number and "0 obj" before it are a few bytes long).
func findOutlinesRoot(pdf []byte) []int {
	const before, after = 64, 128
	for from := 0; ; {
		i := bytes.Index(pdf[from:], outlinesKey)
		if i < 0 {
			return nil
		}
		i += from
		lo, hi := max(0, i-before), min(len(pdf), i+after)
		if m := reOutlinesRoot.FindSubmatchIndex(pdf[lo:hi]); m != nil {
			for j := range m {
				if m[j] >= 0 {
					m[j] += lo
				}
			}
			return m
		}
		from = i + 1
	}
}

// outlineEdits returns the edits that write the outline's counts; offs
// are the cross-reference offsets.
func outlineEdits(pdf []byte, offs []int) ([]edit, error) {
	root := findOutlinesRoot(pdf)
	if root == nil {
		return nil, nil // no outline
	}
	rootObj, _ := strconv.Atoi(string(pdf[root[2]:root[3]]))
	first, _ := strconv.Atoi(string(pdf[root[4]:root[5]]))
	// fpdf writes the items as consecutive objects first .. rootObj-1,
	// each with /Parent: an item or the outline dictionary.
	if first <= 0 || rootObj <= first || rootObj >= len(offs) || slices.Min(offs[first:rootObj]) < 0 {
		return nil, fmt.Errorf("outline items %d..%d outside the cross-reference table", first, rootObj-1)
	}
	type item struct {
		body   []byte // the object, from its offset to "endobj"
		at     int
		parent int
	}
	items := map[int]*item{}
	for n := first; n < rootObj; n++ {
		at := offs[n]
		end := bytes.Index(pdf[at:], []byte("endobj"))
		if end < 0 || !bytes.HasPrefix(pdf[at:], []byte(strconv.Itoa(n)+" 0 obj")) {
			return nil, fmt.Errorf("outline item %d not at its cross-reference offset", n)
		}
		body := pdf[at : at+end]
		m := reParent.FindSubmatch(body)
		if m == nil {
			return nil, fmt.Errorf("outline item %d has no parent", n)
		}
		p, _ := strconv.Atoi(string(m[1]))
		items[n] = &item{body: body, at: at, parent: p}
	}
	// With every item open, an item's count is all its descendants.
	counts := map[int]int{}
	for n := range items {
		for p, seen := items[n].parent, 0; p != rootObj; p, seen = items[p].parent, seen+1 {
			if items[p] == nil || seen > len(items) {
				return nil, fmt.Errorf("outline item %d has a parent %d outside the outline", n, p)
			}
			counts[p]++
		}
	}
	var edits []edit
	for n := first; n < rootObj; n++ {
		c := counts[n]
		if c == 0 {
			continue
		}
		it := items[n]
		i := bytes.LastIndex(it.body, countZero)
		if i < 0 {
			return nil, fmt.Errorf("outline item %d has no /Count 0 to fix", n)
		}
		edits = append(edits, edit{at: it.at + i, n: len(countZero), repl: []byte("/Count " + strconv.Itoa(c) + ">>")})
	}
	// The outline dictionary: the total of visible items, all of them.
	closeAt := root[1] - len(">>")
	edits = append(edits, edit{at: closeAt, n: 0, repl: []byte(" /Count " + strconv.Itoa(len(items)))})
	return edits, nil
}
