package layout

import (
	"bytes"
	"runtime"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/narrative"
	"peerpack/internal/pdf"
)

// With two processors the brief's charts are drawn ahead of the final
// pass into recordings and replayed; the PDF must be byte for byte the one
// drawn in line on one processor (common practice, no source: a
// reproducible build may not depend on the machine), and every chart
// block must have been set from its recording.
func TestChartsDrawnAheadSameAsInLine(t *testing.T) {
	in := fixtureInput(t, 300)
	if com, err := narrative.Compose(in.Model, in.Brief); err == nil {
		in.Commentary = com
	}
	render := func(procs int) ([]byte, int64) {
		prev := runtime.GOMAXPROCS(procs)
		defer runtime.GOMAXPROCS(prev)
		var replayed int64
		testReplayed = func(n int64) { replayed = n }
		defer func() { testReplayed = nil }()
		out, err := Render(in)
		if err != nil {
			t.Fatalf("GOMAXPROCS=%d: %v", procs, err)
		}
		return out, replayed
	}
	one, r1 := render(1)
	two, r2 := render(2)
	if r1 != 0 {
		t.Errorf("one processor: %d charts replayed, want none (drawn in line)", r1)
	}
	blocks := 0
	for _, b := range in.Brief.Blocks {
		if _, ok := b.(*brief.ChartBlock); ok {
			blocks++
		}
	}
	if blocks == 0 || r2 != int64(blocks) {
		t.Errorf("two processors: %d charts replayed, want the %d chart blocks", r2, blocks)
	}
	if !bytes.Equal(one, two) {
		t.Errorf("the PDF drawn ahead (%d bytes) differs from the one drawn in line (%d bytes)", len(two), len(one))
	}
}

// Charts are handed to the workers as the first measuring pass sizes
// them; when a section ends on a runt page a further measuring pass sets
// its charts shorter, so the drawings at the first sizes are dropped or
// left unused and the final sizes drawn ahead instead. The PDF must still
// be the one drawn in line on one processor, every chart block set from a
// recording (common practice, no source: a reproducible build may not
// depend on the machine).
func TestChartsDrawnAheadThroughRuntPasses(t *testing.T) {
	para := "Impact and international staff moved together over the span in most of the national sector, with a few exceptions in the north.\n\n"
	for n := 1; n <= 40; n++ {
		body := "# Trends\n\n```chart\nkind: trend\nindicators: [fnci, intl_staff]\ngroups: [Valmoria]\ncaption: Trends.\n```\n\n" +
			"```chart\nkind: scatter\nindicators: [fnci, intl_staff]\ngroups: [Northern region]\ncaption: Impact and staff.\n```\n\n" +
			strings.Repeat(para, n) + "# Next\n\nThe next section opens a page.\n"
		in := fixtureInputFrom(t, 120, fixtureBody(t, body))
		loose, err := pass(in, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		if plan := loose.runtPlan(); plan == nil || plan.chartScale(1) == 1 {
			continue
		}
		render := func(procs int) ([]byte, int64) {
			prev := runtime.GOMAXPROCS(procs)
			defer runtime.GOMAXPROCS(prev)
			var replayed int64
			testReplayed = func(n int64) { replayed = n }
			defer func() { testReplayed = nil }()
			out, err := Render(in)
			if err != nil {
				t.Fatalf("GOMAXPROCS=%d: %v", procs, err)
			}
			return out, replayed
		}
		one, _ := render(1)
		for range 3 {
			two, r2 := render(2)
			if !bytes.Equal(one, two) {
				t.Fatalf("%d paragraphs: the PDF drawn ahead (%d bytes) differs from the one drawn in line (%d bytes)", n, len(two), len(one))
			}
			if r2 != 2 {
				t.Errorf("%d paragraphs: %d charts replayed, want both", n, r2)
			}
		}
		return
	}
	t.Fatal("no paragraph count made the section end on a runt page; the test no longer exercises the passes")
}

// The final pass's document is made ahead with the faces the first pass
// registered; should one of them go unused in the final pass (here a face
// the fixture never sets, added on purpose), the final pass is laid out
// again on a fresh document, so the file never embeds a font more than
// the pack uses and stays the one made on one processor.
func TestPreparedDocumentNeverAddsAFont(t *testing.T) {
	in := fixtureInput(t, 120)
	render := func(procs int) []byte {
		prev := runtime.GOMAXPROCS(procs)
		defer runtime.GOMAXPROCS(prev)
		out, err := Render(in)
		if err != nil {
			t.Fatalf("GOMAXPROCS=%d: %v", procs, err)
		}
		return out
	}
	one := render(1)
	if two := render(2); !bytes.Equal(one, two) {
		t.Fatal("the pack laid out on a prepared document differs from the one made on one processor")
	}
	extra := pdf.Font{Family: pdf.Mono, Style: pdf.Bold}
	testExtraFace = &extra
	defer func() { testExtraFace = nil }()
	if two := render(2); !bytes.Equal(one, two) {
		t.Fatal("a face prepared but unused changed the pack")
	}
	if bytes.Contains(one, []byte("+liberationmonoB")) {
		t.Fatal("the fixture sets bold mono text; choose another unused face")
	}
}
