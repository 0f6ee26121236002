package charts

import "image/color"

// Theme is the look shared by every chart of a pack.
type Theme struct {
	// Serif selects Liberation Serif instead of Liberation Sans.
	Serif bool
	// Accent is the house colour for titles and rules.
	Accent color.Color
}
