package charts

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/recorder"

	"peerpack/internal/brief"
	"peerpack/internal/diag"
	"peerpack/internal/format"
)

// axisMap recovers the value-to-x mapping of a horizontal value axis from
// the recorded tick labels: each label is centred on its tick.
func axisMap(t *testing.T, acts []recorder.Action, th Theme) func(float64) vg.Length {
	t.Helper()
	type tick struct {
		v float64
		x vg.Length
	}
	byY := map[vg.Length][]tick{}
	sty := th.tickStyle()
	for _, a := range acts {
		fs, ok := a.(*recorder.FillString)
		if !ok || fs.Font.Weight != sty.Font.Weight || fs.Size != sty.Font.Size {
			continue
		}
		v, err := strconv.ParseFloat(strings.ReplaceAll(strings.ReplaceAll(fs.String, ",", ""), "−", "-"), 64)
		if err != nil {
			continue
		}
		byY[fs.Point.Y] = append(byY[fs.Point.Y], tick{v, fs.Point.X + sty.Width(fs.String)/2})
	}
	var ticks []tick
	for _, ts := range byY {
		if len(ts) > len(ticks) {
			ticks = ts
		}
	}
	if len(ticks) < 2 {
		t.Fatalf("found %d value-axis tick labels, need 2", len(ticks))
	}
	a, b := ticks[0], ticks[len(ticks)-1]
	return func(v float64) vg.Length { return a.x + (b.x-a.x)*vg.Length((v-a.v)/(b.v-a.v)) }
}

// TestBoxDrawsModelNumbers checks that the first row's box runs from the
// model's Q1 to its Q3 with the median bar at its median, and that the
// focus diamond sits at the focus's value, by reading coordinates from
// the recorded drawing.
func TestBoxDrawsModelNumbers(t *testing.T) {
	m, b := buildModel(t, 60, goldenBody)
	spec := chartBlocks(b)[0]
	if spec.Type != "box" || spec.Orientation != "" {
		t.Fatalf("first fixture block is %s %s, want a horizontal box", spec.Type, spec.Orientation)
	}
	th := Theme{}
	ch, err := New(m, spec, th)
	if err != nil {
		t.Fatal(err)
	}
	acts := record(t, ch, fullWidth).Actions
	x := axisMap(t, acts, th)
	d, ok := m.Distribution("Kestria national", "fnci", m.Year)
	if !ok {
		t.Fatal("no distribution in the model")
	}
	// The first grey-filled rectangle is the first row's box; the first
	// 2 pt black stroke after it is its median bar.
	var boxRect vg.Rectangle
	var medianX vg.Length = -1
	var focusX vg.Length = -1
	var colour string
	var width vg.Length
	found := false
	for _, a := range acts {
		switch a := a.(type) {
		case *recorder.SetColor:
			colour = hexColour(a.Color)
		case *recorder.SetLineWidth:
			width = a.Width
		case *recorder.Fill:
			if colour == hexColour(greyFill) && !found {
				boxRect = pathBounds(a.Path)
				found = true
			}
			if colour == hexColour(FocusColour) && found && focusX < 0 {
				r := pathBounds(a.Path)
				focusX = (r.Min.X + r.Max.X) / 2
			}
		case *recorder.Stroke:
			if found && medianX < 0 && colour == hexColour(PaletteBlack) && width == vg.Points(2) {
				medianX = pathBounds(a.Path).Min.X
			}
		}
	}
	if !found || medianX < 0 || focusX < 0 {
		t.Fatalf("box %v, median %v, focus %v not all found in the drawing", found, medianX, focusX)
	}
	pos, _ := m.Position("Kestria national", "fnci", m.Focus, m.Year)
	const tol = 0.05 // points; tick labels are placed to font metrics
	for _, c := range []struct {
		what      string
		got, want vg.Length
	}{
		{"Q1 (box left edge)", boxRect.Min.X, x(d.Q1)},
		{"Q3 (box right edge)", boxRect.Max.X, x(d.Q3)},
		{"median bar", medianX, x(d.Median)},
		{"focus diamond", focusX, x(pos.Value)},
	} {
		if math.Abs(float64(c.got-c.want)) > tol {
			t.Errorf("%s at x = %.2f pt, want %.2f pt (model value)", c.what, c.got, c.want)
		}
	}
	// The focus's value label prints the same digits as a table would.
	want := format.Value(fixtureIndicators[0], pos.Value)
	if !hasText(acts, want) {
		t.Errorf("focus value label %q not drawn", want)
	}
}

func pathBounds(p vg.Path) vg.Rectangle {
	r := vg.Rectangle{Min: vg.Point{X: vg.Length(math.Inf(1)), Y: vg.Length(math.Inf(1))}, Max: vg.Point{X: vg.Length(math.Inf(-1)), Y: vg.Length(math.Inf(-1))}}
	for _, c := range p {
		if c.Type == vg.CloseComp {
			continue
		}
		r.Min.X, r.Min.Y = min(r.Min.X, c.Pos.X), min(r.Min.Y, c.Pos.Y)
		r.Max.X, r.Max.Y = max(r.Max.X, c.Pos.X), max(r.Max.Y, c.Pos.Y)
	}
	return r
}

func hasText(acts []recorder.Action, s string) bool {
	for _, a := range acts {
		if fs, ok := a.(*recorder.FillString); ok && fs.String == s {
			return true
		}
	}
	return false
}

// TestLegendNamesFocusAndDiacritics: every chart names the focus in its
// legend or labels, with its diacritics intact.
func TestLegendNamesFocusAndDiacritics(t *testing.T) {
	m, b := buildModel(t, 60, goldenBody)
	for _, spec := range chartBlocks(b) {
		ch, err := New(m, spec, Theme{})
		if err != nil {
			t.Fatal(err)
		}
		acts := record(t, ch, fullWidth).Actions
		found := false
		for _, a := range acts {
			if fs, ok := a.(*recorder.FillString); ok && strings.Contains(fs.String, "Høgskolen i Vårdø") {
				found = true
			}
		}
		if !found {
			t.Errorf("%s: focus name not drawn", blockName(spec))
		}
	}
}

// TestBlockErrors: a wrong block gives a positioned message that says what
// to do.
func TestBlockErrors(t *testing.T) {
	m, _ := buildModel(t, 60, "")
	for _, c := range []struct {
		spec brief.ChartBlock
		want string
	}{
		{brief.ChartBlock{Type: "pie", Indicators: []string{"fnci"}}, `kind "pie" is not drawn; use one of bars, box, esteem, heatmap, radar, scatter, trend, vote-profile`},
		{brief.ChartBlock{Type: "box", Indicators: []string{"fncii"}}, `indicator "fncii" is not in the dictionary (did you mean "fnci"?)`},
		{brief.ChartBlock{Type: "box", Indicators: []string{"fnci"}, Groups: []string{"Kestria nationl"}}, `group "Kestria nationl" is not defined in the brief (did you mean "Kestria national"?)`},
		{brief.ChartBlock{Type: "scatter", Indicators: []string{"fnci"}}, "a scatter takes exactly two indicators, x then y; found 1"},
		{brief.ChartBlock{Type: "radar", Indicators: []string{"fnci", "ssr"}}, "a radar needs at least three indicators; found 2"},
		{brief.ChartBlock{Type: "radar", Indicators: []string{"fnci", "ssr", "income"}, Scale: "log"}, `scale "log": use percentile, range or common`},
		{brief.ChartBlock{Type: "box", Indicators: []string{"fnci"}, Label: []string{"XX999"}}, `label "XX999" is neither a register id nor an institution name`},
		{brief.ChartBlock{Type: "vote-profile", Indicators: []string{"peer_esteem_natural", "fnci", "peer_esteem_social"}}, "fnci is not a field's esteem from survey votes; a vote profile draws one spoke per field"},
		{brief.ChartBlock{Type: "vote-profile", Indicators: []string{"peer_esteem_natural", "peer_esteem_social"}}, "a vote profile needs the esteem of at least three fields; found 2"},
	} {
		spec := c.spec
		spec.At = brief.Pos{Line: 12, Column: 1}
		_, err := New(m, &spec, Theme{})
		if err == nil {
			t.Errorf("%+v: no error, want %q", c.spec, c.want)
			continue
		}
		var p *diag.Problem
		if !errors.As(err, &p) || p.Line != 12 || p.Column != 1 {
			t.Errorf("%v: want a diag.Problem at 12:1", err)
		}
		if !strings.Contains(err.Error(), c.want) {
			t.Errorf("error %q\n does not say %q", err, c.want)
		}
	}
}
