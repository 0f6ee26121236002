package pdf

import (
	"bytes"
	"image"
	"image/color"
	"math"
	"slices"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
)

// findOutlinesRoot must find what the pattern finds over the whole file:
// the first outline dictionary, with its object number whole, or nothing.
func TestFindOutlinesRootMatchesPattern(t *testing.T) {
	filler := bytes.Repeat([]byte("0 0 m 1 1 l S\n"), 500)
	cases := [][]byte{
		nil,
		[]byte("no outline here"),
		[]byte("12 0 obj\n<</Type /Outlines /First 3 0 R\n/Last 9 0 R>>\nendobj"),
		append(append([]byte{}, filler...), []byte("123456 0 obj <</Type /Outlines /First 30 0 R /Last 90 0 R>>")...),
		// the literal without the object header before it, then a real one
		append([]byte("x <</Type /Outlines /First 1 0 R /Last 2 0 R>> "+string(filler)), []byte("7 0 obj<</Type /Outlines /First 1 0 R/Last 2 0 R>>")...),
		[]byte("<</Type /Outlines /First 1 0 R /Last 2 0 R>>"),
	}
	for i, c := range cases {
		want := reOutlinesRoot.FindSubmatchIndex(c)
		got := findOutlinesRoot(c)
		if !slices.Equal(got, want) {
			t.Errorf("case %d: got %v, want %v", i, got, want)
		}
	}
}

// num prints at most three decimals, trailing zeros and a lone point
// trimmed, no negative zero, no exponent: checked against the plain
// definition (strconv with 'f' and 3 decimals, then trimmed) on values
// around every case.
func TestNumFormatting(t *testing.T) {
	plain := func(v float64) string {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			v = 0
		}
		s := strconv.FormatFloat(v, 'f', 3, 64)
		s = strings.TrimRight(s, "0")
		s = strings.TrimSuffix(s, ".")
		if s == "" || s == "-" || s == "-0" {
			s = "0"
		}
		return s
	}
	vals := []float64{0, math.Copysign(0, -1), -0.0004, 0.0004, 0.0005, -0.0005, 1, -1, 10, 100, 1.5, 2.25, 3.125, 0.1,
		123456.789, -98765.4321, 1e15, -1e-9, math.NaN(), math.Inf(1), 595.28, 841.89}
	for i := 0; i < 2000; i++ {
		vals = append(vals, float64(i)*0.0137-13.7, float64(i*i)/7)
	}
	for _, v := range vals {
		if got, want := num(v), plain(v); got != want {
			t.Errorf("num(%v) = %q, want %q", v, got, want)
		}
		if got := string(appendNum([]byte("x "), v)); got != "x "+plain(v) {
			t.Errorf("appendNum(%v) = %q", v, got)
		}
	}
}

// A drawing recorded away from the document and replayed onto the page
// writes exactly what the same drawing writes on a page canvas: paths,
// colours, translucency (ExtGState calls), state pushed and popped and
// left open, text and an image, around text set on the page before and
// after (common practice, no source: a recording must not change the
// output). The recordings are made on other goroutines.
func TestRecordingReplaysByteForByte(t *testing.T) {
	draw := func(c *Canvas) {
		var p vg.Path
		p.Move(vg.Point{X: 5, Y: 5})
		p.Line(vg.Point{X: 40, Y: 30})
		p.Arc(vg.Point{X: 20, Y: 20}, 8, 0, math.Pi)
		p.Close()
		c.SetColor(color.NRGBA{R: 200, G: 10, B: 30, A: 120})
		c.Fill(p)
		c.Push()
		c.SetLineWidth(1.5)
		c.SetLineDash([]vg.Length{2, 1}, 0)
		c.SetColor(color.NRGBA{R: 0, G: 0, B: 255, A: 255})
		c.Stroke(p)
		c.Rotate(0.3)
		fnt := font.Font{Typeface: "Liberation", Variant: "Sans", Size: 9}
		c.FillString(font.Face{Font: fnt}, vg.Point{X: 10, Y: 12}, "Median 1.81 – n = 160")
		c.Pop()
		c.Push()
		c.SetColor(color.NRGBA{R: 10, G: 90, B: 20, A: 60})
		img := image.NewNRGBA(image.Rect(0, 0, 4, 3))
		img.Set(1, 1, color.NRGBA{R: 255, A: 255})
		c.DrawImage(vg.Rectangle{Min: vg.Point{X: 50, Y: 50}, Max: vg.Point{X: 70, Y: 65}}, img)
		// left pushed: Close pops it
	}
	page := func(d *Doc) {
		d.AddPage()
		d.SetFont(Font{Family: Serif, Style: Regular, Size: 11})
		d.Text(20, 30, "Before the chart")
	}
	end := func(d *Doc) []byte {
		d.Text(20, 200, "After the chart")
		out, err := d.Bytes()
		if err != nil {
			t.Fatal(err)
		}
		return out
	}
	for _, compress := range []bool{false, true} {
		direct := New(Options{NoCompression: !compress, Created: time.Unix(0, 0)})
		page(direct)
		for i := 0; i < 3; i++ {
			c := direct.Canvas(10, 40+float64(i)*50, 80, 45)
			draw(c)
			c.Close()
		}
		want := end(direct)

		recs := make([]*Recording, 3)
		var wg sync.WaitGroup
		for i := range recs {
			wg.Add(1)
			go func() {
				defer wg.Done()
				c := Record(80, 45)
				draw(c)
				c.Close()
				recs[i] = c.Recording()
			}()
		}
		wg.Wait()
		replayed := New(Options{NoCompression: !compress, Created: time.Unix(0, 0)})
		page(replayed)
		for i, r := range recs {
			if r == nil {
				t.Fatal("no recording from a closed recording canvas")
			}
			replayed.Replay(r, 10, 40+float64(i)*50)
		}
		got := end(replayed)
		if !bytes.Equal(got, want) {
			t.Errorf("compress %v: replayed PDF (%d bytes) differs from the one drawn directly (%d bytes)", compress, len(got), len(want))
		}
		if !compress && !bytes.Contains(want, []byte(" gs")) {
			t.Error("the drawing should use an ExtGState for translucency")
		}
	}
}

// The colour operators a canvas keeps are those it would format afresh,
// whatever the order colours come in.
func TestColourOpsKeptAsFormatted(t *testing.T) {
	plain := func(n color.NRGBA) string {
		rgb := num(float64(n.R)/255) + " " + num(float64(n.G)/255) + " " + num(float64(n.B)/255)
		return rgb + " RG " + rgb + " rg"
	}
	cols := []color.NRGBA{{0, 114, 178, 255}, {230, 159, 0, 255}, {0, 114, 178, 128}, {0, 0, 0, 0}, {255, 255, 255, 255}, {0, 0, 0, 255}, {1, 2, 3, 4}}
	c := Record(10, 10)
	for i := range 200 {
		n := cols[(i*i+i/3)%len(cols)]
		if got, want := c.colourOp(n), plain(n); got != want {
			t.Fatalf("step %d, %v: %q, formatted afresh %q", i, n, got, want)
		}
	}
}

// BenchmarkCanvasMarks records 640 scatter marks, each filled in one
// colour and outlined in another, as a scatter chart draws them.
func BenchmarkCanvasMarks(b *testing.B) {
	fill, edge := color.NRGBA{0, 114, 178, 230}, color.NRGBA{0, 80, 125, 255}
	for b.Loop() {
		c := Record(170, 100)
		for i := range 640 {
			x, y := vg.Length(i%400), vg.Length(i/4)
			var p vg.Path
			p.Move(vg.Point{X: x + 2, Y: y})
			p.Arc(vg.Point{X: x, Y: y}, 2, 0, 2*math.Pi)
			p.Close()
			c.SetColor(fill)
			c.Fill(p)
			c.SetColor(edge)
			c.SetLineWidth(0.6)
			c.Stroke(p)
		}
		c.Close()
	}
}

// A path drawn again (a mark filled, then outlined) writes the operators
// it wrote the first time, and a path changed in place after drawing is
// formatted afresh.
func TestRepeatedPathAsFormatted(t *testing.T) {
	draw := func(keep bool) ([]byte, int) {
		c := Record(100, 100)
		hits := 0
		ctrl := []vg.Point{{X: 1, Y: 2}, {X: 3, Y: 4}}
		var shared vg.Path
		shared.Move(vg.Point{X: 0, Y: 0})
		shared = append(shared, vg.PathComp{Type: vg.CurveComp, Pos: vg.Point{X: 5, Y: 5}, Control: ctrl})
		for i := range 60 {
			var p vg.Path
			switch i % 4 {
			case 0, 1:
				p.Move(vg.Point{X: vg.Length(i / 4), Y: 1})
				p.Arc(vg.Point{X: vg.Length(i/4) - 2, Y: 1}, 2, 0, 2*math.Pi)
				p.Close()
			case 2:
				p = shared
			case 3:
				ctrl[1].X += 0.5 // the shared path changes in place
				p = shared
			}
			if !keep {
				c.lastOps = nil
			} else if c.lastOps != nil && samePath(p, c.lastPath) {
				hits++
			}
			if i%2 == 0 {
				c.Fill(p)
			} else {
				c.Stroke(p)
			}
		}
		c.Close()
		var all []byte
		for _, op := range c.Recording().ops {
			all = append(all, op.raw...)
		}
		return all, hits
	}
	kept, hits := draw(true)
	fresh, _ := draw(false)
	if !bytes.Equal(kept, fresh) || !bytes.Contains(kept, []byte(" c h S")) {
		t.Errorf("operators differ when paths are kept:\n%s\nformatted afresh:\n%s", kept, fresh)
	}
	if hits != 15 {
		t.Errorf("%d paths reused, want 15 (each arc mark's outline)", hits)
	}
}

// keepWriter holds exactly what was written, in one Write or several.
func TestKeepWriterKeepsEveryWrite(t *testing.T) {
	for _, parts := range [][]string{{"%PDF-1.4 one write"}, {"a", "bc", "", "def"}, {}} {
		var k keepWriter
		for _, p := range parts {
			if n, err := k.Write([]byte(p)); n != len(p) || err != nil {
				t.Fatalf("Write(%q) = %d, %v", p, n, err)
			}
		}
		if got, want := string(k.b), strings.Join(parts, ""); got != want {
			t.Errorf("kept %q, want %q", got, want)
		}
	}
}

// A face added ahead is listed as unused until SetFont selects it; one
// reaching the file unused would be embedded all the same.
func TestUnusedFaces(t *testing.T) {
	d := New(Options{})
	d.AddPage()
	if u := d.UnusedFaces(); len(u) != 0 {
		t.Fatalf("fresh document: %v unused", u)
	}
	var heard []Font
	d.OnNewFace(func(f Font) { heard = append(heard, f) })
	d.AddFace(Font{Family: Serif, Style: Bold, Size: 12})
	if u := d.UnusedFaces(); len(u) != 1 || u[0] != (Font{Family: Serif, Style: Bold}) {
		t.Fatalf("after AddFace: %v unused", u)
	}
	d.SetFont(Font{Family: Serif, Style: Bold, Size: 9})
	d.SetFont(Font{Family: Sans, Style: Italic, Size: 9})
	if u := d.UnusedFaces(); len(u) != 0 {
		t.Errorf("after SetFont: %v unused", u)
	}
	if len(heard) != 1 || heard[0] != (Font{Family: Sans, Style: Italic}) {
		t.Errorf("OnNewFace heard %v, want only the face SetFont registered", heard)
	}
}
