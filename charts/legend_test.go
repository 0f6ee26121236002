package charts

import (
	"testing"

	"gonum.org/v1/plot/vg"

	"peerpack/internal/dataset"
)

// A box chart's key repeats under every box chart of a page, so it must
// take one row at full width even with every entry present and a long
// focus name (layout review of the demo pack; common practice, no source).
func TestBoxLegendIsOneRowAtFullWidth(t *testing.T) {
	th := Theme{}
	long := dataset.Institution{Name: "Technical University of Lesser Ostmark and the Northern Isles", Attrs: map[string]string{shortNameAttr: "TU Lesser Ostmark"}}
	for _, in := range []dataset.Institution{{Name: "Høgskolen i Vårdø"}, long, {Name: "Universidad Politécnica de Santa Oriana del Valle Alto"}} {
		l := &legend{th: th}
		boxLegend(l, in.Name, fitName(in, th.text(sizeLegend, true, PaletteBlack), legendShortName), true, true)
		if n := l.rows(fullWidth); n != 1 {
			t.Errorf("%s: box legend takes %d rows at full width, want 1", in.Name, n)
		}
		// At half width it wraps into aligned columns, never one entry a
		// row.
		lay := l.layout(halfWidth)
		if n := len(lay.rows); n < 2 || n > 3 {
			t.Errorf("%s: box legend takes %d rows at half width, want 2 or 3", in.Name, n)
		}
		checkColumnsAligned(t, l, lay, halfWidth)
	}
}

// checkColumnsAligned checks that a wrapped legend keeps its entries in
// columns (same left edge down a column) and within the width.
func checkColumnsAligned(t *testing.T, l *legend, lay legendLayout, width vg.Length) {
	t.Helper()
	if len(lay.rows) < 2 {
		return
	}
	for ri, row := range lay.rows {
		for ei, e := range row {
			if lay.xs[ri][ei] != lay.xs[0][ei] {
				t.Errorf("row %d entry %d starts at %.1f, column starts at %.1f", ri, ei, lay.xs[ri][ei], lay.xs[0][ei])
			}
			if right := lay.xs[ri][ei] + l.entryWidth(e); right > width+0.01 && len(row) > 1 {
				t.Errorf("entry %q ends at %.1f beyond the width %.1f", e.Text, right, width)
			}
		}
	}
}

// A mark whose name finds no room is still explained: the legend's note
// counts the labels left out, and says nothing when all fit.
func TestLegendCountsLabelsLeftOut(t *testing.T) {
	crowded := &BoxChart{FocusName: "Høgskolen i Vårdø", Panels: []BoxPanel{{Indicator: fxFNCI, Rows: fxBoxRows(fxFNCI, 1, 1.137)}}}
	rec := record(t, crowded, halfWidth)
	bp := crowded.panels()
	n := bp.droppedAt[halfWidth]
	if n == 0 {
		t.Fatal("the crowded fixture lost no label at half width; the test needs a crowded case")
	}
	if !hasText(rec.Actions, droppedNote(n)) {
		t.Errorf("half width: %d labels left out but the note %q is not drawn", n, droppedNote(n))
	}
	roomy := &BoxChart{FocusName: "Høgskolen i Vårdø", Panels: []BoxPanel{{Indicator: fxFNCI, Rows: fxBoxRows(fxFNCI, 1, 1.137)[2:]}}}
	if rec := record(t, roomy, fullWidth); textContains(rec.Actions, "left out for lack of room") {
		t.Error("a chart whose labels all fit says some were left out")
	}
}
