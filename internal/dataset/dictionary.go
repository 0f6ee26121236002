package dataset

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"strings"

	"gopkg.in/yaml.v3"

	"peerpack/internal/derive"
	"peerpack/internal/diag"
	"peerpack/internal/limits"
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
	return ParseDictionaryWith(file, src, yamlx.Limits{})
}

// ParseDictionaryWith is ParseDictionary with the given YAML limits.
func ParseDictionaryWith(file string, src []byte, lim yamlx.Limits) (*Dictionary, map[string]*Derived, error) {
	var probs diag.List
	node, err := yamlx.ParseWith(file, src, 0, lim)
	if err != nil {
		return nil, nil, withSyntaxHint(err)
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
	src, size, err := readBounded(l.fsys, name, l.lim.YAMLBytes)
	if err != nil {
		l.probs.Add(openProblem(name, err))
		return nil, nil
	}
	if l.lim.Exceeded(limits.YAMLBytes, size) {
		l.probs.Addf(name, 0, 0, "the dictionary is %s", l.lim.Over(limits.YAMLBytes, size, ""))
		return nil, nil
	}
	d, derived, err := ParseDictionaryWith(name, src, l.lim.YAML())
	l.probs.Add(err)
	if d != nil && l.lim.Exceeded(limits.Indicators, int64(len(d.Indicators))) {
		ind := d.Indicators[l.lim.Indicators]
		l.probs.Addf(name, ind.Line, ind.Column, "the dictionary has %s", l.lim.Over(limits.Indicators, int64(len(d.Indicators)), ""))
		return nil, nil
	}
	if d != nil {
		l.rep.Files = append(l.rep.Files, FileSummary{Role: "dictionary", Path: name, Rows: len(d.Indicators)})
	}
	return d, derived
}

// readBounded reads a file, but never more than max+1 bytes, so a huge file
// named as a dictionary costs no memory before it is refused: over max, it
// returns no data and the size (exact when the file system states it).
func readBounded(fsys fs.FS, name string, max int64) ([]byte, int64, error) {
	f, err := fsys.Open(name)
	if err != nil {
		return nil, 0, err
	}
	defer f.Close()
	if st, err := f.Stat(); err == nil && st.Size() > max {
		return nil, st.Size(), nil
	}
	data, err := io.ReadAll(io.LimitReader(f, max+1))
	if err != nil {
		return nil, 0, err
	}
	if int64(len(data)) > max {
		return nil, int64(len(data)), nil
	}
	return data, int64(len(data)), nil
}

// withSyntaxHint adds the usual cause and fix to a YAML syntax error, whose
// parser wording ("mapping values are not allowed in this context") says
// what the parser saw rather than what the writer did.
func withSyntaxHint(err error) error {
	var ye *yamlx.Error
	if !errors.As(err, &ye) || !strings.HasPrefix(ye.Msg, "YAML syntax") {
		return err
	}
	hint := "check the indentation (spaces, not tabs, entries of a list lined up under each other) and put a value containing \": \" or \" #\" in quotes"
	switch m := ye.Msg; {
	case strings.Contains(m, "mapping values are not allowed"):
		hint = "a value containing \": \" must be in quotes (label: \"Staff: academic\"), or a line is indented under one that already has a value"
	case strings.Contains(m, "did not find expected key"), strings.Contains(m, "did not find expected '-' indicator"):
		hint = "check the indentation: the keys of one indicator line up under each other, and each indicator starts with \"- \""
	case strings.Contains(m, "cannot start any token"):
		hint = "indent with spaces, not tabs, and put a value starting with @, ` or % in quotes"
	case strings.Contains(m, "could not find expected ':'"):
		hint = "a key lacks its colon, or a quoted value is not closed"
	case strings.Contains(m, "did not find expected node content"), strings.Contains(m, "did not find expected ',' or ']'"), strings.Contains(m, "did not find expected ',' or '}'"):
		hint = "a [list] or {mapping} written on one line is not closed, or a value in it needs quotes"
	}
	e := *ye
	e.Msg += "; " + hint
	return &e
}
