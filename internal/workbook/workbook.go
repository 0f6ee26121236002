// Package workbook writes the figures model as an XLSX workbook, one sheet
// per section of the figures file, for analysts who audit a pack in a
// spreadsheet. The workbook is written with github.com/xuri/excelize/v2's
// stream writer (rows go to the file as they come, not held as cells):
// each sheet has its header row frozen and bold, an autofilter over its
// rows, column widths from its content and number formats from each
// figure's decimals.
package workbook

import (
	"archive/zip"
	"bytes"
	"fmt"
	"io"
	"math"
	"sort"
	"strings"
	"time"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// MaxRows is the most rows one sheet holds, header included: 1,048,576
// (ECMA-376 Part 1, 18.3.1.73, and the spreadsheet applications' limit).
const MaxRows = excelize.TotalRows

// Sheet is one worksheet: a header row and data rows. A cell is a string,
// an int, a float64 or a Number; NaN floats are left empty.
type Sheet struct {
	Name   string
	Header []string
	Rows   [][]any
}

// Number is a figure with the decimals it is shown with: the cell keeps
// the full value and displays it rounded ("0.00" for 2 decimals).
type Number struct {
	Value    float64
	Decimals int
}

// Write writes the sheets as an XLSX workbook.
func Write(w io.Writer, sheets []Sheet) error {
	if len(sheets) == 0 {
		return fmt.Errorf("a workbook needs at least one sheet")
	}
	names := make([]string, len(sheets))
	seen := map[string]bool{}
	for i, s := range sheets {
		if n := len(s.Rows) + 1; n > MaxRows {
			return fmt.Errorf("the %q sheet would have %d rows, over the %d rows a spreadsheet sheet can hold; write the figures file as CSV instead (--figures)", s.Name, n, MaxRows)
		}
		n := sheetName(s.Name)
		base := n
		for k := 2; seen[strings.ToLower(n)]; k++ {
			suffix := fmt.Sprintf(" (%d)", k)
			n = truncate(base, 31-len(suffix)) + suffix
		}
		seen[strings.ToLower(n)] = true
		names[i] = n
	}
	f := excelize.NewFile()
	defer f.Close()
	st, err := newStyles(f)
	if err != nil {
		return err
	}
	for i, s := range sheets {
		if i == 0 {
			if err := f.SetSheetName("Sheet1", names[0]); err != nil {
				return err
			}
		} else if _, err := f.NewSheet(names[i]); err != nil {
			return err
		}
		if err := writeSheet(f, names[i], s, st); err != nil {
			return fmt.Errorf("the %q sheet: %w", s.Name, err)
		}
	}
	f.SetActiveSheet(0)
	var buf bytes.Buffer
	if err := f.Write(&buf); err != nil {
		return err
	}
	return reorder(w, buf.Bytes())
}

// reorder copies the package with its parts in a fixed order
// ([Content_Types].xml first, then by name) and a fixed time: excelize
// writes parts in the order of an internal map, and the figures workbook
// must be byte-identical from build to build. Parts are copied
// compressed, not inflated again.
func reorder(w io.Writer, pkg []byte) error {
	zr, err := zip.NewReader(bytes.NewReader(pkg), int64(len(pkg)))
	if err != nil {
		return err
	}
	files := append([]*zip.File(nil), zr.File...)
	sort.Slice(files, func(i, j int) bool {
		a, b := files[i].Name, files[j].Name
		if (a == "[Content_Types].xml") != (b == "[Content_Types].xml") {
			return a == "[Content_Types].xml"
		}
		return a < b
	})
	zw := zip.NewWriter(w)
	for _, f := range files {
		h := f.FileHeader
		h.Modified = fixedTime
		h.Extra = nil
		raw, err := f.OpenRaw()
		if err != nil {
			return err
		}
		dst, err := zw.CreateRaw(&h)
		if err != nil {
			return err
		}
		if _, err := io.Copy(dst, raw); err != nil {
			return err
		}
	}
	return zw.Close()
}

// fixedTime is the timestamp of every part (the zip format's earliest
// date), so identical content gives identical bytes.
var fixedTime = time.Date(1980, 1, 1, 0, 0, 0, 0, time.UTC)

type styles struct {
	header int
	number map[int]int // decimals -> style
	f      *excelize.File
}

func newStyles(f *excelize.File) (*styles, error) {
	h, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return nil, err
	}
	return &styles{header: h, number: map[int]int{}, f: f}, nil
}

// numberStyle is the style showing d decimals ("0", "0.0", "0.00", ...).
func (st *styles) numberStyle(d int) (int, error) {
	d = max(0, min(d, 10))
	if id, ok := st.number[d]; ok {
		return id, nil
	}
	code := "0"
	if d > 0 {
		code += "." + strings.Repeat("0", d)
	}
	id, err := st.f.NewStyle(&excelize.Style{CustomNumFmt: &code})
	if err != nil {
		return 0, err
	}
	st.number[d] = id
	return id, nil
}

func writeSheet(f *excelize.File, name string, s Sheet, st *styles) error {
	cols := len(s.Header)
	for _, r := range s.Rows {
		cols = max(cols, len(r))
	}
	if cols == 0 {
		cols = 1
	}
	last := ColumnName(cols-1) + fmt.Sprint(len(s.Rows)+1)
	// The filter is set on the worksheet before streaming, so the stream
	// writer carries it into the sheet it writes.
	if err := f.AutoFilter(name, "A1:"+last, nil); err != nil {
		return err
	}
	sw, err := f.NewStreamWriter(name)
	if err != nil {
		return err
	}
	// Widths: the longest text of each column in characters, plus room
	// for the filter button, between 8 and 60 (common practice, no source).
	widths := make([]int, cols)
	for i, h := range s.Header {
		widths[i] = utf8.RuneCountInString(h) + 3
	}
	for _, r := range s.Rows {
		for i, c := range r {
			widths[i] = max(widths[i], len(cellText(c)))
		}
	}
	// Set last to first: the stream writer puts each new <col> before
	// the ones it has, and spreadsheet applications expect them in
	// ascending order (ECMA-376 Part 1, 18.3.1.13).
	for i := len(widths) - 1; i >= 0; i-- {
		if err := sw.SetColWidth(i+1, i+1, float64(max(8, min(widths[i]+1, 60)))); err != nil {
			return err
		}
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft",
		Selection: []excelize.Selection{{SQRef: "A2", ActiveCell: "A2", Pane: "bottomLeft"}}}); err != nil {
		return err
	}
	hdr := make([]any, len(s.Header))
	for i, h := range s.Header {
		hdr[i] = excelize.Cell{StyleID: st.header, Value: h}
	}
	if err := sw.SetRow("A1", hdr); err != nil {
		return err
	}
	vals := make([]any, cols)
	for ri, r := range s.Rows {
		for i := range vals {
			vals[i] = nil
		}
		for i, c := range r {
			switch v := c.(type) {
			case float64:
				if !math.IsNaN(v) && !math.IsInf(v, 0) {
					vals[i] = v
				}
			case Number:
				if math.IsNaN(v.Value) || math.IsInf(v.Value, 0) {
					continue
				}
				id, err := st.numberStyle(v.Decimals)
				if err != nil {
					return err
				}
				vals[i] = excelize.Cell{StyleID: id, Value: v.Value}
			case string:
				if v != "" {
					vals[i] = clean(v)
				}
			case int:
				vals[i] = v
			default:
				vals[i] = clean(fmt.Sprint(v))
			}
		}
		if err := sw.SetRow(fmt.Sprintf("A%d", ri+2), vals); err != nil {
			return err
		}
	}
	return sw.Flush()
}

func cellText(c any) string {
	switch v := c.(type) {
	case string:
		return v
	case Number:
		return fmt.Sprintf("%.*f", max(0, min(v.Decimals, 10)), v.Value)
	case float64:
		return fmt.Sprint(v)
	}
	return fmt.Sprint(c)
}

// clean drops the control characters XML 1.0 does not allow.
func clean(s string) string {
	return strings.Map(func(r rune) rune {
		if r < 0x20 && r != '\t' && r != '\n' && r != '\r' {
			return -1
		}
		return r
	}, s)
}

// sheetName makes a valid sheet name: at most 31 characters, none of
// []:*?/\ (ECMA-376 and spreadsheet practice).
func sheetName(s string) string {
	s = strings.Map(func(r rune) rune {
		if strings.ContainsRune(`[]:*?/\`, r) {
			return '_'
		}
		return r
	}, s)
	s = strings.Trim(s, "'")
	if s == "" {
		s = "Sheet"
	}
	return truncate(s, 31)
}

func truncate(s string, n int) string {
	r := []rune(s)
	if len(r) > n {
		return string(r[:n])
	}
	return s
}

// ColumnName is the spreadsheet column letter of a 0-based index: 0 is A,
// 25 is Z, 26 is AA, 701 is ZZ, 702 is AAA (bijective base 26).
func ColumnName(i int) string {
	var out []byte
	for i++; i > 0; i = (i - 1) / 26 {
		out = append([]byte{byte('A' + (i-1)%26)}, out...)
	}
	return string(out)
}
