package build

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/demo"
	"peerpack/internal/narrative"
	"peerpack/templates"
)

// The demo and every template build with every comparing sentence's
// claims holding twice over: in Go (narrative.Verify) and in the figures
// file, re-read by a short Python script that shares no code with Go
// (internal/narrative/testdata/check_claims.py, Python's csv module only).
// Both must count the same claims, and there must be some.
func TestPacksClaimsHoldOutsideGo(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the demo and the templates")
	}
	py, err := exec.LookPath("python3")
	if err != nil {
		t.Skip("python3 is not installed (Debian: apt-get install python3)")
	}
	script, _ := filepath.Abs(filepath.Join("..", "narrative", "testdata", "check_claims.py"))
	sources := map[string]Source{"demo": demoSource()}
	for _, name := range templates.Names() {
		files, err := templates.Files(name)
		if err != nil {
			t.Fatal(err)
		}
		fsys := fstest.MapFS{}
		for n, b := range files {
			fsys[n] = &fstest.MapFile{Data: b}
		}
		sources[name] = Source{FS: fsys, Brief: demo.BriefName, Display: name + "/" + demo.BriefName}
	}
	for name, src := range sources {
		t.Run(name, func(t *testing.T) {
			in, err := Load(src, nil)
			if err != nil {
				t.Fatal(err)
			}
			p, err := Pack(in, demoCreated, "test")
			if err != nil {
				t.Fatal(err)
			}
			if err := narrative.Verify(in.Figures, p.Commentary); err != nil {
				t.Fatal(err)
			}
			claims := 0
			for _, s := range p.Commentary.Sentences {
				claims += len(s.Claims)
			}
			file := filepath.Join(t.TempDir(), "figures.csv")
			if err := os.WriteFile(file, figuresCSV(t, in), 0o644); err != nil {
				t.Fatal(err)
			}
			out, err := exec.Command(py, script, file).CombinedOutput()
			if err != nil {
				t.Fatalf("check_claims.py: %v\n%s", err, out)
			}
			if want := fmt.Sprintf("checked %d claims, 0 false", claims); claims == 0 || !strings.Contains(string(out), want) {
				t.Fatalf("check_claims.py printed %q, want %q (and more than none)", out, want)
			}
		})
	}
}
