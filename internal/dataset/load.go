package dataset

import (
	"errors"
	"io"
	"io/fs"
	"math"

	"peerpack/internal/brief"
	"peerpack/internal/diag"
	"peerpack/internal/limits"
	"peerpack/internal/tabular"
)

// loader carries the state of one Load.
type loader struct {
	fsys  fs.FS
	b     *brief.Brief
	probs diag.List
	rep   *Report
	notes []stagedNote
	st    *staging
	// data holds the brief's data paths, tidied (see tidyPath).
	data brief.DataPaths
	lim  limits.Limits
	// fetched is the first values file, read ahead.
	fetched *fetched
}

// fetched is a file opened ahead of its turn.
type fetched struct {
	name string
	done chan struct{}
	r    tabular.RowReader
	err  error
}

type stagedNote struct {
	ref  CellRef
	text string
}

// Load reads every data file the brief names from fsys (rooted at the
// brief's folder), validates them, converts currency indicators with the
// PPP factors, computes derived indicators and applies the population
// rules. The error is a *diag.List holding every problem found; the
// Report describes what was read, for `peerpack check`, and is returned
// even when there are problems. The Dataset is nil when the inputs were too
// broken to build one; when the error is not nil it must not be used for a
// pack.
func Load(fsys fs.FS, b *brief.Brief) (d *Dataset, rep *Report, err error) {
	return LoadWith(fsys, b, limits.Default())
}

// LoadWith is Load with the given size limits (file bytes, rows, columns,
// cell length, sheet cells, institutions, indicators, years, values, and
// the dictionary's YAML size); a zero field takes its default. A limit
// reached is a problem naming the file, the limit, what was found and the
// --limit override that raises it.
func LoadWith(fsys fs.FS, b *brief.Brief, lim limits.Limits) (d *Dataset, rep *Report, err error) {
	d, rep, err = LoadUnsummarised(fsys, b, lim)
	if serr := rep.Summarise(); serr != nil {
		var probs diag.List
		probs.Add(err)
		probs.Add(serr)
		rep.Problems = probs.Len()
		return nil, rep, probs.Err()
	}
	return d, rep, err
}

// LoadUnsummarised is LoadWith without the report's data summary
// (coverage by indicator and year, suspicious values), which only
// `peerpack check` reads: Report.Summarise computes it when asked, and may
// run beside later stages, since it only reads the dataset. A build never
// asks and never pays for it.
func LoadUnsummarised(fsys fs.FS, b *brief.Brief, lim limits.Limits) (d *Dataset, rep *Report, err error) {
	l := &loader{fsys: fsys, b: b, rep: &Report{Brief: b.File}, lim: lim.Or()}
	defer func() {
		// A fault of ours must reach the user as a message, not a crash.
		if r := recover(); r != nil {
			l.probs.Add(diag.At(b.File, 0, 0, "internal error while loading the data (please report it with the brief and its files): %v", r))
			d, rep, err = nil, l.rep, l.probs.Err()
			l.rep.Problems = l.probs.Len()
		}
	}()
	d = l.load()
	l.rep.Problems = l.probs.Len()
	return d, l.rep, l.probs.Err()
}

func (l *loader) load() *Dataset {
	b := l.b
	ok := true
	data := brief.DataPaths{
		Register:   tidyPath(b.Data.Register),
		Dictionary: tidyPath(b.Data.Dictionary),
		PPP:        tidyPath(b.Data.PPP),
	}
	for _, v := range b.Data.Values {
		data.Values = append(data.Values, tidyPath(v))
	}
	l.data = data
	check := func(key, p string) bool {
		if err := checkPath(b, key, p); err != nil {
			l.probs.Add(err)
			ok = false
			return false
		}
		return true
	}
	check("data.register", data.Register)
	check("data.dictionary", data.Dictionary)
	listed := map[string]bool{}
	for _, v := range data.Values {
		if check("data.values", v) && listed[v] {
			p := b.PosOf("data.values")
			l.probs.Addf(b.File, p.Line, p.Column, "data.values lists %q twice; every value in it would be a duplicate, so list each file once", v)
			ok = false
		}
		listed[v] = true
	}
	if data.PPP != "" {
		check("data.ppp", data.PPP)
	}
	if !ok {
		return nil
	}
	exists := func(key, p string) {
		if err := checkExists(l.fsys, b, key, p); err != nil {
			l.probs.Add(err)
			ok = false
		}
	}
	exists("data.register", data.Register)
	exists("data.dictionary", data.Dictionary)
	for _, v := range data.Values {
		exists("data.values", v)
	}
	if data.PPP != "" {
		exists("data.ppp", data.PPP)
	}
	if !ok {
		return nil
	}
	// The first values file is opened, and its first chunks read, while
	// the dictionary and register are parsed: at world size it is most of
	// the input (a large file is read as a stream, tabular.OpenStream).
	if len(data.Values) > 0 {
		f := &fetched{name: data.Values[0], done: make(chan struct{})}
		l.fetched = f
		go func() {
			defer close(f.done)
			f.r, f.err = tabular.OpenStream(l.fsys, f.name, l.lim)
		}()
		// Loading may stop before the values are read: never leave the
		// file open behind a returned error.
		defer func() {
			<-f.done
			if c, ok := f.r.(io.Closer); ok && l.fetched == f {
				c.Close()
			}
		}()
	}
	dict, derived := l.dictionary(data.Dictionary)
	reg := l.register(data.Register)
	if dict == nil || reg == nil {
		return nil
	}
	l.rep.Institutions = reg.Len()
	l.rep.Countries = countCountries(reg)

	st := newStaging(reg.Len(), len(dict.Indicators))
	st.lim = l.lim
	l.st = st
	vr := &valuesReader{l: l, reg: reg, dict: dict, st: st,
		unknownI: map[string]*unknownName{}, unknownK: map[string]*unknownName{}, derivedK: map[string]*unknownName{}}
	for _, name := range data.Values {
		if st.over != nil {
			break
		}
		vr.read(name)
	}
	vr.reportUnknown()
	l.rep.Notes = append(l.rep.Notes, vr.percentNotes()...)
	if st.over == nil {
		l.records(reg, dict, st)
	}
	if st.over != nil {
		l.probs.Add(st.over)
		return nil
	}
	if len(st.years) == 0 && l.probs.Len() == 0 {
		p := b.PosOf("data.values")
		l.probs.Addf(b.File, p.Line, p.Column, "the values files hold no values; add rows of institution,year,indicator,value")
	}

	if n := int64(len(st.years)) * int64(len(dict.Indicators)) * int64(reg.Len()); l.lim.Exceeded(limits.Values, n) {
		p := b.PosOf("data.values")
		l.probs.Addf(b.File, p.Line, p.Column, "the data would hold %s institutions x %d indicators x %d years = %s", limits.Group(int64(reg.Len())), len(dict.Indicators), len(st.years), l.lim.Over(limits.Values, n, "drop years or indicators the brief does not use"))
		return nil
	}
	d := l.assemble(reg, dict, st)
	l.convertPPP(d)
	l.derive(d, derived)
	markInternational(d, derived)
	l.population(d)
	l.rep.summary = func() { l.summarise(d) }
	return d
}

// assemble moves the staged columns into a Dataset without copying them.
func (l *loader) assemble(reg *Register, dict *Dictionary, st *staging) *Dataset {
	years := st.sortedYears()
	d := &Dataset{Register: reg, Dictionary: dict, Years: years, Notes: map[CellRef]string{}, DerivedMissing: map[string]int{}}
	d.cols = make([][]float64, len(dict.Indicators)*len(years))
	for y, year := range years {
		sl := st.slot[year]
		for ind := range dict.Indicators {
			c := st.vals[sl][ind]
			if c == nil {
				c = make([]float64, reg.Len())
				for i := range c {
					c[i] = math.NaN()
				}
			}
			d.cols[ind*len(years)+y] = c
		}
	}
	for _, n := range l.notes {
		d.Notes[n.ref] = n.text
	}
	l.notes = nil
	return d
}

func countCountries(r *Register) int {
	seen := map[string]bool{}
	for _, in := range r.Institutions {
		seen[in.Country] = true
	}
	return len(seen)
}

func openProblem(name string, err error) error {
	var pe *fs.PathError
	msg := err.Error()
	if errors.As(err, &pe) {
		msg = pe.Err.Error()
	}
	if errors.Is(err, fs.ErrNotExist) {
		msg = "no such file"
	}
	return diag.At(name, 0, 0, "cannot read the file: %s; check the path, which is relative to the brief's folder", msg)
}
