package records

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"unicode/utf8"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// source yields the rows of a record file one at a time, so that a file of
// tens of millions of rows never sits in memory. Fields returned by next are
// valid until the following call.
type source interface {
	// header returns the column names as written.
	header() []string
	// next returns the next data row and its line (CSV) or row number
	// (Parquet); io.EOF at the end.
	next() ([][]byte, int, error)
	// name is the file name for messages.
	name() string
}

// maxLine caps one CSV record (a paper row lists its fields, institutions
// and countries; 1 MiB is far beyond any real one) so that a file without
// line breaks cannot take the memory.
const maxLine = 1 << 20

// csvSource reads RFC 4180 CSV as a stream. A line without a double quote
// (nearly every line of an export) is split in place with no copying; a
// quoted field, doubled quotes and line breaks inside quotes are handled on
// a copy.
type csvSource struct {
	file    string
	r       *bufio.Reader
	lim     limits.Limits
	maxRows int64 // limits.RecordRows, read once: a lookup per row would cost more than the row
	maxRead int64 // limits.RecordBytes
	hdr     []string
	fields  [][]byte
	buf     []byte
	line    int // physical line last read
	rows    int64
	read    int64
	started bool
}

func newCSVSource(file string, r io.Reader, lim limits.Limits) (*csvSource, error) {
	s := &csvSource{file: file, r: bufio.NewReaderSize(r, 1<<20), lim: lim,
		maxRows: lim.Get(limits.RecordRows), maxRead: lim.Get(limits.RecordBytes)}
	row, line, err := s.record()
	if err == io.EOF {
		return nil, diag.At(file, 1, 1, "the file is empty; a record file starts with a header row naming its columns")
	}
	if err != nil {
		return nil, err
	}
	for i, f := range row {
		if !utf8.Valid(f) {
			return nil, diag.At(file, line, i+1, "the header is not UTF-8 text; save the file as UTF-8")
		}
		s.hdr = append(s.hdr, string(bytes.TrimSpace(f)))
	}
	if len(s.hdr) == 1 && (bytes.IndexByte(row[0], ';') >= 0 || bytes.IndexByte(row[0], '\t') >= 0) {
		return nil, diag.At(file, line, 1, "the header has no commas but has semicolons or tabs; record files are comma-separated (lists inside a field are separated by semicolons)")
	}
	return s, nil
}

func (s *csvSource) header() []string { return s.hdr }
func (s *csvSource) name() string     { return s.file }

func (s *csvSource) next() ([][]byte, int, error) {
	row, line, err := s.record()
	if err != nil {
		return nil, line, err
	}
	s.rows++
	if s.rows > s.maxRows {
		return nil, line, diag.At(s.file, line, 1, "the file has %s", s.lim.Beyond(limits.RecordRows, "split the file"))
	}
	if len(row) != len(s.hdr) {
		return nil, line, diag.At(s.file, line, 1, "this row has %d fields but the header has %d; quote fields that contain commas", len(row), len(s.hdr))
	}
	return row, line, nil
}

// readLine returns the next physical line without its line break.
func (s *csvSource) readLine() ([]byte, error) {
	b, err := s.r.ReadSlice('\n')
	if errors.Is(err, bufio.ErrBufferFull) {
		s.buf = append(s.buf[:0], b...)
		for errors.Is(err, bufio.ErrBufferFull) {
			if len(s.buf) > maxLine {
				return nil, diag.At(s.file, s.line+1, 1, "a line longer than %d bytes; is this a CSV file with line breaks?", maxLine)
			}
			b, err = s.r.ReadSlice('\n')
			s.buf = append(s.buf, b...)
		}
		b = s.buf
	}
	if len(b) == 0 && err != nil {
		return nil, err
	}
	if err != nil && err != io.EOF {
		return nil, diag.At(s.file, s.line+1, 1, "cannot read the file: %v", err)
	}
	s.line++
	s.read += int64(len(b))
	if s.read > s.maxRead {
		return nil, diag.At(s.file, s.line, 1, "the file is %s", s.lim.Beyond(limits.RecordBytes, "split the file"))
	}
	if !s.started {
		s.started = true
		b = bytes.TrimPrefix(b, []byte("\xef\xbb\xbf"))
	}
	b = bytes.TrimSuffix(b, []byte{'\n'})
	b = bytes.TrimSuffix(b, []byte{'\r'})
	return b, nil
}

// record returns the next non-empty record and the line it starts on.
func (s *csvSource) record() ([][]byte, int, error) {
	for {
		b, err := s.readLine()
		if err != nil {
			return nil, s.line, err
		}
		if len(b) == 0 {
			continue
		}
		start := s.line
		if bytes.IndexByte(b, '"') < 0 {
			s.fields = s.fields[:0]
			for {
				i := bytes.IndexByte(b, ',')
				if i < 0 {
					s.fields = append(s.fields, b)
					break
				}
				s.fields = append(s.fields, b[:i])
				b = b[i+1:]
			}
			return s.fields, start, nil
		}
		row, err := s.quoted(b, start)
		return row, start, err
	}
}

// quoted splits a record holding double quotes (RFC 4180 section 2: a
// quoted field may hold commas, line breaks and doubled quotes).
func (s *csvSource) quoted(first []byte, start int) ([][]byte, error) {
	out := make([]byte, 0, len(first)+16)
	var ends []int
	b := append([]byte(nil), first...)
	i := 0
	inQuotes := false
	fieldStart := true
	for {
		for i < len(b) {
			c := b[i]
			switch {
			case inQuotes && c == '"' && i+1 < len(b) && b[i+1] == '"':
				out = append(out, '"')
				i += 2
				continue
			case inQuotes && c == '"':
				inQuotes = false
				if i+1 < len(b) && b[i+1] != ',' {
					return nil, diag.At(s.file, s.line, i+2, "a quoted field must end at a comma or the end of the line; double a quote inside a quoted field (\"\")")
				}
			case !inQuotes && c == '"' && fieldStart:
				inQuotes = true
			case !inQuotes && c == '"':
				return nil, diag.At(s.file, s.line, i+1, "a quote inside an unquoted field; quote the whole field and double the quote (\"\")")
			case !inQuotes && c == ',':
				ends = append(ends, len(out))
				fieldStart = true
				i++
				continue
			default:
				out = append(out, c)
			}
			fieldStart = false
			i++
		}
		if !inQuotes {
			break
		}
		if len(out) > maxLine {
			return nil, diag.At(s.file, start, 1, "a quoted field runs on for more than %d bytes; is a closing quote missing?", maxLine)
		}
		next, err := s.readLine()
		if err != nil {
			if err == io.EOF {
				return nil, diag.At(s.file, start, 1, "a quoted field opened on this line is never closed; add the closing quote")
			}
			return nil, err
		}
		out = append(out, '\n')
		b, i = next, 0
	}
	ends = append(ends, len(out))
	s.fields = s.fields[:0]
	prev := 0
	for _, e := range ends {
		s.fields = append(s.fields, out[prev:e])
		prev = e
	}
	return s.fields, nil
}

// columns maps lower-cased header names to their index.
func columns(hdr []string) map[string]int {
	m := make(map[string]int, len(hdr))
	for i, h := range hdr {
		m[lower(h)] = i
	}
	return m
}

func lower(s string) string {
	b := []byte(s)
	for i, c := range b {
		if 'A' <= c && c <= 'Z' {
			b[i] = c + 'a' - 'A'
		}
	}
	return string(b)
}

// fieldError positions a problem at a field of a row.
func fieldError(src source, line, col int, format string, args ...any) error {
	return diag.At(src.name(), line, col+1, "%s", fmt.Sprintf(format, args...))
}
