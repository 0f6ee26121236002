package build

import (
	"bytes"
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"peerpack/internal/demo"
	"peerpack/internal/figures"
	"peerpack/internal/narrative"
	"peerpack/internal/pdfcheck"
)

// demoCreated is a fixed creation time, as SOURCE_DATE_EPOCH would give.
var demoCreated = time.Date(2026, 11, 30, 12, 0, 0, 0, time.UTC)

func demoSource() Source {
	return Source{FS: demo.FS(), Brief: demo.BriefName, Display: "demo/" + demo.BriefName}
}

var (
	demoOnce  sync.Once
	demoIn    *Inputs
	demoPack1 *Packed
	demoErr   error
)

// demoPack builds the demo pack once for every test in this file.
func demoPack(t *testing.T) (*Inputs, *Packed) {
	t.Helper()
	demoOnce.Do(func() {
		demoIn, demoErr = Load(demoSource(), nil)
		if demoErr != nil {
			return
		}
		demoPack1, demoErr = Pack(demoIn, demoCreated, "test")
	})
	if demoErr != nil {
		t.Fatalf("demo pack: %v", demoErr)
	}
	return demoIn, demoPack1
}

// figuresCSV writes the figures file of packed inputs, as a build asked
// for one writes it.
func figuresCSV(t *testing.T, in *Inputs) []byte {
	t.Helper()
	var buf bytes.Buffer
	if err := figures.WriteCSV(&buf, in.Figures); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

func TestDemoDeterministic(t *testing.T) {
	_, p1 := demoPack(t)
	in2, err := Load(demoSource(), nil)
	if err != nil {
		t.Fatal(err)
	}
	p2, err := Pack(in2, demoCreated, "test")
	if err != nil {
		t.Fatal(err)
	}
	in1, _ := demoPack(t)
	pdf1, pdf2, figs1, figs2 := p1.PDF, p2.PDF, figuresCSV(t, in1), figuresCSV(t, in2)
	if !bytes.Equal(pdf1, pdf2) {
		t.Error("two builds of the demo with the same creation time differ (SOURCE_DATE_EPOCH reproducibility)")
	}
	if !bytes.Equal(figs1, figs2) {
		t.Error("two figures files of the demo differ")
	}
}

// Every number in every sentence of the demo's commentary is found, rounded
// the same way, among the figures the sentence cites.
func TestDemoCommentaryTraceable(t *testing.T) {
	in, p := demoPack(t)
	com := p.Commentary
	if len(com.Sentences) == 0 {
		t.Fatal("the demo pack has no commentary")
	}
	if err := narrative.Verify(in.Figures, com); err != nil {
		t.Fatal(err)
	}
}

func TestDemoFiguresFile(t *testing.T) {
	in, _ := demoPack(t)
	figs := figuresCSV(t, in)
	first, _, _ := bytes.Cut(figs, []byte("\n"))
	if string(first) != "section,group,indicator,institution,year,measure,value" {
		t.Fatalf("figures header %q", first)
	}
	for _, section := range []string{"distribution,", "position,", "trend,", "group,", "commentary,"} {
		if !bytes.Contains(figs, []byte("\n"+section)) {
			t.Errorf("figures file has no %s rows", strings.TrimSuffix(section, ","))
		}
	}
}

func tool(t *testing.T, name string) string {
	p, err := exec.LookPath(name)
	if err != nil {
		t.Skipf("%s not installed (Debian: qpdf, poppler-utils)", name)
	}
	return p
}

// The demo PDF passes qpdf's structural check, embeds every font, has an
// exact A4 page (ISO 216: 210 x 297 mm = 595.276 x 841.89 pt) and its text
// holds the focus institution's name and the headings.
func TestDemoPDFChecks(t *testing.T) {
	in, p := demoPack(t)
	pdf := p.PDF
	path := filepath.Join(t.TempDir(), "demo.pdf")
	if err := os.WriteFile(path, pdf, 0o644); err != nil {
		t.Fatal(err)
	}
	// pdfcpu's strict mode checks ISO 32000-1 rules that qpdf does not
	// (outline counts, the document language, dictionary value types).
	if err := pdfcheck.Strict(pdf); err != nil {
		t.Errorf("%v", err)
	}
	if out, err := exec.Command(tool(t, "qpdf"), "--check", path).CombinedOutput(); err != nil {
		t.Errorf("qpdf --check: %v\n%s", err, out)
	}
	out, err := exec.Command(tool(t, "pdffonts"), path).CombinedOutput()
	if err != nil {
		t.Fatalf("pdffonts: %v", err)
	}
	lines := strings.Split(strings.TrimSpace(string(out)), "\n")
	if len(lines) < 3 {
		t.Fatalf("pdffonts lists no fonts:\n%s", out)
	}
	for _, l := range lines[2:] {
		f := strings.Fields(l)
		// columns: name type [encoding words] emb sub uni object ID
		if len(f) < 7 || f[len(f)-5] != "yes" {
			t.Errorf("font not embedded: %s", l)
		}
	}
	info, _ := exec.Command(tool(t, "pdfinfo"), path).CombinedOutput()
	if !strings.Contains(string(info), "Page size:       595.28 x 841.89 pts (A4)") {
		t.Errorf("page size is not A4:\n%s", info)
	}
	txt, err := exec.Command(tool(t, "pdftotext"), "-layout", path, "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	focus := in.Data.Register.Institutions[in.Figures.Focus].Name
	if !strings.Contains(string(txt), focus) {
		t.Errorf("pdftotext does not find the focus %q", focus)
	}
	if !strings.Contains(string(txt), in.Brief.Title) {
		t.Errorf("pdftotext does not find the title %q", in.Brief.Title)
	}
	// The vote profile writes its caption from the figures: the group's
	// members with votes, as the model counts them.
	d, ok := in.Figures.Distribution("Kestrian sector", "peer_esteem_health", in.Figures.Year)
	if !ok || d.N == 0 {
		t.Fatal("the demo has no esteem by field in the Kestrian sector")
	}
	words := strings.Join(strings.Fields(string(txt)), " ")
	if want := fmt.Sprintf("Kestrian sector (%d institutions with votes), %d; %s against the group's median in each field", d.N, in.Figures.Year, focus); !strings.Contains(words, want) {
		t.Errorf("pdftotext does not find the vote profile's caption %q", want)
	}
}

// A build interrupted after its last stage, before the rename, leaves the
// previous pack byte-identical and no temporary file behind.
func TestInterruptedBuildKeepsPrevious(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "pack.pdf")
	previous := []byte("%PDF-1.4 the previous good pack")
	os.WriteFile(out, previous, 0o644)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	_, err := Build(ctx, demoSource(), Options{Output: out, Created: demoCreated, AfterStage: func(stage string) {
		if stage == "pack" {
			cancel() // as SIGINT does through signal.NotifyContext
		}
	}})
	if err == nil || !strings.Contains(err.Error(), "interrupted") {
		t.Fatalf("want an interruption error, got %v", err)
	}
	got, _ := os.ReadFile(out)
	if !bytes.Equal(got, previous) {
		t.Error("the previous pack changed")
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Errorf("left behind: %v", ents)
	}
}

// A failing build (bad input) leaves the previous pack untouched.
func TestFailedBuildKeepsPrevious(t *testing.T) {
	dir := t.TempDir()
	for name, data := range demo.Files() {
		os.WriteFile(filepath.Join(dir, name), data, 0o644)
	}
	os.WriteFile(filepath.Join(dir, "ppp.csv"), []byte("country,year,factor\n"), 0o644)
	out := filepath.Join(dir, "pack.pdf")
	previous := []byte("%PDF-1.4 the previous good pack")
	os.WriteFile(out, previous, 0o644)
	src, err := OpenSource(filepath.Join(dir, demo.BriefName), "")
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Build(context.Background(), src, Options{Output: out, Created: demoCreated}); err == nil {
		t.Fatal("a build with no PPP factors must fail")
	}
	got, _ := os.ReadFile(out)
	if !bytes.Equal(got, previous) {
		t.Error("the previous pack changed")
	}
}

// Symbolic links that lead out of the brief's folder are refused by the
// root (os.Root), whatever the brief says.
func TestSymlinkOutsideRootRefused(t *testing.T) {
	outside := t.TempDir()
	dir := t.TempDir()
	for name, data := range demo.Files() {
		os.WriteFile(filepath.Join(dir, name), data, 0o644)
	}
	secret := filepath.Join(outside, "values.csv")
	os.WriteFile(secret, demo.Files()["values.csv"], 0o644)
	os.Remove(filepath.Join(dir, "values.csv"))
	if err := os.Symlink(secret, filepath.Join(dir, "values.csv")); err != nil {
		t.Skip("no symbolic links here")
	}
	src, err := OpenSource(filepath.Join(dir, demo.BriefName), "")
	if err != nil {
		t.Fatal(err)
	}
	_, err = Load(src, nil)
	if err == nil || !strings.Contains(err.Error(), "values.csv") {
		t.Fatalf("a link out of the root must be refused, got %v", err)
	}
}

func TestCreatedTime(t *testing.T) {
	t.Setenv("SOURCE_DATE_EPOCH", "1764547200")
	got, err := CreatedTime()
	if err != nil || !got.Equal(time.Date(2025, 12, 1, 0, 0, 0, 0, time.UTC)) {
		t.Errorf("CreatedTime = %v, %v", got, err)
	}
	t.Setenv("SOURCE_DATE_EPOCH", "yesterday")
	if _, err := CreatedTime(); err == nil {
		t.Error("a malformed SOURCE_DATE_EPOCH must be refused")
	}
}

// A build writes the figures file only when asked, and then the same bytes
// as the golden figures file of the demo (streamed from the model, not
// held as a copy).
func TestBuildWritesFiguresOnlyWhenAsked(t *testing.T) {
	dir := t.TempDir()
	pdf := filepath.Join(dir, "pack.pdf")
	if _, err := Build(context.Background(), demoSource(), Options{Output: pdf, Created: demoCreated, Version: "test"}); err != nil {
		t.Fatal(err)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Errorf("a build without --figures left %d files, want the PDF alone", len(ents))
	}
	figs := filepath.Join(dir, "figures.csv")
	if _, err := Build(context.Background(), demoSource(), Options{Output: pdf, Figures: figs, Created: demoCreated, Version: "test"}); err != nil {
		t.Fatal(err)
	}
	got, err := os.ReadFile(figs)
	if err != nil {
		t.Fatal(err)
	}
	want, err := os.ReadFile(goldenFigures)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("the figures file written by Build (%d bytes) differs from %s (%d bytes)", len(got), goldenFigures, len(want))
	}
}
