package layout

import (
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/text"

	"peerpack/internal/brief"
)

// IgnoredHTML returns where the brief's body holds raw HTML, which the
// pack leaves out, so that `peerpack check` can say so.
func IgnoredHTML(b *brief.Brief) []brief.Pos {
	doc := brief.Markdown().Parser().Parse(text.NewReader(b.Body))
	var out []brief.Pos
	_ = ast.Walk(doc, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering {
			return ast.WalkContinue, nil
		}
		switch v := n.(type) {
		case *ast.HTMLBlock:
			if v.Lines().Len() > 0 {
				out = append(out, b.BodyPos(v.Lines().At(0).Start))
			}
			return ast.WalkSkipChildren, nil
		case *ast.RawHTML:
			if v.Segments.Len() > 0 {
				out = append(out, b.BodyPos(v.Segments.At(0).Start))
			}
			return ast.WalkSkipChildren, nil
		case *ast.FencedCodeBlock, *ast.CodeBlock, *ast.CodeSpan:
			return ast.WalkSkipChildren, nil
		}
		return ast.WalkContinue, nil
	})
	return out
}
