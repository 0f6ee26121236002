package dataset

import (
	"fmt"
	"io/fs"
	"strings"

	"gopkg.in/yaml.v3"

	"peerpack/internal/derive"
	"peerpack/internal/diag"
	"peerpack/internal/yamlx"
)

// reservedKeys are column names of the values files that an indicator key
// would collide with in a wide file's header.
var reservedKeys = []string{"institution", "year", "indicator", "value", "note"}

// Derived is a parsed derive: expression of one indicator.
type Derived struct {
	Key  string
	Expr *derive.Expr
	// Line and Col locate the expression in the dictionary.
	Line, Col int
}

// dictionaryFile is the dictionary's YAML shape.
type dictionaryFile struct {
	Indicators []Indicator `yaml:"indicators"`
}

// ParseDictionary decodes and checks an indicator dictionary. It returns
// the dictionary (usable when only some entries are wrong), the parsed
// derive expressions by key, and every problem found.
func ParseDictionary(file string, src []byte) (*Dictionary, map[string]*Derived, error) {
	var probs diag.List
	node, err := yamlx.Parse(file, src, 0)
	if err != nil {
		return nil, nil, err
	}
	var df dictionaryFile
	if err := yamlx.Decode(file, node, &df); err != nil {
		return nil, nil, err
	}
	items := indicatorNodes(node)
	if len(df.Indicators) == 0 {
		return nil, nil, diag.At(file, node.Line, node.Column, "the dictionary has no indicators; write a top-level list, e.g.\nindicators:\n  - {key: papers, label: Papers published, unit: count, better: higher, decimals: 0}")
	}
	seen := map[string]int{}
	derived := map[string]*Derived{}
	var kept []Indicator
	for i := range df.Indicators {
		ind := &df.Indicators[i]
		item := items[i]
		ind.Line, ind.Column = item.Line, item.Column
		at := func(field string) (int, int) {
			if k, v := fieldNode(item, field); k != nil {
				return v.Line, v.Column
			}
			return item.Line, item.Column
		}
		addf := func(field, format string, args ...any) {
			l, c := at(field)
			probs.Addf(file, l, c, format, args...)
		}
		ok := true
		switch {
		case ind.Key == "":
			addf("key", "indicator %d has no key; add key: with a short name of letters, digits and underscores, e.g. key: papers", i+1)
			ok = false
		case !validKey(ind.Key):
			addf("key", "key %q must be letters, digits and underscores, starting with a letter (it is used in derive: expressions and column headers), e.g. %s", ind.Key, suggestKey(ind.Key))
			ok = false
		case derive.IsReserved(ind.Key) || oneOf(ind.Key, reservedKeys):
			addf("key", "key %q is a reserved word (%s, %s); choose another key", ind.Key, strings.Join(derive.Reserved, ", "), strings.Join(reservedKeys, ", "))
			ok = false
		}
		if prev, dup := seen[ind.Key]; dup && ind.Key != "" {
			addf("key", "key %q is used twice (first at line %d); keys must be unique", ind.Key, prev)
			ok = false
		}
		seen[ind.Key] = ind.Line
		if strings.TrimSpace(ind.Label) == "" {
			addf("label", "indicator %q has no label; add label: with the name readers see, e.g. label: Papers per academic", ind.Key)
		}
		if ind.Short == "" {
			ind.Short = ind.Label
		}
		if !unitKnown(ind.Unit) {
			if ind.Unit == "" {
				addf("key", "indicator %q has no unit; add unit: one of %s", ind.Key, unitList())
			} else {
				msg := fmt.Sprintf("unit %q is not known", ind.Unit)
				if s := yamlx.Nearest(string(ind.Unit), unitNames()); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				addf("unit", "%s (units are %s)", msg, unitList())
			}
		}
		switch ind.Better {
		case HigherIsBetter, LowerIsBetter, Neutral:
		case "":
			addf("key", "indicator %q has no better:; say which direction is better: higher, lower or neutral", ind.Key)
		default:
			msg := fmt.Sprintf("better %q is not known", ind.Better)
			if s := yamlx.Nearest(string(ind.Better), []string{"higher", "lower", "neutral"}); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			addf("better", "%s (use higher, lower or neutral)", msg)
		}
		if ind.Decimals < 0 || ind.Decimals > 6 {
			addf("decimals", "decimals %d is out of range; use 0 to 6 (digits after the decimal point when printed)", ind.Decimals)
		}
		if ind.Currency && ind.Unit != UnitCurrency && unitKnown(ind.Unit) {
			addf("currency", "currency: true needs unit: currency (found unit %q); money amounts are converted with the PPP factors", ind.Unit)
		}
		for _, m := range ind.Missing {
			if strings.TrimSpace(m) == "" {
				addf("missing", "an empty entry in missing: means nothing (an empty cell is always missing); remove it")
			}
		}
		if ind.Derive != "" {
			k, v := fieldNode(item, "derive")
			line, col := item.Line, item.Column
			if k != nil {
				line, col = v.Line, v.Column
				if v.Style == yaml.DoubleQuotedStyle || v.Style == yaml.SingleQuotedStyle {
					col++
				}
			}
			expr, err := derive.Parse(ind.Derive)
			if err != nil {
				de, _ := err.(*derive.Error)
				c := col
				if de != nil && v != nil && v.Style != yaml.LiteralStyle && v.Style != yaml.FoldedStyle && !strings.Contains(ind.Derive, "\n") {
					c = col + de.Col - 1
				}
				msg := err.Error()
				if de != nil {
					msg = de.Msg
				}
				probs.Addf(file, line, c, "derive of %q: %s", ind.Key, msg)
			} else if ok {
				if expr.Percent && ind.Unit != UnitPercent && unitKnown(ind.Unit) {
					probs.Addf(file, line, col, "derive of %q: share of X in Y gives a percent (X / Y * 100) but the unit is %q; set unit: percent, or write ratio of X to Y for a share of 1", ind.Key, ind.Unit)
				}
				derived[ind.Key] = &Derived{Key: ind.Key, Expr: expr, Line: line, Col: col}
			}
		}
		if ok {
			kept = append(kept, *ind)
		}
	}
	if len(kept) == 0 {
		return nil, nil, probs.Err()
	}
	return NewDictionary(file, kept), derived, probs.Err()
}

func indicatorNodes(root *yaml.Node) []*yaml.Node {
	if _, v := fieldNode(root, "indicators"); v != nil && v.Kind == yaml.SequenceNode {
		return v.Content
	}
	return nil
}

// fieldNode returns the key and value nodes of a mapping entry.
func fieldNode(m *yaml.Node, name string) (*yaml.Node, *yaml.Node) {
	if m == nil || m.Kind != yaml.MappingNode {
		return nil, nil
	}
	for i := 0; i+1 < len(m.Content); i += 2 {
		if m.Content[i].Value == name {
			return m.Content[i], m.Content[i+1]
		}
	}
	return nil, nil
}

func validKey(k string) bool {
	for i := 0; i < len(k); i++ {
		c := k[i]
		letter := c == '_' || (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z')
		if !letter && (i == 0 || c < '0' || c > '9') {
			return false
		}
	}
	return k != ""
}

func suggestKey(k string) string {
	var b strings.Builder
	for _, r := range strings.ToLower(k) {
		switch {
		case r >= 'a' && r <= 'z', r >= '0' && r <= '9':
			b.WriteRune(r)
		default:
			b.WriteByte('_')
		}
	}
	s := strings.Trim(b.String(), "_")
	if s == "" || (s[0] >= '0' && s[0] <= '9') {
		s = "x_" + s
	}
	return s
}

func unitKnown(u Unit) bool {
	for _, x := range Units {
		if x == u {
			return true
		}
	}
	return false
}

func unitNames() []string {
	out := make([]string, len(Units))
	for i, u := range Units {
		out[i] = string(u)
	}
	return out
}

func unitList() string { return strings.Join(unitNames(), ", ") }

func oneOf(v string, set []string) bool {
	for _, s := range set {
		if s == v {
			return true
		}
	}
	return false
}

func (l *loader) dictionary(name string) (*Dictionary, map[string]*Derived) {
	src, err := fs.ReadFile(l.fsys, name)
	if err != nil {
		l.probs.Add(openProblem(name, err))
		return nil, nil
	}
	d, derived, err := ParseDictionary(name, src)
	l.probs.Add(err)
	if d != nil {
		l.rep.Files = append(l.rep.Files, FileSummary{Role: "dictionary", Path: name, Rows: len(d.Indicators)})
	}
	return d, derived
}
