package pdf

import (
	"bytes"
	"compress/zlib"
	"fmt"
	"reflect"
	"runtime"
	"strconv"
	"sync"
	"sync/atomic"
	"unsafe"

	"codeberg.org/go-pdf/fpdf"
)

// fpdf compresses each page's content stream with a zlib writer it
// allocates afresh for every page (about a megabyte of compressor state
// zeroed each time, more than the compression itself), one page after
// another, when the document is written. Bytes instead compresses the
// finished pages itself, with compressors kept in a pool and reset between
// pages, on every processor at once, puts each page's compressed stream
// back in fpdf's page buffer and lets fpdf write the document without
// compression; markDeflated then names the filter in each page's stream
// dictionary exactly where fpdf would. The file is byte for byte the one
// fpdf writes with its own compression (TestDeflatedAsFpdfWould), and the
// pages are never held uncompressed a second time.
//
// fpdf offers no access to its page buffers, so fpdfPages reaches them by
// reflection; when fpdf's layout is not the one expected (another
// version), or page aliases would be replaced in the written pages, Bytes
// leaves compression to fpdf (TestPagesDeflatedAhead fails then, so an
// upgrade that loses the speed is noticed).

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

// deflate returns a new slice holding data compressed as fpdf compresses
// a stream (zlib, BestSpeed). A reset writer writes the same bytes as a
// new one (compress/flate's TestWriterReset; TestDeflatedAsFpdfWould
// checks it here).
func (d *deflater) deflate(data []byte) ([]byte, error) {
	d.out.Reset()
	d.zw.Reset(&d.out)
	if _, err := d.zw.Write(data); err != nil {
		return nil, err
	}
	if err := d.zw.Close(); err != nil {
		return nil, err
	}
	return bytes.Clone(d.out.Bytes()), nil
}

// deflateAll compresses every data[i] in place, on up to GOMAXPROCS
// goroutines.
func deflateAll(data [][]byte) error {
	errs := make([]error, len(data))
	var next atomic.Int64
	work := func() {
		d := deflaters.Get().(*deflater)
		defer deflaters.Put(d)
		for {
			i := int(next.Add(1)) - 1
			if i >= len(data) {
				return
			}
			data[i], errs[i] = d.deflate(data[i])
		}
	}
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), len(data)) - 1 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			work()
		}()
	}
	work()
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}

var buffersType = reflect.TypeOf([]*bytes.Buffer(nil))

// fpdfPages returns fpdf's page buffers (index 1 is the first page), or
// false when fpdf is not laid out as expected or would still rewrite the
// pages when writing them (page-number aliases).
func fpdfPages(f *fpdf.Fpdf) (*[]*bytes.Buffer, bool) {
	v := reflect.ValueOf(f).Elem()
	pages := v.FieldByName("pages")
	aliases := v.FieldByName("aliasMap")
	nb := v.FieldByName("aliasNbPagesStr")
	if !pages.IsValid() || pages.Type() != buffersType ||
		!aliases.IsValid() || aliases.Kind() != reflect.Map || aliases.Len() != 0 ||
		!nb.IsValid() || nb.Kind() != reflect.String || nb.Len() != 0 {
		return nil, false
	}
	return (*[]*bytes.Buffer)(unsafe.Pointer(pages.UnsafeAddr())), true
}

// deflatePages finishes the last page (its footer, as fpdf's Close would
// draw it), compresses every page's content in fpdf's buffers and turns
// fpdf's own compression off. It reports false, having changed nothing,
// when the pages cannot be reached.
func (d *Doc) deflatePages() (bool, error) {
	pages, ok := fpdfPages(d.f)
	if !ok || d.f.PageNo() == 0 || len(*pages) <= d.f.PageNo() {
		return false, nil
	}
	d.finishLastPage()
	if err := d.f.Error(); err != nil {
		return false, err
	}
	data := make([][]byte, d.f.PageNo())
	for i := range data {
		data[i] = (*pages)[i+1].Bytes()
	}
	if err := deflateAll(data); err != nil {
		return false, err
	}
	for i, z := range data {
		(*pages)[i+1] = bytes.NewBuffer(z)
	}
	d.f.SetCompression(false)
	return true, nil
}

// finishLastPage draws the last page's footer now; fpdf's Close, which
// would draw it, then finds it drawn.
func (d *Doc) finishLastPage() {
	if d.footer != nil && !d.plain[d.f.PageNo()] {
		d.footer(d, d.f.PageNo())
	}
	d.footerDone = true
}

// plainStream is an uncompressed stream object as fpdf writes it:
// "N 0 obj\n<</Length L>>\nstream\n" data "\nendstream\nendobj".
type plainStream struct {
	obj        int
	dict, data int // offsets of "<<" and of the first data byte
	end        int // offset just past "endstream"
}

// markDeflated completes a file fpdf wrote without compression from pages
// deflatePages compressed: each page's content dictionary names the
// filter, and each indexed image's palette, which fpdf would also have
// compressed, is compressed. The cross-reference table is moved to match.
func markDeflated(pdf []byte) ([]byte, error) {
	offs, xrefAt, err := readXref(pdf)
	if err != nil {
		return nil, err
	}
	var edits []edit
	var palettes []plainStream
	for n, o := range offs {
		if o < 0 {
			continue
		}
		obj := pdf[o:]
		page := hasObjHead(obj, n, "<</Type /Page\n")
		var ref int
		switch {
		case page:
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
		if page {
			edits = append(edits, edit{at: s.dict, n: len("<<"), repl: []byte("<</Filter /FlateDecode ")})
		} else {
			palettes = append(palettes, s)
		}
	}
	if len(palettes) > 0 {
		data := make([][]byte, len(palettes))
		for i, s := range palettes {
			data[i] = pdf[s.data : s.end-len("\nendstream")]
		}
		if err := deflateAll(data); err != nil {
			return nil, err
		}
		for i, s := range palettes {
			z := data[i]
			repl := []byte("<</Filter /FlateDecode /Length " + strconv.Itoa(len(z)) + ">>\nstream\n")
			repl = append(append(repl, z...), "\nendstream"...)
			edits = append(edits, edit{at: s.dict, n: s.end - s.dict, repl: repl})
		}
	}
	if len(edits) == 0 {
		return pdf, nil
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
	obj := strconv.Itoa(n) + " 0 obj\n"
	head := obj + "<</Length "
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
	return plainStream{obj: n, dict: o + len(obj), data: data, end: end + len("\nendstream")}, nil
}
