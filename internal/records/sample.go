package records

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"sort"
	"strconv"
)

// SampleOptions shape a generated, invented world of papers or votes. The
// same options and seed always give the same bytes.
type SampleOptions struct {
	Papers       int // papers to generate
	Fields       int // fine fields, spread over the six broad fields
	Institutions int
	Countries    int    // default: Institutions / 40, at least 3
	Years        int    // publication years, default 5
	LastYear     int    // default 2025
	Seed         uint64 // default 1
	// Industry adds an affiliation type column with industry partners.
	Industry bool
	// Pairs writes one row per paper and affiliation.
	Pairs bool
	// Respondents and Votes shape a vote sample (SampleVotes).
	Respondents, VotesEach int
}

func (o *SampleOptions) defaults() {
	if o.Fields <= 0 {
		o.Fields = 344
	}
	if o.Institutions <= 0 {
		o.Institutions = 2000
	}
	if o.Countries <= 0 {
		o.Countries = max(3, o.Institutions/40)
	}
	if o.Years <= 0 {
		o.Years = 5
	}
	if o.LastYear == 0 {
		o.LastYear = 2025
	}
	if o.Seed == 0 {
		o.Seed = 1
	}
}

// sampleWorld is the fixed part of a generated world.
type sampleWorld struct {
	fields    []string  // codes "b.ss.ff" under Frascati broad field b
	fieldMean []float64 // mean citations of a paper of the field in the first year
	cumField  []float64
	instIDs   []string
	instCtry  []int
	cumInst   []float64
	countries []string
}

// Invented country codes: two letters from a consonant-vowel pattern no
// ISO 3166 code uses as a pair with a digit, e.g. "KA1".
func countryCode(i int) string {
	return fmt.Sprintf("%c%c%d", "BDFGKLMNPRSTVZ"[i%14], "AEIOU"[(i/14)%5], i/70)
}

func newSampleWorld(o SampleOptions, r *rand.Rand) *sampleWorld {
	w := &sampleWorld{}
	// Broad fields get shares of the fine fields and of output roughly
	// like a research-intensive system: natural and health sciences
	// largest, humanities smallest (invented).
	broadShare := []float64{0.30, 0.22, 0.26, 0.05, 0.12, 0.05}
	broadCites := []float64{9, 7, 12, 5, 5, 2}
	total := 0.0
	for i := 0; i < o.Fields; i++ {
		b := pickIndex(r, broadShare)
		w.fields = append(w.fields, fmt.Sprintf("%d.%02d.%02d", b+1, 1+i%9, 1+i/9%99))
		w.fieldMean = append(w.fieldMean, broadCites[b]*math.Exp(0.5*r.NormFloat64()))
		total += 0.2 + r.ExpFloat64()
		w.cumField = append(w.cumField, total)
	}
	// Make field codes unique (two fields may draw the same code).
	seen := map[string]int{}
	for i, f := range w.fields {
		if n := seen[f]; n > 0 {
			w.fields[i] = fmt.Sprintf("%s%c", f, 'a'+byte(n-1)%26)
		}
		seen[f]++
	}
	for i := 0; i < o.Countries; i++ {
		w.countries = append(w.countries, countryCode(i))
	}
	total = 0
	for i := 0; i < o.Institutions; i++ {
		w.instIDs = append(w.instIDs, fmt.Sprintf("R%05d", i+1))
		w.instCtry = append(w.instCtry, int(math.Min(float64(o.Countries-1), math.Floor(float64(o.Countries)*math.Pow(r.Float64(), 1.6)))))
		// Sizes are heavy-tailed (a few large research universities).
		total += math.Exp(1.2 * r.NormFloat64())
		w.cumInst = append(w.cumInst, total)
	}
	return w
}

func pickIndex(r *rand.Rand, weights []float64) int {
	t := 0.0
	for _, w := range weights {
		t += w
	}
	u := r.Float64() * t
	for i, w := range weights {
		if u < w {
			return i
		}
		u -= w
	}
	return len(weights) - 1
}

func pickCum(r *rand.Rand, cum []float64) int {
	u := r.Float64() * cum[len(cum)-1]
	return min(sort.SearchFloat64s(cum, u), len(cum)-1)
}

// poisson draws a Poisson count (Knuth's method for small means, a
// normal approximation above 30; adequate for invented samples).
func poisson(r *rand.Rand, mean float64) int {
	if mean <= 0 {
		return 0
	}
	if mean > 30 {
		return max(0, int(math.Round(mean+math.Sqrt(mean)*r.NormFloat64())))
	}
	l, k, p := math.Exp(-mean), 0, 1.0
	for {
		p *= r.Float64()
		if p <= l {
			return k
		}
		k++
	}
}

// gamma draws Gamma(shape, 1) by Marsaglia and Tsang (2000), shape >= 1.
func gamma(r *rand.Rand, shape float64) float64 {
	d := shape - 1.0/3
	c := 1 / math.Sqrt(9*d)
	for {
		x := r.NormFloat64()
		v := 1 + c*x
		if v <= 0 {
			continue
		}
		v = v * v * v
		if u := r.Float64(); math.Log(u) < 0.5*x*x+d-d*v+d*math.Log(v) {
			return d * v
		}
	}
}

// SamplePapers writes an invented world of papers as CSV, one row per paper
// (or per paper and affiliation with Pairs). Citations are gamma-mixed
// Poisson (over-dispersed, as citation counts are), younger papers less
// cited; about three affiliations a paper.
func SamplePapers(out io.Writer, o SampleOptions) error {
	o.defaults()
	r := rand.New(rand.NewPCG(o.Seed, 0x9e3779b97f4a7c15))
	w := newSampleWorld(o, r)
	bw := bufio.NewWriterSize(out, 1<<20)
	hdr := "paper,year,type,field,citations,institutions,countries"
	if o.Pairs {
		hdr = "paper,year,type,field,citations,institution,country"
	}
	if o.Industry {
		if o.Pairs {
			hdr += ",affiliation_type"
		} else {
			hdr += ",affiliation_types"
		}
	}
	bw.WriteString(hdr + "\n")
	types := []string{"article", "review", "conference paper"}
	typeShare := []float64{0.8, 0.08, 0.12}
	typeCites := []float64{1, 2.2, 0.5}
	first := o.LastYear - o.Years + 1
	var line, head []byte
	var insts []int
	var industry []bool
	for p := 0; p < o.Papers; p++ {
		year := first + min(o.Years-1, p*o.Years/max(o.Papers, 1))
		t := pickIndex(r, typeShare)
		f1 := pickCum(r, w.cumField)
		f2 := -1
		if r.Float64() < 0.1 {
			if f2 = pickCum(r, w.cumField); f2 == f1 {
				f2 = -1
			}
		}
		age := float64(o.LastYear-year) + 0.5
		mean := w.fieldMean[f1] * typeCites[t] * age / float64(o.Years)
		cites := poisson(r, mean*gamma(r, 1.5)/1.5)
		n := 1 + poisson(r, 2)
		insts, industry = insts[:0], industry[:0]
		lead := pickCum(r, w.cumInst)
		insts = append(insts, lead)
		industry = append(industry, false)
		for len(insts) < n {
			j := pickCum(r, w.cumInst)
			// Most co-authors share the lead's country.
			if w.instCtry[j] != w.instCtry[lead] && r.Float64() < 0.85 {
				continue
			}
			dup := false
			for _, k := range insts {
				dup = dup || k == j
			}
			if !dup {
				insts = append(insts, j)
				industry = append(industry, o.Industry && r.Float64() < 0.04)
			}
		}
		head = head[:0]
		head = append(head, 'P')
		head = strconv.AppendInt(head, int64(p+1), 10)
		head = append(head, ',')
		head = strconv.AppendInt(head, int64(year), 10)
		head = append(head, ',')
		head = append(head, types[t]...)
		head = append(head, ',')
		head = append(head, w.fields[f1]...)
		if f2 >= 0 {
			head = append(head, ';')
			head = append(head, w.fields[f2]...)
		}
		head = append(head, ',')
		head = strconv.AppendInt(head, int64(cites), 10)
		head = append(head, ',')
		if o.Pairs {
			for i, k := range insts {
				line = append(line[:0], head...)
				line = append(line, w.instIDs[k]...)
				line = append(line, ',')
				line = append(line, w.countries[w.instCtry[k]]...)
				if o.Industry {
					line = append(line, ',')
					line = append(line, affType(industry[i])...)
				}
				line = append(line, '\n')
				bw.Write(line)
			}
			continue
		}
		line = append(line[:0], head...)
		for i, k := range insts {
			if i > 0 {
				line = append(line, ';')
			}
			line = append(line, w.instIDs[k]...)
		}
		line = append(line, ',')
		for i, k := range insts {
			if i > 0 {
				line = append(line, ';')
			}
			line = append(line, w.countries[w.instCtry[k]]...)
		}
		if o.Industry {
			line = append(line, ',')
			for i := range insts {
				if i > 0 {
					line = append(line, ';')
				}
				line = append(line, affType(industry[i])...)
			}
		}
		line = append(line, '\n')
		if _, err := bw.Write(line); err != nil {
			return err
		}
	}
	return bw.Flush()
}

func affType(industry bool) string {
	if industry {
		return "industry"
	}
	return "university"
}

// voteFields are the fields a generated survey asks about: the six
// Frascati broad fields by short name.
var voteFields = []string{"natural", "engineering", "health", "agriculture", "social", "humanities"}

// SampleVotes writes an invented peer survey: votes (one row per vote) and
// target shares of researchers by country. Respondents over-represent
// some countries, so weighting matters; they favour large institutions
// and their own country.
func SampleVotes(votes, targets io.Writer, o SampleOptions) error {
	o.defaults()
	if o.Respondents <= 0 {
		o.Respondents = 2000
	}
	if o.VotesEach <= 0 {
		o.VotesEach = 5
	}
	r := rand.New(rand.NewPCG(o.Seed, 0x2545f4914f6cdd1d))
	w := newSampleWorld(o, r)
	// Researchers by country: the sum of the institutions' sizes.
	research := make([]float64, len(w.countries))
	prev := 0.0
	byCountry := make([][]int, len(w.countries))
	for i, c := range w.instCtry {
		research[c] += w.cumInst[i] - prev
		prev = w.cumInst[i]
		byCountry[c] = append(byCountry[c], i)
	}
	// Response rates differ by country (invented), so the sample's
	// shares differ from the targets.
	resp := make([]float64, len(research))
	for c := range resp {
		resp[c] = research[c] * math.Exp(0.8*r.NormFloat64())
	}
	bt := bufio.NewWriter(targets)
	bt.WriteString("country,share\n")
	total := 0.0
	for _, v := range research {
		total += v
	}
	for c, v := range research {
		if v > 0 {
			fmt.Fprintf(bt, "%s,%s\n", w.countries[c], strconv.FormatFloat(100*v/total, 'f', 4, 64))
		}
	}
	if err := bt.Flush(); err != nil {
		return err
	}
	bv := bufio.NewWriter(votes)
	bv.WriteString("respondent,respondent_country,field,institution\n")
	for p := 0; p < o.Respondents; p++ {
		c := pickIndex(r, resp)
		f := pickIndex(r, []float64{0.3, 0.22, 0.26, 0.05, 0.12, 0.05})
		chosen := map[int]bool{}
		for try := 0; len(chosen) < o.VotesEach && try < 20*o.VotesEach; try++ {
			var j int
			if r.Float64() < 0.4 && len(byCountry[c]) > 0 {
				j = byCountry[c][r.IntN(len(byCountry[c]))]
			} else {
				j = pickCum(r, w.cumInst)
			}
			if chosen[j] {
				continue
			}
			chosen[j] = true
			fmt.Fprintf(bv, "S%06d,%s,%s,%s\n", p+1, w.countries[c], voteFields[f], w.instIDs[j])
		}
	}
	return bv.Flush()
}
