package dataset

import (
	"strconv"
	"strings"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
	"peerpack/internal/tabular"
	"peerpack/internal/yamlx"
)

// registerColumns are the columns every register has.
var registerColumns = []string{"id", "name", "country", "region"}

// ReadRegister builds the register from a table: columns id, name,
// country and region (in any order, names case-insensitive), any further
// columns kept as attributes. Ids must be unique; id, name and country must
// not be empty.
func ReadRegister(t *tabular.Table) (*Register, error) {
	var probs diag.List
	col := map[string]int{}
	var attrNames []string
	var attrCols []int
	seen := map[string]tabular.Cell{}
	var headerNames []string
	for _, h := range t.Header {
		headerNames = append(headerNames, strings.TrimSpace(h.Text))
	}
	for i, h := range t.Header {
		name := strings.TrimSpace(h.Text)
		low := strings.ToLower(name)
		if name == "" {
			probs.Addf(t.File, h.Line, h.Col, "column %d of the header has no name; name it or delete the column", i+1)
			continue
		}
		if prev, dup := seen[low]; dup {
			probs.Addf(t.File, h.Line, h.Col, "column %q appears twice in the header (first at column %d); keep one", name, prev.Col)
			continue
		}
		seen[low] = h
		if oneOf(low, registerColumns) {
			col[low] = i
			continue
		}
		attrNames = append(attrNames, name)
		attrCols = append(attrCols, i)
	}
	for _, need := range registerColumns {
		if _, ok := col[need]; ok {
			continue
		}
		line, c := 1, 1
		if len(t.Header) > 0 {
			line = t.Header[0].Line
		}
		msg := "the register has no column " + quote(need)
		if s := yamlx.Nearest(need, headerNames); s != "" {
			msg += "; is " + quote(s) + " meant to be " + quote(need) + "?"
		} else {
			msg += "; its header must include id, name, country and region (found " + strings.Join(headerNames, ", ") + ")"
		}
		probs.Addf(t.File, line, c, "%s", msg)
	}
	if probs.Len() > 0 {
		return nil, probs.Err()
	}
	insts := make([]Institution, 0, len(t.Rows))
	attrCells := map[string][]tabular.Cell{}
	first := map[string]int{}
	for _, row := range t.Rows {
		get := func(k string) tabular.Cell { return row[col[k]] }
		id := get("id")
		in := Institution{
			ID:      strings.TrimSpace(id.Text),
			Name:    strings.TrimSpace(get("name").Text),
			Country: strings.TrimSpace(get("country").Text),
			Region:  strings.TrimSpace(get("region").Text),
			Line:    id.Line,
		}
		bad := false
		for _, k := range []string{"id", "name", "country"} {
			if c := get(k); strings.TrimSpace(c.Text) == "" {
				probs.Addf(t.File, c.Line, c.Col, "%sthe %s of this institution is empty; every institution needs an id, a name and a country", cellName(t.File, c), k)
				bad = true
			}
		}
		if in.ID != "" {
			if prev, dup := first[in.ID]; dup {
				probs.Addf(t.File, id.Line, id.Col, "%sinstitution id %q is used twice: here and at %s:%d; ids must be unique", cellName(t.File, id), in.ID, t.File, prev)
				bad = true
			} else {
				first[in.ID] = id.Line
			}
		}
		if bad {
			continue
		}
		in.Attrs = make(map[string]string, len(attrNames))
		for j, name := range attrNames {
			c := row[attrCols[j]]
			in.Attrs[name] = strings.TrimSpace(c.Text)
			attrCells[name] = append(attrCells[name], c)
		}
		insts = append(insts, in)
	}
	if len(insts) == 0 && probs.Len() == 0 {
		probs.Addf(t.File, 0, 0, "the register lists no institutions; add one row per institution under the header")
	}
	r := NewRegister(t.File, insts, attrNames)
	r.attrCells = attrCells
	return r, probs.Err()
}

func quote(s string) string { return "\"" + s + "\"" }

func (l *loader) register(name string) *Register {
	t, err := tabular.ReadTableWith(l.fsys, name, l.lim)
	if err != nil {
		l.probs.Add(err)
		if t == nil {
			return nil
		}
	}
	if n := int64(len(t.Rows)); t != nil && l.lim.Exceeded(limits.Institutions, n) {
		row := t.Rows[l.lim.Institutions]
		l.probs.Addf(t.File, row[0].Line, row[0].Col, "the register has %s", l.lim.Over(limits.Institutions, n, ""))
		return nil
	}
	r, err := ReadRegister(t)
	l.probs.Add(err)
	if r != nil {
		l.rep.Files = append(l.rep.Files, FileSummary{Role: "register", Path: name, Rows: len(t.Rows)})
	}
	return r
}

// cellName returns "cell C12: " for a cell of a workbook, so that a message
// names the cell as the spreadsheet shows it, and "" for a CSV file.
func cellName(file string, c tabular.Cell) string {
	name, _, _ := strings.Cut(strings.ToLower(file), "#")
	if !strings.HasSuffix(name, ".xlsx") && !strings.HasSuffix(name, ".xlsm") {
		return ""
	}
	if c.Line < 1 || c.Col < 1 {
		return ""
	}
	return "cell " + tabular.ColumnName(c.Col) + strconv.Itoa(c.Line) + ": "
}
