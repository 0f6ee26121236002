package dataset

import (
	"bytes"
	"strings"
	"testing"
	"testing/fstest"
	"time"

	"github.com/xuri/excelize/v2"

	"peerpack/internal/brief"
)

// unitBook writes a long values workbook with excelize: intl_share is
// entered as 0.036 formatted as a percentage (built-in format 10, 0.00 %,
// ECMA-376 Part 1, 18.8.30), which a spreadsheet shows as 3.60 %; when
// date is set, one papers cell is a date.
func unitBook(t *testing.T, date bool) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	sh := "Sheet1"
	rows := [][]any{
		{"institution", "year", "indicator", "value"},
		{"A1", 2024, "intl_share", 0.036},
		{"A2", 2024, "intl_share", 0.5},
		{"A1", 2024, "papers", 120},
		{"A2", 2024, "papers", 80},
		{"A1", 2024, "staff_share", 0.25},
	}
	for i, r := range rows {
		cell, _ := excelize.CoordinatesToCellName(1, i+1)
		if err := f.SetSheetRow(sh, cell, &r); err != nil {
			t.Fatal(err)
		}
	}
	pct, _ := f.NewStyle(&excelize.Style{NumFmt: 10})
	for _, ref := range []string{"D2", "D3", "D6"} {
		if err := f.SetCellStyle(sh, ref, ref, pct); err != nil {
			t.Fatal(err)
		}
	}
	if date {
		day, _ := f.NewStyle(&excelize.Style{NumFmt: 14})
		f.SetCellValue(sh, "D5", time.Date(2024, 3, 31, 0, 0, 0, 0, time.UTC))
		f.SetCellStyle(sh, "D5", "D5", day)
	}
	var buf bytes.Buffer
	if _, err := f.WriteTo(&buf); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

func loadUnitBook(t *testing.T, date bool) (*Dataset, *Report, error) {
	t.Helper()
	src := "---\ntitle: T\nfocus: A1\nyear: 2024\ndata: {register: reg.csv, values: [v.xlsx], dictionary: dict.yaml}\n---\n"
	b, err := brief.Parse("brief.md", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	fsys := fstest.MapFS{
		"reg.csv": {Data: []byte("id,name,country,region\nA1,Alder Institute,Kestria,North\nA2,Birch College,Kestria,South\n")},
		"dict.yaml": {Data: []byte(`indicators:
  - {key: intl_share, label: Intl share, unit: percent, better: higher, decimals: 1}
  - {key: staff_share, label: Staff share, unit: share, better: higher, decimals: 2}
  - {key: papers, label: Papers, unit: count, better: higher, decimals: 0}
`)},
		"v.xlsx": {Data: unitBook(t, date)},
	}
	return Load(fsys, b)
}

// TestXLSXPercentCells: a percent-formatted cell is read in the
// dictionary's unit (0.036 shown as 3.60 % is 3.6 in a percent indicator;
// common practice, no source), a share indicator keeps the fraction, and
// the report says what was converted.
func TestXLSXPercentCells(t *testing.T) {
	d, rep, err := loadUnitBook(t, false)
	if err != nil {
		t.Fatal(err)
	}
	get := func(key string, inst int) float64 {
		return d.Column(d.Dictionary.Index(key), 2024)[inst]
	}
	if got := get("intl_share", 0); got != 3.6 {
		t.Errorf("intl_share A1 = %v, want 3.6", got)
	}
	if got := get("intl_share", 1); got != 50 {
		t.Errorf("intl_share A2 = %v, want 50", got)
	}
	if got := get("staff_share", 0); got != 0.25 {
		t.Errorf("staff_share A1 = %v, want 0.25 (a share stays a fraction)", got)
	}
	want := "v.xlsx: 2 cells of intl_share formatted as a percentage (first D2, holding 0.036) read as percent"
	if len(rep.Notes) != 1 || !strings.HasPrefix(rep.Notes[0], want) {
		t.Errorf("notes %q, want one starting %q", rep.Notes, want)
	}
	var w strings.Builder
	rep.Write(&w)
	if !strings.Contains(w.String(), want) {
		t.Errorf("the report does not print the note:\n%s", w.String())
	}
}

// TestXLSXDateInNumericColumn: a date in a numeric column is an error
// naming the cell.
func TestXLSXDateInNumericColumn(t *testing.T) {
	_, _, err := loadUnitBook(t, true)
	want := "v.xlsx:5:4: "
	if err == nil || !strings.Contains(err.Error(), want) || !strings.Contains(err.Error(), "formatted as a date (2024-03-31), but papers is a number") {
		t.Fatalf("got %v, want a problem at %s", err, want)
	}
}
