package pdf

import (
	"bytes"
	"compress/zlib"
	"image"
	"image/color"
	"image/png"
	"io"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"codeberg.org/go-pdf/fpdf"
	"gonum.org/v1/plot/vg"
)

// imageDoc is a document of several pages with text, vector drawing, an
// internal link, bookmarks, an RGBA image (a soft mask) and, registered
// with fpdf directly since RegisterImage re-encodes PNGs as RGBA, an
// indexed PNG (a palette stream).
func imageDoc(t testing.TB, noCompression bool) *Doc {
	t.Helper()
	d := New(Options{Title: "Streams", Created: time.Date(2025, 3, 1, 12, 0, 0, 0, time.UTC), NoCompression: noCompression})
	d.SetFurniture(nil, func(d *Doc, page int) {
		d.SetFont(Font{Family: Sans, Size: 8})
		d.TextRight(190, 285, "page "+strconv.Itoa(page))
	})
	pal := image.NewPaletted(image.Rect(0, 0, 16, 16), color.Palette{color.RGBA{0, 114, 178, 255}, color.RGBA{230, 159, 0, 255}, color.White})
	rgba := image.NewNRGBA(image.Rect(0, 0, 8, 8))
	for y := range 16 {
		for x := range 16 {
			pal.SetColorIndex(x, y, uint8((x+y)%3))
			if x < 8 && y < 8 {
				rgba.SetNRGBA(x, y, color.NRGBA{uint8(30 * x), uint8(30 * y), 90, uint8(255 - 20*x)})
			}
		}
	}
	var pb, rb bytes.Buffer
	if err := png.Encode(&pb, pal); err != nil {
		t.Fatal(err)
	}
	if err := png.Encode(&rb, rgba); err != nil {
		t.Fatal(err)
	}
	d.f.RegisterImageOptionsReader("indexed", fpdf.ImageOptions{ImageType: "PNG"}, bytes.NewReader(pb.Bytes()))
	logo, err := d.RegisterImage("logo.png", rb.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	link := d.NewLink()
	for p := 1; p <= 4; p++ {
		d.AddPage()
		d.Bookmark("Section "+strconv.Itoa(p), 0, 20)
		d.SetFont(Font{Family: Serif, Style: Bold, Size: 14})
		d.Text(20, 30, "Høgskolen i Vårdø, part "+strconv.Itoa(p))
		d.SetFont(Font{Family: Sans, Size: 9})
		for i := range 40 {
			d.Text(20, 40+float64(i)*5, strings.Repeat("Politechnika Źródłowa ", 1+i%4))
		}
		c := d.Canvas(20, 100, 150, 60)
		for i := range 60 {
			c.SetColor(color.RGBA{uint8(4 * i), 80, 160, 255})
			c.Fill(rectPath(vg.Length(6*i), 0, 4, vg.Length(3*i)))
		}
		c.Close()
		if p == 1 {
			d.LinkArea(20, 26, 60, 6, link)
			d.f.ImageOptions("indexed", 150, 20, 16, 16, false, fpdf.ImageOptions{ImageType: "PNG"}, 0, "")
		}
		if p == 3 {
			d.SetLink(link, 20, 3)
			d.DrawImage(logo, 150, 20, 16, 16)
		}
	}
	return d
}

// fpdfCompressed writes d as fpdf does with its own compression on,
// finished as Bytes finishes a document: the reference for deflatePages
// and markDeflated.
func fpdfCompressed(t testing.TB, d *Doc) []byte {
	t.Helper()
	d.f.SetCompression(true)
	var buf bytes.Buffer
	if err := d.f.Output(&buf); err != nil {
		t.Fatal(err)
	}
	out, err := finishStructure(tagSubsets(buf.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// Pages compressed ahead of fpdf's writing, and palettes after it, must
// give the very file fpdf writes when it compresses them itself.
func TestDeflatedAsFpdfWould(t *testing.T) {
	got, err := imageDoc(t, false).Bytes()
	if err != nil {
		t.Fatal(err)
	}
	want := fpdfCompressed(t, imageDoc(t, false))
	if !bytes.Equal(got, want) {
		n := 0
		for n < len(got) && n < len(want) && got[n] == want[n] {
			n++
		}
		t.Fatalf("compressed file differs from fpdf's from byte %d (%d bytes against %d):\n%q\n%q", n, len(got), len(want), got[n:min(n+80, len(got))], want[n:min(n+80, len(want))])
	}
	if !bytes.Contains(got, []byte("/ColorSpace [/Indexed /DeviceRGB 2 ")) {
		t.Error("the test document lost its indexed image")
	}
	// The same holds over the sample document of the other tests.
	if !bytes.Equal(sampleDoc(t, A4), fpdfCompressed(t, sampleDocument(t, A4))) {
		t.Error("the sample document compressed ahead differs from fpdf's own compression")
	}
	runTool(t, got, "qpdf", "--check")
	text := runTool(t, got, "pdftotext")
	for _, w := range []string{"Høgskolen i Vårdø, part 1", "Politechnika Źródłowa", "page 4"} {
		if !strings.Contains(text, w) {
			t.Errorf("pdftotext lacks %q", w)
		}
	}
}

// With the fpdf version in go.mod the pages are reached and compressed
// ahead; should an upgrade move fpdf's page buffers, Bytes still works
// (fpdf compresses) but this test says the speed is lost.
func TestPagesDeflatedAhead(t *testing.T) {
	d := imageDoc(t, false)
	pages, ok := fpdfPages(d.f)
	if !ok {
		t.Fatal("fpdf's page buffers cannot be reached: pages are compressed by fpdf again, page after page")
	}
	if len(*pages) <= d.PageNo() || (*pages)[1].Len() == 0 {
		t.Fatalf("%d page buffers for %d pages", len(*pages), d.PageNo())
	}
	done, err := d.deflatePages()
	if err != nil || !done {
		t.Fatalf("deflatePages: %v, %v", done, err)
	}
	for n := 1; n <= d.PageNo(); n++ {
		zr, err := zlib.NewReader(bytes.NewReader((*pages)[n].Bytes()))
		if err != nil {
			t.Fatalf("page %d is not zlib data: %v", n, err)
		}
		page, err := io.ReadAll(zr)
		if err != nil || !bytes.Contains(page, []byte(" Tj")) {
			t.Errorf("page %d does not decode to a page with text: %v", n, err)
		}
	}
	// A document with page-number aliases is left to fpdf.
	a := New(Options{})
	a.AddPage()
	a.f.AliasNbPages("")
	if _, ok := fpdfPages(a.f); ok {
		t.Error("pages reached although fpdf will still replace aliases in them")
	}
}

var streamRE = regexp.MustCompile(`(?s)<<([^<>]*)/Length (\d+)>>\nstream\n`)

// streams lists the data of every stream of a file whose dictionary ends
// with its /Length (as fpdf writes pages and palettes), decompressed when
// it is flate-encoded.
func streams(t *testing.T, pdf []byte) [][]byte {
	t.Helper()
	var out [][]byte
	for _, m := range streamRE.FindAllSubmatchIndex(pdf, -1) {
		n, _ := strconv.Atoi(string(pdf[m[4]:m[5]]))
		data := pdf[m[1] : m[1]+n]
		if bytes.Contains(pdf[m[2]:m[3]], []byte("/FlateDecode")) {
			zr, err := zlib.NewReader(bytes.NewReader(data))
			if err != nil {
				t.Fatal(err)
			}
			if data, err = io.ReadAll(zr); err != nil {
				t.Fatal(err)
			}
		}
		out = append(out, data)
	}
	return out
}

// Read back with Go's zlib reader, every page and palette stream of the
// compressed file is the uncompressed file's stream byte for byte.
func TestDeflatedStreamsDecodeToFpdfs(t *testing.T) {
	plain, err := imageDoc(t, true).Bytes()
	if err != nil {
		t.Fatal(err)
	}
	packed, err := imageDoc(t, false).Bytes()
	if err != nil {
		t.Fatal(err)
	}
	ps, zs := streams(t, plain), streams(t, packed)
	if len(ps) < 5 {
		t.Fatalf("only %d streams found in the uncompressed file", len(ps))
	}
	if len(ps) != len(zs) {
		t.Fatalf("%d streams uncompressed, %d compressed", len(ps), len(zs))
	}
	for i := range ps {
		if !bytes.Equal(ps[i], zs[i]) {
			t.Errorf("stream %d decodes to %d bytes, the uncompressed file has %d", i, len(zs[i]), len(ps[i]))
		}
	}
	if len(packed) >= len(plain) {
		t.Errorf("compressed file of %d bytes is not smaller than the plain one (%d)", len(packed), len(plain))
	}
}

// BenchmarkWriteDocument writes a 20-page document of text and vector
// drawing (about 2 MB of page content), the drawing untimed: "pooled" is
// Bytes (fpdf's output, then deflateStreams and finishStructure), "fpdf"
// the same file with fpdf compressing each page itself.
func BenchmarkWriteDocument(b *testing.B) {
	build := func() *Doc {
		d := imageDoc(b, false)
		for range 16 {
			d.AddPage()
			c := d.Canvas(20, 30, 170, 240)
			for i := range 3000 {
				c.SetColor(color.RGBA{uint8(i), 80, 160, 255})
				x := vg.Length(i % 400)
				c.Fill(rectPath(x, vg.Length(i/20), 2, 2))
			}
			c.Close()
		}
		return d
	}
	b.Run("pooled", func(b *testing.B) {
		for b.Loop() {
			b.StopTimer()
			d := build()
			b.StartTimer()
			if _, err := d.Bytes(); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("fpdf", func(b *testing.B) {
		for b.Loop() {
			b.StopTimer()
			d := build()
			b.StartTimer()
			fpdfCompressed(b, d)
		}
	})
}

func rectPath(x, y, w, h vg.Length) vg.Path {
	var p vg.Path
	p.Move(vg.Point{X: x, Y: y})
	p.Line(vg.Point{X: x + w, Y: y})
	p.Line(vg.Point{X: x + w, Y: y + h})
	p.Line(vg.Point{X: x, Y: y + h})
	p.Close()
	return p
}
