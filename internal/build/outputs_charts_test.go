package build

import (
	"context"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// tree reads every file under dir, hidden ones and sub-folders included.
func tree(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	files := map[string][]byte{}
	err := filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(dir, p)
		if d.IsDir() {
			files[rel+"/"] = nil
			return nil
		}
		b, err := os.ReadFile(p)
		files[rel] = b
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return files
}

// --charts is part of the build's one outcome (common practice, no
// source): a build that fails after its charts are drawn, here interrupted
// when every output is in its temporary, leaves the previous pack and the
// previous charts folder as they were, files of the user's own in it
// included, and no staging folder behind.
func TestFailedBuildKeepsPreviousCharts(t *testing.T) {
	dir, src := writeDemo(t)
	pdf, charts := filepath.Join(dir, "pack.pdf"), filepath.Join(dir, "charts")
	if _, err := Build(context.Background(), src, Options{Output: pdf, Charts: charts, Created: demoCreated}); err != nil {
		t.Fatal(err)
	}
	svgs, _ := filepath.Glob(filepath.Join(charts, "figure-01-*.svg"))
	if len(svgs) != 1 {
		t.Fatalf("%d first-figure SVG files", len(svgs))
	}
	// Marks that a rewrite would replace, and a file the build never writes.
	os.WriteFile(svgs[0], []byte("<svg>previous</svg>"), 0o644)
	os.WriteFile(pdf, []byte("%PDF-1.4 the previous good pack"), 0o644)
	os.WriteFile(filepath.Join(charts, "notes.txt"), []byte("mine"), 0o644)
	before := tree(t, dir)

	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	drawn := false
	_, err := Build(ctx, src, Options{Output: pdf, Charts: charts, Created: demoCreated, AfterStage: func(stage string) {
		if stage == "written" {
			// The charts are drawn by now: their staging folder is full.
			ents, _ := os.ReadDir(charts)
			for _, e := range ents {
				if strings.HasPrefix(e.Name(), ".staging-") {
					inner, _ := os.ReadDir(filepath.Join(charts, e.Name()))
					drawn = len(inner) > 0
				}
			}
			cancel()
		}
	}})
	if err == nil || !strings.Contains(err.Error(), "interrupted") {
		t.Fatalf("want an interruption error, got %v", err)
	}
	if !drawn {
		t.Error("the charts were not drawn before the interruption; the test proves nothing")
	}
	sameSnapshot(t, before, tree(t, dir))
}

// A build with --charts that names a file is refused before any work.
func TestChartsOverAFileRefused(t *testing.T) {
	dir, src := writeDemo(t)
	file := filepath.Join(dir, "charts.txt")
	os.WriteFile(file, []byte("not a folder"), 0o644)
	_, err := Build(context.Background(), src, Options{Output: filepath.Join(dir, "p.pdf"), Charts: file, Created: demoCreated})
	if err == nil || !strings.Contains(err.Error(), "--charts names a file, not a folder") {
		t.Fatalf("got %v", err)
	}
	if _, err := os.Stat(filepath.Join(dir, "p.pdf")); err == nil {
		t.Error("the pack was written")
	}
}
