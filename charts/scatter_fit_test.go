package charts

import (
	"strings"
	"testing"

	"peerpack/internal/figures"
)

// A fit line needs figures.MinCorrelationPairs institutions with both
// values (common practice, no source): with 8 institutions (4 per country)
// the block asking for a line gets none and a note saying why; with 60 it
// gets the line.
func TestScatterFitNeedsEnoughPairs(t *testing.T) {
	body := "\n```chart\nkind: scatter\nindicators: [intl_staff, fnci]\ngroups: [Kestria national, Aldmere national]\nfit: true\n```\n"
	for _, c := range []struct {
		n    int
		line bool
	}{{8, false}, {60, true}} {
		m, b := buildModel(t, c.n, body)
		ch, err := New(m, chartBlocks(b)[0], Theme{})
		if err != nil {
			t.Fatal(err)
		}
		sc := ch.(*ScatterChart)
		if (sc.Fit != nil) != c.line {
			t.Errorf("%d institutions: line drawn %v, want %v", c.n, sc.Fit != nil, c.line)
		}
		if !c.line && !strings.Contains(sc.NoFit, "8 institutions have both values, fewer than the 10") {
			t.Errorf("%d institutions: note %q does not say why no line is drawn", c.n, sc.NoFit)
		}
		if c.line && sc.NoFit != "" {
			t.Errorf("%d institutions: unexpected note %q", c.n, sc.NoFit)
		}
		record(t, ch, fullWidth)
	}
	if figures.MinCorrelationPairs != 10 {
		t.Fatalf("MinCorrelationPairs = %d; the note above states 10", figures.MinCorrelationPairs)
	}
}
