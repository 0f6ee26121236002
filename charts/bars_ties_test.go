package charts

import (
	"testing"

	"peerpack/internal/format"
)

// TestBarsRankAtPrintedValues: the bars chart's rank labels follow the
// printed values. Down the bars, a rank changes exactly when the printed
// value changes, and then to the bar's place (1 + the bars above it),
// so two bars printed alike share the better rank under the note "ties
// share the better rank" (standard competition ranking; ranks at the
// declared precision, common practice, no source). The fixture's
// citation impact (two decimals) has two members printed at 1.31 that
// differ in the third decimal, so the check cannot pass vacuously.
func TestBarsRankAtPrintedValues(t *testing.T) {
	m, b := buildModel(t, 60, "# B\n\n```chart\nkind: bars\nindicators: [fnci]\ngroups: [Kestria national]\nlimit: 30\n```\n")
	c, err := New(m, chartBlocks(b)[0], Theme{})
	if err != nil {
		t.Fatal(err)
	}
	bc := c.(*BarsChart)
	ties := 0
	for i := 1; i < len(bc.Items); i++ {
		prev, it := bc.Items[i-1], bc.Items[i]
		if it.GapBefore {
			continue
		}
		pv, v := format.Value(bc.Indicator, prev.Value), format.Value(bc.Indicator, it.Value)
		switch {
		case pv == v && it.Rank != prev.Rank:
			t.Errorf("%s and %s both print %s but rank %d and %d", prev.Label, it.Label, v, prev.Rank, it.Rank)
		case pv != v && it.Rank != i+1:
			t.Errorf("%s prints %s below %s yet ranks %d, not %d", it.Label, v, pv, it.Rank, i+1)
		case pv == v && prev.Value != it.Value:
			ties++
		}
	}
	if ties == 0 {
		t.Error("no bars printed alike with different values: the fixture no longer tests near-ties")
	}
}
