package tabular

import (
	"archive/zip"
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"peerpack/internal/limits"
)

var xlsxDir = filepath.Join("..", "..", "testdata", "data", "xlsx")

// TestXLSXMatchesCSV reads workbooks written by openpyxl 3.0.9 (Debian
// python3-openpyxl; testdata/data/xlsx/generate.py) and the same data
// written as CSV by Python's csv module, and requires identical text in
// every cell. The values workbook holds the data on its second sheet,
// named "Values".
func TestXLSXMatchesCSV(t *testing.T) {
	fsys := os.DirFS(xlsxDir)
	for _, pair := range [][2]string{{"institutions.xlsx", "institutions.csv"}, {"values.xlsx#Values", "values.csv"}} {
		x, err := ReadTable(fsys, pair[0])
		if err != nil {
			t.Fatalf("%s: %v", pair[0], err)
		}
		c, err := ReadTable(fsys, pair[1])
		if err != nil {
			t.Fatalf("%s: %v", pair[1], err)
		}
		gx, gc := texts(x), texts(c)
		if len(gx) != len(gc) {
			t.Fatalf("%s has %d rows, %s %d", pair[0], len(gx), pair[1], len(gc))
		}
		for i := range gx {
			for j := range gx[i] {
				if !sameCell(gx[i][j], gc[i][j]) {
					t.Errorf("%s row %d: %q, CSV %q", pair[0], i+1, gx[i], gc[i])
					break
				}
			}
		}
		// Positions: row r of the sheet is line r, column C is 3.
		if cell := x.Rows[1][2]; cell.Line != 3 || cell.Col != 3 {
			t.Errorf("%s: cell C3 at %d:%d", pair[0], cell.Line, cell.Col)
		}
	}
}

// sameCell compares texts, and numbers by value: Python's csv module
// writes the float 8.0 as "8.0" where the workbook stores 8.
func sameCell(a, b string) bool {
	if a == b {
		return true
	}
	x, ex, errX := ParseNumber(a)
	y, ey, errY := ParseNumber(b)
	return errX == nil && errY == nil && !ex && !ey && x == y
}

func TestXLSXSheets(t *testing.T) {
	fsys := os.DirFS(xlsxDir)
	tb, err := ReadTable(fsys, "values.xlsx")
	if err != nil {
		t.Fatal(err)
	}
	if tb.Header[0].Text != "Invented demo values" {
		t.Errorf("first sheet header %q", tb.Header[0].Text)
	}
	_, err = ReadTable(fsys, "values.xlsx#Value")
	if err == nil || !strings.Contains(err.Error(), `no sheet named "Value"; did you mean "Values"?`) {
		t.Errorf("got %v", err)
	}
}

// book builds a minimal workbook by hand (ECMA-376 Part 1 part names) with
// the given sheet XML and shared strings.
func book(t *testing.T, sheet, sst string) []byte {
	t.Helper()
	return buildBook(sheet, sst, zip.Deflate)
}

// storedBook is book without compression.
func storedBook(sheet, sst string) []byte { return buildBook(sheet, sst, zip.Store) }

func buildBook(sheet, sst string, method uint16) []byte {
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	put := func(name, body string) {
		w, err := zw.CreateHeader(&zip.FileHeader{Name: name, Method: method})
		if err != nil {
			panic(err)
		}
		w.Write([]byte(body))
	}
	put("_rels/.rels", `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>`)
	put("xl/workbook.xml", `<?xml version="1.0"?><workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets><sheet name="Data" sheetId="1" r:id="rId1"/></sheets></workbook>`)
	rels := `<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/>`
	if sst != "" {
		rels += `<Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sharedStrings" Target="sharedStrings.xml"/>`
		put("xl/sharedStrings.xml", `<?xml version="1.0"?><sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">`+sst+`</sst>`)
	}
	put("xl/_rels/workbook.xml.rels", `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">`+rels+`</Relationships>`)
	put("xl/worksheets/sheet1.xml", `<?xml version="1.0"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>`+sheet+`</sheetData></worksheet>`)
	if err := zw.Close(); err != nil {
		panic(err)
	}
	return buf.Bytes()
}

// TestXLSXCellKinds covers what Excel writes and openpyxl does not: shared
// strings with rich-text runs and phonetic runs, booleans, cached formula
// results, cells without an r attribute, skipped empty rows and a
// floating-point value stored with 17 digits.
func TestXLSXCellKinds(t *testing.T) {
	sst := `<si><t>id</t></si><si><t>flag</t></si><si><r><t>Rich </t></r><r><t>text</t></r><rPh><t>ignored</t></rPh></si><si><t>value</t></si>`
	sheet := `<row r="1"><c r="A1" t="s"><v>0</v></c><c r="B1" t="s"><v>1</v></c><c r="C1" t="s"><v>3</v></c></row>` +
		`<row r="3"><c r="A3" t="s"><v>2</v></c><c r="B3" t="b"><v>1</v></c><c r="C3"><f>1/10</f><v>0.10000000000000001</v></c></row>` +
		`<row r="4"><c t="inlineStr"><is><t>inline</t></is></c><c t="b"><v>0</v></c><c t="str"><f>A4</f><v>inline</v></c></row>` +
		`<row r="5"><c r="C5"><v>2024</v></c></row>`
	tb, err := ParseXLSX("b.xlsx", book(t, sheet, sst), "")
	if err != nil {
		t.Fatal(err)
	}
	want := [][]string{{"id", "flag", "value"}, {"Rich text", "TRUE", "0.1"}, {"inline", "FALSE", "inline"}, {"", "", "2024"}}
	got := texts(tb)
	if len(got) != len(want) {
		t.Fatalf("got %q", got)
	}
	for i := range want {
		if strings.Join(got[i], "|") != strings.Join(want[i], "|") {
			t.Errorf("row %d: %q, want %q", i, got[i], want[i])
		}
	}
	if c := tb.Rows[0][0]; c.Line != 3 || c.Col != 1 {
		t.Errorf("A3 at %d:%d", c.Line, c.Col)
	}
	if c := tb.Rows[1][1]; c.Line != 4 || c.Col != 2 {
		t.Errorf("B4 at %d:%d", c.Line, c.Col)
	}
}

func TestXLSXProblems(t *testing.T) {
	_, err := ParseXLSX("b.xlsx", book(t, `<row r="1"><c r="A1" t="inlineStr"><is><t>a</t></is></c></row><row r="2"><c r="A2"><v>1</v></c><c r="D2"><v>5</v></c></row>`, ""), "")
	if err == nil || !strings.HasPrefix(err.Error(), "b.xlsx:2:4: cell D2 holds \"5\" but the header row has no column D") {
		t.Errorf("got %v", err)
	}
	_, err = ParseXLSX("b.xlsx", book(t, `<row r="1"><c r="A1" t="s"><v>0</v></c><c r="B1" t="s"><v>7</v></c></row>`, `<si><t>a</t></si>`), "")
	if err == nil || !strings.Contains(err.Error(), "shared string \"7\" does not exist") {
		t.Errorf("got %v", err)
	}
	_, err = ParseXLSX("b.xlsx", []byte("not a zip"), "")
	if err == nil || !strings.Contains(err.Error(), "not a readable XLSX workbook") {
		t.Errorf("got %v", err)
	}
}

// TestXLSXBomb: a part that states it inflates past the limit is refused
// before inflating (TestXLSXLyingHeader covers a header that lies).
func TestXLSXBomb(t *testing.T) {
	// The limit is lowered to 1 MiB so that the test inflates 2 MiB, not
	// 256; the code path is the same.
	defer func(old int64) { partLimit = old }(partLimit)
	partLimit = 1 << 20
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	good := book(t, `<row r="1"><c r="A1"><v>1</v></c></row>`, "")
	zr, _ := zip.NewReader(bytes.NewReader(good), int64(len(good)))
	for _, f := range zr.File {
		if f.Name == "xl/worksheets/sheet1.xml" {
			continue
		}
		rc, _ := f.Open()
		w, _ := zw.Create(f.Name)
		var b bytes.Buffer
		b.ReadFrom(rc)
		w.Write(b.Bytes())
	}
	w, _ := zw.CreateHeader(&zip.FileHeader{Name: "xl/worksheets/sheet1.xml", Method: zip.Deflate})
	chunk := bytes.Repeat([]byte(" "), 1<<20)
	w.Write([]byte(`<worksheet><sheetData>`))
	for i := 0; i < int(partLimit>>20)+1; i++ {
		w.Write(chunk)
	}
	zw.Close()
	_, err := ParseXLSX("bomb.xlsx", buf.Bytes(), "")
	if err == nil || !strings.Contains(err.Error(), "inflates") {
		t.Fatalf("got %v", err)
	}
}

func TestCellRef(t *testing.T) {
	// Column letters per ECMA-376 Part 1, 18.3.1.4 (A = 1, Z = 26, AA = 27,
	// XFD = 16384); the scanner reads references with excelize's
	// CellNameToCoordinates, and positions are named back with ColumnName.
	for ref, want := range map[string][2]int{"A1": {1, 1}, "C12": {3, 12}, "Z9": {26, 9}, "AA3": {27, 3}, "XFD1048576": {16384, 1048576}} {
		c, r, err := excelize.CellNameToCoordinates(ref)
		if err != nil || c != want[0] || r != want[1] {
			t.Errorf("%s: %d %d %v", ref, c, r, err)
		}
		if ColumnName(c) != strings.TrimRight(ref, "0123456789") {
			t.Errorf("ColumnName(%d) = %s", c, ColumnName(c))
		}
	}
	for _, bad := range []string{"", "1A", "A", "XFE1", "A0", "A1048577"} {
		if _, _, err := excelize.CellNameToCoordinates(bad); err == nil {
			t.Errorf("%q accepted", bad)
		}
	}
}

// FuzzXLSX is seeded with the parts peerpack reads of the openpyxl register
// workbook and with a small hand-built workbook, both stored without
// compression so that the mutator reaches the XML directly (mutating
// deflated bytes yields little but checksum errors, and minimising a large
// seed takes the whole fuzzing time).
func FuzzXLSX(f *testing.F) {
	if b, err := os.ReadFile(filepath.Join(xlsxDir, "institutions.xlsx")); err == nil {
		f.Add(restore(b, "xl/workbook.xml", "xl/_rels/workbook.xml.rels", "xl/worksheets/sheet1.xml"), "Register")
	}
	f.Add(storedBook(`<row r="1"><c r="A1" t="s"><v>0</v></c><c r="B1" t="inlineStr"><is><t>b</t></is></c></row><row r="2"><c r="A2" t="b"><v>1</v></c><c r="B2"><v>2.5</v></c></row>`, `<si><t>a</t></si>`), "Data")
	f.Fuzz(func(t *testing.T, data []byte, sheet string) {
		tb, err := ParseXLSX("f.xlsx", data, sheet)
		if err != nil {
			if err.Error() == "" {
				t.Fatal("empty message")
			}
		} else {
			for _, r := range tb.Rows {
				if len(r) != len(tb.Header) {
					t.Fatalf("row of %d cells, header %d", len(r), len(tb.Header))
				}
			}
		}
		// The same input under tiny limits stops at them.
		small := limits.Limits{Rows: 2, Columns: 3, CellBytes: 4, SheetCells: 5}.Or()
		tb, err = ParseXLSXWith("f.xlsx", data, sheet, small)
		if err != nil {
			if err.Error() == "" {
				t.Fatal("empty message")
			}
			if tb == nil {
				return
			}
		}
		if int64(len(tb.Rows)) > small.Rows || int64(len(tb.Header)) > small.Columns || int64(len(tb.Rows)*len(tb.Header)) > small.SheetCells {
			t.Fatalf("%d rows x %d columns under limits %+v", len(tb.Rows), len(tb.Header), small)
		}
		for _, r := range tb.Rows {
			for _, c := range r {
				if int64(len(c.Text)) > small.CellBytes {
					t.Fatalf("cell of %d bytes under a limit of %d", len(c.Text), small.CellBytes)
				}
			}
		}
	})
}

// restore re-packs the named parts of a workbook without compression.
func restore(data []byte, parts ...string) []byte {
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		panic(err)
	}
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	for _, f := range zr.File {
		for _, p := range parts {
			if f.Name != p {
				continue
			}
			rc, _ := f.Open()
			var body bytes.Buffer
			body.ReadFrom(rc)
			rc.Close()
			w, _ := zw.CreateHeader(&zip.FileHeader{Name: f.Name, Method: zip.Store})
			w.Write(body.Bytes())
		}
	}
	zw.Close()
	return buf.Bytes()
}

// TestXLSXLyingHeader: a part whose headers understate its size is cut off
// while inflating (archive/zip checks the count against the stated size),
// and reported as a damaged workbook rather than read on.
func TestXLSXLyingHeader(t *testing.T) {
	big := `<row r="1"><c r="A1"><v>1</v></c></row>` + strings.Repeat(`<row><c><v>2</v></c></row>`, 5000)
	data := book(t, big, "")
	name := []byte("xl/worksheets/sheet1.xml")
	// Patch the uncompressed size in the local header (offset 22) and the
	// central directory record (offset 24) of the sheet part to 100 bytes
	// (APPNOTE.TXT 4.3.7 and 4.3.12).
	for i := 0; i+46 < len(data); i++ {
		switch {
		case bytes.Equal(data[i:i+4], []byte{0x50, 0x4b, 0x03, 0x04}) && bytes.HasPrefix(data[i+30:], name):
			copy(data[i+22:], []byte{100, 0, 0, 0})
		case bytes.Equal(data[i:i+4], []byte{0x50, 0x4b, 0x01, 0x02}) && bytes.HasPrefix(data[i+46:], name):
			copy(data[i+24:], []byte{100, 0, 0, 0})
		}
	}
	_, err := ParseXLSX("lying.xlsx", data, "")
	if err == nil || !strings.Contains(err.Error(), "workbook part xl/worksheets/sheet1.xml is damaged") {
		t.Fatalf("got %v", err)
	}
}

// TestXLSXBadChecksum: a part whose bytes do not match the CRC-32 its
// header states (APPNOTE.TXT 4.4.7) is reported as damaged, though excelize
// itself keeps what it inflated.
func TestXLSXBadChecksum(t *testing.T) {
	data := storedBook(`<row r="1"><c r="A1"><v>1</v></c></row><row r="2"><c r="A2"><v>2</v></c></row>`, "")
	// Stored without compression, so the sheet's bytes are in the file as
	// they are: change the digit 2 to 3.
	i := bytes.Index(data, []byte("<v>2</v>"))
	if i < 0 {
		t.Fatal("value not found")
	}
	data[i+3] = '3'
	_, err := ParseXLSX("crc.xlsx", data, "")
	if err == nil || !strings.Contains(err.Error(), "crc.xlsx: workbook part xl/worksheets/sheet1.xml is damaged") {
		t.Fatalf("got %v", err)
	}
}

// TestXLSXMalformedSheet: XML that stops in the middle of a row is
// reported, not read as a shorter sheet.
func TestXLSXMalformedSheet(t *testing.T) {
	_, err := ParseXLSX("m.xlsx", book(t, `<row r="1"><c r="A1"><v>1</v></c></row><row r="2"><c r="A2"><v>2</v></c>`, ""), "")
	if err == nil || !strings.Contains(err.Error(), "workbook part xl/worksheets/sheet1.xml is not well-formed XML") {
		t.Fatalf("got %v", err)
	}
}

// TestXLSXOrder: rows and the cells of a row are written in order by every
// spreadsheet (ECMA-376 Part 1, 18.3.1.73 and 18.3.1.4, from memory); out
// of order, the workbook is refused with the place named.
func TestXLSXOrder(t *testing.T) {
	cases := []struct{ sheet, want string }{
		{`<row r="1"><c r="A1"><v>1</v></c></row><row r="3"><c r="A3"><v>3</v></c></row><row r="2"><c r="A2"><v>2</v></c></row>`,
			"o.xlsx:2: row 2 comes after row 3; the rows of a sheet must be in order"},
		{`<row r="1"><c r="A1"><v>1</v></c><c r="B1"><v>1</v></c></row><row r="2"><c r="B2"><v>2</v></c><c r="A2"><v>3</v></c></row>`,
			"o.xlsx:2:1: cell A2 comes after cell B2; the cells of a row must be in order"},
		{`<row r="1"><c r="A1"><v>1</v></c></row><row r="x"><c><v>2</v></c></row>`,
			`o.xlsx:2: the row after row 1 is numbered "x", which is not a row number`},
		{`<row r="1"><c r="A1"><v>1</v></c></row><row r="2"><c r="2A"><v>2</v></c></row>`,
			`o.xlsx:2:1: a cell of row 2 has the reference "2A", which is not a cell reference`},
	}
	for _, c := range cases {
		_, err := ParseXLSX("o.xlsx", book(t, c.sheet, ""), "")
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("got %v\nwant %s", err, c.want)
		}
	}
}

// TestXLSXCalcLaidOut: excelize's calculation engine lays the whole sheet
// out, every row padded to its last cell, empty cells included; a formula
// saved without its result in a sheet that would lay out beyond the
// sheet-cells limit is refused with the cell named, not computed.
func TestXLSXCalcLaidOut(t *testing.T) {
	var rows strings.Builder
	rows.WriteString(`<row r="1"><c r="A1" t="inlineStr"><is><t>a</t></is></c><c r="B1" t="inlineStr"><is><t>b</t></is></c></row>`)
	rows.WriteString(`<row r="2"><c r="A2"><v>1</v></c><c r="B2"><f>A2*2</f></c></row>`)
	for i := 3; i <= 20; i++ {
		fmt.Fprintf(&rows, `<row r="%d"><c r="J%d"/></row>`, i, i)
	}
	data := book(t, rows.String(), "")
	tb, err := ParseXLSXWith("c.xlsx", data, "", mustLimits(t, "sheet-cells=1000"))
	if err != nil {
		t.Fatal(err)
	}
	// A2*2 with A2 = 1.
	if got := tb.Rows[0][1].Text; got != "2" {
		t.Errorf("B2 = %q, want 2", got)
	}
	// 2 + 2 + 18 x 10 = 184 cells laid out.
	_, err = ParseXLSXWith("c.xlsx", data, "", mustLimits(t, "sheet-cells=50"))
	want := "c.xlsx:2:2: cell B2 holds a formula with no stored result, and computing it here would lay the sheet out as 184 cells, over the limit of 50"
	if err == nil || !strings.HasPrefix(err.Error(), want) {
		t.Errorf("got %v\nwant %s", err, want)
	}
}

// TestXLSXNoReferences: rows and cells without r attributes follow one
// another (ECMA-376 Part 1, 18.3.1.73 and 18.3.1.4 make r optional, from
// memory); a formula saved without its result beyond the header's columns
// is computed and reported like any value there.
func TestXLSXNoReferences(t *testing.T) {
	sheet := `<row><c t="inlineStr"><is><t>a</t></is></c><c t="inlineStr"><is><t>b</t></is></c></row>` +
		`<row><c><v>1</v></c><c t="b"><v>1</v></c></row>` +
		`<row><c><v>2</v></c><c><v>3</v></c><c><f>A3+B3</f></c></row>`
	tb, err := ParseXLSX("n.xlsx", book(t, sheet, ""), "")
	want := `n.xlsx:3:3: cell C3 holds "5" but the header row has no column C; add a header or delete the cell`
	if err == nil || err.Error() != want {
		t.Fatalf("got %v\nwant %s", err, want)
	}
	got := texts(tb)
	if strings.Join(got[1], "|") != "1|TRUE" || strings.Join(got[2], "|") != "2|3" {
		t.Errorf("got %q", got)
	}
	if c := tb.Rows[1][1]; c.Line != 3 || c.Col != 2 {
		t.Errorf("B3 at %d:%d", c.Line, c.Col)
	}
}
