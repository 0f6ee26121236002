package figures

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/stats"
	"peerpack/internal/yamlx"
)

// resolver turns the brief's group definitions into member lists.
type resolver struct {
	d     *dataset.Dataset
	b     *brief.Brief
	focus int
	probs *diag.List
}

func (r *resolver) errAt(p brief.Pos, format string, args ...any) {
	r.probs.Addf(r.b.File, p.Line, p.Column, format, args...)
}

// pool returns the institutions a group may draw from: the ranked
// population, or the whole register for over: all.
func (r *resolver) pool(over string) []bool {
	n := r.d.Register.Len()
	in := make([]bool, n)
	for i := 0; i < n; i++ {
		in[i] = over == "all" || r.d.InPopulation(i)
	}
	return in
}

// resolveGroups resolves every group of the brief, in brief order, with
// "each" definitions expanded in place.
func (r *resolver) resolveGroups() []*Group {
	var out []*Group
	names := map[string]brief.Pos{}
	for i := range r.b.Groups {
		spec := &r.b.Groups[i]
		over := spec.Over
		if over == "" {
			over = "ranked"
		}
		var gs []*Group
		switch {
		case spec.Each != "":
			gs = r.each(spec, over)
		case len(spec.Members) > 0:
			gs = r.members(spec, over)
		case spec.Nearest != nil:
			gs = r.nearest(spec, over)
		case spec.Where != nil:
			gs = r.where(spec, over)
		}
		for _, g := range gs {
			if prev, ok := names[g.Name]; ok {
				r.errAt(spec.Pos, "group name %q is already used by the group at line %d; rename one of them", g.Name, prev.Line)
				continue
			}
			names[g.Name] = spec.Pos
			g.Spec = spec.Name
			if g.Spec == "" {
				g.Spec = g.Name
			}
			g.Over = over
			g.FocusIn = g.Has(r.focus)
			out = append(out, g)
		}
	}
	return out
}

func newGroup(name, kind string, n int) *Group {
	return &Group{Name: name, Kind: kind, member: make([]bool, n)}
}

func (g *Group) add(inst int) {
	if !g.member[inst] {
		g.member[inst] = true
		g.Members = append(g.Members, inst)
	}
}

func (g *Group) sortMembers() { sort.Ints(g.Members) }

// checkFilter reports unknown fields and values of a filter; it returns
// false when the filter cannot be applied.
func (r *resolver) checkFilter(spec *brief.GroupSpec, f *brief.Filter) bool {
	if f == nil {
		return true
	}
	ok := true
	for _, c := range f.Conds {
		p := c.Pos
		if p.Line == 0 {
			p = spec.Pos
		}
		if !r.d.Register.HasAttr(c.Attr) {
			fields := r.fields()
			msg := fmt.Sprintf("group %q: %q is not a column of the register %s", spec.Name, c.Attr, r.d.Register.File)
			if s := yamlx.Nearest(c.Attr, fields); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			r.errAt(p, "%s (columns are %s)", msg, strings.Join(fields, ", "))
			ok = false
			continue
		}
		seen := r.attrValues(c.Attr)
		for _, v := range c.Values {
			if _, found := seen[v]; found {
				continue
			}
			vals := make([]string, 0, len(seen))
			for k := range seen {
				vals = append(vals, k)
			}
			sort.Strings(vals)
			msg := fmt.Sprintf("group %q: no institution in the register has %s %q", spec.Name, c.Attr, v)
			if s := yamlx.Nearest(v, vals); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			r.errAt(p, "%s; check the spelling against the register's %s column", msg, c.Attr)
			ok = false
		}
	}
	return ok
}

func (r *resolver) fields() []string {
	return append([]string{"id", "name", "country", "region"}, r.d.Register.AttrNames...)
}

func (r *resolver) attrValues(attr string) map[string]struct{} {
	seen := map[string]struct{}{}
	for _, in := range r.d.Register.Institutions {
		if v, ok := in.Attr(attr); ok {
			seen[v] = struct{}{}
		}
	}
	return seen
}

// matches applies a filter: every condition must hold; a condition holds
// when the field's value is one of the listed values (or none of them,
// with not).
func matches(in dataset.Institution, f *brief.Filter) bool {
	if f == nil {
		return true
	}
	for _, c := range f.Conds {
		v, _ := in.Attr(c.Attr)
		hit := false
		for _, want := range c.Values {
			if v == want {
				hit = true
				break
			}
		}
		if hit == c.Not {
			return false
		}
	}
	return true
}

// describeFilter restates a filter in words for the pack.
func describeFilter(f *brief.Filter) string {
	if f == nil || len(f.Conds) == 0 {
		return "all institutions"
	}
	parts := make([]string, 0, len(f.Conds))
	for _, c := range f.Conds {
		verb := "is"
		if c.Not {
			verb = "is not"
		}
		if len(c.Values) == 1 {
			parts = append(parts, fmt.Sprintf("%s %s %s", c.Attr, verb, c.Values[0]))
			continue
		}
		if c.Not {
			verb = "is none of"
		} else {
			verb = "is one of"
		}
		parts = append(parts, fmt.Sprintf("%s %s %s", c.Attr, verb, strings.Join(c.Values, ", ")))
	}
	return strings.Join(parts, " and ")
}

func (r *resolver) where(spec *brief.GroupSpec, over string) []*Group {
	if !r.checkFilter(spec, spec.Where) {
		return nil
	}
	pool := r.pool(over)
	g := newGroup(spec.Name, "where", r.d.Register.Len())
	g.Defined = describeFilter(spec.Where)
	for i, in := range r.d.Register.Institutions {
		if pool[i] && matches(in, spec.Where) {
			g.add(i)
		}
	}
	return []*Group{g}
}

func (r *resolver) members(spec *brief.GroupSpec, over string) []*Group {
	pool := r.pool(over)
	g := newGroup(spec.Name, "members", r.d.Register.Len())
	g.Defined = fmt.Sprintf("a chosen list of %d institutions", len(spec.Members))
	bad := false
	for _, id := range spec.Members {
		i := r.d.Register.Index(id)
		if i < 0 {
			msg := fmt.Sprintf("group %q: member %q is not in the register %s", spec.Name, id, r.d.Register.File)
			if s := r.nearestID(id); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			r.errAt(spec.Pos, "%s", msg)
			bad = true
			continue
		}
		if !pool[i] {
			reason := "outside the ranked population"
			if rs := r.exclusionReasons(i); rs != "" {
				reason += ": " + rs
			}
			g.Dropped = append(g.Dropped, Dropped{Institution: i, Reason: reason})
			continue
		}
		g.add(i)
	}
	if bad {
		return nil
	}
	if len(g.Dropped) > 0 {
		g.Defined += fmt.Sprintf(" (%d outside the ranked population left out)", len(g.Dropped))
	}
	g.sortMembers()
	return []*Group{g}
}

func (r *resolver) exclusionReasons(i int) string {
	if r.d.Population == nil {
		return ""
	}
	return strings.Join(r.d.Population.Excluded[i], "; ")
}

// nearestID suggests a register id for a mistyped one.
func (r *resolver) nearestID(id string) string {
	ids := make([]string, len(r.d.Register.Institutions))
	for i, in := range r.d.Register.Institutions {
		ids[i] = in.ID
	}
	return yamlx.Nearest(id, ids)
}

// nearest picks the Count institutions closest to the focus by
// standardised Euclidean distance over the chosen indicators in the brief
// year: each indicator is standardised by the mean and sample SD of the
// group's pool (the ranked population, or all institutions with over: all)
// with a value; d = sqrt(sum(((x - focus) / sd)^2)). Institutions lacking
// any of the indicators are skipped, the focus itself is never chosen, an
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
	for _, k := range inds {
		if _, has := r.d.Value(k, r.focus, year); !has {
			r.errAt(spec.Pos, "group %q: the focus %s has no value of %q in %d, so no institution can be measured against it; choose indicators the focus reports", spec.Name, r.b.Focus, r.d.Dictionary.Indicators[k].Key, year)
			ok = false
		}
	}
	if !ok {
		return nil
	}
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
	g.Defined = fmt.Sprintf("the %d institutions nearest %s on %s in %d (standardised Euclidean distance)", len(cands), r.b.Focus, strings.Join(ns.Indicators, ", "), year)
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

// each expands into one group per distinct non-empty value of a register
// field among the pool (and the optional where), in sorted order of the
// value so the order does not depend on the register's row order.
// Institutions with an empty value belong to none of the groups.
func (r *resolver) each(spec *brief.GroupSpec, over string) []*Group {
	if !r.d.Register.HasAttr(spec.Each) {
		fields := r.fields()
		msg := fmt.Sprintf("group %q: each %q is not a column of the register %s", spec.Name, spec.Each, r.d.Register.File)
		if s := yamlx.Nearest(spec.Each, fields); s != "" {
			msg += fmt.Sprintf("; did you mean %q?", s)
		}
		r.errAt(spec.Pos, "%s (columns are %s)", msg, strings.Join(fields, ", "))
		return nil
	}
	if !r.checkFilter(spec, spec.Where) {
		return nil
	}
	pool := r.pool(over)
	byValue := map[string]*Group{}
	var values []string
	n := r.d.Register.Len()
	for i, in := range r.d.Register.Institutions {
		if !pool[i] || !matches(in, spec.Where) {
			continue
		}
		v, _ := in.Attr(spec.Each)
		if strings.TrimSpace(v) == "" {
			continue
		}
		g, ok := byValue[v]
		if !ok {
			name := v
			if spec.Name != "" {
				name = spec.Name + ": " + v
			}
			g = newGroup(name, "each", n)
			g.EachField, g.EachValue = spec.Each, v
			g.Defined = fmt.Sprintf("%s is %s", spec.Each, v)
			if restrictsOther(spec.Where, spec.Each) {
				g.Defined += ", among those where " + describeFilter(spec.Where)
			}
			byValue[v] = g
			values = append(values, v)
		}
		g.add(i)
	}
	sort.Strings(values)
	out := make([]*Group, len(values))
	for i, v := range values {
		out[i] = byValue[v]
	}
	return out
}

// unknownIndicator words the problem of an indicator key missing from the
// dictionary, with a suggestion.
func unknownIndicator(d *dataset.Dataset, where, key string) string {
	msg := fmt.Sprintf("%s: indicator %q is not in the dictionary %s", where, key, d.Dictionary.File)
	if s := yamlx.Nearest(key, d.Dictionary.Keys()); s != "" {
		msg += fmt.Sprintf("; did you mean %q?", s)
	}
	return msg
}

// restrictsOther reports whether a filter has a condition on a field other
// than field; a where that only picks which values of an each field to
// expand need not be restated in every group's definition.
func restrictsOther(f *brief.Filter, field string) bool {
	if f == nil {
		return false
	}
	for _, c := range f.Conds {
		if c.Attr != field {
			return true
		}
	}
	return false
}
