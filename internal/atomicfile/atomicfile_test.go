package atomicfile

import (
	"bytes"
	"context"
	"errors"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
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

// An unwritable output folder fails the write and leaves the previous
// pack byte-identical. Root ignores permission bits, so there the folder
// is made immutable with chattr +i (ext4 and most Linux file systems);
// where that is not possible the folder is made read-only for other users.
func TestUnwritableFolder(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "pack.pdf")
	previous := []byte("%PDF-1.4 the previous good pack")
	if err := os.WriteFile(target, previous, 0o644); err != nil {
		t.Fatal(err)
	}
	if os.Geteuid() == 0 {
		chattr, err := exec.LookPath("chattr")
		if err != nil || exec.Command(chattr, "+i", dir).Run() != nil {
			t.Skip("running as root without chattr +i: cannot make a folder unwritable")
		}
		t.Cleanup(func() { exec.Command(chattr, "-i", dir).Run() })
	} else {
		os.Chmod(dir, 0o555)
		t.Cleanup(func() { os.Chmod(dir, 0o755) })
	}
	err := WriteFile(context.Background(), target, []byte("new pack"), 0o644)
	if err == nil {
		t.Fatal("expected an error for an unwritable folder")
	}
	if !strings.Contains(err.Error(), "writable") {
		t.Errorf("the message should say what to check: %v", err)
	}
	got, _ := os.ReadFile(target)
	if !bytes.Equal(got, previous) {
		t.Errorf("the previous pack changed to %q", got)
	}
}

// A folder that does not exist fails with a message naming it.
func TestMissingFolder(t *testing.T) {
	err := WriteFile(context.Background(), filepath.Join(t.TempDir(), "missing", "pack.pdf"), []byte("x"), 0o644)
	if err == nil || !strings.Contains(err.Error(), "missing") {
		t.Fatalf("want an error naming the missing folder, got %v", err)
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

// A set of files is one outcome: the second file's failure (a full disk,
// ENOSPC from write(2), POSIX) leaves the first target untouched too.
func TestSetFailureKeepsEveryPrevious(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "pack.pdf"), filepath.Join(dir, "figures.csv")
	os.WriteFile(a, []byte("previous pack"), 0o644)
	os.WriteFile(b, []byte("previous figures"), 0o644)
	var s Set
	if err := s.Add(a, 0o644, func(w io.Writer) error { _, err := w.Write([]byte("new pack")); return err }); err != nil {
		t.Fatal(err)
	}
	err := s.Add(b, 0o644, func(w io.Writer) error {
		_, err := (&failingWriter{w: w, left: 3}).Write([]byte("new figures"))
		return err
	})
	if err == nil {
		t.Fatal("expected the failing writer's error")
	}
	if err := s.Commit(context.Background()); err != nil {
		t.Fatalf("committing a discarded set: %v", err)
	}
	for path, want := range map[string]string{a: "previous pack", b: "previous figures"} {
		if got, _ := os.ReadFile(path); string(got) != want {
			t.Errorf("%s changed to %q", path, got)
		}
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 2 {
		t.Errorf("left behind: %v", ents)
	}
}

// Targets a rename would wrongly replace are refused (common practice, no
// source): a folder, a device, a symbolic link.
func TestCheckTarget(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "f"), nil, 0o644)
	os.Symlink(filepath.Join(dir, "f"), filepath.Join(dir, "l"))
	for path, want := range map[string]string{
		filepath.Join(dir, "new"): "",
		filepath.Join(dir, "f"):   "",
		dir:                       "a folder",
		filepath.Join(dir, "l"):   "a symbolic link",
		"/dev/null":               "a device",
	} {
		err := CheckTarget(path)
		var te *TargetError
		switch {
		case want == "" && err != nil:
			t.Errorf("%s: %v", path, err)
		case want != "" && (!errors.As(err, &te) || te.Kind != want):
			t.Errorf("%s: got %v, want %s", path, err, want)
		}
	}
}

// A set joined into another is committed with it, after the other's
// files, and a discarded set leaves nothing behind (common practice, no
// source).
func TestJoin(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "pack.pdf"), filepath.Join(dir, "figures.csv")
	write := func(s string) func(io.Writer) error {
		return func(w io.Writer) error { _, err := w.Write([]byte(s)); return err }
	}
	var main, side Set
	if err := side.Add(b, 0o644, write("figures")); err != nil {
		t.Fatal(err)
	}
	if err := main.Add(a, 0o644, write("pack")); err != nil {
		t.Fatal(err)
	}
	main.Join(&side)
	if len(side.pending) != 0 || len(main.pending) != 2 || main.pending[1].target != b {
		t.Fatalf("joined set: %+v, left %+v", main.pending, side.pending)
	}
	if err := main.Commit(context.Background()); err != nil {
		t.Fatal(err)
	}
	for path, want := range map[string]string{a: "pack", b: "figures"} {
		if got, _ := os.ReadFile(path); string(got) != want {
			t.Errorf("%s holds %q", path, got)
		}
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 2 {
		t.Errorf("left behind: %v", ents)
	}
}

func writeString(s string) func(io.Writer) error {
	return func(w io.Writer) error {
		_, err := io.WriteString(w, s)
		return err
	}
}

func readDir(t *testing.T, dir string) map[string]string {
	t.Helper()
	out := map[string]string{}
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range ents {
		b, _ := os.ReadFile(filepath.Join(dir, e.Name()))
		out[e.Name()] = string(b)
	}
	return out
}

// A folder of the set: a new folder appears whole at Commit and not
// before; an existing folder gets the new files at Commit, keeps files the
// set does not write, and is left as it was by a failed set. Either way no
// staging folder remains.
func TestFolder(t *testing.T) {
	root := t.TempDir()
	charts := filepath.Join(root, "slides", "charts")
	var s Set
	f, err := s.Folder(charts, 0o755)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Add("a.svg", 0o644, writeString("new a")); err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(charts); err == nil {
		t.Fatal("the folder exists before Commit")
	}
	if err := s.Commit(context.Background()); err != nil {
		t.Fatal(err)
	}
	if got := readDir(t, charts); len(got) != 1 || got["a.svg"] != "new a" {
		t.Fatalf("after the first commit: %v", got)
	}
	if got := readDir(t, filepath.Join(root, "slides")); len(got) != 1 {
		t.Fatalf("beside the folder: %v", got)
	}
	if fi, _ := os.Stat(charts); fi.Mode().Perm() != 0o755 {
		t.Errorf("folder mode %v", fi.Mode().Perm())
	}

	os.WriteFile(filepath.Join(charts, "notes.txt"), []byte("mine"), 0o644)
	// A failed set: the second file's writer fails as a full disk would.
	var s2 Set
	f, err = s2.Folder(charts, 0o755)
	if err != nil {
		t.Fatal(err)
	}
	f.Add("a.svg", 0o644, writeString("newer a"))
	if err := f.Add("b.svg", 0o644, func(w io.Writer) error {
		_, err := (&failingWriter{w: w, left: 2}).Write([]byte("too long"))
		return err
	}); err == nil {
		t.Fatal("expected the failing writer's error")
	}
	s2.Discard()
	if got := readDir(t, charts); len(got) != 2 || got["a.svg"] != "new a" || got["notes.txt"] != "mine" {
		t.Fatalf("after a failed set: %v", got)
	}
	// An interrupted set changes nothing either.
	var s3 Set
	f, _ = s3.Folder(charts, 0o755)
	f.Add("a.svg", 0o644, writeString("newer a"))
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if err := s3.Commit(ctx); err == nil {
		t.Fatal("expected an interruption error")
	}
	if got := readDir(t, charts); len(got) != 2 || got["a.svg"] != "new a" {
		t.Fatalf("after an interrupted set: %v", got)
	}
	// A good set replaces its files and keeps the others.
	var s4 Set
	f, _ = s4.Folder(charts, 0o755)
	f.Add("a.svg", 0o644, writeString("newer a"))
	f.Add("b.svg", 0o644, writeString("new b"))
	if err := s4.Commit(context.Background()); err != nil {
		t.Fatal(err)
	}
	if got := readDir(t, charts); len(got) != 3 || got["a.svg"] != "newer a" || got["b.svg"] != "new b" || got["notes.txt"] != "mine" {
		t.Fatalf("after a good set: %v", got)
	}
}

// A discarded set with a new folder leaves no folder behind, nor the parent
// folders made for it; a folder that names a file is refused.
func TestFolderDiscardedLeavesNothing(t *testing.T) {
	root := t.TempDir()
	var s Set
	f, err := s.Folder(filepath.Join(root, "out", "slides", "charts"), 0o755)
	if err != nil {
		t.Fatal(err)
	}
	f.Add("a.svg", 0o644, writeString("a"))
	s.Discard()
	if got := readDir(t, root); len(got) != 0 {
		t.Fatalf("left behind: %v", got)
	}
	file := filepath.Join(root, "file")
	os.WriteFile(file, nil, 0o644)
	var te *TargetError
	if _, err := s.Folder(file, 0o755); !errors.As(err, &te) {
		t.Fatalf("got %v", err)
	}
}
