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
	"runtime"
	"strings"
	"sync"

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
	return open(name, lim, func(file string) ([]byte, error) { return readFile(fsys, file, lim) })
}

func open(name string, lim limits.Limits, read func(file string) ([]byte, error)) (RowReader, error) {
	lim = lim.Or()
	file, sheet, _ := strings.Cut(name, "#")
	switch strings.ToLower(path.Ext(file)) {
	case ".xlsx", ".xlsm":
		data, err := read(file)
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
		data, err := read(file)
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
	if ra, ok := f.(io.ReaderAt); ok && size >= parallelReadBytes && runtime.GOMAXPROCS(0) > 1 {
		if data, err, ok := readPieces(fsys, name, ra, size, max); ok {
			if err != nil {
				return nil, diag.At(name, 0, 0, "cannot read the file: %s", describeOpenErr(err))
			}
			if int64(len(data)) > max {
				return nil, tooLarge(name, int64(len(data)), lim)
			}
			return data, nil
		}
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

// parallelReadBytes is the size from which a file is read in pieces, one
// per processor.
var parallelReadBytes int64 = 32 << 20

// A Recorder is told of a file read out of order (in pieces), so that it
// can record it as if it had been read from start to end: the provenance
// recorder checksums it.
type Recorder interface {
	Record(name string, data []byte)
}

// readPieces reads a large file in one piece per processor at once. On
// this kind of machine the cost of reading a file that fits in the page
// cache is mostly the kernel handing out and clearing fresh memory for
// the buffer, which happens on whichever processor first writes a page:
// pieces spread it. It reports ok false, having read nothing, when the
// file cannot be read at an offset, so the caller reads it in order. A
// file that grew since its size was taken is read on to its end (up to
// max + 1 bytes); one that shrank is an error, since its pieces no longer
// meet.
func readPieces(fsys fs.FS, name string, ra io.ReaderAt, size, max int64) (data []byte, err error, ok bool) {
	n := int64(runtime.GOMAXPROCS(0))
	data = make([]byte, size)
	adviseHugePages(data)
	errs := make([]error, n)
	var wg sync.WaitGroup
	for i := range n {
		from, to := size*i/n, size*(i+1)/n
		wg.Add(1)
		go func() {
			defer wg.Done()
			_, errs[i] = ra.ReadAt(data[from:to], from)
		}()
	}
	wg.Wait()
	for _, e := range errs {
		switch {
		case e == nil:
		case errors.Is(e, io.EOF):
			return nil, errors.New("the file became shorter while it was read; run again once it is written"), true
		default:
			if errs[0] != nil && !errors.Is(errs[0], io.EOF) && isUnsupported(errs[0]) {
				return nil, nil, false
			}
			return nil, e, true
		}
	}
	// Anything past the stated size.
	for off := size; ; {
		var buf [64 << 10]byte
		k, e := ra.ReadAt(buf[:], off)
		data = append(data, buf[:k]...)
		off += int64(k)
		if errors.Is(e, io.EOF) || k == 0 {
			break
		}
		if e != nil {
			return nil, e, true
		}
		if off > max {
			break
		}
	}
	if rec, ok := fsys.(Recorder); ok {
		rec.Record(name, data)
	}
	return data, nil, true
}

// isUnsupported reports an error of a file that cannot be read at an
// offset at all.
func isUnsupported(err error) bool {
	return errors.Is(err, errors.ErrUnsupported)
}
