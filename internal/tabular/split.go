package tabular

import (
	"runtime"
	"strings"
	"sync"
)

// Split divides the rows a CSVReader has not read yet into consecutive
// readers over about n equal parts, cut only between records, so the rows
// can be parsed on several processors. Each part is an ordinary CSVReader
// (same header, file and limits) whose cells are exactly those the whole
// reader would give, positions included: its first line number is counted
// from the start of the file. Read in order, the parts give the rows of
// the whole.
//
// Split gives nil (read the reader itself instead) when a cut could change
// what is read: when the rest holds a double quote (a quoted field may
// hold line breaks, and a stray quote stops the file where it stands), or
// when the rows limit could be reached (the parts count rows
// separately). A part stopped by a problem (an over-long field, too many
// columns) reports Failed; the rows of later parts would not have been read
// by the whole reader.
func (r *CSVReader) Split(n int) []*CSVReader {
	rest := r.data[r.pos:]
	if n < 2 || r.done || len(rest) == 0 || r.col != 1 {
		return nil
	}
	// Cut just after an LF: a record boundary whether the file uses LF,
	// CRLF or lone CRs (a lone CR ends a record too, and is never cut).
	cuts := []int{0}
	for i := 1; i < n; i++ {
		c := i * len(rest) / n
		if c <= cuts[len(cuts)-1] {
			continue
		}
		j := strings.IndexByte(rest[c:], '\n')
		if j < 0 {
			break
		}
		c += j + 1
		if c < len(rest) && c > cuts[len(cuts)-1] {
			cuts = append(cuts, c)
		}
	}
	cuts = append(cuts, len(rest))
	// One pass over each part, the parts in parallel: does it hold a
	// double quote, how many line breaks precede the next part (an LF, a
	// CR not followed by an LF, or a CRLF pair), how many LFs and CRs it
	// has (every record ends at one, so there are at most this many
	// records), and is it all ASCII.
	type scan struct {
		quote, ascii, nocr bool
		lines, breaks      int
	}
	scans := make([]scan, len(cuts)-1)
	var wg sync.WaitGroup
	sem := make(chan struct{}, runtime.GOMAXPROCS(0))
	for i := range scans {
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer func() { <-sem; wg.Done() }()
			part := rest[cuts[i]:cuts[i+1]]
			if strings.IndexByte(part, '"') >= 0 {
				scans[i].quote = true
				return
			}
			lf, cr := strings.Count(part, "\n"), strings.Count(part, "\r")
			scans[i].breaks = lf + cr
			scans[i].lines = lf
			if cr > 0 {
				scans[i].lines += cr - strings.Count(part, "\r\n")
			}
			scans[i].ascii = isASCII(part)
			scans[i].nocr = cr == 0
		}()
	}
	wg.Wait()
	breaks := int64(0)
	for _, sc := range scans {
		if sc.quote {
			return nil
		}
		breaks += int64(sc.breaks)
	}
	if r.rows+breaks+1 > r.lim.Rows {
		return nil
	}
	parts := make([]*CSVReader, len(scans))
	line := r.line
	for i := range parts {
		p := *r
		p.data = rest[cuts[i]:cuts[i+1]]
		p.pos, p.line, p.col = 0, line, 1
		p.row, p.buf = nil, nil
		p.plain, p.ascii, p.simple = true, scans[i].ascii, scans[i].ascii && scans[i].nocr
		parts[i] = &p
		line += scans[i].lines
	}
	r.pos, r.done = len(r.data), true // the parts read the rest
	return parts
}

// Failed reports whether a problem stopped the reader before the end of
// its data.
func (r *CSVReader) Failed() bool { return r.failed }

// Unread is the number of bytes the reader has not read yet.
func (r *CSVReader) Unread() int { return len(r.data) - r.pos }

// NextSimple reads the next row as Next would when it is a simple line of
// a part Split made whose data are ASCII without carriage returns: a line
// (not empty) of exactly len(fields) fields that is no longer than the
// cell limit. It sets fields to the fields' text and cols to their
// columns (1-based; a byte offset in ASCII) and returns the line number
// and true. Otherwise it reads nothing and returns false, and Next reads
// the row, with its problems. It gives the rows Next gives, faster: one
// pass over the line, no cells.
func (r *CSVReader) NextSimple(fields []string, cols []int) (int, bool) {
	d := r.data
	start := r.pos
	if !r.simple || r.done || start >= len(d) || d[start] == '\n' || r.rows >= r.lim.Rows || len(fields) != len(r.header) {
		return 0, false
	}
	end := strings.IndexByte(d[start:], '\n')
	next := 0
	if end < 0 {
		end = len(d)
	} else {
		end += start
		next = end + 1
	}
	if int64(end-start) > r.lim.CellBytes {
		return 0, false
	}
	n, at := len(fields), start
	for k := 0; k < n-1; k++ {
		j := strings.IndexByte(d[at:end], ',')
		if j < 0 {
			return 0, false
		}
		fields[k], cols[k] = d[at:at+j], 1+at-start
		at += j + 1
	}
	if strings.IndexByte(d[at:end], ',') >= 0 {
		return 0, false
	}
	fields[n-1], cols[n-1] = d[at:end], 1+at-start
	line := r.line
	r.rows++
	if next == 0 {
		r.pos, r.col = end, 1+end-start
	} else {
		r.pos, r.line, r.col = next, r.line+1, 1
	}
	return line, true
}
