// Package provenance records which input files a build read, with their
// sizes and checksums, as the loaders read them: no second pass over the
// data. The closing section of a pack prints them so that a reader can
// tell which data a pack was built from, and whether a rebuild used the
// same.
//
// The checksum is CRC-32C (Castagnoli), computed with the processor's
// CRC instruction where it has one: it identifies a version of the data
// and detects accidental change at several gigabytes a second, where a
// cryptographic digest would add a noticeable share of a world-scale
// build's time. It is not a defence against deliberate tampering.
package provenance

import (
	"errors"
	"fmt"
	"hash"
	"hash/crc32"
	"io"
	"io/fs"
	"slices"
	"sync"
	"sync/atomic"
)

var castagnoli = crc32.MakeTable(crc32.Castagnoli)

// File is one input read to its end.
type File struct {
	Name   string // path within the brief's folder, as the brief names it
	Size   int64
	CRC32C uint32
}

// Checksum prints the file's checksum as eight hex digits.
func (f File) Checksum() string { return fmt.Sprintf("%08x", f.CRC32C) }

// Recorder is an fs.FS that passes every Open through to the FS it wraps
// and records each file that is read sequentially to its end. It is safe
// for concurrent use; a file read twice is recorded once (the last read).
type Recorder struct {
	fsys  fs.FS
	mu    sync.Mutex
	files map[string]File
	// pending are checksums of recorded files still being computed.
	pending sync.WaitGroup
}

// New wraps fsys.
func New(fsys fs.FS) *Recorder { return &Recorder{fsys: fsys, files: map[string]File{}} }

// Open implements fs.FS.
func (r *Recorder) Open(name string) (fs.File, error) {
	f, err := r.fsys.Open(name)
	if err != nil {
		return nil, err
	}
	return &file{File: f, r: r, name: name, h: crc32.New(castagnoli)}, nil
}

// Stat implements fs.StatFS, so a size check before reading costs no open.
func (r *Recorder) Stat(name string) (fs.FileInfo, error) { return fs.Stat(r.fsys, name) }

// ReadDir implements fs.ReadDirFS, so listing a folder (for "did you
// mean" hints) works as on the FS it wraps.
func (r *Recorder) ReadDir(name string) ([]fs.DirEntry, error) { return fs.ReadDir(r.fsys, name) }

// Record records a file read whole by other means than reading it in
// order through Open (in pieces at once, for speed): data are its bytes,
// which the caller must not change. The checksum is computed on another
// goroutine, while the caller goes on to parse the bytes; Files waits
// for it.
func (r *Recorder) Record(name string, data []byte) {
	r.pending.Add(1)
	go func() {
		defer r.pending.Done()
		f := File{Name: name, Size: int64(len(data)), CRC32C: crc32.Checksum(data, castagnoli)}
		r.mu.Lock()
		r.files[name] = f
		r.mu.Unlock()
	}()
}

// Files lists the files read to their end, by name.
func (r *Recorder) Files() []File {
	r.pending.Wait()
	r.mu.Lock()
	defer r.mu.Unlock()
	out := make([]File, 0, len(r.files))
	for _, f := range r.files {
		out = append(out, f)
	}
	slices.SortFunc(out, func(a, b File) int {
		switch {
		case a.Name < b.Name:
			return -1
		case a.Name > b.Name:
			return 1
		}
		return 0
	})
	return out
}

// Version combines the checksums of files into one: CRC-32C over each
// file's name, size and checksum in name order, so it changes when any
// input does.
func Version(files []File) string {
	h := crc32.New(castagnoli)
	for _, f := range files {
		fmt.Fprintf(h, "%s\x00%d\x00%08x\n", f.Name, f.Size, f.CRC32C)
	}
	return fmt.Sprintf("%08x", h.Sum32())
}

type file struct {
	fs.File
	r    *Recorder
	name string
	h    hash.Hash32
	n    int64
	bad  atomic.Bool // read out of order (ReadAt, Seek): no checksum; ReadAt may run on several goroutines at once
	done bool
}

func (f *file) Read(p []byte) (int, error) {
	n, err := f.File.Read(p)
	if n > 0 && !f.bad.Load() {
		f.h.Write(p[:n])
		f.n += int64(n)
	}
	if err == io.EOF && !f.bad.Load() && !f.done {
		f.done = true
		f.r.mu.Lock()
		f.r.files[f.name] = File{Name: f.name, Size: f.n, CRC32C: f.h.Sum32()}
		f.r.mu.Unlock()
	}
	return n, err
}

// ReadAt and Seek pass through when the underlying file has them; a
// file read that way is not checksummed (its bytes do not pass in order).
func (f *file) ReadAt(p []byte, off int64) (int, error) {
	ra, ok := f.File.(io.ReaderAt)
	if !ok {
		return 0, fmt.Errorf("%s: ReadAt: %w", f.name, errors.ErrUnsupported)
	}
	f.bad.Store(true)
	return ra.ReadAt(p, off)
}

func (f *file) Seek(off int64, whence int) (int64, error) {
	s, ok := f.File.(io.Seeker)
	if !ok {
		return 0, fmt.Errorf("%s: Seek not supported", f.name)
	}
	if !(off == 0 && whence == io.SeekCurrent) {
		f.bad.Store(true)
	}
	return s.Seek(off, whence)
}

// ReadDir passes through for a folder opened through the recorder.
func (f *file) ReadDir(n int) ([]fs.DirEntry, error) {
	d, ok := f.File.(fs.ReadDirFile)
	if !ok {
		return nil, &fs.PathError{Op: "readdir", Path: f.name, Err: fs.ErrInvalid}
	}
	return d.ReadDir(n)
}
