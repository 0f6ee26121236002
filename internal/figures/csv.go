package figures

import (
	"bufio"
	"io"
	"math"
	"strconv"
	"unicode"
	"unicode/utf8"
)

// CSVHeader is the figures file's header row.
var CSVHeader = []string{"section", "group", "indicator", "institution", "year", "measure", "value"}

// WriteCSV writes the figures file: RFC 4180 CSV in UTF-8 with the header
// section,group,indicator,institution,year,measure,value and the model's
// rows in Rows order, written as they are produced. Numbers are written
// unrounded in their shortest exact form (strconv 'g', -1), so a
// spreadsheet reads back the very float64 the pack used; text rows carry
// their sentence in the value column.
//
// Each row is formatted into one reused buffer, with the quoting of Go's
// encoding/csv Writer (LF line ends; a field is quoted when it holds a
// comma, a double quote, CR or LF, starts with a space character, or is
// exactly `\.`), so the file is byte for byte what that writer gives
// (TestWriteCSVQuotesAsEncodingCSV) without a string per number.
func WriteCSV(w io.Writer, m *Model) error {
	bw := bufio.NewWriterSize(w, 64<<10)
	b := make([]byte, 0, 256)
	for i, h := range CSVHeader {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendCSVField(b, h)
	}
	b = append(b, '\n')
	if _, err := bw.Write(b); err != nil {
		return err
	}
	// Rows come in key order, so most share their section, group,
	// indicator and institution with the row before: those four fields
	// are quoted once per run and copied after.
	var prefix []byte
	var ps, pg, pi, pn string
	for r := range m.Rows() {
		if prefix == nil || r.Section != ps || r.Group != pg || r.Indicator != pi || r.Institution != pn {
			ps, pg, pi, pn = r.Section, r.Group, r.Indicator, r.Institution
			prefix = appendCSVField(prefix[:0], r.Section)
			prefix = append(prefix, ',')
			prefix = appendCSVField(prefix, r.Group)
			prefix = append(prefix, ',')
			prefix = appendCSVField(prefix, r.Indicator)
			prefix = append(prefix, ',')
			prefix = appendCSVField(prefix, r.Institution)
			prefix = append(prefix, ',')
		}
		b = append(b[:0], prefix...)
		if r.Year != 0 {
			b = strconv.AppendInt(b, int64(r.Year), 10)
		}
		b = append(b, ',')
		b = appendCSVField(b, r.Measure)
		b = append(b, ',')
		if r.IsText {
			b = appendCSVField(b, r.Text)
		} else {
			// Shortest 'g' form: digits, sign, point and exponent only,
			// never a character that needs quoting.
			b = appendShortest(b, r.Value)
		}
		b = append(b, '\n')
		if _, err := bw.Write(b); err != nil {
			return err
		}
	}
	return bw.Flush()
}

// appendShortest appends strconv's shortest 'g' form of v. Whole
// numbers below a million (counts, ranks, quarters, flags: most of the
// file's values) print there as plain integers, which AppendInt writes
// without the general digit search (TestAppendShortest).
func appendShortest(b []byte, v float64) []byte {
	if v == math.Trunc(v) && math.Abs(v) < 1e6 && (v != 0 || !math.Signbit(v)) {
		return strconv.AppendInt(b, int64(v), 10)
	}
	return strconv.AppendFloat(b, v, 'g', -1, 64)
}

// appendCSVField appends one field, quoted as encoding/csv quotes it with
// a comma separator and LF line ends: inside quotes only a double quote
// changes (written twice).
func appendCSVField(b []byte, s string) []byte {
	if !csvNeedsQuotes(s) {
		return append(b, s...)
	}
	b = append(b, '"')
	for i := 0; i < len(s); i++ {
		if s[i] == '"' {
			b = append(b, '"')
		}
		b = append(b, s[i])
	}
	return append(b, '"')
}

// csvNeedsQuotes is encoding/csv's rule for a comma separator.
func csvNeedsQuotes(s string) bool {
	if s == "" {
		return false
	}
	if s == `\.` {
		return true
	}
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case ',', '"', '\r', '\n':
			return true
		}
	}
	r, _ := utf8.DecodeRuneInString(s)
	return unicode.IsSpace(r)
}

func itoa(i int) string { return strconv.Itoa(i) }
