package dataset

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/brief"
)

var update = flag.Bool("update", false, "rewrite the first line of each malformed-input case's expect.txt from the current output (review the diff)")

// TestMalformedCatalogue runs every case folder of testdata/bad/data
// through brief.Load and Load. expect.txt holds, on its first line, the
// exact first problem the case must produce (paths relative to the case's
// folder), or "ok" for a case that must load. Further lines are texts the
// whole error (or, for an ok case, the check summary) must contain.
func TestMalformedCatalogue(t *testing.T) {
	root := filepath.Join("..", "..", "testdata", "bad", "data")
	entries, err := os.ReadDir(root)
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, e := range entries {
		if !e.IsDir() {
			continue
		}
		n++
		dir := filepath.Join(root, e.Name())
		t.Run(e.Name(), func(t *testing.T) {
			got, full := runCase(t, dir)
			expPath := filepath.Join(dir, "expect.txt")
			want, err := os.ReadFile(expPath)
			if *update {
				lines := []string{got}
				if err == nil {
					old := strings.Split(strings.TrimRight(string(want), "\n"), "\n")
					lines = append(lines, old[1:]...)
				}
				if err := os.WriteFile(expPath, []byte(strings.Join(lines, "\n")+"\n"), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			if err != nil {
				t.Fatalf("no expect.txt: %v", err)
			}
			lines := strings.Split(strings.TrimRight(string(want), "\n"), "\n")
			if got != lines[0] {
				t.Errorf("first problem:\n got %s\nwant %s", got, lines[0])
			}
			for _, sub := range lines[1:] {
				if !strings.Contains(full, sub) {
					t.Errorf("output lacks %q; output:\n%s", sub, full)
				}
			}
		})
	}
	if n < 25 {
		t.Errorf("the catalogue has %d cases; it must cover at least 25", n)
	}
}

// runCase returns the first problem line (or "ok") and the full output.
func runCase(t *testing.T, dir string) (first, full string) {
	t.Helper()
	prefix := dir + string(filepath.Separator)
	b, err := brief.Load(filepath.Join(dir, "brief.md"))
	if err != nil {
		msg := strings.ReplaceAll(err.Error(), prefix, "")
		return strings.SplitN(msg, "\n", 2)[0], msg
	}
	d, rep, err := Load(os.DirFS(dir), b)
	if rep == nil {
		t.Fatal("Load returned no report")
	}
	var out bytes.Buffer
	rep.Write(&out)
	if err != nil {
		msg := strings.ReplaceAll(err.Error(), prefix, "")
		return strings.SplitN(msg, "\n", 2)[0], msg + "\n" + out.String()
	}
	if d == nil {
		t.Fatal("no error and no dataset")
	}
	return "ok", out.String()
}
