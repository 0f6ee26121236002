package narrative

import "testing"

// The caveat sentences in each of their forms, exact (written by hand).
func TestCaveatWording(t *testing.T) {
	e := english{}
	cases := []struct {
		name, got, want string
	}{
		{"ppp converted only", e.PPP(CaveatFact{Indicators: []string{"research income"}}),
			"Figures for research income are converted from each country's currency with purchasing-power parity factors for each year, so they compare what the money buys rather than exchange-rate amounts."},
		{"ppp derived only", e.PPP(CaveatFact{Derived: []string{"research income per academic"}}),
			"Figures for research income per academic are computed from amounts converted from each country's currency with purchasing-power parity factors for each year, so they compare what the money buys rather than exchange-rate amounts."},
		{"ppp both", e.PPP(CaveatFact{Indicators: []string{"research income"}, Derived: []string{"research income per academic"}}),
			"Figures for research income are converted from each country's currency with purchasing-power parity factors for each year, and those for research income per academic are computed from the converted amounts, so they compare what the money buys rather than exchange-rate amounts."},
		{"ppp many derived", e.PPP(CaveatFact{Indicators: []string{"research income", "industry income"}, Derived: []string{"a", "b", "c", "d"}}),
			"Figures for research income and industry income are converted from each country's currency with purchasing-power parity factors for each year, and the four indicators computed from them inherit the conversion, so all compare what the money buys rather than exchange-rate amounts."},
		{"ppp brief one", e.PPPBrief(CaveatFact{Indicators: []string{"research income per academic"}}),
			"Research income per academic is in international dollars at purchasing-power parity."},
		{"ppp brief many", e.PPPBrief(CaveatFact{Indicators: []string{"a", "b", "c", "d"}}),
			"The four money indicators (a, b, c and d) are in international dollars at purchasing-power parity."},
		{"direction lower judged", e.Direction(DirectionFact{Lower: []string{"students per academic"}, LowerJudged: []string{"students per academic"}}),
			"On students per academic, lower counts as better (itself a value judgement), so a high percentile there means a low figure."},
		{"direction lower plain", e.Direction(DirectionFact{Lower: []string{"staff turnover"}}),
			"On staff turnover, lower counts as better, so a high percentile there means a low figure."},
		{"direction lower partly judged and higher judged", e.Direction(DirectionFact{Lower: []string{"staff turnover", "students per academic"}, LowerJudged: []string{"students per academic"}, HigherJudged: []string{"international students"}}),
			"On staff turnover and students per academic, lower counts as better, so a high percentile there means a low figure; for students per academic that direction is a value judgement; counting higher values of international students as better is one too."},
		{"direction higher judged only", e.Direction(DirectionFact{HigherJudged: []string{"international students"}}),
			"Counting higher values of international students as better is a value judgement."},
		{"small group brief", e.SmallGroupBrief(CaveatFact{Group: "the chosen peers", N: "7", Threshold: "10"}),
			"Quartiles among the chosen peers rest on only 7 members, too few to be stable (common practice asks for at least 10)."},
	}
	for _, c := range cases {
		if c.got != c.want {
			t.Errorf("%s:\n got %q\nwant %q", c.name, c.got, c.want)
		}
	}
	if got := (english{us: true}).Direction(DirectionFact{HigherJudged: []string{"x"}}); got != "Counting higher values of x as better is a value judgment." {
		t.Errorf("en-US spelling: %q", got)
	}
}

// After the overview, the rest above and below the middle go into one
// sentence, "also" only where the overview named that side.
func TestAboveBelowWording(t *testing.T) {
	e := english{}
	up := RankedFact{Items: []RankedItem{{Indicator: "a", Percentile: "72nd"}}, Also: true}
	down := RankedFact{Items: []RankedItem{{Indicator: "b", Percentile: "28th"}, {Indicator: "c", Percentile: "32nd"}}}
	for _, c := range []struct{ got, want string }{
		{e.AboveBelow(up, down), "It is also above the middle of the group on a (72nd percentile), and below it on b (28th) and c (32nd)."},
		{e.AboveBelow(up, RankedFact{}), "It is also above the middle of the group on a (72nd percentile)."},
		{e.AboveBelow(RankedFact{}, down), "It is below the middle of the group on b (28th percentile) and c (32nd)."},
	} {
		if c.got != c.want {
			t.Errorf("got  %q\nwant %q", c.got, c.want)
		}
	}
}
