package dataset

import (
	"errors"
	"fmt"
	"io"
	"math"
	"runtime"
	"strings"
	"sync"

	"peerpack/internal/tabular"
)

// A long values file of many megabytes is parsed on every processor:
// tabular's Split cuts it into parts between records, workers parse the
// parts, and the rows are then taken in file order, one part after the
// other, so every value, message and position is what reading the file
// row by row gives. Workers only do what cannot go wrong or depend on
// order: splitting fields, finding the institution and indicator, reading
// the year and the number. A row they cannot settle that way (an unknown
// id, a bad number, a value out of its unit's range, a ragged row) is
// handed over whole and read in its turn by the ordinary row reader.
var (
	parallelBytes = 8 << 20 // files smaller than this are read row by row
	partBytes     = 1 << 20 // about the size of one part
)

// Kinds of parsed rows.
const (
	rowPlain   int8 = iota // settled by the worker
	rowWhole               // read in turn by longRow (cells in part.whole)
	rowProblem             // the reader's problem (part.problems)
)

type parsedRow struct {
	x         float64
	inst      int32
	ind, year int16
	line, col int32 // of the value cell
	ref       int32 // index into whole or problems
	kind      int8
}

type parsedPart struct {
	rows     []parsedRow
	whole    [][]tabular.Cell
	problems []error
	// failed: a problem stopped the reader; later parts were never read.
	failed bool
}

// parsePart parses one part. It reads the register and dictionary only.
func (v *valuesReader) parsePart(r *tabular.CSVReader, c longColumns, buf []parsedRow) (p *parsedPart) {
	if want := r.Unread() / 24; cap(buf) < want {
		// About one row per 24 bytes or more: rows are rarely shorter.
		buf = make([]parsedRow, 0, want)
	}
	p = &parsedPart{rows: buf[:0]}
	defer func() {
		if e := recover(); e != nil {
			p.rows = append(p.rows, parsedRow{kind: rowProblem, ref: int32(len(p.problems))})
			p.problems = append(p.problems, fmt.Errorf("internal error while reading %s (please report it with the file): %v", r.File(), e))
			p.failed = true
		}
	}()
	lastInst, lastInd := 0, 0
	insts, inds := v.reg.Institutions, v.dict.Indicators
	nf := len(r.Header())
	fields, cols := make([]string, nf), make([]int, nf)
	var row []tabular.Cell
	for {
		// Most lines are simple (NextSimple); the others, and a line
		// the worker hands over whole, are read as cells.
		line, simple := r.NextSimple(fields, cols)
		if !simple {
			var err error
			row, err = r.Next()
			if errors.Is(err, io.EOF) {
				break
			}
			if err != nil {
				p.rows = append(p.rows, parsedRow{kind: rowProblem, ref: int32(len(p.problems))})
				p.problems = append(p.problems, err)
				continue
			}
			for i, c := range row {
				fields[i], cols[i] = c.Text, c.Col
			}
			line = row[c.vc].Line
		}
		whole := func() {
			p.rows = append(p.rows, parsedRow{kind: rowWhole, ref: int32(len(p.whole))})
			cells := make([]tabular.Cell, nf)
			// Copies: a streamed part's bytes are reused once it is read.
			if simple {
				for i := range cells {
					cells[i] = tabular.Cell{Text: strings.Clone(fields[i]), Line: line, Col: cols[i]}
				}
			} else {
				for i, cell := range row {
					cell.Text = strings.Clone(cell.Text)
					cells[i] = cell
				}
			}
			p.whole = append(p.whole, cells)
		}
		id := trimSpace(fields[c.ic])
		inst := lastInst
		if inst >= len(insts) || insts[inst].ID != id {
			if inst = v.reg.Index(id); inst < 0 {
				whole()
				continue
			}
			lastInst = inst
		}
		key := trimSpace(fields[c.kc])
		ind := -1
		for _, k := range [2]int{lastInd + 1, lastInd} {
			if k < len(inds) && inds[k].Key == key {
				ind = k
				break
			}
		}
		if ind < 0 {
			ind = v.dict.Index(key)
		}
		if ind < 0 || inds[ind].Derive != "" {
			whole()
			continue
		}
		lastInd = ind
		year, ok := plainYear(fields[c.yc])
		if !ok {
			whole()
			continue
		}
		x, empty, err := tabular.ParseNumber(fields[c.vc])
		switch {
		case err != nil:
			whole()
			continue
		case empty:
			x = math.NaN()
		case unitViolation(&inds[ind], x) != "":
			whole()
			continue
		}
		p.rows = append(p.rows, parsedRow{x: x, inst: int32(inst), ind: int16(ind), year: int16(year),
			line: int32(line), col: int32(cols[c.vc]), kind: rowPlain})
	}
	p.failed = r.Failed()
	return p
}

// partSource gives the parts of a long file in file order: the parts of
// a whole file split at once, or the chunks of a stream.
type partSource interface {
	// next gives the next part, or io.EOF, or the problem that ends
	// the file; a rest part is read in turn after the rows before it
	// are counted (tabular.Stream).
	next() (p *tabular.CSVReader, rest bool, err error)
	// release says a part's rows (and cells) are done with.
	release(p *tabular.CSVReader)
	// stop ends the reading early: next then gives io.EOF.
	stop()
}

// splitParts is a partSource over parts made by Split.
type splitParts struct{ parts []*tabular.CSVReader }

func (s *splitParts) next() (*tabular.CSVReader, bool, error) {
	if len(s.parts) == 0 {
		return nil, false, io.EOF
	}
	p := s.parts[0]
	s.parts = s.parts[1:]
	return p, false, nil
}

func (s *splitParts) release(*tabular.CSVReader) {}
func (s *splitParts) stop()                      {}

// streamParts is a partSource over a stream's chunks.
type streamParts struct{ s *tabular.Stream }

func (s streamParts) next() (*tabular.CSVReader, bool, error) { return s.s.Part() }
func (s streamParts) release(p *tabular.CSVReader)            { s.s.Release(p) }
func (s streamParts) stop()                                   { s.s.Close() }

// pending is a part on its way: its parse, or a rest part or a problem
// for the reader to handle in turn.
type pending struct {
	src    *tabular.CSVReader
	parsed chan *parsedPart
	rest   bool
	err    error
}

// readLongParts parses the parts on every processor and takes their rows
// in file order, as readLong's loop does. At most a few parts wait at a
// time, so memory stays bounded whatever the size of the file.
func (v *valuesReader) readLongParts(src partSource, file string, fileIdx int, c longColumns) int {
	workers := runtime.GOMAXPROCS(0)
	order := make(chan pending, 2*workers)
	jobs := make(chan pending)
	done := make(chan struct{})
	// Row buffers of parts already taken are handed back to the workers.
	free := make(chan []parsedRow, 3*workers)
	go func() {
		defer close(order)
		defer close(jobs)
		for {
			p, rest, err := src.next()
			if err == io.EOF {
				return
			}
			it := pending{src: p, rest: rest, err: err}
			if err == nil && !rest {
				it.parsed = make(chan *parsedPart, 1)
				select {
				case jobs <- it:
				case <-done:
					return
				}
			}
			select {
			case order <- it:
			case <-done:
				return
			}
			if err != nil || rest {
				return
			}
		}
	}()
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for it := range jobs {
				var buf []parsedRow
				select {
				case buf = <-free:
				default:
				}
				it.parsed <- v.parsePart(it.src, c, buf)
			}
		}()
	}
	defer func() {
		close(done)
		src.stop()
		for range order { // let the feeder see done
		}
		wg.Wait()
	}()
	// The staged columns by year and indicator, once store has made them:
	// a plain row whose place is still free is stored here directly, as
	// store would store it; anything else (a first value of a column, a
	// duplicate, a limit) goes through store.
	type column struct {
		vals  []float64
		where []uint64
	}
	var byYear [MaxYear - MinYear + 1][]column
	rows := 0
	var read int64 // rows the parts have read, for a rest part's limit
	for it := range order {
		if it.err != nil {
			v.l.probs.Add(it.err)
			return rows
		}
		var p *parsedPart
		if it.rest {
			// The rest of a stream: read here, in turn.
			it.src.SetRowsBefore(read)
			p = v.parsePart(it.src, c, nil)
		} else {
			p = <-it.parsed
		}
		if it.rest {
			read = it.src.RowsRead()
		} else {
			read += it.src.RowsRead()
		}
		for _, pr := range p.rows {
			if pr.kind == rowProblem {
				v.l.probs.Add(p.problems[pr.ref])
				continue
			}
			if v.st.over != nil {
				return rows
			}
			rows++
			if pr.kind == rowWhole {
				v.longRow(file, fileIdx, p.whole[pr.ref], c)
				continue
			}
			if math.IsNaN(pr.x) {
				continue
			}
			cell := tabular.Cell{Line: int(pr.line), Col: int(pr.col)}
			if cols := byYear[pr.year-MinYear]; cols != nil {
				if col := cols[pr.ind]; col.vals != nil && col.where[pr.inst] == 0 {
					col.where[pr.inst] = whereCode(fileIdx, cell)
					col.vals[pr.inst] = pr.x
					continue
				}
			}
			v.store(file, fileIdx, cell, int(pr.inst), int(pr.ind), int(pr.year), pr.x)
			if sl := v.st.slotOf[pr.year-MinYear] - 1; sl >= 0 && v.st.over == nil && v.st.vals[sl][pr.ind] != nil {
				cols := byYear[pr.year-MinYear]
				if cols == nil {
					cols = make([]column, len(v.dict.Indicators))
					byYear[pr.year-MinYear] = cols
				}
				cols[pr.ind] = column{v.st.vals[sl][pr.ind], v.st.where[sl][pr.ind]}
			}
		}
		src.release(it.src)
		if p.failed {
			break
		}
		select {
		case free <- p.rows:
		default:
		}
	}
	return rows
}

// trimSpace is strings.TrimSpace, quicker for the usual field that
// starts and ends with a printable ASCII character.
func trimSpace(s string) string {
	if n := len(s); n > 0 && s[0] > ' ' && s[0] < 0x7f && s[n-1] > ' ' && s[n-1] < 0x7f {
		return s
	}
	return strings.TrimSpace(s)
}
