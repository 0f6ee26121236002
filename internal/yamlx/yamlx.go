// Package yamlx decodes YAML strictly and safely for peerpack's inputs: a
// brief's front matter, its fenced blocks and the indicator dictionary.
//
// It parses into a yaml.Node tree first, so that every problem can name the
// line and column, then checks the tree against the Go type it will fill:
// unknown keys (with the nearest valid key as a suggestion), duplicate keys,
// aliases (refused outright: no input of ours needs them, and refusing them
// removes alias-expansion bombs), nesting deeper than MaxDepth and scalars
// longer than MaxScalar. Only then does it decode.
package yamlx

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"reflect"
	"sort"
	"strings"

	"gopkg.in/yaml.v3"
)

// Limits on a YAML document, stated in the README's "Limits and safety".
const (
	MaxBytes  = 4 << 20 // 4 MiB
	MaxDepth  = 32
	MaxScalar = 64 << 10 // 64 KiB
	MaxNodes  = 200000
)

// Error is a problem at a position in a YAML source.
type Error struct {
	File   string
	Line   int // 1-based, 0 when unknown
	Column int
	Msg    string
}

func (e *Error) Error() string {
	switch {
	case e.Line > 0 && e.Column > 0:
		return fmt.Sprintf("%s:%d:%d: %s", e.File, e.Line, e.Column, e.Msg)
	case e.Line > 0:
		return fmt.Sprintf("%s:%d: %s", e.File, e.Line, e.Msg)
	default:
		return fmt.Sprintf("%s: %s", e.File, e.Msg)
	}
}

// Limits caps one YAML document; zero fields mean the defaults above.
type Limits struct {
	Bytes, Depth, Scalar, Nodes int
}

func (l Limits) or() Limits {
	if l.Bytes <= 0 {
		l.Bytes = MaxBytes
	}
	if l.Depth <= 0 {
		l.Depth = MaxDepth
	}
	if l.Scalar <= 0 {
		l.Scalar = MaxScalar
	}
	if l.Nodes <= 0 {
		l.Nodes = MaxNodes
	}
	return l
}

// Parse reads src into a node tree, enforcing the default size, depth and
// alias limits. lineOffset is added to every reported line, for YAML
// embedded in a larger file (a brief's front matter or a fenced block).
func Parse(file string, src []byte, lineOffset int) (*yaml.Node, error) {
	return ParseWith(file, src, lineOffset, Limits{})
}

// ParseWith is Parse with the given limits.
func ParseWith(file string, src []byte, lineOffset int, lim Limits) (*yaml.Node, error) {
	lim = lim.or()
	if len(src) > lim.Bytes {
		return nil, &Error{File: file, Line: lineOffset + 1, Msg: fmt.Sprintf("YAML of %d bytes is over the limit of %d bytes; shorten it, or raise the limit with --limit yaml=N", len(src), lim.Bytes)}
	}
	// Refuse anchors and aliases before the decoder expands anything.
	var doc yaml.Node
	dec := yaml.NewDecoder(bytes.NewReader(src))
	if err := dec.Decode(&doc); err != nil {
		if errors.Is(err, io.EOF) {
			return &yaml.Node{Kind: yaml.MappingNode, Line: lineOffset + 1, Column: 1}, nil
		}
		return nil, wrapYAMLError(file, err, lineOffset)
	}
	count := 0
	if err := walkLimits(file, &doc, 0, &count, lineOffset, lim); err != nil {
		return nil, err
	}
	shift(&doc, lineOffset)
	if doc.Kind == yaml.DocumentNode {
		if len(doc.Content) == 0 {
			return &yaml.Node{Kind: yaml.MappingNode, Line: lineOffset + 1, Column: 1}, nil
		}
		return doc.Content[0], nil
	}
	return &doc, nil
}

func shift(n *yaml.Node, off int) {
	n.Line += off
	for _, c := range n.Content {
		shift(c, off)
	}
}

func walkLimits(file string, n *yaml.Node, depth int, count *int, off int, lim Limits) error {
	*count++
	if *count > lim.Nodes {
		return &Error{File: file, Line: n.Line + off, Column: n.Column, Msg: fmt.Sprintf("YAML has more than %d nodes, far beyond any brief or dictionary; raise the limit with --limit yaml-nodes=N if it is really meant", lim.Nodes)}
	}
	if depth > lim.Depth {
		return &Error{File: file, Line: n.Line + off, Column: n.Column, Msg: fmt.Sprintf("YAML nested deeper than %d levels; flatten it, or raise the limit with --limit yaml-depth=N", lim.Depth)}
	}
	if n.Kind == yaml.AliasNode || n.Anchor != "" {
		return &Error{File: file, Line: n.Line + off, Column: n.Column, Msg: "YAML anchors and aliases (& and *) are not accepted; write the value out in full"}
	}
	if n.Kind == yaml.ScalarNode && len(n.Value) > lim.Scalar {
		return &Error{File: file, Line: n.Line + off, Column: n.Column, Msg: fmt.Sprintf("a YAML value of %d bytes is over the limit of %d bytes; shorten it, or raise the limit with --limit yaml-scalar=N", len(n.Value), lim.Scalar)}
	}
	if n.Kind == yaml.MappingNode {
		seen := map[string]*yaml.Node{}
		for i := 0; i+1 < len(n.Content); i += 2 {
			k := n.Content[i]
			if prev, ok := seen[k.Value]; ok {
				return &Error{File: file, Line: k.Line + off, Column: k.Column, Msg: fmt.Sprintf("key %q appears twice (first at line %d); keep one", k.Value, prev.Line+off)}
			}
			seen[k.Value] = k
		}
	}
	for _, c := range n.Content {
		if err := walkLimits(file, c, depth+1, count, off, lim); err != nil {
			return err
		}
	}
	return nil
}

func wrapYAMLError(file string, err error, off int) error {
	msg := err.Error()
	msg = strings.TrimPrefix(msg, "yaml: ")
	line := 0
	if strings.HasPrefix(msg, "line ") {
		var l int
		var rest string
		if n, _ := fmt.Sscanf(msg, "line %d:", &l); n == 1 {
			line = l
			if i := strings.Index(msg, ":"); i >= 0 {
				rest = strings.TrimSpace(msg[i+1:])
			}
			msg = rest
		}
	}
	if line > 0 {
		line += off
	}
	return &Error{File: file, Line: line, Msg: "YAML syntax: " + msg}
}

// Decode checks node against the type of out (a pointer to a struct, slice
// or map) and then decodes it. Struct fields are matched by their yaml tag.
func Decode(file string, node *yaml.Node, out any) error {
	t := reflect.TypeOf(out)
	if t.Kind() != reflect.Pointer {
		return fmt.Errorf("yamlx.Decode needs a pointer, got %s", t)
	}
	if err := check(file, node, t.Elem(), ""); err != nil {
		return err
	}
	if err := node.Decode(out); err != nil {
		return typeError(file, node, err)
	}
	return nil
}

// Unmarshaler is implemented by types that decode themselves; Check then
// leaves their keys to them.
type Unmarshaler interface{ UnmarshalYAML(*yaml.Node) error }

var unmarshalerType = reflect.TypeOf((*Unmarshaler)(nil)).Elem()

// Check reports the first unknown key or kind mismatch of node against t.
func Check(file string, node *yaml.Node, t reflect.Type) error {
	return check(file, node, t, "")
}

func join(path, key string) string {
	if path == "" {
		return key
	}
	return path + "." + key
}

func check(file string, node *yaml.Node, t reflect.Type, path string) error {
	what := ""
	if path != "" {
		what = path + ": "
	}
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if reflect.PointerTo(t).Implements(unmarshalerType) || t.Implements(unmarshalerType) {
		return nil
	}
	if node.Kind == yaml.ScalarNode && node.Tag == "!!null" {
		return nil
	}
	switch t.Kind() {
	case reflect.Struct:
		if node.Kind != yaml.MappingNode {
			return at(file, node, "%s"+"expected a mapping of keys to values, found %s", what, describe(node))
		}
		fields := yamlFields(t)
		for i := 0; i+1 < len(node.Content); i += 2 {
			k, v := node.Content[i], node.Content[i+1]
			ft, ok := fields[k.Value]
			if !ok {
				names := make([]string, 0, len(fields))
				for n := range fields {
					names = append(names, n)
				}
				sort.Strings(names)
				msg := fmt.Sprintf("unknown key %q", k.Value)
				if path != "" {
					msg += " in " + path
				}
				if s := Nearest(k.Value, names); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				} else {
					msg += "; valid keys are " + strings.Join(names, ", ")
				}
				return at(file, k, "%s", msg)
			}
			if err := check(file, v, ft, join(path, k.Value)); err != nil {
				return err
			}
		}
	case reflect.Slice:
		if node.Kind != yaml.SequenceNode {
			return at(file, node, "%s"+"expected a list, found %s", what, describe(node))
		}
		for i, c := range node.Content {
			if err := check(file, c, t.Elem(), fmt.Sprintf("%s[%d]", path, i+1)); err != nil {
				return err
			}
		}
	case reflect.Map:
		if node.Kind != yaml.MappingNode {
			return at(file, node, "%s"+"expected a mapping, found %s", what, describe(node))
		}
		for i := 1; i < len(node.Content); i += 2 {
			if err := check(file, node.Content[i], t.Elem(), join(path, node.Content[i-1].Value)); err != nil {
				return err
			}
		}
	case reflect.String:
		if node.Kind != yaml.ScalarNode {
			return at(file, node, "%s"+"expected text, found %s", what, describe(node))
		}
	case reflect.Int, reflect.Int64, reflect.Int32:
		if node.Kind != yaml.ScalarNode || node.Tag != "!!int" {
			return at(file, node, "%s"+"expected a whole number, found %s", what, describe(node))
		}
	case reflect.Float64, reflect.Float32:
		if node.Kind != yaml.ScalarNode || (node.Tag != "!!int" && node.Tag != "!!float") {
			return at(file, node, "%s"+"expected a number, found %s", what, describe(node))
		}
	case reflect.Bool:
		if node.Kind != yaml.ScalarNode || node.Tag != "!!bool" {
			return at(file, node, "%s"+"expected true or false, found %s", what, describe(node))
		}
	}
	return nil
}

func yamlFields(t reflect.Type) map[string]reflect.Type {
	out := map[string]reflect.Type{}
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		tag := f.Tag.Get("yaml")
		if tag == "-" || !f.IsExported() {
			continue
		}
		name := strings.Split(tag, ",")[0]
		if strings.Contains(tag, "inline") {
			for k, v := range yamlFields(f.Type) {
				out[k] = v
			}
			continue
		}
		if name == "" {
			name = strings.ToLower(f.Name)
		}
		out[name] = f.Type
	}
	return out
}

func describe(n *yaml.Node) string {
	switch n.Kind {
	case yaml.MappingNode:
		return "a mapping"
	case yaml.SequenceNode:
		return "a list"
	case yaml.ScalarNode:
		return fmt.Sprintf("%q", n.Value)
	}
	return "something else"
}

// At builds an Error at a node.
func At(file string, n *yaml.Node, format string, args ...any) *Error {
	return at(file, n, format, args...)
}

func at(file string, n *yaml.Node, format string, args ...any) *Error {
	return &Error{File: file, Line: n.Line, Column: n.Column, Msg: fmt.Sprintf(format, args...)}
}

func typeError(file string, node *yaml.Node, err error) error {
	var te *yaml.TypeError
	if errors.As(err, &te) && len(te.Errors) > 0 {
		return &Error{File: file, Line: node.Line, Column: node.Column, Msg: strings.TrimPrefix(te.Errors[0], "yaml: ")}
	}
	var ye *Error
	if errors.As(err, &ye) {
		return ye
	}
	msg := err.Error()
	var line, col int
	if n, _ := fmt.Sscanf(msg, "line %d column %d:", &line, &col); n == 2 {
		if i := strings.Index(msg, ":"); i >= 0 {
			return &Error{File: file, Line: line, Column: col, Msg: strings.TrimSpace(msg[i+1:])}
		}
	}
	if n, _ := fmt.Sscanf(msg, "line %d:", &line); n == 1 {
		if i := strings.Index(msg, ":"); i >= 0 {
			return &Error{File: file, Line: line, Msg: strings.TrimSpace(msg[i+1:])}
		}
	}
	return &Error{File: file, Line: node.Line, Column: node.Column, Msg: msg}
}

// Nearest returns the candidate closest to s by edit distance, when it is
// close enough to be a plausible typo (at most a third of the length).
func Nearest(s string, candidates []string) string {
	best, bestD := "", 1<<30
	for _, c := range candidates {
		d := Levenshtein(strings.ToLower(s), strings.ToLower(c))
		if d < bestD {
			best, bestD = c, d
		}
	}
	limit := len(s)/3 + 1
	if bestD <= limit {
		return best
	}
	return ""
}

// Levenshtein is the edit distance between a and b (insertions, deletions
// and substitutions, each costing one; Levenshtein 1966).
func Levenshtein(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
