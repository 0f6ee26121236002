package figures

import (
	"fmt"
	"math"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/stats"
	"peerpack/internal/yamlx"
)

// SectionSystem holds what a comparison group is before and after the
// population rules, and its medians weighted by size: the figures of the
// systems table and of the systems commentary topic.
//
// Keys (`section/group/indicator/institution/year/measure`):
//
//   - `system/G////n_defined`: institutions of the whole register that
//     G's definition holds, before the population rules (where, each and
//     members groups only);
//   - `system/G////n_ranked`: of those, how many pass the population rules;
//   - `system/G////share_ranked`: 100 x n_ranked / n_defined;
//   - `system/G/I//Y/median_weighted`: the median of I over G's members in
//     year Y, each member weighted by its value of the brief's size_weight
//     indicator in Y (stats.WeightedMedian);
//   - `system/G/I//Y/weight_n`: the members with both a value of I and a
//     positive weight, over which median_weighted is taken;
//   - `system/G/I//Y/weighted_minus_median`: median_weighted minus the
//     unweighted median (distribution/G/I//Y/median) of the same members
//     reporting I;
//   - `system/G/I///median_change_per_iqr`: the absolute change of G's
//     median of I over the span (trend/G/I///median_change) divided by
//     G's interquartile range of I in the last year of that change, the
//     share the "broadly unchanged" rule reads (as change_per_iqr does for
//     an institution);
//   - `system/////size_weight` (text): the size_weight indicator's key.
const SectionSystem = "system"

// Measures of the system section.
const (
	MeasureDefined        = "n_defined"
	MeasureRanked         = "n_ranked"
	MeasureShareRanked    = "share_ranked"
	MeasureWeightedMedian = "median_weighted"
	MeasureWeightN        = "weight_n"
	MeasureWeightedGap    = "weighted_minus_median"
	MeasureSizeWeight     = "size_weight"
	MeasureMedianPerIQR   = "median_change_per_iqr"
)

// SystemKey is the key of a system-section figure.
func SystemKey(group, ind string, year int, measure string) Key {
	return Key{Section: SectionSystem, Group: group, Indicator: ind, Year: year, Measure: measure}
}

// checkSizeWeight refuses a size_weight that is not an indicator of the
// dictionary, or whose values cannot be sizes.
func checkSizeWeight(d *dataset.Dataset, b *brief.Brief, probs *diag.List) {
	if b.SizeWeight == "" {
		return
	}
	p := b.PosOf("size_weight")
	ind, ok := d.Dictionary.Lookup(b.SizeWeight)
	if !ok {
		msg := fmt.Sprintf("size_weight %q is not an indicator of the dictionary", b.SizeWeight)
		if s := yamlx.Nearest(b.SizeWeight, d.Dictionary.Keys()); s != "" {
			msg += fmt.Sprintf(" (did you mean %q?)", s)
		}
		probs.Addf(b.File, p.Line, p.Column, "%s; name a size such as students or academic staff", msg)
		return
	}
	switch ind.Unit {
	case dataset.UnitCount, dataset.UnitCurrency:
	default:
		probs.Addf(b.File, p.Line, p.Column, "size_weight %q is measured in %s, not a size; name a count (students, academic staff) or an amount of money", b.SizeWeight, ind.Unit)
	}
}

// systemScope is what the system section covers: the groups and
// indicators of the brief's systems tables and systems commentary (every
// group, or every dictionary indicator, when such a block names none).
func (m *Model) systemScope(b *brief.Brief) (groups []*Group, inds []string) {
	seenG, seenI := map[string]bool{}, map[string]bool{}
	allG, allI := false, false
	use := func(gs, is []string, needInds bool) {
		if len(gs) == 0 {
			allG = true
		}
		for _, name := range gs {
			for _, g := range m.GroupsOf(name) {
				if !seenG[g.Name] {
					seenG[g.Name] = true
					groups = append(groups, g)
				}
			}
		}
		if !needInds {
			return
		}
		if len(is) == 0 {
			allI = true
		}
		for _, k := range is {
			if !seenI[k] {
				seenI[k] = true
				inds = append(inds, k)
			}
		}
	}
	found := false
	for _, blk := range b.Blocks {
		switch v := blk.(type) {
		case *brief.TableBlock:
			if v.Type == "systems" {
				found = true
				use(v.Groups, v.Indicators, len(v.Indicators) > 0)
			}
		case *brief.CommentaryBlock:
			for _, t := range v.Topics {
				if t == "systems" {
					found = true
					use(v.Groups, v.Indicators, true)
				}
			}
		}
	}
	if !found {
		return nil, nil
	}
	if allG {
		groups = m.Groups
	}
	if allI {
		inds = m.Data.Dictionary.Keys()
	}
	return groups, inds
}

// systemRows computes the system section once, for the later stages to
// read through Lookup (tables and sentences print the same figures).
func (m *Model) systemRows(b *brief.Brief) []Row {
	groups, inds := m.systemScope(b)
	if len(groups) == 0 {
		return nil
	}
	d := m.Data
	var out []Row
	counts := m.definedCounts(b, groups)
	for _, g := range groups {
		c, ok := counts[g.Name]
		if !ok || c[0] == 0 {
			continue
		}
		out = append(out,
			Row{Key: SystemKey(g.Name, "", 0, MeasureDefined), Value: float64(c[0])},
			Row{Key: SystemKey(g.Name, "", 0, MeasureRanked), Value: float64(c[1])},
			Row{Key: SystemKey(g.Name, "", 0, MeasureShareRanked), Value: 100 * float64(c[1]) / float64(c[0])})
	}
	for _, g := range groups {
		for _, k := range inds {
			gt, ok := m.GroupTrend(g.Name, k)
			if !ok || !gt.Valid {
				continue
			}
			if dist, ok := m.Distribution(g.Name, k, gt.EndYear); ok && dist.N > 0 && dist.IQR > 0 {
				out = append(out, Row{Key: SystemKey(g.Name, k, 0, MeasureMedianPerIQR), Value: math.Abs(gt.Change) / dist.IQR})
			}
		}
	}
	if b.SizeWeight == "" {
		return out
	}
	out = append(out, Row{Key: SystemKey("", "", 0, MeasureSizeWeight), Text: b.SizeWeight, IsText: true})
	wcol := d.Column(d.Dictionary.Index(b.SizeWeight), m.Year)
	if wcol == nil {
		return out
	}
	for _, g := range groups {
		for _, k := range inds {
			col := d.Column(d.Dictionary.Index(k), m.Year)
			if col == nil {
				continue
			}
			vs := make([]float64, 0, len(g.Members))
			ws := make([]float64, 0, len(g.Members))
			for _, i := range g.Members {
				vs = append(vs, col[i])
				ws = append(ws, wcol[i])
			}
			wm, n, ok := stats.WeightedMedian(vs, ws)
			if !ok {
				continue
			}
			out = append(out,
				Row{Key: SystemKey(g.Name, k, m.Year, MeasureWeightedMedian), Value: wm},
				Row{Key: SystemKey(g.Name, k, m.Year, MeasureWeightN), Value: float64(n)})
			if dist, ok := m.Distribution(g.Name, k, m.Year); ok && dist.N > 0 && !math.IsNaN(dist.Median) {
				out = append(out, Row{Key: SystemKey(g.Name, k, m.Year, MeasureWeightedGap), Value: wm - dist.Median})
			}
		}
	}
	return out
}

// definedCounts returns, per group name, the institutions its definition
// holds in the whole register and how many of them pass the population
// rules. Groups chosen by likeness (nearest, cluster) have no definition
// outside the ranked population and get none. One pass over the register
// per group definition.
func (m *Model) definedCounts(b *brief.Brief, groups []*Group) map[string][2]int {
	want := map[string]bool{}
	for _, g := range groups {
		want[g.Name] = true
	}
	out := map[string][2]int{}
	d := m.Data
	reg := d.Register
	for _, spec := range b.Groups {
		switch {
		case spec.Nearest != nil || spec.Cluster != nil:
			continue
		case spec.Each != "":
			if !reg.HasAttr(spec.Each) {
				continue
			}
			by := map[string][2]int{}
			for i, in := range reg.Institutions {
				if !matches(in, spec.Where) {
					continue
				}
				v, _ := in.Attr(spec.Each)
				if strings.TrimSpace(v) == "" {
					continue
				}
				c := by[v]
				c[0]++
				if d.InPopulation(i) {
					c[1]++
				}
				by[v] = c
			}
			for v, c := range by {
				name := v
				if spec.Name != "" {
					name = spec.Name + ": " + v
				}
				if want[name] {
					out[name] = c
				}
			}
		case len(spec.Members) > 0:
			if !want[spec.Name] {
				continue
			}
			var c [2]int
			seen := map[int]bool{}
			for _, id := range spec.Members {
				if i := reg.Index(id); i >= 0 && !seen[i] {
					seen[i] = true
					c[0]++
					if d.InPopulation(i) {
						c[1]++
					}
				}
			}
			out[spec.Name] = c
		case spec.Where != nil:
			if !want[spec.Name] {
				continue
			}
			var c [2]int
			for i, in := range reg.Institutions {
				if matches(in, spec.Where) {
					c[0]++
					if d.InPopulation(i) {
						c[1]++
					}
				}
			}
			out[spec.Name] = c
		}
	}
	return out
}

// SystemFigure returns one figure of the system section.
func (m *Model) SystemFigure(group, ind string, year int, measure string) (float64, bool) {
	r, ok := m.Lookup(SystemKey(group, ind, year, measure))
	if !ok || r.IsText {
		return math.NaN(), false
	}
	return r.Value, true
}

// SizeWeight returns the indicator groups are weighted by, when the brief
// names one.
func (m *Model) SizeWeight() (dataset.Indicator, bool) {
	r, ok := m.Lookup(SystemKey("", "", 0, MeasureSizeWeight))
	if !ok {
		return dataset.Indicator{}, false
	}
	return m.Indicator(r.Text)
}
