// Package charts draws peerpack's chart kinds (box, radar, trend, scatter,
// heatmap, bars) with gonum/plot from the figures model. A chart draws; it
// never decides what a quartile is: every statistic comes precomputed from
// the model.
package charts

import (
	"fmt"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/brief"
	"peerpack/internal/figures"
)

// Chart is a planned chart, ready to draw at any width.
type Chart interface {
	// Height is the height the chart wants at the given width.
	Height(width vg.Length) vg.Length
	// Draw draws the chart filling the canvas.
	Draw(c draw.Canvas) error
}

// New plans the chart a block asks for.
func New(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	return nil, fmt.Errorf("chart kind %q is not drawn yet", spec.Type)
}
