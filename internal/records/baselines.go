package records

import (
	"bufio"
	"bytes"
	"io"
	"math"
	"strconv"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// Baseline is the world-wide reference of one field, publication year and
// document type.
type Baseline struct {
	Field string
	Year  int
	Type  string
	// Papers is the weighted number of papers (a paper in k fields counts
	// 1/k in each) and Citations their weighted citations; Expected =
	// Citations / Papers is the expected citations of a paper.
	Papers, Citations, Expected float64
	// Threshold is the citation count at the top 10 % boundary; a paper
	// above it is in the top 10 %, one at it counts TieShare.
	Threshold int64
	TieShare  float64
}

// Baselines is the table of every baseline, in field, year, type order.
type Baselines struct {
	Rows   []Baseline
	fields *names
	types  *names
	index  map[groupKey]int
}

func (b *Baselines) add(k groupKey, row Baseline) {
	b.index[k] = len(b.Rows)
	b.Rows = append(b.Rows, row)
}

func (b *Baselines) lookup(k groupKey) *Baseline {
	i, ok := b.index[k]
	if !ok {
		return nil
	}
	return &b.Rows[i]
}

func (b *Baselines) span() (first, last int, ok bool) {
	if len(b.Rows) == 0 {
		return 0, 0, false
	}
	first, last = math.MaxInt, math.MinInt
	for _, r := range b.Rows {
		first, last = min(first, r.Year), max(last, r.Year)
	}
	return first, last, true
}

// baselineHeader is the baselines table's header.
var baselineHeader = []string{"field", "year", "type", "papers", "citations", "expected", "top10_threshold", "top10_tie_share"}

// WriteCSV writes the table; numbers in shortest round-trip form, so a
// table read back gives bit-identical indicators.
func (b *Baselines) WriteCSV(w io.Writer) error {
	bw := bufio.NewWriter(w)
	writeCSVRow(bw, baselineHeader...)
	for _, r := range b.Rows {
		writeCSVRow(bw, r.Field, strconv.Itoa(r.Year), r.Type, FormatValue(r.Papers), FormatValue(r.Citations),
			FormatValue(r.Expected), strconv.FormatInt(r.Threshold, 10), FormatValue(r.TieShare))
	}
	return bw.Flush()
}

// writeCSVRow writes one RFC 4180 row, quoting where needed.
func writeCSVRow(w *bufio.Writer, fields ...string) {
	for i, f := range fields {
		if i > 0 {
			w.WriteByte(',')
		}
		if needsQuote(f) {
			w.WriteByte('"')
			w.Write(bytes.ReplaceAll([]byte(f), []byte(`"`), []byte(`""`)))
			w.WriteByte('"')
		} else {
			w.WriteString(f)
		}
	}
	w.WriteByte('\n')
}

func needsQuote(s string) bool {
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case ',', '"', '\n', '\r':
			return true
		}
	}
	return len(s) > 0 && (s[0] == ' ' || s[len(s)-1] == ' ')
}

// ReadBaselines reads a baselines table (CSV or Parquet with the columns
// WriteCSV writes) for a run over an institution's own papers.
func ReadBaselines(open Opener, lim limits.Limits) (*Baselines, error) {
	lim = lim.Or()
	src, closer, err := open()
	if err != nil {
		return nil, err
	}
	defer closer.Close()
	col := columns(src.header())
	idx := make([]int, len(baselineHeader))
	var missing []string
	for i, h := range baselineHeader {
		j, ok := col[h]
		if !ok {
			missing = append(missing, h)
		}
		idx[i] = j
	}
	if len(missing) > 0 {
		return nil, diag.At(src.name(), 1, 1, "a baselines table has the columns %s; missing: %s", joinList(baselineHeader), joinList(missing))
	}
	b := &Baselines{fields: newNames("field", lim.RecordKeys), types: newNames("type", lim.RecordKeys), index: map[groupKey]int{}}
	for {
		row, line, err := src.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		num := func(i int, name string) (float64, error) {
			v, err := strconv.ParseFloat(string(bytes.TrimSpace(row[idx[i]])), 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
				return 0, fieldError(src, line, idx[i], "%s %q is not a number of zero or more", name, row[idx[i]])
			}
			return v, nil
		}
		field := bytes.TrimSpace(row[idx[0]])
		typ := bytes.TrimSpace(row[idx[2]])
		y, ok := parseInt(row[idx[1]])
		if !ok || y < 1900 || y > 2100 {
			return nil, fieldError(src, line, idx[1], "year %q is not a year between 1900 and 2100", row[idx[1]])
		}
		if len(field) == 0 || len(typ) == 0 {
			return nil, fieldError(src, line, idx[0], "the field and the type must not be empty")
		}
		var v [5]float64
		for i, n := range []struct {
			col  int
			name string
		}{{3, "papers"}, {4, "citations"}, {5, "expected"}, {7, "top10_tie_share"}} {
			if v[i], err = num(n.col, n.name); err != nil {
				return nil, err
			}
		}
		t, ok := parseInt(row[idx[6]])
		if !ok {
			return nil, fieldError(src, line, idx[6], "top10_threshold %q is not a whole number of zero or more", row[idx[6]])
		}
		fid, ok1 := b.fields.id(field)
		tid, ok2 := b.types.id(typ)
		if !ok1 || !ok2 {
			return nil, fieldError(src, line, idx[0], "the table names %s", lim.Beyond(limits.RecordKeys, "check the field and type columns"))
		}
		k := groupKey{fid, tid, int32(y)}
		if prev := b.lookup(k); prev != nil {
			return nil, fieldError(src, line, idx[0], "field %s, year %d, type %s appears twice; keep one row per field, year and type", field, y, typ)
		}
		if v[0] <= 0 {
			return nil, fieldError(src, line, idx[3], "papers must be more than zero")
		}
		if v[3] > 1 {
			return nil, fieldError(src, line, idx[7], "top10_tie_share is a share between 0 and 1")
		}
		b.add(k, Baseline{Field: string(field), Year: int(y), Type: string(typ), Papers: v[0], Citations: v[1], Expected: v[2], Threshold: int64(t), TieShare: v[3]})
	}
	return b, nil
}

// WriteValuesCSV writes values in the dataset's long format.
func WriteValuesCSV(w io.Writer, vals []Value) error {
	bw := bufio.NewWriter(w)
	writeCSVRow(bw, "institution", "year", "indicator", "value")
	for _, v := range vals {
		writeCSVRow(bw, v.Institution, strconv.Itoa(v.Year), v.Indicator, FormatValue(v.Value))
	}
	return bw.Flush()
}
