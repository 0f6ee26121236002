package build

import (
	"io"

	"peerpack/internal/figures"
	"peerpack/internal/workbook"
)

// inIndicatorUnits are the measures stated in their indicator's unit,
// which the workbook shows with the indicator's decimals; ranks, counts,
// percentiles, z-scores and shares of change keep the general format.
var inIndicatorUnits = map[string]bool{
	"value": true, "min": true, "max": true, "mean": true, "median": true, "q1": true, "q3": true,
	"iqr": true, "sd": true, "whisker_low": true, "whisker_high": true, "outlier": true,
	"gap_median": true, "gap_better_quartile": true,
	"start_value": true, "end_value": true, "change": true, "median_start": true, "median_end": true,
}

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
		} else if ind, ok := m.Indicator(r.Indicator); ok && inIndicatorUnits[r.Measure] {
			// Shown with the indicator's decimals, as in the pack; the
			// cell keeps the unrounded value.
			value = workbook.Number{Value: r.Value, Decimals: ind.Decimals}
		}
		sheets[i].Rows = append(sheets[i].Rows, []any{r.Group, r.Indicator, r.Institution, year, r.Measure, value})
	}
	if len(sheets) == 0 {
		sheets = append(sheets, workbook.Sheet{Name: "figures", Header: figures.CSVHeader})
	}
	return workbook.Write(w, sheets)
}
