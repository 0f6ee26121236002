package pdf

import (
	"encoding/binary"
	"hash/crc32"
	"image/color"
	"math"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
)

// canvasStream draws with f on a canvas at (10, 20) mm, 50 x 40 mm, and
// returns the uncompressed PDF.
func canvasStream(t *testing.T, f func(c *Canvas)) string {
	t.Helper()
	d := New(Options{NoCompression: true, Created: time.Unix(0, 0)})
	d.AddPage()
	c := d.Canvas(10, 20, 50, 40)
	f(c)
	c.Close()
	out, err := d.Bytes()
	if err != nil {
		t.Fatal(err)
	}
	return string(out)
}

func TestCanvasPlacesItsOrigin(t *testing.T) {
	s := canvasStream(t, func(c *Canvas) {})
	// The rectangle's bottom-left corner in PDF points: x = 10 mm, y =
	// (297 - 20 - 40) mm, at 72/25.4 points to the millimetre.
	x0, y0 := 10*PointsPerMM, (297-60)*PointsPerMM
	want := num(x0) + " " + num(y0) + " " + num(50*PointsPerMM) + " " + num(40*PointsPerMM) + " re W n"
	if !strings.Contains(s, want) {
		t.Errorf("clip %q not found", want)
	}
	if !strings.Contains(s, "1 0 0 1 "+num(x0)+" "+num(y0)+" cm") {
		t.Error("origin translation not found")
	}
	if w, h := (&Canvas{w: vg.Length(50 * PointsPerMM), h: vg.Length(40 * PointsPerMM)}).Size(); math.Abs(float64(w)-141.732) > 0.001 || math.Abs(float64(h)-113.386) > 0.001 {
		t.Errorf("size %v x %v, want 141.732 x 113.386 pt", w, h)
	}
}

func TestCanvasArcIsBezierCircle(t *testing.T) {
	s := canvasStream(t, func(c *Canvas) {
		var p vg.Path
		p.Move(vg.Point{X: 30, Y: 20})
		p.Arc(vg.Point{X: 20, Y: 20}, 10, 0, 2*math.Pi)
		p.Close()
		c.Fill(p)
	})
	// A quarter circle as a cubic Bézier has its control points at
	// kappa = 4/3 (sqrt 2 - 1) = 0.5522847 of the radius along the
	// tangents (from memory; the usual constant of PostScript and PDF
	// circle drawing). First quarter from (30, 20) to (20, 30):
	want := "30 20 m 30 20 l 30 25.523 25.523 30 20 30 c"
	if !strings.Contains(s, want) {
		t.Errorf("first quarter %q not in stream", want)
	}
	if n := strings.Count(s, " c "); n != 4 {
		t.Errorf("full circle drawn with %d curves, want 4", n)
	}
	if !strings.Contains(s, " h f") {
		t.Error("closed fill not found")
	}
}

func TestCanvasStateOperators(t *testing.T) {
	s := canvasStream(t, func(c *Canvas) {
		c.Push()
		c.Rotate(math.Pi / 2)
		c.Translate(vg.Point{X: 5, Y: 7})
		c.Scale(2, 3)
		c.SetLineWidth(1.5)
		c.SetLineDash([]vg.Length{3, 2}, 1)
		c.SetColor(color.NRGBA{R: 255, G: 0, B: 0, A: 128})
		var p vg.Path
		p.Move(vg.Point{X: 0, Y: 0})
		p.Line(vg.Point{X: 10, Y: 0})
		c.Stroke(p)
		c.Pop()
		c.FillString(font.Face{Font: font.Font{Typeface: "Liberation", Variant: "Serif", Size: 9}}, vg.Point{X: 1, Y: 2}, "Źródło")
	})
	for _, want := range []string{
		"0 1 -1 0 0 0 cm", "1 0 0 1 5 7 cm", "2 0 0 3 0 0 cm", "1.5 w", "[3 2] 1 d",
		"1 0 0 RG 1 0 0 rg", "0 0 m 10 0 l S", "/ca 0.502", "Tj",
	} {
		if !strings.Contains(s, want) {
			t.Errorf("stream lacks %q", want)
		}
	}
	if !strings.Contains(s, "+liberationserif") {
		t.Error("chart text is not set in the document's Liberation Serif")
	}
}

func TestFontForMapsGonumFaces(t *testing.T) {
	cases := []struct {
		f    font.Font
		want Font
	}{
		{font.Font{Typeface: "Liberation", Variant: "Sans", Size: 8}, Font{Sans, Regular, 8}},
		{font.Font{Typeface: "Liberation", Variant: "Serif", Weight: 700, Size: 10}, Font{Serif, Bold, 10}},
		{font.Font{Typeface: "Liberation", Variant: "Mono", Style: 1, Size: 7}, Font{Mono, Italic, 7}},
		{font.Font{Typeface: "Other", Weight: 800, Style: 1, Size: 9}, Font{Sans, BoldItalic, 9}},
	}
	for _, c := range cases {
		if got := FontFor(c.f); got != c.want {
			t.Errorf("FontFor(%+v) = %+v, want %+v", c.f, got, c.want)
		}
	}
}

func TestImageLimits(t *testing.T) {
	d := New(Options{})
	d.AddPage()
	if _, err := d.RegisterImage("logo.gif", []byte("GIF89a")); err == nil || !strings.Contains(err.Error(), "PNG or JPEG") {
		t.Errorf("want a PNG-or-JPEG error, got %v", err)
	}
	// A PNG header claiming 100000 x 100000 pixels is refused before any
	// decoding (IHDR per the PNG specification, ISO/IEC 15948).
	ihdr := []byte("IHDR\x00\x01\x86\xa0\x00\x01\x86\xa0\x08\x02\x00\x00\x00")
	huge := append([]byte("\x89PNG\r\n\x1a\n\x00\x00\x00\x0d"), ihdr...)
	huge = binary.BigEndian.AppendUint32(huge, crc32.ChecksumIEEE(ihdr))
	if _, err := d.RegisterImage("big.png", huge); err == nil || !strings.Contains(err.Error(), "100000 x 100000") {
		t.Errorf("want a size error, got %v", err)
	}
}
