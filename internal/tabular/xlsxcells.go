package tabular

import (
	"bytes"
	"encoding/xml"
	"io"
	"path"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// The cell scanner: the one hand-written piece of the workbook reader.
//
// excelize's row reader (File.Rows, Rows.Columns) gives each cell's value
// as text and nothing else, while reading a workbook right needs three more
// things of every cell: its type (a boolean is stored as 1 or 0, a shared
// string as an index), its style (a percentage and a date are numbers that
// only their number format tells apart) and whether it holds a formula
// (one saved without its result reads as empty). excelize's per-cell
// functions that say these (GetCellType, GetCellStyle, GetCellFormula)
// load the whole sheet into memory with every row padded to its last cell,
// so that a few kilobytes of XML can ask for billions of cells; they are
// not safe on a workbook nobody has checked. So the scanner reads the
// sheet's XML, from the bytes excelize already inflated, beside excelize's
// row reader, row for row, and takes from each <c> element only its
// reference, type, style, stored value and formula. It follows the row
// reader's rules for numbering rows and cells, and refuses what would make
// the two disagree: rows or cells out of order. It also reports what the
// row reader passes over in silence: XML that is not well-formed, and a
// row or cell reference that is not one.

// cellAttr is what the scanner keeps of one cell.
type cellAttr struct {
	col     int
	typ     string // the t attribute: s, b, n, str, inlineStr, e, d or empty
	style   int    // the s attribute: an index into the cell formats
	formula bool   // an <f> element
	hasV    bool   // a stored value (<v>) that is not empty
	v       string // the stored value, kept for shared strings (an index)
}

type cellScanner struct {
	bk      *xlsxBook
	part    string
	dec     *xml.Decoder
	lastRow int
	nextRow int  // the number of a <row> already read, or 0
	done    bool // </sheetData> or the end of the part was reached
	cells   []cellAttr
}

func newCellScanner(bk *xlsxBook, part string, body []byte) *cellScanner {
	dec := xml.NewDecoder(bytes.NewReader(body))
	dec.CharsetReader = bk.f.CharsetReader // as excelize decodes it
	return &cellScanner{bk: bk, part: part, dec: dec}
}

func (s *cellScanner) xmlErr(err error) error {
	return diag.At(s.bk.file, 0, 0, "workbook part %s is not well-formed XML (%v); save the workbook again from the spreadsheet", s.part, err)
}

// next returns the number of the next <row> and its cells, in order;
// io.EOF after the last. The slice is reused by the next call.
func (s *cellScanner) next() (int, []cellAttr, error) {
	for s.nextRow == 0 {
		if s.done {
			return 0, nil, io.EOF
		}
		tok, err := s.dec.Token()
		if err == io.EOF {
			return 0, nil, io.EOF
		}
		if err != nil {
			return 0, nil, s.xmlErr(err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			if e.Name.Local == "row" {
				if err := s.startRow(e); err != nil {
					return 0, nil, err
				}
			}
		case xml.EndElement:
			if e.Name.Local == "sheetData" {
				s.done = true
			}
		}
	}
	row := s.nextRow
	s.nextRow = 0
	s.cells = s.cells[:0]
	lim := s.bk.lim
	for !s.done && s.nextRow == 0 {
		tok, err := s.dec.Token()
		if err == io.EOF {
			s.done = true
			break
		}
		if err != nil {
			return 0, nil, s.xmlErr(err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			switch e.Name.Local {
			case "row":
				if err := s.startRow(e); err != nil {
					return 0, nil, err
				}
			case "c":
				prev := 0
				if n := len(s.cells); n > 0 {
					prev = s.cells[n-1].col
				}
				c, err := s.cell(e, row, prev)
				if err != nil {
					return 0, nil, err
				}
				if c.col > maxColumns || int64(c.col) > lim.Columns {
					return 0, nil, diag.At(s.bk.file, row, min(c.col, maxColumns), "row %d has %s", row, lim.Over(limits.Columns, int64(min(c.col, maxColumns)), "delete the cells beyond the last column"))
				}
				if int64(len(s.cells)) >= lim.Columns {
					// Cells that repeat a reference (r="A1" over and over)
					// never pass the column limit; count them instead.
					return 0, nil, diag.At(s.bk.file, row, c.col, "row %d has %s", row, lim.Beyond(limits.Columns, "the workbook may be damaged: save it again from the spreadsheet"))
				}
				s.cells = append(s.cells, c)
			}
		case xml.EndElement:
			if e.Name.Local == "sheetData" {
				s.done = true
			}
		}
	}
	for i := 1; i < len(s.cells); i++ {
		if a, b := s.cells[i-1].col, s.cells[i].col; b <= a {
			return 0, nil, diag.At(s.bk.file, row, b, "cell %s%d comes after cell %s%d; the cells of a row must be in order, so the workbook may be damaged: save it again from the spreadsheet", ColumnName(b), row, ColumnName(a), row)
		}
	}
	return row, s.cells, nil
}

// startRow takes a <row>'s number: its r attribute, or the next after the
// last (also for r="0", as excelize reads it).
func (s *cellScanner) startRow(e xml.StartElement) error {
	n := s.lastRow + 1
	for _, a := range e.Attr {
		if a.Name.Local != "r" {
			continue
		}
		v, err := strconv.Atoi(a.Value)
		switch {
		case err != nil || v < 0 || v > maxRows:
			return diag.At(s.bk.file, s.lastRow+1, 0, "the row after row %d is numbered %q, which is not a row number from 1 to 1,048,576; the workbook may be damaged: save it again from the spreadsheet", s.lastRow, a.Value)
		case v == 0:
			n = s.lastRow + 1
		case v <= s.lastRow:
			return diag.At(s.bk.file, v, 0, "row %d comes after row %d; the rows of a sheet must be in order, so the workbook may be damaged: save it again from the spreadsheet", v, s.lastRow)
		default:
			n = v
		}
	}
	if n > maxRows {
		return diag.At(s.bk.file, maxRows, 0, "the sheet has rows beyond row 1,048,576, the last a workbook may have; the workbook may be damaged: save it again from the spreadsheet")
	}
	s.lastRow, s.nextRow = n, n
	return nil
}

// cell reads one <c> element through its end, as excelize's row reader
// does: the cell ends at the first end tag of its own name; <v>, <f> and
// <is> are read whole wherever they stand inside it.
func (s *cellScanner) cell(start xml.StartElement, row, prev int) (cellAttr, error) {
	c := cellAttr{col: prev + 1}
	for _, a := range start.Attr {
		switch a.Name.Local {
		case "r":
			col, _, err := excelize.CellNameToCoordinates(a.Value)
			if err != nil {
				return c, diag.At(s.bk.file, row, prev+1, "a cell of row %d has the reference %q, which is not a cell reference such as C12; the workbook may be damaged: save it again from the spreadsheet", row, a.Value)
			}
			c.col = col
		case "t":
			c.typ = a.Value
		case "s":
			v, err := strconv.ParseInt(a.Value, 10, 64)
			if err != nil {
				return c, diag.At(s.bk.file, row, c.col, "a cell of row %d has the style %q, which is not a number; the workbook may be damaged: save it again from the spreadsheet", row, a.Value)
			}
			c.style = int(min(max(v, -1), 1<<30))
		}
	}
	for {
		tok, err := s.dec.Token()
		if err != nil {
			if err == io.EOF {
				err = io.ErrUnexpectedEOF
			}
			return c, s.xmlErr(err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			switch e.Name.Local {
			case "v":
				v, err := s.text()
				if err != nil {
					return c, s.xmlErr(err)
				}
				c.hasV = v != ""
				if c.typ == "s" {
					c.v = v
				}
			case "f":
				c.formula = true
				if err := s.dec.Skip(); err != nil {
					return c, s.xmlErr(err)
				}
			case "is":
				if err := s.dec.Skip(); err != nil {
					return c, s.xmlErr(err)
				}
			}
		case xml.EndElement:
			if e.Name == start.Name {
				return c, nil
			}
		}
	}
}

// text reads an element's own character data through its end tag, as
// encoding/xml's DecodeElement into a string does (nested elements are
// skipped), without reflection.
func (s *cellScanner) text() (string, error) {
	var b []byte
	for {
		tok, err := s.dec.Token()
		if err != nil {
			if err == io.EOF {
				err = io.ErrUnexpectedEOF
			}
			return "", err
		}
		switch e := tok.(type) {
		case xml.CharData:
			b = append(b, e...)
		case xml.StartElement:
			if err := s.dec.Skip(); err != nil {
				return "", err
			}
		case xml.EndElement:
			return string(b), nil
		}
	}
}

// xlsxRels is a relationships part (ECMA-376 Part 2, 9.3).
type xlsxRels struct {
	Rels []struct {
		ID     string `xml:"Id,attr"`
		Type   string `xml:"Type,attr"`
		Target string `xml:"Target,attr"`
	} `xml:"Relationship"`
}

func (bk *xlsxBook) rels(name string) xlsxRels {
	var r xlsxRels
	if v, ok := bk.f.Pkg.Load(name); ok {
		b, _ := v.([]byte)
		_ = xml.Unmarshal(b, &r) // a broken part names no parts, as for excelize
	}
	return r
}

// sheetPart is the part that holds the sheet, found as excelize finds it
// (the package's relationships to the workbook, the workbook's to its
// sheets), so that the scanner reads the part excelize's row reader reads.
func (bk *xlsxBook) sheetPart() (string, bool) {
	wb := ""
	for _, r := range bk.rels("_rels/.rels").Rels {
		if r.Type == excelize.SourceRelationshipOfficeDocument || r.Type == excelize.StrictSourceRelationshipOfficeDocument {
			wb = strings.TrimPrefix(r.Target, "/")
			break
		}
	}
	relsPath := "_rels/" + path.Base(wb) + ".rels"
	if dir := path.Dir(wb); dir != "." {
		relsPath = strings.TrimPrefix(dir+"/_rels/"+path.Base(wb)+".rels", "/")
	}
	id := ""
	if bk.f.WorkBook != nil {
		for _, s := range bk.f.WorkBook.Sheets.Sheet {
			if s.Name == bk.sheet {
				id = s.ID
				break
			}
		}
	}
	found := ""
	for _, r := range bk.rels(relsPath).Rels {
		if r.ID != id || id == "" {
			continue
		}
		p := strings.TrimPrefix(strings.ReplaceAll(path.Clean(path.Dir(wb)+"/"+r.Target), "\\", "/"), "/")
		if strings.HasPrefix(r.Target, "/") {
			p = strings.TrimPrefix(strings.ReplaceAll(path.Clean(r.Target), "\\", "/"), "/")
		}
		if _, ok := bk.f.Pkg.Load(p); ok {
			found = p
		}
	}
	return found, found != ""
}

// sharedStrings has excelize read the shared string table, after a cheap
// count of its entries against the sheet-cells limit (excelize decodes the
// table whole, so a table of millions of empty entries would otherwise be
// decoded before it could be refused).
func (bk *xlsxBook) sharedStrings() error {
	over := func() error {
		return diag.At(bk.file, 0, 0, "the workbook's shared string table has %s", bk.lim.Beyond(limits.SheetCells, "export the sheet as CSV UTF-8"))
	}
	if v, ok := bk.f.Pkg.Load("xl/sharedStrings.xml"); ok {
		b, _ := v.([]byte)
		n := bytes.Count(b, []byte("<si>")) + bytes.Count(b, []byte("<si/>")) + bytes.Count(b, []byte("<si "))
		if int64(n) > bk.lim.SheetCells {
			return over()
		}
	}
	// The row reader reads the table on its first row; reading an empty
	// row range of the first sheet's reader does the same here.
	rows, err := bk.f.Rows(bk.sheet)
	if err != nil {
		return diag.At(bk.file, 0, 0, "sheet %q cannot be read (%v); save the workbook again from the spreadsheet", bk.sheet, err)
	}
	_, err = rows.Columns()
	rows.Close()
	if err != nil {
		return diag.At(bk.file, 0, 0, "the workbook's shared string table cannot be read (%v); save the workbook again from the spreadsheet", err)
	}
	if bk.f.SharedStrings != nil {
		bk.sstLen = len(bk.f.SharedStrings.SI)
	}
	if int64(bk.sstLen) > bk.lim.SheetCells {
		return over()
	}
	return nil
}
