package figures

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/stats"
)

// nearest picks the Count institutions closest to the focus by
// standardised Euclidean distance over the chosen indicators in the brief
// year: each indicator is standardised by the mean and sample SD of the
// group's pool (the ranked population, or all institutions with over: all)
// with a value; d = sqrt(sum(((x - focus) / sd)^2)). Institutions lacking
// any of the indicators are skipped, indicators the focus lacks are left
// out of the profile (and the definition says so), the focus itself is never chosen, an
// indicator with zero spread adds nothing, and equal distances are broken
// by register id (ascending), so the choice is reproducible.
func (r *resolver) nearest(spec *brief.GroupSpec, over string) []*Group {
	ns := spec.Nearest
	inds := make([]int, 0, len(ns.Indicators))
	ok := true
	for _, key := range ns.Indicators {
		k := r.d.Dictionary.Index(key)
		if k < 0 {
			r.errAt(spec.Pos, "%s", unknownIndicator(r.d, fmt.Sprintf("group %q: nearest", spec.Name), key))
			ok = false
			continue
		}
		inds = append(inds, k)
	}
	if !ok || !r.checkFilter(spec, ns.Where) || r.focus < 0 {
		return nil
	}
	year := r.b.Year
	// An indicator the focus does not report cannot measure distance from
	// it: it is left out of the profile and the group's definition says so,
	// so one missing value does not stop the pack (a batch over a whole
	// sector meets this). Only when none is left is it an error.
	var used []int
	// The definition is read in the pack: labels, not keys.
	var usedLabels, dropped []string
	for _, k := range inds {
		label := runningLabel(r.d.Dictionary.Indicators[k])
		if _, has := r.d.Value(k, r.focus, year); !has {
			dropped = append(dropped, label)
			continue
		}
		used = append(used, k)
		usedLabels = append(usedLabels, label)
	}
	if len(used) == 0 {
		r.errAt(spec.Pos, "group %q: the focus %s has no value in %d of any of %s, so no institution can be measured against it; choose indicators the focus reports", spec.Name, r.b.Focus, year, strings.Join(ns.Indicators, ", "))
		return nil
	}
	inds = used
	pool := r.pool(over)
	sds := make([]float64, len(inds))
	for j, k := range inds {
		col := r.d.Column(k, year)
		vals := make([]float64, 0, len(col))
		for i, v := range col {
			if pool[i] && !math.IsNaN(v) {
				vals = append(vals, v)
			}
		}
		_, sds[j] = stats.MeanSD(vals)
	}
	type cand struct {
		inst int
		dist float64
	}
	var cands []cand
	for i, in := range r.d.Register.Institutions {
		if i == r.focus || !pool[i] || !matches(in, ns.Where) {
			continue
		}
		sum, complete := 0.0, true
		for j, k := range inds {
			v, has := r.d.Value(k, i, year)
			if !has {
				complete = false
				break
			}
			if sds[j] > 0 {
				f, _ := r.d.Value(k, r.focus, year)
				z := (v - f) / sds[j]
				sum += z * z
			}
		}
		if complete {
			cands = append(cands, cand{i, math.Sqrt(sum)})
		}
	}
	ids := r.d.Register.Institutions
	sort.Slice(cands, func(a, b int) bool {
		if cands[a].dist != cands[b].dist {
			return cands[a].dist < cands[b].dist
		}
		return ids[cands[a].inst].ID < ids[cands[b].inst].ID
	})
	if len(cands) > ns.Count {
		cands = cands[:ns.Count]
	}
	g := newGroup(spec.Name, "nearest", r.d.Register.Len())
	focusName := r.d.Register.Institutions[r.focus].Name
	g.Defined = fmt.Sprintf("the %d institutions nearest %s on %s in %d (standardised Euclidean distance)", len(cands), focusName, listText(usedLabels), year)
	if len(dropped) > 0 {
		g.Defined += fmt.Sprintf("; %s left out because %s reports no value of %s in %d", listText(dropped), focusName, map[bool]string{true: "it", false: "them"}[len(dropped) == 1], year)
	}
	if len(cands) < ns.Count {
		g.Defined += fmt.Sprintf("; %d were asked for, but only %d institutions have every one of these indicators", ns.Count, len(cands))
	}
	if ns.Where != nil {
		g.Defined += ", among those where " + describeFilter(ns.Where)
	}
	for _, c := range cands {
		g.add(c.inst)
		g.Nearest = append(g.Nearest, Neighbour{Institution: c.inst, Distance: c.dist})
	}
	g.sortMembers()
	return []*Group{g}
}
