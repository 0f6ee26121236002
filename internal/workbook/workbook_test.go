package workbook

import (
	"bytes"
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
