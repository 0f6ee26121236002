package batch

import (
	"bytes"
	"context"
	"io/fs"
	"os"
	"path/filepath"
	"reflect"
	"sort"
	"strings"
	"syscall"
	"testing"
	"testing/fstest"
	"time"
	"unicode/utf8"

	"peerpack/internal/build"
	"peerpack/internal/demo"
)

var created = time.Date(2026, 11, 30, 0, 0, 0, 0, time.UTC)

func loadDemo(t testing.TB) *build.Inputs {
	t.Helper()
	in, err := build.Load(build.Source{FS: demo.FS(), Brief: demo.BriefName, Display: "demo/brief.md"}, nil)
	if err != nil {
		t.Fatal(err)
	}
	return in
}

func TestReadPlanProblems(t *testing.T) {
	fsys := fstest.MapFS{
		"plan.csv": {Data: []byte("focus,output,colour\nKE001,a.pdf,red\n")},
		"dup.csv":  {Data: []byte("focus,output\nKE001,a.pdf\nKE002,a.pdf\nKE003,../b.pdf\n")},
	}
	_, err := ReadPlan(fsys, "plan.csv", "plan.csv")
	if err == nil || !strings.HasPrefix(err.Error(), `plan.csv:1:14: unknown plan column "colour"`) {
		t.Errorf("unknown column: %v", err)
	}
	_, err = ReadPlan(fsys, "dup.csv", "dup.csv")
	want := "dup.csv:3:1: output \"a.pdf\" is also written by line 2; give each pack its own file name\n" +
		"dup.csv:4:1: output \"../b.pdf\" must be a plain file name; packs are written into the --out folder"
	if err == nil || err.Error() != want {
		t.Errorf("got  %v\nwant %s", err, want)
	}
}

// One failing pack (an unknown focus) never stops the others; the summary
// names it and counts it.
func TestBatchFailureIsolated(t *testing.T) {
	in := loadDemo(t)
	g := in.Figures.Groups[0]
	ok1, ok2 := in.Figures.InstitutionID(g.Members[0]), in.Figures.InstitutionID(g.Members[1])
	jobs := []Job{{Focus: ok1, Output: "one.pdf"}, {Focus: "NOPE999", Output: "bad.pdf"}, {Focus: ok2, Output: "two.pdf", Title: "Retitled"}}
	dir := t.TempDir()
	var progress bytes.Buffer
	outs := Run(context.Background(), in, jobs, Options{OutDir: dir, Workers: 2, Created: created, Version: "test", Progress: NewProgress(&progress)})
	var sum bytes.Buffer
	if failed := WriteSummary(&sum, outs); failed != 1 {
		t.Fatalf("failed = %d, want 1\n%s", failed, sum.String())
	}
	for _, name := range []string{"one.pdf", "two.pdf"} {
		b, err := os.ReadFile(filepath.Join(dir, name))
		if err != nil || !bytes.HasPrefix(b, []byte("%PDF-")) {
			t.Errorf("%s not built: %v", name, err)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "bad.pdf")); err == nil {
		t.Error("the failed pack left a file")
	}
	if !strings.Contains(sum.String(), "bad.pdf (NOPE999): ") || !strings.Contains(sum.String(), "2 built, 1 failed") {
		t.Errorf("summary:\n%s", sum.String())
	}
	if !strings.Contains(progress.String(), "building 3 packs") || strings.Count(progress.String(), "\n") != 4 {
		t.Errorf("plain progress lines expected off a terminal:\n%s", progress.String())
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 2 {
		t.Errorf("temporary files left behind: %v", ents)
	}
}

// Two batch runs writing the same folder at once never leave a partial or
// interleaved file: each pack is written to its own temporary file and
// renamed, so every file present is one complete PDF.
func TestConcurrentBatchesSameFolder(t *testing.T) {
	in := loadDemo(t)
	id := in.Figures.InstitutionID(in.Figures.Groups[0].Members[0])
	jobs := []Job{{Focus: id, Output: "same.pdf"}}
	dir := t.TempDir()
	done := make(chan []Outcome, 2)
	for i := 0; i < 2; i++ {
		go func() {
			done <- Run(context.Background(), in, jobs, Options{OutDir: dir, Workers: 1, Created: created})
		}()
	}
	for i := 0; i < 2; i++ {
		for _, o := range <-done {
			if o.Err != nil {
				t.Fatal(o.Err)
			}
		}
	}
	b, _ := os.ReadFile(filepath.Join(dir, "same.pdf"))
	if !bytes.HasPrefix(b, []byte("%PDF-")) || !bytes.HasSuffix(bytes.TrimSpace(b), []byte("%%EOF")) {
		t.Error("the pack is not one complete PDF")
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Errorf("files left: %v", ents)
	}
}

// BenchmarkBatch50 builds 50 demo-sized packs over two workers; the
// target is under 30 seconds per 50 on the 2-core machine.
//
//	go test ./internal/batch -run '^$' -bench Batch50 -benchtime 1x
func BenchmarkBatch50(b *testing.B) {
	in := loadDemo(b)
	var jobs []Job
	for _, inst := range in.Figures.Groups[0].Members {
		if len(jobs) == 50 {
			break
		}
		id := in.Figures.InstitutionID(inst)
		jobs = append(jobs, Job{Focus: id, Output: id + ".pdf"})
	}
	dir := b.TempDir()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		outs := Run(context.Background(), in, jobs, Options{OutDir: dir, Workers: 2, Created: created})
		for _, o := range outs {
			if o.Err != nil && !strings.Contains(o.Err.Error(), "no value of") {
				b.Fatal(o.Err)
			}
		}
	}
	b.ReportMetric(float64(b.Elapsed().Seconds())/float64(b.N), "s/50packs")
}

// BenchmarkSoak200 builds 200 packs one after another in one process (the
// batch path) and reports the heap after the last against the heap after
// the 20th; the bound is that the heap grows by less than 64 MiB.
//
//	go test ./internal/batch -run '^$' -bench Soak200 -benchtime 1x
func BenchmarkSoak200(b *testing.B) {
	in := loadDemo(b)
	id := in.Figures.InstitutionID(in.Figures.Groups[0].Members[0])
	dir := b.TempDir()
	var early, late uint64
	for i := 0; i < b.N; i++ {
		for k := 0; k < 200; k++ {
			outs := Run(context.Background(), in, []Job{{Focus: id, Output: "soak.pdf"}}, Options{OutDir: dir, Workers: 1, Created: created})
			if outs[0].Err != nil {
				b.Fatal(outs[0].Err)
			}
			if k == 19 {
				early = heapAfterGC()
			}
		}
		late = heapAfterGC()
	}
	growth := float64(int64(late)-int64(early)) / (1 << 20)
	b.ReportMetric(growth, "MiB-heap-growth")
	if growth > 64 {
		b.Fatalf("heap grew by %.1f MiB over 180 builds; the bound is 64 MiB", growth)
	}
}

// A bar line must fit the terminal one column short (a full-width line
// makes terminals wrap, and each redraw becomes a new line) and cut names
// between characters: common practice, no source. Column widths of wide
// characters from Unicode Standard Annex #11 (East Asian Width).
func TestBarLineFitsAndCutsOnCharacters(t *testing.T) {
	names := []string{
		"packs/a.pdf",
		"packs/" + strings.Repeat("Ångström-Ünïvërsïty-", 6) + ".pdf",
		"packs/" + strings.Repeat("東京大学", 20) + ".pdf",
		"packs/" + strings.Repeat("e\u0301", 60) + ".pdf",
	}
	for _, cols := range []int{20, 40, 80, 200} {
		for _, n := range names {
			got := barLine(7, 50, 1, n, cols-1)
			if !utf8.ValidString(got) {
				t.Errorf("cols %d: cut inside a UTF-8 sequence: %q", cols, got)
			}
			if c := columns(got); c != cols-1 {
				t.Errorf("cols %d: line is %d columns, want %d: %q", cols, c, cols-1, got)
			}
			if strings.ContainsAny(got, "\r\n") {
				t.Errorf("cols %d: line breaks in %q", cols, got)
			}
		}
	}
	if got := barLine(25, 50, 0, "x.pdf", 79); !strings.Contains(got, "25/50 packs, 0 failed  x.pdf") || !strings.HasPrefix(got, "[############.............]") {
		t.Errorf("80 columns: %q", got)
	}
}

// Column counts: ASCII 1, CJK ideographs and fullwidth forms 2, combining
// acute accent 0 (Unicode Standard Annex #11 and the Unicode character
// database, from memory).
func TestRuneColumns(t *testing.T) {
	for _, c := range []struct {
		r    rune
		want int
	}{{'a', 1}, {'Å', 1}, {'東', 2}, {'Ａ', 2}, {'\u0301', 0}, {'\t', 0}} {
		if got := runeColumns(c.r); got != c.want {
			t.Errorf("runeColumns(%q) = %d, want %d", c.r, got, c.want)
		}
	}
}

// /dev/null is a character device but not a terminal: the progress must
// be plain lines there (isatty(3), from memory).
func TestProgressOffTerminal(t *testing.T) {
	f, err := os.OpenFile(os.DevNull, os.O_WRONLY, 0)
	if err != nil {
		t.Skip(err)
	}
	defer f.Close()
	if _, ok := NewProgress(f).(*lines); !ok {
		t.Errorf("%s counted as a terminal", os.DevNull)
	}
}

// A redraw through the bar starts with a carriage return and never ends
// a line until Finish.
func TestBarRedrawsInPlace(t *testing.T) {
	var buf bytes.Buffer
	b := &bar{w: &buf, cols: func() int { return 40 }}
	b.Start(3)
	for i := 1; i <= 3; i++ {
		b.Done(Outcome{Job: Job{Output: "out/" + strings.Repeat("名", 30) + ".pdf"}}, i, 3)
	}
	if strings.Contains(buf.String(), "\n") {
		t.Errorf("a redraw ended a line: %q", buf.String())
	}
	for _, seg := range strings.Split(buf.String(), "\r")[1:] {
		if c := columns(seg); c != 39 {
			t.Errorf("redraw is %d columns on a 40-column terminal: %q", c, seg)
		}
	}
	b.Finish()
}

// --charts in a batch: each pack's figures go to a sub-folder named after
// the pack's file, so two packs never overwrite each other's charts.
func TestBatchChartsPerPack(t *testing.T) {
	in := loadDemo(t)
	g := in.Figures.Groups[0]
	jobs := []Job{{Focus: in.Figures.InstitutionID(g.Members[0]), Output: "first.pdf"}, {Focus: in.Figures.InstitutionID(g.Members[1]), Output: "second.pdf"}}
	dir, charts := t.TempDir(), t.TempDir()
	outs := Run(context.Background(), in, jobs, Options{OutDir: dir, Workers: 1, Created: created, Version: "test", Charts: charts})
	for _, o := range outs {
		if o.Err != nil {
			t.Fatalf("%s: %v", o.Job.Output, o.Err)
		}
	}
	for _, sub := range []string{"first", "second"} {
		svg, _ := filepath.Glob(filepath.Join(charts, sub, "figure-01-*.svg"))
		pngs, _ := filepath.Glob(filepath.Join(charts, sub, "figure-*.png"))
		if len(svg) != 1 || len(pngs) < 3 {
			t.Errorf("%s: %d first-figure SVG, %d PNG files", sub, len(svg), len(pngs))
		}
	}
}

// Ids that make the same file name each get their own file (common
// practice, no source: a batch must never report a pack built that a
// later pack overwrote), in a way that does not depend on their order.
func TestGroupOutputsAreUnique(t *testing.T) {
	ids := []string{"sub/x", "sub_x", "KE001", "ke001", "AL002"}
	var jobs []Job
	for _, id := range ids {
		jobs = append(jobs, Job{Focus: id, Output: safeName(id) + ".pdf"})
	}
	got, err := uniqueOutputs(jobs)
	if err != nil {
		t.Fatal(err)
	}
	seen := map[string]bool{}
	names := map[string]string{}
	for _, j := range got {
		key := strings.ToLower(j.Output)
		if seen[key] {
			t.Errorf("%s written twice", j.Output)
		}
		seen[key] = true
		names[j.Focus] = j.Output
		if !strings.HasSuffix(j.Output, ".pdf") || strings.ContainsAny(j.Output, "/\\") {
			t.Errorf("%q is not a plain PDF file name", j.Output)
		}
	}
	if names["AL002"] != "AL002.pdf" {
		t.Errorf("an id that collides with nothing keeps its plain name, got %s", names["AL002"])
	}
	// The same ids in another order get the same names.
	var rev []Job
	for i := len(ids) - 1; i >= 0; i-- {
		rev = append(rev, Job{Focus: ids[i], Output: safeName(ids[i]) + ".pdf"})
	}
	again, _ := uniqueOutputs(rev)
	for _, j := range again {
		if names[j.Focus] != j.Output {
			t.Errorf("%s: %s in one order, %s in another", j.Focus, names[j.Focus], j.Output)
		}
	}
}

// Plan outputs differing only in case are one file on macOS and Windows.
func TestPlanOutputsDifferingInCase(t *testing.T) {
	fsys := fstest.MapFS{"plan.csv": {Data: []byte("focus,output\nKE001,Pack.pdf\nKE002,pack\n")}}
	_, err := ReadPlan(fsys, "plan.csv", "plan.csv")
	want := `plan.csv:3:1: output "pack.pdf" is also written by line 2; give each pack its own file name`
	if err == nil || err.Error() != want {
		t.Errorf("got  %v\nwant %s", err, want)
	}
}

// A plan's unknown focus is reported at the plan's row, where the fix is.
func TestPlanFocusErrorAtPlanRow(t *testing.T) {
	in := loadDemo(t)
	id := in.Figures.InstitutionID(in.Figures.Groups[0].Members[0])
	fsys := fstest.MapFS{"plan.csv": {Data: []byte("focus,output\n" + id + "X,a.pdf\n")}}
	jobs, err := ReadPlan(fsys, "plan.csv", "plans/plan.csv")
	if err != nil {
		t.Fatal(err)
	}
	outs := Run(context.Background(), in, jobs, Options{OutDir: t.TempDir(), Workers: 1, Created: created, Version: "test"})
	want := `plans/plan.csv:2:1: focus "` + id + `X" is not in the register institutions.csv; did you mean "` + id + `"?`
	if outs[0].Err == nil || outs[0].Err.Error() != want {
		t.Errorf("got  %v\nwant %s", outs[0].Err, want)
	}
}

// A plan that is a named pipe or a folder is refused before it is opened
// (opening a pipe blocks until a writer comes), like every other input.
func TestPlanKindCheckedBeforeOpening(t *testing.T) {
	dir := t.TempDir()
	if err := syscall.Mkfifo(filepath.Join(dir, "plan.csv"), 0o644); err != nil {
		t.Skip("no named pipes here:", err)
	}
	if err := os.Mkdir(filepath.Join(dir, "plans"), 0o755); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 2)
	go func() {
		_, err := ReadPlan(os.DirFS(dir), "plan.csv", "plan.csv")
		done <- err
		_, err = ReadPlan(os.DirFS(dir), "plans", "plans")
		done <- err
	}()
	for _, want := range []string{"plan.csv: the plan is a named pipe, not a file", "plans: the plan is a folder, not a file"} {
		select {
		case err := <-done:
			if err == nil || !strings.HasPrefix(err.Error(), want) {
				t.Errorf("got %v, want %s...", err, want)
			}
		case <-time.After(10 * time.Second):
			t.Fatal("reading a plan that is a named pipe blocked")
		}
	}
}

// A pack of a batch and its charts sub-folder are one outcome (common
// practice, no source): a pack that fails after its charts are drawn, here
// interrupted before any output is renamed, leaves the previous pack and
// the previous sub-folder as they were, with no staging folder behind.
func TestBatchFailedPackKeepsPreviousCharts(t *testing.T) {
	in := loadDemo(t)
	g := in.Figures.Groups[0]
	jobs := []Job{{Focus: in.Figures.InstitutionID(g.Members[0]), Output: "first.pdf"}}
	dir, charts := t.TempDir(), t.TempDir()
	opt := Options{OutDir: dir, Workers: 1, Created: created, Version: "test", Charts: charts}
	if o := Run(context.Background(), in, jobs, opt)[0]; o.Err != nil {
		t.Fatal(o.Err)
	}
	svgs, _ := filepath.Glob(filepath.Join(charts, "first", "figure-01-*.svg"))
	if len(svgs) != 1 {
		t.Fatalf("%d first-figure SVG files", len(svgs))
	}
	os.WriteFile(svgs[0], []byte("<svg>previous</svg>"), 0o644)
	os.WriteFile(filepath.Join(dir, "first.pdf"), []byte("%PDF-1.4 previous"), 0o644)
	list := func(d string) map[string]string {
		out := map[string]string{}
		filepath.WalkDir(d, func(p string, e fs.DirEntry, err error) error {
			if err == nil && !e.IsDir() {
				b, _ := os.ReadFile(p)
				out[p] = string(b)
			} else if err == nil {
				out[p+"/"] = ""
			}
			return err
		})
		return out
	}
	beforeCharts, beforeOut := list(charts), list(dir)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	drawn := 0
	opt.beforeCommit = func(Job) {
		pngs, _ := filepath.Glob(filepath.Join(charts, "first", ".staging-*", "*.png"))
		drawn = len(pngs)
		cancel()
	}
	if o := Run(ctx, in, jobs, opt)[0]; o.Err == nil || !strings.Contains(o.Err.Error(), "interrupted") {
		t.Fatalf("want an interruption, got %v", o.Err)
	}
	if drawn < 3 {
		t.Errorf("%d charts drawn before the interruption; the test proves nothing", drawn)
	}
	for name, d := range map[string][2]map[string]string{"charts": {beforeCharts, list(charts)}, "packs": {beforeOut, list(dir)}} {
		if !reflect.DeepEqual(d[0], d[1]) {
			t.Errorf("%s folder changed:\n before %v\n after  %v", name, keys(d[0]), keys(d[1]))
		}
	}
}

func keys(m map[string]string) []string {
	var out []string
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}
