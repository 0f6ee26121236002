package charts

import (
	"fmt"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/yamlx"
)

// specError is a problem with a chart block, positioned at its fence. The
// file is left empty: the layout, which knows the brief's path, fills it
// in (see DEVELOPERS.md).
func specError(spec *brief.ChartBlock, format string, args ...any) error {
	p := spec.Position()
	return diag.At("", p.Line, p.Column, "%s chart: "+format, append([]any{spec.Type}, args...)...)
}

// chartIndicators resolves the block's indicator keys in the dictionary.
func chartIndicators(m *figures.Model, spec *brief.ChartBlock) ([]dataset.Indicator, error) {
	if len(spec.Indicators) == 0 {
		return nil, specError(spec, "no indicators given; list indicator keys from the dictionary under indicators")
	}
	out := make([]dataset.Indicator, 0, len(spec.Indicators))
	for _, k := range spec.Indicators {
		ind, ok := m.Indicator(k)
		if !ok {
			msg := fmt.Sprintf("indicator %q is not in the dictionary", k)
			if s := yamlx.Nearest(k, m.Data.Dictionary.Keys()); s != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", s)
			}
			return nil, specError(spec, "%s", msg)
		}
		out = append(out, ind)
	}
	return out, nil
}

// chartGroups resolves the block's groups, or every group of the brief in
// brief order when the block names none.
func chartGroups(m *figures.Model, spec *brief.ChartBlock) ([]*figures.Group, error) {
	if len(spec.Groups) == 0 {
		if len(m.Groups) == 0 {
			return nil, specError(spec, "the brief defines no comparison groups; add groups to the front matter")
		}
		return m.Groups, nil
	}
	names := make([]string, len(m.Groups))
	for i, g := range m.Groups {
		names[i] = g.Name
	}
	out := make([]*figures.Group, 0, len(spec.Groups))
	for _, n := range spec.Groups {
		// A name may stand for one group or for every group an "each"
		// definition expanded into.
		gs := m.GroupsOf(n)
		if len(gs) == 0 {
			msg := fmt.Sprintf("group %q is not defined in the brief", n)
			if s := yamlx.Nearest(n, names); s != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", s)
			}
			return nil, specError(spec, "%s; groups are %s", msg, strings.Join(names, ", "))
		}
		out = append(out, gs...)
	}
	return out, nil
}

// chartYear is the block's year, else the brief's.
// chartSubjects resolves what most kinds draw: the block's indicators,
// groups and labelled institutions, the first problem returned.
func chartSubjects(m *figures.Model, spec *brief.ChartBlock) ([]dataset.Indicator, []*figures.Group, []int, error) {
	inds, err := chartIndicators(m, spec)
	if err != nil {
		return nil, nil, nil, err
	}
	groups, err := chartGroups(m, spec)
	if err != nil {
		return nil, nil, nil, err
	}
	marks, err := labelled(m, spec)
	if err != nil {
		return nil, nil, nil, err
	}
	return inds, groups, marks, nil
}

func chartYear(m *figures.Model, spec *brief.ChartBlock) int {
	if spec.Year != 0 {
		return spec.Year
	}
	return m.Year
}

// labelled resolves the block's label list (register ids, or names as
// written in the register) to register positions, the focus left out
// since it is always marked.
func labelled(m *figures.Model, spec *brief.ChartBlock) ([]int, error) {
	reg := m.Data.Register
	var out []int
	for _, s := range spec.Label {
		i := reg.Index(s)
		if i < 0 {
			for j, in := range reg.Institutions {
				if in.Name == s {
					i = j
					break
				}
				if sn, ok := in.Attr(shortNameAttr); ok && sn == s {
					i = j
					break
				}
			}
		}
		if i < 0 {
			return nil, specError(spec, "label %q is neither a register id nor an institution name; use the id column of %s", s, reg.File)
		}
		if i != m.Focus {
			out = append(out, i)
		}
	}
	return out, nil
}

// valueOf is an institution's value of an indicator in a year from the
// model's dataset (a raw observation, not a statistic).
func valueOf(m *figures.Model, ind dataset.Indicator, inst, year int) (float64, bool) {
	return m.Data.Value(m.Data.Dictionary.Index(ind.Key), inst, year)
}

func institution(m *figures.Model, inst int) dataset.Institution {
	return m.Data.Register.Institutions[inst]
}
