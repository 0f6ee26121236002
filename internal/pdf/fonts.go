package pdf

import (
	"codeberg.org/go-fonts/liberation/liberationmonobold"
	"codeberg.org/go-fonts/liberation/liberationmonoregular"
	"codeberg.org/go-fonts/liberation/liberationsansbold"
	"codeberg.org/go-fonts/liberation/liberationsansbolditalic"
	"codeberg.org/go-fonts/liberation/liberationsansitalic"
	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"codeberg.org/go-fonts/liberation/liberationserifbold"
	"codeberg.org/go-fonts/liberation/liberationserifbolditalic"
	"codeberg.org/go-fonts/liberation/liberationserifitalic"
	"codeberg.org/go-fonts/liberation/liberationserifregular"
)

// Family is one of the document's typeface families. All are Liberation
// fonts (SIL Open Font License), metric-compatible with the common office
// faces, and the same files gonum/plot measures chart text with, so chart
// labels and body text share one family and one set of widths.
type Family string

// The families a pack uses.
const (
	Sans  Family = "sans"
	Serif Family = "serif"
	Mono  Family = "mono"
)

// Style is a font style: "" (regular), "B", "I" or "BI", as fpdf spells
// them.
type Style string

// The four styles.
const (
	Regular    Style = ""
	Bold       Style = "B"
	Italic     Style = "I"
	BoldItalic Style = "BI"
)

// Font names one face at one size in points.
type Font struct {
	Family Family
	Style  Style
	Size   float64
}

// fontBytes returns the TrueType file of a face. Mono has no italic faces
// registered: code is set upright, so italic maps to regular.
func fontBytes(f Family, s Style) []byte {
	switch f {
	case Serif:
		switch s {
		case Bold:
			return liberationserifbold.TTF
		case Italic:
			return liberationserifitalic.TTF
		case BoldItalic:
			return liberationserifbolditalic.TTF
		}
		return liberationserifregular.TTF
	case Mono:
		if s == Bold || s == BoldItalic {
			return liberationmonobold.TTF
		}
		return liberationmonoregular.TTF
	}
	switch s {
	case Bold:
		return liberationsansbold.TTF
	case Italic:
		return liberationsansitalic.TTF
	case BoldItalic:
		return liberationsansbolditalic.TTF
	}
	return liberationsansregular.TTF
}

// normalise maps a requested face to one that is registered.
func normalise(f Font) Font {
	switch f.Family {
	case Sans, Serif, Mono:
	default:
		f.Family = Sans
	}
	switch f.Style {
	case Regular, Bold, Italic, BoldItalic:
	default:
		f.Style = Regular
	}
	if f.Family == Mono {
		if f.Style == BoldItalic {
			f.Style = Bold
		} else if f.Style == Italic {
			f.Style = Regular
		}
	}
	if f.Size <= 0 {
		f.Size = 10
	}
	return f
}
