package charts

import (
	"image/color"
	"math"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Shape is a marker outline. Filled shapes with a dark outline keep their
// edge in greyscale print; the cross and plus have no fill at all.
type Shape int

// The marker shapes, in the order groups take them.
const (
	ShapeCircle Shape = iota
	ShapeSquare
	ShapeTriangle
	ShapeTriangleDown
	ShapeCross
	ShapePlus
	ShapeDiamond
)

// Marker is a drawable point mark: a shape filled with Fill (nil: hollow)
// and outlined with Stroke (nil: no outline) of Width.
type Marker struct {
	Shape  Shape
	Fill   color.Color
	Stroke color.Color
	Radius vg.Length
	Width  vg.Length
}

// path returns the marker's outline around pt.
func (mk Marker) path(pt vg.Point) vg.Path {
	r := mk.Radius
	// Room for the longest outline (a move, four lines and a close) up
	// front: a scatter draws one mark per institution, and growing each
	// path step by step was a tenth of a world-sized pack's drawing time.
	p := make(vg.Path, 0, 6)
	poly := func(pts ...vg.Point) {
		for i, q := range pts {
			if i == 0 {
				p.Move(q)
			} else {
				p.Line(q)
			}
		}
		p.Close()
	}
	switch mk.Shape {
	case ShapeSquare:
		s := r * 0.85
		poly(vg.Point{X: pt.X - s, Y: pt.Y - s}, vg.Point{X: pt.X + s, Y: pt.Y - s}, vg.Point{X: pt.X + s, Y: pt.Y + s}, vg.Point{X: pt.X - s, Y: pt.Y + s})
	case ShapeTriangle, ShapeTriangleDown:
		// An equilateral triangle of circumradius r, pointing up or down.
		d := vg.Length(1)
		if mk.Shape == ShapeTriangleDown {
			d = -1
		}
		h := r * vg.Length(math.Sqrt(3)/2)
		poly(vg.Point{X: pt.X, Y: pt.Y + d*r}, vg.Point{X: pt.X + h, Y: pt.Y - d*r/2}, vg.Point{X: pt.X - h, Y: pt.Y - d*r/2})
	case ShapeDiamond:
		poly(vg.Point{X: pt.X, Y: pt.Y + r*1.15}, vg.Point{X: pt.X + r, Y: pt.Y}, vg.Point{X: pt.X, Y: pt.Y - r*1.15}, vg.Point{X: pt.X - r, Y: pt.Y})
	case ShapeCross:
		s := r * 0.8
		p.Move(vg.Point{X: pt.X - s, Y: pt.Y - s})
		p.Line(vg.Point{X: pt.X + s, Y: pt.Y + s})
		p.Move(vg.Point{X: pt.X - s, Y: pt.Y + s})
		p.Line(vg.Point{X: pt.X + s, Y: pt.Y - s})
	case ShapePlus:
		p.Move(vg.Point{X: pt.X - r, Y: pt.Y})
		p.Line(vg.Point{X: pt.X + r, Y: pt.Y})
		p.Move(vg.Point{X: pt.X, Y: pt.Y - r})
		p.Line(vg.Point{X: pt.X, Y: pt.Y + r})
	default:
		p.Move(vg.Point{X: pt.X + r, Y: pt.Y})
		p.Arc(pt, r, 0, 2*math.Pi)
		p.Close()
	}
	return p
}

// lineOnly reports whether the shape is drawn as strokes only.
func (mk Marker) lineOnly() bool { return mk.Shape == ShapeCross || mk.Shape == ShapePlus }

// Draw draws the marker centred on pt, unclipped so a mark on the edge of
// the data area stays whole.
func (mk Marker) Draw(c *draw.Canvas, pt vg.Point) {
	p := mk.path(pt)
	if mk.Fill != nil && !mk.lineOnly() {
		c.SetColor(mk.Fill)
		c.Fill(p)
	}
	st := mk.Stroke
	if mk.lineOnly() && st == nil {
		st = mk.Fill
	}
	if st != nil {
		c.SetLineStyle(draw.LineStyle{Color: st, Width: mk.Width})
		c.Stroke(p)
	}
}

// Rect is the marker's bounding rectangle around pt.
func (mk Marker) Rect(pt vg.Point) vg.Rectangle {
	r := mk.Radius * 1.15
	return vg.Rectangle{Min: vg.Point{X: pt.X - r, Y: pt.Y - r}, Max: vg.Point{X: pt.X + r, Y: pt.Y + r}}
}

// seriesMarker is the point mark of a group series: the group's shape in
// its colour with a thin darker edge.
func seriesMarker(s Series, radius vg.Length) Marker {
	return Marker{Shape: s.Shape, Fill: s.Colour, Stroke: s.Colour, Radius: radius, Width: vg.Points(0.6)}
}
