package figures

import (
	"slices"
	"sort"
	"strings"

	"peerpack/internal/brief"
)

// A group's members in the span's earlier years. Membership is decided in
// the reporting year (Group.Members); when the population rules are
// applied as of each year (the default, dataset.Population.ByYear), a
// group's members in another year are those its definition admits among
// that year's ranked population:
//
//   - where and each groups: the register rows matching the definition;
//   - members groups: the listed institutions;
//   - nearest and cluster groups: the peers chosen in the reporting year
//     (similarity is judged once, on the reporting year's profiles);
//
// each kept when it is in that year's ranked population (or always, for a
// group over: all). With a fixed panel (earlier_years: fixed), no rules or
// over: all, every year has the reporting year's members.

// MembersIn returns the register positions of the group's members in a
// year, ascending: Members in the reporting year and whenever the
// population does not change from year to year.
func (g *Group) MembersIn(year int) []int {
	if ms, ok := g.byYear[year]; ok {
		return ms
	}
	return g.Members
}

// HasIn reports whether register position inst is a member in a year.
func (g *Group) HasIn(inst, year int) bool {
	ms, ok := g.byYear[year]
	if !ok {
		return g.Has(inst)
	}
	_, found := slices.BinarySearch(ms, inst)
	return found
}

// VariesByYear reports whether the group's members differ in some year
// of the span from the reporting year's.
func (g *Group) VariesByYear() bool { return len(g.byYear) > 0 }

// spanYears returns the years of the brief's span present in the data.
func spanYears(years []int, first, last int) []int {
	var out []int
	for _, y := range years {
		if y >= first && y <= last {
			out = append(out, y)
		}
	}
	return out
}

// yearly sets a resolved group's members in every span year other than
// the reporting year, keeping only the years whose members differ.
func (r *resolver) yearly(spec *brief.GroupSpec, g *Group, years []int) {
	if !r.d.PopulationByYear() || g.Over == "all" {
		return
	}
	candidates := r.candidates(spec, g)
	for _, y := range years {
		if y == r.b.Year {
			continue
		}
		var ms []int
		for _, i := range candidates {
			if r.d.InPopulationIn(i, y) {
				ms = append(ms, i)
			}
		}
		if slices.Equal(ms, g.Members) {
			continue
		}
		if g.byYear == nil {
			g.byYear = map[int][]int{}
		}
		if ms == nil {
			ms = []int{}
		}
		g.byYear[y] = ms
	}
}

// candidates returns, ascending, the institutions a group's definition
// admits before the population rules (see the comment at the top).
func (r *resolver) candidates(spec *brief.GroupSpec, g *Group) []int {
	var out []int
	switch g.Kind {
	case "where", "each":
		for i, in := range r.d.Register.Institutions {
			if !matches(in, spec.Where) {
				continue
			}
			if g.Kind == "each" {
				if v, _ := in.Attr(g.EachField); strings.TrimSpace(v) == "" || v != g.EachValue {
					continue
				}
			}
			out = append(out, i)
		}
	case "members":
		for _, id := range spec.Members {
			if i := r.d.Register.Index(id); i >= 0 {
				out = append(out, i)
			}
		}
		sort.Ints(out)
		out = slices.Compact(out)
	default:
		out = append(out, g.Members...)
	}
	return out
}

// populationYearRows yields, when the rules are applied as of each year,
// every span year's ranked and excluded counts (section population, year
// set, no institution).
func (m *Model) populationYearRows(f rowSink) bool {
	if !m.Data.PopulationByYear() {
		return true
	}
	n := m.Data.Register.Len()
	for _, y := range m.Years {
		ranked := m.Data.RankedIn(y)
		k := Key{Section: SectionPopulation, Year: y}
		k.Measure = "n_excluded"
		if !emitNum(f, k, float64(n-ranked)) {
			return false
		}
		k.Measure = "n_ranked"
		if !emitNum(f, k, float64(ranked)) {
			return false
		}
	}
	return true
}

// groupYearRows yields, for a group whose members change from year to
// year, each span year's member count (section group, year set, no
// institution).
func (m *Model) groupYearRows(f rowSink, g *Group) bool {
	if !g.VariesByYear() {
		return true
	}
	for _, y := range m.Years {
		k := Key{Section: SectionGroup, Group: g.Name, Year: y, Measure: "n_members"}
		if !emitNum(f, k, float64(len(g.MembersIn(y)))) {
			return false
		}
	}
	return true
}
