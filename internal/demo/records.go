package demo

import (
	"fmt"
	"math"
	"sort"
	"strconv"
)

// ChosenPeers are the institutions the demo brief names as the focus
// university's chosen peers; the record-level paper sample covers the focus
// and these.
var ChosenPeers = []string{"KE002", "KE004", "AL003", "OR002", "NV001", "WI002", "LU001"}

// papersPerSampled is the number of papers sampled per sampled institution
// and year.
const papersPerSampled = 60

// subjectExpected is the world-average citations of a paper by subject,
// for a paper published in FirstYear; younger papers have had less time to
// be cited (invented values shaped like the usual subject differences:
// arts lowest, life sciences and health highest).
var subjectExpected = [6]float64{2.1, 6.4, 16.8, 15.2, 12.5, 9.3}

// expectedCitations is the field-expected citation count for a paper of
// the subject and year, counted at the end of LastYear; citations
// accumulate roughly linearly in the first years after publication.
func expectedCitations(subject, year int) float64 {
	age := float64(LastYear-year) + 0.5
	full := float64(LastYear-FirstYear) + 0.5
	return math.Round(subjectExpected[subject]*age/full*100) / 100
}

// papersCSV writes the record-level paper sample: one row per paper and
// affiliated institution.
func papersCSV(seed uint64, insts []institution, v *values) []byte {
	r := stream(seed, 3)
	idx := indexByID(insts)
	sampled := append([]string{FocusID}, ChosenPeers...)
	ys := years()
	w := newCSV("paper", "year", "subject", "citations", "expected_citations", "institution", "country")
	n := 0
	for t, year := range ys {
		// Co-author weights: an institution's papers in the year.
		weights := make([]float64, len(insts))
		for i := range insts {
			if p := v.v[i]["papers"][t]; !math.IsNaN(p) {
				weights[i] = p
			}
		}
		for _, id := range sampled {
			lead := idx[id]
			in := insts[lead]
			share := v.v[lead]["intl_papers"][t] / v.v[lead]["papers"][t]
			impact := v.v[lead]["fwci"][t]
			for k := 0; k < papersPerSampled; k++ {
				n++
				subject := drawIndex(r, in.Profile[:])
				exp := expectedCitations(subject, year)
				// Citations are over-dispersed: a gamma-mixed Poisson
				// (negative binomial) with mean exp x impact.
				mean := exp * impact * r.gamma(1.2) / 1.2
				cites := r.poisson(mean)
				authors := []int{lead}
				coauthors := r.poisson(1.4)
				intl := r.chance(share)
				// An international paper has a first co-author abroad; every
				// other co-author of any paper is drawn from the lead's country
				// unless the paper is already international.
				for a := 0; a < coauthors+boolInt(intl) && len(authors) < 8; a++ {
					for try := 0; try < 40; try++ {
						j := drawIndex(r, weights)
						foreign := insts[j].Country != in.Country
						if contains(authors, j) || (intl && a == 0 && !foreign) || (!intl && foreign) {
							continue
						}
						authors = append(authors, j)
						break
					}
				}
				pid := fmt.Sprintf("P%05d", n)
				for _, a := range authors {
					w.row(pid, strconv.Itoa(year), subjects[subject].Key, strconv.Itoa(cites), num(exp, 2),
						insts[a].ID, countries[insts[a].Country].Name)
				}
			}
		}
	}
	return w.bytes()
}

// votesCSV writes the record-level survey sample: one row per vote.
// Respondents name institutions they consider among the best in their
// subject, favouring research-intensive ones and, strongly, their own
// country's (home bias, a well-known feature of such surveys).
func votesCSV(seed uint64, insts []institution) []byte {
	r := stream(seed, 4)
	w := newCSV("respondent", "year", "respondent_country", "subject", "kind", "institution")
	sizes := make([]float64, len(countries))
	for ci, c := range countries {
		sizes[ci] = float64(c.Size)
	}
	base := make([]float64, len(insts))
	for i, in := range insts {
		base[i] = math.Exp(1.6*in.Research + 0.5*(in.LogAcademics-math.Log(1000)))
	}
	// The weights depend only on the year, the respondent's country, the
	// subject and the kind of vote, so they are computed once per
	// combination rather than once per respondent.
	type wkey struct{ year, home, subject, kind int }
	cache := map[wkey][]float64{}
	weightsFor := func(k wkey) []float64 {
		if w, ok := cache[k]; ok {
			return w
		}
		weights := make([]float64, len(insts))
		for i, in := range insts {
			wgt := base[i] * (0.2 + in.Profile[k.subject])
			if k.kind == 1 {
				wgt = math.Sqrt(wgt) * (1 + 0.5*boolFloat(in.Mission == missionTeaching))
			}
			if in.Country == k.home {
				wgt *= 4
			}
			if k.year < in.EntryYear {
				wgt = 0
			}
			weights[i] = wgt
		}
		cache[k] = weights
		return weights
	}
	n := 0
	for _, year := range []int{LastYear - 1, LastYear} {
		for k := 0; k < 600; k++ {
			n++
			home := drawIndex(r, sizes)
			subject := r.intn(len(subjects))
			rid := fmt.Sprintf("R%04d", n)
			for kind, kindName := range []string{"research", "teaching"} {
				weights := weightsFor(wkey{year, home, subject, kind})
				count := 1 + r.intn(3)
				var chosen []int
				for len(chosen) < count {
					j := drawIndex(r, weights)
					if !contains(chosen, j) {
						chosen = append(chosen, j)
					}
				}
				sort.Ints(chosen)
				for _, j := range chosen {
					w.row(rid, strconv.Itoa(year), countries[home].Name, subjects[subject].Key, kindName, insts[j].ID)
				}
			}
		}
	}
	return w.bytes()
}

// drawIndex draws an index with probability proportional to weights.
func drawIndex(r *rng, weights []float64) int {
	total := 0.0
	for _, w := range weights {
		total += w
	}
	u := r.uniform() * total
	for i, w := range weights {
		if u < w {
			return i
		}
		u -= w
	}
	for i := len(weights) - 1; i >= 0; i-- {
		if weights[i] > 0 {
			return i
		}
	}
	return 0
}

func indexByID(insts []institution) map[string]int {
	m := make(map[string]int, len(insts))
	for i, in := range insts {
		m[in.ID] = i
	}
	return m
}

func contains(xs []int, x int) bool {
	for _, v := range xs {
		if v == x {
			return true
		}
	}
	return false
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

func boolFloat(b bool) float64 { return float64(boolInt(b)) }
