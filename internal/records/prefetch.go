package records

import (
	"io"
)

// prefetch runs a source in its own goroutine and hands rows over in
// batches, so reading and splitting lines (about a third of the work of a
// papers pass) runs on a second core while the caller interns and adds
// up. Rows arrive in file order, so results do not depend on scheduling.
type prefetch struct {
	src    source
	full   chan *rowBatch
	free   chan *rowBatch
	done   chan struct{}
	cur    *rowBatch
	i      int
	fields [][]byte
	n      int // fields per row
}

type rowBatch struct {
	buf   []byte
	ends  []int // end offset of every field, n per row
	lines []int
	err   error // after the rows: the error (io.EOF at the end) that stopped the source
}

const batchRows = 4096

func newPrefetch(src source) *prefetch {
	p := &prefetch{src: src, full: make(chan *rowBatch, 3), free: make(chan *rowBatch, 4), done: make(chan struct{}), n: len(src.header())}
	for range 4 {
		p.free <- &rowBatch{}
	}
	p.fields = make([][]byte, p.n)
	go p.run()
	return p
}

func (p *prefetch) run() {
	for {
		var b *rowBatch
		select {
		case b = <-p.free:
		case <-p.done:
			return
		}
		b.buf, b.ends, b.lines, b.err = b.buf[:0], b.ends[:0], b.lines[:0], nil
		for len(b.lines) < batchRows {
			row, line, err := p.src.next()
			if err != nil {
				b.err = err
				break
			}
			for _, f := range row {
				b.buf = append(b.buf, f...)
				b.ends = append(b.ends, len(b.buf))
			}
			b.lines = append(b.lines, line)
		}
		select {
		case p.full <- b:
		case <-p.done:
			return
		}
		if b.err != nil {
			return
		}
	}
}

func (p *prefetch) header() []string { return p.src.header() }
func (p *prefetch) name() string     { return p.src.name() }

func (p *prefetch) next() ([][]byte, int, error) {
	for p.cur == nil || p.i >= len(p.cur.lines) {
		if p.cur != nil {
			if p.cur.err != nil {
				return nil, 0, p.cur.err
			}
			p.free <- p.cur
		}
		p.cur, p.i = <-p.full, 0
	}
	b := p.cur
	start := 0
	if p.i > 0 {
		start = b.ends[p.i*p.n-1]
	}
	for k := 0; k < p.n; k++ {
		end := b.ends[p.i*p.n+k]
		p.fields[k] = b.buf[start:end:end]
		start = end
	}
	line := b.lines[p.i]
	p.i++
	return p.fields, line, nil
}

// stop ends the goroutine; the caller closes the file after it.
func (p *prefetch) stop() { close(p.done) }

// prefetchCloser stops the goroutine before closing the file.
type prefetchCloser struct {
	p *prefetch
	c io.Closer
}

func (pc prefetchCloser) Close() error {
	pc.p.stop()
	return pc.c.Close()
}
