package charts

import (
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"peerpack/internal/dataset"
)

// Axis titles break between phrases, never inside one: "higher is better"
// and "(unit)" stay whole on one line at every axis length (layout review
// of the packs; common practice, no source).
func TestAxisTitleBreaksBetweenPhrases(t *testing.T) {
	th := Theme{}
	sty := th.axisStyle()
	inds := []dataset.Indicator{
		fxFNCI, fxIntl, fxSSR, fxInc,
		{Key: "fnci", Short: "FNCI", Unit: dataset.UnitIndex, Better: dataset.HigherIsBetter},
		{Key: "inc", Label: "Research income per academic staff member", Unit: dataset.UnitCurrency, InternationalDollars: true, Better: dataset.HigherIsBetter},
		{Key: "gender", Short: "Women among professors", Unit: dataset.UnitPercent, Better: dataset.Neutral},
	}
	for _, ind := range inds {
		_, unit, dir := axisPhrases(ind)
		for l := vg.Length(40); l <= 500; l += 3 {
			title := fitAxisTitle(ind, th, l)
			lines := strings.Split(title, "\n")
			if len(lines) > 2 {
				t.Errorf("%s at %.0f pt: %d lines %q", ind.Key, l, len(lines), title)
			}
			for _, line := range lines {
				if sty.Width(line) > l+0.01 {
					t.Errorf("%s at %.0f pt: line %q is %.1f pt wide", ind.Key, l, line, sty.Width(line))
				}
				if strings.HasSuffix(line, "…") {
					continue
				}
				if dir != "" && strings.Contains(line, strings.Fields(dir)[0]) && !strings.Contains(line, dir) {
					t.Errorf("%s at %.0f pt: %q splits %q", ind.Key, l, title, dir)
				}
				if strings.Contains(line, "(") && !strings.Contains(line, unit) {
					t.Errorf("%s at %.0f pt: %q splits %q", ind.Key, l, title, unit)
				}
			}
			if lines[0] == "" || (len(lines) == 2 && (strings.HasSuffix(lines[0], ",") || strings.HasPrefix(lines[1], "is "))) {
				t.Errorf("%s at %.0f pt: badly broken %q", ind.Key, l, title)
			}
		}
	}
	// The reviewed case: a short name whose title no longer fits one line
	// puts the direction on its own line.
	fw := dataset.Indicator{Key: "fnci", Short: "FNCI", Unit: dataset.UnitIndex, Better: dataset.HigherIsBetter}
	if got, want := fitAxisTitle(fw, th, sty.Width("FNCI (index), higher is")+1), "FNCI (index)\nhigher is better"; got != want {
		t.Errorf("FNCI title = %q, want %q", got, want)
	}
}

// Money axes name international dollars when the amounts are converted
// or derived from converted amounts (format.InDollars), never a bare
// "(currency)".
func TestMoneyAxisSaysPPPDollars(t *testing.T) {
	cases := []struct {
		ind  dataset.Indicator
		want string
	}{
		{dataset.Indicator{Short: "Income", Unit: dataset.UnitCurrency, Currency: true}, "Income (PPP$)"},
		{dataset.Indicator{Short: "Income per FTE", Unit: dataset.UnitCurrency, InternationalDollars: true}, "Income per FTE (PPP$)"},
		{dataset.Indicator{Short: "Fees", Unit: dataset.UnitCurrency}, "Fees (local currency)"},
	}
	for _, c := range cases {
		if got := axisTitle(c.ind); got != c.want {
			t.Errorf("axisTitle = %q, want %q", got, c.want)
		}
	}
}
