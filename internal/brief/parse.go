package brief

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"unicode/utf8"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/extension"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
	"gopkg.in/yaml.v3"

	"peerpack/internal/diag"
	"peerpack/internal/yamlx"
)

// MaxBriefBytes caps a brief's size (stated in the README's limits).
const MaxBriefBytes = 8 << 20

// Load reads and parses the brief at path.
func Load(path string) (*Brief, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, diag.At(path, 0, 0, "cannot read the brief: %v", pathErr(err))
	}
	if fi.Size() > MaxBriefBytes {
		return nil, diag.At(path, 0, 0, "brief is %d bytes, over the limit of %d bytes", fi.Size(), MaxBriefBytes)
	}
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, diag.At(path, 0, 0, "cannot read the brief: %v", pathErr(err))
	}
	b, err := Parse(path, src)
	if b != nil {
		b.Dir = filepath.Dir(path)
	}
	return b, err
}

func pathErr(err error) string {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err.Error()
	}
	return err.Error()
}

// Markdown returns the goldmark instance peerpack uses for brief bodies:
// CommonMark with tables, footnotes and strikethrough; raw HTML is never
// passed through (goldmark's renderer default, and our layout ignores HTML
// nodes).
func Markdown() goldmark.Markdown {
	return goldmark.New(goldmark.WithExtensions(extension.Table, extension.Footnote, extension.Strikethrough))
}

// Parse parses a brief from its bytes. It returns every problem it finds as
// a *diag.List; the returned brief is usable for further checks when only
// block problems were found.
func Parse(file string, src []byte) (*Brief, error) {
	return ParseWith(file, src, yamlx.Limits{})
}

// ParseWith is Parse with the given YAML limits for the front matter and
// every block.
func ParseWith(file string, src []byte, lim yamlx.Limits) (*Brief, error) {
	var probs diag.List
	if !utf8.Valid(src) {
		line := 1 + bytes.Count(src[:firstInvalid(src)], []byte("\n"))
		return nil, diag.At(file, line, 0, "the brief is not valid UTF-8 (first bad byte on this line); save it as UTF-8")
	}
	src = bytes.TrimPrefix(src, []byte("\xef\xbb\xbf"))
	// Line endings as CommonMark 0.31 section 2.1 defines them: LF, CRLF,
	// or a CR alone (as classic Mac OS saved text).
	src = bytes.ReplaceAll(src, []byte("\r\n"), []byte("\n"))
	src = bytes.ReplaceAll(src, []byte("\r"), []byte("\n"))
	fm, body, bodyLine, err := splitFrontMatter(file, src)
	if err != nil {
		return nil, err
	}
	node, err := yamlx.ParseWith(file, fm, 1, lim)
	if err != nil {
		return nil, err
	}
	b := &Brief{File: file, Body: body, BodyLine: bodyLine, Lines: map[string]Pos{}}
	if err := yamlx.Decode(file, node, b); err != nil {
		return nil, fixLine(err, file, 0)
	}
	recordLines(node, "", b.Lines)
	probs.Add(b.setGroupPositions(node))
	probs.Add(b.validateFrontMatter())
	probs.Add(b.decodeComposite())
	blocks, err := parseBlocks(file, body, bodyLine, lim)
	probs.Add(err)
	b.Blocks = blocks
	probs.Add(b.validateBlocks())
	return b, probs.Err()
}

func firstInvalid(b []byte) int {
	for i := 0; i < len(b); {
		r, n := utf8.DecodeRune(b[i:])
		if r == utf8.RuneError && n == 1 {
			return i
		}
		i += n
	}
	return len(b)
}

// fixLine turns a "line N: msg" error from a custom unmarshaler into a
// positioned problem.
func fixLine(err error, file string, off int) error {
	if _, ok := err.(*yamlx.Error); ok {
		return err
	}
	msg := err.Error()
	var line int
	if n, _ := fmt.Sscanf(msg, "line %d:", &line); n == 1 {
		if i := strings.Index(msg, ":"); i >= 0 {
			return diag.At(file, line+off, 0, "%s", strings.TrimSpace(msg[i+1:]))
		}
	}
	return diag.At(file, 0, 0, "%s", msg)
}

func splitFrontMatter(file string, src []byte) (fm, body []byte, bodyLine int, err error) {
	if !bytes.HasPrefix(src, []byte("---\n")) {
		return nil, nil, 0, diag.At(file, 1, 1, "a brief starts with YAML front matter between two lines of three dashes (---); see `peerpack new` for a starting brief")
	}
	rest := src[4:]
	line := 2
	for len(rest) > 0 {
		i := bytes.IndexByte(rest, '\n')
		var l []byte
		if i < 0 {
			l, rest = rest, nil
		} else {
			l, rest = rest[:i], rest[i+1:]
		}
		if string(bytes.TrimRight(l, " \t")) == "---" {
			fm = src[4 : len(src)-len(rest)-len(l)-boolInt(i >= 0)]
			return fm, rest, line + 1, nil
		}
		line++
	}
	return nil, nil, 0, diag.At(file, 1, 1, "the front matter opened on line 1 is never closed; add a line of three dashes (---) after it")
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

func recordLines(n *yaml.Node, prefix string, out map[string]Pos) {
	if n.Kind != yaml.MappingNode {
		return
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		key := k.Value
		if prefix != "" {
			key = prefix + "." + key
		}
		out[key] = Pos{Line: k.Line, Column: k.Column}
		recordLines(v, key, out)
	}
}

// ruleKeys are the keys every population rule must state: a rule with its
// threshold left out would otherwise read as 0 and exclude everyone (or no
// one) silently.
var ruleKeys = map[string][]string{
	"min_total": {"indicator", "years", "at_least"},
	"max_value": {"indicator", "at_most"},
}

func (b *Brief) setGroupPositions(root *yaml.Node) error {
	var l diag.List
	for i := 0; i+1 < len(root.Content); i += 2 {
		if root.Content[i].Value == "groups" && root.Content[i+1].Kind == yaml.SequenceNode {
			for j, g := range root.Content[i+1].Content {
				if j < len(b.Groups) {
					b.Groups[j].Pos = Pos{Line: g.Line, Column: g.Column}
				}
			}
		}
		if root.Content[i].Value == "population" && b.Population != nil {
			pop := root.Content[i+1]
			for k := 0; k+1 < len(pop.Content); k += 2 {
				seq := pop.Content[k+1]
				for j, r := range seq.Content {
					p := Pos{Line: r.Line, Column: r.Column}
					if r.Kind == yaml.MappingNode {
						have := map[string]bool{}
						for q := 0; q+1 < len(r.Content); q += 2 {
							have[r.Content[q].Value] = true
						}
						for _, need := range ruleKeys[pop.Content[k].Value] {
							if !have[need] {
								l.Addf(b.File, p.Line, p.Column, "population rule %s needs %s: %s", pop.Content[k].Value, need, ruleExample[pop.Content[k].Value])
							}
						}
					}
					switch pop.Content[k].Value {
					case "min_total":
						if j < len(b.Population.MinTotal) {
							b.Population.MinTotal[j].Pos = p
						}
					case "max_value":
						if j < len(b.Population.MaxValue) {
							b.Population.MaxValue[j].Pos = p
						}
					}
				}
			}
		}
	}
	return l.Err()
}

var ruleExample = map[string]string{
	"min_total": "{indicator: papers, years: 3, at_least: 600}",
	"max_value": "{indicator: top_subject_share, at_most: 80}",
}

// PosOf returns where a front-matter key path ("data.register") was
// written, or line 1 when it was not.
func (b *Brief) PosOf(key string) Pos {
	if p, ok := b.Lines[key]; ok {
		return p
	}
	return Pos{Line: 1, Column: 1}
}

func (b *Brief) validateFrontMatter() error {
	var l diag.List
	req := func(key, val, example string) {
		if strings.TrimSpace(val) == "" {
			p := b.PosOf(key)
			l.Addf(b.File, p.Line, p.Column, "missing required key %q in the front matter, e.g. %s", key, example)
		}
	}
	req("title", b.Title, "title: International position 2025")
	req("focus", b.Focus, "focus: KE001 (an id from the register)")
	req("data.register", b.Data.Register, "data: {register: institutions.csv, ...}")
	req("data.dictionary", b.Data.Dictionary, "data: {dictionary: indicators.yaml, ...}")
	if len(b.Data.Values) == 0 {
		p := b.PosOf("data")
		l.Addf(b.File, p.Line, p.Column, "missing required key \"data.values\" in the front matter, e.g. data: {values: values.csv, ...}")
	}
	if b.Year == 0 {
		p := b.PosOf("year")
		l.Addf(b.File, p.Line, p.Column, "missing required key \"year\" in the front matter, e.g. year: 2025")
	}
	if b.Years.First == 0 {
		b.Years = Span{First: b.Year, Last: b.Year}
	} else if b.Year != 0 && (b.Year < b.Years.First || b.Year > b.Years.Last) {
		p := b.PosOf("year")
		l.Addf(b.File, p.Line, p.Column, "year %d lies outside years [%d, %d]; the reporting year must be inside the trend span", b.Year, b.Years.First, b.Years.Last)
	}
	switch b.Language {
	case "":
		b.Language = "en-GB"
	case "en-GB", "en-US":
	default:
		p := b.PosOf("language")
		l.Addf(b.File, p.Line, p.Column, "language %q is not available; use en-GB or en-US", b.Language)
	}
	switch b.Quantiles {
	case "":
		b.Quantiles = "type7"
	case "type7", "type6", "hinges":
	default:
		p := b.PosOf("quantiles")
		l.Addf(b.File, p.Line, p.Column, "quantiles %q is not a known definition; use type7 (default), type6 or hinges", b.Quantiles)
	}
	if pop := b.Population; pop != nil {
		switch pop.EarlierYears {
		case "":
			pop.EarlierYears = EarlierRolling
		case EarlierRolling, EarlierFixed:
		default:
			p := b.PosOf("population.earlier_years")
			l.Addf(b.File, p.Line, p.Column, "population earlier_years %q is not known; use rolling (the rules applied as of each year, the default) or fixed (the reporting year's population in every year)", pop.EarlierYears)
		}
	}
	if b.Noise != nil && !(*b.Noise >= 0 && *b.Noise < 25) {
		p := b.PosOf("noise")
		l.Addf(b.File, p.Line, p.Column, "noise %v is outside 0 to 25; it is the noise rule in percentile points, e.g. noise: 5", *b.Noise)
	}
	if b.SmallGroup != nil && *b.SmallGroup < 2 {
		p := b.PosOf("small_group")
		l.Addf(b.File, p.Line, p.Column, "small_group %d is below 2; it is the fewest members reporting for quarters and percentiles to be printed, e.g. small_group: 10", *b.SmallGroup)
	}
	switch b.Theme.Paper {
	case "":
		b.Theme.Paper = "a4"
	case "a4", "letter":
	default:
		p := b.PosOf("theme.paper")
		l.Addf(b.File, p.Line, p.Column, "paper %q is not available; use a4 or letter", b.Theme.Paper)
	}
	if b.Theme.Accent != "" && !validHex(b.Theme.Accent) {
		p := b.PosOf("theme.accent")
		l.Addf(b.File, p.Line, p.Column, "accent %q is not a colour; write it as #rrggbb, e.g. #1f4e79", b.Theme.Accent)
	}
	switch b.Theme.Font {
	case "":
		b.Theme.Font = "sans"
	case "sans", "serif":
	default:
		p := b.PosOf("theme.font")
		l.Addf(b.File, p.Line, p.Column, "font %q is not available; use sans or serif", b.Theme.Font)
	}
	seen := map[string]Pos{}
	for i, g := range b.Groups {
		if g.Name == "" && g.Each == "" {
			l.Addf(b.File, g.Pos.Line, g.Pos.Column, "group %d has no name; add name: ...", i+1)
		}
		if prev, ok := seen[g.Name]; ok && g.Name != "" {
			l.Addf(b.File, g.Pos.Line, g.Pos.Column, "group name %q is used twice (first at line %d); names must be unique", g.Name, prev.Line)
		}
		seen[g.Name] = g.Pos
		defs := 0
		if g.Where != nil && g.Each == "" {
			defs++
		}
		if len(g.Members) > 0 {
			defs++
		}
		if g.Nearest != nil {
			defs++
		}
		if g.Each != "" {
			defs++
		}
		if g.Cluster != nil {
			defs++
		}
		if defs != 1 {
			l.Addf(b.File, g.Pos.Line, g.Pos.Column, "group %q must be defined by exactly one of where, members, nearest, each or cluster (each may carry a where)", g.Name)
		}
		if g.Nearest != nil && (g.Nearest.Count < 1 || len(g.Nearest.Indicators) == 0) {
			l.Addf(b.File, g.Pos.Line, g.Pos.Column, "group %q: nearest needs a count of at least 1 and a list of indicators, e.g. nearest: {count: 15, indicators: [fnci, papers_per_academic]}", g.Name)
		}
		switch g.Over {
		case "", "ranked", "all":
		default:
			l.Addf(b.File, g.Pos.Line, g.Pos.Column, "group %q: over must be ranked (default) or all", g.Name)
		}
	}
	b.validatePeers(&l)
	return l.Err()
}

func validHex(s string) bool {
	if len(s) != 7 || s[0] != '#' {
		return false
	}
	for _, c := range s[1:] {
		if !strings.ContainsRune("0123456789abcdefABCDEF", c) {
			return false
		}
	}
	return true
}

// parseBlocks finds the peerpack fenced blocks in the body and decodes
// their YAML.
func parseBlocks(file string, body []byte, bodyLine int, lim yamlx.Limits) ([]Block, error) {
	var l diag.List
	md := Markdown()
	doc := md.Parser().Parse(text.NewReader(body), parser.WithContext(parser.NewContext()))
	var blocks []Block
	_ = ast.Walk(doc, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering {
			return ast.WalkContinue, nil
		}
		fc, ok := n.(*ast.FencedCodeBlock)
		if !ok {
			return ast.WalkContinue, nil
		}
		info := ""
		if fc.Info != nil {
			info = strings.TrimSpace(string(fc.Info.Segment.Value(body)))
		}
		fenceLine := FenceLine(body, fc, bodyLine)
		blk, err := decodeBlock(file, info, FencedContent(body, fc), fenceLine, lim)
		if err != nil {
			l.Add(err)
			return ast.WalkSkipChildren, nil
		}
		if blk != nil {
			blocks = append(blocks, blk)
		}
		return ast.WalkSkipChildren, nil
	})
	return blocks, l.Err()
}

// FenceLine is the brief line on which a fenced block opens.
func FenceLine(body []byte, fc *ast.FencedCodeBlock, bodyLine int) int {
	start := 0
	if fc.Info != nil {
		start = fc.Info.Segment.Start
	} else if fc.Lines().Len() > 0 {
		start = fc.Lines().At(0).Start - 1
	}
	if start < 0 {
		start = 0
	}
	return bodyLine + bytes.Count(body[:start], []byte("\n"))
}

// FencedContent returns the raw text inside a fenced block.
func FencedContent(body []byte, fc *ast.FencedCodeBlock) []byte {
	var buf bytes.Buffer
	lines := fc.Lines()
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		buf.Write(seg.Value(body))
	}
	return buf.Bytes()
}

// DecodeBlock decodes the YAML of one fenced block. It returns nil, nil for
// a fence that is not a peerpack block (an ordinary code sample).
func DecodeBlock(file, info string, content []byte, fenceLine int) (Block, error) {
	return decodeBlock(file, info, content, fenceLine, yamlx.Limits{})
}

func decodeBlock(file, info string, content []byte, fenceLine int, lim yamlx.Limits) (Block, error) {
	var blk Block
	switch info {
	case "chart":
		blk = &ChartBlock{}
	case "table":
		blk = &TableBlock{}
	case "commentary":
		blk = &CommentaryBlock{}
	case "appendix":
		blk = &AppendixBlock{}
	case "pagebreak":
		blk = &PageBreakBlock{}
	case "columns":
		blk = &ColumnsBlock{}
	case "clusters":
		blk = &ClustersBlock{}
	case "composite":
		blk = &CompositeBlock{}
	default:
		if s := yamlx.Nearest(info, BlockKinds); s != "" && info != "" {
			return nil, diag.At(file, fenceLine, 1, "unknown block %q; did you mean %q? (blocks are %s)", info, s, quoteList(BlockKinds))
		}
		return nil, nil
	}
	node, err := yamlx.ParseWith(file, content, fenceLine, lim)
	if err != nil {
		return nil, err
	}
	if err := yamlx.Decode(file, node, blk); err != nil {
		return nil, fixLine(err, file, fenceLine)
	}
	pos := Pos{Line: fenceLine, Column: 1}
	switch v := blk.(type) {
	case *ChartBlock:
		v.At = pos
	case *TableBlock:
		v.At = pos
	case *CommentaryBlock:
		v.At = pos
	case *AppendixBlock:
		v.At = pos
	case *PageBreakBlock:
		v.At = pos
	case *ColumnsBlock:
		v.At = pos
	case *ClustersBlock:
		v.At = pos
	case *CompositeBlock:
		v.At = pos
	}
	return blk, nil
}

// checkChartCounts refuses what a chart kind cannot show: a name listed
// twice (a radar of [a, a, a] has one axis three times), more indicators
// or groups than the kind draws (bars show one indicator for one group),
// a row limit that is not a positive count, and options of another kind.
func checkChartCounts(v *ChartBlock, bad func(Block, string, ...any)) {
	for _, list := range []struct {
		what  string
		names []string
	}{{"indicator", v.Indicators}, {"group", v.Groups}, {"institution", v.Label}} {
		seen := map[string]int{}
		for _, n := range list.names {
			if seen[n]++; seen[n] == 2 {
				bad(v, "chart block lists %s %q more than once; name each once", list.what, n)
			}
		}
	}
	if v.Type == "bars" && (len(v.Indicators) > 1 || len(v.Groups) > 1) {
		bad(v, "a bars chart shows one indicator for one group, found %s and %s; make one bars chart for each, or use a heatmap for several indicators", plural(len(v.Indicators), "indicator"), plural(len(v.Groups), "group"))
	}
	if v.Limit != 0 {
		switch {
		case v.Type != "bars" && v.Type != "heatmap" && v.Type != "":
			bad(v, "limit: caps the rows of a bars or heatmap chart; a %s chart has no rows to cap, so remove it", v.Type)
		case v.Limit < 1 || v.Limit > MaxChartRows:
			bad(v, "chart limit: %d; give the number of rows to show, from 1 to %d", v.Limit, MaxChartRows)
		}
	}
	if v.Fit && v.Type != "scatter" && v.Type != "" {
		bad(v, "fit: draws a line through a scatter chart; a %s chart has none, so remove it", v.Type)
	}
	if v.Scale != "" && v.Type != "radar" && v.Type != "" {
		bad(v, "scale: sets a radar chart's axes; a %s chart does not use it, so remove it", v.Type)
	}
}

// MaxChartRows caps a bars or heatmap chart's limit: more rows than fit on
// a page cannot be read (a page holds about 60 bars at the chart's pitch).
const MaxChartRows = 60

func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return fmt.Sprintf("%d %ss", n, word)
}

func (b *Brief) validateBlocks() error {
	var l diag.List
	bad := func(blk Block, format string, args ...any) {
		p := blk.Position()
		l.Addf(b.File, p.Line, p.Column, format, args...)
	}
	for _, blk := range b.Blocks {
		switch v := blk.(type) {
		case *CompositeBlock:
			b.validateCompositeBlock(v, &l)
		case *ChartBlock:
			if v.Type == "" {
				bad(v, "chart block needs a kind: one of %s", quoteList(ChartKinds))
			} else if !oneOf(v.Type, ChartKinds) {
				msg := fmt.Sprintf("unknown chart kind %q", v.Type)
				if s := yamlx.Nearest(v.Type, ChartKinds); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				bad(v, "%s (kinds are %s)", msg, quoteList(ChartKinds))
			}
			if len(v.Indicators) == 0 && v.Type != "" {
				bad(v, "chart block needs indicators: a list of indicator keys from the dictionary")
			}
			checkChartCounts(v, bad)
			if v.Type == "scatter" && len(v.Indicators) != 2 {
				bad(v, "a scatter chart takes exactly two indicators (x then y), found %d", len(v.Indicators))
			}
			if v.Type == "esteem" && len(v.Indicators) != 2 {
				bad(v, "an esteem chart takes exactly two indicators, the home-country share of votes (x) then the esteem position (y), found %d", len(v.Indicators))
			}
			if v.Type == "radar" && len(v.Indicators) < 3 {
				bad(v, "a radar chart needs at least three indicators, found %d", len(v.Indicators))
			}
			if v.Type == "vote-profile" && len(v.Indicators) < 3 {
				bad(v, "a vote profile needs the esteem of at least three fields (peer_esteem_<field> indicators), found %d", len(v.Indicators))
			}
			switch v.Size {
			case "":
				v.Size = "full"
			case "full", "half":
			default:
				bad(v, "chart size %q: use full or half", v.Size)
			}
			switch v.Orientation {
			case "", "horizontal", "vertical":
			default:
				bad(v, "chart orientation %q: use horizontal or vertical", v.Orientation)
			}
			switch v.Scale {
			case "", "percentile", "range", "common":
			default:
				bad(v, "radar scale %q: use percentile, range or common", v.Scale)
			}
		case *TableBlock:
			if v.Type == "" {
				v.Type = "position"
			} else if !oneOf(v.Type, TableKinds) {
				msg := fmt.Sprintf("unknown table kind %q", v.Type)
				if s := yamlx.Nearest(v.Type, TableKinds); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				bad(v, "%s (kinds are %s)", msg, quoteList(TableKinds))
			}
			if v.Type == "scale" && (len(v.Indicators) == 0 || len(v.Indicators) > MaxScaleIndicators) {
				bad(v, "a scale table shows the size measures it names, 1 to %d of them, found %d; list them, e.g. indicators: [academic_staff, students, total_income, papers]", MaxScaleIndicators, len(v.Indicators))
			}
		case *CommentaryBlock:
			if v.Style == "" {
				v.Style = "detail"
			} else if !oneOf(v.Style, CommentaryStyles) {
				msg := fmt.Sprintf("unknown commentary style %q", v.Style)
				if s := yamlx.Nearest(v.Style, CommentaryStyles); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				bad(v, "%s (styles are %s)", msg, quoteList(CommentaryStyles))
			}
			for _, t := range v.Topics {
				if !oneOf(t, CommentaryTopics) {
					bad(v, "unknown commentary topic %q (topics are %s)", t, quoteList(CommentaryTopics))
				}
			}
		case *AppendixBlock:
			if !oneOf(v.Type, AppendixKinds) {
				msg := fmt.Sprintf("unknown appendix kind %q", v.Type)
				if s := yamlx.Nearest(v.Type, AppendixKinds); s != "" && v.Type != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				bad(v, "%s (kinds are %s)", msg, quoteList(AppendixKinds))
			}
		case *ClustersBlock:
			if b.Peers == nil {
				bad(v, "a clusters block shows the peers: section, which this brief does not have; add one to the front matter, e.g. peers: {indicators: [citation_impact, papers_per_academic], k: auto}")
			}
			for _, s := range v.Show {
				if !oneOf(s, ClustersParts) {
					msg := fmt.Sprintf("clusters block: unknown part %q", s)
					if n := yamlx.Nearest(s, ClustersParts); n != "" {
						msg += fmt.Sprintf("; did you mean %q?", n)
					}
					bad(v, "%s (parts are %s)", msg, quoteList(ClustersParts))
				}
			}
			if len(v.Show) == 0 {
				v.Show = ClustersParts
			}
		case *ColumnsBlock:
			if v.Count < 1 || v.Count > 3 {
				bad(v, "columns count must be 1, 2 or 3, found %d", v.Count)
			}
		}
	}
	return l.Err()
}
