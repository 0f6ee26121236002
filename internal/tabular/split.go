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
	if n < 2 || r.done || len(rest) == 0 || r.col != 1 || strings.IndexByte(rest, '"') >= 0 {
		return nil
	}
	// Every record ends at a line break, so there are at most this many.
	breaks := int64(strings.Count(rest, "\n") + strings.Count(rest, "\r"))
	if r.rows+breaks+1 > r.lim.Rows {
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
	// Lines before each part, counted in parallel: a line break is an LF,
	// a CR not followed by an LF, or a CRLF pair.
	lines := make([]int, len(cuts)-1)
	ascii := make([]bool, len(lines))
	var wg sync.WaitGroup
	sem := make(chan struct{}, runtime.GOMAXPROCS(0))
	for i := range lines {
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer func() { <-sem; wg.Done() }()
			lines[i] = lineBreaks(rest[cuts[i]:cuts[i+1]])
			ascii[i] = isASCII(rest[cuts[i]:cuts[i+1]])
		}()
	}
	wg.Wait()
	parts := make([]*CSVReader, len(lines))
	line := r.line
	for i := range parts {
		p := *r
		p.data = rest[cuts[i]:cuts[i+1]]
		p.pos, p.line, p.col = 0, line, 1
		p.row, p.buf = nil, nil
		p.plain, p.ascii = true, ascii[i]
		parts[i] = &p
		line += lines[i]
	}
	r.pos, r.done = len(r.data), true // the parts read the rest
	return parts
}

// Failed reports whether a problem stopped the reader before the end of
// its data.
func (r *CSVReader) Failed() bool { return r.failed }

func lineBreaks(s string) int {
	n := strings.Count(s, "\n")
	if cr := strings.Count(s, "\r"); cr > 0 {
		n += cr - strings.Count(s, "\r\n")
	}
	return n
}

// Unread is the number of bytes the reader has not read yet.
func (r *CSVReader) Unread() int { return len(r.data) - r.pos }
