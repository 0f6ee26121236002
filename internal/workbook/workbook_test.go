package workbook

import (
	"archive/zip"
	"bytes"
	"io"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// Column letters are bijective base 26 (ECMA-376 Part 1, 18.3.1.4 cell
// references; A..Z, AA..ZZ, AAA..; XFD is the last column, 16,384th).
func TestColumnName(t *testing.T) {
	cases := map[int]string{0: "A", 25: "Z", 26: "AA", 51: "AZ", 52: "BA", 701: "ZZ", 702: "AAA", 16383: "XFD"}
	for i, want := range cases {
		if got := ColumnName(i); got != want {
			t.Errorf("ColumnName(%d) = %q, want %q", i, got, want)
		}
	}
}

func sample() []Sheet {
	return []Sheet{
		{Name: "distribution", Header: []string{"group", "indicator", "value"}, Rows: [][]any{
			{"Home sector", "fnci", 1.25}, {"Høgskolen i Vårdø & co", "intl_staff_share", 0.3}, {"missing", "x", math.NaN()},
		}},
		{Name: "a/very:long*name that is over thirty-one characters", Header: []string{"n"}, Rows: [][]any{{42}}},
	}
}

func TestDeterministic(t *testing.T) {
	var a, b bytes.Buffer
	if err := Write(&a, sample()); err != nil {
		t.Fatal(err)
	}
	Write(&b, sample())
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("two writes of the same sheets differ")
	}
}

// The workbook must open in a general-purpose spreadsheet library: openpyxl
// (Debian package python3-openpyxl) reads it back with the same values.
func TestReadBackWithOpenpyxl(t *testing.T) {
	py := "/usr/bin/python3"
	if err := exec.Command(py, "-c", "import openpyxl").Run(); err != nil {
		t.Skip("python3-openpyxl is not installed (apt-get install python3-openpyxl)")
	}
	path := filepath.Join(t.TempDir(), "figures.xlsx")
	var buf bytes.Buffer
	if err := Write(&buf, sample()); err != nil {
		t.Fatal(err)
	}
	os.WriteFile(path, buf.Bytes(), 0o644)
	script := `
import sys, openpyxl
wb = openpyxl.load_workbook(sys.argv[1])
for ws in wb.worksheets:
    print("sheet", ws.title)
    for row in ws.iter_rows(values_only=True):
        print("|".join("" if v is None else repr(v) for v in row))
`
	out, err := exec.Command(py, "-c", script, path).CombinedOutput()
	if err != nil {
		t.Fatalf("openpyxl could not read the workbook: %v\n%s", err, out)
	}
	want := strings.Join([]string{
		"sheet distribution",
		"'group'|'indicator'|'value'",
		"'Home sector'|'fnci'|1.25",
		"'Høgskolen i Vårdø & co'|'intl_staff_share'|0.3",
		"'missing'|'x'|",
		"sheet a_very_long_name that is over t",
		"'n'",
		"42",
	}, "\n") + "\n"
	if string(out) != want {
		t.Errorf("openpyxl read\n%s\nwant\n%s", out, want)
	}
}

// The sheet's furniture as openpyxl (python3-openpyxl, Debian) reads it:
// the header row frozen (freeze_panes "A2"), an autofilter over the
// header and rows, bold headers, column widths from the content, and
// number formats from each figure's decimals ("0.00" for 2, ECMA-376
// Part 1, 18.8.30 number format codes).
func TestSheetFurnitureWithOpenpyxl(t *testing.T) {
	py := "/usr/bin/python3"
	if err := exec.Command(py, "-c", "import openpyxl").Run(); err != nil {
		t.Skip("python3-openpyxl is not installed (apt-get install python3-openpyxl)")
	}
	sheets := []Sheet{{Name: "position", Header: []string{"indicator", "value"}, Rows: [][]any{
		{"citation_impact", Number{Value: 1.23456, Decimals: 2}},
		{"a much longer indicator name for the width", Number{Value: 12.5, Decimals: 0}},
		{"students", 1200},
	}}}
	var buf bytes.Buffer
	if err := Write(&buf, sheets); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "f.xlsx")
	os.WriteFile(path, buf.Bytes(), 0o644)
	script := `
import sys, openpyxl
ws = openpyxl.load_workbook(sys.argv[1]).active
print(ws.title, ws.freeze_panes, ws.auto_filter.ref.replace("$", ""), ws["A1"].font.b)
print(ws["B2"].value, ws["B2"].number_format, ws["B3"].value, ws["B3"].number_format, ws["B4"].value)
print(ws.column_dimensions["A"].width > ws.column_dimensions["B"].width >= 8)
`
	out, err := exec.Command(py, "-c", script, path).CombinedOutput()
	if err != nil {
		t.Fatalf("openpyxl: %v\n%s", err, out)
	}
	want := "position A2 A1:B4 True\n1.23456 0.00 12.5 0 1200\nTrue\n"
	if string(out) != want {
		t.Errorf("openpyxl read\n%s\nwant\n%s", out, want)
	}
	zr, err := zip.NewReader(bytes.NewReader(buf.Bytes()), int64(buf.Len()))
	if err != nil {
		t.Fatal(err)
	}
	for _, zf := range zr.File {
		if zf.Name != "xl/worksheets/sheet1.xml" {
			continue
		}
		rc, _ := zf.Open()
		body, _ := io.ReadAll(rc)
		rc.Close()
		if i, j := bytes.Index(body, []byte(`<col min="1"`)), bytes.Index(body, []byte(`<col min="2"`)); i < 0 || j < i {
			t.Errorf("<col> elements not in ascending order: %s", body[bytes.Index(body, []byte("<cols>")):bytes.Index(body, []byte("</cols>"))])
		}
	}
}

// A sheet of more rows than a sheet holds (1,048,576 with the header,
// ECMA-376 Part 1, 18.3.1.73, from memory) is refused before anything is
// written, with a message that names the sheet and the way out.
func TestRowLimit(t *testing.T) {
	rows := make([][]any, MaxRows) // with the header, one row too many
	var buf bytes.Buffer
	err := Write(&buf, []Sheet{{Name: "distribution", Header: []string{"v"}, Rows: rows}})
	if err == nil || !strings.Contains(err.Error(), `"distribution" sheet would have 1048577 rows`) || !strings.Contains(err.Error(), "--figures") {
		t.Errorf("want a row-limit error, got %v", err)
	}
	if buf.Len() != 0 {
		t.Errorf("%d bytes written before the error", buf.Len())
	}
	if err := Write(&buf, []Sheet{{Name: "ok", Header: []string{"v"}, Rows: rows[:10]}}); err != nil {
		t.Errorf("a small sheet: %v", err)
	}
}
