package narrative

import (
	"math"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// How the focus's positions change with the choice of peers (brief topic
// "peerchoice"): the block's groups are read as alternative peer sets
// (agreed members, nearest profiles, a data-driven cluster). For each
// judged indicator the focus is above the middle of a set (percentile
// over 50), below it (under 50) or at it. Indicators read alike by every
// set are named together, one sentence for above and one for below; an
// indicator read differently gets a sentence of its own giving its place
// in each set (a rank "of n" below the small-group floor, else the
// percentile). Every side stated is a claim on the percentile against 50;
// the sentence of an indicator at the middle of some set says nothing of
// that set.

type peerSide struct {
	g    *figures.Group
	side int // Above, Below or Level
	p    *figures.Position
	d    *figures.Distribution
}

func (c *composer) peerChoice(sc *scope) []Paragraph {
	if len(sc.groups) < 2 {
		return nil
	}
	var allUp, allDown []dataset.Indicator
	var upClaims, downClaims []Claim
	var upCites, downCites []figures.Key
	var groupNames []string
	for _, g := range sc.groups {
		groupNames = append(groupNames, c.phrase(g))
	}
	var mixed []Sentence
	var unread []dataset.Indicator
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		var sides []peerSide
		for _, g := range sc.groups {
			p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
			d, okd := c.m.Distribution(g.Name, ind.Key, sc.year)
			if !okp || !okd || !p.HasValue || p.Rank == 0 || p.Of < 2 {
				continue
			}
			s := Level
			switch r := math.Round(p.Percentile); {
			case r > 50:
				s = Above
			case r < 50:
				s = Below
			}
			sides = append(sides, peerSide{g, s, p, d})
		}
		if len(sides) < len(sc.groups) {
			// A set without a place for the focus: the indicator is named
			// among those not read across the sets.
			unread = append(unread, ind)
			continue
		}
		pk := func(x peerSide) figures.Key { return posKey(x.g.Name, ind.Key, c.m.FocusID, sc.year, mPercentile) }
		nUp, nDown := 0, 0
		for _, x := range sides {
			switch x.side {
			case Above:
				nUp++
			case Below:
				nDown++
			}
		}
		switch {
		case nUp == len(sides):
			allUp = append(allUp, ind)
			for _, x := range sides {
				upClaims = append(upClaims, Claimed(Fig(pk(x)), OpGreater, Num(50)))
				upCites = append(upCites, pk(x))
			}
		case nDown == len(sides):
			allDown = append(allDown, ind)
			for _, x := range sides {
				downClaims = append(downClaims, Claimed(Fig(pk(x)), OpLess, Num(50)))
				downCites = append(downCites, pk(x))
			}
		default:
			f := PeerChoiceFact{Seed: ind.Key, Focus: c.focus, Indicator: c.w.Indicator(ind)}
			var cites []figures.Key
			var claims []Claim
			for _, x := range sides {
				pl, k := c.peerPlace(x, ind, sc.year)
				cites = append(cites, k...)
				switch x.side {
				case Above:
					f.Above = append(f.Above, pl)
					claims = append(claims, Claimed(Fig(pk(x)), OpGreater, Num(50)))
				case Below:
					f.Below = append(f.Below, pl)
					claims = append(claims, Claimed(Fig(pk(x)), OpLess, Num(50)))
				default:
					// At the middle: the percentile prints as 50.
					f.Level = append(f.Level, pl)
					claims = append(claims, Claimed(Fig(pk(x)), OpGreaterEq, Num(49.5)), Claimed(Fig(pk(x)), OpLess, Num(50.5)))
				}
			}
			mixed = append(mixed, c.say(ind.Key, c.council().PeerDepends(f), cites...).claim(claims...))
			// The indicator's name heads its paragraph.
			mixed[len(mixed)-1].About = ind.Key
		}
	}
	var out []Paragraph
	var same []Sentence
	if len(allUp) > 0 {
		f := PeerChoiceFact{Seed: "up", Focus: c.focus, Groups: groupNames, Up: true, Indicators: c.indicatorNames(allUp)}
		same = append(same, c.say("", c.council().PeerSame(f), upCites...).claim(upClaims...))
	}
	if len(allDown) > 0 {
		f := PeerChoiceFact{Seed: "down", Focus: c.focus, Groups: groupNames, Indicators: c.indicatorNames(allDown), After: len(same) > 0}
		same = append(same, c.say("", c.council().PeerSame(f), downCites...).claim(downClaims...))
	}
	if len(same) > 0 {
		out = append(out, Paragraph{Heading: c.council().TopicHeading("peerchoice"), Sentences: same})
	}
	if len(unread) > 0 {
		f := PeerChoiceFact{Seed: "unread", Focus: c.focus, Indicators: c.indicatorNames(unread)}
		s := c.say("", c.council().PeerUnread(f))
		if len(out) > 0 {
			out[0].Sentences = append(out[0].Sentences, s)
		} else {
			out = append(out, Paragraph{Heading: c.council().TopicHeading("peerchoice"), Sentences: []Sentence{s}})
		}
	}
	for _, s := range mixed {
		ind, _ := c.m.Indicator(s.About)
		out = append(out, Paragraph{Heading: headingOf(ind), Sentences: []Sentence{s}})
	}
	return out
}

// peerPlace is the focus's place in one set as a sentence prints it.
func (c *composer) peerPlace(x peerSide, ind dataset.Indicator, year int) (PeerPlace, []figures.Key) {
	k := func(m string) figures.Key { return posKey(x.g.Name, ind.Key, c.m.FocusID, year, m) }
	pl := PeerPlace{Group: c.phrase(x.g)}
	if c.small(x.d) {
		pl.Rank = format.Ordinal(x.p.Rank) + " of " + printCount(x.p.Of)
		if x.p.Ties > 1 {
			pl.Rank = "joint " + pl.Rank
		}
		return pl, []figures.Key{k(mRank), k(mOf), k(mPercentile)}
	}
	pl.Percentile = printOrdinalPct(x.p.Percentile)
	return pl, []figures.Key{k(mPercentile)}
}

func (c *composer) indicatorNames(inds []dataset.Indicator) []string {
	out := make([]string, len(inds))
	for i, ind := range inds {
		out[i] = c.w.Indicator(ind)
	}
	return out
}
