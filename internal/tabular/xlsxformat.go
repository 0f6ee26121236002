package tabular

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"peerpack/internal/limits"
)

// Kind says how a spreadsheet cell's number format asks it to be read. A
// CSV field, and a workbook cell with no number format that matters, is
// KindPlain.
type Kind uint8

const (
	// KindPlain: the text is the value as written.
	KindPlain Kind = iota
	// KindPercent: a number shown as a percentage (0.036 shown as 3.6 %);
	// Text holds the stored fraction, and a loader whose column is in
	// percent multiplies it by 100.
	KindPercent
	// KindDate: a serial date shown as a date; Text holds it as
	// YYYY-MM-DD (with hh:mm:ss when it has a time of day).
	KindDate
)

// calc computes a formula cell saved without its result (as some libraries
// write them) with excelize's calculation engine; a formula it cannot
// compute is refused, never read as a missing value. The engine lays the
// whole sheet out in memory, every row padded to its last cell (laidOut
// cells in all), so a sheet that would lay out beyond the sheet-cells limit
// is refused instead.
func (bk *xlsxBook) calc(ref string, laidOut int64) (string, error) {
	if laidOut > bk.lim.SheetCells {
		return "", fmt.Errorf("cell %s holds a formula with no stored result, and computing it here would lay the sheet out as %s; open the workbook in a spreadsheet and save it, which stores the results, or replace the formula by its value", ref, bk.lim.Over(limits.SheetCells, laidOut, ""))
	}
	formula, _ := bk.f.GetCellFormula(bk.sheet, ref)
	v, err := bk.f.CalcCellValue(bk.sheet, ref, excelize.Options{RawCellValue: true})
	if err == nil && strings.HasPrefix(v, "#") {
		err = fmt.Errorf("it gives %s", v)
	}
	if err != nil {
		return "", fmt.Errorf("cell %s holds the formula =%s with no stored result, and it cannot be computed here (the calculation engine says: %v); open the workbook in a spreadsheet and save it, which stores the results, or replace the formula by its value", ref, formula, err)
	}
	if x, err := strconv.ParseFloat(v, 64); err == nil {
		v = strconv.FormatFloat(x, 'f', -1, 64)
	}
	return v, nil
}

// styled reads a numeric cell through its number format: a percentage keeps
// its stored fraction and says so; a date becomes a date in the workbook's
// date system (1900 or 1904).
func (bk *xlsxBook) styled(style int, text string) (string, Kind, error) {
	k, ok := bk.kinds[style]
	if !ok {
		k = KindPlain
		if st, err := bk.f.GetStyle(style); err == nil && st != nil {
			code := ""
			if st.CustomNumFmt != nil {
				code = *st.CustomNumFmt
			}
			k = classifyFormat(st.NumFmt, code)
		}
		if bk.kinds == nil {
			bk.kinds = map[int]Kind{}
		}
		bk.kinds[style] = k
	}
	if k != KindDate {
		return text, k, nil
	}
	x, err := strconv.ParseFloat(text, 64)
	if err != nil {
		return text, KindPlain, nil
	}
	if bk.date1904 == nil {
		d := false
		if p, err := bk.f.GetWorkbookProps(); err == nil && p.Date1904 != nil {
			d = *p.Date1904
		}
		bk.date1904 = &d
	}
	tm, err := excelize.ExcelDateToTime(x, *bk.date1904)
	if err != nil {
		return text, KindPlain, fmt.Errorf("%s is formatted as a date but is not one (%v)", text, err)
	}
	if tm.Hour() == 0 && tm.Minute() == 0 && tm.Second() == 0 {
		return tm.Format("2006-01-02"), KindDate, nil
	}
	return tm.Format("2006-01-02 15:04:05"), KindDate, nil
}

// classifyFormat sorts a number format into percent, date or plain. The
// built-in formats are numbered in ECMA-376 Part 1, 18.8.30 (numFmt): 9 and
// 10 are percentages; 14-22 and 45-47 dates and times (27-36 and 50-58 are
// the East Asian date formats). A custom format code is read in its first
// section, with quoted text, escaped characters and bracketed parts (colours,
// conditions, locales) set aside: a % makes it a percentage, any of the date
// and time letters y m d h s makes it a date.
func classifyFormat(id int, code string) Kind {
	switch {
	case id == 9 || id == 10:
		return KindPercent
	case id >= 14 && id <= 22, id >= 45 && id <= 47, id >= 27 && id <= 36, id >= 50 && id <= 58:
		return KindDate
	}
	if code == "" {
		return KindPlain
	}
	var b strings.Builder
	quoted, bracket := false, false
	for i := 0; i < len(code); i++ {
		c := code[i]
		switch {
		case quoted:
			quoted = c != '"'
		case bracket:
			bracket = c != ']'
		case c == '"':
			quoted = true
		case c == '[':
			bracket = true
		case c == '\\' || c == '_' || c == '*':
			i++ // the next character is shown as is, or is padding
		case c == ';':
			i = len(code)
		default:
			b.WriteByte(c)
		}
	}
	s := strings.ToLower(b.String())
	if strings.Contains(s, "%") {
		return KindPercent
	}
	if strings.ContainsAny(s, "ymdhs") && !strings.EqualFold(strings.TrimSpace(s), "general") {
		return KindDate
	}
	return KindPlain
}
