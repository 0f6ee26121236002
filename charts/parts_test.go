package charts

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/font/liberation"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/recorder"

	"peerpack/internal/dataset"
	"peerpack/internal/stats"
)

func TestNiceStep(t *testing.T) {
	// Heckbert (1990), "Nice numbers for graph labels", Graphics Gems:
	// steps are 1, 2 or 5 times a power of ten (values from memory of the
	// method, checked by hand).
	for _, c := range []struct {
		lo, hi, want float64
	}{
		{0, 1, 0.2},  // raw 0.25 -> 2 x 0.1
		{0, 100, 20}, // raw 25 -> 2 x 10
		{0.42, 1.87, 0.5},
		{12000, 260000, 50000},
		{0, 7, 2},
	} {
		if got := niceStep(c.lo, c.hi, 5); math.Abs(got-c.want) > 1e-12 {
			t.Errorf("niceStep(%g, %g) = %g, want %g", c.lo, c.hi, got, c.want)
		}
	}
	ts := valueTicks{}.Ticks(12000, 260000)
	var labels []string
	for _, tk := range ts {
		labels = append(labels, tk.Label)
	}
	if got := strings.Join(labels, " "); got != "50,000 100,000 150,000 200,000 250,000" {
		t.Errorf("tick labels %q, want thousands separators", got)
	}
	ts = valueTicks{}.Ticks(-0.3, 0.3)
	if ts[0].Label != "−0.2" || ts[2].Label != "0.0" {
		t.Errorf("negative ticks %q, %q; want a true minus sign and one decimal", ts[0].Label, ts[2].Label)
	}
}

func TestQuartileShadesDarkenTowardsTheBest(t *testing.T) {
	// Lightness must fall from the bottom quarter to the top so the order
	// survives greyscale print (common practice, no source); luma by
	// ITU-R BT.601 weights (from memory: 0.299, 0.587, 0.114).
	luma := func(q int) float64 {
		r, g, b, _ := QuartileShade(q).RGBA()
		return 0.299*float64(r) + 0.587*float64(g) + 0.114*float64(b)
	}
	for q := 1; q < 4; q++ {
		if !(luma(q) < luma(q+1)) {
			t.Errorf("quarter %d is not darker than quarter %d", q, q+1)
		}
	}
	if luma(4) >= luma(0) {
		t.Error("the bottom quarter is as light as an unshaded cell")
	}
}

func TestFitName(t *testing.T) {
	th := Theme{}
	sty := th.labelStyle()
	long := dataset.Institution{Name: "Ostmark College of Applied Sciences and Maritime Studies", Attrs: map[string]string{"short_name": "Ostmark College"}}
	if got := fitName(long, sty, vg.Points(300)); got != long.Name {
		t.Errorf("wide: %q, want the full name", got)
	}
	if got := fitName(long, sty, vg.Points(100)); got != "Ostmark College" {
		t.Errorf("narrow: %q, want the register short name", got)
	}
	plain := dataset.Institution{Name: "Politechnika Źródłowa w Vårdø"}
	got := fitName(plain, sty, vg.Points(80))
	if !strings.HasSuffix(got, "…") || sty.Width(got) > vg.Points(80) || !strings.HasPrefix(plain.Name, strings.TrimSuffix(got, "…")) {
		t.Errorf("no short name: %q, want a prefix ending in an ellipsis within 80 pt", got)
	}
	// Shortening cuts at characters, never inside a multi-byte letter.
	for w := vg.Points(10); w < vg.Points(120); w += 3 {
		s := fitText("Źródłowa Éluard Høgskolen", sty, w)
		if !strings.Contains("Źródłowa Éluard Høgskolen…", strings.TrimSuffix(s, "…")) {
			t.Fatalf("width %v: %q is not a prefix", w, s)
		}
	}
}

func TestPlaceLabelsNeverOverlap(t *testing.T) {
	th := Theme{}
	bounds := vg.Rectangle{Max: vg.Point{X: 300, Y: 200}}
	var reqs []labelRequest
	// Forty labels crowded round a few anchors (common practice, no
	// source: the placement must drop or move, never overlap).
	for i := 0; i < 40; i++ {
		reqs = append(reqs, labelRequest{Anchor: vg.Point{X: vg.Length(100 + (i%5)*8), Y: vg.Length(100 + (i%3)*6)}, Text: "Université de Saint-Éluard", Style: th.labelStyle(), Gap: 3, Priority: i % 2})
	}
	obstacle := vg.Rectangle{Min: vg.Point{X: 90, Y: 90}, Max: vg.Point{X: 150, Y: 120}}
	line := []vg.Point{{X: 0, Y: 60}, {X: 300, Y: 60}}
	placed, dropped := placeLabels(reqs, bounds, []vg.Rectangle{obstacle}, line)
	if len(placed)+dropped != len(reqs) || len(placed) == 0 || dropped == 0 {
		t.Fatalf("placed %d, dropped %d of %d", len(placed), dropped, len(reqs))
	}
	for i, a := range placed {
		if !inside(a.Rect, bounds) || overlaps(a.Rect, obstacle) || crossesAny(a.Rect, [][]vg.Point{line}) {
			t.Errorf("label %d at %v leaves the bounds, covers the obstacle or crosses the line", i, a.Rect)
		}
		for j := i + 1; j < len(placed); j++ {
			if overlaps(a.Rect, placed[j].Rect) {
				t.Errorf("labels %d and %d overlap", i, j)
			}
		}
	}
	// The first-priority label gets its first choice (right of the anchor
	// is blocked by the obstacle, so it moves out with a leader).
	if placed[0].Priority != 0 {
		t.Errorf("first placed label has priority %d, want 0", placed[0].Priority)
	}
}

func TestSegmentHitsRect(t *testing.T) {
	r := vg.Rectangle{Min: vg.Point{X: 0, Y: 0}, Max: vg.Point{X: 10, Y: 10}}
	for _, c := range []struct {
		a, b vg.Point
		want bool
	}{
		{vg.Point{X: -5, Y: 5}, vg.Point{X: 15, Y: 5}, true},   // straight through
		{vg.Point{X: -5, Y: -5}, vg.Point{X: 15, Y: 15}, true}, // diagonal
		{vg.Point{X: -5, Y: 12}, vg.Point{X: 15, Y: 12}, false},
		{vg.Point{X: 12, Y: -5}, vg.Point{X: 30, Y: 5}, false},
		{vg.Point{X: 2, Y: 2}, vg.Point{X: 3, Y: 3}, true}, // inside
		{vg.Point{X: -10, Y: 5}, vg.Point{X: 5, Y: 30}, false},
	} {
		if got := segmentHitsRect(c.a, c.b, r); got != c.want {
			t.Errorf("segment %v-%v: %v, want %v", c.a, c.b, got, c.want)
		}
	}
}

func TestSerifTheme(t *testing.T) {
	m, b := buildModel(t, 60, goldenBody)
	ch, err := New(m, chartBlocks(b)[0], Theme{Serif: true})
	if err != nil {
		t.Fatal(err)
	}
	for _, a := range record(t, ch, fullWidth).Actions {
		if fs, ok := a.(interface{ Call() string }); ok && strings.Contains(fs.Call(), "LiberationSans") {
			t.Fatalf("serif theme drew %s", fs.Call())
		}
	}
}

// TestAnyWidthDrawsWithoutPanic draws every fixture chart from the narrow
// to the very wide: a chart may look cramped, but must never panic or
// fail at a width a layout could ask for.
func TestAnyWidthDrawsWithoutPanic(t *testing.T) {
	m, b := buildModel(t, 60, goldenBody)
	for _, spec := range chartBlocks(b) {
		for _, w := range []vg.Length{120, 200, 300, 481.89, 800} {
			ch, err := New(m, spec, Theme{})
			if err != nil {
				t.Fatal(err)
			}
			if h := ch.Height(w); h <= 0 || math.IsNaN(float64(h)) {
				t.Errorf("%s at %v pt: height %v", blockName(spec), w, h)
			}
			record(t, ch, w)
		}
	}
}

func TestBoxEmptyRowSaysNoValues(t *testing.T) {
	rows := fxBoxRows(fxFNCI, 1, 1.137)
	rows = append(rows, BoxRow{Label: "Empty group", Box: stats.BoxOf(nil, stats.Type7), Focus: math.NaN()})
	bc := &BoxChart{FocusName: "Høgskolen i Vårdø", Panels: []BoxPanel{{Indicator: fxFNCI, Rows: rows}}}
	if !hasText(record(t, bc, fullWidth).Actions, "no values") {
		t.Error("an empty group's row does not say it has no values")
	}
}

// TestNoOverlappingText reads every upright string a fixture chart draws
// back from the recording and checks that no two ink boxes overlap
// (common practice, no source: overlapping labels are unreadable).
func TestNoOverlappingText(t *testing.T) {
	m, b := buildModel(t, 60, goldenBody)
	cache := font.NewCache(liberation.Collection())
	all := fixtureCharts()
	for _, spec := range chartBlocks(b) {
		ch, err := New(m, spec, Theme{})
		if err != nil {
			t.Fatal(err)
		}
		all = append(all, fixtureChart{"model " + blockName(spec), ch})
	}
	for _, fx := range all {
		for _, w := range []vg.Length{fullWidth, halfWidth} {
			ch := fx.chart
			type box struct {
				s string
				r vg.Rectangle
			}
			var boxes []box
			depth, rotated := 0, map[int]bool{}
			for _, a := range record(t, ch, w).Actions {
				switch a := a.(type) {
				case *recorder.Push:
					depth++
				case *recorder.Pop:
					delete(rotated, depth)
					depth--
				case *recorder.Rotate:
					rotated[depth] = true
				case *recorder.FillString:
					if len(rotated) > 0 {
						continue
					}
					face := cache.Lookup(a.Font, a.Size)
					e := face.Extents()
					r := vg.Rectangle{Min: vg.Point{X: a.Point.X, Y: a.Point.Y - e.Descent}, Max: vg.Point{X: a.Point.X + face.Width(a.String), Y: a.Point.Y + e.Ascent}}
					// Shrink by half a point: glyph boxes of adjacent
					// lines may touch without ink overlapping.
					r.Min.X, r.Min.Y, r.Max.X, r.Max.Y = r.Min.X+0.5, r.Min.Y+0.5, r.Max.X-0.5, r.Max.Y-0.5
					boxes = append(boxes, box{a.String, r})
				}
			}
			for i := range boxes {
				for j := i + 1; j < len(boxes); j++ {
					if overlaps(boxes[i].r, boxes[j].r) {
						t.Errorf("%s at %.0f pt: %q and %q overlap", fx.name, float64(w), boxes[i].s, boxes[j].s)
					}
				}
			}
		}
	}
}
