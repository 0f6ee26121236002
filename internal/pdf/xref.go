package pdf

import (
	"bytes"
	"fmt"
	"sort"
	"strconv"
)

// finishStructure completes what fpdf leaves short of ISO 32000-1 and
// pdfcpu's strict validation: the outline's counts (outlineEdits) and
// link annotations as indirect objects (annotationEdits). Both change
// lengths, so the file is rewritten with its cross-reference table's
// offsets, its size and startxref moved to match.
func finishStructure(pdf []byte) ([]byte, error) {
	offs, xrefAt, err := readXref(pdf)
	if err != nil {
		return nil, err
	}
	edits, err := outlineEdits(pdf, offs)
	if err != nil {
		return nil, err
	}
	more, objs, err := annotationEdits(pdf, offs, xrefAt)
	if err != nil {
		return nil, err
	}
	edits = append(edits, more...)
	if len(edits) == 0 {
		return pdf, nil
	}
	return applyEdits(pdf, edits, offs, xrefAt, objs)
}

// edit replaces old bytes [at, at+n) with repl.
type edit struct {
	at, n int
	repl  []byte
}

// readXref reads fpdf's one-section cross-reference table: object n's
// offset is offs[n] (-1 for a free entry); xrefAt is where "xref" starts.
func readXref(pdf []byte) (offs []int, xrefAt int, err error) {
	sx := bytes.LastIndex(pdf, []byte("startxref"))
	if sx < 0 {
		return nil, 0, fmt.Errorf("no startxref")
	}
	f := bytes.Fields(pdf[sx+len("startxref"):])
	if len(f) == 0 {
		return nil, 0, fmt.Errorf("no offset after startxref")
	}
	xrefAt, err = strconv.Atoi(string(f[0]))
	if err != nil || xrefAt < 0 || xrefAt >= len(pdf) || !bytes.HasPrefix(pdf[xrefAt:], []byte("xref")) {
		return nil, 0, fmt.Errorf("startxref does not point at a cross-reference table")
	}
	rest := pdf[xrefAt+len("xref"):]
	rest = bytes.TrimLeft(rest, " \r\n")
	nl := bytes.IndexAny(rest, "\r\n")
	if nl < 0 {
		return nil, 0, fmt.Errorf("cross-reference table without entries")
	}
	hdr := bytes.Fields(rest[:nl])
	if len(hdr) != 2 || string(hdr[0]) != "0" {
		return nil, 0, fmt.Errorf("cross-reference table with more than one section")
	}
	count, err := strconv.Atoi(string(hdr[1]))
	if err != nil || count <= 0 {
		return nil, 0, fmt.Errorf("bad cross-reference count %q", hdr[1])
	}
	entries := bytes.TrimLeft(rest[nl:], "\r\n")
	// Each entry is exactly 20 bytes: "nnnnnnnnnn ggggg n" and an EOL
	// (ISO 32000-1, 7.5.4).
	if len(entries) < 20*count {
		return nil, 0, fmt.Errorf("cross-reference table shorter than its count")
	}
	offs = make([]int, count)
	for i := 0; i < count; i++ {
		e := entries[20*i : 20*i+20]
		if e[17] != 'n' {
			offs[i] = -1
			continue
		}
		offs[i], err = strconv.Atoi(string(e[:10]))
		if err != nil {
			return nil, 0, fmt.Errorf("bad cross-reference entry %d", i)
		}
	}
	return offs, xrefAt, nil
}

// applyEdits makes the edits (which must not overlap), appends objs as
// new objects numbered from len(offs) on, and moves every
// cross-reference offset and startxref by the bytes inserted before it.
func applyEdits(pdf []byte, edits []edit, offs []int, xrefAt int, objs [][]byte) ([]byte, error) {
	sort.Slice(edits, func(i, j int) bool { return edits[i].at < edits[j].at })
	// moved[k] is how far the edits before edits[k] move what follows them.
	moved := make([]int, len(edits)+1)
	grow := 0
	for i, e := range edits {
		moved[i+1] = moved[i] + len(e.repl) - e.n
		grow += len(e.repl) - e.n
	}
	shift := func(p int) int {
		k := sort.Search(len(edits), func(i int) bool { return edits[i].at >= p })
		return p + moved[k]
	}
	size := len(offs) + len(objs)
	extra := 0
	for _, o := range objs {
		extra += len(o) + 32
	}
	var out bytes.Buffer
	out.Grow(len(pdf) + grow + extra + 20*len(objs) + 64)
	prev := 0
	for _, e := range edits {
		if e.at < prev || e.at > xrefAt {
			return nil, fmt.Errorf("overlapping or misplaced edit at %d", e.at)
		}
		out.Write(pdf[prev:e.at])
		out.Write(e.repl)
		prev = e.at + e.n
	}
	out.Write(pdf[prev:xrefAt])
	var added []int
	for i, o := range objs {
		added = append(added, out.Len())
		fmt.Fprintf(&out, "%d 0 obj\n%s\nendobj\n", len(offs)+i, o)
	}
	// The table itself: same layout, offsets moved.
	newXref := out.Len()
	out.WriteString("xref\n0 " + strconv.Itoa(size) + "\n")
	for _, o := range offs {
		if o < 0 {
			out.WriteString("0000000000 65535 f \n")
			continue
		}
		writeXrefEntry(&out, shift(o))
	}
	for _, o := range added {
		writeXrefEntry(&out, o)
	}
	tr := bytes.Index(pdf[xrefAt:], []byte("trailer"))
	if tr < 0 {
		return nil, fmt.Errorf("no trailer after the cross-reference table")
	}
	trailer := pdf[xrefAt+tr:]
	sx := bytes.LastIndex(trailer, []byte("startxref"))
	oldSize := []byte("/Size " + strconv.Itoa(len(offs)))
	t := trailer[:sx]
	if !bytes.Contains(t, oldSize) {
		return nil, fmt.Errorf("the trailer's /Size is not the table's %d entries", len(offs))
	}
	out.Write(bytes.Replace(t, oldSize, []byte("/Size "+strconv.Itoa(size)), 1))
	out.WriteString("startxref\n" + strconv.Itoa(newXref) + "\n%%EOF\n")
	return out.Bytes(), nil
}

// writeXrefEntry writes an in-use entry, "%010d 00000 n \n".
func writeXrefEntry(out *bytes.Buffer, off int) {
	var b [20]byte
	copy(b[10:], " 00000 n \n")
	for i := 9; i >= 0; i-- {
		b[i] = byte('0' + off%10)
		off /= 10
	}
	out.Write(b[:])
}
