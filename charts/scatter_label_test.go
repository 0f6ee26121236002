package charts

import (
	"testing"

	"gonum.org/v1/plot/vg"
)

// A scatter label goes to free space when there is any within reach and
// covers points (on a halo) only when there is none (layout review: the
// focus label sat over dense points).
func TestScatterLabelsPreferFreeSpace(t *testing.T) {
	th := Theme{}
	bounds := vg.Rectangle{Max: vg.Point{X: 300, Y: 200}}
	anchor := vg.Point{X: 150, Y: 100}
	// Points everywhere within 30 pt of the anchor except a clear patch
	// to its lower left.
	var points []vg.Rectangle
	for x := vg.Length(60); x <= 240; x += 6 {
		for y := vg.Length(40); y <= 160; y += 6 {
			if x < 150 && x > 60 && y < 100 && y > 70 {
				continue
			}
			points = append(points, vg.Rectangle{Min: vg.Point{X: x - 2, Y: y - 2}, Max: vg.Point{X: x + 2, Y: y + 2}})
		}
	}
	req := []labelRequest{{Anchor: anchor, Text: "Høgskolen i Vårdø", Style: th.focusLabelStyle(), Gap: 4.2}}
	placed, dropped := placeLabelsAvoiding(req, bounds, nil, points)
	if dropped != 0 || len(placed) != 1 {
		t.Fatalf("placed %d, dropped %d", len(placed), dropped)
	}
	if placed[0].OverData || overlapsAny(placed[0].Rect, points) {
		t.Errorf("label at %v covers points though the lower left is clear", placed[0].Rect)
	}
	// With no free space at all it is still placed, marked for a halo.
	var full []vg.Rectangle
	for x := vg.Length(0); x <= 300; x += 6 {
		for y := vg.Length(0); y <= 200; y += 6 {
			full = append(full, vg.Rectangle{Min: vg.Point{X: x - 2, Y: y - 2}, Max: vg.Point{X: x + 2, Y: y + 2}})
		}
	}
	placed, _ = placeLabelsAvoiding(req, bounds, nil, full)
	if len(placed) != 1 || !placed[0].OverData {
		t.Errorf("in a full field: placed %d, over data %v; want one label on a halo", len(placed), len(placed) == 1 && placed[0].OverData)
	}
}
