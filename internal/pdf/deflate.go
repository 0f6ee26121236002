package pdf

import (
	"bytes"
	"compress/zlib"
	"fmt"
	"runtime"
	"strconv"
	"sync"
	"sync/atomic"
)

// fpdf compresses each page's content stream (and each indexed image's
// palette) with a zlib writer it allocates afresh every time: close to a
// megabyte of compressor state zeroed per page, which cost more than the
// compression itself. The document is therefore written by fpdf without
// compression, and deflateStreams compresses those same streams
// afterwards, exactly as fpdf would (zlib at its fastest level, the
// dictionary "<</Filter /FlateDecode /Length n>>"), with compressors
// kept in a pool and reset between streams, on every processor at once.
// The result is byte for byte the file fpdf writes with compression on
// (TestDeflatedAsFpdfWould); fonts are compressed by fpdf in either case.

// deflater is one reusable zlib compressor and its output buffer.
type deflater struct {
	zw  *zlib.Writer
	out bytes.Buffer
}

var deflaters = sync.Pool{New: func() any {
	d := &deflater{}
	// BestSpeed is a valid level, so this cannot fail.
	d.zw, _ = zlib.NewWriterLevel(&d.out, zlib.BestSpeed)
	return d
}}

// deflate returns data compressed as fpdf compresses a stream. A reset
// writer writes the same bytes as a new one (compress/flate's
// TestWriterReset; TestDeflatedAsFpdfWould checks it here).
func (d *deflater) deflate(data []byte) ([]byte, error) {
	d.out.Reset()
	d.out.Grow(len(data)/4 + 64)
	d.zw.Reset(&d.out)
	if _, err := d.zw.Write(data); err != nil {
		return nil, err
	}
	if err := d.zw.Close(); err != nil {
		return nil, err
	}
	return d.out.Bytes(), nil
}

// plainStream is an uncompressed stream object as fpdf writes it:
// "N 0 obj\n<</Length L>>\nstream\n" data "\nendstream\nendobj".
type plainStream struct {
	obj        int
	dict, data int // offsets of "<<" and of the first data byte
	end        int // offset just past "endstream"
}

// deflateStreams compresses the content stream of every page and the
// palette of every indexed image of pdf, an uncompressed fpdf file, and
// returns the file with its cross-reference table moved to match.
func deflateStreams(pdf []byte) ([]byte, error) {
	offs, xrefAt, err := readXref(pdf)
	if err != nil {
		return nil, err
	}
	var streams []plainStream
	for n, o := range offs {
		if o < 0 {
			continue
		}
		var ref int
		switch obj := pdf[o:]; {
		case hasObjHead(obj, n, "<</Type /Page\n"):
			ref = refAfter(obj, "\n/Contents ")
		case hasObjHead(obj, n, "<</Type /XObject\n/Subtype /Image\n"):
			ref = paletteRef(obj)
		default:
			continue
		}
		if ref < 0 {
			continue
		}
		if ref <= 0 || ref >= len(offs) || offs[ref] < 0 {
			return nil, fmt.Errorf("object %d refers to a missing object %d", n, ref)
		}
		s, err := readPlainStream(pdf, ref, offs[ref])
		if err != nil {
			return nil, err
		}
		streams = append(streams, s)
	}
	if len(streams) == 0 {
		return pdf, nil
	}
	edits := make([]edit, len(streams))
	errs := make([]error, len(streams))
	var next atomic.Int64
	work := func() {
		d := deflaters.Get().(*deflater)
		defer deflaters.Put(d)
		for {
			i := int(next.Add(1)) - 1
			if i >= len(streams) {
				return
			}
			s := streams[i]
			z, err := d.deflate(pdf[s.data : s.end-len("\nendstream")])
			if err != nil {
				errs[i] = err
				continue
			}
			head := "<</Filter /FlateDecode /Length " + strconv.Itoa(len(z)) + ">>\nstream\n"
			repl := make([]byte, 0, len(head)+len(z)+len("\nendstream"))
			repl = append(repl, head...)
			repl = append(repl, z...)
			repl = append(repl, "\nendstream"...)
			edits[i] = edit{at: s.dict, n: s.end - s.dict, repl: repl}
		}
	}
	workers := min(runtime.GOMAXPROCS(0), len(streams))
	var wg sync.WaitGroup
	for range workers - 1 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			work()
		}()
	}
	work()
	wg.Wait()
	for i, err := range errs {
		if err != nil {
			return nil, fmt.Errorf("object %d could not be compressed: %w", streams[i].obj, err)
		}
	}
	return applyEdits(pdf, edits, offs, xrefAt, nil)
}

// hasObjHead reports whether obj opens with "N 0 obj\n" and then head.
func hasObjHead(obj []byte, n int, head string) bool {
	p := strconv.Itoa(n) + " 0 obj\n"
	return bytes.HasPrefix(obj, []byte(p)) && bytes.HasPrefix(obj[len(p):], []byte(head))
}

// objBody is obj up to its "endobj", or nil.
func objBody(obj []byte) []byte {
	end := bytes.Index(obj, []byte("\nendobj"))
	if end < 0 {
		return nil
	}
	return obj[:end]
}

// refAfter reads the object number of "KEY N 0 R" in the object obj
// opens with, or -1 when the key is not there.
func refAfter(obj []byte, key string) int {
	body := objBody(obj)
	at := bytes.Index(body, []byte(key))
	if at < 0 {
		return -1
	}
	return leadingRef(body[at+len(key):])
}

// paletteRef reads N of "/ColorSpace [/Indexed /DeviceRGB K N 0 R]" in
// an image object, or -1 for an image without a palette.
func paletteRef(obj []byte) int {
	const key = "\n/ColorSpace [/Indexed /DeviceRGB "
	body := objBody(obj)
	at := bytes.Index(body, []byte(key))
	if at < 0 {
		return -1
	}
	rest := body[at+len(key):]
	sp := bytes.IndexByte(rest, ' ')
	if sp < 0 {
		return 0
	}
	return leadingRef(rest[sp+1:])
}

// leadingRef reads "N 0 R" at the start of b; 0 when it is not there.
func leadingRef(b []byte) int {
	i := 0
	for i < len(b) && b[i] >= '0' && b[i] <= '9' {
		i++
	}
	if i == 0 || !bytes.HasPrefix(b[i:], []byte(" 0 R")) {
		return 0
	}
	n, err := strconv.Atoi(string(b[:i]))
	if err != nil {
		return 0
	}
	return n
}

// readPlainStream checks that object n at offset o is an uncompressed
// stream as fpdf writes it and locates its parts.
func readPlainStream(pdf []byte, n, o int) (plainStream, error) {
	bad := func(what string) (plainStream, error) {
		return plainStream{}, fmt.Errorf("object %d is not an uncompressed stream as expected: %s", n, what)
	}
	head := strconv.Itoa(n) + " 0 obj\n<</Length "
	if !bytes.HasPrefix(pdf[o:], []byte(head)) {
		return bad("no length")
	}
	p := o + len(head)
	q := p
	for q < len(pdf) && pdf[q] >= '0' && pdf[q] <= '9' {
		q++
	}
	length, err := strconv.Atoi(string(pdf[p:q]))
	if err != nil {
		return bad("bad length")
	}
	const open = ">>\nstream\n"
	if !bytes.HasPrefix(pdf[q:], []byte(open)) {
		return bad("no stream after the dictionary")
	}
	data := q + len(open)
	end := data + length
	if end > len(pdf) || !bytes.HasPrefix(pdf[end:], []byte("\nendstream\nendobj")) {
		return bad("the length does not reach endstream")
	}
	return plainStream{obj: n, dict: o + len(strconv.Itoa(n)+" 0 obj\n"), data: data, end: end + len("\nendstream")}, nil
}
