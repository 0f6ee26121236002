package dataset

import (
	"errors"
	"fmt"
	"io"
	"math"
	"runtime"
	"strconv"
	"strings"

	"peerpack/internal/tabular"
	"peerpack/internal/yamlx"
)

// The years a value may carry; anything outside is a typing error.
const (
	MinYear = 1900
	MaxYear = 2100
)

// unknownName aggregates rows that name an institution or indicator that
// does not exist, so a wrong id repeated over 10,000 rows is one message.
type unknownName struct {
	first tabular.Cell
	file  string
	count int
}

// valuesReader reads values files into staging.
type valuesReader struct {
	l        *loader
	reg      *Register
	dict     *Dictionary
	st       *staging
	unknownI map[string]*unknownName
	unknownK map[string]*unknownName
	derivedK map[string]*unknownName
	order    []string // first-seen order of aggregated names, "i:"/"k:"/"d:" prefixed
	rows     int
	// otherRows counts rows naming an unknown id or key once
	// maxUnknownNames distinct ones have been recorded, so a file of
	// millions of different wrong ids costs a counter, not a map of them.
	otherRows  int
	otherFirst tabular.Cell
	otherFile  string
	// The last institution and indicator resolved: long files are grouped
	// by institution, with the indicators in dictionary order within a
	// year, so the next row usually names the same institution and the
	// same or the next indicator; checking those first saves a map lookup
	// per row.
	lastInst, lastInd int
	// percents counts the percent-formatted workbook cells read into a
	// percent indicator, by file and indicator, in first-seen order.
	percents []*percentNote
}

type percentNote struct {
	file, key string
	first     tabular.Cell
	n         int
}

// maxUnknownNames caps the distinct unknown ids and keys remembered.
const maxUnknownNames = 1000

// errTooMany is added instead of formatting a message once the problem list is
// full, so a million bad rows cost no more than counting them.
var errTooMany = errors.New("too many problems")

func (v *valuesReader) addf(file string, c tabular.Cell, format string, args ...any) {
	if v.l.probs.Len() >= maxProblems {
		v.l.probs.Add(errTooMany)
		return
	}
	v.l.probs.Addf(file, c.Line, c.Col, "%s%s", cellName(file, c), fmt.Sprintf(format, args...))
}

// maxProblems matches diag.List's default cap.
const maxProblems = 200

func (v *valuesReader) read(name string) {
	var r tabular.RowReader
	var err error
	if f := v.l.fetched; f != nil && f.name == name {
		<-f.done
		r, err = f.r, f.err
		f.r, v.l.fetched = nil, nil // read once
	} else {
		r, err = tabular.OpenStream(v.l.fsys, name, v.l.lim)
	}
	if err != nil {
		v.l.probs.Add(err)
		return
	}
	if c, ok := r.(io.Closer); ok {
		// A stream stops reading ahead when its rows are not all read.
		defer c.Close()
	}
	fileIdx := len(v.st.files)
	v.st.files = append(v.st.files, r.File())
	hdr := r.Header()
	col := map[string]int{}
	for i, h := range hdr {
		col[strings.ToLower(strings.TrimSpace(h.Text))] = i
	}
	ic, okI := col["institution"]
	yc, okY := col["year"]
	if !okI || !okY {
		names := make([]string, len(hdr))
		for i, h := range hdr {
			names[i] = h.Text
		}
		line := 1
		if len(hdr) > 0 {
			line = hdr[0].Line
		}
		v.l.probs.Addf(r.File(), line, 1, "a values file's header starts with institution,year and then either indicator,value[,note] (long) or one column per indicator key (wide); found %s", strings.Join(names, ","))
		return
	}
	_, hasInd := col["indicator"]
	_, hasVal := col["value"]
	rows := 0
	switch {
	case hasInd && hasVal:
		rows = v.readLong(r, fileIdx, col, ic, yc)
		v.l.rep.Files = append(v.l.rep.Files, FileSummary{Role: "values (long)", Path: r.File(), Rows: rows})
	case hasInd != hasVal:
		have, missing := "indicator", "value"
		if hasVal {
			have, missing = "value", "indicator"
		}
		v.l.probs.Addf(r.File(), hdr[0].Line, 1, "the header has %q but no %q column; a long values file has institution,year,indicator,value[,note]", have, missing)
	default:
		rows = v.readWide(r, fileIdx, ic, yc)
		v.l.rep.Files = append(v.l.rep.Files, FileSummary{Role: "values (wide)", Path: r.File(), Rows: rows})
	}
	v.rows += rows
}

// institution resolves an id cell, aggregating unknown ids.
func (v *valuesReader) institution(file string, c tabular.Cell) int {
	id := strings.TrimSpace(c.Text)
	if v.lastInst < len(v.reg.Institutions) && v.reg.Institutions[v.lastInst].ID == id {
		return v.lastInst
	}
	if i := v.reg.Index(id); i >= 0 {
		v.lastInst = i
		return i
	}
	if id == "" {
		v.addf(file, c, "the institution id is empty; every row names an institution id from the register")
		return -1
	}
	if u, ok := v.unknownI[id]; ok {
		u.count++
		return -1
	}
	if v.full(file, c) {
		return -1
	}
	id = strings.Clone(id)
	v.unknownI[id] = &unknownName{first: lasting(c), file: file, count: 1}
	v.order = append(v.order, "i:"+id)
	return -1
}

func (v *valuesReader) indicator(file string, c tabular.Cell) int {
	key := strings.TrimSpace(c.Text)
	for _, i := range [2]int{v.lastInd + 1, v.lastInd} {
		if i < len(v.dict.Indicators) && v.dict.Indicators[i].Key == key && v.dict.Indicators[i].Derive == "" {
			v.lastInd = i
			return i
		}
	}
	if i := v.dict.Index(key); i >= 0 {
		if v.dict.Indicators[i].Derive != "" {
			if u, ok := v.derivedK[key]; ok {
				u.count++
			} else {
				key = strings.Clone(key)
				v.derivedK[key] = &unknownName{first: lasting(c), file: file, count: 1}
				v.order = append(v.order, "d:"+key)
			}
			return -1
		}
		v.lastInd = i
		return i
	}
	if key == "" {
		v.addf(file, c, "the indicator key is empty; every row names an indicator key from the dictionary")
		return -1
	}
	if u, ok := v.unknownK[key]; ok {
		u.count++
		return -1
	}
	if v.full(file, c) {
		return -1
	}
	key = strings.Clone(key)
	v.unknownK[key] = &unknownName{first: lasting(c), file: file, count: 1}
	v.order = append(v.order, "k:"+key)
	return -1
}

// plainYear is the year of a cell that year accepts without a problem.
func plainYear(text string) (int, bool) {
	// Four digits, the year as nearly every file writes it, read
	// directly; anything else as before.
	if len(text) == 4 && isDigit(text[0]) && isDigit(text[1]) && isDigit(text[2]) && isDigit(text[3]) {
		y := int(text[0]-'0')*1000 + int(text[1]-'0')*100 + int(text[2]-'0')*10 + int(text[3]-'0')
		if y < MinYear || y > MaxYear {
			return 0, false
		}
		return y, true
	}
	s := strings.TrimSpace(text)
	y, err := strconv.Atoi(s)
	if err != nil {
		if f, ferr := strconv.ParseFloat(s, 64); ferr == nil && f == math.Trunc(f) && math.Abs(f) < 1e6 {
			y, err = int(f), nil
		}
	}
	if err != nil || y < MinYear || y > MaxYear {
		return 0, false
	}
	return y, true
}

func (v *valuesReader) year(file string, c tabular.Cell) int {
	if y, ok := plainYear(c.Text); ok {
		return y
	}
	s := strings.TrimSpace(c.Text)
	y, err := strconv.Atoi(s)
	if err != nil {
		if f, ferr := strconv.ParseFloat(s, 64); ferr == nil && f == math.Trunc(f) && math.Abs(f) < 1e6 {
			y, err = int(f), nil
		}
	}
	if err != nil {
		if s == "" {
			v.addf(file, c, "the year is empty; every row needs a year, e.g. 2024")
		} else {
			v.addf(file, c, "year %q is not a whole number; write a calendar year, e.g. 2024", s)
		}
		return 0
	}
	if y < MinYear || y > MaxYear {
		hint := ""
		if y > 10000 && y < 100000 {
			// Spreadsheets store dates as days since 1899-12-30.
			hint = "; it looks like a spreadsheet date: format the year column as a plain number, e.g. 2024"
		}
		if hint == "" {
			hint = "; correct the year"
		}
		v.addf(file, c, "year %d is out of range; years must be from %d to %d%s", y, MinYear, MaxYear, hint)
		return 0
	}
	return y
}

// value parses a value cell for indicator ind and checks it against the
// indicator's unit. ok is false when the row must be skipped.
func (v *valuesReader) value(file string, c tabular.Cell, ind int) (float64, bool) {
	x, empty, err := tabular.ParseNumber(c.Text)
	if empty {
		return math.NaN(), true
	}
	in := &v.dict.Indicators[ind]
	if c.Kind == tabular.KindDate {
		v.addf(file, c, "the cell is formatted as a date (%s), but %s is a number (unit %s); format the cell as a number and enter the value", c.Text, in.Key, in.Unit)
		return 0, false
	}
	if c.Kind == tabular.KindPercent && in.Unit == UnitPercent && err == nil {
		// A spreadsheet shows 0.036 formatted as a percentage as 3.6 %;
		// the dictionary's percent runs 0..100. Shifting the decimal
		// point in the text ("0.036e2") parses to the nearest float to
		// 3.6, where x*100 would give 3.5999999999999996.
		if y, perr := strconv.ParseFloat(strings.TrimSpace(c.Text)+"e2", 64); perr == nil {
			x = y
			v.notePercent(file, c, in.Key)
		}
	}
	if err != nil {
		var ne *tabular.NumberError
		if errors.As(err, &ne) && ne.Token != "" {
			for _, m := range in.Missing {
				if strings.EqualFold(strings.TrimSpace(m), ne.Token) {
					return math.NaN(), true
				}
			}
			v.addf(file, c, "%q is not a number; for a missing value of %s leave the cell empty, or list %q under missing: of that indicator (%s line %d) to read it as missing", ne.Token, in.Key, ne.Token, v.dict.File, in.Line)
			return 0, false
		}
		v.addf(file, c, "value of %s: %s", in.Key, err)
		return 0, false
	}
	if msg := unitViolation(in, x); msg != "" {
		v.addf(file, c, "%s", msg)
		return 0, false
	}
	return x, true
}

func (v *valuesReader) notePercent(file string, c tabular.Cell, key string) {
	for _, p := range v.percents {
		if p.file == file && p.key == key {
			p.n++
			return
		}
	}
	v.percents = append(v.percents, &percentNote{file: file, key: key, first: c, n: 1})
}

// percentNotes tells the report which cells were read in another unit.
func (v *valuesReader) percentNotes() []string {
	var out []string
	for _, p := range v.percents {
		cells := "1 cell"
		if p.n > 1 {
			cells = fmt.Sprintf("%d cells", p.n)
		}
		out = append(out, fmt.Sprintf("%s: %s of %s formatted as a percentage (first %s%d, holding %s) read as percent: the spreadsheet stores 3.6 %% as 0.036, and %s is in percent (0..100), so each was multiplied by 100", p.file, cells, p.key, tabular.ColumnName(p.first.Col), p.first.Line, p.first.Text, p.key))
	}
	return out
}

// unitViolation checks a value against its indicator's unit: a percent
// lies in 0..100, a share in 0..1, counts and ratios are not negative.
func unitViolation(in *Indicator, x float64) string {
	switch in.Unit {
	case UnitPercent, UnitShare, UnitCount, UnitRatio:
	default:
		return ""
	}
	if x >= 0 && (x <= 1 || (x <= 100 && in.Unit != UnitShare) || in.Unit == UnitCount || in.Unit == UnitRatio) {
		return ""
	}
	val := strconv.FormatFloat(x, 'f', -1, 64)
	switch in.Unit {
	case UnitPercent:
		if x < 0 || x > 100 {
			hint := ""
			if x > 100 {
				hint = "; is it a count rather than a percent?"
			}
			if hint == "" {
				hint = "; correct it, or leave the cell empty if the value is unknown"
			}
			return fmt.Sprintf("%s is a percent but the value %s lies outside 0..100%s", in.Key, val, hint)
		}
	case UnitShare:
		if x < 0 || x > 1 {
			hint := "; correct it, or leave the cell empty if the value is unknown"
			if x > 1 && x <= 100 {
				hint = "; it looks like a percent: divide by 100, or declare unit: percent in the dictionary"
			}
			return fmt.Sprintf("%s is a share (0..1) but the value %s lies outside 0..1%s", in.Key, val, hint)
		}
	case UnitCount:
		if x < 0 {
			return fmt.Sprintf("%s is a count but the value %s is negative; correct it, or leave the cell empty if the value is unknown", in.Key, val)
		}
	case UnitRatio:
		if x < 0 {
			return fmt.Sprintf("%s is a ratio but the value %s is negative; correct it, or leave the cell empty if the value is unknown", in.Key, val)
		}
	}
	return ""
}

func (v *valuesReader) store(file string, fileIdx int, cell tabular.Cell, inst, ind, year int, x float64) {
	vals, where := v.st.column(file, cell, year, ind)
	if v.st.over != nil {
		return
	}
	code := whereCode(fileIdx, cell)
	if prev := where[inst]; prev != 0 {
		v.addf(file, cell, "%s, %s, %d has a value twice: here and at %s; keep one", v.reg.Institutions[inst].ID, v.dict.Indicators[ind].Key, year, v.st.place(prev))
		return
	}
	where[inst] = code
	vals[inst] = x
}

func (v *valuesReader) readLong(r tabular.RowReader, fileIdx int, col map[string]int, ic, yc int) int {
	file := r.File()
	kc, vc := col["indicator"], col["value"]
	nc, hasNote := col["note"]
	for i, h := range r.Header() {
		n := strings.ToLower(strings.TrimSpace(h.Text))
		if !oneOf(n, []string{"institution", "year", "indicator", "value", "note"}) {
			v.addf(file, h, "unexpected column %q in a long values file (institution,year,indicator,value[,note]); remove it, or use the wide shape with one column per indicator", r.Header()[i].Text)
		}
	}
	cols := longColumns{ic: ic, yc: yc, kc: kc, vc: vc, nc: nc, hasNote: hasNote}
	if !hasNote && runtime.GOMAXPROCS(0) > 1 && len(v.dict.Indicators) <= math.MaxInt16 {
		switch r := r.(type) {
		case *tabular.Stream:
			return v.readLongParts(streamParts{r}, file, fileIdx, cols)
		case *tabular.CSVReader:
			if r.Unread() >= parallelBytes {
				if parts := r.Split(r.Unread() / partBytes); parts != nil {
					return v.readLongParts(&splitParts{parts}, file, fileIdx, cols)
				}
			}
		}
	}
	rows := 0
	for {
		row, err := r.Next()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			v.l.probs.Add(err)
			continue
		}
		if v.st.over != nil {
			break
		}
		rows++
		v.longRow(file, fileIdx, row, cols)
	}
	return rows
}

// longColumns are the positions of a long file's columns.
type longColumns struct {
	ic, yc, kc, vc, nc int
	hasNote            bool
}

// longRow reads one row of a long values file.
func (v *valuesReader) longRow(file string, fileIdx int, row []tabular.Cell, c longColumns) {
	inst := v.institution(file, row[c.ic])
	ind := v.indicator(file, row[c.kc])
	year := v.year(file, row[c.yc])
	if ind < 0 {
		return
	}
	x, ok := v.value(file, row[c.vc], ind)
	if inst < 0 || year == 0 || !ok {
		return
	}
	// An empty value claims no place, as in a wide file, so another
	// file may supply it; its note is still kept.
	if !math.IsNaN(x) {
		v.store(file, fileIdx, row[c.vc], inst, ind, year, x)
	}
	if c.hasNote {
		if n := strings.TrimSpace(row[c.nc].Text); n != "" {
			v.l.notes = append(v.l.notes, stagedNote{CellRef{Indicator: ind, Year: year, Institution: inst}, strings.Clone(n)})
		}
	}
}

func (v *valuesReader) readWide(r tabular.RowReader, fileIdx int, ic, yc int) int {
	file := r.File()
	hdr := r.Header()
	keys := make([]int, len(hdr))
	seen := map[string]int{}
	for i, h := range hdr {
		keys[i] = -1
		if i == ic || i == yc {
			continue
		}
		k := strings.TrimSpace(h.Text)
		if prev, dup := seen[k]; dup {
			v.addf(file, h, "column %q appears twice in the header (first at column %d); keep one", k, prev)
			continue
		}
		seen[k] = h.Col
		idx := v.dict.Index(k)
		switch {
		case k == "":
			v.addf(file, h, "column %d of the header has no name; name it with an indicator key or delete the column", i+1)
		case strings.EqualFold(k, "note"):
			v.addf(file, h, "a note column belongs to the long shape (institution,year,indicator,value,note); a wide file has one column per indicator")
		case idx < 0:
			msg := fmt.Sprintf("column %q is not an indicator key in %s", k, v.dict.File)
			if s := yamlx.Nearest(k, v.dict.Keys()); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			} else {
				msg += "; add it to the dictionary or remove the column"
			}
			v.addf(file, h, "%s", msg)
		case v.dict.Indicators[idx].Derive != "":
			v.addf(file, h, "%q is derived (derive: in %s line %d), so it is computed, not read; remove the column or remove derive:", k, v.dict.File, v.dict.Indicators[idx].Line)
		default:
			keys[i] = idx
		}
	}
	rows := 0
	for {
		row, err := r.Next()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			v.l.probs.Add(err)
			continue
		}
		if v.st.over != nil {
			break
		}
		rows++
		inst := v.institution(file, row[ic])
		year := v.year(file, row[yc])
		for i, ind := range keys {
			if ind < 0 {
				continue
			}
			x, ok := v.value(file, row[i], ind)
			if inst < 0 || year == 0 || !ok {
				continue
			}
			if math.IsNaN(x) {
				// An empty cell in a wide file is missing; it claims no
				// place, so a long file may supply the value.
				continue
			}
			v.store(file, fileIdx, row[i], inst, ind, year, x)
		}
	}
	return rows
}

// full reports whether maxUnknownNames are recorded already; the row is
// then only counted.
func (v *valuesReader) full(file string, c tabular.Cell) bool {
	if len(v.order) < maxUnknownNames {
		return false
	}
	if v.otherRows == 0 {
		v.otherFirst, v.otherFile = lasting(c), file
	}
	v.otherRows++
	return true
}

// reportUnknown turns the aggregated unknown names into problems, in the
// order they were first met.
func (v *valuesReader) reportUnknown() {
	ids := make([]string, len(v.reg.Institutions))
	for i, in := range v.reg.Institutions {
		ids[i] = in.ID
	}
	keys := v.dict.Keys()
	more := func(u *unknownName) string {
		if u.count > 1 {
			return fmt.Sprintf(" (%d rows)", u.count)
		}
		return ""
	}
	// Past the first maxListedUnknown names of a kind, one message sums
	// up the rest: a hundred wrong ids are one mistake (the wrong
	// register, a changed id scheme), not a hundred.
	type rest struct {
		names, rows int
		first       *unknownName
	}
	var restI, restK rest
	listedI, listedK := 0, 0
	for _, name := range v.order {
		kind, key := name[:2], name[2:]
		switch kind {
		case "i:":
			u := v.unknownI[key]
			if listedI >= maxListedUnknown {
				restI.names++
				restI.rows += u.count
				if restI.first == nil {
					restI.first = u
				}
				continue
			}
			listedI++
			msg := fmt.Sprintf("unknown institution id %q%s: it is not in the register (%s)", key, more(u), v.reg.File)
			if s := yamlx.Nearest(key, ids); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			} else {
				msg += "; add the institution to the register or correct the id"
			}
			v.addf(u.file, u.first, "%s", msg)
		case "k:":
			u := v.unknownK[key]
			if listedK >= maxListedUnknown {
				restK.names++
				restK.rows += u.count
				if restK.first == nil {
					restK.first = u
				}
				continue
			}
			listedK++
			msg := fmt.Sprintf("unknown indicator key %q%s: it is not in the dictionary (%s)", key, more(u), v.dict.File)
			if s := yamlx.Nearest(key, keys); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			} else {
				msg += "; add it to the dictionary or correct the key"
			}
			v.addf(u.file, u.first, "%s", msg)
		case "d:":
			u := v.derivedK[key]
			in, _ := v.dict.Lookup(key)
			v.addf(u.file, u.first, "%q is derived (derive: in %s line %d), so it is computed, not read%s; remove its rows or remove derive:", key, v.dict.File, in.Line, more(u))
		}
	}
	if restI.names > 0 {
		v.addf(restI.first.file, restI.first.first, "and %d more unknown institution ids over %d rows, the first here; with this many, check that the brief names the register these values belong to (%s)", restI.names, restI.rows, v.reg.File)
	}
	if restK.names > 0 {
		v.addf(restK.first.file, restK.first.first, "and %d more unknown indicator keys over %d rows, the first here; with this many, check that the brief names the dictionary these values belong to (%s)", restK.names, restK.rows, v.dict.File)
	}
	if v.otherRows > 0 {
		v.addf(v.otherFile, v.otherFirst, "and %d more rows from here on with ids or keys that are neither in the register nor in the dictionary (over %d different wrong names in all); is this the right register and dictionary for these values?", v.otherRows, maxUnknownNames)
	}
}

// maxListedUnknown is how many unknown ids (and keys) are listed one by
// one, with a suggestion each, before the rest are summed up.
const maxListedUnknown = 20

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

// lasting is a cell whose text no longer refers into the file's bytes,
// which a streamed file reuses (tabular.Stream), for keeping past its row.
func lasting(c tabular.Cell) tabular.Cell {
	c.Text = strings.Clone(c.Text)
	return c
}
