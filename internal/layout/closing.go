package layout

import (
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/text"

	"peerpack/internal/brief"
)

// caution is one of the standard cautions every pack carries (see
// limits in cautions.go). A pack states each exactly once: in the brief's
// own cautions section when it has one that covers it, else in the
// closing "About these figures".
type caution int

const (
	cautionMeasured    caution = iota // what the figures do not measure
	cautionJudgement                  // choices and weights are value judgements
	cautionUncertainty                // small differences are noise
	cautionCoverage                   // missing data and who is counted
	cautionDecisions                  // not the sole basis for decisions
	cautionCount
)

// cautionCues are the phrases by which a brief's text is taken to state a
// caution. They are deliberately specific: a section is only credited with
// a caution it plainly makes (common practice, no source).
var cautionCues = [cautionCount][]string{
	cautionMeasured:    {"do not measure", "does not measure", "not measured", "say nothing", "says nothing", "do not capture", "does not capture", "not captured", "do not show", "does not show"},
	cautionJudgement:   {"judgement", "judgment"},
	cautionUncertainty: {"uncertain", "noise", "margin of error", "confidence interval"},
	cautionCoverage:    {"coverage", "missing", "returned data", "returned a value", "without data", "without a value", "only institutions with"},
	cautionDecisions:   {"inform, not replace", "decision", "people and money", "verdict", "sole basis"},
}

// cautionTitleCues mark a heading as a cautions section by its title.
var cautionTitleCues = []string{"caution", "caveat", "limit", "reading these", "how to read", "read these", "about these figures", "notes on the figures"}

// ownCautions is the brief's own cautions section, when it has one.
type ownCautions struct {
	title string
	level int
	// text is the section's text in lower case: its paragraphs and the
	// commentary its blocks produce.
	text    string
	covered [cautionCount]bool
}

// says reports whether the section mentions a phrase (any case).
func (o *ownCautions) says(phrase string) bool {
	return o != nil && phrase != "" && strings.Contains(o.text, strings.ToLower(phrase))
}

// states reports whether the section makes a standard caution.
func (o *ownCautions) states(c caution) bool { return o != nil && o.covered[c] }

// findOwnCautions looks for the section of the brief that sets out its
// cautions: a level-1 or level-2 section that makes at least three of the
// standard cautions, or at least two under a title that says it is about
// cautions or reading the figures. The best-covering section wins; nil
// when there is none.
func (w *writer) findOwnCautions() *ownCautions {
	doc := brief.Markdown().Parser().Parse(text.NewReader(w.src))
	var sections []*ownCautions
	var cur *ownCautions
	var buf strings.Builder
	flush := func() {
		if cur != nil {
			cur.text = strings.ToLower(buf.String())
			sections = append(sections, cur)
		}
		buf.Reset()
	}
	for n := doc.FirstChild(); n != nil; n = n.NextSibling() {
		if h, ok := n.(*ast.Heading); ok && h.Level <= 2 {
			flush()
			cur = &ownCautions{title: strings.TrimSpace(plainText(h, w.src)), level: h.Level}
			continue
		}
		if cur == nil {
			continue
		}
		if cb, ok := w.blockOf(n).(*brief.CommentaryBlock); ok {
			if w.com != nil {
				for _, p := range w.com.Blocks[cb] {
					buf.WriteString(p.Heading + " " + p.Text() + "\n")
				}
			}
			continue
		}
		if _, ok := n.(*ast.FencedCodeBlock); ok {
			continue
		}
		buf.WriteString(plainText(n, w.src) + "\n")
	}
	flush()
	var best *ownCautions
	bestN := 0
	for _, s := range sections {
		n := 0
		for c := caution(0); c < cautionCount; c++ {
			for _, cue := range cautionCues[c] {
				if strings.Contains(s.text, cue) {
					s.covered[c] = true
					n++
					break
				}
			}
		}
		title := strings.ToLower(s.title)
		titled := false
		for _, cue := range cautionTitleCues {
			if strings.Contains(title, cue) {
				titled = true
			}
		}
		if (n >= 3 || n >= 2 && titled) && n > bestN {
			best, bestN = s, n
		}
	}
	return best
}

// plainText is the text under a node, inline markup dropped, with line
// breaks read as spaces.
func plainText(n ast.Node, src []byte) string {
	var b strings.Builder
	_ = ast.Walk(n, func(c ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering {
			return ast.WalkContinue, nil
		}
		switch t := c.(type) {
		case *ast.FencedCodeBlock, *ast.CodeBlock, *ast.HTMLBlock, *ast.RawHTML:
			return ast.WalkSkipChildren, nil
		case *ast.Text:
			b.Write(t.Segment.Value(src))
			if t.SoftLineBreak() || t.HardLineBreak() {
				b.WriteByte(' ')
			}
		case *ast.String:
			b.Write(t.Value)
		}
		return ast.WalkContinue, nil
	})
	return b.String()
}
