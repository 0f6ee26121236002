package main

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestMalformedCatalogue runs `peerpack check brief.md` in every case
// folder under testdata/bad/ and compares the first line of stderr with
// expect.txt (first line: the exact message; optional second line
// "exit N", default 1).
func TestMalformedCatalogue(t *testing.T) {
	cases, _ := filepath.Glob("../../testdata/bad/*/*")
	if len(cases) < 40 {
		t.Errorf("the catalogue has %d cases; keep at least 40", len(cases))
	}
	for _, dir := range cases {
		if fi, err := os.Stat(dir); err != nil || !fi.IsDir() {
			continue // a generator script beside the cases
		}
		t.Run(filepath.Base(filepath.Dir(dir))+"/"+filepath.Base(dir), func(t *testing.T) {
			raw, err := os.ReadFile(filepath.Join(dir, "expect.txt"))
			if err != nil {
				t.Fatalf("case without expect.txt: %v", err)
			}
			lines := strings.Split(strings.TrimRight(string(raw), "\n"), "\n")
			want, wantCode := lines[0], 1
			if want == "ok" {
				// a valid edge case: it must load, with nothing on stderr
				want, wantCode = "", 0
			}
			if len(lines) > 1 && strings.HasPrefix(lines[1], "exit ") {
				wantCode, _ = strconv.Atoi(strings.TrimPrefix(lines[1], "exit "))
			}
			args := []string{"check", "brief.md"}
			if extra, err := os.ReadFile(filepath.Join(dir, "args.txt")); err == nil {
				args = append(args, strings.Fields(string(extra))...)
			}
			t.Chdir(dir)
			var stdout, stderr bytes.Buffer
			code := run(context.Background(), &env{stdout: &stdout, stderr: &stderr}, args)
			got := strings.SplitN(stderr.String(), "\n", 2)[0]
			if got != want {
				t.Errorf("first line of the error\n got: %s\nwant: %s", got, want)
			}
			if code != wantCode {
				t.Errorf("exit code %d, want %d", code, wantCode)
			}
		})
	}
}
