package dataset

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"peerpack/internal/derive"
	"peerpack/internal/tabular"
	"peerpack/internal/yamlx"
)

// derive computes every derived indicator for every institution and year,
// in dependency order, after PPP conversion so that money amounts in a
// derivation are already in international dollars. A derived value is
// missing (NaN) when an input is missing or a divisor is zero; both are
// counted for the check summary.
func (l *loader) derive(d *Dataset, defs map[string]*Derived) {
	if len(defs) == 0 {
		return
	}
	dict := d.Dictionary
	reg := d.Register
	exprs := map[string]*derive.Expr{}
	names := append(dict.Keys(), reg.AttrNames...)
	usable := true
	for _, k := range dict.Keys() {
		def, ok := defs[k]
		if !ok {
			continue
		}
		exprs[k] = def.Expr
		for _, ref := range def.Expr.Refs() {
			if dict.Index(ref) >= 0 {
				if reg.HasAttr(ref) {
					l.probs.Addf(dict.File, def.Line, def.Col+def.Expr.RefAt(ref)-1, "derive of %q reads %q, which is both an indicator key and a column of %s; rename the register column so the expression is unambiguous", k, ref, reg.File)
					usable = false
				}
				continue
			}
			if reg.HasAttr(ref) && !oneOf(ref, registerColumns) {
				continue
			}
			msg := fmt.Sprintf("derive of %q reads %q, which is neither an indicator key in the dictionary nor a register column", k, ref)
			if s := yamlx.Nearest(ref, names); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			} else {
				msg += "; add it to the dictionary or the register, or correct the name"
			}
			if oneOf(ref, registerColumns) {
				msg = fmt.Sprintf("derive of %q reads %q, a text column of the register; derivations read numbers only, so use an indicator key or a numeric register column", k, ref)
			}
			l.probs.Addf(dict.File, def.Line, def.Col+def.Expr.RefAt(ref)-1, "%s", msg)
			usable = false
		}
	}
	order, err := derive.Order(dict.Keys(), exprs)
	if err != nil {
		var ce *derive.CycleError
		if errors.As(err, &ce) {
			def := defs[ce.Path[0]]
			l.probs.Addf(dict.File, def.Line, def.Col, "%s", err)
		} else {
			l.probs.Add(err)
		}
		return
	}
	if !usable {
		return
	}
	attrs := map[string][]float64{}
	for _, k := range order {
		for _, ref := range exprs[k].Refs() {
			if dict.Index(ref) < 0 && attrs[ref] == nil {
				attrs[ref] = l.numericAttr(reg, ref)
			}
		}
	}
	cols := map[string][]float64{}
	for _, k := range order {
		ind := dict.Index(k)
		expr := exprs[k]
		refs := expr.Refs()
		out := DerivedOutcome{Key: k, Expr: expr.Source}
		for y, year := range d.Years {
			for _, r := range refs {
				if i := dict.Index(r); i >= 0 {
					cols[r] = d.cols[i*len(d.Years)+y]
				} else {
					cols[r] = attrs[r]
				}
			}
			dst := d.cols[ind*len(d.Years)+y]
			inst := 0
			lookup := func(name string) float64 { return cols[name][inst] }
			for inst = range dst {
				v, why := expr.Eval(lookup)
				dst[inst] = v
				switch why {
				case derive.OK:
					out.Computed++
				case derive.MissingInput:
					out.MissingInput++
				case derive.DivideByZero:
					out.DivideByZero++
				}
			}
			_ = year
		}
		d.DerivedMissing[k] = out.MissingInput + out.DivideByZero
		l.rep.Derived = append(l.rep.Derived, out)
	}
	sort.SliceStable(l.rep.Derived, func(i, j int) bool {
		return dict.Index(l.rep.Derived[i].Key) < dict.Index(l.rep.Derived[j].Key)
	})
}

// numericAttr reads a register column as numbers for a derivation; an
// empty cell is missing and any other non-number is reported where it was
// written.
func (l *loader) numericAttr(reg *Register, name string) []float64 {
	out := make([]float64, reg.Len())
	cells := reg.attrCells[name]
	for i, in := range reg.Institutions {
		v, empty, err := tabular.ParseNumber(in.Attrs[name])
		switch {
		case empty:
			out[i] = math.NaN()
		case err != nil:
			out[i] = math.NaN()
			line, col := in.Line, 0
			if i < len(cells) {
				line, col = cells[i].Line, cells[i].Col
			}
			l.probs.Addf(reg.File, line, col, "%s of %s is used in a derivation and must be a number: %s", name, in.ID, err)
		default:
			out[i] = v
		}
	}
	return out
}
