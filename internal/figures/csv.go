package figures

import (
	"encoding/csv"
	"io"
	"strconv"
)

// CSVHeader is the figures file's header row.
var CSVHeader = []string{"section", "group", "indicator", "institution", "year", "measure", "value"}

// WriteCSV writes the figures file: RFC 4180 CSV in UTF-8 with the header
// section,group,indicator,institution,year,measure,value and the model's
// rows in Rows order, written as they are produced. Numbers are written unrounded in their shortest exact
// form (strconv 'g', -1), so a spreadsheet reads back the very float64 the
// pack used; text rows carry their sentence in the value column.
func WriteCSV(w io.Writer, m *Model) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(CSVHeader); err != nil {
		return err
	}
	rec := make([]string, len(CSVHeader))
	for r := range m.Rows() {
		rec[0], rec[1], rec[2], rec[3] = r.Section, r.Group, r.Indicator, r.Institution
		rec[4] = ""
		if r.Year != 0 {
			rec[4] = strconv.Itoa(r.Year)
		}
		rec[5] = r.Measure
		if r.IsText {
			rec[6] = r.Text
		} else {
			rec[6] = strconv.FormatFloat(r.Value, 'g', -1, 64)
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

func itoa(i int) string { return strconv.Itoa(i) }
