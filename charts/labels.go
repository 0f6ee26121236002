package charts

import (
	"sort"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// labelRequest asks for a text label near an anchor point (a marker of
// radius Gap around it). Lower Priority values are placed first, so the
// focus label always wins its preferred place.
type labelRequest struct {
	Anchor   vg.Point
	Text     string
	Style    text.Style
	Gap      vg.Length
	Priority int
	// Prefer lists candidate directions to try first (see labelDirs).
	Prefer []int
}

// placedLabel is a label with its final box; Leader is set when the label
// sits away from its anchor and needs a thin line back to it.
type placedLabel struct {
	labelRequest
	Rect   vg.Rectangle
	Leader bool
	// OverData is set when no place clear of the soft obstacles was
	// found, so the label covers data and needs a halo.
	OverData bool
}

// labelDirs are the candidate offsets as unit steps (dx, dy): right,
// above, left, below, then the four corners. This is the fixed-candidate
// greedy scheme of point-feature label placement (Christensen, Marks and
// Shieber 1995, "An empirical study of algorithms for point-feature label
// placement", ACM Transactions on Graphics 14(3)), without its annealing.
var labelDirs = [][2]float64{{1, 0}, {0, 1}, {-1, 0}, {0, -1}, {1, 1}, {-1, 1}, {1, -1}, {-1, -1}}

// Directions by name for labelRequest.Prefer.
const (
	dirRight = iota
	dirAbove
	dirLeft
	dirBelow
)

// placeLabels places every label it can without overlapping another label,
// an obstacle or the bounds; a label that finds no free place near its
// anchor is tried further out with a leader line, and dropped (reported in
// the second result) only when nothing fits.
//
// lines are polylines (data lines, whiskers) a label should not cross.
func placeLabels(reqs []labelRequest, bounds vg.Rectangle, obstacles []vg.Rectangle, lines ...[]vg.Point) (placed []placedLabel, dropped int) {
	return placeLabelsAvoiding(reqs, bounds, obstacles, nil, lines...)
}

// placeLabelsAvoiding is placeLabels with soft obstacles as well (the
// points of a scatter): a label first looks for a place clear of them
// too, out to the farthest ring, and only when there is none may sit
// over them (the caller then draws a halo behind it).
func placeLabelsAvoiding(reqs []labelRequest, bounds vg.Rectangle, obstacles, soft []vg.Rectangle, lines ...[]vg.Point) (placed []placedLabel, dropped int) {
	order := make([]int, len(reqs))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return reqs[order[a]].Priority < reqs[order[b]].Priority })
	taken := append([]vg.Rectangle(nil), obstacles...)
	for _, i := range order {
		r := reqs[i]
		w, h := r.Style.Width(r.Text), textHeight(r.Style)
		ok := false
		for pass, avoid := range [][]vg.Rectangle{soft, nil} {
			if pass == 0 && len(soft) == 0 {
				continue
			}
			for ring, dist := range []vg.Length{r.Gap + 1.5, r.Gap + 9, r.Gap + 18, r.Gap + 30, r.Gap + 45} {
				for _, d := range candidateDirs(r.Prefer) {
					rect := labelRect(r.Anchor, d, dist, w, h)
					if !inside(rect, bounds) || overlapsAny(rect, taken) || overlapsAny(rect, avoid) || crossesAny(rect, lines) {
						continue
					}
					placed = append(placed, placedLabel{labelRequest: r, Rect: rect, Leader: ring > 0, OverData: pass == 1 && len(soft) > 0})
					taken = append(taken, rect)
					ok = true
					break
				}
				if ok {
					break
				}
			}
			if ok {
				break
			}
		}
		if !ok {
			dropped++
		}
	}
	return placed, dropped
}

func candidateDirs(prefer []int) [][2]float64 {
	out := make([][2]float64, 0, len(labelDirs)+len(prefer))
	seen := map[int]bool{}
	for _, p := range prefer {
		if p >= 0 && p < len(labelDirs) && !seen[p] {
			out = append(out, labelDirs[p])
			seen[p] = true
		}
	}
	for i, d := range labelDirs {
		if !seen[i] {
			out = append(out, d)
		}
	}
	return out
}

// labelRect is the box of a w x h label offset from the anchor by dist in
// direction d, aligned so that the label grows away from the anchor.
func labelRect(a vg.Point, d [2]float64, dist, w, h vg.Length) vg.Rectangle {
	var x, y vg.Length
	// Corner positions hug the anchor sideways so the label still reads
	// as belonging to it.
	dx := dist
	if d[0] != 0 && d[1] != 0 {
		dx = min(dist, 2)
	}
	switch {
	case d[0] > 0:
		x = a.X + dx
	case d[0] < 0:
		x = a.X - dx - w
	default:
		x = a.X - w/2
	}
	switch {
	case d[1] > 0:
		y = a.Y + dist
	case d[1] < 0:
		y = a.Y - dist - h
	default:
		y = a.Y - h/2
	}
	return vg.Rectangle{Min: vg.Point{X: x, Y: y}, Max: vg.Point{X: x + w, Y: y + h}}
}

func inside(r, b vg.Rectangle) bool {
	return r.Min.X >= b.Min.X && r.Min.Y >= b.Min.Y && r.Max.X <= b.Max.X && r.Max.Y <= b.Max.Y
}

func overlaps(a, b vg.Rectangle) bool {
	return a.Min.X < b.Max.X && b.Min.X < a.Max.X && a.Min.Y < b.Max.Y && b.Min.Y < a.Max.Y
}

func overlapsAny(r vg.Rectangle, others []vg.Rectangle) bool {
	for _, o := range others {
		if overlaps(r, o) {
			return true
		}
	}
	return false
}

// drawLabels draws placed labels, with a leader line for distant ones.
func drawLabels(c *draw.Canvas, labels []placedLabel) {
	for _, l := range labels {
		if l.Leader {
			to := nearestPoint(l.Rect, l.Anchor)
			c.StrokeLine2(draw.LineStyle{Color: greyMark, Width: vg.Points(0.4)}, l.Anchor.X, l.Anchor.Y, to.X, to.Y)
		}
		fillTextIn(c, l.Style, l.Rect, l.Text)
	}
}

// nearestPoint is the point of r nearest p, where a leader line ends.
func nearestPoint(r vg.Rectangle, p vg.Point) vg.Point {
	clamp := func(v, lo, hi vg.Length) vg.Length { return max(lo, min(hi, v)) }
	return vg.Point{X: clamp(p.X, r.Min.X, r.Max.X), Y: clamp(p.Y, r.Min.Y, r.Max.Y)}
}

// crossesAny reports whether any polyline passes through r.
func crossesAny(r vg.Rectangle, lines [][]vg.Point) bool {
	for _, l := range lines {
		for i := 1; i < len(l); i++ {
			if segmentHitsRect(l[i-1], l[i], r) {
				return true
			}
		}
	}
	return false
}

// segmentHitsRect clips the segment a-b to r (Liang and Barsky 1984, "A
// new concept and method for line clipping", ACM Transactions on Graphics
// 3(1)) and reports whether anything is left.
func segmentHitsRect(a, b vg.Point, r vg.Rectangle) bool {
	dx, dy := float64(b.X-a.X), float64(b.Y-a.Y)
	t0, t1 := 0.0, 1.0
	clip := func(p, q float64) bool {
		if p == 0 {
			return q >= 0
		}
		t := q / p
		if p < 0 {
			if t > t1 {
				return false
			}
			t0 = max(t0, t)
		} else {
			if t < t0 {
				return false
			}
			t1 = min(t1, t)
		}
		return true
	}
	return clip(-dx, float64(a.X-r.Min.X)) && clip(dx, float64(r.Max.X-a.X)) &&
		clip(-dy, float64(a.Y-r.Min.Y)) && clip(dy, float64(r.Max.Y-a.Y)) && t0 <= t1
}

// spreadLabels moves labels of height h along one axis from their wanted
// centres so that no two overlap, each cluster of labels that would
// collide set as a block centred on its members' wanted mean (the
// cluster-merging step of direct line labelling), then kept within
// [lo, hi]. The result is in the input's order; it keeps the input's
// order along the axis for labels wanted in that order, so leader lines
// never cross.
func spreadLabels(want []vg.Length, h, lo, hi vg.Length) []vg.Length {
	n := len(want)
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return want[order[a]] < want[order[b]] })
	type cluster struct {
		first, count int // into order
		sum          vg.Length
		centre       vg.Length
	}
	var cs []cluster
	for k, i := range order {
		cs = append(cs, cluster{first: k, count: 1, sum: want[i], centre: want[i]})
		// Merge back while the new cluster overlaps the one before it.
		for len(cs) > 1 {
			a, b := cs[len(cs)-2], cs[len(cs)-1]
			if a.centre+vg.Length(a.count)*h/2 <= b.centre-vg.Length(b.count)*h/2 {
				break
			}
			m := cluster{first: a.first, count: a.count + b.count, sum: a.sum + b.sum}
			m.centre = m.sum / vg.Length(m.count)
			cs = append(cs[:len(cs)-2], m)
		}
	}
	out := make([]vg.Length, n)
	for _, c := range cs {
		start := c.centre - vg.Length(c.count)*h/2 + h/2
		for j := 0; j < c.count; j++ {
			out[order[c.first+j]] = start + vg.Length(j)*h
		}
	}
	// Keep inside the bounds, pushing neighbours along when a label at an
	// edge moves (from the top down, then from the bottom up).
	if n > 0 {
		for k := n - 1; k >= 0; k-- {
			i := order[k]
			limit := hi - h/2
			if k < n-1 {
				limit = min(limit, out[order[k+1]]-h)
			}
			out[i] = min(out[i], limit)
		}
		for k := 0; k < n; k++ {
			i := order[k]
			limit := lo + h/2
			if k > 0 {
				limit = max(limit, out[order[k-1]]+h)
			}
			out[i] = max(out[i], limit)
		}
	}
	return out
}
