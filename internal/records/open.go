package records

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"strconv"
	"strings"

	"github.com/parquet-go/parquet-go"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// openSource opens name for one pass: Parquet when it ends in .parquet,
// else CSV.
func openSource(fsys fs.FS, name string, lim limits.Limits) (source, io.Closer, error) {
	f, err := fsys.Open(name)
	if err != nil {
		msg := err.Error()
		var pe *fs.PathError
		if errors.As(err, &pe) {
			msg = pe.Err.Error()
		}
		if errors.Is(err, fs.ErrNotExist) {
			msg = "no such file"
		}
		return nil, nil, diag.At(name, 0, 0, "cannot read the file: %s; check the path", msg)
	}
	if strings.HasSuffix(strings.ToLower(name), ".parquet") {
		src, err := openParquet(name, f, lim)
		if err != nil {
			f.Close()
			return nil, nil, err
		}
		return src, f, nil
	}
	src, err := newCSVSource(name, f, lim)
	if err != nil {
		f.Close()
		return nil, nil, err
	}
	pf := newPrefetch(src)
	return pf, prefetchCloser{pf, f}, nil
}

// parquetSource reads the rows of a flat Parquet file, each value printed
// as the CSV reader would see it (strings as they are, integers in
// decimal, floating-point in shortest form), so CSV and Parquet inputs of
// the same records give identical results.
type parquetSource struct {
	file string
	// groups are the file's row groups, read one after another through
	// rows.
	groups []parquet.RowGroup
	group  int
	rows   parquet.Rows
	hdr    []string
	buf    []parquet.Row
	n, i   int
	row    int
	lim    limits.Limits
	cells  [][]byte
	text   []byte
	// per-row scratch: where each column's text starts and ends
	starts, ends []int
	have         []bool
}

func openParquet(name string, f fs.File, lim limits.Limits) (src *parquetSource, err error) {
	defer func() {
		// The library may panic on a malformed file; that is bad input,
		// not a crash.
		if r := recover(); r != nil {
			src, err = nil, diag.At(name, 0, 0, "not a readable Parquet file (%v)", r)
		}
	}()
	st, err := f.Stat()
	if err != nil {
		return nil, diag.At(name, 0, 0, "cannot read the file: %v", err)
	}
	if lim.Exceeded(limits.RecordBytes, st.Size()) {
		return nil, diag.At(name, 0, 0, "the file is %s", lim.Over(limits.RecordBytes, st.Size(), "split the file"))
	}
	ra, ok := f.(io.ReaderAt)
	if !ok {
		// An in-memory file system without random access: read it whole
		// (only small files come this way; the limit above applies).
		b, err := io.ReadAll(f)
		if err != nil {
			return nil, diag.At(name, 0, 0, "cannot read the file: %v", err)
		}
		ra = bytes.NewReader(b)
	}
	pf, err := parquet.OpenFile(ra, st.Size())
	if err != nil {
		return nil, diag.At(name, 0, 0, "not a readable Parquet file: %v", err)
	}
	s := &parquetSource{file: name, lim: lim, buf: make([]parquet.Row, 256)}
	for _, path := range pf.Schema().Columns() {
		if len(path) != 1 {
			return nil, diag.At(name, 0, 0, "column %s is nested; a records file has flat columns (lists as text separated by ;)", strings.Join(path, "."))
		}
		s.hdr = append(s.hdr, path[0])
	}
	s.groups = pf.RowGroups()
	s.cells = make([][]byte, len(s.hdr))
	return s, nil
}

func (s *parquetSource) header() []string { return s.hdr }
func (s *parquetSource) name() string     { return s.file }

func (s *parquetSource) next() (cells [][]byte, line int, err error) {
	defer func() {
		if r := recover(); r != nil {
			cells, err = nil, diag.At(s.file, s.row+1, 0, "not a readable Parquet file (%v)", r)
		}
	}()
	for s.i >= s.n {
		if s.rows == nil {
			if s.group >= len(s.groups) {
				return nil, s.row, io.EOF
			}
			s.rows = s.groups[s.group].Rows()
			s.group++
		}
		n, err := s.rows.ReadRows(s.buf)
		if err != nil && !errors.Is(err, io.EOF) {
			return nil, s.row, diag.At(s.file, s.row+1, 0, "cannot read row %d: %v", s.row+1, err)
		}
		if n == 0 || errors.Is(err, io.EOF) {
			if n == 0 {
				s.rows.Close()
				s.rows = nil
				continue
			}
		}
		s.n, s.i = n, 0
	}
	r := s.buf[s.i]
	s.i++
	s.row++
	if s.lim.Exceeded(limits.RecordRows, int64(s.row)) {
		return nil, s.row, diag.At(s.file, s.row, 0, "the file has %s", s.lim.Beyond(limits.RecordRows, "split the file"))
	}
	s.text = s.text[:0]
	if s.starts == nil {
		s.starts, s.ends, s.have = make([]int, len(s.hdr)), make([]int, len(s.hdr)), make([]bool, len(s.hdr))
	}
	starts, ends, have := s.starts, s.ends, s.have
	for i := range s.cells {
		s.cells[i], have[i] = nil, false
	}
	for _, v := range r {
		c := v.Column()
		if c < 0 || c >= len(s.hdr) {
			continue
		}
		starts[c] = len(s.text)
		have[c] = true
		if !v.IsNull() {
			s.text = appendValue(s.text, v)
		}
		ends[c] = len(s.text)
	}
	for i := range s.cells {
		if have[i] {
			s.cells[i] = s.text[starts[i]:ends[i]]
		}
	}
	// Parquet has no lines; the row number stands in for one.
	return s.cells, s.row, nil
}

func appendValue(b []byte, v parquet.Value) []byte {
	switch v.Kind() {
	case parquet.ByteArray, parquet.FixedLenByteArray:
		return append(b, v.ByteArray()...)
	case parquet.Int32:
		return strconv.AppendInt(b, int64(v.Int32()), 10)
	case parquet.Int64:
		return strconv.AppendInt(b, v.Int64(), 10)
	case parquet.Float:
		return strconv.AppendFloat(b, float64(v.Float()), 'g', -1, 32)
	case parquet.Double:
		return strconv.AppendFloat(b, v.Double(), 'g', -1, 64)
	case parquet.Boolean:
		return strconv.AppendBool(b, v.Boolean())
	}
	return fmt.Append(b, v.String())
}
