package layout

import (
	"image/color"
	"strconv"

	"peerpack/charts"
	"peerpack/internal/pdf"
)

// style is the pack's typography: one body family (the theme's sans or
// serif), a modular scale of sizes and a grey ramp. Sizes follow common
// practice for printed reports: 10 pt body at 1.4 leading, headings at
// 18/13.5/11 pt (common practice, no source).
type style struct {
	body    pdf.Family
	accent  color.RGBA
	text    color.RGBA
	muted   color.RGBA
	rule    color.RGBA
	tint    color.RGBA // light accent for table heads and boxes
	shades  [5]color.RGBA
	size    float64 // body size, pt
	leading float64 // line height / size
}

func newStyle(font, accent string) style {
	s := style{
		body:    pdf.Sans,
		accent:  color.RGBA{0x1f, 0x4e, 0x79, 0xff},
		text:    color.RGBA{0x1a, 0x1a, 0x1a, 0xff},
		muted:   color.RGBA{0x55, 0x55, 0x55, 0xff},
		rule:    color.RGBA{0xb0, 0xb0, 0xb0, 0xff},
		size:    10,
		leading: 1.4,
	}
	if font == "serif" {
		s.body = pdf.Serif
	}
	if c, ok := parseHex(accent); ok {
		s.accent = c
	}
	s.tint = mix(s.accent, white, 0.88)
	// Quartile shades come from the charts' one definition, so a table
	// cell and a heatmap cell of the same quarter look alike.
	for q := range s.shades {
		s.shades[q] = rgba(charts.QuartileShade(q))
	}
	return s
}

var white = color.RGBA{0xff, 0xff, 0xff, 0xff}

// rgba converts any colour to opaque 8-bit RGBA.
func rgba(c color.Color) color.RGBA {
	r, g, b, _ := c.RGBA()
	return color.RGBA{uint8(r >> 8), uint8(g >> 8), uint8(b >> 8), 0xff}
}

func mix(a, b color.RGBA, t float64) color.RGBA {
	f := func(x, y uint8) uint8 { return uint8(float64(x)*(1-t) + float64(y)*t + 0.5) }
	return color.RGBA{f(a.R, b.R), f(a.G, b.G), f(a.B, b.B), 0xff}
}

func parseHex(s string) (color.RGBA, bool) {
	if len(s) != 7 || s[0] != '#' {
		return color.RGBA{}, false
	}
	v, err := strconv.ParseUint(s[1:], 16, 32)
	if err != nil {
		return color.RGBA{}, false
	}
	return color.RGBA{uint8(v >> 16), uint8(v >> 8), uint8(v), 0xff}, true
}

// font returns the body family in a style and size.
func (s style) font(st pdf.Style, size float64) pdf.Font {
	return pdf.Font{Family: s.body, Style: st, Size: size}
}

// lineHeight is the baseline-to-baseline distance for a size, in mm.
func (s style) lineHeight(size float64) float64 { return pdf.PtToMM(size * s.leading) }

// Heading sizes by level (1..3; deeper levels use 3).
func headingSize(level int) float64 {
	switch level {
	case 1:
		return 18
	case 2:
		return 13.5
	}
	return 11
}

// quartileGlyph marks a shaded cell's quarter so that tables read without
// colour: ▲ best quarter, ● second, ○ third, ▼ worst.
func quartileGlyph(q int) string {
	switch q {
	case 1:
		return "▲"
	case 2:
		return "●"
	case 3:
		return "○"
	case 4:
		return "▼"
	}
	return ""
}

// quartileWords names a quarter for the quarter column.
func quartileWords(q int) string {
	switch q {
	case 1:
		return "top quarter"
	case 2:
		return "second quarter"
	case 3:
		return "third quarter"
	case 4:
		return "bottom quarter"
	}
	return "–"
}

// tint2 is a mid accent tint for rules beside quotes.
func (s style) tint2() color.RGBA { return mix(s.accent, white, 0.55) }
