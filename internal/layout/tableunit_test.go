package layout

import (
	"strings"
	"testing"

	"peerpack/internal/dataset"
	"peerpack/internal/format"
)

// Tables state the currency once, in the label, and print the same digits
// as format.Value elsewhere in the pack (common practice, no source:
// units in headers, not in every cell).
func TestTableStatesCurrencyOnce(t *testing.T) {
	income := dataset.Indicator{Key: "income", Label: "Research income per academic", Unit: dataset.UnitCurrency, Currency: true, Better: dataset.HigherIsBetter}
	cost := dataset.Indicator{Key: "cost", Label: "Cost per student", Unit: dataset.UnitCurrency, InternationalDollars: true, Better: dataset.LowerIsBetter}
	local := dataset.Indicator{Key: "fee", Label: "Fee", Unit: dataset.UnitCurrency, Better: dataset.Neutral}
	share := dataset.Indicator{Key: "intl", Label: "International staff", Unit: dataset.UnitPercent, Decimals: 1, Better: dataset.HigherIsBetter}
	cases := []struct {
		ind          dataset.Indicator
		v            float64
		label, value string
	}{
		{income, 91382.4, "Research income per academic (PPP$)", "91,382"},
		{cost, 12000, "Cost per student (PPP$) ↓", "12,000"},
		{local, 450, "Fee", "450"},
		{share, 42.84, "International staff", "42.8%"},
	}
	for _, c := range cases {
		if got := unitLabel(c.ind, false); got != c.label {
			t.Errorf("unitLabel(%s) = %q, want %q", c.ind.Key, got, c.label)
		}
		got := tableValue(c.ind, c.v)
		if got != c.value {
			t.Errorf("tableValue(%s, %v) = %q, want %q", c.ind.Key, c.v, got, c.value)
		}
		if full := format.Value(c.ind, c.v); !strings.HasSuffix(full, got) {
			t.Errorf("format.Value(%s) = %q does not end in the table's %q", c.ind.Key, full, got)
		}
	}
}
