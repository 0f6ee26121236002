package pdf

import (
	"bytes"
	"image"
	"image/color"
	"image/draw"
	"image/png"
	"math"
	"strconv"

	stdfnt "golang.org/x/image/font"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
)

// Canvas is a vg.Canvas drawing into a rectangle of the document's current
// page. It writes PDF content operators directly (ISO 32000-1, section 8:
// q/Q, cm, m/l/c/h, S/f, re W n), in points with the origin at the
// rectangle's bottom-left corner and y upwards, which is gonum's
// convention, so vg's transforms map one-to-one onto the PDF graphics
// state. Text goes through the document's own UTF-8 fonts, so chart labels
// use the same embedded, subset faces as the body text.
//
// Close must be called before anything else is drawn on the page.
type Canvas struct {
	d      *Doc
	w, h   vg.Length
	stack  []canvasState
	buf    []byte
	closed bool
	font   Font // the document's font before the canvas opened
	// rec, when set, receives the drawing instead of the document (Record).
	rec *Recording
	// colourOps are the colour operators of the two colours set last,
	// latest first: charts alternate a mark's fill and outline, and
	// formatting the six numbers every time was a visible share of
	// drawing a scatter.
	colourOps [2]colourOp
	// lastPath and lastOps are the path written last and its operators
	// before the painting one: a mark is filled, then outlined along the
	// same path, and the second time its numbers need no formatting.
	lastPath vg.Path
	lastOps  []byte
}

type colourOp struct {
	rgb color.NRGBA // alpha zero: the operators do not carry it
	op  string
}

type canvasState struct {
	stroke, fill color.NRGBA
	alpha        float64
	width        vg.Length
}

// Canvas opens a canvas over the rectangle x, y (top-left), w, h in mm of
// the current page. Drawing is clipped to the rectangle.
func (d *Doc) Canvas(x, y, w, h float64) *Canvas {
	c := &Canvas{d: d, w: vg.Length(w * PointsPerMM), h: vg.Length(h * PointsPerMM), font: d.cur}
	d.canvasOn = true
	// fpdf's notion of fill and text colour must agree so that Text does
	// not wrap itself in its own colour (see FillString).
	d.f.SetFillColor(0, 0, 0)
	d.f.SetTextColor(0, 0, 0)
	k := PointsPerMM
	x0, y0 := x*k, (d.opt.Paper.Height-y-h)*k
	c.raw("q")
	c.raw(num(x0) + " " + num(y0) + " " + num(w*k) + " " + num(h*k) + " re W n")
	c.raw("1 0 0 1 " + num(x0) + " " + num(y0) + " cm")
	c.stack = []canvasState{{stroke: color.NRGBA{A: 255}, fill: color.NRGBA{A: 255}, alpha: 1, width: 1}}
	c.raw("0 0 0 RG 0 0 0 rg 1 w [] 0 d 0 J 0 j")
	return c
}

// Close ends the canvas and restores the document's graphics state.
func (c *Canvas) Close() {
	if c.closed {
		return
	}
	c.closed = true
	for len(c.stack) > 1 {
		c.Pop()
	}
	if c.rec != nil {
		c.rec.flush() // Replay closes the canvas it opens on the page
		return
	}
	c.raw("Q")
	d := c.d
	d.canvasOn = false
	// Q restored the PDF state; tell fpdf what it now is.
	d.f.SetAlpha(1, "Normal")
	d.f.SetLineWidth(0.2)
	d.f.SetDashPattern(nil, 0)
	d.f.SetDrawColor(0, 0, 0)
	d.f.SetFillColor(255, 255, 255)
	d.SetTextColor(d.text)
	d.SetFont(c.font)
}

func (c *Canvas) raw(s string) {
	if c.rec != nil {
		if c.rec.discard {
			return
		}
		c.rec.pending = append(append(c.rec.pending, s...), '\n') // as fpdf's out writes it
		return
	}
	c.d.f.RawWriteStr(s)
}

// onDoc runs f on the document now, or, on a recording canvas, when the
// recording is replayed, in the same order relative to the drawing.
func (c *Canvas) onDoc(f func(d *Doc)) {
	if c.rec != nil {
		c.rec.flush()
		c.rec.ops = append(c.rec.ops, recOp{do: f})
		return
	}
	f(c.d)
}

// Recording is a drawing made on a canvas away from any document
// (Record), to be replayed onto a page later (Doc.Replay): what it writes
// is byte for byte what the same drawing writes on a page canvas, so
// charts can be drawn on several goroutines and set in order.
type Recording struct {
	w, h    float64 // mm
	ops     []recOp
	pending []byte
	// discard drops the content written (RecordDiscarding).
	discard bool
}

// recOp is either content written as is (lines ending in a newline) or a
// call on the document (alpha states, text, images).
type recOp struct {
	raw []byte
	do  func(d *Doc)
}

func (r *Recording) flush() {
	if len(r.pending) > 0 {
		r.ops = append(r.ops, recOp{raw: r.pending})
		r.pending = nil
	}
}

// Record opens a canvas of w x h mm that draws into a Recording; Close it,
// then Replay the recording onto a page. A recording canvas touches no
// document, so several can draw at once on different goroutines.
func Record(w, h float64) *Canvas {
	c := &Canvas{w: vg.Length(w * PointsPerMM), h: vg.Length(h * PointsPerMM), rec: &Recording{w: w, h: h}}
	c.stack = []canvasState{{stroke: color.NRGBA{A: 255}, fill: color.NRGBA{A: 255}, alpha: 1, width: 1}}
	return c
}

// RecordDiscarding is Record for a drawing that is made only to prove it
// can be made (check): everything is drawn and formatted as Record does,
// but the content written is dropped, not kept.
func RecordDiscarding(w, h float64) *Canvas {
	c := Record(w, h)
	c.rec.discard = true
	return c
}

// Recording returns what a closed recording canvas drew (nil for a page
// canvas or one still open).
func (c *Canvas) Recording() *Recording {
	if c.rec == nil || !c.closed {
		return nil
	}
	return c.rec
}

// Replay draws a recording onto the current page with its top-left corner
// at x, y mm, exactly as drawing it there on Canvas(x, y, w, h) would.
func (d *Doc) Replay(r *Recording, x, y float64) {
	c := d.Canvas(x, y, r.w, r.h)
	for _, op := range r.ops {
		if op.do != nil {
			op.do(d)
			continue
		}
		// fpdf ends every write with a newline; the recording holds them
		d.f.RawWriteBuf(bytes.NewReader(op.raw[:len(op.raw)-1]))
	}
	c.Close()
}

func (c *Canvas) top() *canvasState { return &c.stack[len(c.stack)-1] }

// num formats a coordinate with at most 3 decimals (1/1000 pt is far below
// any printer's resolution) and no exponent.
func num(v float64) string {
	var b [32]byte
	return string(appendNum(b[:0], v))
}

// appendNum appends num(v) to b.
func appendNum(b []byte, v float64) []byte {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		v = 0
	}
	start := len(b)
	b = strconv.AppendFloat(b, v, 'f', 3, 64)
	// Trim trailing zeros for smaller streams.
	for len(b)-start > 1 && b[len(b)-1] == '0' {
		b = b[:len(b)-1]
	}
	if b[len(b)-1] == '.' {
		b = b[:len(b)-1]
	}
	if len(b)-start == 2 && b[start] == '-' && b[start+1] == '0' {
		b = append(b[:start], '0')
	}
	return b
}

// Size implements vg.Canvas.
func (c *Canvas) Size() (w, h vg.Length) { return c.w, c.h }

// SetLineWidth implements vg.Canvas.
func (c *Canvas) SetLineWidth(w vg.Length) {
	c.top().width = w
	c.raw(num(float64(w)) + " w")
}

// SetLineDash implements vg.Canvas.
func (c *Canvas) SetLineDash(pattern []vg.Length, offset vg.Length) {
	b := []byte{'['}
	for i, p := range pattern {
		if i > 0 {
			b = append(b, ' ')
		}
		b = append(b, num(float64(p))...)
	}
	b = append(b, "] "...)
	b = append(b, num(float64(offset))...)
	b = append(b, " d"...)
	c.raw(string(b))
}

// SetColor implements vg.Canvas: it sets stroke, fill and text colour, and
// the constant alpha through an ExtGState when the colour is translucent.
func (c *Canvas) SetColor(clr color.Color) {
	if clr == nil {
		clr = color.Black
	}
	n := color.NRGBAModel.Convert(clr).(color.NRGBA)
	st := c.top()
	st.stroke, st.fill = n, n
	c.raw(c.colourOp(n))
	a := math.Round(float64(n.A)/255*1000) / 1000
	if a != st.alpha {
		st.alpha = a
		c.onDoc(func(d *Doc) { d.f.SetAlpha(a, "Normal") })
	}
}

// colourOp returns "r g b RG r g b rg" for n's colour.
func (c *Canvas) colourOp(n color.NRGBA) string {
	n.A = 0
	for i, k := range c.colourOps {
		if k.op != "" && k.rgb == n {
			if i > 0 {
				c.colourOps[0], c.colourOps[1] = k, c.colourOps[0]
			}
			return k.op
		}
	}
	rgb := num(float64(n.R)/255) + " " + num(float64(n.G)/255) + " " + num(float64(n.B)/255)
	k := colourOp{rgb: n, op: rgb + " RG " + rgb + " rg"}
	c.colourOps[1], c.colourOps[0] = c.colourOps[0], k
	return k.op
}

// Rotate implements vg.Canvas (radians, anticlockwise).
func (c *Canvas) Rotate(rad float64) {
	s, co := math.Sincos(rad)
	c.raw(num(co) + " " + num(s) + " " + num(-s) + " " + num(co) + " 0 0 cm")
}

// Translate implements vg.Canvas.
func (c *Canvas) Translate(pt vg.Point) {
	c.raw("1 0 0 1 " + num(float64(pt.X)) + " " + num(float64(pt.Y)) + " cm")
}

// Scale implements vg.Canvas.
func (c *Canvas) Scale(x, y float64) {
	c.raw(num(x) + " 0 0 " + num(y) + " 0 0 cm")
}

// Push implements vg.Canvas.
func (c *Canvas) Push() {
	c.stack = append(c.stack, *c.top())
	c.raw("q")
}

// Pop implements vg.Canvas.
func (c *Canvas) Pop() {
	if len(c.stack) <= 1 {
		return
	}
	prev := c.top().alpha
	c.stack = c.stack[:len(c.stack)-1]
	c.raw("Q")
	if c.top().alpha != prev {
		// Q restored the ExtGState already; keep fpdf's record in step.
		a := c.top().alpha
		c.onDoc(func(d *Doc) { d.f.SetAlpha(a, "Normal") })
	}
}

// Stroke implements vg.Canvas.
func (c *Canvas) Stroke(p vg.Path) {
	if c.top().width <= 0 || len(p) == 0 {
		return
	}
	c.path(p, "S")
}

// Fill implements vg.Canvas (non-zero winding rule).
func (c *Canvas) Fill(p vg.Path) {
	if len(p) == 0 {
		return
	}
	c.path(p, "f")
}

// pathWriter accumulates one path's operators.
type pathWriter struct{ b []byte }

func (w *pathWriter) pt(x, y vg.Length) {
	w.b = appendNum(w.b, float64(x))
	w.b = append(w.b, ' ')
	w.b = appendNum(w.b, float64(y))
	w.b = append(w.b, ' ')
}

func (w *pathWriter) op(s string) {
	w.b = append(w.b, s...)
	w.b = append(w.b, ' ')
}

func (c *Canvas) path(p vg.Path, op string) {
	if c.lastOps != nil && samePath(p, c.lastPath) {
		c.paint(append(append(c.buf[:0], c.lastOps...), op...))
		return
	}
	w := &pathWriter{b: c.buf[:0]}
	var cur, start vg.Point
	open := false
	for _, comp := range p {
		switch comp.Type {
		case vg.MoveComp:
			w.pt(comp.Pos.X, comp.Pos.Y)
			w.op("m")
			cur, start, open = comp.Pos, comp.Pos, true
		case vg.LineComp:
			w.pt(comp.Pos.X, comp.Pos.Y)
			w.op(lineOrMove(open))
			cur, open = comp.Pos, true
		case vg.CurveComp:
			if !open {
				w.pt(cur.X, cur.Y)
				w.op("m")
				open = true
			}
			switch len(comp.Control) {
			case 1:
				// Raise the quadratic to a cubic: control points 2/3 of the
				// way from each end to the quadratic control point.
				q := comp.Control[0]
				w.pt(cur.X+2*(q.X-cur.X)/3, cur.Y+2*(q.Y-cur.Y)/3)
				w.pt(comp.Pos.X+2*(q.X-comp.Pos.X)/3, comp.Pos.Y+2*(q.Y-comp.Pos.Y)/3)
			case 2:
				w.pt(comp.Control[0].X, comp.Control[0].Y)
				w.pt(comp.Control[1].X, comp.Control[1].Y)
			default:
				w.pt(comp.Pos.X, comp.Pos.Y)
				w.op("l")
				cur = comp.Pos
				continue
			}
			w.pt(comp.Pos.X, comp.Pos.Y)
			w.op("c")
			cur = comp.Pos
		case vg.ArcComp:
			cur = w.arc(comp, open)
			open = true
		case vg.CloseComp:
			if open {
				w.op("h")
			}
			cur = start
		}
	}
	if !open {
		return
	}
	c.lastOps = append(c.lastOps[:0], w.b...)
	c.lastPath = clonePath(c.lastPath[:0], p)
	c.paint(append(w.b, op...))
}

// paint writes one path's operators, the painting one last.
func (c *Canvas) paint(b []byte) {
	c.buf = b
	if c.rec != nil {
		if c.rec.discard {
			return
		}
		c.rec.pending = append(append(c.rec.pending, b...), '\n') // as raw, without a string
		return
	}
	c.raw(string(b))
}

// samePath reports whether a and b have the same components.
func samePath(a, b vg.Path) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		x, y := &a[i], &b[i]
		if x.Type != y.Type || x.Pos != y.Pos || x.Radius != y.Radius || x.Start != y.Start || x.Angle != y.Angle || len(x.Control) != len(y.Control) {
			return false
		}
		for j := range x.Control {
			if x.Control[j] != y.Control[j] {
				return false
			}
		}
	}
	return true
}

// clonePath appends a deep copy of p to dst (the caller may change p's
// control points later).
func clonePath(dst, p vg.Path) vg.Path {
	for _, comp := range p {
		if comp.Control != nil {
			comp.Control = append([]vg.Point(nil), comp.Control...)
		}
		dst = append(dst, comp)
	}
	return dst
}

func lineOrMove(open bool) string {
	if open {
		return "l"
	}
	return "m"
}

// arc appends an arc as cubic Bézier segments of at most 90 degrees, each
// with control points at distance 4/3 tan(θ/4) of the radius along the
// tangents (the standard approximation; see Riškus 2006, "Approximation of
// a cubic Bézier curve by circular arcs and vice versa"). A line joins the
// current point to the arc's start, as vg's arcs require.
func (w *pathWriter) arc(comp vg.PathComp, open bool) vg.Point {
	r := float64(comp.Radius)
	cx, cy := float64(comp.Pos.X), float64(comp.Pos.Y)
	a0, sweep := comp.Start, comp.Angle
	w.pt(vg.Length(cx+r*math.Cos(a0)), vg.Length(cy+r*math.Sin(a0)))
	w.op(lineOrMove(open))
	n := int(math.Ceil(math.Abs(sweep) / (math.Pi / 2)))
	if n < 1 {
		n = 1
	}
	step := sweep / float64(n)
	k := 4.0 / 3.0 * math.Tan(step/4)
	a := a0
	for i := 0; i < n; i++ {
		s0, c0 := math.Sincos(a)
		s1, c1 := math.Sincos(a + step)
		w.pt(vg.Length(cx+r*(c0-k*s0)), vg.Length(cy+r*(s0+k*c0)))
		w.pt(vg.Length(cx+r*(c1+k*s1)), vg.Length(cy+r*(s1-k*c1)))
		w.pt(vg.Length(cx+r*c1), vg.Length(cy+r*s1))
		w.op("c")
		a += step
	}
	return vg.Point{X: vg.Length(cx + r*math.Cos(a0+sweep)), Y: vg.Length(cy + r*math.Sin(a0+sweep))}
}

// FontFor maps a gonum font to the document's face: Variant "Serif" and
// "Mono" pick those families, anything else Sans; weight bold or heavier
// and italic or oblique style pick the styles.
func FontFor(f font.Font) Font {
	fam := Sans
	switch f.Variant {
	case "Serif":
		fam = Serif
	case "Mono":
		fam = Mono
	}
	st := Regular
	bold := f.Weight >= stdfnt.WeightBold
	ital := f.Style == stdfnt.StyleItalic || f.Style == stdfnt.StyleOblique
	switch {
	case bold && ital:
		st = BoldItalic
	case bold:
		st = Bold
	case ital:
		st = Italic
	}
	return Font{Family: fam, Style: st, Size: float64(f.Size.Points())}
}

// FillString implements vg.Canvas: text with its baseline's left end at pt.
func (c *Canvas) FillString(f font.Face, pt vg.Point, text string) {
	if f.Font.Size <= 0 || text == "" {
		return
	}
	fnt, s := FontFor(f.Font), Printable(text)
	c.onDoc(func(d *Doc) {
		d.SetFont(fnt)
		// fpdf's Text writes x*k, (H - y)*k in the current matrix; invert
		// that so the text lands on pt in canvas points. Fill and text
		// colour are equal in fpdf's record, so it emits no colour of its
		// own and the canvas's rg applies.
		k := PointsPerMM
		d.f.Text(float64(pt.X)/k, d.opt.Paper.Height-float64(pt.Y)/k, s)
	})
}

// DrawImage implements vg.Canvas: the image is embedded as a PNG, the one
// raster element a chart may carry.
func (c *Canvas) DrawImage(rect vg.Rectangle, img image.Image) {
	b := img.Bounds()
	if b.Dx() <= 0 || b.Dy() <= 0 || b.Dx() > MaxImageSide || b.Dy() > MaxImageSide {
		return
	}
	nrgba := image.NewNRGBA(b)
	draw.Draw(nrgba, b, img, b.Min, draw.Src)
	var buf bytes.Buffer
	if err := png.Encode(&buf, nrgba); err != nil {
		return
	}
	data := buf.Bytes()
	c.onDoc(func(d *Doc) {
		d.images++
		name := "chartimg" + strconv.Itoa(d.images)
		opts := imageOptions("png")
		d.f.RegisterImageOptionsReader(name, opts, bytes.NewReader(data))
		k := PointsPerMM
		w := float64(rect.Max.X-rect.Min.X) / k
		h := float64(rect.Max.Y-rect.Min.Y) / k
		// Same inversion as for text: fpdf places the image's top-left
		// corner.
		x := float64(rect.Min.X) / k
		y := d.opt.Paper.Height - float64(rect.Max.Y)/k
		d.f.ImageOptions(name, x, y, w, h, false, opts, 0, "")
	})
}

// DPI implements vg's optional DPI reporting: vector output at 72 points
// to the inch.
func (c *Canvas) DPI() float64 { return 72 }

var _ vg.Canvas = (*Canvas)(nil)
