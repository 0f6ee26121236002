package figures

import (
	"fmt"
	"sort"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/yamlx"
)

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
