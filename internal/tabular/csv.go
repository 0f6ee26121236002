package tabular

import (
	"bytes"
	"encoding/binary"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"
	"unsafe"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// CSVReader reads comma-separated values as RFC 4180 ("Common Format and
// MIME Type for Comma-Separated Values (CSV) Files", 2005) defines them:
// fields separated by commas, records by line breaks (CRLF, and also the
// bare LF most tools write), fields optionally enclosed in double quotes,
// a quote inside a quoted field written twice, and commas and line breaks
// allowed inside quoted fields. Spaces are part of a field (RFC 4180 section
// 2.4). Beyond the RFC: a UTF-8 byte-order mark is skipped, wholly empty
// lines are skipped, and the bytes must be UTF-8.
type CSVReader struct {
	file   string
	data   string
	pos    int
	line   int
	col    int // character column of pos, 1-based
	header []Cell
	row    []Cell
	done   bool
	// failed is set when a problem stopped the file (done, not at its end).
	failed bool
	buf    []byte
	lim    limits.Limits
	rows   int64
	// plain is set on the parts Split makes: their data holds no double
	// quote, so a record is a line cut at its commas (recordPlain).
	// ascii is set when the data is also all ASCII, where a character
	// column is a byte offset.
	plain, ascii bool
	// simple is set on parts that are also free of carriage returns,
	// where NextSimple reads most lines.
	simple bool
	// release is the chunk a streamed part reads (Stream.Release).
	release []byte
}

// NewCSV checks the encoding of data, reads its header and returns a reader
// positioned on the first data row. data must not be modified afterwards:
// cells refer into it.
func NewCSV(file string, data []byte) (*CSVReader, error) {
	return NewCSVWith(file, data, limits.Default())
}

// NewCSVWith is NewCSV with limits on rows, columns and field length (a
// zero field takes its default). Going over one stops the file: a field
// longer than the limit is most often a stray quote that joined many lines.
func NewCSVWith(file string, data []byte, lim limits.Limits) (*CSVReader, error) {
	lim = lim.Or()
	if bytes.HasPrefix(data, []byte{0xFF, 0xFE}) || bytes.HasPrefix(data, []byte{0xFE, 0xFF}) {
		return nil, diag.At(file, 1, 1, "the file is UTF-16 encoded; save it as UTF-8 (in a spreadsheet: \"CSV UTF-8 (comma delimited)\")")
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	if !validUTF8(data) {
		return nil, encodingProblem(file, data)
	}
	r := &CSVReader{file: file, line: 1, col: 1, lim: lim}
	if len(data) > 0 {
		r.data = unsafe.String(&data[0], len(data))
	}
	hdr, err := r.record()
	if err == io.EOF {
		return nil, diag.At(file, 1, 1, "the file is empty; it needs a header row naming its columns")
	}
	if err != nil {
		return nil, err
	}
	r.header = append([]Cell(nil), hdr...)
	if err := checkDelimiter(file, r.header); err != nil {
		return nil, err
	}
	return r, nil
}

// encodingProblem names the first byte that is not UTF-8. A byte of 0xA0
// or above on its own is almost always Latin-1 (ISO 8859-1) or
// Windows-1252 text, so the message shows the character it would be.
func encodingProblem(file string, data []byte) error {
	return encodingProblemAt(file, data, 1)
}

// encodingProblemAt is encodingProblem for data starting at line first.
func encodingProblemAt(file string, data []byte, first int) error {
	off := 0
	for off < len(data) {
		r, n := utf8.DecodeRune(data[off:])
		if r == utf8.RuneError && n == 1 {
			break
		}
		off += n
	}
	lineStart := bytes.LastIndexByte(data[:off], '\n') + 1
	line := first + bytes.Count(data[:off], []byte("\n"))
	col := 1 + utf8.RuneCount(data[lineStart:off])
	b := data[off]
	guess := ""
	if b >= 0xA0 {
		guess = fmt.Sprintf(" (in Latin-1 it would be %q)", string(rune(b)))
	}
	return diag.At(file, line, col, "byte 0x%02X is not valid UTF-8%s; the file looks Latin-1 or Windows-1252 encoded: save it as UTF-8 (in a spreadsheet: \"CSV UTF-8 (comma delimited)\")", b, guess)
}

// checkDelimiter catches files separated by semicolons or tabs, which
// spreadsheets set to a decimal-comma locale write: the header then reads
// as a single field.
func checkDelimiter(file string, hdr []Cell) error {
	if len(hdr) != 1 {
		return nil
	}
	h := hdr[0]
	for _, d := range []struct {
		sep  string
		name string
	}{{";", "semicolons"}, {"\t", "tabs"}, {"|", "vertical bars"}} {
		if n := strings.Count(h.Text, d.sep); n > 0 {
			return diag.At(file, h.Line, h.Col, "the header has no commas but %d %s: the file looks %s-separated; peerpack reads comma-separated values (RFC 4180), so export it as \"CSV (comma delimited)\" or replace the %s with commas", n, d.name, strings.TrimSuffix(d.name, "s"), d.name)
		}
	}
	return nil
}

// File implements RowReader.
func (r *CSVReader) File() string { return r.file }

// Header implements RowReader.
func (r *CSVReader) Header() []Cell { return r.header }

// Next implements RowReader. Rows with a different number of fields from
// the header are reported and skipped.
func (r *CSVReader) Next() ([]Cell, error) {
	row, err := r.record()
	if err != nil {
		return nil, err
	}
	r.rows++
	if r.rows > r.lim.Rows {
		r.done, r.failed = true, true
		return nil, diag.At(r.file, row[0].Line, row[0].Col, "the file has %s", r.lim.Beyond(limits.Rows, "split it into several files (the brief's values: takes a list)"))
	}
	if len(row) != len(r.header) {
		return nil, r.ragged(row)
	}
	return row, nil
}

func (r *CSVReader) ragged(row []Cell) error {
	first := row[0]
	hint := ""
	for _, c := range row {
		if strings.Contains(c.Text, ";") {
			hint = "; the row contains semicolons: is it separated by semicolons instead of commas?"
			break
		}
	}
	if hint == "" && len(row) > len(r.header) {
		hint = "; a value containing a comma must be enclosed in double quotes"
	}
	if hint == "" {
		hint = "; add the missing fields (leave a field empty for a missing value, but keep its comma)"
	}
	return diag.At(r.file, first.Line, first.Col, "this row has %d %s but the header has %d%s", len(row), plural(len(row), "field", "fields"), len(r.header), hint)
}

// record reads one record, skipping wholly empty lines.
func (r *CSVReader) record() ([]Cell, error) {
	if r.done {
		return nil, io.EOF
	}
	if r.plain {
		if row, ok, err := r.recordPlain(); ok {
			return row, err
		}
	}
	for {
		if r.pos >= len(r.data) {
			r.done = true
			return nil, io.EOF
		}
		// Skip an empty line.
		if c := r.data[r.pos]; c == '\n' || c == '\r' {
			r.newline()
			continue
		}
		break
	}
	r.row = r.row[:0]
	for {
		cell, end, err := r.field()
		if err != nil {
			r.done, r.failed = true, true
			return nil, err
		}
		if int64(len(cell.Text)) > r.lim.CellBytes {
			r.done, r.failed = true, true
			return nil, diag.At(r.file, cell.Line, cell.Col, "the field starting here is %s", r.lim.Over(limits.CellBytes, int64(len(cell.Text)), "if it should not be this long, look for a stray double quote that joins many lines into one field"))
		}
		if int64(len(r.row)) >= r.lim.Columns {
			r.done, r.failed = true, true
			return nil, diag.At(r.file, cell.Line, cell.Col, "line %d has %s", r.row[0].Line, r.lim.Beyond(limits.Columns, "check the separators of this line"))
		}
		r.row = append(r.row, cell)
		if end {
			return r.row, nil
		}
	}
}

// recordPlain reads one record of data without double quotes as record
// does, giving the same cells, positions and problems, but a line at a
// time: the line's end and each comma are found with a byte search, and in
// ASCII data a column is the byte offset. ok is false, with nothing read,
// for a line that holds a lone CR (a line break of its own) or, in data
// that is not all ASCII, a multi-byte character; record then reads it.
func (r *CSVReader) recordPlain() (row []Cell, ok bool, err error) {
	d := r.data
	for r.pos < len(d) && (d[r.pos] == '\n' || d[r.pos] == '\r') {
		r.newline()
	}
	if r.pos >= len(d) {
		r.done = true
		return nil, true, io.EOF
	}
	start := r.pos
	end := strings.IndexByte(d[start:], '\n')
	next := 0 // where the next line starts; 0: the data ends with this line
	if end < 0 {
		end = len(d)
	} else {
		end += start
		next = end + 1
	}
	text := end
	if i := strings.IndexByte(d[start:end], '\r'); i >= 0 {
		if start+i != end-1 || next == 0 {
			return nil, false, nil // a lone CR ends a record too
		}
		text = end - 1 // CRLF
	}
	if !r.ascii && !isASCII(d[start:text]) {
		return nil, false, nil
	}
	r.row = r.row[:0]
	at := start
	for {
		cell := Cell{Line: r.line, Col: 1 + at - start}
		j := strings.IndexByte(d[at:text], ',')
		last := j < 0
		if last {
			cell.Text = d[at:text]
		} else {
			cell.Text = d[at : at+j]
		}
		if int64(len(cell.Text)) > r.lim.CellBytes {
			r.done, r.failed = true, true
			return nil, true, diag.At(r.file, cell.Line, cell.Col, "the field starting here is %s", r.lim.Over(limits.CellBytes, int64(len(cell.Text)), "if it should not be this long, look for a stray double quote that joins many lines into one field"))
		}
		if int64(len(r.row)) >= r.lim.Columns {
			r.done, r.failed = true, true
			return nil, true, diag.At(r.file, cell.Line, cell.Col, "line %d has %s", r.row[0].Line, r.lim.Beyond(limits.Columns, "check the separators of this line"))
		}
		r.row = append(r.row, cell)
		if last {
			break
		}
		at += j + 1
	}
	if next == 0 {
		r.pos, r.col = text, 1+text-start
	} else {
		r.pos, r.line, r.col = next, r.line+1, 1
	}
	return r.row, true, nil
}

// isASCII reports whether s holds only bytes below 0x80, eight at a time.
func isASCII(s string) bool {
	i := 0
	for ; i+8 <= len(s); i += 8 {
		if binary.LittleEndian.Uint64(unsafe.Slice(unsafe.StringData(s[i:]), 8))&0x8080808080808080 != 0 {
			return false
		}
	}
	for ; i < len(s); i++ {
		if s[i] >= utf8.RuneSelf {
			return false
		}
	}
	return true
}

// newline consumes a line break (CRLF, LF or a lone CR) at pos.
func (r *CSVReader) newline() {
	if r.data[r.pos] == '\r' && r.pos+1 < len(r.data) && r.data[r.pos+1] == '\n' {
		r.pos++
	}
	r.pos++
	r.line++
	r.col = 1
}

// field reads one field; end reports that it closed the record.
func (r *CSVReader) field() (Cell, bool, error) {
	cell := Cell{Line: r.line, Col: r.col}
	d := r.data
	if r.pos < len(d) && d[r.pos] == '"' {
		return r.quoted(cell)
	}
	start := r.pos
	for r.pos < len(d) {
		c := d[r.pos]
		switch c {
		case ',':
			cell.Text = d[start:r.pos]
			r.pos++
			r.col++
			return cell, false, nil
		case '\n', '\r':
			cell.Text = d[start:r.pos]
			r.newline()
			return cell, true, nil
		case '"':
			return cell, true, diag.At(r.file, r.line, r.col, "a double quote inside an unquoted field; enclose the whole field in double quotes and write the quote twice (\"\"), as RFC 4180 section 2.5-2.7 requires")
		}
		if c&0xC0 != 0x80 {
			r.col++
		}
		r.pos++
	}
	cell.Text = d[start:r.pos]
	return cell, true, nil
}

func (r *CSVReader) quoted(cell Cell) (Cell, bool, error) {
	d := r.data
	r.pos++ // opening quote
	r.col++
	start := r.pos
	escaped := false
	for {
		if r.pos >= len(d) {
			return cell, true, diag.At(r.file, cell.Line, cell.Col, "the quoted field opened here is never closed; add the closing double quote")
		}
		c := d[r.pos]
		if c == '"' {
			if r.pos+1 < len(d) && d[r.pos+1] == '"' {
				escaped = true
				r.pos += 2
				r.col += 2
				continue
			}
			break
		}
		if c == '\n' || (c == '\r' && !(r.pos+1 < len(d) && d[r.pos+1] == '\n')) {
			r.pos++
			r.line++
			r.col = 1
			continue
		}
		if c&0xC0 != 0x80 {
			r.col++
		}
		r.pos++
	}
	text := d[start:r.pos]
	if escaped {
		r.buf = r.buf[:0]
		for i := 0; i < len(text); i++ {
			r.buf = append(r.buf, text[i])
			if text[i] == '"' {
				i++
			}
		}
		text = string(r.buf)
	}
	if strings.Contains(text, "\r\n") {
		text = strings.ReplaceAll(text, "\r\n", "\n")
	}
	cell.Text = text
	r.pos++ // closing quote
	r.col++
	if r.pos >= len(d) {
		return cell, true, nil
	}
	switch d[r.pos] {
	case ',':
		r.pos++
		r.col++
		return cell, false, nil
	case '\n', '\r':
		r.newline()
		return cell, true, nil
	}
	return cell, true, diag.At(r.file, r.line, r.col, "unexpected text after the closing quote of a field that began at line %d, column %d; a quote inside a quoted field is written twice (\"\"), and a comma must follow the closing quote (RFC 4180 section 2.7)", cell.Line, cell.Col)
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
