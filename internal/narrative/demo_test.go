package narrative_test

import (
	"strings"
	"testing"

	"io/fs"
	"peerpack/internal/brief"

	"peerpack/internal/dataset"
	"peerpack/internal/demo"
	"peerpack/internal/figures"
	"peerpack/internal/narrative"
)

func demoModel(t testing.TB) (*figures.Model, *brief.Brief) {
	t.Helper()
	fsys := demo.FS()
	raw, err := fs.ReadFile(fsys, "brief.md")
	if err != nil {
		t.Fatal(err)
	}
	b, err := brief.Parse("brief.md", raw)
	if err != nil {
		t.Fatalf("demo brief: %v", err)
	}
	b.Dir = "."
	d, _, err := dataset.Load(fsys, b)
	if err != nil {
		t.Fatalf("demo data: %v", err)
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		t.Fatalf("demo figures: %v", err)
	}
	return m, b
}

// TestDemoTraceable re-reads every number of every sentence of the demo
// pack and finds it, printed the same way, among the figures the sentence
// cites; it also checks the commentary rows reached the model.
func TestDemoTraceable(t *testing.T) {
	m, b := demoModel(t)
	c, err := narrative.Compose(m, b)
	if err != nil {
		t.Fatalf("Compose: %v", err)
	}
	if err := narrative.Verify(m, c); err != nil {
		t.Fatalf("Verify: %v", err)
	}
	if len(c.Summary) == 0 || len(c.Sentences) == 0 {
		t.Fatal("the demo pack has no executive summary")
	}
	for _, blk := range b.Blocks {
		if cb, ok := blk.(*brief.CommentaryBlock); ok && len(c.Blocks[cb]) == 0 {
			t.Errorf("commentary block at line %d has no text", cb.At.Line)
		}
	}
	rows := 0
	for r := range m.Rows() {
		if r.Section == figures.SectionCommentary && r.Measure == "sentence" {
			rows++
		}
	}
	if rows != len(c.Sentences) {
		t.Errorf("model has %d commentary sentence rows, want %d", rows, len(c.Sentences))
	}
	if testing.Verbose() {
		var sb strings.Builder
		for _, p := range c.Summary {
			sb.WriteString(p.Heading + ": " + p.Text() + "\n")
		}
		for _, blk := range b.Blocks {
			if cb, ok := blk.(*brief.CommentaryBlock); ok {
				sb.WriteString("--- block " + cb.Style + "\n")
				for _, p := range c.Blocks[cb] {
					sb.WriteString(p.Heading + ": " + p.Text() + "\n")
				}
			}
		}
		t.Log("\n" + sb.String())
	}
}

// BenchmarkComposeDemo writes and verifies the demo pack's commentary.
// Each iteration needs a fresh model (Compose adds its rows to the model),
// so the model is recomputed outside the timer.
func BenchmarkComposeDemo(b *testing.B) {
	for i := 0; i < b.N; i++ {
		b.StopTimer()
		m, br := demoModel(b)
		b.StartTimer()
		c, err := narrative.Compose(m, br)
		if err != nil {
			b.Fatal(err)
		}
		if err := narrative.Verify(m, c); err != nil {
			b.Fatal(err)
		}
	}
}

// The demo's executive summary (its first summary block) names the
// per-academic incomes, which are derived from converted money, so it
// must say they are in international dollars; it keeps to caveats of its
// own figures and leaves the standing cautions to the closing section.
func TestDemoSummaryCaveats(t *testing.T) {
	m, b := demoModel(t)
	c, err := narrative.Compose(m, b)
	if err != nil {
		t.Fatalf("Compose: %v", err)
	}
	var first *brief.CommentaryBlock
	for _, blk := range b.Blocks {
		if cb, ok := blk.(*brief.CommentaryBlock); ok && cb.Style == "summary" {
			first = cb
			break
		}
	}
	if first == nil {
		t.Fatal("the demo brief has no summary block")
	}
	var caveats string
	for _, p := range c.Blocks[first] {
		if p.Heading == "Caveats" {
			caveats = p.Text()
		}
		if p.Heading == "Reading these figures" {
			t.Errorf("the summary's caveats take the title of the brief's own section: %q", p.Text())
		}
	}
	for _, want := range []string{
		"Research income per academic and licence and consultancy income per academic are in international dollars at purchasing-power parity.",
		"On students per academic, lower counts as better (itself a value judgement)",
	} {
		if !strings.Contains(caveats, want) {
			t.Errorf("summary caveats lack %q:\n%s", want, caveats)
		}
	}
	for _, standing := range []string{"do not measure everything", "within the uncertainty", "choices, not facts"} {
		if strings.Contains(caveats, standing) {
			t.Errorf("summary caveats repeat the standing caution %q:\n%s", standing, caveats)
		}
	}
	// One sentence per caveat particular to the summary's figures: PPP,
	// the judged direction, and here the chosen peers under the
	// small-group floor (the summary now covers them).
	if !strings.Contains(caveats, "Among the chosen peers there are only 7 members, too few for stable quartiles") {
		t.Errorf("summary caveats omit the small chosen-peer group:\n%s", caveats)
	}
	if n := strings.Count(caveats, ". "); n > 2 {
		t.Errorf("summary caveats run to %d sentences, want at most three:\n%s", n+1, caveats)
	}
}
