package demo

import (
	"bytes"
	"encoding/csv"
	"math"
	"strconv"
)

// csvOut writes RFC 4180 CSV with LF line ends; encoding/csv quotes only
// fields that need it, so the output is deterministic.
type csvOut struct {
	buf bytes.Buffer
	w   *csv.Writer
}

func newCSV(header ...string) *csvOut {
	c := &csvOut{}
	c.w = csv.NewWriter(&c.buf)
	c.row(header...)
	return c
}

func (c *csvOut) row(fields ...string) {
	// Writing to a bytes.Buffer cannot fail.
	_ = c.w.Write(fields)
}

func (c *csvOut) bytes() []byte {
	c.w.Flush()
	return c.buf.Bytes()
}

// num formats v at fixed decimals; NaN (missing) is the empty cell.
func num(v float64, decimals int) string {
	if math.IsNaN(v) {
		return ""
	}
	s := strconv.FormatFloat(v, 'f', decimals, 64)
	if s == "-0" || (len(s) > 1 && s[0] == '-' && isZero(s[1:])) {
		s = s[1:]
	}
	return s
}

func isZero(s string) bool {
	for _, c := range s {
		if c != '0' && c != '.' {
			return false
		}
	}
	return true
}
