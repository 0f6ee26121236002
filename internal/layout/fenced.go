package layout

import (
	"strings"

	"github.com/yuin/goldmark/ast"

	"peerpack/internal/brief"
	"peerpack/internal/pdf"
)

// indexBlocks maps each peerpack block of the brief by the line its fence
// opens on, which is how a fenced node of the Markdown tree finds its
// decoded block (brief.FenceLine computes the same line).
func (w *writer) indexBlocks() {
	w.blockAt = map[int]brief.Block{}
	for _, blk := range w.b.Blocks {
		w.blockAt[blk.Position().Line] = blk
	}
}

// blockOf returns the decoded peerpack block of a fenced node, or nil for
// an ordinary code sample.
func (w *writer) blockOf(n ast.Node) brief.Block {
	fc, ok := n.(*ast.FencedCodeBlock)
	if !ok {
		return nil
	}
	return w.blockAt[brief.FenceLine(w.src, fc, w.b.BodyLine)]
}

// fencedBlock lays out a peerpack block, or a code sample in mono type.
func (w *writer) fencedBlock(n ast.Node, entering bool) ast.WalkStatus {
	if !entering {
		return ast.WalkSkipChildren
	}
	blk := w.blockOf(n)
	if blk == nil {
		fc := n.(*ast.FencedCodeBlock)
		info := ""
		if fc.Info != nil {
			info = strings.TrimSpace(string(fc.Info.Segment.Value(w.src)))
		}
		if isBlockKind(info) {
			// A peerpack block the brief could not decode: the brief
			// check reports it; lay out nothing rather than its YAML.
			return ast.WalkSkipChildren
		}
		w.codeLines(n)
		return ast.WalkSkipChildren
	}
	switch v := blk.(type) {
	case *brief.ChartBlock:
		w.chart(v)
	case *brief.TableBlock:
		w.tableBlock(v)
	case *brief.CommentaryBlock:
		w.commentary(v)
	case *brief.AppendixBlock:
		w.appendix(v)
	case *brief.PageBreakBlock:
		if (!w.atFrameTop() || w.cols > 1 && w.col > 0) && !(w.plan.joins(w.section+1) && w.cols <= 1) {
			w.cols = 1
			w.newPage()
		}
		w.section++
	case *brief.ColumnsBlock:
		w.setColumns(v.Count)
	}
	return ast.WalkSkipChildren
}

func isBlockKind(s string) bool {
	for _, k := range brief.BlockKinds {
		if s == k {
			return true
		}
	}
	return false
}

// commentary lays out the paragraphs written for a commentary block.
func (w *writer) commentary(cb *brief.CommentaryBlock) {
	if w.com == nil {
		w.noteBox("Commentary not available: this pack was built without the commentary stage, so the text this block asks for (" + cb.Style + ") is missing. The figures, charts and tables are complete.")
		return
	}
	paras, ok := w.com.Blocks[cb]
	if !ok || len(paras) == 0 {
		w.noteBox("No commentary was written for this block: the figures it covers give nothing to report for the chosen scope.")
		return
	}
	w.paragraphs(paras)
}

// noteBox sets a short notice in a tinted, ruled box, for things a reader
// must not miss (missing commentary, an image that could not be shown).
func (w *writer) noteBox(msg string) {
	w.flushColumns()
	size := w.st.size - 1
	sp := []span{{text: msg, font: w.st.font(pdf.Italic, size), color: w.st.text}}
	lines := w.wrap(sp, w.tokenize(sp), w.width-w.indent-8, w.width-w.indent-8)
	lh := w.st.lineHeight(size)
	h := float64(len(lines))*lh + 4
	w.ensure(h + 2)
	if !w.measuring {
		w.doc.FillRect(w.x+w.indent, w.y, w.width-w.indent, h, w.st.tint)
		w.doc.Line(w.x+w.indent, w.y, w.x+w.indent, w.y+h, 0.8, w.st.accent)
	}
	y := w.y + 2
	for _, ln := range lines {
		w.drawLine(sp, ln, w.x+w.indent+4, y+pdf.PtToMM(size)*0.8)
		y += lh
	}
	w.y += h + paraGap
}
