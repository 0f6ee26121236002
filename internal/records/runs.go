package records

import (
	"bytes"
	"io"
)

// seenPapers remembers the ids of the papers read so far in the per-
// affiliation shape, so that a paper whose rows are not adjacent (a second
// run of rows with an id already closed) is found rather than counted as
// two papers.
//
// While the ids arrive in ascending byte order (an export sorted by paper)
// nothing is stored: a new id greater than the last cannot repeat an
// earlier one. At the first id out of order the ids of the lines before it
// are read again (fill) and from then on every id goes into an
// open-addressing table of 64-bit FNV-1a fingerprints (8 bytes a slot, at
// most three quarters full: 11 to 21 bytes a paper), never the ids
// themselves. A fingerprint seen before is confirmed by reading the file
// again up to the current line (firstLineOf), so a collision of two ids
// can never raise a false error.
type seenPapers struct {
	slots    []uint64
	n        int
	unsorted bool
	last     []byte
}

// check records the id that opens a run of rows on line and reports
// whether it may repeat an earlier paper (to be confirmed by firstLineOf).
func (s *seenPapers) check(open Opener, col int, id []byte, line int) (bool, error) {
	if !s.unsorted {
		if s.last == nil || bytes.Compare(id, s.last) > 0 {
			s.last = append(s.last[:0], id...)
			return false, nil
		}
		s.unsorted, s.last = true, nil
		if err := s.fill(open, col, line); err != nil {
			return false, err
		}
	}
	return s.add(id), nil
}

// fill adds the ids of every line before line.
func (s *seenPapers) fill(open Opener, col int, before int) error {
	src, closer, err := open()
	if err != nil {
		return err
	}
	defer closer.Close()
	for {
		row, line, err := src.next()
		if err == io.EOF || (err == nil && line >= before) {
			return nil
		}
		if err != nil {
			return err
		}
		s.add(bytes.TrimSpace(row[col]))
	}
}

// fingerprint is FNV-1a (64 bit) of the id, with 0 kept free as the empty
// slot.
func fingerprint(id []byte) uint64 {
	h := uint64(14695981039346656037)
	for _, c := range id {
		h ^= uint64(c)
		h *= 1099511628211
	}
	if h == 0 {
		h = 1
	}
	return h
}

// add records an id and reports whether its fingerprint was there before.
func (s *seenPapers) add(id []byte) bool {
	if 4*(s.n+1) > 3*len(s.slots) {
		s.grow()
	}
	h := fingerprint(id)
	mask := uint64(len(s.slots) - 1)
	for i := h & mask; ; i = (i + 1) & mask {
		switch s.slots[i] {
		case h:
			return true
		case 0:
			s.slots[i] = h
			s.n++
			return false
		}
	}
}

func (s *seenPapers) grow() {
	old := s.slots
	s.slots = make([]uint64, max(1024, 2*len(old)))
	mask := uint64(len(s.slots) - 1)
	for _, h := range old {
		if h == 0 {
			continue
		}
		i := h & mask
		for s.slots[i] != 0 {
			i = (i + 1) & mask
		}
		s.slots[i] = h
	}
}

// firstLineOf reads the file again from the start and returns the first
// line whose paper column holds id, stopping before line before (0 when
// there is none: the fingerprint matched another id).
func firstLineOf(open Opener, col int, id []byte, before int) (int, error) {
	src, closer, err := open()
	if err != nil {
		return 0, err
	}
	defer closer.Close()
	for {
		row, line, err := src.next()
		if err == io.EOF || (err == nil && line >= before) {
			return 0, nil
		}
		if err != nil {
			return 0, err
		}
		if bytes.Equal(bytes.TrimSpace(row[col]), id) {
			return line, nil
		}
	}
}
