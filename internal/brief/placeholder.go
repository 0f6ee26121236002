package brief

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"

	"peerpack/internal/diag"
	"peerpack/internal/yamlx"
)

// Inline figures. A brief's text may name a figure and have the pack print
// it, formatted with the indicator's decimals and unit:
//
//	{=value fnci}                        the focus's value in the brief year
//	{=rank fnci in "National peers"}     "12th of 140" in that group
//	{=median fnci in Kestria for 2023}   the group's median in 2023
//	{=percentile fnci of KE004}          another institution's percentile
//	{=name of KE004}, {=members in "National peers"}
//
// The form is "{=" measure [indicator] clauses "}". Clauses, in any order,
// each at most once: "in GROUP" (default: the brief's first group), "of
// INSTITUTION" (a register id or "focus", the default) and "for YEAR"
// (default: the brief's year). A group name with spaces is written in
// double quotes. Placeholders live in ordinary text (paragraphs, headings,
// list items, table cells), not in code; "{\=" writes the characters
// literally. The braces-and-equals opening is peerpack's own; it reads as
// "insert the figure" and does not collide with Markdown.

// Placeholder is one inline figure reference.
type Placeholder struct {
	// Pos is where the placeholder opens in the brief.
	Pos Pos
	// Raw is the placeholder as written, braces included.
	Raw string
	// Measure is one of PlaceholderMeasures.
	Measure string
	// Indicator is the dictionary key ("" for name and members).
	Indicator string
	// Group is the group name ("" means the brief's first group).
	Group string
	// Institution is a register id ("" means the focus).
	Institution string
	// Year is the year (0 means the brief's year).
	Year int
	// Start and End are byte offsets of Raw in the text it was found in.
	Start, End int
}

// PlaceholderMeasures are the measures a placeholder may name, with what
// each prints.
var PlaceholderMeasures = []string{
	"value",      // the institution's value: "1.34", "23.4%"
	"rank",       // rank of n in the group, better direction: "12th of 140"
	"percentile", // percentile rank: "73rd percentile"
	"quartile",   // "top quartile" .. "bottom quartile"
	"z",          // z-score against the group: "+0.84"
	"median",     // the group's median
	"q1",         // the group's lower quartile (25th percentile of values)
	"q3",         // the group's upper quartile (75th percentile of values)
	"mean",       // the group's mean
	"min", "max", // the group's smallest and largest value
	"count",      // members with a value
	"gap",        // distance to the group median, e.g. "0.12"
	"change",     // change over the trend span, signed: "+0.08"
	"change_pct", // percentage change over the span: "+6.1%"
	"name",       // the institution's name (no indicator)
	"members",    // the group's size (no indicator)
}

// placeholderNoIndicator are measures that take no indicator.
var placeholderNoIndicator = map[string]bool{"name": true, "members": true}

// MaxPlaceholderBytes bounds one placeholder; longer is a typing error.
const MaxPlaceholderBytes = 300

// PlaceholderError is a malformed placeholder at an offset in the scanned
// text.
type PlaceholderError struct {
	Offset int
	Msg    string
}

func (e *PlaceholderError) Error() string { return e.Msg }

// FindPlaceholders scans text (the raw Markdown of a run of text, backslash
// escapes still in it) for placeholders. It returns the well-formed ones
// and an error for each malformed one; scanning continues after an error.
func FindPlaceholders(s string) ([]Placeholder, []*PlaceholderError) {
	var out []Placeholder
	var errs []*PlaceholderError
	for i := 0; i+1 < len(s); {
		j := strings.Index(s[i:], "{=")
		if j < 0 {
			break
		}
		start := i + j
		if start > 0 && s[start-1] == '\\' {
			i = start + 2
			continue
		}
		end := strings.IndexByte(s[start:], '}')
		if end < 0 || end > MaxPlaceholderBytes {
			errs = append(errs, &PlaceholderError{Offset: start, Msg: "placeholder \"{=\" is not closed with \"}\"; write e.g. {=value fnci}, or {\\= to print the characters"})
			i = start + 2
			continue
		}
		end += start + 1
		p, err := parsePlaceholder(s[start+2 : end-1])
		if err != nil {
			errs = append(errs, &PlaceholderError{Offset: start, Msg: fmt.Sprintf("placeholder %s: %s", s[start:end], err)})
		} else {
			p.Raw, p.Start, p.End = s[start:end], start, end
			out = append(out, p)
		}
		i = end
	}
	return out, errs
}

// placeholderWords splits the inside of a placeholder into words, double
// quotes grouping words with spaces.
func placeholderWords(s string) ([]string, error) {
	var words []string
	for i := 0; i < len(s); {
		c := s[i]
		switch {
		case c == ' ' || c == '\t' || c == '\n':
			i++
		case c == '"':
			k := strings.IndexByte(s[i+1:], '"')
			if k < 0 {
				return nil, fmt.Errorf("a quoted name is not closed; add the closing \"")
			}
			w := s[i+1 : i+1+k]
			if strings.TrimSpace(w) == "" {
				return nil, fmt.Errorf("an empty quoted name")
			}
			words = append(words, "\x00"+w) // marks "quoted"
			i += k + 2
		default:
			k := i
			for k < len(s) && s[k] != ' ' && s[k] != '\t' && s[k] != '\n' && s[k] != '"' {
				k++
			}
			words = append(words, s[i:k])
			i = k
		}
	}
	return words, nil
}

func unquote(w string) string { return strings.TrimPrefix(w, "\x00") }

func parsePlaceholder(inner string) (Placeholder, error) {
	var p Placeholder
	words, err := placeholderWords(inner)
	if err != nil {
		return p, err
	}
	if len(words) == 0 {
		return p, fmt.Errorf("name a measure, e.g. {=value fnci}; measures are %s", strings.Join(PlaceholderMeasures, ", "))
	}
	p.Measure = unquote(words[0])
	if !oneOf(p.Measure, PlaceholderMeasures) {
		msg := fmt.Sprintf("unknown measure %q", p.Measure)
		if s := yamlx.Nearest(p.Measure, PlaceholderMeasures); s != "" {
			msg += fmt.Sprintf("; did you mean %q?", s)
		}
		return p, fmt.Errorf("%s (measures are %s)", msg, strings.Join(PlaceholderMeasures, ", "))
	}
	rest := words[1:]
	if !placeholderNoIndicator[p.Measure] {
		if len(rest) == 0 || isClauseWord(rest[0]) {
			return p, fmt.Errorf("measure %q needs an indicator key, e.g. {=%s fnci}", p.Measure, p.Measure)
		}
		p.Indicator = unquote(rest[0])
		rest = rest[1:]
	}
	seen := map[string]bool{}
	for len(rest) > 0 {
		w := rest[0]
		if !isClauseWord(w) {
			return p, fmt.Errorf("unexpected %q; after the measure and indicator come clauses: in GROUP, of INSTITUTION, for YEAR", unquote(w))
		}
		if seen[w] {
			return p, fmt.Errorf("clause %q is given twice", w)
		}
		seen[w] = true
		if len(rest) < 2 {
			return p, fmt.Errorf("clause %q needs a value, e.g. %s", w, clauseExample(w))
		}
		v := unquote(rest[1])
		switch w {
		case "in":
			p.Group = v
		case "of":
			if v != "focus" {
				p.Institution = v
			}
		case "for":
			y, err := strconv.Atoi(v)
			if err != nil || y < 1000 || y > 9999 {
				return p, fmt.Errorf("year %q is not a four-digit year, e.g. for 2024", v)
			}
			p.Year = y
		}
		rest = rest[2:]
	}
	return p, nil
}

func isClauseWord(w string) bool { return w == "in" || w == "of" || w == "for" }

func clauseExample(w string) string {
	switch w {
	case "in":
		return `in "National peers"`
	case "of":
		return "of KE004"
	}
	return "for 2024"
}

// TextRun is a run of adjacent text nodes under one parent, as raw
// Markdown, with the body offset of each byte's source kept for positions.
type TextRun struct {
	Text string
	// offs[i] is the body offset of Text[i].
	offs []int
}

// BodyOffset maps an offset in Text to an offset in the body.
func (r TextRun) BodyOffset(i int) int {
	if len(r.offs) == 0 {
		return 0
	}
	if i >= len(r.offs) {
		return r.offs[len(r.offs)-1]
	}
	return r.offs[i]
}

// CollectRun joins n and the text-node siblings following it into one run
// and returns the run and the last node taken. Soft line breaks become
// spaces. Placeholders are found in runs so that a placeholder split into
// several text nodes by the Markdown parser is still seen whole.
func CollectRun(n *ast.Text, src []byte) (TextRun, ast.Node) {
	var b []byte
	var offs []int
	var last ast.Node = n
	for cur := ast.Node(n); cur != nil; cur = cur.NextSibling() {
		t, ok := cur.(*ast.Text)
		if !ok {
			break
		}
		seg := t.Segment
		b = append(b, seg.Value(src)...)
		for k := seg.Start; k < seg.Stop; k++ {
			offs = append(offs, k)
		}
		if t.SoftLineBreak() || t.HardLineBreak() {
			b = append(b, ' ')
			offs = append(offs, seg.Stop)
		}
		last = cur
		if t.HardLineBreak() {
			break
		}
	}
	return TextRun{Text: string(b), offs: offs}, last
}

// BodyPos turns a body offset into a position in the brief.
func (b *Brief) BodyPos(off int) Pos {
	if off > len(b.Body) {
		off = len(b.Body)
	}
	if off < 0 {
		off = 0
	}
	line := b.BodyLine + bytes.Count(b.Body[:off], []byte("\n"))
	ls := bytes.LastIndexByte(b.Body[:off], '\n') + 1
	col := 1 + len([]rune(string(b.Body[ls:off])))
	return Pos{Line: line, Column: col}
}

// Placeholders returns every placeholder in the brief's text, positioned,
// for `peerpack check` to validate against the dictionary and the groups.
// Malformed placeholders are returned as a *diag.List with line and column.
// A placeholder naming a group that the brief does not define is reported
// here too; indicators are checked by the caller, which has the dictionary.
func Placeholders(b *Brief) ([]Placeholder, error) {
	var all []Placeholder
	var l diag.List
	doc := Markdown().Parser().Parse(text.NewReader(b.Body), parser.WithContext(parser.NewContext()))
	_ = ast.Walk(doc, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering {
			return ast.WalkContinue, nil
		}
		switch n.(type) {
		case *ast.FencedCodeBlock, *ast.CodeBlock, *ast.CodeSpan, *ast.HTMLBlock, *ast.RawHTML:
			return ast.WalkSkipChildren, nil
		}
		t, ok := n.(*ast.Text)
		if !ok {
			return ast.WalkContinue, nil
		}
		if prev, ok := t.PreviousSibling().(*ast.Text); ok && prev != nil {
			return ast.WalkContinue, nil // already part of the run that prev opened
		}
		for cur := ast.Node(t); cur != nil; {
			ct, ok := cur.(*ast.Text)
			if !ok {
				break
			}
			run, last := CollectRun(ct, b.Body)
			ps, errs := FindPlaceholders(run.Text)
			for _, p := range ps {
				p.Pos = b.BodyPos(run.BodyOffset(p.Start))
				all = append(all, p)
			}
			for _, e := range errs {
				pos := b.BodyPos(run.BodyOffset(e.Offset))
				l.Addf(b.File, pos.Line, pos.Column, "%s", e.Msg)
			}
			cur = last.NextSibling()
			if _, ok := cur.(*ast.Text); !ok {
				break
			}
		}
		return ast.WalkContinue, nil
	})
	groups := map[string]bool{}
	for _, g := range b.Groups {
		groups[g.Name] = true
	}
	for _, p := range all {
		if p.Group == "" || groups[p.Group] || eachGroupName(b, p.Group) {
			continue
		}
		names := make([]string, 0, len(b.Groups))
		for _, g := range b.Groups {
			names = append(names, g.Name)
		}
		msg := fmt.Sprintf("placeholder %s names group %q, which the front matter does not define", p.Raw, p.Group)
		if s := yamlx.Nearest(p.Group, names); s != "" {
			msg += fmt.Sprintf("; did you mean %q?", s)
		}
		l.Addf(b.File, p.Pos.Line, p.Pos.Column, "%s (groups are %s)", msg, strings.Join(names, ", "))
	}
	return all, l.Err()
}

// eachGroupName reports whether name could be one of the groups an "each"
// group expands into ("Name: value" or a bare value); those are known only
// once the register is read, so the figures stage checks them.
func eachGroupName(b *Brief, name string) bool {
	for _, g := range b.Groups {
		if g.Each == "" {
			continue
		}
		if g.Name == "" || strings.HasPrefix(name, g.Name+": ") {
			return true
		}
	}
	return false
}
