// Package charts draws peerpack's chart kinds (box, radar, trend, scatter, esteem,
// vote-profile, heatmap, bars) with gonum/plot from the figures model. A chart draws; it
// never decides what a quartile is: every statistic comes precomputed from
// the model, and each kind's plotter takes plain structs (BoxRow,
// RadarSeries, ...) so it can be drawn and tested without a model.
package charts

import (
	"fmt"
	"sort"
	"strings"

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

// planner maps the figures model and a chart block to a Chart.
type planner func(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error)

// kinds registers the planner of every chart kind; adding a kind is one
// file with its plotter and planner and one line here.
var kinds = map[string]planner{
	"box":     newBox,
	"radar":   newRadar,
	"trend":   newTrend,
	"scatter": newScatter,
	"heatmap": newHeatmap,
	"bars":    newBars,
	"esteem":  newEsteem,
	// vote-profile: one institution's esteem per field, from votes.
	"vote-profile": newVoteProfile,
}

// New plans the chart a block asks for. Errors are *diag.Problem values
// positioned at the block, with the file left for the caller to set.
func New(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	if m == nil || spec == nil {
		return nil, fmt.Errorf("internal error: a chart needs the figures model and its block")
	}
	plan, ok := kinds[spec.Type]
	if !ok {
		names := make([]string, 0, len(kinds))
		for k := range kinds {
			names = append(names, k)
		}
		sort.Strings(names)
		return nil, specError(spec, "kind %q is not drawn; use one of %s", spec.Type, strings.Join(names, ", "))
	}
	return plan(m, spec, th)
}
