package figures

import (
	"bytes"
	"encoding/csv"
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
