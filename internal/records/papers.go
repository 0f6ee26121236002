package records

import (
	"bytes"
	"fmt"
	"io"
	"io/fs"
	"math"
	"sort"
	"strconv"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// The indicator keys computed from papers.
const (
	KeyPapers               = "papers"
	KeyCitationImpact       = "citation_impact"
	KeyTop10Share           = "top10_share"
	KeyIntlCoauthorship     = "intl_coauthorship"
	KeyIndustryCoauthorship = "industry_coauthorship"
)

// BroadFields are the keys of the six OECD Frascati Manual 2015 broad
// fields of research and development, in the manual's order (1 to 6).
var BroadFields = [6]string{"field_natural", "field_engineering", "field_health", "field_agriculture", "field_social", "field_humanities"}

// PaperKeys lists every indicator papers can give, in output order.
func PaperKeys() []string {
	return append([]string{KeyPapers, KeyCitationImpact, KeyTop10Share, KeyIntlCoauthorship, KeyIndustryCoauthorship}, BroadFields[:]...)
}

// PaperOptions are the settings of one papers computation.
type PaperOptions struct {
	// Window is the number of publication years per value; 0 means the
	// whole span, giving one value per institution under the last year.
	Window int
	// Fractional divides each paper equally among its institutions.
	Fractional bool
	// Baselines, when set, are used instead of a first pass over the file.
	Baselines *Baselines
	Limits    limits.Limits
}

// Value is one computed indicator value.
type Value struct {
	Institution string
	Year        int
	Indicator   string
	Value       float64
}

// PaperResult is what a papers computation gives.
type PaperResult struct {
	Values    []Value
	Baselines *Baselines
	// Papers and Rows read; NoBaseline counts papers with no baseline for
	// any of their fields, NoRatio those whose every baseline has zero
	// mean citations (no citation impact); Unmapped counts papers with a
	// field outside the six broad fields.
	Papers, Rows, NoBaseline, NoRatio, Unmapped int64
	First, Last                                 int
	// HasIndustry and HasCountries tell whether the file had the columns.
	HasIndustry, HasCountries bool
}

// paperColumns locates the columns of a papers file.
type paperColumns struct {
	paper, year, typ, field, citations, inst, country, affType int
	pairs                                                      bool
}

func findPaperColumns(src source) (paperColumns, error) {
	col := columns(src.header())
	get := func(names ...string) int {
		for _, n := range names {
			if i, ok := col[n]; ok {
				return i
			}
		}
		return -1
	}
	c := paperColumns{paper: get("paper"), year: get("year"), typ: get("type"), field: get("field", "fields"),
		citations: get("citations")}
	var missing []string
	for _, m := range []struct {
		name string
		i    int
	}{{"paper", c.paper}, {"year", c.year}, {"type", c.typ}, {"field", c.field}, {"citations", c.citations}} {
		if m.i < 0 {
			missing = append(missing, m.name)
		}
	}
	if i := get("institutions"); i >= 0 {
		c.inst, c.country, c.affType = i, get("countries"), get("affiliation_types")
	} else if i := get("institution"); i >= 0 {
		c.pairs = true
		c.inst, c.country, c.affType = i, get("country"), get("affiliation_type")
	} else {
		missing = append(missing, "institutions (or institution, one row per affiliation)")
	}
	if len(missing) > 0 {
		return c, diag.At(src.name(), 1, 1, "a papers file needs the columns paper,year,type,field,citations and institutions,countries (one row per paper, lists separated by ;) or institution,country (one row per paper and affiliation); missing: %s", joinList(missing))
	}
	return c, nil
}

func joinList(s []string) string {
	var b bytes.Buffer
	for i, x := range s {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(x)
	}
	return b.String()
}

// names interns the strings of a record file to small integers.
type names struct {
	ids  map[string]int32
	list []string
	max  int64
	kind string
}

func newNames(kind string, max int64) *names {
	return &names{ids: map[string]int32{}, max: max, kind: kind}
}

// id returns the id of b, adding it; ok is false once the limit is reached.
func (n *names) id(b []byte) (int32, bool) {
	if i, ok := n.ids[string(b)]; ok {
		return i, true
	}
	if int64(len(n.list)) >= n.max {
		return -1, false
	}
	s := string(b)
	i := int32(len(n.list))
	n.ids[s] = i
	n.list = append(n.list, s)
	return i, true
}

func (n *names) clone() *names {
	c := &names{ids: make(map[string]int32, len(n.ids)), list: append([]string(nil), n.list...), max: n.max, kind: n.kind}
	for k, v := range n.ids {
		c.ids[k] = v
	}
	return c
}

// paper is one paper as read; slices are reused between papers.
type paper struct {
	line      int
	id        []byte
	year      int
	typ       int32
	fields    []int32
	citations int64
	insts     []int32
	countries []int32
	industry  bool
}

// paperReader assembles papers from rows of either shape.
type paperReader struct {
	src       source
	c         paperColumns
	fields    *names
	types     *names
	insts     *names
	countries *names
	lim       limits.Limits
	// withInsts is false in the baselines pass, which needs no
	// affiliations.
	withInsts bool
	rows      int64
	// pending holds the first row of the next paper (pairs shape).
	pending     [][]byte
	pendingLine int
	pendBuf     [][]byte
	eof         bool
	p           paper
	lastType    int32
	// ctry holds the distinct countries of a paper in the per-paper shape,
	// compared as bytes (a handful per paper: cheaper than interning).
	ctry [][]byte
	// open, when set in the per-affiliation shape, makes the reader check
	// that the rows of each paper are adjacent (seen: the ids closed so
	// far); open reads the file again to name the earlier line.
	open Opener
	seen seenPapers
}

func (r *paperReader) keyLimit(line, col int, kind string) error {
	return fieldError(r.src, line, col, "the file names %s; %s", kind, r.lim.Beyond(limits.RecordKeys, "check the column for stray text"))
}

// parseInt reads a plain non-negative integer.
func parseInt(b []byte) (int64, bool) {
	b = bytes.TrimSpace(b)
	if len(b) == 0 || len(b) > 18 {
		return 0, false
	}
	var n int64
	for _, c := range b {
		if c < '0' || c > '9' {
			return 0, false
		}
		n = n*10 + int64(c-'0')
	}
	return n, true
}

// eachItem calls f for each non-empty ;-separated item of b, trimmed.
func eachItem(b []byte, f func(item []byte) error) error {
	for len(b) > 0 {
		i := bytes.IndexByte(b, ';')
		var item []byte
		if i < 0 {
			item, b = b, nil
		} else {
			item, b = b[:i], b[i+1:]
		}
		item = bytes.TrimSpace(item)
		if len(item) > 0 {
			if err := f(item); err != nil {
				return err
			}
		}
	}
	return nil
}

func addDistinct(s []int32, v int32) []int32 {
	for _, x := range s {
		if x == v {
			return s
		}
	}
	return append(s, v)
}

// start reads the paper-level fields of a row into r.p.
func (r *paperReader) start(row [][]byte, line int) error {
	p := &r.p
	p.line = line
	p.id = append(p.id[:0], bytes.TrimSpace(row[r.c.paper])...)
	if len(p.id) == 0 {
		return fieldError(r.src, line, r.c.paper, "the paper id is empty; every row names its paper")
	}
	y, ok := parseInt(row[r.c.year])
	if !ok || y < 1900 || y > 2100 {
		return fieldError(r.src, line, r.c.year, "year %q is not a year between 1900 and 2100", row[r.c.year])
	}
	p.year = int(y)
	t := bytes.TrimSpace(row[r.c.typ])
	if len(t) == 0 {
		return fieldError(r.src, line, r.c.typ, "the document type is empty; write article, review, conference paper, ... (baselines are per field, year and type)")
	}
	if r.lastType >= 0 && string(t) == r.types.list[r.lastType] {
		p.typ = r.lastType
	} else if p.typ, ok = r.types.id(t); !ok {
		return r.keyLimit(line, r.c.typ, "too many document types")
	}
	r.lastType = p.typ
	c, ok := parseInt(row[r.c.citations])
	if !ok {
		return fieldError(r.src, line, r.c.citations, "citations %q is not a whole number of zero or more", row[r.c.citations])
	}
	p.citations = c
	p.fields = p.fields[:0]
	if err := eachItem(row[r.c.field], func(f []byte) error {
		id, ok := r.fields.id(f)
		if !ok {
			return r.keyLimit(line, r.c.field, "too many fields")
		}
		p.fields = addDistinct(p.fields, id)
		return nil
	}); err != nil {
		return err
	}
	if len(p.fields) == 0 {
		return fieldError(r.src, line, r.c.field, "the field is empty; every paper has at least one field (several separated by ;)")
	}
	p.insts, p.countries, p.industry = p.insts[:0], p.countries[:0], false
	return r.affiliations(row, line)
}

// same checks that a further row of a paper (pairs shape) repeats its
// paper-level fields.
func (r *paperReader) same(row [][]byte, line int) error {
	p := &r.p
	y, _ := parseInt(row[r.c.year])
	c, _ := parseInt(row[r.c.citations])
	t, _ := r.types.ids[string(bytes.TrimSpace(row[r.c.typ]))]
	if int(y) != p.year || c != p.citations || t != p.typ {
		return fieldError(r.src, line, r.c.paper, "paper %s has another year, type or citation count here than on line %d; the rows of one paper must agree", p.id, p.line)
	}
	return r.affiliations(row, line)
}

func (r *paperReader) affiliations(row [][]byte, line int) error {
	if !r.withInsts {
		return nil
	}
	p := &r.p
	n := 0
	if err := eachItem(row[r.c.inst], func(b []byte) error {
		id, ok := r.insts.id(b)
		if !ok {
			return r.keyLimit(line, r.c.inst, "too many institutions")
		}
		p.insts = addDistinct(p.insts, id)
		n++
		return nil
	}); err != nil {
		return err
	}
	if n == 0 && !r.c.pairs {
		return fieldError(r.src, line, r.c.inst, "the paper lists no institution; list its institutions separated by ;")
	}
	if r.c.country >= 0 && !r.c.pairs {
		r.ctry = r.ctry[:0]
		_ = eachItem(row[r.c.country], func(b []byte) error {
			for _, c := range r.ctry {
				if bytes.Equal(c, b) {
					return nil
				}
			}
			r.ctry = append(r.ctry, b)
			return nil
		})
		// Only the number of distinct countries is used.
		for i := range r.ctry {
			p.countries = append(p.countries, int32(i))
		}
	} else if r.c.country >= 0 {
		if err := eachItem(row[r.c.country], func(b []byte) error {
			id, ok := r.countries.id(b)
			if !ok {
				return r.keyLimit(line, r.c.country, "too many countries")
			}
			p.countries = addDistinct(p.countries, id)
			return nil
		}); err != nil {
			return err
		}
	}
	if r.c.affType >= 0 {
		_ = eachItem(row[r.c.affType], func(b []byte) error {
			if bytes.EqualFold(b, []byte("industry")) {
				p.industry = true
			}
			return nil
		})
	}
	return nil
}

// next reads the next paper into r.p; io.EOF at the end.
func (r *paperReader) next() error {
	if !r.c.pairs {
		row, line, err := r.src.next()
		if err != nil {
			return err
		}
		r.rows++
		return r.start(row, line)
	}
	// Pairs: a paper is a run of adjacent rows with the same id.
	if r.pending == nil {
		if r.eof {
			return io.EOF
		}
		row, line, err := r.src.next()
		if err != nil {
			return err
		}
		r.rows++
		r.hold(row, line)
	}
	if err := r.start(r.pending, r.pendingLine); err != nil {
		return err
	}
	r.pending = nil
	if r.open != nil {
		again, err := r.seen.check(r.open, r.c.paper, r.p.id, r.p.line)
		if err != nil {
			return err
		}
		if again {
			if err := r.notAdjacent(); err != nil {
				return err
			}
		}
	}
	for {
		row, line, err := r.src.next()
		if err == io.EOF {
			r.eof = true
			return nil
		}
		if err != nil {
			return err
		}
		r.rows++
		if !bytes.Equal(bytes.TrimSpace(row[r.c.paper]), r.p.id) {
			r.hold(row, line)
			return nil
		}
		if err := r.same(row, line); err != nil {
			return err
		}
	}
}

// notAdjacent is called when a run of rows starts with a paper id whose
// fingerprint was seen before: it finds the earlier line and, when the id
// really is the same, returns the error naming both lines.
func (r *paperReader) notAdjacent() error {
	first, err := firstLineOf(r.open, r.c.paper, r.p.id, r.p.line)
	if err != nil || first == 0 {
		return err
	}
	return fieldError(r.src, r.p.line, r.c.paper, "paper %s has rows on line %d and again here, with other papers between; in the shape with one row per paper and affiliation the rows of a paper must be adjacent: sort the file by its paper column and run again", r.p.id, first)
}

// hold copies a row that starts the next paper, since the source reuses
// its buffers.
func (r *paperReader) hold(row [][]byte, line int) {
	r.pendBuf = r.pendBuf[:0]
	for _, f := range row {
		r.pendBuf = append(r.pendBuf, append([]byte(nil), f...))
	}
	r.pending, r.pendingLine = r.pendBuf, line
}

// Opener opens a record file for one pass.
type Opener func() (source, io.Closer, error)

// OpenFile returns an Opener for a CSV or Parquet file of fsys (Parquet by
// the .parquet extension).
func OpenFile(fsys fs.FS, name string, lim limits.Limits) Opener {
	return func() (source, io.Closer, error) {
		return openSource(fsys, name, lim.Or())
	}
}

// Papers computes the paper indicators of the file.
func Papers(open Opener, opt PaperOptions) (*PaperResult, error) {
	opt.Limits = opt.Limits.Or()
	if opt.Window < 0 {
		return nil, fmt.Errorf("the window must be a whole number of years, 1 or more")
	}
	res := &PaperResult{}
	base := opt.Baselines
	if base == nil {
		b, err := baselinePass(open, opt, res)
		if err != nil {
			return nil, err
		}
		base = b
	}
	res.Baselines = base
	if err := institutionPass(open, opt, base, res); err != nil {
		return nil, err
	}
	return res, nil
}

// groupAcc gathers one baseline's papers in the first pass.
type groupAcc struct {
	w, c float64
	hist map[int64]float64 // citations -> weight
}

type groupKey struct {
	field, typ int32
	year       int32
}

func baselinePass(open Opener, opt PaperOptions, res *PaperResult) (*Baselines, error) {
	src, closer, err := open()
	if err != nil {
		return nil, err
	}
	defer closer.Close()
	c, err := findPaperColumns(src)
	if err != nil {
		return nil, err
	}
	r := &paperReader{src: src, c: c, lim: opt.Limits, lastType: -1,
		fields: newNames("field", opt.Limits.RecordKeys), types: newNames("type", opt.Limits.RecordKeys)}
	if c.pairs {
		r.open = open
	}
	groups := map[groupKey]*groupAcc{}
	for {
		err := r.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		p := &r.p
		w := 1 / float64(len(p.fields))
		for _, f := range p.fields {
			k := groupKey{f, p.typ, int32(p.year)}
			g := groups[k]
			if g == nil {
				g = &groupAcc{hist: map[int64]float64{}}
				groups[k] = g
			}
			g.w += w
			g.c += w * float64(p.citations)
			g.hist[p.citations] += w
		}
	}
	b := &Baselines{fields: r.fields, types: r.types, index: map[groupKey]int{}}
	keys := make([]groupKey, 0, len(groups))
	for k := range groups {
		keys = append(keys, k)
	}
	sort.Slice(keys, func(i, j int) bool {
		a, c := keys[i], keys[j]
		if fa, fc := r.fields.list[a.field], r.fields.list[c.field]; fa != fc {
			return fa < fc
		}
		if a.year != c.year {
			return a.year < c.year
		}
		return r.types.list[a.typ] < r.types.list[c.typ]
	})
	for _, k := range keys {
		g := groups[k]
		t, share := top10Threshold(g.hist, g.w)
		b.add(k, Baseline{Field: r.fields.list[k.field], Year: int(k.year), Type: r.types.list[k.typ],
			Papers: g.w, Citations: g.c, Expected: g.c / g.w, Threshold: t, TieShare: share})
	}
	return b, nil
}

// top10Threshold finds the citation count at the top 10 % boundary of a
// baseline and the share of the papers tied at it that falls inside:
// papers above the threshold count 1, papers at it TieShare, below 0, so
// that the weights counted add up to exactly a tenth of the papers
// (Waltman and Schreiber 2013, fractional assignment of tied papers).
func top10Threshold(hist map[int64]float64, total float64) (int64, float64) {
	levels := make([]int64, 0, len(hist))
	for c := range hist {
		levels = append(levels, c)
	}
	sort.Slice(levels, func(i, j int) bool { return levels[i] > levels[j] })
	room := 0.1 * total
	above := 0.0
	for _, c := range levels {
		w := hist[c]
		if above+w >= room {
			return c, (room - above) / w
		}
		above += w
	}
	// Only reached through rounding: every paper fits.
	return levels[len(levels)-1], 1
}

// acc gathers one institution's papers of one publication year.
type acc struct {
	n, top, nTop, impact, nScored, intl, industry float64
	broad                                         [6]float64
}

type instAcc struct {
	first int // publication year of years[0]
	years []acc
}

func (a *instAcc) at(year int) *acc {
	if a.years == nil {
		a.first = year
	}
	if year < a.first {
		grow := a.first - year
		a.years = append(make([]acc, grow), a.years...)
		a.first = year
	}
	for year-a.first >= len(a.years) {
		a.years = append(a.years, acc{})
	}
	return &a.years[year-a.first]
}

func institutionPass(open Opener, opt PaperOptions, base *Baselines, res *PaperResult) error {
	src, closer, err := open()
	if err != nil {
		return err
	}
	defer closer.Close()
	c, err := findPaperColumns(src)
	if err != nil {
		return err
	}
	res.HasCountries, res.HasIndustry = c.country >= 0, c.affType >= 0
	r := &paperReader{src: src, c: c, lim: opt.Limits, withInsts: true, lastType: -1,
		fields: base.fields.clone(), types: base.types.clone(),
		insts: newNames("institution", opt.Limits.RecordKeys), countries: newNames("country", opt.Limits.RecordKeys)}
	if c.pairs && opt.Baselines != nil {
		// Without a first pass over this file the check runs here.
		r.open = open
	}
	var accs []instAcc
	broadOf := []int8{} // per field id: broad field 0..5, -1 unmapped
	first, last := math.MaxInt, math.MinInt
	var fieldRef []*Baseline
	for {
		err := r.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return err
		}
		p := &r.p
		res.Papers++
		first, last = min(first, p.year), max(last, p.year)
		for len(broadOf) < len(r.fields.list) {
			broadOf = append(broadOf, int8(BroadOf(r.fields.list[len(broadOf)])))
		}
		k := float64(len(p.fields))
		var top, impact float64
		var nBase, nRatio int
		var profile [6]float64
		unmapped := false
		fieldRef = fieldRef[:0]
		for _, f := range p.fields {
			if bf := broadOf[f]; bf >= 0 {
				profile[bf] += 1 / k
			} else {
				unmapped = true
			}
			bl := base.lookup(groupKey{f, p.typ, int32(p.year)})
			if bl == nil {
				continue
			}
			nBase++
			switch {
			case p.citations > bl.Threshold:
				top++
			case p.citations == bl.Threshold:
				top += bl.TieShare
			}
			if bl.Expected > 0 {
				nRatio++
				impact += float64(p.citations) / bl.Expected
			}
		}
		if unmapped {
			res.Unmapped++
		}
		if nBase == 0 {
			res.NoBaseline++
		} else {
			top /= float64(nBase)
		}
		if nRatio == 0 {
			if nBase > 0 {
				res.NoRatio++
			}
		} else {
			impact /= float64(nRatio)
		}
		intl := len(p.countries) >= 2
		w := 1.0
		if len(p.insts) == 0 {
			continue
		}
		if opt.Fractional {
			w = 1 / float64(len(p.insts))
		}
		for _, in := range p.insts {
			for int(in) >= len(accs) {
				accs = append(accs, instAcc{})
			}
			a := accs[in].at(p.year)
			a.n += w
			if nBase > 0 {
				a.nTop += w
				a.top += w * top
			}
			if nRatio > 0 {
				a.nScored += w
				a.impact += w * impact
			}
			if intl {
				a.intl += w
			}
			if p.industry {
				a.industry += w
			}
			for i, s := range profile {
				if s != 0 {
					a.broad[i] += w * s
				}
			}
		}
	}
	res.Rows = r.rows
	if res.Papers == 0 {
		return diag.At(src.name(), 1, 1, "the file holds no papers; add one row per paper (or per paper and affiliation) below the header")
	}
	// The span: the papers' years, widened to the baselines' years so that
	// an institution's own papers with the world's baselines give the
	// same windows as the world run.
	if bf, bl, ok := base.span(); ok {
		first, last = min(first, bf), max(last, bl)
	}
	res.First, res.Last = first, last
	window := opt.Window
	if window == 0 {
		window = last - first + 1
	}
	ids := make([]int, len(accs))
	for i := range ids {
		ids[i] = i
	}
	sort.Slice(ids, func(i, j int) bool { return r.insts.list[ids[i]] < r.insts.list[ids[j]] })
	for _, in := range ids {
		a := &accs[in]
		for end := first + window - 1; end <= last; end++ {
			var s acc
			for y := end - window + 1; y <= end; y++ {
				if y < a.first || y-a.first >= len(a.years) {
					continue
				}
				t := &a.years[y-a.first]
				s.n += t.n
				s.nTop += t.nTop
				s.top += t.top
				s.nScored += t.nScored
				s.impact += t.impact
				s.intl += t.intl
				s.industry += t.industry
				for i := range s.broad {
					s.broad[i] += t.broad[i]
				}
			}
			if s.n == 0 {
				continue
			}
			id := r.insts.list[in]
			add := func(key string, v float64) {
				res.Values = append(res.Values, Value{Institution: id, Year: end, Indicator: key, Value: v})
			}
			add(KeyPapers, s.n)
			if s.nScored > 0 {
				add(KeyCitationImpact, s.impact/s.nScored)
			}
			if s.nTop > 0 {
				add(KeyTop10Share, 100*s.top/s.nTop)
			}
			if res.HasCountries {
				add(KeyIntlCoauthorship, 100*s.intl/s.n)
			}
			if res.HasIndustry {
				add(KeyIndustryCoauthorship, 100*s.industry/s.n)
			}
			for i, key := range BroadFields {
				add(key, 100*s.broad[i]/s.n)
			}
		}
	}
	return nil
}

// BroadOf returns the Frascati broad field (0 to 5 for fields 1 to 6) a
// fine field's code starts with, or -1: "1", "1.7", "1.07.03" are natural
// sciences (OECD Frascati Manual 2015, table 2.2).
func BroadOf(code string) int {
	if len(code) == 0 || code[0] < '1' || code[0] > '6' {
		return -1
	}
	if len(code) > 1 && code[1] != '.' {
		return -1
	}
	return int(code[0] - '1')
}

// FormatValue prints a value in the shortest form that reads back to the
// same float64, so a written file loses nothing.
func FormatValue(v float64) string {
	return strconv.FormatFloat(v, 'g', -1, 64)
}
