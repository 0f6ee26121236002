package main

import (
	"bytes"
	"context"
	"io"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"
)

// inputCase copies a small valid case (brief and data) into a fresh
// folder and returns it.
func inputCase(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	src := "../../testdata/bad/data/extreme_magnitude_valid"
	for _, name := range []string{"brief.md", "institutions.csv", "indicators.yaml", "values.csv"} {
		b, err := os.ReadFile(filepath.Join(src, name))
		if err != nil {
			t.Fatal(err)
		}
		os.WriteFile(filepath.Join(dir, name), b, 0o644)
	}
	return dir
}

// Inputs that are not regular files are refused by kind before anything
// opens them (opening a named pipe blocks until a writer comes; a device
// such as /dev/zero never ends), and a brief over its size limit before
// it is read. Expected texts are the messages themselves; the rule is
// common practice, no source.
func TestInputKindsRefusedBeforeReading(t *testing.T) {
	cases := []struct {
		name  string
		setup func(t *testing.T, dir string)
		want  string
	}{
		{"values a named pipe", func(t *testing.T, dir string) {
			os.Remove(filepath.Join(dir, "values.csv"))
			if err := syscall.Mkfifo(filepath.Join(dir, "values.csv"), 0o644); err != nil {
				t.Skip("no named pipes here")
			}
		}, `brief.md:8:3: data.values "values.csv" is a named pipe, not a file; name a data file (CSV, XLSX or YAML) in the brief's folder`},
		{"values a folder", func(t *testing.T, dir string) {
			os.Remove(filepath.Join(dir, "values.csv"))
			os.Mkdir(filepath.Join(dir, "values.csv"), 0o755)
		}, `brief.md:8:3: data.values "values.csv" is a folder, not a file; name a data file (CSV, XLSX or YAML) in the brief's folder`},
		{"values a link out of the folder", func(t *testing.T, dir string) {
			outside := t.TempDir()
			os.Rename(filepath.Join(dir, "values.csv"), filepath.Join(outside, "values.csv"))
			if err := os.Symlink(filepath.Join(outside, "values.csv"), filepath.Join(dir, "values.csv")); err != nil {
				t.Skip("no symbolic links here")
			}
		}, `brief.md:8:3: data.values "values.csv" is a symbolic link (or lies behind one) that leads out of the brief's folder, and peerpack reads only files inside it; copy the file into the folder, or pass --root with a folder that holds both`},
		{"brief a named pipe", func(t *testing.T, dir string) {
			os.Remove(filepath.Join(dir, "brief.md"))
			if err := syscall.Mkfifo(filepath.Join(dir, "brief.md"), 0o644); err != nil {
				t.Skip("no named pipes here")
			}
		}, `brief.md: the brief is a named pipe, not a file; name a Markdown file, e.g. brief.md`},
		{"brief over 8 MiB", func(t *testing.T, dir string) {
			// A sparse file: its size is stated, nothing is written.
			if err := os.Truncate(filepath.Join(dir, "brief.md"), 2<<30); err != nil {
				t.Skip("cannot make a sparse file here")
			}
		}, `brief.md: the brief is 2048.0 MiB, over the limit of 8.0 MiB for a brief; keep data in the data files it names`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := inputCase(t)
			c.setup(t, dir)
			t.Chdir(dir)
			code, _, stderr := runArgs("check", "brief.md")
			if got := strings.SplitN(stderr, "\n", 2)[0]; got != c.want {
				t.Errorf("first line\n got: %s\nwant: %s", got, c.want)
			}
			if code != exitInput {
				t.Errorf("exit %d, want %d", code, exitInput)
			}
		})
	}
}

// syncBuffer is a bytes.Buffer safe to write from the watch loop while the
// test reads it.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

// A data file deleted under --watch is reported as gone, with the last
// pack kept, not as "not in the brief's folder".
func TestWatchDeletedDataFile(t *testing.T) {
	dir := inputCase(t)
	t.Chdir(dir)
	var stderr syncBuffer
	e := &env{stdout: io.Discard, stderr: &stderr}
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan int)
	go func() { done <- run(ctx, e, []string{"build", "brief.md", "-o", "pack.pdf", "--watch"}) }()
	deadline := time.Now().Add(20 * time.Second)
	for !strings.Contains(stderr.String(), "watching") && time.Now().Before(deadline) {
		time.Sleep(50 * time.Millisecond)
	}
	before, _ := os.ReadFile("pack.pdf")
	os.Remove("values.csv")
	for !strings.Contains(stderr.String(), "is gone") && time.Now().Before(deadline) {
		time.Sleep(50 * time.Millisecond)
	}
	cancel()
	<-done
	out := stderr.String()
	if !strings.Contains(out, "values.csv is gone (deleted or renamed); keeping the last pack and waiting for it to come back") {
		t.Errorf("stderr:\n%s", out)
	}
	if strings.Contains(out, "brief's folder") {
		t.Errorf("a deleted file is not a path mistake:\n%s", out)
	}
	after, _ := os.ReadFile("pack.pdf")
	if len(before) == 0 || !bytes.Equal(before, after) {
		t.Error("the last pack changed")
	}
}
