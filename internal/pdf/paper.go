package pdf

import (
	"fmt"
	"strings"
)

// Paper is a page size in millimetres, portrait.
type Paper struct {
	Name          string
	Width, Height float64
}

// Page sizes. A4 is 210 x 297 mm by ISO 216; US Letter is 8.5 x 11 in by
// ANSI/ASME Y14.1, that is 215.9 x 279.4 mm at 25.4 mm to the inch.
var (
	A4     = Paper{Name: "a4", Width: 210, Height: 297}
	Letter = Paper{Name: "letter", Width: 8.5 * 25.4, Height: 11 * 25.4}
)

// PaperByName returns the paper a brief's theme.paper names ("" is A4).
func PaperByName(name string) (Paper, error) {
	switch strings.ToLower(name) {
	case "", "a4":
		return A4, nil
	case "letter":
		return Letter, nil
	}
	return Paper{}, fmt.Errorf("paper %q is not available; use a4 or letter", name)
}

// Margins of a page in millimetres.
type Margins struct {
	Top, Bottom, Left, Right float64
}

// DefaultMargins are 20 mm at the sides and 22 mm top and bottom, room for
// the running header and footer (common practice, no source).
var DefaultMargins = Margins{Top: 22, Bottom: 22, Left: 20, Right: 20}
