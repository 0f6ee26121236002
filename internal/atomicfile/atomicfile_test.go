package atomicfile

import (
	"context"
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

// failingWriter stands for a full disk: it accepts some bytes, then fails
// with ENOSPC as write(2) does (POSIX).
type failingWriter struct {
	w    io.Writer
	left int
}

func (f *failingWriter) Write(p []byte) (int, error) {
	if len(p) > f.left {
		n, _ := f.w.Write(p[:f.left])
		f.left = 0
		return n, errors.New("no space left on device")
	}
	f.left -= len(p)
	return f.w.Write(p)
}

func TestFailedWriteKeepsPrevious(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "pack.pdf")
	if err := os.WriteFile(target, []byte("previous pack"), 0o644); err != nil {
		t.Fatal(err)
	}
	err := Write(context.Background(), target, 0o644, func(w io.Writer) error {
		fw := &failingWriter{w: w, left: 5}
		_, err := fw.Write([]byte("new pack that does not fit"))
		return err
	})
	if err == nil {
		t.Fatal("expected an error from the failing writer")
	}
	got, _ := os.ReadFile(target)
	if string(got) != "previous pack" {
		t.Fatalf("previous file changed to %q", got)
	}
	assertNoTemporaries(t, dir)
}

func TestCancelledKeepsPrevious(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "pack.pdf")
	os.WriteFile(target, []byte("previous pack"), 0o644)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if err := WriteFile(ctx, target, []byte("new"), 0o644); err == nil {
		t.Fatal("expected an interruption error")
	}
	got, _ := os.ReadFile(target)
	if string(got) != "previous pack" {
		t.Fatalf("previous file changed to %q", got)
	}
	assertNoTemporaries(t, dir)
}

func TestUnwritableFolder(t *testing.T) {
	if os.Geteuid() == 0 {
		// root ignores permission bits; use a folder that does not exist
		// instead, which fails the same way for every user.
		err := WriteFile(context.Background(), filepath.Join(t.TempDir(), "missing", "pack.pdf"), []byte("x"), 0o644)
		if err == nil {
			t.Fatal("expected an error for a missing folder")
		}
		return
	}
	dir := t.TempDir()
	os.Chmod(dir, 0o555)
	defer os.Chmod(dir, 0o755)
	if err := WriteFile(context.Background(), filepath.Join(dir, "pack.pdf"), []byte("x"), 0o644); err == nil {
		t.Fatal("expected an error for an unwritable folder")
	}
}

func TestWriteReplaces(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "pack.pdf")
	os.WriteFile(target, []byte("old"), 0o644)
	if err := WriteFile(context.Background(), target, []byte("new"), 0o644); err != nil {
		t.Fatal(err)
	}
	got, _ := os.ReadFile(target)
	if string(got) != "new" {
		t.Fatalf("got %q", got)
	}
	assertNoTemporaries(t, dir)
}

func assertNoTemporaries(t *testing.T, dir string) {
	t.Helper()
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if e.Name() != "pack.pdf" {
			t.Errorf("left behind %s", e.Name())
		}
	}
}
