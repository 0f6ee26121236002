package tabular

import (
	"errors"
	"fmt"
	"io"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/limits"
)

// collectAll reads every row of r and returns the first error met.
func collectAll(r RowReader) (rows int, first error) {
	for {
		_, err := r.Next()
		if errors.Is(err, io.EOF) {
			return rows, first
		}
		if err != nil {
			if first == nil {
				first = err
			}
			continue
		}
		rows++
	}
}

func mustLimits(t *testing.T, spec string) limits.Limits {
	t.Helper()
	l, err := limits.Parse(spec)
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// TestCSVLimits: each limit stops the file at the row, field or line that
// goes over it, with a message naming the limit and the override.
func TestCSVLimits(t *testing.T) {
	cases := []struct {
		name, spec, src, want string
		rows                  int
	}{
		{"rows", "rows=3", "a,b\n1,2\n3,4\n5,6\n7,8\n9,10\n", "t.csv:5:1: the file has more than the limit of 3 rows; split it into several files (the brief's values: takes a list), or raise the limit with --limit rows=6", 3},
		{"rows at the limit", "rows=3", "a,b\n1,2\n3,4\n5,6\n", "", 3},
		{"cell", "cell=8", "a,b\n1,\"0123456789\"\n", "t.csv:2:3: the field starting here is 10 bytes, over the limit of 8 bytes; if it should not be this long, look for a stray double quote that joins many lines into one field, or raise the limit with --limit cell=10", 0},
		{"cell at the limit", "cell=8", "a,b\n1,01234567\n", "", 1},
		{"columns in a row", "columns=3", "a,b,c\n1,2,3,4,5,6\n", "t.csv:2:7: line 2 has more than the limit of 3 columns; check the separators of this line, or raise the limit with --limit columns=6", 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r, err := NewCSVWith("t.csv", []byte(c.src), mustLimits(t, c.spec))
			if err != nil {
				t.Fatal(err)
			}
			rows, err := collectAll(r)
			got := ""
			if err != nil {
				got = err.Error()
			}
			if got != c.want || rows != c.rows {
				t.Errorf("\n got %d rows, %s\nwant %d rows, %s", rows, got, c.rows, c.want)
			}
		})
	}
	// A header wider than the limit stops the file at once.
	_, err := NewCSVWith("t.csv", []byte("a,b,c,d\n1,2,3,4\n"), mustLimits(t, "columns=3"))
	want := "t.csv:1:7: line 1 has more than the limit of 3 columns; check the separators of this line, or raise the limit with --limit columns=6"
	if err == nil || err.Error() != want {
		t.Errorf("wide header:\n got %v\nwant %s", err, want)
	}
}

func TestFileLimit(t *testing.T) {
	fsys := fstest.MapFS{"v.csv": {Data: []byte(strings.Repeat("a,b\n", 600))}}
	_, err := OpenWith(fsys, "v.csv", mustLimits(t, "file=2K"))
	want := "v.csv: the file is 2,400 bytes (2.3 KiB), over the limit of 2 KiB; raise it with --limit file=3K"
	if err == nil || err.Error() != want {
		t.Errorf("\n got %v\nwant %s", err, want)
	}
	if _, err := OpenWith(fsys, "v.csv", mustLimits(t, "file=3K")); err != nil {
		t.Errorf("the suggested limit does not admit the file: %v", err)
	}
}

func TestXLSXLimits(t *testing.T) {
	var rows strings.Builder
	rows.WriteString(`<row r="1"><c r="A1" t="inlineStr"><is><t>a</t></is></c><c r="B1" t="inlineStr"><is><t>b</t></is></c></row>`)
	for i := 2; i <= 6; i++ {
		fmt.Fprintf(&rows, `<row r="%d"><c r="A%d"><v>%d</v></c><c r="B%d"><v>1</v></c></row>`, i, i, i, i)
	}
	data := book(t, rows.String(), "")
	cases := []struct{ spec, want string }{
		{"rows=3", "b.xlsx:5:1: the sheet has more than the limit of 3 rows; split it into several files, or raise the limit with --limit rows=6"},
		{"sheet-cells=7", "b.xlsx:5:1: the sheet has more than the limit of 7 cells; export it as CSV UTF-8, which is read row by row, or raise the limit with --limit sheet-cells=14"},
		{"columns=1", "b.xlsx:1:2: row 1 has 2 columns, over the limit of 1; delete the cells beyond the last column, or raise the limit with --limit columns=2"},
		{"rows=5,sheet-cells=10", ""},
	}
	for _, c := range cases {
		_, err := ParseXLSXWith("b.xlsx", data, "", mustLimits(t, c.spec))
		got := ""
		if err != nil {
			got = err.Error()
		}
		if got != c.want {
			t.Errorf("%s:\n got %s\nwant %s", c.spec, got, c.want)
		}
	}
	long := book(t, `<row r="1"><c r="A1" t="inlineStr"><is><t>a</t></is></c></row><row r="2"><c r="A2" t="inlineStr"><is><t>`+strings.Repeat("x", 20)+`</t></is></c></row>`, "")
	_, err := ParseXLSXWith("b.xlsx", long, "", mustLimits(t, "cell=16"))
	want := "b.xlsx:2:1: cell A2 is 20 bytes, over the limit of 16 bytes; raise it with --limit cell=20"
	if err == nil || err.Error() != want {
		t.Errorf("cell:\n got %v\nwant %s", err, want)
	}
}

// TestXLSXPaddingBomb: a header reaching column XFD and a million one-cell
// rows compress to almost nothing but would be padded to 16 billion cells;
// the sheet-cells limit stops it after a few.
func TestXLSXPaddingBomb(t *testing.T) {
	var rows strings.Builder
	rows.WriteString(`<row r="1"><c r="A1" t="inlineStr"><is><t>a</t></is></c><c r="XFD1"><v>1</v></c></row>`)
	for i := 2; i <= 20000; i++ {
		fmt.Fprintf(&rows, `<row r="%d"><c r="A%d"><v>1</v></c></row>`, i, i)
	}
	_, err := ParseXLSXWith("bomb.xlsx", book(t, rows.String(), ""), "", mustLimits(t, "columns=16384"))
	if err == nil || !strings.Contains(err.Error(), "the sheet has more than the limit of 20,000,000 cells") {
		t.Fatalf("got %v", err)
	}
}

// TestXLSXRepeatedCells: cells that all claim column A never pass the
// column limit by number; they are counted per row.
func TestXLSXRepeatedCells(t *testing.T) {
	row := `<row r="1"><c r="A1" t="inlineStr"><is><t>a</t></is></c></row><row r="2">` + strings.Repeat(`<c r="A2"><v>1</v></c>`, 50) + `</row>`
	_, err := ParseXLSXWith("b.xlsx", book(t, row, ""), "", mustLimits(t, "columns=10"))
	want := "b.xlsx:2:1: row 2 has more than the limit of 10 columns; the workbook may be damaged: save it again from the spreadsheet, or raise the limit with --limit columns=20"
	if err == nil || err.Error() != want {
		t.Errorf("\n got %v\nwant %s", err, want)
	}
	sst := strings.Repeat(`<si><t>x</t></si>`, 30)
	_, err = ParseXLSXWith("b.xlsx", book(t, `<row r="1"><c r="A1" t="s"><v>0</v></c></row>`, sst), "", mustLimits(t, "sheet-cells=20"))
	if err == nil || !strings.Contains(err.Error(), "shared string table has more than the limit of 20 cells") {
		t.Errorf("shared strings: %v", err)
	}
}
