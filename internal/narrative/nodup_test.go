package narrative_test

import (
	"io/fs"
	"testing"
	"testing/fstest"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/demo"
	"peerpack/internal/figures"
	"peerpack/internal/narrative"
	"peerpack/templates"
)

// printedParagraphs lists the paragraphs a pack prints, in order: the
// executive summary unless a summary block stands in for it (as the
// layout decides), every commentary block, every clusters block, the
// composite section.
func printedParagraphs(b *brief.Brief, c *narrative.Commentary) []narrative.Paragraph {
	var out []narrative.Paragraph
	standIn := false
	for _, blk := range b.Blocks {
		if cb, ok := blk.(*brief.CommentaryBlock); ok && cb.Style == "summary" {
			standIn = true
		}
	}
	if !standIn {
		out = append(out, c.Summary...)
	}
	for _, blk := range b.Blocks {
		switch v := blk.(type) {
		case *brief.CommentaryBlock:
			out = append(out, c.Blocks[v]...)
		case *brief.ClustersBlock:
			out = append(out, c.Clusters[v]...)
		}
	}
	return append(out, c.Composite...)
}

// No paragraph appears twice in a pack, whatever its run-in heading: the
// demo and every template, composed and verified (common practice, no
// source: a council reads a repeated paragraph as an error).
func TestNoParagraphTwice(t *testing.T) {
	if testing.Short() {
		t.Skip("loads the demo and every template")
	}
	packs := map[string]fs.FS{"demo": demo.FS()}
	for _, name := range templates.Names() {
		files, err := templates.Files(name)
		if err != nil {
			t.Fatal(err)
		}
		mfs := fstest.MapFS{}
		for k, v := range files {
			mfs[k] = &fstest.MapFile{Data: v}
		}
		packs[name] = mfs
	}
	for name, fsys := range packs {
		raw, err := fs.ReadFile(fsys, "brief.md")
		if err != nil {
			t.Fatal(err)
		}
		b, err := brief.Parse("brief.md", raw)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		b.Dir = "."
		d, _, err := dataset.Load(fsys, b)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		m, err := figures.Compute(d, b)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		c, err := narrative.Compose(m, b)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if err := narrative.Verify(m, c); err != nil {
			t.Errorf("%s: %v", name, err)
		}
		seen := map[string]bool{}
		for _, p := range printedParagraphs(b, c) {
			if text := p.Text(); seen[text] {
				t.Errorf("%s: paragraph printed twice: %q", name, text)
			} else {
				seen[text] = true
			}
		}
	}
}
