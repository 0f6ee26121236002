package dataset

import (
	"slices"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/records"
	"peerpack/internal/tabular"
)

// recordSet is one computation from records, ready to stage.
type recordSet struct {
	key    string // data.papers or data.votes
	file   string
	values []records.Value
	keys   []string // indicators staged
}

// records computes the indicators of data.papers and data.votes and
// stages them like the rows of a values file, before derivation, so a
// derived indicator may use them and nothing downstream can tell them
// apart. Called after the values files are read, so an indicator given
// both ways is caught and named with both places.
func (l *loader) records(reg *Register, dict *Dictionary, st *staging) {
	b := l.b
	var sets []recordSet
	if p := b.Data.Papers; p.File != "" {
		if s, ok := l.paperSet(p, dict); ok {
			sets = append(sets, s)
		}
	}
	if v := b.Data.Votes; v.File != "" {
		if s, ok := l.voteSet(v, reg, dict); ok {
			sets = append(sets, s)
		}
	}
	for _, s := range sets {
		l.stageRecords(s, reg, dict, st)
	}
}

// chooseKeys returns the indicators a record set stages: the brief's list
// (each must be one the records give and the dictionary defines, not
// derived), else every one the records give that the dictionary defines.
func (l *loader) chooseKeys(key string, asked, available []string, dict *Dictionary) ([]string, bool) {
	p := l.b.PosOf(key)
	if len(asked) == 0 {
		var out []string
		for _, k := range available {
			if i := dict.Index(k); i >= 0 && dict.Indicators[i].Derive == "" {
				out = append(out, k)
			}
		}
		if len(out) == 0 {
			l.probs.Addf(l.b.File, p.Line, p.Column, "%s gives none of the dictionary's indicators; add one of %s to the dictionary, or drop %s", key, strings.Join(available, ", "), key)
			return nil, false
		}
		return out, true
	}
	ok := true
	for _, k := range asked {
		switch i := dict.Index(k); {
		case !slices.Contains(available, k):
			l.probs.Addf(l.b.File, p.Line, p.Column, "%s.indicators: %q is not computed from these records; they give %s", key, k, strings.Join(available, ", "))
			ok = false
		case i < 0:
			l.probs.Addf(l.b.File, p.Line, p.Column, "%s.indicators: %q is not in the dictionary; add an entry for it (label, unit, better)", key, k)
			ok = false
		case dict.Indicators[i].Derive != "":
			l.probs.Addf(l.b.File, p.Line, p.Column, "%s.indicators: %q is derived in the dictionary; an indicator is either derived or computed from records, so drop one", key, k)
			ok = false
		}
	}
	return asked, ok
}

func (l *loader) recordPath(key, p string) (string, bool) {
	p = tidyPath(p)
	if err := checkPath(l.b, key, p); err != nil {
		l.probs.Add(err)
		return "", false
	}
	if err := checkExists(l.fsys, l.b, key, p); err != nil {
		l.probs.Add(err)
		return "", false
	}
	return p, true
}

func (l *loader) paperSet(p brief.PaperSource, dict *Dictionary) (recordSet, bool) {
	file, ok := l.recordPath("data.papers", p.File)
	if !ok {
		return recordSet{}, false
	}
	keys, ok := l.chooseKeys("data.papers", p.Indicators, records.PaperKeys(), dict)
	if !ok {
		return recordSet{}, false
	}
	opt := records.PaperOptions{Window: p.Window, Fractional: p.Counting == "fractional", Limits: l.lim}
	if p.Baselines != "" {
		bf, ok := l.recordPath("data.papers", p.Baselines)
		if !ok {
			return recordSet{}, false
		}
		base, err := records.ReadBaselines(records.OpenFile(l.fsys, bf, l.lim), l.lim)
		if err != nil {
			l.probs.Add(err)
			return recordSet{}, false
		}
		opt.Baselines = base
	}
	res, err := records.Papers(records.OpenFile(l.fsys, file, l.lim), opt)
	if err != nil {
		l.probs.Add(err)
		return recordSet{}, false
	}
	l.rep.Files = append(l.rep.Files, FileSummary{Role: "paper records", Path: file, Rows: int(res.Rows)})
	return recordSet{key: "data.papers", file: file, values: res.Values, keys: keys}, true
}

func (l *loader) voteSet(v brief.VoteSource, reg *Register, dict *Dictionary) (recordSet, bool) {
	file, ok := l.recordPath("data.votes", v.File)
	if !ok {
		return recordSet{}, false
	}
	opt := records.VoteOptions{Year: l.b.Year, Cap: v.Cap, Limits: l.lim,
		Institutions: map[string]records.Place{}, Regions: map[string]string{}}
	for _, in := range reg.Institutions {
		opt.Institutions[in.ID] = records.Place{Country: in.Country, Region: in.Region}
		if in.Region != "" {
			opt.Regions[in.Country] = in.Region
		}
	}
	var tg *records.Targets
	if v.Targets != "" {
		tf, ok := l.recordPath("data.votes", v.Targets)
		if !ok {
			return recordSet{}, false
		}
		var err error
		if tg, err = records.ReadTargets(records.OpenFile(l.fsys, tf, l.lim)); err != nil {
			l.probs.Add(err)
			return recordSet{}, false
		}
	}
	res, err := records.Votes(records.OpenFile(l.fsys, file, l.lim), tg, opt)
	if err != nil {
		l.probs.Add(err)
		return recordSet{}, false
	}
	available := records.VoteKeys()
	for _, f := range res.Fields {
		available = append(available, records.KeyEsteem+"_"+records.FieldKey(f))
	}
	keys, ok := l.chooseKeys("data.votes", v.Indicators, available, dict)
	if !ok {
		return recordSet{}, false
	}
	l.rep.Files = append(l.rep.Files, FileSummary{Role: "vote records", Path: file, Rows: res.Votes})
	return recordSet{key: "data.votes", file: file, values: res.Values, keys: keys}, true
}

// stageRecords puts a record set's values into staging. An indicator that
// a values file already gave is an error naming both; values of
// institutions outside the register (the rest of the world, which the
// baselines need) are left out.
func (l *loader) stageRecords(s recordSet, reg *Register, dict *Dictionary, st *staging) {
	p := l.b.PosOf(s.key)
	chosen := map[string]int{}
	for _, k := range s.keys {
		ind := dict.Index(k)
		if file, line, col, found := st.firstValue(ind); found {
			l.probs.Addf(l.b.File, p.Line, p.Column, "indicator %s is computed from the records in %s (%s) and also given in %s:%d:%d; drop it from the values file, or list the indicators to compute under %s.indicators",
				k, s.file, s.key, file, line, col, s.key)
			continue
		}
		chosen[k] = ind
	}
	fileIdx := len(st.files)
	st.files = append(st.files, s.file)
	for _, v := range s.values {
		ind, ok := chosen[v.Indicator]
		if !ok {
			continue
		}
		i := reg.Index(v.Institution)
		if i < 0 {
			continue
		}
		c := tabular.Cell{Line: 0, Col: 0}
		col, where := st.column(s.file, c, v.Year, ind)
		val := v.Value
		if records.IsPercent(v.Indicator) && dict.Indicators[ind].Unit == UnitShare {
			val /= 100 // the dictionary keeps this share on the 0..1 scale
		}
		col[i] = val
		where[i] = whereCode(fileIdx, c)
	}
}

// firstValue finds the place of the first staged value of an indicator, in
// any year.
func (s *staging) firstValue(ind int) (file string, line, col int, found bool) {
	for sl := range s.years {
		w := s.where[sl][ind]
		for _, code := range w {
			if code != 0 {
				f, ln, c := s.unpack(code)
				return f, ln, c, true
			}
		}
	}
	return "", 0, 0, false
}
