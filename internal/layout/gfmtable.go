package layout

import (
	"strings"

	"github.com/yuin/goldmark/ast"
	east "github.com/yuin/goldmark/extension/ast"
)

// MaxTableColumns bounds a Markdown table: more columns than this cannot
// be read across a portrait page.
const MaxTableColumns = 24

// gfmTable sets a Markdown (GitHub-flavoured) table with the same grid as
// the pack's own tables: header repeated across pages, never wider than
// the frame. Cell text keeps its inline figures; emphasis is dropped.
func (w *writer) gfmTable(n ast.Node, entering bool) ast.WalkStatus {
	if !entering {
		return ast.WalkSkipChildren
	}
	t := n.(*east.Table)
	if len(t.Alignments) > MaxTableColumns {
		w.failAt(w.nodePos(n), "this table has %d columns; at most %d fit across a page, so split it or turn it round (rows for columns)", len(t.Alignments), MaxTableColumns)
		return ast.WalkSkipChildren
	}
	g := grid{natural: true, noNumber: true}
	for row := n.FirstChild(); row != nil; row = row.NextSibling() {
		var cells []cell
		for c := row.FirstChild(); c != nil; c = c.NextSibling() {
			cells = append(cells, cell{text: w.inlineText(c)})
		}
		if _, ok := row.(*east.TableHeader); ok {
			for _, c := range cells {
				g.head = append(g.head, c.text)
			}
			continue
		}
		g.rows = append(g.rows, cells)
	}
	for i := range g.head {
		a := byte('L')
		if i < len(t.Alignments) && t.Alignments[i] == east.AlignRight {
			a = 'R'
		}
		g.align = append(g.align, a)
	}
	for i := range g.rows {
		for len(g.rows[i]) < len(g.head) {
			g.rows[i] = append(g.rows[i], cell{})
		}
	}
	w.setTable(g)
	return ast.WalkSkipChildren
}

// inlineText lays out a node's inline children into plain text, with
// placeholders replaced.
func (w *writer) inlineText(n ast.Node) string {
	saved := w.spans
	w.spans = nil
	_ = ast.Walk(n, func(c ast.Node, entering bool) (ast.WalkStatus, error) {
		if c == n {
			return ast.WalkContinue, nil
		}
		switch c.Kind() {
		case ast.KindText, ast.KindString, ast.KindCodeSpan, ast.KindAutoLink, ast.KindRawHTML:
			return w.funcs[c.Kind()](w, c, entering), nil
		}
		return ast.WalkContinue, nil
	})
	var b strings.Builder
	for _, s := range w.spans {
		if s.brk {
			b.WriteByte(' ')
			continue
		}
		b.WriteString(s.text)
	}
	w.spans = saved
	return strings.TrimSpace(b.String())
}
