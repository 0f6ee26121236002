package charts

import (
	"image/color"

	xfont "golang.org/x/image/font"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Theme is the look shared by every chart of a pack.
type Theme struct {
	// Serif selects Liberation Serif instead of Liberation Sans.
	Serif bool
	// Accent is the house colour for titles and rules. Charts do not use
	// it for data: data colours come from the colour-blind safe palette so
	// that a house colour cannot collide with the focus colour.
	Accent color.Color
}

// The colour-blind safe palette of Okabe and Ito (2008), "Color Universal
// Design (CUD): how to make figures and presentations that are friendly to
// colorblind people", https://jfly.uni-koeln.de/color/. Yellow is kept out
// of lines and marks because it is too light on white paper.
var (
	PaletteBlack         = color.RGBA{0x00, 0x00, 0x00, 0xff}
	PaletteOrange        = color.RGBA{0xe6, 0x9f, 0x00, 0xff}
	PaletteSkyBlue       = color.RGBA{0x56, 0xb4, 0xe9, 0xff}
	PaletteBluishGreen   = color.RGBA{0x00, 0x9e, 0x73, 0xff}
	PaletteYellow        = color.RGBA{0xf0, 0xe4, 0x42, 0xff}
	PaletteBlue          = color.RGBA{0x00, 0x72, 0xb2, 0xff}
	PaletteVermillion    = color.RGBA{0xd5, 0x5e, 0x00, 0xff}
	PaletteReddishPurple = color.RGBA{0xcc, 0x79, 0xa7, 0xff}
)

// FocusColour is reserved for the focus institution in every chart.
var FocusColour = PaletteVermillion

// Neutral greys for furniture (grid, boxes, other institutions).
var (
	greyText   = color.Gray{0x33}
	greyAxis   = color.Gray{0x55}
	greyMark   = color.Gray{0x80}
	greyGrid   = color.Gray{0xdd}
	greyFill   = color.Gray{0xe8}
	greyBand   = color.Gray{0xf2}
	whiteColor = color.White
)

// groupColours are the series colours in group order; the focus colour is
// not among them.
var groupColours = []color.Color{PaletteBlue, PaletteOrange, PaletteBluishGreen, PaletteReddishPurple, PaletteSkyBlue, PaletteBlack}

// groupShapes and groupDashes make series differ in greyscale print too.
var groupShapes = []Shape{ShapeCircle, ShapeSquare, ShapeTriangle, ShapeTriangleDown, ShapeCross, ShapePlus}

var groupDashes = [][]vg.Length{
	{vg.Points(5), vg.Points(2)},
	{vg.Points(1), vg.Points(1.5)},
	{vg.Points(6), vg.Points(2), vg.Points(1), vg.Points(2)},
	{vg.Points(2.5), vg.Points(2)},
	{vg.Points(9), vg.Points(3)},
	nil,
}

// Type sizes in points. Labels stay at 8 pt or more so a chart reduced to
// half a page width still reads in print (common practice, no source).
const (
	sizeTick   = 8
	sizeLabel  = 8
	sizeAxis   = 8.5
	sizeLegend = 8
)

// Series is how one comparison group is drawn: colour, marker shape and
// line dash, cycling together so that no two groups share all three.
type Series struct {
	Colour color.Color
	Shape  Shape
	Dashes []vg.Length
}

// GroupSeries returns the style of the i-th group of a chart.
func GroupSeries(i int) Series {
	if i < 0 {
		i = 0
	}
	return Series{
		Colour: groupColours[i%len(groupColours)],
		Shape:  groupShapes[i%len(groupShapes)],
		Dashes: groupDashes[i%len(groupDashes)],
	}
}

// FocusMarker is the focus institution's mark, the same in every chart: a
// vermillion diamond with a black outline.
func FocusMarker() Marker {
	return Marker{Shape: ShapeDiamond, Fill: FocusColour, Stroke: PaletteBlack, Radius: vg.Points(4.2), Width: vg.Points(0.9)}
}

// NamedMarker marks a chosen institution: a white circle with a black
// outline, so it reads the same in colour and in grey.
func NamedMarker() Marker {
	return Marker{Shape: ShapeCircle, Fill: whiteColor, Stroke: PaletteBlack, Radius: vg.Points(3), Width: vg.Points(0.8)}
}

// OutlierMarker marks an observation beyond the whiskers.
func OutlierMarker() Marker {
	return Marker{Shape: ShapeCircle, Stroke: greyAxis, Radius: vg.Points(1.6), Width: vg.Points(0.5)}
}

// font returns the theme's font at a size, bold or regular.
func (th Theme) font(size float64, bold bool) font.Font {
	f := font.Font{Typeface: "Liberation", Variant: "Sans", Size: vg.Points(size)}
	if th.Serif {
		f.Variant = "Serif"
	}
	if bold {
		f.Weight = xfont.WeightBold
	}
	return f
}

// text returns a text style in the theme's font.
func (th Theme) text(size float64, bold bool, c color.Color) text.Style {
	return text.Style{
		Color:   c,
		Font:    th.font(size, bold),
		XAlign:  draw.XLeft,
		YAlign:  draw.YBottom,
		Handler: chartText,
	}
}

func (th Theme) labelStyle() text.Style      { return th.text(sizeLabel, false, greyText) }
func (th Theme) focusLabelStyle() text.Style { return th.text(sizeLabel, true, PaletteBlack) }
func (th Theme) tickStyle() text.Style       { return th.text(sizeTick, false, greyText) }
func (th Theme) axisStyle() text.Style       { return th.text(sizeAxis, false, PaletteBlack) }
func (th Theme) legendStyle() text.Style     { return th.text(sizeLegend, false, PaletteBlack) }
