package tabular

import (
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"strings"
	"testing"

	"peerpack/internal/limits"
)

// readAll lists what a sequence of readers yields, read in order and
// stopping after one that failed: every row's cells with positions, and
// every problem.
func readAll(rs ...*CSVReader) []string {
	var out []string
	for _, r := range rs {
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
		if r.Failed() {
			break
		}
	}
	return out
}

// readAllSimple is readAll taking each row through NextSimple where it
// reads one, as the values loader does, and through Next otherwise.
func readAllSimple(rs ...*CSVReader) []string {
	out, _ := readCountSimple(rs...)
	return out
}

// readCountSimple is readAllSimple that also counts the rows NextSimple
// read.
func readCountSimple(rs ...*CSVReader) (out []string, simple int) {
	for _, r := range rs {
		n := len(r.Header())
		fields, cols := make([]string, n), make([]int, n)
		for {
			if line, ok := r.NextSimple(fields, cols); ok {
				row := make([]Cell, n)
				for i := range row {
					row[i] = Cell{Text: fields[i], Line: line, Col: cols[i]}
				}
				out = append(out, fmt.Sprintf("%+v", row))
				simple++
				continue
			}
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
		if r.Failed() {
			break
		}
	}
	return out, simple
}

// Reading the parts of a split in order gives exactly what the whole
// reader gives (the reference: the whole reader, tested on RFC 4180's own
// examples in csv_test.go), whatever the line ends, empty lines, multi-byte
// characters, ragged rows and limits; and Split declines when a cut could
// change the reading.
func TestSplitReadsAsTheWhole(t *testing.T) {
	rng := rand.New(rand.NewPCG(4180, 2))
	words := []string{"KE001", "2024", "fnci", "1.25", "", "Vårdø", "ł€😀", "x y"}
	ends := []string{"\n", "\r\n", "\r"}
	simple := 0
	for trial := 0; trial < 300; trial++ {
		lim := limits.Default()
		lim.Columns = 5
		if trial%2 == 0 {
			lim.CellBytes = 12
		}
		var sb strings.Builder
		sb.WriteString("institution,year,indicator,value")
		end := ends[trial%3]
		sb.WriteString(end)
		for range rng.IntN(60) {
			switch rng.IntN(20) {
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
			}
			for f := 0; f < 4; f++ {
				if f > 0 {
					sb.WriteByte(',')
				}
				w := words[rng.IntN(len(words))]
				if trial%4 != 1 && !isASCII(w) {
					w = "KE002" // ASCII data, where NextSimple reads
				}
				sb.WriteString(w)
			}
			if rng.IntN(8) > 0 {
				sb.WriteString(end)
			}
		}
		data := []byte(sb.String())
		whole, err := NewCSVWith("v.csv", data, lim)
		if err != nil {
			t.Fatal(err)
		}
		want := readAll(whole)
		for n := 2; n <= 7; n++ {
			r, _ := NewCSVWith("v.csv", data, lim)
			parts := r.Split(n)
			if parts == nil && len(want) == 0 {
				continue // nothing left to read
			}
			if parts == nil {
				t.Fatalf("trial %d: Split(%d) declined a file without quotes", trial, n)
			}
			got := readAll(parts...)
			if strings.Join(got, "\n") != strings.Join(want, "\n") {
				t.Fatalf("trial %d, %d parts of %q:\n got %q\nwant %q", trial, n, data, got, want)
			}
			r, _ = NewCSVWith("v.csv", data, lim)
			got, k := readCountSimple(r.Split(n)...)
			simple += k
			if strings.Join(got, "\n") != strings.Join(want, "\n") {
				t.Fatalf("trial %d, %d parts of %q read by NextSimple:\n got %q\nwant %q", trial, n, data, got, want)
			}
		}
	}
	if simple < 1000 {
		t.Errorf("NextSimple read only %d rows of the trials", simple)
	}
	quoted, _ := NewCSV("q.csv", []byte("a,b\n\"x\ny\",1\n"))
	if quoted.Split(2) != nil {
		t.Error("Split cut a file with quoted fields")
	}
	lim := limits.Default()
	lim.Rows = 3
	many, _ := NewCSVWith("m.csv", []byte("a,b\n1,2\n3,4\n5,6\n7,8\n"), lim)
	if many.Split(2) != nil {
		t.Error("Split cut a file that may reach the rows limit")
	}
}

// FuzzSplit: whatever the bytes, the parts of a split read in order give
// what the whole reader gives (cells, positions, problems), under tight
// limits so that the limit problems are reached too.
func FuzzSplit(f *testing.F) {
	for _, s := range []string{
		"a,b\n1,2\n3,4\n",
		"a,b\r\n1,2\r\n\r\n3,4",
		"a,b\r1,2\r3,4\r",
		"a,b\n1,2\n3\n4,5,6\n,\n",
		"a,b\nVårdø,2\n😀,ł\n1,2\r",
		"a,b\n1,2\r\r\n3,4\n",
	} {
		f.Add([]byte(s), uint8(3))
	}
	f.Fuzz(func(t *testing.T, data []byte, n uint8) {
		lim := limits.Default()
		lim.Columns = 4
		if n%2 == 0 {
			lim.CellBytes = 6
		}
		whole, err := NewCSVWith("f.csv", data, lim)
		if err != nil {
			return
		}
		want := readAll(whole)
		r, _ := NewCSVWith("f.csv", data, lim)
		parts := r.Split(int(n%8) + 2)
		if parts == nil {
			return
		}
		got := readAll(parts...)
		if strings.Join(got, "\n") != strings.Join(want, "\n") {
			t.Fatalf("%q in parts:\n got %q\nwant %q", data, got, want)
		}
		r, _ = NewCSVWith("f.csv", data, lim)
		got = readAllSimple(r.Split(int(n%8) + 2)...)
		if strings.Join(got, "\n") != strings.Join(want, "\n") {
			t.Fatalf("%q in parts read by NextSimple:\n got %q\nwant %q", data, got, want)
		}
	})
}
