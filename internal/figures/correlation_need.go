package figures

import (
	"slices"

	"peerpack/internal/brief"
)

// TopicAssociation is the commentary topic that reads correlations.
const TopicAssociation = "association"

// correlationNeeds marks, per group of the model, the indicators whose
// pairwise correlations the brief reads: a commentary block with the
// association topic writes about every pair of its indicators (all of
// the dictionary when it names none) across its groups (all groups when
// it names none; an each name stands for all its groups). Nothing else
// in a pack reads a correlation, so the other pairs are not computed and
// the figures file carries only these. A nil entry means none.
func (m *Model) correlationNeeds(b *brief.Brief) [][]bool {
	dict := m.Data.Dictionary
	need := make([][]bool, len(m.Groups))
	for _, blk := range b.Blocks {
		cb, ok := blk.(*brief.CommentaryBlock)
		if !ok || !slices.Contains(cb.Topics, TopicAssociation) {
			continue
		}
		inds := make([]bool, len(dict.Indicators))
		if len(cb.Indicators) == 0 {
			for k := range inds {
				inds[k] = true
			}
		}
		for _, key := range cb.Indicators {
			if k := dict.Index(key); k >= 0 {
				inds[k] = true
			}
		}
		mark := func(gi int) {
			if need[gi] == nil {
				need[gi] = make([]bool, len(inds))
			}
			for k, on := range inds {
				need[gi][k] = need[gi][k] || on
			}
		}
		if len(cb.Groups) == 0 {
			for gi := range m.Groups {
				mark(gi)
			}
			continue
		}
		for _, name := range cb.Groups {
			// as GroupsOf: the group of that name, else every group an
			// each definition of that name made
			if gi, ok := m.groupIndex[name]; ok {
				mark(gi)
				continue
			}
			for gi, g := range m.Groups {
				if g.Spec == name {
					mark(gi)
				}
			}
		}
	}
	for gi, inds := range need {
		n := 0
		for _, on := range inds {
			if on {
				n++
			}
		}
		if n < 2 {
			need[gi] = nil // no pair
		}
	}
	return need
}
