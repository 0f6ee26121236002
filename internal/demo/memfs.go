package demo

import (
	"bytes"
	"io"
	"io/fs"
	"path"
	"sort"
	"strings"
	"time"
)

// memFS is a read-only, flat, in-memory fs.FS over the scenario's files.
//
// testing/fstest.MapFS would do the same job, but it is a writable map in a
// testing package; a pack build should not depend on test helpers, and a
// read-only view means no caller can alter the shared scenario bytes. The
// tests check this type against fstest.TestFS, the standard library's own
// conformance test for fs.FS implementations.
type memFS struct {
	files map[string][]byte
	names []string // sorted, for ReadDir
}

func newMemFS(files map[string][]byte) *memFS {
	m := &memFS{files: files}
	for n := range files {
		m.names = append(m.names, n)
	}
	sort.Strings(m.names)
	return m
}

// The files carry a fixed modification time so that anything hashing or
// listing them (a zip, a cache) sees the same metadata on every run.
var scenarioTime = time.Date(2026, time.January, 1, 0, 0, 0, 0, time.UTC)

// Open implements fs.FS.
func (m *memFS) Open(name string) (fs.File, error) {
	if !fs.ValidPath(name) {
		return nil, &fs.PathError{Op: "open", Path: name, Err: fs.ErrInvalid}
	}
	if name == "." {
		return &memDir{fs: m}, nil
	}
	data, ok := m.files[name]
	if !ok {
		return nil, &fs.PathError{Op: "open", Path: name, Err: fs.ErrNotExist}
	}
	return &memFile{name: name, r: bytes.NewReader(data), size: int64(len(data))}, nil
}

// ReadFile implements fs.ReadFileFS; it returns a copy so the shared bytes
// stay unchanged.
func (m *memFS) ReadFile(name string) ([]byte, error) {
	if !fs.ValidPath(name) {
		return nil, &fs.PathError{Op: "read", Path: name, Err: fs.ErrInvalid}
	}
	data, ok := m.files[name]
	if !ok {
		return nil, &fs.PathError{Op: "read", Path: name, Err: fs.ErrNotExist}
	}
	return bytes.Clone(data), nil
}

type memInfo struct {
	name string
	size int64
	dir  bool
}

func (i memInfo) Name() string { return i.name }
func (i memInfo) Size() int64  { return i.size }
func (i memInfo) Mode() fs.FileMode {
	if i.dir {
		return fs.ModeDir | 0o555
	}
	return 0o444
}
func (i memInfo) ModTime() time.Time { return scenarioTime }
func (i memInfo) IsDir() bool        { return i.dir }
func (i memInfo) Sys() any           { return nil }

type memFile struct {
	name string
	r    *bytes.Reader
	size int64
}

func (f *memFile) Stat() (fs.FileInfo, error) {
	return memInfo{name: path.Base(f.name), size: f.size}, nil
}
func (f *memFile) Read(p []byte) (int, error) { return f.r.Read(p) }
func (f *memFile) Seek(off int64, whence int) (int64, error) {
	return f.r.Seek(off, whence)
}
func (f *memFile) ReadAt(p []byte, off int64) (int, error) { return f.r.ReadAt(p, off) }
func (f *memFile) Close() error                            { return nil }

type memDir struct {
	fs  *memFS
	pos int
}

func (d *memDir) Stat() (fs.FileInfo, error) { return memInfo{name: ".", dir: true}, nil }
func (d *memDir) Read([]byte) (int, error) {
	return 0, &fs.PathError{Op: "read", Path: ".", Err: fs.ErrInvalid}
}
func (d *memDir) Close() error { return nil }

// ReadDir implements fs.ReadDirFile with the usual n semantics.
func (d *memDir) ReadDir(n int) ([]fs.DirEntry, error) {
	rest := d.fs.names[d.pos:]
	if n > 0 && len(rest) == 0 {
		return nil, io.EOF
	}
	if n > 0 && len(rest) > n {
		rest = rest[:n]
	}
	out := make([]fs.DirEntry, len(rest))
	for i, name := range rest {
		out[i] = fs.FileInfoToDirEntry(memInfo{name: name, size: int64(len(d.fs.files[name]))})
	}
	d.pos += len(rest)
	return out, nil
}

// flatName reports whether a scenario file name is a plain name with no
// folder, which memFS relies on.
func flatName(name string) bool {
	return fs.ValidPath(name) && name != "." && !strings.Contains(name, "/")
}
