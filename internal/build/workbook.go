package build

import (
	"io"

	"peerpack/internal/figures"
	"peerpack/internal/workbook"
)

// WriteWorkbook writes the figures model as an XLSX workbook with one
// sheet per section of the figures file and the same rows, so the
// workbook and the CSV never disagree.
func WriteWorkbook(w io.Writer, m *figures.Model) error {
	var sheets []workbook.Sheet
	index := map[string]int{}
	for r := range m.Rows() {
		i, ok := index[r.Section]
		if !ok {
			i = len(sheets)
			index[r.Section] = i
			sheets = append(sheets, workbook.Sheet{Name: r.Section, Header: []string{"group", "indicator", "institution", "year", "measure", "value"}})
		}
		var year any = ""
		if r.Year != 0 {
			year = r.Year
		}
		var value any = r.Value
		if r.IsText {
			value = r.Text
		}
		sheets[i].Rows = append(sheets[i].Rows, []any{r.Group, r.Indicator, r.Institution, year, r.Measure, value})
	}
	if len(sheets) == 0 {
		sheets = append(sheets, workbook.Sheet{Name: "figures", Header: figures.CSVHeader})
	}
	return workbook.Write(w, sheets)
}
