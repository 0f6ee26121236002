// Package atomicfile writes a file so that readers see either the old
// content or the complete new content, never a partial file: the data goes
// to a uniquely named temporary file beside the target, is flushed to disk,
// and is renamed over the target (rename is atomic within a folder on
// POSIX file systems). A failed or interrupted write removes the temporary
// file and leaves the previous file untouched.
package atomicfile

import (
	"context"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
)

// WriteFile writes data to path atomically with the given permissions.
func WriteFile(ctx context.Context, path string, data []byte, perm os.FileMode) error {
	return Write(ctx, path, perm, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// Write calls fill with a writer onto a temporary file beside path and, if
// fill succeeds and ctx is not cancelled, renames it over path.
func Write(ctx context.Context, path string, perm os.FileMode, fill func(io.Writer) error) error {
	var s Set
	if err := s.Add(path, perm, fill); err != nil {
		return err
	}
	return s.Commit(ctx)
}

// Set writes several files as one outcome: every file goes to its own
// temporary beside its target, and none replaces its target until all are
// complete and flushed. A failure while any is written (a full disk while
// the last of three is written) leaves every target as it was.
type Set struct {
	pending []pending
	folders []*Folder
}

type pending struct {
	target, tmp string
	perm        os.FileMode
}

// Add writes one file of the set to its temporary. On error the set is
// discarded: temporaries written so far are removed.
func (s *Set) Add(path string, perm os.FileMode, fill func(io.Writer) error) (err error) {
	defer func() {
		if err != nil {
			s.Discard()
		}
	}()
	if err := CheckTarget(path); err != nil {
		return err
	}
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	tmp, err := os.CreateTemp(dir, "."+base+".tmp-*")
	if err != nil {
		return fmt.Errorf("cannot write %s: %w (is the folder there and writable?)", path, unwrapPath(err))
	}
	name := tmp.Name()
	fail := func(err error) error {
		tmp.Close()
		os.Remove(name)
		return fmt.Errorf("writing %s failed: %w; the previous file, if any, is untouched", path, unwrapPath(err))
	}
	if err := fill(tmp); err != nil {
		return fail(err)
	}
	if err := tmp.Sync(); err != nil {
		return fail(err)
	}
	if err := tmp.Close(); err != nil {
		os.Remove(name)
		return fmt.Errorf("writing %s failed: %w; the previous file, if any, is untouched", path, unwrapPath(err))
	}
	s.pending = append(s.pending, pending{target: path, tmp: name, perm: perm})
	return nil
}

// Join moves the files of another set, written meanwhile (on another
// goroutine, say), to the end of this one, so that one Commit replaces
// them all; o is left empty.
func (s *Set) Join(o *Set) {
	s.pending = append(s.pending, o.pending...)
	o.pending = nil
}

// Commit renames every temporary over its target, unless ctx is cancelled
// (then, as on any error before the first rename, nothing is replaced).
// Renames within a folder are atomic (POSIX rename(2)); the set as a whole
// is not, but every file is complete before the first rename.
func (s *Set) Commit(ctx context.Context) error {
	defer s.Discard()
	if err := ctx.Err(); err != nil {
		return fmt.Errorf("interrupted before %s was replaced; the previous files, if any, are untouched", s.targets())
	}
	for _, p := range s.pending {
		if err := CheckTarget(p.target); err != nil {
			return err
		}
		if err := os.Chmod(p.tmp, p.perm); err != nil {
			return fmt.Errorf("cannot set permissions on %s: %w", p.target, unwrapPath(err))
		}
	}
	for _, f := range s.folders {
		if err := f.check(); err != nil {
			return err
		}
	}
	for i, p := range s.pending {
		if err := os.Rename(p.tmp, p.target); err != nil {
			return fmt.Errorf("cannot replace %s: %w", p.target, unwrapPath(err))
		}
		s.pending[i].tmp = ""
	}
	for _, f := range s.folders {
		if err := f.commit(); err != nil {
			return err
		}
	}
	return nil
}

// Discard removes the temporaries not yet renamed, and the staging folders
// with the files still in them.
func (s *Set) Discard() {
	for _, p := range s.pending {
		if p.tmp != "" {
			os.Remove(p.tmp)
		}
	}
	s.pending = nil
	for _, f := range s.folders {
		f.discard()
	}
	s.folders = nil
}

func (s *Set) targets() string {
	names := make([]string, 0, len(s.pending)+len(s.folders))
	for _, p := range s.pending {
		names = append(names, p.target)
	}
	for _, f := range s.folders {
		names = append(names, f.target)
	}
	if len(names) == 0 {
		return "anything"
	}
	return strings.Join(names, " and ")
}

// Folder is a folder of files written as part of a Set (a pack's charts):
// its files are written to a staging folder, and none reaches the folder
// before the set's Commit. A folder that does not exist yet is staged
// beside it and renamed into place whole (one atomic rename); an existing
// folder is staged inside itself, so that every file is renamed into it
// within one file system, and files of its own that the set does not write
// are left alone. Until Commit the folder is as it was; a discarded set
// removes the staging folder and any parent folders it made.
type Folder struct {
	target  string
	stage   string
	inside  bool     // staged inside the existing target
	made    []string // parent folders made for a new target, deepest last
	names   []string
	perm    os.FileMode
	settled bool
}

// Folder starts a folder of the set; files are added to it with Add.
func (s *Set) Folder(dir string, perm os.FileMode) (*Folder, error) {
	f := &Folder{target: dir, perm: perm}
	fi, err := os.Stat(dir)
	switch {
	case err == nil && !fi.IsDir():
		return nil, &TargetError{Path: dir, Kind: "a file, not a folder", Fix: "give the name of a folder (made if missing)"}
	case err == nil:
		f.inside = true
		f.stage, err = os.MkdirTemp(dir, ".staging-*")
	case errors.Is(err, fs.ErrNotExist):
		parent, base := filepath.Split(filepath.Clean(dir))
		if parent == "" {
			parent = "."
		}
		for p := filepath.Clean(parent); ; p = filepath.Dir(p) {
			if _, err := os.Lstat(p); err == nil || p == filepath.Dir(p) {
				break
			}
			f.made = append([]string{p}, f.made...)
		}
		if err = os.MkdirAll(parent, 0o755); err == nil {
			f.stage, err = os.MkdirTemp(parent, "."+base+".tmp-*")
		}
	}
	if err != nil {
		f.discard()
		return nil, fmt.Errorf("cannot write the folder %s: %w (is its parent folder there and writable?)", dir, unwrapPath(err))
	}
	s.folders = append(s.folders, f)
	return f, nil
}

// Add writes one file of the folder, named name inside it, to the staging
// folder. On error the file is removed; the caller discards the set.
func (f *Folder) Add(name string, perm os.FileMode, fill func(io.Writer) error) error {
	if name != filepath.Base(name) || strings.HasPrefix(name, ".") {
		return fmt.Errorf("cannot write %q into %s: not a plain file name", name, f.target)
	}
	path := filepath.Join(f.stage, name)
	out, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o600)
	if err != nil {
		return fmt.Errorf("cannot write %s: %w (is the folder writable?)", filepath.Join(f.target, name), unwrapPath(err))
	}
	fail := func(err error) error {
		out.Close()
		os.Remove(path)
		return fmt.Errorf("writing %s failed: %w; the previous file, if any, is untouched", filepath.Join(f.target, name), unwrapPath(err))
	}
	if err := fill(out); err != nil {
		return fail(err)
	}
	if err := out.Sync(); err != nil {
		return fail(err)
	}
	if err := out.Chmod(perm); err != nil {
		return fail(err)
	}
	if err := out.Close(); err != nil {
		os.Remove(path)
		return fmt.Errorf("writing %s failed: %w; the previous file, if any, is untouched", filepath.Join(f.target, name), unwrapPath(err))
	}
	f.names = append(f.names, name)
	return nil
}

// check refuses, before any rename, a target that cannot take the files.
func (f *Folder) check() error {
	if !f.inside {
		if _, err := os.Lstat(f.target); err == nil {
			return fmt.Errorf("cannot write the folder %s: it appeared while the files were written; run again", f.target)
		}
		return os.Chmod(f.stage, f.perm)
	}
	for _, n := range f.names {
		if err := CheckTarget(filepath.Join(f.target, n)); err != nil {
			return err
		}
	}
	return nil
}

func (f *Folder) commit() error {
	if !f.inside {
		if err := os.Rename(f.stage, f.target); err != nil {
			return fmt.Errorf("cannot put the folder %s in place: %w", f.target, unwrapPath(err))
		}
		f.settled = true
		return nil
	}
	for _, n := range f.names {
		if err := os.Rename(filepath.Join(f.stage, n), filepath.Join(f.target, n)); err != nil {
			return fmt.Errorf("cannot replace %s: %w", filepath.Join(f.target, n), unwrapPath(err))
		}
	}
	f.settled = true
	return os.Remove(f.stage)
}

func (f *Folder) discard() {
	if f.settled {
		return
	}
	if f.stage != "" {
		os.RemoveAll(f.stage)
	}
	for i := len(f.made) - 1; i >= 0; i-- {
		os.Remove(f.made[i]) // only if empty
	}
	f.settled = true
}

// CheckTarget refuses a target that a rename would wrongly replace: a
// folder (rename fails with a bare "file exists"), a device, pipe or
// socket (as root, rename would swap /dev/full for a plain file), or a
// symbolic link (rename replaces the link, not the file it points to).
// A regular file or a name that does not exist yet is fine.
func CheckTarget(path string) error {
	fi, err := os.Lstat(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return fmt.Errorf("cannot write %s: %w", path, unwrapPath(err))
	}
	switch m := fi.Mode(); {
	case m.IsRegular():
		return nil
	case m.IsDir():
		return &TargetError{Path: path, Kind: "a folder", Fix: "give a file name inside it, e.g. " + filepath.Join(path, "pack.pdf")}
	case m&fs.ModeSymlink != 0:
		return &TargetError{Path: path, Kind: "a symbolic link", Fix: "give the path of the file it points to, or a new name"}
	case m&fs.ModeDevice != 0:
		return &TargetError{Path: path, Kind: "a device", Fix: "give the name of a regular file (an existing one is replaced) or a new name"}
	default:
		return &TargetError{Path: path, Kind: "a pipe or socket, not a regular file", Fix: "give the name of a regular file (an existing one is replaced) or a new name"}
	}
}

// TargetError is an output path that is not a regular file or a new name.
type TargetError struct {
	Path, Kind, Fix string
}

func (e *TargetError) Error() string {
	return fmt.Sprintf("%s: cannot write there: it is %s; %s", e.Path, e.Kind, e.Fix)
}

func unwrapPath(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	return err
}
