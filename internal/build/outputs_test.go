package build

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/demo"
)

// writeDemo writes the demo scenario to a fresh folder and opens it as a
// source on disk, as `peerpack build DIR/brief.md` would.
func writeDemo(t *testing.T) (string, Source) {
	t.Helper()
	dir := t.TempDir()
	if err := demo.Write(dir); err != nil {
		t.Fatal(err)
	}
	src, err := OpenSource(filepath.Join(dir, demo.BriefName), "")
	if err != nil {
		t.Fatal(err)
	}
	return dir, src
}

// snapshot reads every file of a folder, to prove a refused build changed
// nothing.
func snapshot(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	files := map[string][]byte{}
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range ents {
		if e.Type().IsRegular() {
			b, _ := os.ReadFile(filepath.Join(dir, e.Name()))
			files[e.Name()] = b
		} else {
			files[e.Name()] = []byte(e.Type().String())
		}
	}
	return files
}

func sameSnapshot(t *testing.T, before, after map[string][]byte) {
	t.Helper()
	for name, b := range before {
		if !bytes.Equal(after[name], b) {
			t.Errorf("%s changed", name)
		}
	}
	for name := range after {
		if _, ok := before[name]; !ok {
			t.Errorf("%s was left behind", name)
		}
	}
}

// Outputs over inputs: a file output that is an input of the build, equal
// to another output, a folder, a device or a symbolic link is refused with
// the flag named and what to do, and nothing on disk changes. The rule
// (never overwrite an input; write only regular files) is common practice,
// no source.
func TestOutputsRefused(t *testing.T) {
	dir, src := writeDemo(t)
	in := func(name string) string { return filepath.Join(dir, name) }
	os.Mkdir(in("packs"), 0o755)
	os.WriteFile(in("pack.pdf"), []byte("%PDF-1.4 the previous good pack"), 0o644)
	linked := os.Symlink(in("pack.pdf"), in("link.pdf")) == nil
	hard := os.Link(in("values.csv"), in("hard.csv")) == nil
	cases := []struct {
		name string
		opt  Options
		want string
	}{
		{"brief", Options{Output: in("brief.md")},
			in("brief.md") + ": -o names the brief of this build, which would be overwritten; write the output elsewhere, e.g. -o pack.pdf"},
		{"values", Options{Output: in("pack.pdf"), Figures: in("values.csv")},
			in("values.csv") + ": --figures names a values file (data.values) of this build, which would be overwritten; write the output elsewhere, e.g. --figures figures.csv"},
		{"register by a relative path", Options{Output: in("pack.pdf"), Workbook: in("sub/../institutions.csv")},
			in("sub/../institutions.csv") + ": --workbook names the register (data.register) of this build, which would be overwritten; write the output elsewhere, e.g. --workbook figures.xlsx"},
		{"ppp", Options{Output: in("ppp.csv")},
			in("ppp.csv") + ": -o names the PPP file (data.ppp) of this build, which would be overwritten; write the output elsewhere, e.g. -o pack.pdf"},
		{"equal outputs", Options{Output: in("pack.pdf"), Figures: in("./pack.pdf")},
			in("./pack.pdf") + ": -o and --figures name the same file; give each output its own name, e.g. --figures figures.csv"},
		{"folder", Options{Output: in("packs")},
			in("packs") + ": -o names a folder, not a file; give a file name inside it, e.g. " + in("packs/pack.pdf")},
		{"device", Options{Output: in("pack.pdf"), Figures: "/dev/full"},
			"/dev/full: --figures names a device, not a file; give the name of a regular file (an existing one is replaced) or a new name"},
	}
	if linked {
		cases = append(cases, struct {
			name string
			opt  Options
			want string
		}{"symbolic link", Options{Output: in("link.pdf")},
			in("link.pdf") + ": -o names a symbolic link, not a file; give the path of the file it points to, or a new name"})
	}
	if hard {
		cases = append(cases, struct {
			name string
			opt  Options
			want string
		}{"hard link to an input", Options{Output: in("pack.pdf"), Figures: in("hard.csv")},
			in("hard.csv") + ": --figures names a values file (data.values) of this build, which would be overwritten; write the output elsewhere, e.g. --figures figures.csv"})
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if c.name == "device" {
				if fi, err := os.Stat("/dev/full"); err != nil || fi.Mode()&os.ModeDevice == 0 {
					t.Skip("no /dev/full here")
				}
			}
			before := snapshot(t, dir)
			c.opt.Created = demoCreated
			_, err := Build(context.Background(), src, c.opt)
			if err == nil {
				t.Fatal("the build must be refused")
			}
			if err.Error() != c.want {
				t.Errorf("message\n got: %s\nwant: %s", err, c.want)
			}
			sameSnapshot(t, before, snapshot(t, dir))
		})
	}
}

// One build, one outcome: when a later output cannot be written (here its
// folder is missing, as a full disk would fail it), no earlier output has
// replaced its previous file and no temporary is left.
func TestLaterOutputFailureKeepsEveryPrevious(t *testing.T) {
	dir, src := writeDemo(t)
	pdf, figs := filepath.Join(dir, "pack.pdf"), filepath.Join(dir, "figures.csv")
	os.WriteFile(pdf, []byte("%PDF-1.4 the previous good pack"), 0o644)
	os.WriteFile(figs, []byte("previous figures"), 0o644)
	before := snapshot(t, dir)
	_, err := Build(context.Background(), src, Options{Output: pdf, Figures: figs, Workbook: filepath.Join(dir, "gone", "f.xlsx"), Created: demoCreated})
	if err == nil || !strings.Contains(err.Error(), "gone") {
		t.Fatalf("want an error naming the missing folder, got %v", err)
	}
	sameSnapshot(t, before, snapshot(t, dir))
}

// An interrupt after every output is in its temporary, before any rename,
// replaces nothing.
func TestInterruptBeforeRenameKeepsEveryPrevious(t *testing.T) {
	dir, src := writeDemo(t)
	pdf, figs := filepath.Join(dir, "pack.pdf"), filepath.Join(dir, "figures.csv")
	os.WriteFile(pdf, []byte("%PDF-1.4 the previous good pack"), 0o644)
	os.WriteFile(figs, []byte("previous figures"), 0o644)
	before := snapshot(t, dir)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	_, err := Build(ctx, src, Options{Output: pdf, Figures: figs, Created: demoCreated, AfterStage: func(stage string) {
		if stage == "written" {
			cancel()
		}
	}})
	if err == nil || !strings.Contains(err.Error(), "interrupted") {
		t.Fatalf("want an interruption error, got %v", err)
	}
	sameSnapshot(t, before, snapshot(t, dir))
}
