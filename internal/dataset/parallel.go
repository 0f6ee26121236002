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
			if simple {
				for i := range cells {
					cells[i] = tabular.Cell{Text: fields[i], Line: line, Col: cols[i]}
				}
			} else {
				copy(cells, row)
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

// readLongParts parses the parts on every processor and takes their rows
// in file order, as readLong's loop does. At most a few parts wait at a
// time, so memory stays bounded whatever the size of the file.
func (v *valuesReader) readLongParts(parts []*tabular.CSVReader, file string, fileIdx int, c longColumns) int {
	workers := runtime.GOMAXPROCS(0)
	results := make([]chan *parsedPart, len(parts))
	for i := range results {
		results[i] = make(chan *parsedPart, 1)
	}
	next := make(chan int)
	window := make(chan struct{}, 2*workers)
	done := make(chan struct{})
	// Row buffers of parts already taken are handed back to the workers.
	free := make(chan []parsedRow, 3*workers)
	go func() {
		defer close(next)
		for i := range parts {
			select {
			case window <- struct{}{}:
			case <-done:
				return
			}
			select {
			case next <- i:
			case <-done:
				return
			}
		}
	}()
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				var buf []parsedRow
				select {
				case buf = <-free:
				default:
				}
				results[i] <- v.parsePart(parts[i], c, buf)
			}
		}()
	}
	defer func() {
		close(done)
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
	for i := range parts {
		p := <-results[i]
		<-window
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
