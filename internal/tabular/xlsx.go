package tabular

import (
	"archive/zip"
	"bytes"
	"fmt"
	"hash/crc32"
	"io"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
	"peerpack/internal/yamlx"
)

// Limits that keep a hostile workbook (a "zip bomb") from exhausting
// memory: no part may inflate beyond MaxPartBytes (or the file limit, when
// lower), and all parts together beyond the file limit
// (limits.Limits.FileBytes). These become excelize's UnzipXMLSizeLimit and
// UnzipSizeLimit. A sheet is held in memory whole, so its rows x columns are
// capped too (SheetCells).
const (
	MaxPartBytes = 256 << 20
	maxZipParts  = 10000
	maxColumns   = 16384   // XFD, the last column Office Open XML allows
	maxRows      = 1048576 // the last row Office Open XML allows
)

// partLimit is MaxPartBytes, lowered by tests.
var partLimit int64 = MaxPartBytes

type xlsxBook struct {
	file     string
	f        *excelize.File
	sheet    string // the sheet's name in the workbook
	lim      limits.Limits
	sstLen   int          // entries in the shared string table
	kinds    map[int]Kind // style index -> how its number format reads
	date1904 *bool        // the workbook's date system, read on first need
}

// ParseXLSX reads one sheet of an Office Open XML workbook (ECMA-376)
// into a Table: the named sheet, or the first when sheet is empty. The
// workbook is opened once, by excelize, under the project's size limits;
// its row reader gives each cell's stored value (shared, inline and rich
// strings without their phonetic runs, numbers, booleans, cached formula
// results), and a cell's number format (percent, date) and formulas saved
// without a result are read through excelize too (xlsxformat.go). Cell
// "C12" is line 12, column 3. The first non-empty row is the header; empty
// rows are skipped; short rows are padded with empty cells.
func ParseXLSX(file string, data []byte, sheet string) (*Table, error) {
	return ParseXLSXWith(file, data, sheet, limits.Default())
}

// ParseXLSXWith is ParseXLSX with the given limits (a zero field takes its
// default).
func ParseXLSXWith(file string, data []byte, sheet string, lim limits.Limits) (*Table, error) {
	lim = lim.Or()
	part := min(partLimit, lim.FileBytes)
	// The archive's directory is read here, without inflating anything, to
	// refuse a bomb by its stated sizes before excelize inflates it:
	// excelize checks only the sum of the parts (UnzipSizeLimit), reads every
	// part but the sheets and shared strings whole, and writes a sheet larger
	// than UnzipXMLSizeLimit to a temporary file instead of refusing it.
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		return nil, diag.At(file, 0, 0, "not a readable XLSX workbook (%v); save it again from the spreadsheet as .xlsx, or export the sheet as CSV UTF-8", err)
	}
	if err := checkStatedSizes(file, zr, part, lim); err != nil {
		return nil, err
	}
	f, err := excelize.OpenReader(bytes.NewReader(data), excelize.Options{
		UnzipSizeLimit:    lim.FileBytes,
		UnzipXMLSizeLimit: part,
	})
	if f != nil {
		defer f.Close()
	}
	if err != nil {
		return nil, diag.At(file, 0, 0, "the workbook cannot be read (%v); save it again from the spreadsheet, or export the sheet as CSV UTF-8", err)
	}
	if err := checkInflated(file, zr, f); err != nil {
		return nil, err
	}
	bk := &xlsxBook{file: file, f: f, lim: lim}
	names := f.GetSheetList()
	if len(names) == 0 {
		return nil, diag.At(file, 0, 0, "the workbook has no sheets")
	}
	bk.sheet = names[0]
	if sheet != "" {
		bk.sheet = ""
		for _, n := range names {
			if n == sheet {
				bk.sheet = n
			}
		}
		if bk.sheet == "" {
			msg := fmt.Sprintf("the workbook has no sheet named %q", sheet)
			if s := yamlx.Nearest(sheet, names); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			return nil, diag.At(file, 0, 0, "%s (sheets are %s)", msg, strings.Join(names, ", "))
		}
	}
	// excelize finds a sheet by its name with case ignored, as spreadsheets
	// do; two names that differ only in case would make that a guess.
	for _, n := range names {
		if n != bk.sheet && strings.EqualFold(n, bk.sheet) {
			return nil, diag.At(file, 0, 0, "the workbook has two sheets named %q and %q, which spreadsheets take for one name; rename one of them", bk.sheet, n)
		}
	}
	return bk.read()
}

// checkStatedSizes refuses a workbook whose directory states a part, or
// all parts together, larger than the limits.
func checkStatedSizes(file string, zr *zip.Reader, part int64, lim limits.Limits) error {
	if len(zr.File) > maxZipParts {
		return diag.At(file, 0, 0, "the workbook has %d parts, over the limit of %d", len(zr.File), maxZipParts)
	}
	var total uint64
	for _, zf := range zr.File {
		size := min(zf.UncompressedSize64, 1<<62)
		if size > uint64(part) {
			return diag.At(file, 0, 0, "workbook part %s would take the workbook beyond the limit of %s bytes for one part (it inflates to %s bytes); the file may be damaged or hostile: save it again from the spreadsheet, or export the sheet as CSV UTF-8", zf.Name, limits.Group(part), limits.Group(int64(size)))
		}
		total += size
		if total > uint64(lim.FileBytes) {
			return diag.At(file, 0, 0, "the workbook inflates to %s", lim.Over(limits.FileBytes, int64(total), "the file may be damaged or hostile; export the sheet as CSV UTF-8"))
		}
	}
	return nil
}

// checkInflated compares every part excelize inflated with the size and
// CRC-32 its header states. excelize does not report a part that fails to
// inflate (a header that understates the size, a wrong checksum, damaged
// data); it keeps what it could read. The check runs over the bytes already
// in memory, without inflating again.
func checkInflated(file string, zr *zip.Reader, f *excelize.File) error {
	for _, zf := range zr.File {
		if zf.FileInfo().IsDir() {
			continue
		}
		v, ok := f.Pkg.Load(pkgName(zf.Name))
		b, _ := v.([]byte)
		if !ok || uint64(len(b)) != zf.UncompressedSize64 || crc32.ChecksumIEEE(b) != zf.CRC32 {
			return diag.At(file, 0, 0, "workbook part %s is damaged (it does not inflate to the size and checksum its header states); save the workbook again from the spreadsheet", zf.Name)
		}
	}
	return nil
}

// pkgName is the name under which excelize keeps a part: backslashes made
// slashes, and two part names taken case-insensitively.
func pkgName(name string) string {
	name = strings.ReplaceAll(name, "\\", "/")
	switch strings.ToLower(name) {
	case "[content_types].xml":
		return "[Content_Types].xml"
	case "xl/sharedstrings.xml":
		return "xl/sharedStrings.xml"
	}
	return name
}

// ColumnName turns a column number into its letters (3 -> "C").
func ColumnName(col int) string {
	var b []byte
	for col > 0 {
		col--
		b = append([]byte{byte('A' + col%26)}, b...)
		col /= 26
	}
	return string(b)
}

// pending is a cell holding a formula saved without its result, computed
// once the whole sheet has been read (see read).
type pending struct {
	row  int // index into Table.Rows, -1 for the header, -2 beyond the header's columns
	attr cellAttr
	line int
}

// read streams the sheet's rows from excelize's row reader, beside the
// cell scanner (xlsxcells.go) that gives what the row reader leaves out:
// each cell's type, style and whether it holds a formula.
func (bk *xlsxBook) read() (*Table, error) {
	partName, ok := bk.sheetPart()
	if !ok {
		return nil, diag.At(bk.file, 0, 0, "the workbook names sheet %q but does not say where it is stored; save it again from the spreadsheet", bk.sheet)
	}
	if err := bk.sharedStrings(); err != nil {
		return nil, err
	}
	rows, err := bk.f.Rows(bk.sheet)
	if err != nil {
		return nil, diag.At(bk.file, 0, 0, "sheet %q cannot be read (%v); save the workbook again from the spreadsheet", bk.sheet, err)
	}
	defer rows.Close()
	raw, _ := bk.f.Pkg.Load(partName)
	body, _ := raw.([]byte)
	sc := newCellScanner(bk, partName, body)

	t := &Table{File: bk.file}
	var (
		probs   diag.List
		later   []pending
		libRow  int // the row excelize's reader is on
		vals    []string
		out     []Cell
		laidOut int64 // cells once every row is padded to its last cell
	)
	for {
		rowNum, cells, err := sc.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		for libRow < rowNum {
			if !rows.Next() {
				return nil, diag.At(bk.file, rowNum, 0, "row %d cannot be read; the workbook may be damaged: save it again from the spreadsheet", rowNum)
			}
			libRow++
			if vals, err = rows.Columns(excelize.Options{RawCellValue: true}); err != nil {
				return nil, diag.At(bk.file, rowNum, 0, "row %d cannot be read (%v); the workbook may be damaged: save it again from the spreadsheet", rowNum, err)
			}
		}
		if len(cells) > 0 {
			laidOut += int64(cells[len(cells)-1].col)
		}
		out = out[:0]
		empty := true
		var waiting []int // indexes into cells of formulas to compute later
		for i, c := range cells {
			text := ""
			if c.col <= len(vals) {
				text = vals[c.col-1]
			}
			text, err := bk.cellText(c, text)
			if err != nil {
				probs.Addf(bk.file, rowNum, c.col, "cell %s%d: %v", ColumnName(c.col), rowNum, err)
			}
			cell := Cell{Text: text, Line: rowNum, Col: c.col}
			if c.formula && !c.hasV && c.typ != "inlineStr" {
				waiting = append(waiting, i)
				empty = false
			} else {
				cell.Text, cell.Kind = bk.finish(&probs, rowNum, c, text)
			}
			if strings.TrimSpace(cell.Text) != "" {
				empty = false
			}
			out = append(out, cell)
		}
		if empty {
			continue
		}
		if t.Header == nil {
			width := 0
			if len(cells) > 0 {
				width = cells[len(cells)-1].col
			}
			if int64(width) > bk.lim.Columns {
				return nil, diag.At(bk.file, rowNum, 1, "the header row %d has %s", rowNum, bk.lim.Over(limits.Columns, int64(width), "delete unused columns"))
			}
			t.Header = make([]Cell, width)
			for i := range t.Header {
				t.Header[i] = Cell{Line: rowNum, Col: i + 1}
			}
			for _, c := range out {
				t.Header[c.Col-1].Text = c.Text
			}
			for _, i := range waiting {
				later = append(later, pending{row: -1, attr: cells[i], line: rowNum})
			}
			continue
		}
		if int64(len(t.Rows)) >= bk.lim.Rows {
			return nil, diag.At(bk.file, rowNum, 1, "the sheet has %s", bk.lim.Beyond(limits.Rows, "split it into several files"))
		}
		if int64(len(t.Rows)+1)*int64(len(t.Header)) > bk.lim.SheetCells {
			return nil, diag.At(bk.file, rowNum, 1, "the sheet has %s", bk.lim.Beyond(limits.SheetCells, "export it as CSV UTF-8, which is read row by row"))
		}
		row := make([]Cell, len(t.Header))
		for i := range row {
			row[i] = Cell{Line: rowNum, Col: i + 1}
		}
		for _, c := range out {
			if c.Col > len(row) {
				if strings.TrimSpace(c.Text) != "" {
					probs.Addf(bk.file, rowNum, c.Col, "cell %s%d holds %q but the header row has no column %s; add a header or delete the cell", ColumnName(c.Col), rowNum, c.Text, ColumnName(c.Col))
				}
				continue
			}
			row[c.Col-1] = c
		}
		for _, i := range waiting {
			p := pending{row: len(t.Rows), attr: cells[i], line: rowNum}
			if cells[i].col > len(row) {
				p.row = -2
			}
			later = append(later, p)
		}
		t.Rows = append(t.Rows, row)
	}
	if t.Header == nil {
		probs.Addf(bk.file, 0, 0, "the sheet is empty; it needs a header row naming its columns")
		return nil, probs.Err()
	}
	// Formulas saved without a result are computed once the sheet is known
	// to be within the limits, since excelize's calculation engine lays the
	// whole sheet out in memory, every row padded to its last cell.
	for _, p := range later {
		c := p.attr
		text, err := bk.calc(ColumnName(c.col)+strconv.Itoa(p.line), laidOut)
		if err != nil {
			probs.Add(diag.At(bk.file, p.line, c.col, "%v", err))
		}
		cell := Cell{Line: p.line, Col: c.col}
		cell.Text, cell.Kind = bk.finish(&probs, p.line, c, text)
		switch {
		case p.row == -2:
			if strings.TrimSpace(cell.Text) != "" {
				probs.Addf(bk.file, p.line, c.col, "cell %s%d holds %q but the header row has no column %s; add a header or delete the cell", ColumnName(c.col), p.line, cell.Text, ColumnName(c.col))
			}
		case p.row == -1:
			t.Header[c.col-1].Text = cell.Text
		default:
			t.Rows[p.row][c.col-1] = cell
		}
	}
	return t, probs.Err()
}

// cellText turns the value excelize read for a cell into the text a CSV
// would hold. Numbers are written in their shortest form, so 0.1 stored as
// 0.10000000000000001 reads as "0.1", as a spreadsheet shows it.
func (bk *xlsxBook) cellText(c cellAttr, v string) (string, error) {
	switch c.typ {
	case "s":
		// excelize reads an index outside the table as an empty cell.
		if s := strings.TrimSpace(c.v); s != "" {
			i, err := strconv.Atoi(s)
			if err != nil || i < 0 || i >= bk.sstLen {
				return "", fmt.Errorf("shared string %q does not exist; save the workbook again", c.v)
			}
		}
		return v, nil
	case "b":
		switch strings.TrimSpace(v) {
		case "1":
			return "TRUE", nil
		case "0":
			return "FALSE", nil
		}
		return v, nil
	case "", "n":
		s := strings.TrimSpace(v)
		if s == "" {
			return "", nil
		}
		if f, err := strconv.ParseFloat(s, 64); err == nil {
			return strconv.FormatFloat(f, 'f', -1, 64), nil
		}
	}
	return v, nil
}

// finish reads a numeric cell through its number format and holds its text
// to the cell limit.
func (bk *xlsxBook) finish(probs *diag.List, line int, c cellAttr, text string) (string, Kind) {
	kind := KindPlain
	if c.style > 0 && (c.typ == "" || c.typ == "n") && text != "" {
		var err error
		text, kind, err = bk.styled(c.style, text)
		if err != nil {
			probs.Add(diag.At(bk.file, line, c.col, "cell %s%d: %v", ColumnName(c.col), line, err))
		}
	}
	if int64(len(text)) > bk.lim.CellBytes {
		probs.Addf(bk.file, line, c.col, "cell %s%d is %s", ColumnName(c.col), line, bk.lim.Over(limits.CellBytes, int64(len(text)), ""))
		return "", KindPlain
	}
	return text, kind
}
