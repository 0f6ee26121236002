package charts

import (
	"fmt"
	"image"
	"image/color"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// nullCanvas is a vg.Canvas that draws nothing: the plots are laid out on
// it once to learn, before the legend's height is fixed, how many labels
// will find no room.
type nullCanvas struct{ w, h vg.Length }

func (nullCanvas) SetLineWidth(vg.Length)                 {}
func (nullCanvas) SetLineDash([]vg.Length, vg.Length)     {}
func (nullCanvas) SetColor(color.Color)                   {}
func (nullCanvas) Rotate(float64)                         {}
func (nullCanvas) Translate(vg.Point)                     {}
func (nullCanvas) Scale(float64, float64)                 {}
func (nullCanvas) Push()                                  {}
func (nullCanvas) Pop()                                   {}
func (nullCanvas) Stroke(vg.Path)                         {}
func (nullCanvas) Fill(vg.Path)                           {}
func (nullCanvas) FillString(font.Face, vg.Point, string) {}
func (nullCanvas) DrawImage(vg.Rectangle, image.Image)    {}
func (n nullCanvas) Size() (vg.Length, vg.Length)         { return n.w, n.h }

// droppedNote tells the reader that marks are unlabelled, so an unnamed
// circle is not taken for an anonymous institution.
func droppedNote(n int) string {
	if n == 1 {
		return "One label is left out for lack of room; the tables give every value."
	}
	return fmt.Sprintf("%d labels are left out for lack of room; the tables give every value.", n)
}

// prepare sets the legend's note for a width: its own note plus, when the
// chart counts left-out labels, a sentence about them, found by laying
// the plots out once on a nullCanvas (cached per width).
func (ps *panels) prepare(w vg.Length) {
	if ps.dropped == nil || ps.legend == nil {
		return
	}
	if !ps.noteKept {
		ps.baseNote, ps.noteKept = ps.legend.note, true
	}
	n, ok := ps.droppedAt[w]
	if !ok {
		n = ps.dryRun(w)
		if ps.droppedAt == nil {
			ps.droppedAt = map[vg.Length]int{}
		}
		ps.droppedAt[w] = n
	}
	ps.legend.note = ps.baseNote
	if n > 0 {
		ps.legend.note = joinNonEmpty(" ", ps.baseNote, droppedNote(n))
	}
}

// dryRun lays the plots out at a width and returns the labels left out;
// geometry gonum cannot lay out counts as none (Draw reports it).
func (ps *panels) dryRun(w vg.Length) (n int) {
	defer func() {
		if recover() != nil {
			n = 0
		}
	}()
	h := ps.plotsHeight(w)
	if w <= 0 || h <= 0 {
		return 0
	}
	cols := ps.cols(w)
	ps.drawPlots(draw.New(nullCanvas{w: w, h: h}), ps.make(w, cols), cols)
	return ps.dropped()
}

// sumDropped adds up the labels each plotter left out.
func sumDropped[T any](ps []T, dropped func(T) int) int {
	n := 0
	for _, p := range ps {
		n += dropped(p)
	}
	return n
}
