package figures

import (
	"bytes"
	"encoding/csv"
	"math"
	"strconv"
	"testing"
)

// The figures file is written without encoding/csv, but must be exactly
// what Go's encoding/csv Writer (the reference: RFC 4180 with its own
// rules for leading spaces and `\.`) writes for the same records.
func TestWriteCSVQuotesAsEncodingCSV(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	texts := []string{"", "plain", "a, b", `say "so"`, "two\nlines", "cr\rhere", "crlf\r\nend", " leading space",
		"\tleading tab", "\u00a0no-break space", "\u2028line separator", `\.`, `\.x`, "trailing ", "ümlaut, and \"quotes\""}
	for i, s := range texts {
		m.Add(Row{Key: Key{Section: SectionCommentary, Group: s, Institution: "#" + strconv.Itoa(i), Measure: "sentence"}, Text: s, IsText: true})
	}
	var got bytes.Buffer
	if err := WriteCSV(&got, m); err != nil {
		t.Fatal(err)
	}
	var want bytes.Buffer
	cw := csv.NewWriter(&want)
	cw.Write(CSVHeader)
	for r := range m.Rows() {
		y := ""
		if r.Year != 0 {
			y = strconv.Itoa(r.Year)
		}
		v := strconv.FormatFloat(r.Value, 'g', -1, 64)
		if r.IsText {
			v = r.Text
		}
		cw.Write([]string{r.Section, r.Group, r.Indicator, r.Institution, y, r.Measure, v})
	}
	cw.Flush()
	if !bytes.Equal(got.Bytes(), want.Bytes()) {
		gl, wl := bytes.Split(got.Bytes(), []byte("\n")), bytes.Split(want.Bytes(), []byte("\n"))
		for i := range min(len(gl), len(wl)) {
			if !bytes.Equal(gl[i], wl[i]) {
				t.Fatalf("line %d:\n got %q\nwant %q", i+1, gl[i], wl[i])
			}
		}
		t.Fatalf("%d lines, encoding/csv gives %d", len(gl), len(wl))
	}
}

// TestAppendShortest: the integer shortcut writes what strconv's
// shortest 'g' form writes, on whole numbers either side of a million,
// negative zero, fractions, infinities and NaN.
func TestAppendShortest(t *testing.T) {
	vs := []float64{0, math.Copysign(0, -1), 1, -1, 7, 10, 999999, -999999, 1e6, -1e6, 1e6 - 0.5, 123456.5, 0.1, 1e-5, 1e21, math.Inf(1), math.Inf(-1), math.NaN(), 5e-324}
	for i := -2000; i <= 2000; i++ {
		vs = append(vs, float64(i), float64(i)*499.75, float64(i)*517)
	}
	for _, v := range vs {
		if got, want := string(appendShortest(nil, v)), strconv.FormatFloat(v, 'g', -1, 64); got != want {
			t.Fatalf("appendShortest(%v) = %q, strconv gives %q", v, got, want)
		}
	}
}
