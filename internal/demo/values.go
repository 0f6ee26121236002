package demo

import (
	"math"
	"strconv"
)

// The raw indicators the scenario writes, by the file they go into. The
// derived indicators of the dictionary are left for peerpack to compute.
var (
	longKeys = []string{"papers", "intl_papers", "fwci", "research_income", "industry_income", "doctorates", "reputation_votes", "teaching_reputation"}
	wideKeys = []string{"academic_fte", "students", "intl_staff", "intl_students", "subj_arts", "subj_social", "subj_life", "subj_health", "subj_physical", "subj_engineering"}
)

// decimals as written in the data files (finer than printed, as real
// extracts are).
var fileDecimals = map[string]int{
	"papers": 0, "intl_papers": 0, "fwci": 3, "research_income": 0, "industry_income": 0,
	"doctorates": 0, "reputation_votes": 0, "teaching_reputation": 1,
	"academic_fte": 1, "students": 0, "intl_staff": 1, "intl_students": 1,
	"subj_arts": 1, "subj_social": 1, "subj_life": 1, "subj_health": 1, "subj_physical": 1, "subj_engineering": 1,
}

// missingRate is the chance that a value was not returned; bibliometric
// counts come from a database and are always present.
var missingRate = map[string]float64{
	"industry_income": 0.07, "teaching_reputation": 0.06, "intl_students": 0.03,
	"research_income": 0.02, "doctorates": 0.03, "intl_staff": 0.02, "academic_fte": 0.004,
}

// cellNotes are the footnotes a few long-format values carry, by
// indicator.
var cellNotes = map[string][]string{
	"research_income": {
		"Restated by the institution after audit.",
		"Provisional figure; final accounts not yet published.",
		"Includes a college merged into the institution this year.",
	},
	"industry_income": {
		"Restated by the institution after audit.",
		"Financial year changed; figure covers fifteen months scaled to twelve.",
	},
	"doctorates": {
		"Includes degrees awarded jointly with a partner institution.",
		"Provisional count; the graduation register closes after the census date.",
	},
}

// values holds every generated value: v[inst][year index][key] with NaN for
// missing, plus the notes and "n/a" markers of the long file.
type values struct {
	v     []map[string][]float64 // per institution: key -> per year
	notes map[cell]string
	na    map[cell]bool // written as "n/a" (the dictionary allows it)
}

type cell struct {
	inst, year int
	key        string
}

// generateValues draws six years of values for every institution, and sets
// each institution's staff_fte register attribute from its last year.
func generateValues(seed uint64, insts []institution, ppp [][]float64) *values {
	r := stream(seed, 2)
	// Each institution's own departures from what its latent factors
	// predict, drawn from a stream of their own so that the register and
	// the yearly noise stay as they are. Without them the international
	// shares would correlate almost perfectly with one another, which no
	// real dataset shows (correlations of 0.4-0.7 are typical).
	own := stream(seed, 6)
	ys := years()
	out := &values{notes: map[cell]string{}, na: map[cell]bool{}}
	teachRaw := make([][]float64, len(insts))
	for i := range insts {
		in := &insts[i]
		c := countries[in.Country]
		m := map[string][]float64{}
		for _, k := range append(append([]string(nil), longKeys...), wideKeys...) {
			col := make([]float64, len(ys))
			for t := range col {
				col[t] = math.NaN()
			}
			m[k] = col
		}
		teachRaw[i] = make([]float64, len(ys))
		staffOwn, studOwn, coOwn, impactOwn := 0.45*own.normal(), 0.55*own.normal(), 0.35*own.normal(), 0.15*own.normal()
		if in.ID == FocusID {
			staffOwn, studOwn, coOwn, impactOwn = 0, 0, 0, 0
		}
		var acad float64
		for t, year := range ys {
			ft := float64(t)
			acad = math.Exp(in.LogAcademics + in.Growth*ft + 0.02*r.normal())
			R := in.Research + (in.ResearchTrend+c.ResearchTrend)*ft + 0.05*r.normal()
			I := in.Intl + in.IntlTrend*ft + 0.05*r.normal()
			students := acad * c.StudentRatio * math.Exp(in.StudentShift+0.03*r.normal())
			papers := math.Round(acad * math.Exp(-0.5+0.68*R+0.08*r.normal()))
			intlP := math.Round(papers * logistic(-0.35+0.55*I+0.3*R+coOwn+0.06*r.normal()))
			fwci := math.Exp(-0.2 + 0.22*R + 0.12*I + in.ImpactShift + impactOwn + 0.9/math.Sqrt(papers+5)*r.normal())
			resPer := math.Exp(10.95 + 0.6*R + in.FundingShift + 0.015*ft + 0.08*r.normal())
			indPer := math.Exp(8.6 + 0.4*R + in.IndustryShift + 0.15*r.normal())
			docs := math.Round(acad * math.Exp(-2.6+0.7*R+0.1*r.normal()))
			votes := float64(r.poisson(math.Exp(1.2 + 1.5*R + 0.6*math.Log(acad/1000))))
			teachRaw[i][t] = math.Exp(0.9*R + 0.3*math.Log(acad/1000) + 0.1*r.normal())
			iStaff := 100 * logistic(-1.6+0.6*I+0.3*R+staffOwn+0.05*r.normal())
			iStud := 100 * logistic(-2.0+0.75*I+0.1*R+studOwn+0.06*r.normal())
			var prof [6]float64
			sum := 0.0
			for s := range prof {
				prof[s] = in.Profile[s] * math.Exp(0.04*r.normal())
				sum += prof[s]
			}
			f := ppp[in.Country][t]
			drawn := map[string]float64{
				"academic_fte": acad, "students": students, "papers": papers, "intl_papers": intlP,
				"fwci": fwci, "research_income": math.Round(resPer*acad*f/1000) * 1000,
				"industry_income": math.Round(indPer*acad*f/100) * 100, "doctorates": docs,
				"reputation_votes": votes, "intl_staff": iStaff, "intl_students": iStud,
			}
			for s, sub := range subjects {
				drawn[sub.Key] = 100 * prof[s] / sum
			}
			// One uniform per key and year, drawn whether or not it is used,
			// so the missing pattern never shifts the other draws.
			for _, k := range append(append([]string(nil), longKeys...), wideKeys...) {
				u := r.uniform()
				if year < in.EntryYear {
					continue
				}
				if k == "teaching_reputation" {
					m[k][t] = 0 // scaled below, once every raw value is known
				} else {
					m[k][t] = drawn[k]
				}
				if in.ID != FocusID && u < missingRate[k] {
					m[k][t] = math.NaN()
					if k == "doctorates" {
						out.na[cell{i, t, k}] = true
					}
				}
			}
			if year < in.EntryYear {
				teachRaw[i][t] = math.NaN()
			}
		}
		in.StaffFTE = int(math.Round(acad * (1.7 + 0.3*r.uniform())))
		out.v = append(out.v, m)
	}
	// Teaching reputation is scaled so that the most-named institution of
	// each year scores 100, the usual presentation of survey scores.
	for t := range ys {
		top := 0.0
		for i := range insts {
			if v := teachRaw[i][t]; !math.IsNaN(v) && v > top {
				top = v
			}
		}
		for i := range insts {
			if cur := out.v[i]["teaching_reputation"][t]; !math.IsNaN(cur) {
				out.v[i]["teaching_reputation"][t] = 100 * teachRaw[i][t] / top
			}
		}
	}
	// A few footnotes on values that are present.
	for len(out.notes) < 24 {
		i, t := r.intn(len(insts)), r.intn(len(ys))
		k := pick(r, []string{"research_income", "industry_income", "doctorates"})
		if insts[i].ID == FocusID || math.IsNaN(out.v[i][k][t]) {
			continue
		}
		out.notes[cell{i, t, k}] = pick(r, cellNotes[k])
	}
	return out
}

// longCSV writes values.csv: one row per institution, year and indicator.
func longCSV(insts []institution, v *values) []byte {
	w := newCSV("institution", "year", "indicator", "value", "note")
	for i, in := range insts {
		for t, year := range years() {
			if year < in.EntryYear {
				continue
			}
			for _, k := range longKeys {
				val := v.v[i][k][t]
				c := cell{i, t, k}
				switch {
				case v.na[c]:
					w.row(in.ID, strconv.Itoa(year), k, "n/a", "Not returned by the institution.")
				case math.IsNaN(val):
					// missing values are simply absent from a long file
				default:
					w.row(in.ID, strconv.Itoa(year), k, num(val, fileDecimals[k]), v.notes[c])
				}
			}
		}
	}
	return w.bytes()
}

// wideCSV writes values-wide.csv: one row per institution and year, one
// column per indicator, an empty cell for a missing value.
func wideCSV(insts []institution, v *values) []byte {
	w := newCSV(append([]string{"institution", "year"}, wideKeys...)...)
	for i, in := range insts {
		for t, year := range years() {
			if year < in.EntryYear {
				continue
			}
			row := []string{in.ID, strconv.Itoa(year)}
			for _, k := range wideKeys {
				row = append(row, num(v.v[i][k][t], fileDecimals[k]))
			}
			w.row(row...)
		}
	}
	return w.bytes()
}
