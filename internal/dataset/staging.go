package dataset

import (
	"fmt"
	"math"
	"sort"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
	"peerpack/internal/tabular"
)

// staging gathers values from every values file before the set of years is
// known. Columns are allocated per (year, indicator) on first use; where
// records the file and line each value came from, to name both places of a
// duplicate and the place of a value a later check rejects.
type staging struct {
	nInst, nInd int
	slot        map[int]int // calendar year -> slot
	years       []int       // by slot
	vals        [][][]float64
	where       [][][]uint64 // see whereCode; 0 = no value
	files       []string
	// The last column used, since rows usually come in runs.
	lastYear, lastInd int
	lastVals          []float64
	lastWhere         []uint64
	// slotOf[year-MinYear] is the slot of a year + 1 (0: none yet), so a
	// row whose indicator differs from the last one finds its column
	// without a map lookup.
	slotOf [MaxYear - MinYear + 1]int32
	// lim caps the years and the values allocated; over is set (and no
	// more is allocated) once one is reached.
	lim       limits.Limits
	allocated int64
	over      error
	scratchV  []float64
	scratchW  []uint64
}

func newStaging(nInst, nInd int) *staging {
	return &staging{nInst: nInst, nInd: nInd, slot: map[int]int{}, lim: limits.Default()}
}

// column returns the staged column of (year, ind), allocating it on first
// use. Once a limit is reached it returns a scratch column, so callers need
// no special case; the loader reports s.over and stops.
func (s *staging) column(file string, c tabular.Cell, year, ind int) ([]float64, []uint64) {
	if year == s.lastYear && ind == s.lastInd && s.lastVals != nil {
		return s.lastVals, s.lastWhere
	}
	if year >= MinYear && year <= MaxYear && s.over == nil {
		if sl := s.slotOf[year-MinYear] - 1; sl >= 0 && s.vals[sl][ind] != nil {
			s.lastYear, s.lastInd = year, ind
			s.lastVals, s.lastWhere = s.vals[sl][ind], s.where[sl][ind]
			return s.lastVals, s.lastWhere
		}
	}
	sl, ok := s.slot[year]
	if !ok && s.over == nil && s.lim.Exceeded(limits.Years, int64(len(s.years)+1)) {
		s.over = diag.At(file, c.Line, c.Col, "year %d makes %s", year, s.lim.Over(limits.Years, int64(len(s.years)+1), "check the year column for typing errors"))
	}
	if s.over == nil && (!ok || s.vals[sl][ind] == nil) {
		if n := (s.allocated + 1) * int64(s.nInst); s.lim.Exceeded(limits.Values, n) {
			s.over = diag.At(file, c.Line, c.Col, "the values reach %s", s.lim.Over(limits.Values, n, "drop years or indicators the brief does not use"))
		}
	}
	if s.over != nil {
		if s.scratchV == nil {
			s.scratchV = make([]float64, s.nInst)
			s.scratchW = make([]uint64, s.nInst)
		}
		return s.scratchV, s.scratchW
	}
	if !ok {
		sl = len(s.years)
		s.slot[year] = sl
		if year >= MinYear && year <= MaxYear {
			s.slotOf[year-MinYear] = int32(sl + 1)
		}
		s.years = append(s.years, year)
		s.vals = append(s.vals, make([][]float64, s.nInd))
		s.where = append(s.where, make([][]uint64, s.nInd))
	}
	if s.vals[sl][ind] == nil {
		s.allocated++
		col := make([]float64, s.nInst)
		for i := range col {
			col[i] = math.NaN()
		}
		s.vals[sl][ind] = col
		s.where[sl][ind] = make([]uint64, s.nInst)
	}
	s.lastYear, s.lastInd = year, ind
	s.lastVals, s.lastWhere = s.vals[sl][ind], s.where[sl][ind]
	return s.lastVals, s.lastWhere
}

// whereCode packs where a value was written: file index + 1 in the top
// 16 bits, the column (capped) in the next 16 and the line in the low 32.
func whereCode(file int, c tabular.Cell) uint64 {
	col := min(max(c.Col, 0), 0xFFFF)
	return uint64(file+1)<<48 | uint64(col)<<32 | uint64(uint32(c.Line))
}

// unpack splits a where code into file, line and column.
func (s *staging) unpack(code uint64) (string, int, int) {
	if code == 0 {
		return "", 0, 0
	}
	return s.files[int(code>>48)-1], int(uint32(code)), int(code >> 32 & 0xFFFF)
}

// place renders a where code as file:line:column.
func (s *staging) place(code uint64) string {
	f, l, c := s.unpack(code)
	if f == "" || l == 0 {
		return f // a value computed from a record file has no line
	}
	return fmt.Sprintf("%s:%d:%d", f, l, c)
}

// placeOf returns where the value of (year, ind, inst) came from.
func (s *staging) placeOf(year, ind, inst int) (file string, line, col int) {
	sl, ok := s.slot[year]
	if !ok || s.where[sl][ind] == nil {
		return "", 0, 0
	}
	return s.unpack(s.where[sl][ind][inst])
}

// sortedYears returns the staged years ascending.
func (s *staging) sortedYears() []int {
	ys := append([]int(nil), s.years...)
	sort.Ints(ys)
	return ys
}
