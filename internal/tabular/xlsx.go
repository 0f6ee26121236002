package tabular

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"path"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
	"peerpack/internal/yamlx"
)

// Limits that keep a hostile workbook (a "zip bomb") from exhausting
// memory: no part may inflate beyond MaxPartBytes (or the file limit, when
// lower), and all parts read together beyond the file limit
// (limits.Limits.FileBytes). The sizes are counted while inflating, not
// taken from the archive's headers, which can lie. A sheet is held in
// memory whole, so its rows x columns are capped too (SheetCells).
const (
	MaxPartBytes = 256 << 20
	maxZipParts  = 10000
	maxColumns   = 16384   // XFD, the last column Office Open XML allows
	maxRows      = 1048576 // the last row Office Open XML allows
)

// partLimit is MaxPartBytes, lowered by tests.
var partLimit int64 = MaxPartBytes

// The namespace-free element names of SpreadsheetML (ECMA-376 Part 1,
// section 18) that the reader needs.
type xlsxWorkbook struct {
	Sheets []struct {
		Name string `xml:"name,attr"`
		RID  string `xml:"id,attr"`
	} `xml:"sheets>sheet"`
}

type xlsxRels struct {
	Rels []struct {
		ID     string `xml:"Id,attr"`
		Type   string `xml:"Type,attr"`
		Target string `xml:"Target,attr"`
	} `xml:"Relationship"`
}

type xlsxBook struct {
	file      string
	data      []byte
	sheetName string
	lib       *excelize.File // opened on first need; see library
	libErr    error
	kinds     map[int]Kind // style index -> how its number format reads
	zr        *zip.Reader
	total     int64
	lim       limits.Limits
	part      int64 // the cap on one part
}

// ParseXLSX reads one sheet of an Office Open XML workbook (ECMA-376)
// into a Table: the named sheet, or the first when sheet is empty. Shared
// strings, inline strings, numbers, booleans and cached formula results are
// read here; number formats (percent, date) and formulas saved without a
// result go to excelize (xlsxformat.go). Cell "C12" is
// line 12, column 3. The first non-empty row is the header; empty rows are
// skipped; short rows are padded with empty cells.
func ParseXLSX(file string, data []byte, sheet string) (*Table, error) {
	return ParseXLSXWith(file, data, sheet, limits.Default())
}

// ParseXLSXWith is ParseXLSX with the given limits (a zero field takes its
// default).
func ParseXLSXWith(file string, data []byte, sheet string, lim limits.Limits) (*Table, error) {
	lim = lim.Or()
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		return nil, diag.At(file, 0, 0, "not a readable XLSX workbook (%v); save it again from the spreadsheet as .xlsx, or export the sheet as CSV UTF-8", err)
	}
	if len(zr.File) > maxZipParts {
		return nil, diag.At(file, 0, 0, "the workbook has %d parts, over the limit of %d", len(zr.File), maxZipParts)
	}
	bk := &xlsxBook{file: file, data: data, zr: zr, lim: lim, part: min(partLimit, lim.FileBytes)}
	wbPath := "xl/workbook.xml"
	if rels, err := bk.rels("_rels/.rels"); err == nil {
		for _, r := range rels.Rels {
			if strings.HasSuffix(r.Type, "/officeDocument") {
				wbPath = strings.TrimPrefix(r.Target, "/")
			}
		}
	}
	var wb xlsxWorkbook
	if err := bk.decode(wbPath, &wb); err != nil {
		return nil, err
	}
	if len(wb.Sheets) == 0 {
		return nil, diag.At(file, 0, 0, "the workbook has no sheets")
	}
	idx := 0
	if sheet != "" {
		idx = -1
		names := make([]string, len(wb.Sheets))
		for i, s := range wb.Sheets {
			names[i] = s.Name
			if s.Name == sheet {
				idx = i
			}
		}
		if idx < 0 {
			msg := fmt.Sprintf("the workbook has no sheet named %q", sheet)
			if s := yamlx.Nearest(sheet, names); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			return nil, diag.At(file, 0, 0, "%s (sheets are %s)", msg, strings.Join(names, ", "))
		}
	}
	dir := path.Dir(wbPath)
	relsPath := path.Join(dir, "_rels", path.Base(wbPath)+".rels")
	rels, err := bk.rels(relsPath)
	if err != nil {
		return nil, err
	}
	target, shared := "", ""
	for _, r := range rels.Rels {
		if r.ID == wb.Sheets[idx].RID {
			target = resolve(dir, r.Target)
		}
		if strings.HasSuffix(r.Type, "/sharedStrings") {
			shared = resolve(dir, r.Target)
		}
	}
	if target == "" {
		return nil, diag.At(file, 0, 0, "the workbook names sheet %q but does not say where it is stored; save it again from the spreadsheet", wb.Sheets[idx].Name)
	}
	var sst []string
	if shared != "" {
		if sst, err = bk.sharedStrings(shared); err != nil {
			return nil, err
		}
	}
	bk.sheetName = wb.Sheets[idx].Name
	t, err := bk.sheet(target, sst)
	if bk.lib != nil {
		bk.lib.Close()
	}
	return t, err
}

func resolve(dir, target string) string {
	if strings.HasPrefix(target, "/") {
		return strings.TrimPrefix(target, "/")
	}
	return path.Clean(path.Join(dir, target))
}

// open returns a reader over one part, bounded by the size limits.
func (bk *xlsxBook) open(name string) (io.Reader, func(), error) {
	for _, f := range bk.zr.File {
		if f.Name != name {
			continue
		}
		if f.UncompressedSize64 > uint64(bk.part) {
			return nil, nil, diag.At(bk.file, 0, 0, "workbook part %s inflates to %s bytes, over the limit of %s bytes for one part; the file may be damaged or hostile: save it again from the spreadsheet, or export the sheet as CSV UTF-8", name, limits.Group(int64(min(f.UncompressedSize64, 1<<62))), limits.Group(bk.part))
		}
		rc, err := f.Open()
		if err != nil {
			return nil, nil, diag.At(bk.file, 0, 0, "cannot read workbook part %s: %v; save the workbook again", name, err)
		}
		return &limitedPart{r: rc, left: bk.part, bk: bk, name: name}, func() { rc.Close() }, nil
	}
	return nil, nil, diag.At(bk.file, 0, 0, "the workbook has no part %s; it is not a complete XLSX file, so save it again from the spreadsheet", name)
}

type limitedPart struct {
	r    io.Reader
	left int64
	bk   *xlsxBook
	name string
}

var errTooBig = errors.New("over the size limit")

func (l *limitedPart) Read(p []byte) (int, error) {
	n, err := l.r.Read(p)
	l.left -= int64(n)
	l.bk.total += int64(n)
	if l.left < 0 || l.bk.total > l.bk.lim.FileBytes {
		return n, errTooBig
	}
	return n, err
}

func (bk *xlsxBook) partErr(name string, err error) error {
	if errors.Is(err, errTooBig) {
		if bk.total > bk.lim.FileBytes {
			return diag.At(bk.file, 0, 0, "the workbook inflates to %s", bk.lim.Over(limits.FileBytes, bk.total, "the file may be damaged or hostile; export the sheet as CSV UTF-8"))
		}
		return diag.At(bk.file, 0, 0, "workbook part %s inflates beyond the limit of %s bytes for one part; the file may be damaged or hostile: save it again from the spreadsheet, or export the sheet as CSV UTF-8", name, limits.Group(bk.part))
	}
	if errors.Is(err, zip.ErrFormat) || errors.Is(err, zip.ErrChecksum) || errors.Is(err, zip.ErrAlgorithm) {
		return diag.At(bk.file, 0, 0, "workbook part %s is damaged (%v); save the workbook again from the spreadsheet", name, err)
	}
	return diag.At(bk.file, 0, 0, "workbook part %s is not well-formed XML (%v); save the workbook again from the spreadsheet", name, err)
}

func (bk *xlsxBook) decode(name string, v any) error {
	r, done, err := bk.open(name)
	if err != nil {
		return err
	}
	defer done()
	if err := xml.NewDecoder(r).Decode(v); err != nil {
		return bk.partErr(name, err)
	}
	return nil
}

func (bk *xlsxBook) rels(name string) (*xlsxRels, error) {
	var rels xlsxRels
	if err := bk.decode(name, &rels); err != nil {
		return nil, err
	}
	return &rels, nil
}

// sharedStrings reads the shared string table: each <si> is plain <t> or
// rich-text runs <r><t>, whose texts join; phonetic runs (<rPh>) are not
// part of the value (ECMA-376 Part 1, 18.4).
func (bk *xlsxBook) sharedStrings(name string) ([]string, error) {
	r, done, err := bk.open(name)
	if err != nil {
		return nil, err
	}
	defer done()
	dec := xml.NewDecoder(r)
	var out []string
	var sb strings.Builder
	inSI, inT, phonetic := false, false, 0
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, bk.partErr(name, err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			switch t.Name.Local {
			case "si":
				inSI = true
				sb.Reset()
			case "t":
				inT = true
			case "rPh":
				phonetic++
			}
		case xml.EndElement:
			switch t.Name.Local {
			case "si":
				inSI = false
				if int64(len(out)) >= bk.lim.SheetCells {
					return nil, diag.At(bk.file, 0, 0, "the workbook's shared string table has %s", bk.lim.Beyond(limits.SheetCells, "export the sheet as CSV UTF-8"))
				}
				if int64(sb.Len()) > bk.lim.CellBytes {
					return nil, diag.At(bk.file, 0, 0, "shared string %d of the workbook is %s", len(out), bk.lim.Over(limits.CellBytes, int64(sb.Len()), ""))
				}
				out = append(out, sb.String())
			case "t":
				inT = false
			case "rPh":
				phonetic--
			}
		case xml.CharData:
			if inSI && inT && phonetic == 0 {
				sb.Write(t)
			}
		}
	}
	return out, nil
}

// cellRef splits "C12" into column 3 and row 12.
func cellRef(ref string) (col, row int, ok bool) {
	i := 0
	for i < len(ref) && ref[i] >= 'A' && ref[i] <= 'Z' {
		col = col*26 + int(ref[i]-'A'+1)
		i++
		if col > maxColumns {
			return 0, 0, false
		}
	}
	if i == 0 || i == len(ref) {
		return 0, 0, false
	}
	row, err := strconv.Atoi(ref[i:])
	if err != nil || row < 1 || row > maxRows {
		return 0, 0, false
	}
	return col, row, true
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

type xlsxCell struct {
	col  int
	text string
	kind Kind
}

func (bk *xlsxBook) sheet(name string, sst []string) (*Table, error) {
	r, done, err := bk.open(name)
	if err != nil {
		return nil, err
	}
	defer done()
	dec := xml.NewDecoder(r)
	t := &Table{File: bk.file}
	var (
		rowNum, lastRow int
		cells           []xlsxCell
		inRow           bool
		cur             struct {
			ref, typ string
			col      int
			style    int
			formula  bool
			phonetic int
			v        strings.Builder
			inV, inT bool
			inIS     bool
		}
		nextCol int
	)
	var probs diag.List
	var overflow error // a limit was reached; reading stops
	flush := func() {
		if !inRow {
			return
		}
		inRow = false
		empty := true
		for _, c := range cells {
			if strings.TrimSpace(c.text) != "" {
				empty = false
			}
		}
		if empty {
			return
		}
		if t.Header == nil {
			width := 0
			for _, c := range cells {
				width = max(width, c.col)
			}
			if int64(width) > bk.lim.Columns {
				overflow = diag.At(bk.file, rowNum, 1, "the header row %d has %s", rowNum, bk.lim.Over(limits.Columns, int64(width), "delete unused columns"))
				return
			}
			t.Header = make([]Cell, width)
			for i := range t.Header {
				t.Header[i] = Cell{Line: rowNum, Col: i + 1}
			}
			for _, c := range cells {
				t.Header[c.col-1].Text = c.text
			}
			return
		}
		if int64(len(t.Rows)) >= bk.lim.Rows {
			overflow = diag.At(bk.file, rowNum, 1, "the sheet has %s", bk.lim.Beyond(limits.Rows, "split it into several files"))
			return
		}
		if int64(len(t.Rows)+1)*int64(len(t.Header)) > bk.lim.SheetCells {
			overflow = diag.At(bk.file, rowNum, 1, "the sheet has %s", bk.lim.Beyond(limits.SheetCells, "export it as CSV UTF-8, which is read row by row"))
			return
		}
		row := make([]Cell, len(t.Header))
		for i := range row {
			row[i] = Cell{Line: rowNum, Col: i + 1}
		}
		for _, c := range cells {
			if c.col > len(row) {
				if strings.TrimSpace(c.text) != "" {
					probs.Addf(bk.file, rowNum, c.col, "cell %s%d holds %q but the header row has no column %s; add a header or delete the cell", ColumnName(c.col), rowNum, c.text, ColumnName(c.col))
				}
				continue
			}
			row[c.col-1].Text = c.text
			row[c.col-1].Kind = c.kind
		}
		t.Rows = append(t.Rows, row)
	}
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, bk.partErr(name, err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			switch e.Name.Local {
			case "row":
				flush()
				if overflow != nil {
					return nil, overflow
				}
				inRow = true
				cells = cells[:0]
				nextCol = 1
				rowNum = lastRow + 1
				for _, a := range e.Attr {
					if a.Name.Local == "r" {
						if n, err := strconv.Atoi(a.Value); err == nil && n > lastRow && n <= maxRows {
							rowNum = n
						}
					}
				}
				lastRow = rowNum
			case "c":
				cur.ref, cur.typ = "", ""
				cur.style, cur.formula, cur.phonetic = 0, false, 0
				cur.v.Reset()
				cur.col = nextCol
				for _, a := range e.Attr {
					switch a.Name.Local {
					case "r":
						cur.ref = a.Value
					case "t":
						cur.typ = a.Value
					case "s":
						cur.style, _ = strconv.Atoi(a.Value)
					}
				}
				if cur.ref != "" {
					if c, _, ok := cellRef(cur.ref); ok {
						cur.col = c
					}
				}
				if cur.col > maxColumns || int64(cur.col) > bk.lim.Columns {
					return nil, diag.At(bk.file, rowNum, min(cur.col, maxColumns), "row %d has %s", rowNum, bk.lim.Over(limits.Columns, int64(min(cur.col, maxColumns)), "delete the cells beyond the last column"))
				}
			case "v":
				cur.inV = true
			case "is":
				cur.inIS = true
			case "t":
				cur.inT = true
			case "f":
				cur.formula = true
			case "rPh":
				cur.phonetic++
			}
		case xml.EndElement:
			switch e.Name.Local {
			case "row":
				flush()
				if overflow != nil {
					return nil, overflow
				}
			case "v":
				cur.inV = false
			case "is":
				cur.inIS = false
			case "t":
				cur.inT = false
			case "rPh":
				cur.phonetic--
			case "c":
				text, err := cellText(cur.typ, cur.v.String(), sst)
				if err != nil {
					probs.Addf(bk.file, rowNum, cur.col, "cell %s%d: %v", ColumnName(cur.col), rowNum, err)
				}
				kind := KindPlain
				if cur.formula && cur.v.Len() == 0 && cur.typ != "inlineStr" {
					text, err = bk.calc(ColumnName(cur.col) + strconv.Itoa(rowNum))
					if bk.libErr != nil {
						// The workbook as a whole cannot be read for
						// formulas and styles: say so once.
						return nil, diag.At(bk.file, rowNum, cur.col, "%v", bk.libErr)
					}
					if err != nil {
						probs.Add(diag.At(bk.file, rowNum, cur.col, "%v", err))
					}
				}
				if cur.style > 0 && (cur.typ == "" || cur.typ == "n") && text != "" {
					text, kind, err = bk.styled(cur.style, text)
					if bk.libErr != nil {
						return nil, diag.At(bk.file, rowNum, cur.col, "%v", bk.libErr)
					}
					if err != nil {
						probs.Add(diag.At(bk.file, rowNum, cur.col, "cell %s%d: %v", ColumnName(cur.col), rowNum, err))
					}
				}
				if int64(len(text)) > bk.lim.CellBytes {
					probs.Addf(bk.file, rowNum, cur.col, "cell %s%d is %s", ColumnName(cur.col), rowNum, bk.lim.Over(limits.CellBytes, int64(len(text)), ""))
					text = ""
				}
				if int64(len(cells)) >= bk.lim.Columns {
					// Cells that repeat a reference (r="A1" over and over)
					// never pass the column limit; count them instead.
					return nil, diag.At(bk.file, rowNum, cur.col, "row %d has %s", rowNum, bk.lim.Beyond(limits.Columns, "the workbook may be damaged: save it again from the spreadsheet"))
				}
				cells = append(cells, xlsxCell{col: cur.col, text: text, kind: kind})
				nextCol = cur.col + 1
			}
		case xml.CharData:
			// Phonetic runs (<rPh>) guide pronunciation and are not part
			// of the value (ECMA-376 Part 1, 18.4.6).
			if cur.inV || (cur.inIS && cur.inT && cur.phonetic == 0) {
				cur.v.Write(e)
			}
		}
	}
	flush()
	if overflow != nil {
		return nil, overflow
	}
	if t.Header == nil {
		probs.Addf(bk.file, 0, 0, "the sheet is empty; it needs a header row naming its columns")
		return nil, probs.Err()
	}
	return t, probs.Err()
}

// cellText turns a cell's stored value into the text a CSV would hold.
// Numbers are written in their shortest form, so 0.1 stored as
// 0.10000000000000001 reads as "0.1", as a spreadsheet shows it.
func cellText(typ, v string, sst []string) (string, error) {
	switch typ {
	case "s":
		i, err := strconv.Atoi(strings.TrimSpace(v))
		if err != nil || i < 0 || i >= len(sst) {
			return "", fmt.Errorf("shared string %q does not exist; save the workbook again", v)
		}
		return sst[i], nil
	case "b":
		switch strings.TrimSpace(v) {
		case "1":
			return "TRUE", nil
		case "0":
			return "FALSE", nil
		}
		return v, nil
	case "inlineStr", "str", "e":
		return v, nil
	}
	s := strings.TrimSpace(v)
	if s == "" {
		return "", nil
	}
	if f, err := strconv.ParseFloat(s, 64); err == nil {
		return strconv.FormatFloat(f, 'f', -1, 64), nil
	}
	return v, nil
}
