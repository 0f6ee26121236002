package templates

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"testing"
	"testing/fstest"
	"time"

	"peerpack/internal/build"
	"peerpack/internal/demo"
)

// TestEveryTemplateBuilds runs the whole pipeline on what `peerpack new`
// writes for each template: the template must build a PDF from the demo
// data with no edits at all.
func TestEveryTemplateBuilds(t *testing.T) {
	if testing.Short() {
		t.Skip("builds three packs")
	}
	for _, name := range Names() {
		t.Run(name, func(t *testing.T) {
			files, err := Files(name)
			if err != nil {
				t.Fatal(err)
			}
			fsys := fstest.MapFS{}
			for n, b := range files {
				fsys[n] = &fstest.MapFile{Data: b}
			}
			src := build.Source{FS: fsys, Brief: demo.BriefName, Display: name + "/" + demo.BriefName}
			dir := t.TempDir()
			opt := build.Options{
				Output:  filepath.Join(dir, "pack.pdf"),
				Figures: filepath.Join(dir, "figures.csv"),
				Created: time.Date(2026, 3, 1, 0, 0, 0, 0, time.UTC),
				Version: "test",
			}
			res, err := build.Build(context.Background(), src, opt)
			if err != nil {
				t.Fatalf("building:\n%v", err)
			}
			pdf, _ := os.ReadFile(opt.Output)
			figs, _ := os.ReadFile(opt.Figures)
			if !bytes.HasPrefix(pdf, []byte("%PDF-")) || len(pdf) < 10000 {
				t.Errorf("not a PDF of any size: %d bytes", len(pdf))
			}
			if !bytes.Contains(figs, []byte(res.Inputs.Brief.Focus)) {
				t.Errorf("the figures file never mentions the focus %s", res.Inputs.Brief.Focus)
			}
		})
	}
}
