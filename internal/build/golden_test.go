package build

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the demo's golden figures file")

// goldenFigures holds the demo pack's figures file. A change to any number
// or sentence of the demo shows here as a diff; refresh it deliberately
// with `go test ./internal/build -run Golden -update` and read the diff.
var goldenFigures = filepath.Join("..", "..", "testdata", "golden", "demo-figures.csv")

func TestDemoFiguresGolden(t *testing.T) {
	in, _ := demoPack(t)
	got := figuresCSV(t, in)
	if *update {
		os.MkdirAll(filepath.Dir(goldenFigures), 0o755)
		if err := os.WriteFile(goldenFigures, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(goldenFigures)
	if err != nil {
		t.Fatalf("no golden figures file (run with -update once): %v", err)
	}
	if bytes.Equal(want, got) {
		return
	}
	gl, wl := bytes.Split(got, []byte("\n")), bytes.Split(want, []byte("\n"))
	shown := 0
	for i := 0; i < len(gl) || i < len(wl); i++ {
		var g, w []byte
		if i < len(gl) {
			g = gl[i]
		}
		if i < len(wl) {
			w = wl[i]
		}
		if !bytes.Equal(g, w) {
			t.Errorf("line %d\n got: %s\nwant: %s", i+1, g, w)
			if shown++; shown == 5 {
				break
			}
		}
	}
	t.Errorf("the demo's figures changed (%d lines now, %d in the golden file); if intended, run go test ./internal/build -run Golden -update and review the diff", len(gl), len(wl))
}
