package layout

import (
	"strings"

	"github.com/yuin/goldmark/ast"
	east "github.com/yuin/goldmark/extension/ast"
	"github.com/yuin/goldmark/util"

	"peerpack/internal/brief"
	"peerpack/internal/pdf"
)

// nodeFunc lays out one kind of Markdown node, called on entering and on
// leaving it, as goldmark's renderers are (renderer.NodeRendererFunc).
type nodeFunc func(w *writer, n ast.Node, entering bool) ast.WalkStatus

// MaxNesting bounds lists and block quotes inside each other; deeper
// nesting does not print legibly and is refused with its position.
const MaxNesting = 8

// register fills the node-function table: one small function per node
// kind. A kind without a function is walked through (its children are
// laid out), so an unknown extension node never stops a build.
func (w *writer) register() {
	w.funcs = map[ast.NodeKind]nodeFunc{
		ast.KindHeading:         (*writer).heading,
		ast.KindParagraph:       (*writer).paragraph,
		ast.KindTextBlock:       (*writer).textBlock,
		ast.KindText:            (*writer).text,
		ast.KindString:          (*writer).str,
		ast.KindEmphasis:        (*writer).emphasis,
		ast.KindCodeSpan:        (*writer).codeSpan,
		ast.KindLink:            (*writer).link,
		ast.KindAutoLink:        (*writer).autoLink,
		ast.KindImage:           (*writer).image,
		ast.KindRawHTML:         (*writer).rawHTML,
		ast.KindHTMLBlock:       (*writer).rawHTML,
		ast.KindList:            (*writer).list,
		ast.KindListItem:        (*writer).listItem,
		ast.KindBlockquote:      (*writer).blockquote,
		ast.KindThematicBreak:   (*writer).thematicBreak,
		ast.KindFencedCodeBlock: (*writer).fencedBlock,
		ast.KindCodeBlock:       (*writer).codeBlock,
		east.KindTable:          (*writer).gfmTable,
		east.KindStrikethrough:  (*writer).strikethrough,
		east.KindFootnoteLink:   (*writer).footnoteLink,
		east.KindFootnoteList:   (*writer).footnoteList,
		east.KindFootnote:       (*writer).footnote,
		east.KindFootnoteBacklink: func(*writer, ast.Node, bool) ast.WalkStatus {
			return ast.WalkSkipChildren
		},
	}
}

// walk lays out a Markdown tree.
func (w *writer) walk(doc ast.Node) {
	_ = ast.Walk(doc, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if entering && n.Type() == ast.TypeBlock && !isHalfChart(w, n) && n.Kind() != ast.KindDocument {
			w.flushHalf()
		}
		if f := w.funcs[n.Kind()]; f != nil {
			return f(w, n, entering), nil
		}
		return ast.WalkContinue, nil
	})
	w.flushHalf()
	w.flushColumns()
}

// nodePos finds where a node starts in the brief: its first line, or the
// first text below it.
func (w *writer) nodePos(n ast.Node) brief.Pos {
	off := -1
	_ = ast.Walk(n, func(c ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering || off >= 0 {
			return ast.WalkStop, nil
		}
		if c.Type() == ast.TypeBlock && c.Lines().Len() > 0 {
			off = c.Lines().At(0).Start
			return ast.WalkStop, nil
		}
		if t, ok := c.(*ast.Text); ok {
			off = t.Segment.Start
			return ast.WalkStop, nil
		}
		return ast.WalkContinue, nil
	})
	if off < 0 {
		return brief.Pos{Line: w.b.BodyLine, Column: 1}
	}
	return w.b.BodyPos(off)
}

// inlineFont is the face for text at the current inline state.
func (w *writer) inlineFont() pdf.Font {
	size := w.inlineSize
	if size == 0 {
		size = w.st.size
	}
	if w.code > 0 {
		return pdf.Font{Family: pdf.Mono, Size: size * 0.9}
	}
	st := pdf.Regular
	switch {
	case w.bold > 0 && w.italic > 0:
		st = pdf.BoldItalic
	case w.bold > 0:
		st = pdf.Bold
	case w.italic > 0:
		st = pdf.Italic
	}
	return w.st.font(st, size)
}

// addText appends text in the current inline style.
func (w *writer) addText(s string) {
	if s == "" {
		return
	}
	sp := span{text: s, font: w.inlineFont(), color: w.inlineColor, strike: w.strike > 0, raise: w.raise}
	if len(w.links) > 0 {
		sp.link = w.links[len(w.links)-1]
		if sp.link != "" {
			sp.color = w.st.accent
		}
	}
	w.spans = append(w.spans, sp)
}

func (w *writer) lineBreak() {
	w.spans = append(w.spans, span{brk: true, font: w.inlineFont()})
}

// text lays out a run of text nodes, replacing inline figures.
func (w *writer) text(n ast.Node, entering bool) ast.WalkStatus {
	if !entering || w.consumed[n] {
		return ast.WalkContinue
	}
	t := n.(*ast.Text)
	run, last := brief.CollectRun(t, w.src)
	for c := ast.Node(t); c != nil; c = c.NextSibling() {
		w.consumed[c] = true
		if c == last {
			break
		}
	}
	hard := false
	if lt, ok := last.(*ast.Text); ok && lt.HardLineBreak() {
		hard = true
		run.Text = strings.TrimSuffix(run.Text, " ")
	}
	w.addRun(run)
	if hard {
		w.lineBreak()
	}
	return ast.WalkContinue
}

// addRun adds a run's text with its placeholders replaced by figures.
func (w *writer) addRun(run brief.TextRun) {
	ps, errs := brief.FindPlaceholders(run.Text)
	for _, e := range errs {
		w.failAt(w.b.BodyPos(run.BodyOffset(e.Offset)), "%s", e.Msg)
	}
	at := 0
	for _, p := range ps {
		w.addText(unescape(run.Text[at:p.Start]))
		p.Pos = w.b.BodyPos(run.BodyOffset(p.Start))
		v, err := w.resolve(p)
		if err != nil {
			w.failAt(p.Pos, "%s", err)
			v = p.Raw
		}
		w.addText(v)
		at = p.End
	}
	w.addText(unescape(run.Text[at:]))
}

// unescape resolves Markdown backslash escapes and character references
// the way goldmark's HTML writer does.
func unescape(s string) string {
	if !strings.ContainsAny(s, `\&`) {
		return s
	}
	b := util.UnescapePunctuations([]byte(s))
	b = util.ResolveNumericReferences(b)
	b = util.ResolveEntityNames(b)
	return string(b)
}

func (w *writer) str(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		w.addText(string(n.(*ast.String).Value))
	}
	return ast.WalkContinue
}

func (w *writer) emphasis(n ast.Node, entering bool) ast.WalkStatus {
	d := 1
	if !entering {
		d = -1
	}
	if n.(*ast.Emphasis).Level >= 2 {
		w.bold += d
	} else {
		w.italic += d
	}
	return ast.WalkContinue
}

func (w *writer) strikethrough(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		w.strike++
	} else {
		w.strike--
	}
	return ast.WalkContinue
}

func (w *writer) codeSpan(n ast.Node, entering bool) ast.WalkStatus {
	if !entering {
		return ast.WalkSkipChildren
	}
	var b strings.Builder
	for c := n.FirstChild(); c != nil; c = c.NextSibling() {
		if t, ok := c.(*ast.Text); ok {
			b.Write(t.Segment.Value(w.src))
		} else if s, ok := c.(*ast.String); ok {
			b.Write(s.Value)
		}
	}
	w.code++
	w.addText(b.String())
	w.code--
	return ast.WalkSkipChildren
}

// safeLink keeps only addresses a reader can follow on paper or screen:
// http, https and mailto. Anything else (javascript:, file:) is shown as
// text without a link.
func safeLink(dest string) string {
	l := strings.ToLower(dest)
	if strings.HasPrefix(l, "http://") || strings.HasPrefix(l, "https://") || strings.HasPrefix(l, "mailto:") {
		return dest
	}
	return ""
}

func (w *writer) link(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		w.links = append(w.links, safeLink(string(n.(*ast.Link).Destination)))
	} else {
		w.links = w.links[:len(w.links)-1]
	}
	return ast.WalkContinue
}

func (w *writer) autoLink(n ast.Node, entering bool) ast.WalkStatus {
	if !entering {
		return ast.WalkSkipChildren
	}
	al := n.(*ast.AutoLink)
	url := string(al.URL(w.src))
	label := string(al.Label(w.src))
	if al.AutoLinkType == ast.AutoLinkEmail && !strings.HasPrefix(strings.ToLower(url), "mailto:") {
		url = "mailto:" + url
	}
	w.links = append(w.links, safeLink(url))
	w.addText(label)
	w.links = w.links[:len(w.links)-1]
	return ast.WalkSkipChildren
}

// rawHTML leaves HTML out: a pack prints Markdown only, and nothing in a
// brief is ever executed or passed through. IgnoredHTML lists it for
// `peerpack check`.
func (w *writer) rawHTML(n ast.Node, entering bool) ast.WalkStatus {
	return ast.WalkSkipChildren
}
