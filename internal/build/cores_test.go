package build

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"runtime"
	"testing"
	"time"

	"peerpack/internal/benchworld"
	"peerpack/internal/figures"
)

// A build gives the same bytes whatever the number of processors: the
// loader parses large files in parts, the figures model computes its
// groups on every processor, and both must put the results back in one
// fixed order (common practice, no source: reproducible builds, as
// reproducible-builds.org asks, may not depend on the machine). The world
// is large enough (about 8.5 MB of values) for the parallel parser to
// take the long file in parts.
func TestBuildSameOnOneAndTwoProcessors(t *testing.T) {
	if testing.Short() {
		t.Skip("builds a 1,000-institution world twice")
	}
	dir := t.TempDir()
	if err := benchworld.Write(dir, benchworld.Options{Institutions: 1000, Systems: 30}); err != nil {
		t.Fatal(err)
	}
	src, err := OpenSource(filepath.Join(dir, "brief.md"), "")
	if err != nil {
		t.Fatal(err)
	}
	created := time.Unix(1764547200, 0).UTC()
	build := func(procs int) (pdf, csv []byte) {
		prev := runtime.GOMAXPROCS(procs)
		defer runtime.GOMAXPROCS(prev)
		in, err := Load(src, nil)
		if err != nil {
			t.Fatalf("GOMAXPROCS=%d: %v", procs, err)
		}
		p, err := Pack(in, created, "test")
		if err != nil {
			t.Fatalf("GOMAXPROCS=%d: %v", procs, err)
		}
		var b bytes.Buffer
		if err := figures.WriteCSV(&b, in.Figures); err != nil {
			t.Fatal(err)
		}
		return p.PDF, b.Bytes()
	}
	pdf1, csv1 := build(1)
	pdf2, csv2 := build(2)
	if len(csv1) == 0 || len(pdf1) == 0 {
		t.Fatal("an empty figures file or PDF")
	}
	if !bytes.Equal(csv1, csv2) {
		t.Errorf("the figures file differs between one processor (%d bytes) and two (%d bytes)", len(csv1), len(csv2))
	}
	if !bytes.Equal(pdf1, pdf2) {
		t.Errorf("the PDF differs between one processor (%d bytes) and two (%d bytes)", len(pdf1), len(pdf2))
	}
}

// Build writes the figures file and workbook while the pack is laid out;
// the files must be those written after it, from the finished model, and
// the PDF the same as without them (common practice, no source: concurrency may not
// change an output).
func TestBuildWritesFiguresAlongsideLayout(t *testing.T) {
	dir := t.TempDir()
	out, figs := filepath.Join(dir, "pack.pdf"), filepath.Join(dir, "figures.csv")
	res, err := Build(context.Background(), demoSource(), Options{Output: out, Figures: figs, Created: demoCreated})
	if err != nil {
		t.Fatal(err)
	}
	in, _ := demoPack(t)
	var want bytes.Buffer
	if err := figures.WriteCSV(&want, in.Figures); err != nil {
		t.Fatal(err)
	}
	gotCSV, _ := os.ReadFile(figs)
	if !bytes.Equal(gotCSV, want.Bytes()) {
		t.Errorf("the figures file written alongside layout (%d bytes) differs from the one written after it (%d bytes)", len(gotCSV), want.Len())
	}
	if !bytes.Contains(gotCSV, []byte("\ncommentary,")) {
		t.Error("the figures file lacks the commentary rows")
	}
	// the same build without a figures file writes nothing alongside
	alone := filepath.Join(dir, "alone.pdf")
	if _, err := Build(context.Background(), demoSource(), Options{Output: alone, Created: demoCreated}); err != nil {
		t.Fatal(err)
	}
	gotPDF, _ := os.ReadFile(out)
	wantPDF, _ := os.ReadFile(alone)
	if len(gotPDF) == 0 || !bytes.Equal(gotPDF, wantPDF) || res.Bytes != len(wantPDF) {
		t.Errorf("the PDF built with a figures file (%d bytes) differs from the one built without (%d bytes)", len(gotPDF), len(wantPDF))
	}
}

// `check` reports the same, plain and as JSON, whatever the number of
// processors: the values are parsed in parts, the data summary runs beside
// the in-memory pack and summarises the indicators on every processor, and
// each must come back in one fixed order (common practice, no source, as
// for the build above).
func TestCheckSameOnOneAndTwoProcessors(t *testing.T) {
	if testing.Short() {
		t.Skip("checks a 1,000-institution world twice")
	}
	dir := t.TempDir()
	if err := benchworld.Write(dir, benchworld.Options{Institutions: 1000, Systems: 30}); err != nil {
		t.Fatal(err)
	}
	src, err := OpenSource(filepath.Join(dir, "brief.md"), "")
	if err != nil {
		t.Fatal(err)
	}
	check := func(procs int) (plain, js []byte) {
		prev := runtime.GOMAXPROCS(procs)
		defer runtime.GOMAXPROCS(prev)
		var p, j bytes.Buffer
		for _, asJSON := range []bool{false, true} {
			in, err := Load(src, nil)
			if err != nil {
				t.Fatalf("GOMAXPROCS=%d: %v", procs, err)
			}
			err = CheckBuild(in, "test")
			if asJSON {
				if err := NewCheckJSON("brief.md", in, err).Write(&j); err != nil {
					t.Fatal(err)
				}
				continue
			}
			if err != nil {
				t.Fatalf("GOMAXPROCS=%d: %v", procs, err)
			}
			WriteCheckReport(&p, in)
		}
		return p.Bytes(), j.Bytes()
	}
	plain1, json1 := check(1)
	plain2, json2 := check(2)
	if !bytes.Contains(plain1, []byte("Comparison groups in")) || !bytes.Contains(json1, []byte(`"coverage"`)) {
		t.Fatalf("an incomplete report:\n%s\n%s", plain1, json1)
	}
	if !bytes.Equal(plain1, plain2) {
		t.Errorf("check's report differs between one processor and two:\n%s\n---\n%s", plain1, plain2)
	}
	if !bytes.Equal(json1, json2) {
		t.Errorf("check --json differs between one processor and two:\n%s\n---\n%s", json1, json2)
	}
}
