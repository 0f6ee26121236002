// Package tabular reads the rectangular files a user brings (CSV after
// RFC 4180, and the first or a named sheet of an XLSX workbook) into cells
// that remember where they were written, so that every later message can
// name the file, line and column.
//
// Both readers give the same shape, a header and rows of Cells, so loaders
// do not care which format a file is in. Large files are read row by row
// through a RowReader; ReadTable collects every row for small files such as
// the register.
package tabular

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"path"
	"strings"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// MaxFileBytes is the default cap on a single data file (limits.Default's
// FileBytes). A world-sized values file of 4.3 million rows is about
// 110 MB.
const MaxFileBytes = 1 << 30

// Cell is one field and where it was written. For CSV, Line is the
// physical line the field starts on and Col the character (not byte)
// column, both 1-based; for XLSX, Line is the sheet row and Col the column
// number (A = 1), so "C12" is line 12, column 3.
type Cell struct {
	Text string
	Line int
	Col  int
	// Kind is how a workbook cell's number format reads it (percent,
	// date); always KindPlain for CSV.
	Kind Kind
}

// Table is a whole sheet: the header row and the data rows.
type Table struct {
	File   string
	Header []Cell
	Rows   [][]Cell
}

// RowReader yields the rows of a table one at a time after its header.
//
// Next returns io.EOF after the last row. A row that cannot be used (a
// ragged row) is returned as a nil row with a *diag.Problem, and reading can
// go on; a problem that makes the rest of the file unreadable (an unclosed
// quote) is returned once and every later call returns io.EOF. The returned
// slice is reused by the next call.
type RowReader interface {
	File() string
	Header() []Cell
	Next() ([]Cell, error)
}

// Open opens a CSV or XLSX file in fsys by its extension. An XLSX path
// may name a sheet after a '#': "data.xlsx#Values"; without one the first
// sheet is read.
func Open(fsys fs.FS, name string) (RowReader, error) {
	return OpenWith(fsys, name, limits.Default())
}

// OpenWith is Open with the given limits on file size, rows, columns,
// cell length and (for XLSX) sheet cells; a zero field takes its default.
// Going over a limit stops the file with a message that names the limit
// and the --limit override.
func OpenWith(fsys fs.FS, name string, lim limits.Limits) (RowReader, error) {
	lim = lim.Or()
	file, sheet, _ := strings.Cut(name, "#")
	switch strings.ToLower(path.Ext(file)) {
	case ".xlsx", ".xlsm":
		data, err := readFile(fsys, file, lim)
		if err != nil {
			return nil, err
		}
		t, err := ParseXLSXWith(name, data, sheet, lim)
		if err != nil {
			return nil, err
		}
		return t.Reader(), nil
	case ".csv", ".txt", "":
		if sheet != "" {
			return nil, diag.At(name, 0, 0, "only an XLSX workbook has sheets; remove %q from the path", "#"+sheet)
		}
		data, err := readFile(fsys, file, lim)
		if err != nil {
			return nil, err
		}
		return NewCSVWith(file, data, lim)
	case ".xls":
		return nil, diag.At(file, 0, 0, "the old Excel 97-2003 format (.xls) is not read; save the workbook as .xlsx or export the sheet as CSV UTF-8")
	case ".ods":
		return nil, diag.At(file, 0, 0, "OpenDocument spreadsheets (.ods) are not read; save the sheet as .xlsx or as CSV UTF-8")
	}
	return nil, diag.At(file, 0, 0, "cannot tell the format of %q from its extension; name it .csv (comma-separated, UTF-8) or .xlsx", file)
}

// ReadTable reads a whole table; see Open.
func ReadTable(fsys fs.FS, name string) (*Table, error) {
	return ReadTableWith(fsys, name, limits.Default())
}

// ReadTableWith is ReadTable with the given limits; see OpenWith.
func ReadTableWith(fsys fs.FS, name string, lim limits.Limits) (*Table, error) {
	r, err := OpenWith(fsys, name, lim)
	if err != nil {
		return nil, err
	}
	return Collect(r)
}

// Collect reads every remaining row of r into a Table. Problems with single
// rows are gathered and returned together with the rows that could be read.
func Collect(r RowReader) (*Table, error) {
	t := &Table{File: r.File(), Header: append([]Cell(nil), r.Header()...)}
	var probs diag.List
	for {
		row, err := r.Next()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			probs.Add(err)
			continue
		}
		t.Rows = append(t.Rows, append([]Cell(nil), row...))
	}
	return t, probs.Err()
}

// Reader returns a RowReader over a table already in memory.
func (t *Table) Reader() RowReader { return &tableReader{t: t} }

type tableReader struct {
	t *Table
	i int
}

func (r *tableReader) File() string   { return r.t.File }
func (r *tableReader) Header() []Cell { return r.t.Header }
func (r *tableReader) Next() ([]Cell, error) {
	if r.i >= len(r.t.Rows) {
		return nil, io.EOF
	}
	r.i++
	return r.t.Rows[r.i-1], nil
}

func readFile(fsys fs.FS, name string, lim limits.Limits) ([]byte, error) {
	max := lim.FileBytes
	f, err := fsys.Open(name)
	if err != nil {
		return nil, diag.At(name, 0, 0, "cannot open the file: %s; check the path, which is relative to the brief's folder", describeOpenErr(err))
	}
	defer f.Close()
	size := int64(0)
	if st, err := f.Stat(); err == nil {
		if st.IsDir() {
			return nil, diag.At(name, 0, 0, "this is a folder, not a file; name the file inside it")
		}
		if st.Size() > max {
			return nil, tooLarge(name, st.Size(), lim)
		}
		size = st.Size()
	}
	// Read into a buffer of the stated size (plus one byte to see the end)
	// rather than growing one by doubling: a 170 MB values file would
	// otherwise be copied and cleared several times over.
	data := make([]byte, size+1)
	adviseHugePages(data)
	n, err := io.ReadFull(f, data)
	switch {
	case err == io.ErrUnexpectedEOF || err == io.EOF:
		data, err = data[:n], nil
	case err == nil:
		// The file is longer than its stated size (it is growing, or the
		// file system does not know); read the rest.
		var rest []byte
		rest, err = io.ReadAll(io.LimitReader(f, max))
		data = append(data, rest...)
	}
	if err != nil {
		return nil, diag.At(name, 0, 0, "cannot read the file: %s", describeOpenErr(err))
	}
	if int64(len(data)) > max {
		return nil, tooLarge(name, int64(len(data)), lim)
	}
	return data, nil
}

func tooLarge(name string, size int64, lim limits.Limits) error {
	return diag.At(name, 0, 0, "the file is %s", lim.Over(limits.FileBytes, size, ""))
}

func describeOpenErr(err error) string {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		err = pe.Err
	}
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return "no such file"
	case errors.Is(err, fs.ErrPermission):
		return "permission denied"
	}
	return err.Error()
}

// HeaderIndex returns the position of the header cell whose text equals
// name (case-insensitively, surrounding spaces ignored), or -1.
func HeaderIndex(header []Cell, name string) int {
	for i, c := range header {
		if strings.EqualFold(strings.TrimSpace(c.Text), name) {
			return i
		}
	}
	return -1
}

// Where formats a cell position for messages ("line 12, column 3").
func (c Cell) Where() string { return fmt.Sprintf("line %d, column %d", c.Line, c.Col) }
