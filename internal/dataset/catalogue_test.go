package dataset

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/limits"
)

var update = flag.Bool("update", false, "rewrite the first line of each malformed-input case's expect.txt from the current output (review the diff)")

// TestMalformedCatalogue runs every case folder of testdata/bad/data through
// brief.Load and LoadWith. expect.txt holds, on its first line, the exact
// first problem the case must produce (paths relative to the case's
// folder), or "ok" for a case that must load. Further lines are texts the
// whole error (or, for an ok case, the check summary) must contain; a line
// "exit N" is for the command-line runner and is skipped here. An optional
// args.txt holds extra command-line flags; of them this test applies
// --limit.
func TestMalformedCatalogue(t *testing.T) {
	n := 0
	for _, root := range []string{
		filepath.Join("..", "..", "testdata", "bad", "data"),
	} {
		entries, err := os.ReadDir(root)
		if err != nil {
			t.Fatal(err)
		}
		for _, e := range entries {
			if e.IsDir() {
				n++
				runCatalogueCase(t, filepath.Join(root, e.Name()))
			}
		}
	}
	if n < 25 {
		t.Errorf("the catalogue has %d cases; it must cover at least 25", n)
	}
}

func runCatalogueCase(t *testing.T, dir string) {
	{
		t.Run(filepath.Base(dir), func(t *testing.T) {
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
				if strings.HasPrefix(sub, "exit ") {
					continue
				}
				if !strings.Contains(full, sub) {
					t.Errorf("output lacks %q; output:\n%s", sub, full)
				}
			}
		})
	}
}

// caseLimits reads the --limit flags of a case's args.txt (flags separated
// by spaces or lines; "--limit x=1" and "--limit=x=1" both accepted).
func caseLimits(t *testing.T, dir string) limits.Limits {
	t.Helper()
	lim := limits.Default()
	raw, err := os.ReadFile(filepath.Join(dir, "args.txt"))
	if err != nil {
		return lim
	}
	args := strings.Fields(string(raw))
	for i := 0; i < len(args); i++ {
		spec, ok := strings.CutPrefix(args[i], "--limit=")
		if !ok && args[i] == "--limit" && i+1 < len(args) {
			spec, ok = args[i+1], true
			i++
		}
		if !ok {
			continue
		}
		if lim, err = lim.Parse(spec); err != nil {
			t.Fatalf("args.txt: %v", err)
		}
	}
	return lim
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
	d, rep, err := LoadWith(os.DirFS(dir), b, caseLimits(t, dir))
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
