package tabular

import (
	"bytes"
	"io"
	"io/fs"
	"path"
	"runtime"
	"strings"
	"unicode/utf8"
	"unsafe"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// StreamBytes is the size from which OpenStream reads a CSV file as a
// stream of chunks instead of whole: a world-sized values file (180 MB)
// is then never held at once, and no memory is handed out for it beyond
// a few chunks, which on a virtual machine costs more than parsing.
var StreamBytes int64 = 4 << 20

// StreamChunkBytes is the largest chunk, and so about the size of a
// part (tests make it small); a smaller file is cut in at least eight
// chunks of 256 KiB or more, so that every processor has parts to parse.
var StreamChunkBytes = 2 << 20

// A Stream reads a large CSV file chunk by chunk, each chunk cut just
// after a line feed, in the order of the file and ahead of its reader (a
// few chunks at most). It is a RowReader giving exactly the rows, cells,
// positions and problems that NewCSVWith over the whole file gives, and
// through Part it gives the chunks as parts to parse on several
// processors, as Split does.
//
// Two differences from reading the file whole, both only for files that
// fail: a byte that is not UTF-8, or the size limit reached, is reported
// when its chunk is reached, after the rows before it (whole, nothing is
// read); and a problem that stops the file leaves the rest unread.
//
// A chunk holding a double quote (a quoted field may hold a line break
// and so cross the cut) ends the streaming: that chunk and the rest of
// the file are read whole into one last part, which must be read in turn
// (Part's rest), after the rows before it are counted.
type Stream struct {
	file   string
	header []Cell
	lim    limits.Limits

	// read side (one goroutine)
	items chan streamItem
	free  chan []byte
	stop  chan struct{}
	ended chan struct{}

	// reading side
	cur      *CSVReader // serial reading: the part being read
	rows     int64      // rows read so far by Next
	finished bool
	failed   bool
}

// streamItem is one part, or the problem that ends the stream.
type streamItem struct {
	part *CSVReader
	buf  []byte
	rest bool
	err  error
}

// OpenStream opens a CSV file to read as a stream. Anything OpenWith
// reads otherwise (a workbook, a sheet, an unknown extension) is left to
// OpenWith; a small CSV file, or one whose first chunk holds a double
// quote, is read whole and the reader returned is an ordinary
// *CSVReader; otherwise a *Stream.
func OpenStream(fsys fs.FS, name string, lim limits.Limits) (RowReader, error) {
	lim = lim.Or()
	switch strings.ToLower(path.Ext(name)) {
	case ".csv", ".txt", "":
		if !strings.Contains(name, "#") {
			break
		}
		fallthrough
	default:
		return OpenWith(fsys, name, lim)
	}
	f, err := fsys.Open(name)
	if err != nil {
		return nil, openProblem(name, err)
	}
	st, err := f.Stat()
	if err != nil || st.IsDir() || st.Size() < StreamBytes {
		f.Close()
		return OpenWith(fsys, name, lim)
	}
	if st.Size() > lim.FileBytes {
		f.Close()
		return nil, tooLarge(name, st.Size(), lim)
	}
	s := &Stream{file: name, lim: lim}
	rd := &chunkReader{f: f, name: name, lim: lim}
	chunk := StreamChunkBytes
	if c := st.Size() / 8; c < int64(chunk) {
		chunk = int(min(max(c, 256<<10), int64(chunk)))
	}
	first, err := rd.next(make([]byte, 0, chunk))
	// The first chunk holds the whole header line (after any empty lines).
	for err == nil && !holdsHeader(first) && !rd.eof {
		var more []byte
		more, err = rd.next(make([]byte, 0, chunk))
		first = append(first, more...)
	}
	if err == io.EOF && len(first) > 0 {
		err = nil
	}
	if err != nil {
		f.Close()
		if err == io.EOF {
			return NewCSVWith(name, nil, lim) // the file is empty
		}
		return nil, err
	}
	if bytes.IndexByte(first, '"') >= 0 || bytes.HasPrefix(first, []byte{0xFF, 0xFE}) || bytes.HasPrefix(first, []byte{0xFE, 0xFF}) {
		// Read whole, as before streaming.
		defer f.Close()
		data, err := rd.rest(first)
		if err != nil {
			return nil, err
		}
		return NewCSVWith(name, data, lim)
	}
	hr, err := NewCSVWith(name, first, lim)
	if err != nil {
		f.Close()
		return nil, err
	}
	// The chunk buffers are reused: the header keeps copies.
	s.header = make([]Cell, len(hr.header))
	for i, c := range hr.header {
		c.Text = strings.Clone(c.Text)
		s.header[i] = c
	}
	workers := runtime.GOMAXPROCS(0)
	n := 2*workers + 4
	s.items = make(chan streamItem, n)
	s.free = make(chan []byte, n+1)
	s.stop = make(chan struct{})
	s.ended = make(chan struct{})
	for range n {
		s.free <- make([]byte, 0, chunk)
	}
	go s.produce(f, rd, hr, first)
	return s, nil
}

// produce reads the chunks and sends them as parts, until the end, a
// problem, or Close.
func (s *Stream) produce(f fs.File, rd *chunkReader, hr *CSVReader, first []byte) {
	defer close(s.ended)
	defer close(s.items)
	defer f.Close()
	send := func(it streamItem) bool {
		select {
		case s.items <- it:
			return true
		case <-s.stop:
			return false
		}
	}
	// The first chunk after its header, then chunk after chunk.
	line := hr.line
	var breaks int64
	// hr reads first, less a byte-order mark.
	chunk, buf := first[len(first)-len(hr.data)+hr.pos:], first
	for {
		if chunk == nil {
			select {
			case buf = <-s.free:
			case <-s.stop:
				return
			}
			var err error
			chunk, err = rd.next(buf[:0])
			if err == io.EOF {
				return
			}
			if err != nil {
				send(streamItem{err: err})
				return
			}
			buf = chunk
		}
		part, lines, nb, ok := s.part(unsafeString(chunk), line)
		// ASCII is UTF-8; other text is checked (the first chunk was, by
		// NewCSVWith).
		if ok && part != nil && !part.ascii && !utf8.Valid(chunk) {
			send(streamItem{err: encodingProblemAt(s.file, chunk, line)})
			return
		}
		if !ok || breaks+nb+1 > s.lim.Rows {
			// The rest of the file is read whole, in turn.
			data, err := rd.rest(chunk)
			if err != nil {
				send(streamItem{err: err})
				return
			}
			if !utf8.Valid(data) {
				send(streamItem{err: encodingProblemAt(s.file, data, line)})
				return
			}
			r := &CSVReader{file: s.file, data: unsafeString(data), line: line, col: 1, header: s.header, lim: s.lim}
			send(streamItem{part: r, rest: true})
			return
		}
		breaks += nb
		line += lines
		if part == nil {
			select {
			case s.free <- buf[:0]:
			default:
			}
		} else if !send(streamItem{part: part, buf: buf}) {
			return
		}
		chunk = nil
	}
}

// part makes a plain part of data (a whole number of lines, starting at
// line), as Split makes its parts: ok false when data hold a double
// quote. It gives the lines data span and the line breaks in it (an
// upper bound on its records); no part for empty data.
func (s *Stream) part(data string, line int) (p *CSVReader, lines int, breaks int64, ok bool) {
	if strings.IndexByte(data, '"') >= 0 {
		return nil, 0, 0, false
	}
	lf, cr := strings.Count(data, "\n"), strings.Count(data, "\r")
	lines = lf
	if cr > 0 {
		lines += cr - strings.Count(data, "\r\n")
	}
	if len(data) == 0 {
		return nil, 0, 0, true
	}
	ascii := isASCII(data)
	p = &CSVReader{file: s.file, data: data, line: line, col: 1, header: s.header, lim: s.lim,
		plain: true, ascii: ascii, simple: ascii && cr == 0}
	return p, lines, int64(lf + cr), true
}

// File implements RowReader.
func (s *Stream) File() string { return s.file }

// Header implements RowReader.
func (s *Stream) Header() []Cell { return s.header }

// Next implements RowReader: the rows of the parts one after another,
// the rows limit counted over the whole file. Cells refer into a chunk
// that is reused once the next part is reached: copy what must last.
func (s *Stream) Next() ([]Cell, error) {
	for {
		if s.finished {
			return nil, io.EOF
		}
		if s.cur == nil {
			p, _, err := s.Part() // a rest part is read in turn here anyway
			if err == io.EOF {
				s.finished = true
				return nil, io.EOF
			}
			if err != nil {
				s.finished, s.failed = true, true
				return nil, err
			}
			p.rows = s.rows
			s.cur = p
		}
		row, err := s.cur.Next()
		if err == io.EOF {
			s.rows = s.cur.rows
			if s.cur.failed {
				s.finished, s.failed = true, true
				s.Close()
				return nil, io.EOF
			}
			s.Release(s.cur)
			s.cur = nil
			continue
		}
		s.rows = s.cur.rows
		if s.cur.failed {
			s.failed = true
		}
		return row, err
	}
}

// Failed reports whether a problem stopped the stream before its end.
func (s *Stream) Failed() bool { return s.failed }

// Part gives the next part in file order, or io.EOF after the last, or
// the problem that ended the stream. A part that is rest holds the rest
// of the file: set its rows read so far (SetRowsBefore) and read it after
// every part before it. Release a part when its rows are read.
func (s *Stream) Part() (p *CSVReader, rest bool, err error) {
	it, ok := <-s.items
	if !ok {
		return nil, false, io.EOF
	}
	if it.err != nil {
		return nil, false, it.err
	}
	if it.buf != nil {
		it.part.release = it.buf
	}
	return it.part, it.rest, nil
}

// Release gives a part's chunk back for reuse; the part's cells are then
// no longer valid.
func (s *Stream) Release(p *CSVReader) {
	if p == nil || p.release == nil {
		return
	}
	buf := p.release
	p.release, p.data = nil, ""
	select {
	case s.free <- buf[:0]:
	default:
	}
}

// Close stops reading; parts not taken are dropped. It always returns
// nil.
func (s *Stream) Close() error {
	select {
	case <-s.stop:
	default:
		close(s.stop)
	}
	for range s.items {
	}
	<-s.ended
	return nil
}

// SetRowsBefore sets the rows read before a part, for a rest part: the
// rows limit then counts over the whole file.
func (r *CSVReader) SetRowsBefore(n int64) { r.rows = n }

// RowsRead is the number of rows the reader has read (with SetRowsBefore's).
func (r *CSVReader) RowsRead() int64 { return r.rows }

// chunkReader reads a file in chunks cut just after a line feed, counting
// the bytes against the file size limit.
type chunkReader struct {
	f     fs.File
	name  string
	lim   limits.Limits
	carry []byte // read past the last cut
	n     int64
	eof   bool
}

// next fills buf (reusing its array) with the carried bytes and more, up
// to its capacity or the end of the file, and cuts it after the last line
// feed; with no line feed in a full chunk it reads on until one (a line
// longer than a chunk). io.EOF when nothing is left.
func (c *chunkReader) next(buf []byte) ([]byte, error) {
	buf = append(buf[:0], c.carry...)
	c.carry = c.carry[:0]
	for {
		for !c.eof && len(buf) < cap(buf) {
			k, err := c.f.Read(buf[len(buf):cap(buf)])
			buf = buf[:len(buf)+k]
			c.n += int64(k)
			if c.n > c.lim.FileBytes {
				return nil, tooLarge(c.name, c.n, c.lim)
			}
			if err == io.EOF {
				c.eof = true
			} else if err != nil {
				return nil, diagRead(c.name, err)
			}
		}
		if len(buf) == 0 {
			return nil, io.EOF
		}
		if c.eof {
			return buf, nil
		}
		if i := bytes.LastIndexByte(buf, '\n'); i >= 0 {
			c.carry = append(c.carry, buf[i+1:]...)
			return buf[:i+1], nil
		}
		// A line longer than the chunk: room for more.
		buf = append(buf, make([]byte, cap(buf))...)[:len(buf)]
	}
}

// rest gives chunk followed by everything not yet read.
func (c *chunkReader) rest(chunk []byte) ([]byte, error) {
	data := append([]byte(nil), chunk...)
	data = append(data, c.carry...)
	c.carry = nil
	for !c.eof {
		if len(data) == cap(data) {
			data = append(data, 0)[:len(data)]
		}
		k, err := c.f.Read(data[len(data):cap(data)])
		data = data[:len(data)+k]
		c.n += int64(k)
		if c.n > c.lim.FileBytes {
			return nil, tooLarge(c.name, c.n, c.lim)
		}
		if err == io.EOF {
			c.eof = true
		} else if err != nil {
			return nil, diagRead(c.name, err)
		}
	}
	return data, nil
}

// unsafeString views b as a string without copying; b must not change
// while the string is in use (a chunk is reused only once released).
func unsafeString(b []byte) string {
	if len(b) == 0 {
		return ""
	}
	return unsafe.String(&b[0], len(b))
}

func openProblem(name string, err error) error {
	return diag.At(name, 0, 0, "cannot open the file: %s; check the path, which is relative to the brief's folder", describeOpenErr(err))
}

func diagRead(name string, err error) error {
	return diag.At(name, 0, 0, "cannot read the file: %s", describeOpenErr(err))
}

// holdsHeader reports whether b holds a whole first record: a line feed
// after the first line that is not empty.
func holdsHeader(b []byte) bool {
	b = bytes.TrimPrefix(b, []byte("\xef\xbb\xbf"))
	b = bytes.TrimLeft(b, "\r\n")
	return bytes.IndexByte(b, '\n') >= 0
}
