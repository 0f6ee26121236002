package build

import (
	"bytes"
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
