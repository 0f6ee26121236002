package tabular

import (
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/limits"
)

// withStream streams every file, in chunks of the given size, for the
// length of a test.
func withStream(t testing.TB, chunk int) {
	old, oldChunk := StreamBytes, StreamChunkBytes
	StreamBytes, StreamChunkBytes = 1, chunk
	t.Cleanup(func() { StreamBytes, StreamChunkBytes = old, oldChunk })
}

// readRows lists what a RowReader yields: every row's cells with
// positions, and every problem.
func readRows(r RowReader) []string {
	var out []string
	for {
		row, err := r.Next()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			out = append(out, "error: "+err.Error())
			continue
		}
		out = append(out, fmt.Sprintf("%+v", row))
	}
	return out
}

// readStreamParts reads a stream's parts in order as the values loader
// does: each part's rows (NextSimple where it reads one, as the loader),
// the rest part after counting the rows before it; stopping after a
// part that failed.
func readStreamParts(s *Stream) []string {
	var out []string
	var rows int64
	defer s.Close()
	for {
		p, rest, err := s.Part()
		if errors.Is(err, io.EOF) {
			return out
		}
		if err != nil {
			return append(out, "error: "+err.Error())
		}
		if rest {
			p.SetRowsBefore(rows)
		}
		got, _ := readCountSimple(p)
		out = append(out, got...)
		if rest {
			rows = p.RowsRead()
		} else {
			rows += p.RowsRead()
		}
		s.Release(p)
		if p.Failed() {
			return out
		}
	}
}

// randomCSV writes a values file of random rows: ASCII or not, LF, CRLF
// or CR line ends, empty and ragged lines, lines over the limits, and
// (in some trials) quoted fields.
func randomCSV(rng *rand.Rand, trial int) []byte {
	words := []string{"KE001", "2024", "fnci", "1.25", "", "Vårdø", "ł€😀", "x y"}
	ends := []string{"\n", "\r\n", "\r"}
	var sb strings.Builder
	if trial%11 == 3 {
		sb.WriteString("\xef\xbb\xbf") // a byte-order mark
	}
	sb.WriteString("institution,year,indicator,value")
	end := ends[trial%3]
	sb.WriteString(end)
	for range rng.IntN(300) {
		switch rng.IntN(40) {
		case 0:
			sb.WriteString(end) // an empty line
		case 1:
			sb.WriteString("a,b,c" + end) // ragged
		case 2:
			if trial%5 == 0 {
				sb.WriteString("a,b,c,d,e,f" + end) // too many columns: stops the file
			}
		case 3:
			if trial%7 == 0 {
				sb.WriteString("a,b,c,a-field-longer-than-the-limit" + end) // stops the file
			}
		case 4:
			if trial%6 == 0 {
				sb.WriteString("\"q\nx\",2024,k,1" + end) // a quoted line break
			}
		}
		for f := 0; f < 4; f++ {
			if f > 0 {
				sb.WriteByte(',')
			}
			w := words[rng.IntN(len(words))]
			if trial%4 != 1 && !isASCII(w) {
				w = "KE002"
			}
			sb.WriteString(w)
		}
		if rng.IntN(8) > 0 {
			sb.WriteString(end)
		}
	}
	return []byte(sb.String())
}

// TestStreamReadsAsTheWhole: a file read as a stream, row by row or part
// by part, in chunks of any size, gives exactly what the whole reader
// gives (cells, positions, problems), whatever the line ends, empty
// lines, quotes, multi-byte characters, ragged rows and limits. The whole
// reader is the reference (tested on RFC 4180's examples in csv_test.go).
func TestStreamReadsAsTheWhole(t *testing.T) {
	rng := rand.New(rand.NewPCG(4180, 3))
	dir := t.TempDir()
	name := "v.csv"
	streamed := 0
	for trial := 0; trial < 400; trial++ {
		data := randomCSV(rng, trial)
		if err := os.WriteFile(filepath.Join(dir, name), data, 0o644); err != nil {
			t.Fatal(err)
		}
		lim := limits.Default()
		lim.Columns = 5
		if trial%2 == 0 {
			lim.CellBytes = 12
		}
		if trial%9 == 4 {
			lim.Rows = int64(rng.IntN(40) + 1)
		}
		whole, err := NewCSVWith(name, data, lim)
		if err != nil {
			continue
		}
		want := strings.Join(readRows(whole), "\n")
		for _, chunk := range []int{8, 33, 100, 4096} {
			withStream(t, chunk)
			r, err := OpenStream(os.DirFS(dir), name, lim)
			if err != nil {
				t.Fatalf("trial %d: %v", trial, err)
			}
			if _, ok := r.(*Stream); ok {
				streamed++
			}
			if got := strings.Join(readRows(r), "\n"); got != want {
				t.Fatalf("trial %d, chunks of %d, row by row:\n got %q\nwant %q\nfile %q", trial, chunk, got, want, data)
			}
			if c, ok := r.(io.Closer); ok {
				c.Close()
			}
			r, _ = OpenStream(os.DirFS(dir), name, lim)
			s, ok := r.(*Stream)
			if !ok {
				continue
			}
			if got := strings.Join(readStreamParts(s), "\n"); got != want {
				t.Fatalf("trial %d, chunks of %d, by parts:\n got %q\nwant %q\nfile %q", trial, chunk, got, want, data)
			}
		}
	}
	if streamed < 400 {
		t.Errorf("only %d readings streamed", streamed)
	}
}

// TestStreamStopsEarly: closing a stream before its end stops its reading
// (Close returns: no goroutine is left blocked on a full queue).
func TestStreamStopsEarly(t *testing.T) {
	withStream(t, 16)
	dir := t.TempDir()
	data := strings.Repeat("a,b\n1,2\n", 1000)
	if err := os.WriteFile(filepath.Join(dir, "f.csv"), []byte("x,y\n"+data), 0o644); err != nil {
		t.Fatal(err)
	}
	r, err := OpenStream(os.DirFS(dir), "f.csv", limits.Default())
	if err != nil {
		t.Fatal(err)
	}
	if _, err := r.Next(); err != nil {
		t.Fatal(err)
	}
	r.(*Stream).Close()
}

// TestStreamEncodingProblem: a byte that is not UTF-8 in a later chunk
// is the whole reader's problem, at the same line and column, after the
// rows before it.
func TestStreamEncodingProblem(t *testing.T) {
	withStream(t, 64)
	dir := t.TempDir()
	var sb strings.Builder
	sb.WriteString("institution,year,indicator,value\n")
	for i := range 50 {
		fmt.Fprintf(&sb, "I%03d,2024,k,%d\n", i, i)
	}
	sb.WriteString("I050,2024,k,caf\xe9\n")
	data := []byte(sb.String())
	if err := os.WriteFile(filepath.Join(dir, "v.csv"), data, 0o644); err != nil {
		t.Fatal(err)
	}
	_, want := NewCSV("v.csv", data)
	r, err := OpenStream(os.DirFS(dir), "v.csv", limits.Default())
	if err != nil {
		t.Fatal(err)
	}
	got := readRows(r)
	if len(got) != 51 || got[50] != "error: "+want.Error() {
		t.Fatalf("%d rows, last %q; want 50 rows and %q", len(got), got[len(got)-1], want)
	}
}

// FuzzStream: whatever the bytes and the chunk size, a stream read row by
// row gives what the whole reader gives, under tight limits.
func FuzzStream(f *testing.F) {
	for _, s := range []string{
		"a,b\n1,2\n3,4\n",
		"a,b\r\n1,2\r\n\r\n3,4",
		"a,b\r1,2\r3,4\r",
		"a,b\n1,2\n3\n4,5,6\n,\n",
		"a,b\nVårdø,2\n😀,ł\n1,2\r",
		"a,b\n1,\"2\n3\",4\n5,6\n",
	} {
		f.Add([]byte(s), uint8(3))
	}
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, data []byte, n uint8) {
		lim := limits.Default()
		lim.Columns = 4
		lim.Rows = 50
		if n%2 == 0 {
			lim.CellBytes = 6
		}
		whole, err := NewCSVWith("f.csv", data, lim)
		if err != nil {
			return
		}
		want := strings.Join(readRows(whole), "\n")
		withStream(t, int(n%32)+1)
		if err := os.WriteFile(filepath.Join(dir, "f.csv"), data, 0o644); err != nil {
			t.Fatal(err)
		}
		r, err := OpenStream(os.DirFS(dir), "f.csv", lim)
		if err != nil {
			t.Fatalf("%q: %v", data, err)
		}
		if got := strings.Join(readRows(r), "\n"); got != want {
			t.Fatalf("%q in chunks of %d:\n got %q\nwant %q", data, n%32+1, got, want)
		}
	})
}
