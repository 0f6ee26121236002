package dataset

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"peerpack/internal/diag"
	"peerpack/internal/tabular"
)

// ReadPPP reads purchasing-power-parity conversion factors: columns
// country, year, factor, where factor is local currency units per
// international dollar (the World Bank's "PPP conversion factor"
// definition). A factor must be a positive number, and a country and year
// appear once.
func ReadPPP(t *tabular.Table) (*PPPTable, error) {
	var probs diag.List
	cc, yc, fc := tabular.HeaderIndex(t.Header, "country"), tabular.HeaderIndex(t.Header, "year"), tabular.HeaderIndex(t.Header, "factor")
	if cc < 0 || yc < 0 || fc < 0 {
		names := make([]string, len(t.Header))
		for i, h := range t.Header {
			names[i] = h.Text
		}
		line := 1
		if len(t.Header) > 0 {
			line = t.Header[0].Line
		}
		return nil, diag.At(t.File, line, 1, "a PPP file has the columns country,year,factor (local currency units per international dollar); found %s", strings.Join(names, ","))
	}
	p := &PPPTable{File: t.File, Factors: map[string]map[int]float64{}}
	first := map[string]map[int]int{}
	for _, row := range t.Rows {
		country := strings.TrimSpace(row[cc].Text)
		if country == "" {
			probs.Addf(t.File, row[cc].Line, row[cc].Col, "the country is empty; write the country as the register writes it")
			continue
		}
		ys := strings.TrimSpace(row[yc].Text)
		var year int
		if _, err := fmt.Sscanf(ys, "%d", &year); err != nil || fmt.Sprint(year) != ys {
			probs.Addf(t.File, row[yc].Line, row[yc].Col, "year %q is not a whole number; write a calendar year, e.g. 2024", ys)
			continue
		}
		if year < MinYear || year > MaxYear {
			probs.Addf(t.File, row[yc].Line, row[yc].Col, "year %d is out of range; years must be from %d to %d", year, MinYear, MaxYear)
			continue
		}
		f, empty, err := tabular.ParseNumber(row[fc].Text)
		switch {
		case empty:
			probs.Addf(t.File, row[fc].Line, row[fc].Col, "the factor for %s %d is empty; give local currency units per international dollar, or delete the row", country, year)
			continue
		case err != nil:
			probs.Addf(t.File, row[fc].Line, row[fc].Col, "factor: %s", err)
			continue
		case !(f > 0) || math.IsInf(f, 0):
			probs.Addf(t.File, row[fc].Line, row[fc].Col, "the factor for %s %d must be a positive number of local currency units per international dollar", country, year)
			continue
		}
		if first[country] == nil {
			first[country] = map[int]int{}
			p.Factors[country] = map[int]float64{}
		}
		if prev, dup := first[country][year]; dup {
			probs.Addf(t.File, row[cc].Line, row[cc].Col, "%s %d has a factor twice: here and at %s:%d; keep one", country, year, t.File, prev)
			continue
		}
		first[country][year] = row[cc].Line
		p.Factors[country][year] = f
	}
	return p, probs.Err()
}

// ToInternational converts a local currency amount to international
// dollars with a factor in local currency units per international dollar.
func ToInternational(local, factor float64) float64 { return local / factor }

type missingFactor struct {
	country string
	year    int
	inst    int
	ind     int
	count   int
}

// convertPPP divides every value of every read currency indicator by its
// institution's country-and-year factor. A value with no factor is an
// error, never passed through unconverted.
func (l *loader) convertPPP(d *Dataset) {
	var cur []int
	for i, in := range d.Dictionary.Indicators {
		if in.Currency && in.Derive == "" {
			cur = append(cur, i)
		}
	}
	if l.data.PPP != "" {
		t, err := tabular.ReadTableWith(l.fsys, l.data.PPP, l.lim)
		l.probs.Add(err)
		if t != nil {
			p, err := ReadPPP(t)
			l.probs.Add(err)
			if p != nil {
				d.PPP = p
				l.rep.Files = append(l.rep.Files, FileSummary{Role: "PPP factors", Path: t.File, Rows: len(t.Rows)})
			}
		}
	}
	if len(cur) == 0 {
		return
	}
	if l.data.PPP == "" {
		for _, ind := range cur {
			if n := d.countValues(ind); n > 0 {
				in := d.Dictionary.Indicators[ind]
				pos := l.b.PosOf("data")
				l.probs.Addf(d.Dictionary.File, in.Line, in.Column, "%q is currency: true and has %d %s, but the brief names no PPP file; add ppp: ppp.csv under data: in %s (line %d), with columns country,year,factor, or drop currency: true if the amounts are already comparable", in.Key, n, plural(n, "value", "values"), l.b.File, pos.Line)
			}
		}
		return
	}
	if d.PPP == nil {
		return
	}
	missing := map[string]*missingFactor{}
	var order []string
	rep := &PPPSummary{File: d.PPP.File}
	for _, ind := range cur {
		converted := 0
		for y, year := range d.Years {
			col := d.cols[ind*len(d.Years)+y]
			for inst, v := range col {
				if math.IsNaN(v) {
					continue
				}
				country := d.Register.Institutions[inst].Country
				f, ok := d.PPP.Factor(country, year)
				if !ok {
					k := fmt.Sprintf("%s\x00%d", country, year)
					m := missing[k]
					if m == nil {
						m = &missingFactor{country: country, year: year, inst: inst, ind: ind}
						missing[k] = m
						order = append(order, k)
					}
					m.count++
					col[inst] = math.NaN()
					continue
				}
				x := ToInternational(v, f)
				if math.IsInf(x, 0) {
					// Only absurd factors (below 1e-300) get here.
					file, line, c := l.st.placeOf(year, ind, inst)
					l.probs.Addf(file, line, c, "converting %s of %s in %d with factor %g overflows; check the factor for %s %d in %s", d.Dictionary.Indicators[ind].Key, d.Register.Institutions[inst].ID, year, f, country, year, d.PPP.File)
					col[inst] = math.NaN()
					continue
				}
				col[inst] = x
				converted++
			}
		}
		if converted > 0 {
			d.PPP.Converted = append(d.PPP.Converted, d.Dictionary.Indicators[ind].Key)
			rep.Converted = append(rep.Converted, d.Dictionary.Indicators[ind].Key)
			rep.Values += converted
		}
	}
	for _, k := range order {
		m := missing[k]
		in := d.Register.Institutions[m.inst]
		key := d.Dictionary.Indicators[m.ind].Key
		file, line, col := l.st.placeOf(m.year, m.ind, m.inst)
		others := ""
		if m.count > 1 {
			others = fmt.Sprintf(" and %d more values from %s in %d", m.count-1, m.country, m.year)
		}
		l.probs.Addf(file, line, col, "no PPP factor for country %q in %d: %s of %s (%s) cannot be converted to international dollars%s; add a row %s,%d,<factor> to %s", m.country, m.year, key, in.ID, in.Name, others, csvField(m.country), m.year, d.PPP.File)
	}
	countries := map[string]bool{}
	for c := range d.PPP.Factors {
		countries[c] = true
		for range d.PPP.Factors[c] {
			rep.Factors++
		}
	}
	rep.Countries = len(countries)
	sort.Strings(rep.Converted)
	l.rep.PPP = rep
}

func csvField(s string) string {
	if strings.ContainsAny(s, ",\"\n") {
		return "\"" + strings.ReplaceAll(s, "\"", "\"\"") + "\""
	}
	return s
}

// countValues counts present values of an indicator over all years.
func (d *Dataset) countValues(ind int) int {
	n := 0
	for y := range d.Years {
		for _, v := range d.cols[ind*len(d.Years)+y] {
			if !math.IsNaN(v) {
				n++
			}
		}
	}
	return n
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// markInternational sets Indicator.InternationalDollars on every
// indicator whose values are in international dollars: the currency
// indicators converted with the PPP factors, and the derived currency
// indicators computed, directly or through other derived indicators, from
// one of them. A derived currency amount over unconverted inputs (say a
// register column of local money) is left unmarked.
func markInternational(d *Dataset, defs map[string]*Derived) {
	if d.PPP == nil {
		return
	}
	inds := d.Dictionary.Indicators
	fromConverted := map[string]bool{}
	for i := range inds {
		if inds[i].Currency && inds[i].Derive == "" {
			inds[i].InternationalDollars = true
			fromConverted[inds[i].Key] = true
		}
	}
	// Derived indicators may refer to each other in any dictionary order;
	// repeat until nothing changes (at most one pass per derived
	// indicator, as the order has no cycles once loaded).
	for changed := true; changed; {
		changed = false
		for i := range inds {
			def := defs[inds[i].Key]
			if def == nil || fromConverted[inds[i].Key] {
				continue
			}
			for _, ref := range def.Expr.Refs() {
				if fromConverted[ref] {
					fromConverted[inds[i].Key] = true
					inds[i].InternationalDollars = inds[i].Unit == UnitCurrency
					changed = true
					break
				}
			}
		}
	}
}
