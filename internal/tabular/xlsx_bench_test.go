package tabular

import (
	"bytes"
	"fmt"
	"testing"

	"github.com/xuri/excelize/v2"
)

// benchBook is a long values sheet written by excelize's stream writer:
// rows x (institution, year, indicator, value, share as a percentage).
func benchBook(b *testing.B, rows int) []byte {
	b.Helper()
	f := excelize.NewFile()
	defer f.Close()
	sw, err := f.NewStreamWriter("Sheet1")
	if err != nil {
		b.Fatal(err)
	}
	pct, _ := f.NewStyle(&excelize.Style{NumFmt: 10})
	sw.SetRow("A1", []any{"institution", "year", "indicator", "value", "share"})
	for i := 2; i <= rows+1; i++ {
		cell, _ := excelize.CoordinatesToCellName(1, i)
		row := []any{fmt.Sprintf("KE%03d", i%500), 2015 + i%10, "papers", float64(i) * 1.25, excelize.Cell{StyleID: pct, Value: float64(i%100) / 1000}}
		if err := sw.SetRow(cell, row); err != nil {
			b.Fatal(err)
		}
	}
	if err := sw.Flush(); err != nil {
		b.Fatal(err)
	}
	var buf bytes.Buffer
	if _, err := f.WriteTo(&buf); err != nil {
		b.Fatal(err)
	}
	return buf.Bytes()
}

// BenchmarkParseXLSX reads a 100,000-row values sheet:
//
//	go test ./internal/tabular -run '^$' -bench ParseXLSX -benchmem
func BenchmarkParseXLSX(b *testing.B) {
	data := benchBook(b, 100_000)
	b.SetBytes(int64(len(data)))
	b.ResetTimer()
	for b.Loop() {
		t, err := ParseXLSX("b.xlsx", data, "")
		if err != nil || len(t.Rows) != 100_000 {
			b.Fatalf("%v, %d rows", err, len(t.Rows))
		}
	}
}
