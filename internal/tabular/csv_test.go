package tabular

import (
	"encoding/json"
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

func texts(t *Table) [][]string {
	out := [][]string{cellTexts(t.Header)}
	for _, r := range t.Rows {
		out = append(out, cellTexts(r))
	}
	return out
}

func cellTexts(cs []Cell) []string {
	s := make([]string, len(cs))
	for i, c := range cs {
		s[i] = c.Text
	}
	return s
}

func readCSV(t *testing.T, src string) (*Table, error) {
	t.Helper()
	r, err := NewCSV("t.csv", []byte(src))
	if err != nil {
		return nil, err
	}
	return Collect(r)
}

// TestRFC4180Reference reads RFC 4180's section 2 examples and further edge
// cases and compares every field with the rows Python's csv module reads
// from the same bytes (testdata/data/rfc4180/generate.py, Python 3.11.2
// csv.reader(strict=True)).
func TestRFC4180Reference(t *testing.T) {
	dir := filepath.Join("..", "..", "testdata", "data", "rfc4180")
	raw, err := os.ReadFile(filepath.Join(dir, "expected.json"))
	if err != nil {
		t.Fatal(err)
	}
	var ref struct {
		Cases map[string][][]string `json:"cases"`
	}
	if err := json.Unmarshal(raw, &ref); err != nil {
		t.Fatal(err)
	}
	if len(ref.Cases) < 10 {
		t.Fatalf("only %d reference cases", len(ref.Cases))
	}
	for name, want := range ref.Cases {
		t.Run(name, func(t *testing.T) {
			data, err := os.ReadFile(filepath.Join(dir, name+".csv"))
			if err != nil {
				t.Fatal(err)
			}
			tb, err := readCSV(t, string(data))
			if err != nil {
				t.Fatal(err)
			}
			got := texts(tb)
			if len(got) != len(want) {
				t.Fatalf("got %d rows %q, want %d %q", len(got), got, len(want), want)
			}
			for i := range want {
				if strings.Join(got[i], "\x00") != strings.Join(want[i], "\x00") {
					t.Errorf("row %d: got %q, want %q", i+1, got[i], want[i])
				}
			}
		})
	}
}

// TestCSVPositions checks that every cell knows its line and character
// column, also after a quoted field spanning lines and after multi-byte
// characters (positions counted by hand from the literal).
func TestCSVPositions(t *testing.T) {
	src := "id,name,x\nA,\"two\nlines\",1\nÆø,b,\"q\"\"q\"\n"
	tb, err := readCSV(t, src)
	if err != nil {
		t.Fatal(err)
	}
	type pos struct{ line, col int }
	want := [][]pos{{{2, 1}, {2, 3}, {3, 8}}, {{4, 1}, {4, 4}, {4, 6}}}
	for i, row := range tb.Rows {
		for j, c := range row {
			if c.Line != want[i][j].line || c.Col != want[i][j].col {
				t.Errorf("row %d cell %d %q at %d:%d, want %d:%d", i+1, j+1, c.Text, c.Line, c.Col, want[i][j].line, want[i][j].col)
			}
		}
	}
	if tb.Rows[1][2].Text != "q\"q" {
		t.Errorf("doubled quote read as %q", tb.Rows[1][2].Text)
	}
}

func TestCSVProblems(t *testing.T) {
	for _, tc := range []struct {
		name, src, want string
	}{
		// Expected texts: our own messages; positions counted by hand.
		{"bom stripped", "\ufeffa,b\n1,2\n", ""},
		{"semicolons", "a;b;c\n1;2;3\n", "t.csv:1:1: the header has no commas but 2 semicolons"},
		{"tabs", "a\tb\n1\t2\n", "t.csv:1:1: the header has no commas but 1 tabs"},
		{"ragged short", "a,b,c\n1,2\n", "t.csv:2:1: this row has 2 fields but the header has 3"},
		{"ragged long", "a,b\n1,2,3\n", "t.csv:2:1: this row has 3 fields but the header has 2; a value containing a comma must be enclosed in double quotes"},
		{"bare quote", "a,b\n1,x\"y\n", "t.csv:2:4: a double quote inside an unquoted field"},
		{"unclosed", "a,b\n1,\"xy\n", "t.csv:2:3: the quoted field opened here is never closed"},
		{"after quote", "a,b\n\"x\"y,2\n", "t.csv:2:4: unexpected text after the closing quote"},
		{"latin-1", "a,b\nx,caf\xe9\n", "t.csv:2:6: byte 0xE9 is not valid UTF-8 (in Latin-1 it would be \"é\")"},
		{"utf-16", "\xff\xfea\x00", "t.csv:1:1: the file is UTF-16 encoded"},
		{"empty", "", "t.csv:1:1: the file is empty"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := readCSV(t, tc.src)
			if tc.want == "" {
				if err != nil {
					t.Fatalf("unexpected %v", err)
				}
				return
			}
			if err == nil || !strings.HasPrefix(err.Error(), tc.want) {
				t.Fatalf("got %v\nwant prefix %s", err, tc.want)
			}
		})
	}
}

// TestCSVRaggedContinues checks that a ragged row is skipped and reading
// goes on, so that every bad row is reported.
func TestCSVRaggedContinues(t *testing.T) {
	r, err := NewCSV("t.csv", []byte("a,b\n1\n2,3\n4\n5,6\n"))
	if err != nil {
		t.Fatal(err)
	}
	var rows, bad int
	for {
		_, err := r.Next()
		if errors.Is(err, io.EOF) {
			break
		}
		var p *diag.Problem
		if errors.As(err, &p) {
			bad++
			continue
		}
		rows++
	}
	if rows != 2 || bad != 2 {
		t.Errorf("rows %d bad %d, want 2 and 2", rows, bad)
	}
}

func FuzzCSV(f *testing.F) {
	matches, _ := filepath.Glob(filepath.Join("..", "..", "testdata", "data", "rfc4180", "*.csv"))
	more, _ := filepath.Glob(filepath.Join("..", "..", "testdata", "bad", "data", "*", "*.csv"))
	for _, m := range append(matches, more...) {
		if b, err := os.ReadFile(m); err == nil {
			f.Add(b)
		}
	}
	f.Add([]byte("a,\"b\r\n\"\"c\",d\r"))
	f.Fuzz(func(t *testing.T, data []byte) {
		r, err := NewCSV("f.csv", data)
		if err != nil {
			if err.Error() == "" {
				t.Fatal("empty message")
			}
			return
		}
		width := len(r.Header())
		for i := 0; i < 1e6; i++ {
			row, err := r.Next()
			if errors.Is(err, io.EOF) {
				return
			}
			if err != nil {
				var p *diag.Problem
				if !errors.As(err, &p) || p.Line < 1 {
					t.Fatalf("problem without a position: %v", err)
				}
				continue
			}
			if len(row) != width {
				t.Fatalf("row of %d cells, header %d", len(row), width)
			}
			for _, c := range row {
				if c.Line < 1 || c.Col < 1 {
					t.Fatalf("cell %q at %d:%d", c.Text, c.Line, c.Col)
				}
			}
		}
		t.Fatal("reader did not end")
	})
}

// FuzzCSVLimits reads arbitrary input under tiny limits: the reader must
// stop at them (never return more rows, wider rows or longer cells) and
// every problem must carry a position.
func FuzzCSVLimits(f *testing.F) {
	f.Add([]byte("a,b\n1,2\n3,4\n5,6\n7,8\n"), uint8(2), uint8(3), uint8(4))
	f.Add([]byte("a,b,c,d,e\n\"0123456789\",2\n"), uint8(1), uint8(1), uint8(1))
	f.Fuzz(func(t *testing.T, data []byte, rows, cols, cell uint8) {
		lim := limits.Limits{Rows: int64(rows) + 1, Columns: int64(cols) + 1, CellBytes: int64(cell) + 1}.Or()
		r, err := NewCSVWith("f.csv", data, lim)
		if err != nil {
			var p *diag.Problem
			if !errors.As(err, &p) || p.Msg == "" {
				t.Fatalf("problem without a message: %v", err)
			}
			return
		}
		if int64(len(r.Header())) > lim.Columns {
			t.Fatalf("header of %d columns under a limit of %d", len(r.Header()), lim.Columns)
		}
		got := int64(0)
		for i := 0; i < 1e6; i++ {
			row, err := r.Next()
			if errors.Is(err, io.EOF) {
				if got > lim.Rows {
					t.Fatalf("%d rows under a limit of %d", got, lim.Rows)
				}
				return
			}
			if err != nil {
				var p *diag.Problem
				if !errors.As(err, &p) || p.Line < 1 {
					t.Fatalf("problem without a position: %v", err)
				}
				if strings.HasPrefix(p.Msg, "this row has") {
					got++ // a ragged row counts as a row read
				}
				continue
			}
			got++
			for _, c := range row {
				if int64(len(c.Text)) > lim.CellBytes {
					t.Fatalf("cell of %d bytes under a limit of %d", len(c.Text), lim.CellBytes)
				}
			}
		}
		t.Fatal("reader did not end")
	})
}
