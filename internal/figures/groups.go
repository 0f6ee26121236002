package figures

import (
	"fmt"
	"sort"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/yamlx"
)

// resolver turns the brief's group definitions into member lists.
type resolver struct {
	d     *dataset.Dataset
	b     *brief.Brief
	focus int
	probs *diag.List
	// pm is the peers: section's clustering, for cluster groups.
	pm *Peers
	// years are the span's years in the data, for members by year.
	years []int
	// emptied names the groups of an each expansion that the population
	// rules left without members, with why, so a block naming one is told
	// that rather than "not defined".
	emptied map[string]string
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
		if spec.Each == "" && strings.Contains(spec.Phrase, PhraseValue) {
			r.errAt(spec.Pos, "group %q: phrase %q uses %s, which only an each group has; write the words in full", spec.Name, spec.Phrase, PhraseValue)
		}
		var gs []*Group
		switch {
		case spec.Each != "":
			gs = r.each(spec, over)
		case len(spec.Members) > 0:
			gs = r.members(spec, over)
		case spec.Nearest != nil:
			gs = r.nearest(spec, over)
		case spec.Cluster != nil:
			gs = r.clusterGroup(spec)
		case spec.Where != nil:
			gs = r.where(spec, over)
		}
		r.checkEmpty(spec, over, gs)
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
			g.Phrase = phraseOf(spec.Phrase, g.EachValue)
			g.FocusIn = g.Has(r.focus)
			r.yearly(spec, g, r.years)
			out = append(out, g)
		}
	}
	return out
}

// checkEmpty refuses a group left without members: no statistic exists for
// an empty group (a rank "0th of 0", a percentile of nothing). The message
// says how many the population rules left out, so the fix is plain.
func (r *resolver) checkEmpty(spec *brief.GroupSpec, over string, gs []*Group) {
	name := spec.Name
	if spec.Each != "" {
		r.checkEmptyEach(spec, over, gs)
		return
	}
	for _, g := range gs {
		if len(g.Members) > 0 {
			continue
		}
		if over == "ranked" && r.d.Population != nil {
			if left := r.wouldHold(spec); left > 0 {
				r.errAt(spec.Pos, "group %q has no members: the population rules leave out %s it would hold; add over: all to the group, or loosen the population rules", name, allOf(left))
				continue
			}
		}
		r.errAt(spec.Pos, "group %q has no members; check its definition against the register", name)
	}
}

// wouldHold counts the institutions a group would hold over the whole
// register.
func (r *resolver) wouldHold(spec *brief.GroupSpec) int {
	switch {
	case len(spec.Members) > 0:
		return len(spec.Members)
	case spec.Where != nil && spec.Nearest == nil:
		n := 0
		for _, in := range r.d.Register.Institutions {
			if matches(in, spec.Where) {
				n++
			}
		}
		return n
	}
	return 0
}

// checkEmptyEach records the values of an each group whose institutions
// the population rules all left out, and refuses the definition when no
// value keeps a member.
func (r *resolver) checkEmptyEach(spec *brief.GroupSpec, over string, gs []*Group) {
	if over != "ranked" || r.d.Population == nil || !r.d.Register.HasAttr(spec.Each) {
		return
	}
	kept := map[string]bool{}
	for _, g := range gs {
		kept[g.EachValue] = true
	}
	lost := map[string]int{}
	var values []string
	for _, in := range r.d.Register.Institutions {
		v, _ := in.Attr(spec.Each)
		if strings.TrimSpace(v) == "" || kept[v] || !matches(in, spec.Where) {
			continue
		}
		if lost[v] == 0 {
			values = append(values, v)
		}
		lost[v]++
	}
	sort.Strings(values)
	if r.emptied == nil {
		r.emptied = map[string]string{}
	}
	for _, v := range values {
		name := v
		if spec.Name != "" {
			name = spec.Name + ": " + v
		}
		r.emptied[name] = fmt.Sprintf("the population rules leave out %s with %s %s; add over: all to the each group at line %d, or loosen the population rules", allOf(lost[v]), spec.Each, v, spec.Pos.Line)
	}
	if len(gs) == 0 && len(values) > 0 {
		label := spec.Name
		if label == "" {
			label = "each " + spec.Each
		}
		total := 0
		for _, v := range values {
			total += lost[v]
		}
		r.errAt(spec.Pos, "group %q has no members: the population rules leave out %s with a %s; add over: all to the group, or loosen the population rules", label, allOf(total), spec.Each)
	}
}

// allOf says "the one institution" or "all 12 institutions".
func allOf(n int) string {
	if n == 1 {
		return "the one institution"
	}
	return "all " + count(n) + " institutions"
}

// count prints a count with thousands separators ("1,204").
func count(n int) string {
	s := fmt.Sprint(n)
	for i := len(s) - 3; i > 0; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
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
