package templates

import (
	"fmt"
	"sort"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/build"
	"peerpack/internal/demo"
	"peerpack/internal/figures"
	"peerpack/internal/narrative"
)

// maxSharedSentences is the largest share of sentences two templates may
// have in common: three templates for three audiences are three products,
// each choosing its own groups, indicators and topics, not the same
// commentary under other headings.
const maxSharedSentences = 1.0 / 3

// TestTemplatesDiffer builds the commentary of every template on the demo
// data and fails when any two share more than a third of their sentences.
//
// A sentence is the text of one row of the figures file with section
// "commentary" and measure "sentence" (what narrative.Compose writes: the
// executive summary and every commentary block, in pack order), with each
// run of white space made one space and the ends trimmed; the text the
// brief's author wrote around the blocks is not counted. A template's
// sentences are the distinct such texts of its pack. Two templates share a
// sentence when the same text is among the sentences of both. The share of
// a pair is the number of sentences they share divided by the number of
// sentences of the one with fewer, so a short template copied into a long
// one counts as wholly shared.
func TestTemplatesDiffer(t *testing.T) {
	if testing.Short() {
		t.Skip("composes three packs")
	}
	names := Names()
	sentences := map[string]map[string]bool{}
	for _, name := range names {
		sentences[name] = templateSentences(t, name)
		if len(sentences[name]) == 0 {
			t.Fatalf("%s: no commentary sentences", name)
		}
	}
	// The measure can fail: a template against itself shares everything.
	if got := shareOf(sentences[names[0]], sentences[names[0]]); got != 1 {
		t.Fatalf("a template against itself shares %.2f of its sentences, want 1", got)
	}
	var report []string
	for i, a := range names {
		for _, b := range names[i+1:] {
			shared := sharedCount(sentences[a], sentences[b])
			share := shareOf(sentences[a], sentences[b])
			line := fmt.Sprintf("%s / %s: %d shared of %d and %d sentences, %.0f%% of the fewer", a, b, shared, len(sentences[a]), len(sentences[b]), 100*share)
			if share > maxSharedSentences || testing.Verbose() {
				line += "; shared, for example:\n" + examples(sentences[a], sentences[b], 3)
			}
			report = append(report, line)
			if share > maxSharedSentences {
				t.Errorf("%s\nover a third", line)
			}
		}
	}
	t.Log("\n" + strings.Join(report, "\n"))
}

func sharedCount(a, b map[string]bool) int {
	n := 0
	for s := range a {
		if b[s] {
			n++
		}
	}
	return n
}

// shareOf is the share defined at TestTemplatesDiffer.
func shareOf(a, b map[string]bool) float64 {
	return float64(sharedCount(a, b)) / float64(min(len(a), len(b)))
}

// templateSentences composes a template's commentary on the demo data and
// returns its distinct sentences as defined at TestTemplatesDiffer.
func templateSentences(t *testing.T, name string) map[string]bool {
	t.Helper()
	files, err := Files(name)
	if err != nil {
		t.Fatal(err)
	}
	fsys := fstest.MapFS{}
	for n, b := range files {
		fsys[n] = &fstest.MapFile{Data: b}
	}
	in, err := build.Load(build.Source{FS: fsys, Brief: demo.BriefName, Display: name + "/" + demo.BriefName}, nil)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	if _, err := narrative.Compose(in.Figures, in.Brief); err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	out := map[string]bool{}
	for r := range in.Figures.Rows() {
		if r.Section == figures.SectionCommentary && r.Measure == "sentence" {
			out[strings.Join(strings.Fields(r.Text), " ")] = true
		}
	}
	return out
}

// examples lists up to n sentences two sets share, sorted.
func examples(a, b map[string]bool, n int) string {
	var out []string
	for s := range a {
		if b[s] {
			out = append(out, s)
		}
	}
	sort.Strings(out)
	if len(out) > n {
		out = out[:n]
	}
	return "  " + strings.Join(out, "\n  ")
}
