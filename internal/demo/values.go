package demo

import (
	"math"
	"strconv"
)

// The raw indicators the scenario writes, by the file they go into. The
// derived indicators of the dictionary are left for peerpack to compute.
//
// recordKeys (citation_impact, top10_share, intl_coauthorship,
// industry_coauthorship, peer_esteem) are drawn here, since the paper and
// vote records (records.go) are drawn from them, but no values file
// carries them: the demo brief has peerpack compute them from the records
// at build time (data.papers, data.votes).
var (
	longKeys   = []string{"papers", "total_income", "research_income", "exchange_income", "operating_surplus", "doctorates", "spinouts"}
	recordKeys = []string{"citation_impact", "top10_share", "intl_coauthorship", "industry_coauthorship", "peer_esteem"}
	// drawKeys is the order values are drawn in (it fixes the random
	// streams, so it stays as the scenario was first written).
	drawKeys = []string{"papers", "citation_impact", "top10_share", "intl_coauthorship", "industry_coauthorship",
		"total_income", "research_income", "exchange_income", "operating_surplus", "doctorates", "spinouts", "peer_esteem"}
	wideKeys = []string{"academic_staff", "students", "intl_staff_share", "intl_student_share",
		"continuation_rate", "completion_rate", "graduate_outcomes",
		"field_natural", "field_engineering", "field_health", "field_agriculture", "field_social", "field_humanities"}
)

// decimals as written in the data files (finer than printed, as real
// extracts are).
var fileDecimals = map[string]int{
	"papers": 0, "citation_impact": 3, "top10_share": 2, "intl_coauthorship": 2, "industry_coauthorship": 2,
	"total_income": 0, "research_income": 0, "exchange_income": 0, "operating_surplus": 2,
	"doctorates": 0, "spinouts": 0, "peer_esteem": 1,
	"academic_staff": 1, "students": 0, "intl_staff_share": 1, "intl_student_share": 1,
	"continuation_rate": 1, "completion_rate": 1, "graduate_outcomes": 1,
	"field_natural": 1, "field_engineering": 1, "field_health": 1, "field_agriculture": 1, "field_social": 1, "field_humanities": 1,
}

// missingRate is the chance that a value was not returned; bibliometric
// values come from the paper records and are always present, as are the
// survey's esteem scores.
var missingRate = map[string]float64{
	"exchange_income": 0.07, "spinouts": 0.05, "intl_student_share": 0.03, "research_income": 0.02,
	"doctorates": 0.03, "intl_staff_share": 0.02, "academic_staff": 0.004, "operating_surplus": 0.03,
	"continuation_rate": 0.04, "completion_rate": 0.05, "graduate_outcomes": 0.06,
}

// cellNotes are the footnotes a few long-format values carry, by
// indicator.
var cellNotes = map[string][]string{
	"research_income": {
		"Restated by the institution after audit.",
		"Provisional figure; final accounts not yet published.",
		"Includes a college merged into the institution this year.",
	},
	"exchange_income": {
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
	// esteem is the expected number of survey nominations per institution
	// and year, from which peer_esteem is scaled and the vote records drawn.
	esteem [][]float64
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
	// predict, drawn from a stream of their own. Without them the
	// international shares would correlate almost perfectly with one
	// another, which no real dataset shows (correlations of 0.4-0.7 are
	// typical).
	own := stream(seed, 6)
	ys := years()
	out := &values{notes: map[cell]string{}, na: map[cell]bool{}}
	keys := append(append([]string(nil), drawKeys...), wideKeys...)
	for i := range insts {
		in := &insts[i]
		c := countries[in.Country]
		m := map[string][]float64{}
		for _, k := range keys {
			col := make([]float64, len(ys))
			for t := range col {
				col[t] = math.NaN()
			}
			m[k] = col
		}
		esteem := make([]float64, len(ys))
		staffOwn, studOwn, coOwn, impactOwn := 0.45*own.normal(), 0.55*own.normal(), 0.35*own.normal(), 0.15*own.normal()
		contOwn, complOwn, gradOwn := 0.3*own.normal(), 0.3*own.normal(), 0.35*own.normal()
		if in.ID == FocusID {
			staffOwn, studOwn, coOwn, impactOwn = 0, 0, 0, 0
			contOwn, complOwn, gradOwn = 0, 0, 0
		}
		var acad float64
		for t, year := range ys {
			ft := float64(t)
			acad = math.Exp(in.LogAcademics + in.Growth*ft + 0.02*r.normal())
			R := in.Research + (in.ResearchTrend+c.ResearchTrend)*ft + 0.05*r.normal()
			I := in.Intl + in.IntlTrend*ft + 0.05*r.normal()
			students := acad * c.StudentRatio * math.Exp(in.StudentShift+0.03*r.normal())
			papers := math.Round(acad * math.Exp(-0.5+0.68*R+0.08*r.normal()))
			intlCo := 100 * logistic(-0.35+0.55*I+0.3*R+coOwn+0.06*r.normal())
			indCo := 100 * logistic(-3.1+0.45*in.ExchangeShift+0.25*R+0.08*r.normal())
			impact := math.Exp(-0.2 + 0.22*R + 0.12*I + in.ImpactShift + impactOwn + 0.9/math.Sqrt(papers+5)*r.normal())
			// The share of papers among the 10 % most cited follows the
			// citation impact: 10 % at the world average, more above it,
			// with noise that shrinks as the output grows (an assumption
			// of the scenario: the two measures rank institutions alike).
			top10 := 100 * logistic(math.Log(0.1/0.9)+1.15*math.Log(impact)+1.2/math.Sqrt(papers+5)*r.normal())
			resPer := math.Exp(10.95 + 0.6*R + in.FundingShift + 0.015*ft + 0.08*r.normal())
			exPer := math.Exp(8.1 + 0.4*R + in.ExchangeShift + 0.15*r.normal())
			// Income other than research and exchange: teaching grants and
			// fees, per student, higher where staff time per student is
			// higher; in international dollars.
			otherPer := c.PerStudent * math.Exp(0.35*in.Research-0.3*in.StudentShift+0.08*r.normal()) * (1 + 0.01*ft)
			f := ppp[in.Country][t]
			research := math.Round(resPer*acad*f/1000) * 1000
			exchange := math.Round(exPer*acad*f/100) * 100
			total := math.Round((resPer*acad+exPer*acad+otherPer*students)*f/1000) * 1000
			surplus := 100 * logistic(-3.3+0.55*in.Finance+0.12*r.normal())
			docs := math.Round(acad * math.Exp(-2.6+0.7*R+0.1*r.normal()))
			spin := float64(r.poisson(math.Exp(-1.4 + 0.45*R + 0.6*in.ExchangeShift + 0.7*math.Log(acad/1000))))
			esteem[t] = math.Exp(1.2 + 1.05*R + 0.5*math.Log(acad/1000))
			iStaff := 100 * logistic(-1.6+0.6*I+0.3*R+staffOwn+0.05*r.normal())
			iStud := 100 * logistic(-2.0+0.75*I+0.1*R+studOwn+0.06*r.normal())
			S := in.Support + c.Outcomes
			cont := 100 * logistic(2.2+0.45*S+0.2*R+contOwn+0.06*r.normal())
			compl := 100 * logistic(1.0+0.55*S+0.25*R+complOwn+0.06*r.normal())
			grad := 100 * logistic(1.7+0.35*S+0.15*R+gradOwn+0.08*r.normal())
			var prof [6]float64
			sum := 0.0
			for s := range prof {
				prof[s] = in.Profile[s] * math.Exp(0.04*r.normal())
				sum += prof[s]
			}
			drawn := map[string]float64{
				"academic_staff": acad, "students": students, "papers": papers,
				"citation_impact": impact, "top10_share": top10, "intl_coauthorship": intlCo, "industry_coauthorship": indCo,
				"total_income": total, "research_income": research, "exchange_income": exchange,
				"operating_surplus": surplus, "doctorates": docs, "spinouts": spin,
				"intl_staff_share": iStaff, "intl_student_share": iStud,
				"continuation_rate": cont, "completion_rate": compl, "graduate_outcomes": grad,
			}
			for s, fd := range fields {
				drawn[fd.Key] = 100 * prof[s] / sum
			}
			// One uniform per key and year, drawn whether or not it is used,
			// so the missing pattern never shifts the other draws.
			for _, k := range keys {
				u := r.uniform()
				if year < in.EntryYear {
					continue
				}
				if k == "peer_esteem" {
					m[k][t] = 0 // scaled below, once every year's votes are known
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
				esteem[t] = 0
			}
		}
		in.StaffFTE = int(math.Round(acad * (1.7 + 0.3*r.uniform())))
		out.v = append(out.v, m)
		out.esteem = append(out.esteem, esteem)
	}
	// Peer esteem: nominations in each year's survey, a Poisson count
	// around the expected number, scaled so that the most-nominated
	// institution of the year scores 100. Counts are skewed: most
	// teaching-led institutions are rarely named.
	for t := range ys {
		counts := make([]float64, len(insts))
		top := 0.0
		for i := range insts {
			counts[i] = float64(r.poisson(out.esteem[i][t]))
			top = math.Max(top, counts[i])
		}
		for i := range insts {
			if cur := out.v[i]["peer_esteem"][t]; !math.IsNaN(cur) {
				out.v[i]["peer_esteem"][t] = 100 * counts[i] / top
			}
		}
	}
	// A few footnotes on values that are present.
	for len(out.notes) < 24 {
		i, t := r.intn(len(insts)), r.intn(len(ys))
		k := pick(r, []string{"research_income", "exchange_income", "doctorates"})
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
