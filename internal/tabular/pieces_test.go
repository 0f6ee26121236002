package tabular

import (
	"bytes"
	"hash/crc32"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"runtime"
	"testing"
	"time"

	"peerpack/internal/limits"
	"peerpack/internal/provenance"
)

// withPieces makes every file of at least 1 byte read in pieces, on
// four processors, for the length of a test.
func withPieces(t *testing.T) {
	t.Helper()
	old, procs := parallelReadBytes, runtime.GOMAXPROCS(4)
	parallelReadBytes = 1
	t.Cleanup(func() { parallelReadBytes = old; runtime.GOMAXPROCS(procs) })
}

// TestReadPiecesSameBytesAndChecksum: a file read in pieces gives the
// bytes os.ReadFile gives, and the provenance recorder records the
// checksum a read from start to end records (CRC-32C as hash/crc32
// computes it).
func TestReadPiecesSameBytesAndChecksum(t *testing.T) {
	withPieces(t)
	dir := t.TempDir()
	rng := rand.New(rand.NewPCG(10, 2026))
	for _, size := range []int{1, 2, 3, 7, 4096, 1<<20 + 13} {
		want := make([]byte, size)
		for i := range want {
			want[i] = byte('a' + rng.IntN(26))
		}
		name := "f.csv"
		if err := os.WriteFile(filepath.Join(dir, name), want, 0o644); err != nil {
			t.Fatal(err)
		}
		rec := provenance.New(os.DirFS(dir))
		got, err := readFile(rec, name, limits.Default())
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(got, want) {
			t.Fatalf("size %d: the pieces differ from the file", size)
		}
		files := rec.Files()
		if len(files) != 1 || files[0].Size != int64(size) || files[0].CRC32C != crc32.Checksum(want, crc32.MakeTable(crc32.Castagnoli)) {
			t.Fatalf("size %d: recorded %+v", size, files)
		}
	}
}

// grownFS serves one file whose Stat gives a smaller size than it holds,
// as a file still being written does.
type grownFS struct {
	data  []byte
	stat  int64
	noAt  bool
	saved []byte
}

func (g *grownFS) Open(string) (fs.File, error) {
	f := &grownFile{g: g, r: bytes.NewReader(g.data)}
	if g.noAt {
		return seqOnly{f}, nil
	}
	return f, nil
}

func (g *grownFS) Record(_ string, data []byte) { g.saved = data }

type grownFile struct {
	g *grownFS
	r *bytes.Reader
}

func (f *grownFile) Stat() (fs.FileInfo, error)              { return grownInfo{f.g.stat}, nil }
func (f *grownFile) Read(p []byte) (int, error)              { return f.r.Read(p) }
func (f *grownFile) ReadAt(p []byte, off int64) (int, error) { return f.r.ReadAt(p, off) }
func (f *grownFile) Close() error                            { return nil }

// seqOnly hides ReadAt.
type seqOnly struct{ f *grownFile }

func (s seqOnly) Stat() (fs.FileInfo, error) { return s.f.Stat() }
func (s seqOnly) Read(p []byte) (int, error) { return s.f.Read(p) }
func (s seqOnly) Close() error               { return nil }

type grownInfo struct{ size int64 }

func (i grownInfo) Name() string       { return "f.csv" }
func (i grownInfo) Size() int64        { return i.size }
func (i grownInfo) Mode() fs.FileMode  { return 0o644 }
func (i grownInfo) ModTime() time.Time { return time.Time{} }
func (i grownInfo) IsDir() bool        { return false }
func (i grownInfo) Sys() any           { return nil }

// TestReadPiecesGrownFile: bytes written after the size was taken are
// read too, and a file past the size limit is refused as before.
func TestReadPiecesGrownFile(t *testing.T) {
	withPieces(t)
	data := bytes.Repeat([]byte("0123456789\n"), 20000)
	g := &grownFS{data: data, stat: 1000}
	got, err := readFile(g, "f.csv", limits.Default())
	if err != nil || !bytes.Equal(got, data) || !bytes.Equal(g.saved, data) {
		t.Fatalf("grown file: %d bytes, %v; recorded %d", len(got), err, len(g.saved))
	}
	lim := limits.Default()
	lim.FileBytes = 5000
	if _, err := readFile(g, "f.csv", lim); err == nil {
		t.Fatal("a file grown past the limit was read")
	}
	// A file that cannot be read at an offset is read in order.
	g2 := &grownFS{data: data, stat: int64(len(data)), noAt: true}
	got, err = readFile(g2, "f.csv", limits.Default())
	if err != nil || !bytes.Equal(got, data) || g2.saved != nil {
		t.Fatalf("sequential file: %d bytes, %v, recorded %d", len(got), err, len(g2.saved))
	}
}

var _ io.ReaderAt = (*grownFile)(nil)
