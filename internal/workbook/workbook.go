// Package workbook writes the figures model as an XLSX workbook, one sheet
// per section of the figures file, for analysts who audit a pack in a
// spreadsheet. It writes the minimal SpreadsheetML package of ECMA-376
// (Office Open XML, Part 1: the workbook, worksheets, relationships and
// content types) with inline strings, using only archive/zip and
// encoding/xml, and it is deterministic: entries are written in a fixed
// order with a fixed timestamp.
package workbook

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"strconv"
	"strings"
	"time"
)

// Sheet is one worksheet: a header row and data rows. A cell is a string
// or a float64; NaN floats are left empty.
type Sheet struct {
	Name   string
	Header []string
	Rows   [][]any
}

// fixedTime is the timestamp of every zip entry (the zip format's earliest
// date), so identical content gives identical bytes.
var fixedTime = time.Date(1980, 1, 1, 0, 0, 0, 0, time.UTC)

// Write writes the sheets as an XLSX workbook.
func Write(w io.Writer, sheets []Sheet) error {
	if len(sheets) == 0 {
		return fmt.Errorf("a workbook needs at least one sheet")
	}
	names := make([]string, len(sheets))
	seen := map[string]bool{}
	for i, s := range sheets {
		n := sheetName(s.Name)
		base := n
		for k := 2; seen[n]; k++ {
			suffix := fmt.Sprintf(" (%d)", k)
			n = truncate(base, 31-len(suffix)) + suffix
		}
		seen[n] = true
		names[i] = n
	}
	zw := zip.NewWriter(w)
	add := func(name string, body []byte) error {
		f, err := zw.CreateHeader(&zip.FileHeader{Name: name, Method: zip.Deflate, Modified: fixedTime})
		if err != nil {
			return err
		}
		_, err = f.Write(body)
		return err
	}
	if err := add("[Content_Types].xml", contentTypes(len(sheets))); err != nil {
		return err
	}
	if err := add("_rels/.rels", []byte(xml.Header+`<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>`)); err != nil {
		return err
	}
	if err := add("xl/workbook.xml", workbookXML(names)); err != nil {
		return err
	}
	if err := add("xl/_rels/workbook.xml.rels", workbookRels(len(sheets))); err != nil {
		return err
	}
	for i, s := range sheets {
		if err := add(fmt.Sprintf("xl/worksheets/sheet%d.xml", i+1), sheetXML(s)); err != nil {
			return err
		}
	}
	return zw.Close()
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

func contentTypes(n int) []byte {
	var b bytes.Buffer
	b.WriteString(xml.Header)
	b.WriteString(`<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">`)
	b.WriteString(`<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>`)
	b.WriteString(`<Default Extension="xml" ContentType="application/xml"/>`)
	b.WriteString(`<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>`)
	for i := 1; i <= n; i++ {
		fmt.Fprintf(&b, `<Override PartName="/xl/worksheets/sheet%d.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>`, i)
	}
	b.WriteString(`</Types>`)
	return b.Bytes()
}

func workbookXML(names []string) []byte {
	var b bytes.Buffer
	b.WriteString(xml.Header)
	b.WriteString(`<workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets>`)
	for i, n := range names {
		fmt.Fprintf(&b, `<sheet name="%s" sheetId="%d" r:id="rId%d"/>`, esc(n), i+1, i+1)
	}
	b.WriteString(`</sheets></workbook>`)
	return b.Bytes()
}

func workbookRels(n int) []byte {
	var b bytes.Buffer
	b.WriteString(xml.Header)
	b.WriteString(`<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">`)
	for i := 1; i <= n; i++ {
		fmt.Fprintf(&b, `<Relationship Id="rId%d" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet%d.xml"/>`, i, i)
	}
	b.WriteString(`</Relationships>`)
	return b.Bytes()
}

func sheetXML(s Sheet) []byte {
	var b bytes.Buffer
	b.WriteString(xml.Header)
	b.WriteString(`<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>`)
	row := 1
	writeRow := func(cells []any) {
		fmt.Fprintf(&b, `<row r="%d">`, row)
		for i, c := range cells {
			ref := ColumnName(i) + strconv.Itoa(row)
			switch v := c.(type) {
			case float64:
				if v != v { // NaN: leave the cell out
					continue
				}
				fmt.Fprintf(&b, `<c r="%s"><v>%s</v></c>`, ref, strconv.FormatFloat(v, 'g', -1, 64))
			case int:
				fmt.Fprintf(&b, `<c r="%s"><v>%d</v></c>`, ref, v)
			case string:
				if v == "" {
					continue
				}
				fmt.Fprintf(&b, `<c r="%s" t="inlineStr"><is><t xml:space="preserve">%s</t></is></c>`, ref, esc(v))
			default:
				fmt.Fprintf(&b, `<c r="%s" t="inlineStr"><is><t>%s</t></is></c>`, ref, esc(fmt.Sprint(v)))
			}
		}
		b.WriteString(`</row>`)
		row++
	}
	hdr := make([]any, len(s.Header))
	for i, h := range s.Header {
		hdr[i] = h
	}
	writeRow(hdr)
	for _, r := range s.Rows {
		writeRow(r)
	}
	b.WriteString(`</sheetData></worksheet>`)
	return b.Bytes()
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

func esc(s string) string {
	var b strings.Builder
	for _, r := range s {
		// XML 1.0 allows only these control characters.
		if r < 0x20 && r != '\t' && r != '\n' && r != '\r' {
			continue
		}
		switch r {
		case '&':
			b.WriteString("&amp;")
		case '<':
			b.WriteString("&lt;")
		case '>':
			b.WriteString("&gt;")
		case '"':
			b.WriteString("&quot;")
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}
