package layout

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// benchBrief is the fixture brief's front matter with a body of 25 charts
// in 5 sections, tables and text: a pack of about 30 pages.
func benchBrief(t testing.TB) []byte { return benchBriefSections(t, 5) }

// benchBriefSections is benchBrief with the given number of sections of
// five charts each (about six pages a section).
func benchBriefSections(t testing.TB, sections int) []byte {
	src, err := os.ReadFile(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		t.Fatal(err)
	}
	end := bytes.Index(src[4:], []byte("\n---\n")) + 4 + 5
	var b strings.Builder
	b.Write(src[:end])
	text := "The figures below compare Université de Saint-Éluard with its national and regional peers; " +
		"impact stands at {=value fnci}, {=rank fnci} in Valmoria, against a median of {=median fnci in Valmoria}. "
	inds := []string{"fnci", "intl_staff", "students_per_academic", "income"}
	n := 0
	for s := 1; s <= sections; s++ {
		fmt.Fprintf(&b, "\n# Section %d\n\n%s%s\n\n%s%s%s\n\n", s, text, text, text, text, text)
		for c := 0; c < 5; c++ {
			n++
			ind := inds[n%len(inds)]
			fmt.Fprintf(&b, "## Part %d.%d\n\n%s\n\n%s%s%s\n\n", s, c+1, text, text, text, text)
			switch n % 4 {
			case 0:
				fmt.Fprintf(&b, "```chart\nkind: box\nindicators: [%s, %s]\ngroups: [Valmoria, Northern region]\ncaption: Chart %d\n```\n\n", ind, inds[(n+1)%4], n)
			case 1:
				fmt.Fprintf(&b, "```chart\nkind: trend\nindicators: [%s]\ngroups: [Valmoria]\ncaption: Chart %d\n```\n\n", ind, n)
			case 2:
				fmt.Fprintf(&b, "```chart\nkind: scatter\nindicators: [fnci, intl_staff]\ngroups: [Northern region]\ncaption: Chart %d\n```\n\n", n)
			default:
				fmt.Fprintf(&b, "```chart\nkind: box\nindicators: [%s]\ngroups: [Valmoria]\nsize: half\ncaption: Chart %d\n```\n\n", ind, n)
			}
		}
		fmt.Fprintf(&b, "```table\nkind: position\ngroups: [Valmoria, Northern region]\n```\n\n```table\nkind: peers\ngroups: [Northern region]\nlimit: 30\n```\n\n")
	}
	b.WriteString("\n# Closing notes\n\n")
	for i := 0; i < 8; i++ {
		fmt.Fprintf(&b, "%s%s%s\n\n", text, text, text)
	}
	return []byte(b.String())
}

// BenchmarkRender30Pages lays out a pack of about 30 pages with 25 charts
// over 1,000 institutions. Targets (README): under 1 s and 200 MiB on the
// 2-core build machine, PDF under 2 MiB.
func BenchmarkRender30Pages(b *testing.B) {
	in := fixtureInputFrom(b, 1000, benchBrief(b))
	var out []byte
	var peak uint64
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		var err error
		out, err = Render(in)
		if err != nil {
			b.Fatal(err)
		}
		var ms runtime.MemStats
		runtime.ReadMemStats(&ms)
		if ms.HeapSys > peak {
			peak = ms.HeapSys
		}
	}
	b.StopTimer()
	b.ReportMetric(float64(len(out))/(1<<20), "MiB-pdf")
	b.ReportMetric(float64(peak)/(1<<20), "MiB-heap")
	b.ReportMetric(float64(bytes.Count(out, []byte("/Type /Page\n"))), "pages")
	if dir := os.Getenv("PEERPACK_SAMPLE_DIR"); dir != "" {
		_ = os.WriteFile(filepath.Join(dir, "bench.pdf"), out, 0o644)
	}
}

// BenchmarkRenderScaling lays out packs of 2, 5 and 10 sections (about 12,
// 30 and 60 pages): the time per page should stay flat, cost linear in
// pages.
//
//	go test ./internal/layout -run '^$' -bench RenderScaling -benchtime 3x
func BenchmarkRenderScaling(b *testing.B) {
	for _, sections := range []int{2, 5, 10} {
		b.Run(fmt.Sprintf("sections=%d", sections), func(b *testing.B) {
			in := fixtureInputFrom(b, 1000, benchBriefSections(b, sections))
			var out []byte
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				var err error
				if out, err = Render(in); err != nil {
					b.Fatal(err)
				}
			}
			b.StopTimer()
			pages := float64(bytes.Count(out, []byte("/Type /Page\n")))
			b.ReportMetric(pages, "pages")
			b.ReportMetric(float64(b.Elapsed().Milliseconds())/float64(b.N)/pages, "ms/page")
		})
	}
}
