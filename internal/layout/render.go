// Package layout turns a brief, its figures model and its commentary into
// the pages of a pack: cover, contents, executive summary, the brief's
// Markdown body with its charts, tables and commentary blocks, and the
// closing notes on what the figures do and do not show.
//
// The body is laid out the way goldmark renders HTML: the Markdown tree is
// walked and each node kind has one small function (see register in
// nodes.go), all sharing one writer. Layout runs twice: the first pass
// learns on which page every heading falls and how many pages there are;
// the second draws, with the contents and the "page n of N" footer filled
// in. Both passes make the same decisions, so the page numbers are right.
package layout

import (
	"fmt"
	"io/fs"
	"peerpack/internal/provenance"
	"sync"
	"time"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/text"

	"peerpack/internal/brief"
	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/narrative"
	"peerpack/internal/pdf"
)

// Input is everything a pack is laid out from.
type Input struct {
	Brief *brief.Brief
	Model *figures.Model
	// Commentary may be nil; commentary blocks then show a visible note.
	Commentary *narrative.Commentary
	// FS is the brief's root, for the logo and images.
	FS fs.FS
	// Created dates the PDF (SOURCE_DATE_EPOCH or now).
	Created time.Time
	// Version is peerpack's version, for the Producer field.
	Version string
	// Sources are the data files the pack was built from, with sizes and
	// checksums; Rebuild is the command that builds it again (empty: a
	// generic one is given). Both go into "About these figures".
	Sources []provenance.File
	Rebuild string
	// Draft lays the pack out in full, charts drawn, but does not write
	// the PDF file (nor copy the drawn charts into its pages):
	// RenderFigures returns no bytes. check lays a pack out
	// to prove it builds and would discard them; writing them (fonts
	// subset, pages compressed, the file assembled) reads nothing from
	// the brief or the data that laying out has not used already.
	Draft bool

	// plans holds the charts planned by an earlier pass of the same
	// render (nil: plan afresh); predraw the charts being drawn ahead of
	// the final pass (nil: draw in line).
	plans   *chartPlans
	predraw *predraw
	// feedPredraw hands each chart to predraw as the pass sizes it (the
	// first measuring pass).
	feedPredraw bool
	// doc, when set, is the document the pass lays out on (made ahead,
	// with faces registered); onNewFace hears of each face the pass's
	// document registers.
	doc       *pdf.Doc
	onNewFace func(pdf.Font)
}

// Render lays out the pack and returns the PDF. Problems in the brief
// found while laying out (an unknown placeholder figure, nesting too deep,
// a chart that cannot be drawn) are returned together as a *diag.List.
func Render(in Input) (out []byte, err error) {
	out, _, err = RenderFigures(in)
	return out, err
}

// RenderFigures is Render that also returns the charts as set in the
// pack, in figure order, for writing them as separate files.
func RenderFigures(in Input) (out []byte, figs []Figure, err error) {
	defer func() {
		if r := recover(); r != nil {
			out, figs, err = nil, nil, fmt.Errorf("internal error while laying out the pack (please report it with the brief): %v", r)
		}
	}()
	if in.Brief == nil || in.Model == nil {
		return nil, nil, fmt.Errorf("internal error: layout needs a brief and a figures model")
	}
	// Every pass sets the same charts from the same model: plan each once
	// (charts.New, and the measuring each chart caches by width).
	in.plans = &chartPlans{byBlock: map[*brief.ChartBlock]chartPlan{}}
	// The charts are drawn ahead of the final pass, which sets the text,
	// on the other processors: from the moment the first measuring pass
	// sizes each one.
	in.predraw = newPredraw(in.plans)
	if in.predraw != nil {
		in.predraw.discard = in.Draft
	}
	defer in.predraw.finish()
	feeding := in
	feeding.feedPredraw = true
	// The final pass's document is made on another processor meanwhile,
	// and given each face the first pass registers (parsing a font is
	// most of the cost of a document's first lines).
	var faces chan pdf.Font
	var prepared chan *pdf.Doc
	endFaces := func() {}
	defer func() { endFaces() }() // also when a pass panics
	if in.predraw != nil {
		if opts, err := docOptions(in); err == nil {
			faces, prepared = make(chan pdf.Font, 64), make(chan *pdf.Doc, 1)
			go func() {
				var d *pdf.Doc
				defer func() {
					if recover() != nil {
						d = nil // the final pass makes its own document
						for range faces {
						}
					}
					prepared <- d
				}()
				d = pdf.New(opts)
				for f := range faces {
					d.AddFace(f)
				}
				if testExtraFace != nil {
					d.AddFace(*testExtraFace)
				}
			}()
			feeding.onNewFace = func(f pdf.Font) { faces <- f }
			endFaces = sync.OnceFunc(func() { close(faces) })
		}
	}
	first, err := pass(feeding, nil, nil)
	endFaces()
	if err != nil {
		return nil, nil, err
	}
	// A section ending on a runt page is set again a little tighter; the
	// tighter plan is kept only when it saves the page.
	var plan *fitPlan
	if p := first.runtPlan(); p != nil {
		// Every section opens a fresh page, so each one's tightening is
		// judged on its own: kept where it saved the section a page.
		if alt, err := pass(in, nil, p); err == nil {
			if p.keepSaving(first.sectionPages(), alt.sectionPages()) {
				first, plan = alt, p
			} else if !p.empty() {
				if alt, err := pass(in, nil, p); err == nil && alt.doc.PageNo() < first.doc.PageNo() {
					first, plan = alt, p
				}
			}
		}
	}
	// A runt that tightening could not pull back is given enough to carry:
	// the next section opens on that page. Joining moves every later page
	// break, so the check runs again on the joined layout, a few times at
	// most (each round only adds joins, so it settles).
	for range maxJoinRounds {
		ends := first.runtEnds()
		if len(ends) == 0 {
			break
		}
		p := plan.withJoins(ends)
		alt, err := pass(in, nil, p)
		if err != nil {
			break
		}
		first, plan = alt, p
	}
	rec := &passRecord{headings: first.headings, pages: first.doc.PageNo(),
		contentsPages: contentsPageCount(first.headings, first.doc.ContentTop(), first.doc.ContentBottom())}
	// Charts a later measuring pass set at another size are drawn ahead
	// at the size the final pass will use.
	in.predraw.addSized(first.sized)
	final := in
	if prepared != nil {
		final.doc = <-prepared // nil if it could not be made
	}
	second, err := pass(final, rec, plan)
	if err == nil && !in.Draft && final.doc != nil && len(second.doc.UnusedFaces()) > 0 {
		// fpdf embeds every registered face: a face the first pass used
		// and the final one did not would be one more font in the file,
		// so the final pass is laid out again on a fresh document.
		second, err = pass(in, rec, plan)
	}
	in.predraw.finish()
	if err != nil {
		return nil, nil, err
	}
	if want := rec.pages + rec.contentsPages - 1; second.doc.PageNo() != want {
		return nil, nil, fmt.Errorf("internal error: the two layout passes disagree on the page count (%d, then %d)", want, second.doc.PageNo())
	}
	if in.Draft {
		return nil, second.figures, nil
	}
	out, err = second.doc.Bytes()
	if err != nil {
		return nil, nil, err
	}
	return out, second.figures, nil
}

// testExtraFace, when a test sets it, is registered in the final pass's
// prepared document as if the first pass had used it.
var testExtraFace *pdf.Font

// pass runs one layout pass; known is nil in the first. plan, which may
// be nil, tightens sections that would end on a runt page.
func pass(in Input, known *passRecord, plan *fitPlan) (*writer, error) {
	b := in.Brief
	opts, err := docOptions(in)
	if err != nil {
		return nil, err
	}
	doc := in.doc
	if doc == nil {
		doc = pdf.New(opts)
	}
	if in.onNewFace != nil {
		doc.OnNewFace(in.onNewFace)
	}
	w := &writer{
		in: in, b: b, m: in.Model, com: in.Commentary, doc: doc, st: newStyle(b.Theme.Font, b.Theme.Accent),
		src: b.Body, known: known, measuring: known == nil, colGap: 8, cols: 1,
		consumed: map[ast.Node]bool{}, plan: plan,
		chartHeight: map[int]float64{}, tableCount: map[int]int{}, headed: map[int]bool{},
	}
	w.register()
	w.indexBlocks()
	w.own = w.findOwnCautions()
	doc.SetFurniture(w.header, w.footer)
	w.cover()
	w.contents()
	w.summary()
	w.body()
	w.cautions()
	w.sources()
	w.notePage()
	if err := doc.Err(); err != nil {
		return nil, fmt.Errorf("the PDF could not be laid out: %v", err)
	}
	return w, w.problems.Err()
}

// docOptions are the document settings every pass uses.
func docOptions(in Input) (pdf.Options, error) {
	b := in.Brief
	paper, err := pdf.PaperByName(b.Theme.Paper)
	if err != nil {
		p := b.PosOf("theme.paper")
		return pdf.Options{}, diag.At(b.File, p.Line, p.Column, "%v", err)
	}
	margins := pdf.DefaultMargins
	if mg := b.Theme.Margins; mg != nil {
		margins = pdf.Margins{Top: orDefault(mg.Top, margins.Top), Bottom: orDefault(mg.Bottom, margins.Bottom), Left: orDefault(mg.Left, margins.Left), Right: orDefault(mg.Right, margins.Right)}
		if err := checkMargins(b, paper, margins); err != nil {
			return pdf.Options{}, err
		}
	}
	producer := "peerpack"
	if in.Version != "" {
		producer += " " + in.Version
	}
	return pdf.Options{
		Paper: paper, Margins: margins,
		Title: b.Title, Author: author(b), Subject: subject(in), Keywords: b.Keywords,
		Creator: producer, Producer: producer, Lang: b.Language, Created: in.Created,
		NoCompression: in.Draft,
	}, nil
}

func orDefault(v, d float64) float64 {
	if v <= 0 {
		return d
	}
	return v
}

// checkMargins refuses margins that leave too little room to set text.
func checkMargins(b *brief.Brief, p pdf.Paper, m pdf.Margins) error {
	if p.Width-m.Left-m.Right < 100 || p.Height-m.Top-m.Bottom < 150 || m.Top < 12 || m.Bottom < 12 {
		pos := b.PosOf("theme.margins")
		return diag.At(b.File, pos.Line, pos.Column, "margins top %g, bottom %g, left %g, right %g mm leave too little room: keep at least 100 x 150 mm for text and 12 mm top and bottom for the running header and footer", m.Top, m.Bottom, m.Left, m.Right)
	}
	return nil
}

func author(b *brief.Brief) string {
	if b.Author != "" {
		return b.Author
	}
	return b.Theme.Organisation
}

func subject(in Input) string {
	s := in.Brief.Subtitle
	if s == "" {
		s = "Peer comparison"
	}
	if name := focusName(in.Model); name != "" {
		s += " — " + name
	}
	return s
}

func focusName(m *figures.Model) string {
	if m == nil || m.Data == nil || m.Data.Register == nil || m.Focus < 0 || m.Focus >= m.Data.Register.Len() {
		return ""
	}
	return m.Data.Register.Institutions[m.Focus].Name
}

// body lays out the brief's Markdown, parsed with the same goldmark
// configuration the brief package checks it with.
func (w *writer) body() {
	doc := brief.Markdown().Parser().Parse(text.NewReader(w.src))
	if !w.plan.joins(w.section + 1) {
		w.newPage()
	}
	w.walk(doc)
}
