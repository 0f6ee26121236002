package layout

import (
	"bytes"
	"runtime"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/narrative"
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
