package narrative

import (
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// MinSharedRank is the fewest indicators of a detail block on which the
// focus holds the same first or last place of the same number, "last of 8",
// for that statement to be made once, listing them, rather than in each
// indicator's paragraph (common practice, no source: three repetitions of
// one statement read as a list).
const MinSharedRank = 3

// sharedRanks finds, for every group of a detail block, the indicators on
// which the focus stands first (or last) of the same number, unshared,
// and says so once a group: "Among the chosen peers, Wendholm ranks last
// of 8 on six of the eleven indicators here: A, B, ...". The positions it
// covers are marked as said, so their paragraphs give the value and the
// distance to the median without the rank again. Each listed indicator
// records its claims (rank = of, or rank = 1, and of = n); every other
// indicator of the block ranked among the same number records that it is
// not in that place.
func (c *composer) sharedRanks(sc *scope) []Sentence {
	if !sc.has("position") {
		return nil
	}
	var out []Sentence
	for _, g := range sc.groups {
		for _, last := range []bool{true, false} {
			byOf := map[int][]dataset.Indicator{}
			var order []int
			for _, ind := range sc.inds {
				if !judged(ind) {
					continue // first or last of a neutral indicator is no standing
				}
				p, ok := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
				if !ok || !p.HasValue || p.Rank == 0 || p.Of <= 2 || p.Ties >= 2 {
					continue
				}
				if _, _, banded := format.RankBand(p.Rank, c.b.RankBands); banded {
					continue
				}
				if (last && p.Rank == p.Of) || (!last && p.Rank == 1) {
					if _, seen := byOf[p.Of]; !seen {
						order = append(order, p.Of)
					}
					byOf[p.Of] = append(byOf[p.Of], ind)
				}
			}
			for _, of := range order {
				if inds := byOf[of]; len(inds) >= MinSharedRank {
					out = append(out, c.sharedRank(sc, g, inds, of, last))
				}
			}
		}
	}
	return out
}

// sharedRank writes one shared first or last place and marks the
// positions as said.
func (c *composer) sharedRank(sc *scope, g *figures.Group, inds []dataset.Indicator, of int, last bool) Sentence {
	id := c.m.FocusID
	f := SharedRankFact{Seed: g.Name + "/" + inds[0].Key, Focus: c.focus, Group: c.phrase(g), Last: last, Of: printCount(of),
		Count: len(inds), Total: len(sc.inds)}
	listed := map[string]bool{}
	var cites []figures.Key
	var claims []Claim
	inGroup := true
	for _, ind := range inds {
		listed[ind.Key] = true
		f.Indicators = append(f.Indicators, c.w.Indicator(ind))
		k := func(m string) figures.Key { return posKey(g.Name, ind.Key, id, sc.year, m) }
		cites = append(cites, k(mRank), k(mOf))
		claims = append(claims, Claimed(Fig(k(mOf)), OpEqual, Num(float64(of))), Claimed(Fig(k(mTies)), OpEqual, Num(1)))
		if last {
			claims = append(claims, Claimed(Fig(k(mRank)), OpEqual, Fig(k(mOf))))
		} else {
			claims = append(claims, Claimed(Fig(k(mRank)), OpEqual, Num(1)))
		}
		if p, ok := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year); ok && !p.InGroup {
			inGroup = false
			claims = append(claims, Claimed(Fig(k("in_group")), OpEqual, Num(0)))
		}
		c.said[c.part+"\x00rank\x00"+g.Name+"\x00"+ind.Key] = true
	}
	f.InGroup = inGroup
	intro := c.part + "\x00" + g.Name
	if !inGroup {
		c.introduced[intro] = true
	}
	// The others of the block: not in that place among the same number.
	for _, ind := range sc.inds {
		if listed[ind.Key] {
			continue
		}
		p, ok := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
		if !judged(ind) || !ok || !p.HasValue || p.Rank == 0 || p.Of != of || p.Ties >= 2 {
			continue // a shared place is another statement
		}
		if _, _, banded := format.RankBand(p.Rank, c.b.RankBands); banded {
			continue
		}
		k := func(m string) figures.Key { return posKey(g.Name, ind.Key, id, sc.year, m) }
		if last {
			claims = append(claims, Claimed(Fig(k(mRank)), OpLess, Fig(k(mOf))))
		} else {
			claims = append(claims, Claimed(Fig(k(mRank)), OpGreater, Num(1)))
		}
	}
	return c.say("", c.w.SharedRank(f), cites...).claim(claims...)
}
