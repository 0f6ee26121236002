package demo

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// ChosenPeers are the institutions the demo brief names as the focus
// university's chosen peers; the paper sample holds more of their papers
// than of other institutions'.
var ChosenPeers = []string{"KE002", "KE004", "AL003", "OR002", "NV001", "WI002", "LU001"}

// Paper sample sizes: every institution with papers in a year leads
// between minSampled and maxSampled sampled papers that year (about one in
// sampleEvery of its papers); the focus and its chosen peers lead
// closeSampled each.
const (
	minSampled   = 2
	maxSampled   = 12
	sampleEvery  = 120
	closeSampled = 40
)

// fieldExpected is the world-average citations of an article by broad
// field (Frascati order: natural, engineering, health, agriculture, social,
// humanities) for a paper published in FirstYear, counted at the end of
// LastYear. Invented values shaped like the usual field differences: the
// humanities lowest, health and natural sciences highest.
var fieldExpected = [6]float64{14.5, 9.8, 16.2, 8.1, 6.4, 2.2}

// paperTypes are the document types of the sample, with their share and
// their citation level relative to an article (reviews are cited more,
// conference papers less; common practice, no source).
var paperTypes = []struct {
	Name         string
	Share, Level float64
}{
	{"article", 0.78, 1.0},
	{"review", 0.07, 2.4},
	{"conference paper", 0.15, 0.55},
}

// expectedCitations is the expected citation count of a paper of the
// field, year and type, counted at the end of LastYear; citations
// accumulate roughly linearly in the first years after publication.
func expectedCitations(field, year, typ int) float64 {
	age := float64(LastYear-year) + 0.5
	full := float64(LastYear-FirstYear) + 0.5
	return fieldExpected[field] * age / full * paperTypes[typ].Level
}

// papersCSV writes the paper records: one row per paper with its year,
// document type, fine fields (Frascati second-level codes, ";"-separated),
// citations, the register ids of its institutions and their countries
// (";"-separated) and the kinds of affiliation on it. Every institution
// leads some sampled papers in every year it has papers; citations follow
// its citation impact, international and industry co-authorship its
// shares, fields its subject profile.
func papersCSV(seed uint64, insts []institution, v *values) []byte {
	r := stream(seed, 3)
	close := map[string]bool{FocusID: true}
	for _, p := range ChosenPeers {
		close[p] = true
	}
	w := newCSV("paper", "year", "type", "field", "citations", "institutions", "countries", "affiliation_types")
	n := 0
	typeShares := make([]float64, len(paperTypes))
	for i, pt := range paperTypes {
		typeShares[i] = pt.Share
	}
	for t, year := range years() {
		// Co-authors are drawn in proportion to an institution's papers
		// in the year: from the lead's own country, from the other
		// countries (the first co-author of an international paper), or
		// from anywhere (the further co-authors of an international one).
		weights := make([]float64, len(insts))
		for i := range insts {
			if p := v.v[i]["papers"][t]; !math.IsNaN(p) {
				weights[i] = p
			}
		}
		all := newSampler(weights, func(int) bool { return true })
		home := make([]sampler, len(countries))
		abroad := make([]sampler, len(countries))
		for ci := range countries {
			home[ci] = newSampler(weights, func(j int) bool { return insts[j].Country == ci })
			abroad[ci] = newSampler(weights, func(j int) bool { return insts[j].Country != ci })
		}
		for lead, in := range insts {
			papers := v.v[lead]["papers"][t]
			if math.IsNaN(papers) || papers == 0 {
				continue
			}
			k := int(math.Round(papers / sampleEvery))
			k = max(minSampled, min(maxSampled, k))
			if close[in.ID] {
				k = closeSampled
			}
			intlShare := v.v[lead]["intl_coauthorship"][t] / 100
			indShare := v.v[lead]["industry_coauthorship"][t] / 100
			impact := v.v[lead]["citation_impact"][t]
			for range k {
				n++
				field := drawIndex(r, in.Profile[:])
				typ := drawIndex(r, typeShares)
				fine := fmt.Sprintf("%d.%d", field+1, 1+r.intn(fields[field].Fine))
				if r.chance(0.2) {
					// Some papers are classified in a second fine field of
					// the same broad field.
					if other := fmt.Sprintf("%d.%d", field+1, 1+r.intn(fields[field].Fine)); other != fine {
						fine += ";" + other
					}
				}
				// Citations are over-dispersed: a gamma-mixed Poisson
				// (negative binomial) with mean expected x impact.
				mean := expectedCitations(field, year, typ) * impact * r.gamma(1.2) / 1.2
				cites := r.poisson(mean)
				authors := []int{lead}
				coauthors := r.poisson(1.3)
				intl := r.chance(intlShare)
				// An international paper has a first co-author abroad; every
				// other co-author is drawn from the lead's country unless the
				// paper is already international.
				for a := 0; a < coauthors+boolInt(intl) && len(authors) < 8; a++ {
					from := home[in.Country]
					switch {
					case intl && a == 0:
						from = abroad[in.Country]
					case intl:
						from = all
					}
					for try := 0; try < 40; try++ {
						if j := from.draw(r); !contains(authors, j) {
							authors = append(authors, j)
							break
						}
					}
				}
				kinds := []string{"academic"}
				if r.chance(indShare) {
					kinds = append(kinds, "industry")
				}
				if field == 2 && r.chance(0.35) {
					kinds = append(kinds, "health")
				}
				var ids, cs []string
				seen := map[string]bool{}
				for _, a := range authors {
					ids = append(ids, insts[a].ID)
					if c := countries[insts[a].Country].Name; !seen[c] {
						seen[c] = true
						cs = append(cs, c)
					}
				}
				w.row(fmt.Sprintf("P%06d", n), strconv.Itoa(year), paperTypes[typ].Name, fine, strconv.Itoa(cites),
					strings.Join(ids, ";"), strings.Join(cs, ";"), strings.Join(kinds, ";"))
			}
		}
	}
	return w.bytes()
}

// Survey size: respondents in the last year's peer survey, and how many
// institutions each may name.
const (
	respondents   = 3000
	maxNominated  = 5
	homeBiasRatio = 4
)

// votesCSV writes the vote records of the last year's peer survey: one row
// per nomination. Respondents name institutions they consider among the
// best in their field, favouring research-intensive ones and, strongly,
// their own country's (home bias, a well-known feature of such surveys).
// It returns the file and each institution's nominations weighted so that
// respondents match the target shares of their countries
// (post-stratification on one variable: weight = target share / sample
// share; e.g. Kalton and Flores-Cervantes 2003, "Weighting methods",
// Journal of Official Statistics 19(2), from memory).
func votesCSV(seed uint64, insts []institution, v *values) ([]byte, []float64) {
	r := stream(seed, 4)
	w := newCSV("respondent", "respondent_country", "field", "institution")
	last := len(years()) - 1
	targets := surveyTargets(insts, v)
	// The weights depend only on the respondent's country and field, so
	// they are computed once per combination.
	type wkey struct{ home, field int }
	cache := map[wkey][]float64{}
	weightsFor := func(k wkey) []float64 {
		if w, ok := cache[k]; ok {
			return w
		}
		weights := make([]float64, len(insts))
		for i, in := range insts {
			wgt := v.esteem[i][last] * (0.2 + in.Profile[k.field])
			if in.Country == k.home {
				wgt *= homeBiasRatio
			}
			weights[i] = wgt
		}
		cache[k] = weights
		return weights
	}
	// Respondents come from the countries in proportion to their research
	// staff, with a few countries over-represented (the demo's survey needs
	// weighting, as real ones do).
	reach := make([]float64, len(countries))
	for ci := range countries {
		reach[ci] = targets[ci] * (1 + 0.6*float64(ci%2))
	}
	fieldShares := []float64{0.24, 0.2, 0.2, 0.06, 0.2, 0.1}
	homeOf := make([]int, respondents+1)
	nominated := make([][]int, respondents+1)
	for k := 1; k <= respondents; k++ {
		home := drawIndex(r, reach)
		field := drawIndex(r, fieldShares)
		weights := weightsFor(wkey{home, field})
		count := 1 + r.intn(maxNominated)
		var chosen []int
		for len(chosen) < count {
			j := drawIndex(r, weights)
			if !contains(chosen, j) {
				chosen = append(chosen, j)
			}
		}
		sort.Ints(chosen)
		for _, j := range chosen {
			w.row(fmt.Sprintf("R%05d", k), countries[home].Name, fields[field].Key[len("field_"):], insts[j].ID)
		}
		homeOf[k], nominated[k] = home, chosen
	}
	// Every institution receives at least one nomination, so the vote
	// records cover the whole world and baselines computed from them are
	// baselines of every institution. An institution the draws above never
	// named gets one further respondent from its own country, in its
	// largest broad field, who names it and draws the rest of a usual list
	// as every respondent does: one weighted vote keeps its esteem near the
	// bottom, where its weight put it.
	named := make([]bool, len(insts))
	for k := 1; k <= respondents; k++ {
		for _, j := range nominated[k] {
			named[j] = true
		}
	}
	for i, in := range insts {
		if named[i] {
			continue
		}
		field := 0
		for f, s := range in.Profile {
			if s > in.Profile[field] {
				field = f
			}
		}
		weights := weightsFor(wkey{in.Country, field})
		count := 1 + r.intn(maxNominated)
		chosen := []int{i}
		for len(chosen) < count {
			j := drawIndex(r, weights)
			if !contains(chosen, j) {
				chosen = append(chosen, j)
			}
		}
		sort.Ints(chosen)
		k := len(homeOf)
		for _, j := range chosen {
			w.row(fmt.Sprintf("R%05d", k), countries[in.Country].Name, fields[field].Key[len("field_"):], insts[j].ID)
			named[j] = true
		}
		homeOf, nominated = append(homeOf, in.Country), append(nominated, chosen)
	}
	total := len(homeOf) - 1
	sample := make([]float64, len(countries))
	for k := 1; k <= total; k++ {
		sample[homeOf[k]]++
	}
	weighted := make([]float64, len(insts))
	for k := 1; k <= total; k++ {
		wgt := targets[homeOf[k]] / (sample[homeOf[k]] / float64(total))
		for _, j := range nominated[k] {
			weighted[j] += wgt
		}
	}
	return w.bytes(), weighted
}

// esteemFromVotes sets the last year's peer_esteem from the vote records:
// weighted nominations scaled so that the most-nominated institution
// scores 100, so the values file and the records agree exactly.
func esteemFromVotes(v *values, weighted []float64) {
	last := len(years()) - 1
	top := 0.0
	for _, x := range weighted {
		top = math.Max(top, x)
	}
	for i := range v.v {
		if !math.IsNaN(v.v[i]["peer_esteem"][last]) {
			v.v[i]["peer_esteem"][last] = 100 * weighted[i] / top
		}
	}
}

// surveyTargets are the shares of academic staff by country in the last
// year: the population the survey's respondents should represent.
func surveyTargets(insts []institution, v *values) []float64 {
	last := len(years()) - 1
	out := make([]float64, len(countries))
	total := 0.0
	for i, in := range insts {
		if a := v.v[i]["academic_staff"][last]; !math.IsNaN(a) {
			out[in.Country] += a
			total += a
		}
	}
	for ci := range out {
		out[ci] /= total
	}
	return out
}

// targetsCSV writes the survey's target shares by country.
func targetsCSV(insts []institution, v *values) []byte {
	w := newCSV("country", "share")
	for ci, s := range surveyTargets(insts, v) {
		w.row(countries[ci].Name, num(s, 4))
	}
	return w.bytes()
}

// sampler draws indices with probability proportional to their weights,
// among the indices a filter kept: inverse transform sampling over the
// cumulative weights, by binary search (O(log n) a draw).
type sampler struct {
	idx []int
	cum []float64
}

func newSampler(weights []float64, keep func(int) bool) sampler {
	var s sampler
	total := 0.0
	for i, w := range weights {
		if w > 0 && keep(i) {
			total += w
			s.idx = append(s.idx, i)
			s.cum = append(s.cum, total)
		}
	}
	return s
}

func (s sampler) draw(r *rng) int {
	u := r.uniform() * s.cum[len(s.cum)-1]
	k := sort.Search(len(s.cum), func(i int) bool { return s.cum[i] > u })
	return s.idx[min(k, len(s.idx)-1)]
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
