package pdf

import (
	"image/color"
	"math"

	"codeberg.org/go-pdf/fpdf"
)

// SetFont selects a face, registering its TrueType file in the document on
// first use (so an unused face costs nothing). fpdf subsets every UTF-8
// font to the glyphs used when the document is written.
func (d *Doc) SetFont(f Font) {
	f = normalise(f)
	key := Font{Family: f.Family, Style: f.Style}
	if !d.fonts[key] {
		d.addFace(key)
		if d.onNewFace != nil {
			d.onNewFace(key)
		}
	}
	d.used[key] = true
	d.f.SetFont(fpdfFamily(f.Family), string(f.Style), f.Size)
	d.cur = f
}

func (d *Doc) addFace(key Font) {
	d.f.AddUTF8FontFromBytes(fpdfFamily(key.Family), string(key.Style), fontBytes(key.Family, key.Style))
	d.fonts[key] = true
}

// AddFace registers a face (family and style; the size is ignored)
// without selecting it, so that a later SetFont finds it ready: a
// document for a later layout pass can be given, on another goroutine,
// the faces an earlier pass registered. fpdf embeds every registered
// face, so a document is written only when UnusedFaces is empty.
func (d *Doc) AddFace(f Font) {
	f = normalise(f)
	key := Font{Family: f.Family, Style: f.Style}
	if !d.fonts[key] {
		d.addFace(key)
	}
}

// OnNewFace calls fn with each face SetFont registers from now on.
func (d *Doc) OnNewFace(fn func(Font)) { d.onNewFace = fn }

// UnusedFaces lists the faces registered (AddFace) but never selected.
func (d *Doc) UnusedFaces() []Font {
	var out []Font
	for k := range d.fonts {
		if !d.used[k] {
			out = append(out, k)
		}
	}
	return out
}

// CurrentFont is the face last selected.
func (d *Doc) CurrentFont() Font { return d.cur }

// StringWidth is the advance width of s in the current font, in mm.
func (d *Doc) StringWidth(s string) float64 { return d.f.GetStringWidth(Printable(s)) }

// WidthIn is the width of s in font f, leaving the current font selected.
func (d *Doc) WidthIn(f Font, s string) float64 {
	cur := d.cur
	d.SetFont(f)
	w := d.f.GetStringWidth(Printable(s))
	d.SetFont(cur)
	return w
}

// SetTextColor sets the colour of text drawn with Text.
func (d *Doc) SetTextColor(c color.RGBA) {
	d.text = c
	d.f.SetTextColor(int(c.R), int(c.G), int(c.B))
}

// Text draws s with its baseline at y, starting at x.
func (d *Doc) Text(x, y float64, s string) {
	if s == "" {
		return
	}
	d.f.Text(x, y, Printable(s))
}

// TextRight draws s ending at x.
func (d *Doc) TextRight(x, y float64, s string) {
	d.Text(x-d.StringWidth(s), y, s)
}

// TextCentre draws s centred on x.
func (d *Doc) TextCentre(x, y float64, s string) {
	d.Text(x-d.StringWidth(s)/2, y, s)
}

// Ascent is the distance from baseline to the top of capitals of the
// current font, in mm; Liberation's cap height is about 0.73 em.
func (d *Doc) Ascent() float64 { return 0.73 * d.cur.Size / PointsPerMM }

// PtToMM converts a size in points to millimetres.
func PtToMM(pt float64) float64 { return pt / PointsPerMM }

// Fit shortens s with an ellipsis until it fits width in the current font.
// The cut is found by bisection over the runes, so a very long string
// costs O(n log n), not O(n²).
func (d *Doc) Fit(s string, width float64) string {
	if d.StringWidth(s) <= width {
		return s
	}
	r := []rune(s)
	lo, hi := 0, len(r) // r[:lo]+"…" fits (or lo is 0); r[:hi]+"…" does not
	for lo < hi {
		mid := (lo + hi + 1) / 2
		if d.StringWidth(string(r[:mid])+"…") <= width {
			lo = mid
		} else {
			hi = mid - 1
		}
	}
	if lo == 0 {
		if d.StringWidth("…") <= width {
			return "…"
		}
		return ""
	}
	return string(r[:lo]) + "…"
}

// FillRect fills a rectangle.
func (d *Doc) FillRect(x, y, w, h float64, c color.RGBA) {
	d.f.SetFillColor(int(c.R), int(c.G), int(c.B))
	d.f.Rect(x, y, w, h, "F")
	d.f.SetTextColor(int(d.text.R), int(d.text.G), int(d.text.B))
}

// StrokeRect outlines a rectangle.
func (d *Doc) StrokeRect(x, y, w, h, width float64, c color.RGBA) {
	d.f.SetLineWidth(width)
	d.f.SetDrawColor(int(c.R), int(c.G), int(c.B))
	d.f.Rect(x, y, w, h, "D")
}

// Line draws a straight rule.
func (d *Doc) Line(x1, y1, x2, y2, width float64, c color.RGBA) {
	d.f.SetLineWidth(width)
	d.f.SetDrawColor(int(c.R), int(c.G), int(c.B))
	d.f.Line(x1, y1, x2, y2)
}

// Circle fills a disc, used for list bullets and legend glyphs.
func (d *Doc) Circle(x, y, r float64, c color.RGBA) {
	d.f.SetFillColor(int(c.R), int(c.G), int(c.B))
	d.f.Circle(x, y, r, "F")
	d.f.SetTextColor(int(d.text.R), int(d.text.G), int(d.text.B))
}

// Polygon fills a closed polygon given as x, y pairs.
func (d *Doc) Polygon(pts []float64, c color.RGBA) {
	if len(pts) < 6 {
		return
	}
	ps := make([]fpdf.PointType, 0, len(pts)/2)
	for i := 0; i+1 < len(pts); i += 2 {
		ps = append(ps, fpdf.PointType{X: pts[i], Y: pts[i+1]})
	}
	d.f.SetFillColor(int(c.R), int(c.G), int(c.B))
	d.f.Polygon(ps, "F")
	d.f.SetTextColor(int(d.text.R), int(d.text.G), int(d.text.B))
}

// Rotated returns the corners of a regular n-gon of radius r centred on
// x, y, starting at angle a0 (radians), as x, y pairs; for legend glyphs.
func Rotated(x, y, r float64, n int, a0 float64) []float64 {
	out := make([]float64, 0, 2*n)
	for i := 0; i < n; i++ {
		a := a0 + 2*math.Pi*float64(i)/float64(n)
		out = append(out, x+r*math.Cos(a), y-r*math.Sin(a))
	}
	return out
}
