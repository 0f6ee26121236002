package provenance

import (
	"hash/crc32"
	"io"
	"io/fs"
	"testing"
	"testing/fstest"
)

// CRC-32C of "123456789" is e3069283 (the check value of the CRC-32C
// parameter set in RFC 3720, appendix B.4, and in the catalogue of
// parametrised CRC algorithms; from memory).
func TestChecksumCheckValue(t *testing.T) {
	r := New(fstest.MapFS{"a.csv": {Data: []byte("123456789")}})
	if _, err := fs.ReadFile(r, "a.csv"); err != nil {
		t.Fatal(err)
	}
	got := r.Files()
	if len(got) != 1 || got[0].Checksum() != "e3069283" || got[0].Size != 9 {
		t.Fatalf("files %+v, want a.csv of 9 bytes with e3069283", got)
	}
}

// Only a file read to its end is recorded, and the combined version
// changes when any file does.
func TestOnlyWholeReadsAndVersion(t *testing.T) {
	fsys := fstest.MapFS{"a.csv": {Data: []byte("x,y\n1,2\n")}, "b.csv": {Data: []byte("long enough to stop early")}}
	r := New(fsys)
	if _, err := fs.ReadFile(r, "a.csv"); err != nil {
		t.Fatal(err)
	}
	f, _ := r.Open("b.csv")
	buf := make([]byte, 4)
	_, _ = io.ReadFull(f, buf)
	f.Close()
	files := r.Files()
	if len(files) != 1 || files[0].Name != "a.csv" {
		t.Fatalf("recorded %+v, want a.csv alone", files)
	}
	want := crc32.Checksum([]byte("x,y\n1,2\n"), crc32.MakeTable(crc32.Castagnoli))
	if files[0].CRC32C != want {
		t.Errorf("checksum %08x, want %08x", files[0].CRC32C, want)
	}
	v1 := Version(files)
	files[0].CRC32C++
	if Version(files) == v1 {
		t.Error("version did not change with a file's checksum")
	}
}
