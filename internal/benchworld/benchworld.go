// Package benchworld writes the world-sized benchmark scenario: an invented
// register of institutions in numbered higher-education systems, a
// dictionary of 24 indicators, ten years of values in the long shape and a
// brief with one comparison group per system (each: country), twelve
// charts, tables and commentary. Everything is drawn from a fixed seed, so
// the files are the same on every machine; no name is a real place (the
// systems and regions are numbered, the institutions are ids).
//
// It feeds the Go benchmarks at world size and examples/bench, where the
// same files go through peerpack and through a pandas + matplotlib script
// doing the same work.
package benchworld

import (
	"bufio"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
)

// Options size the world.
type Options struct {
	Institutions int    // default 21,500
	Systems      int    // higher-education systems (countries); default 120
	FirstYear    int    // default 2016
	Years        int    // default 10
	Seed         uint64 // default 10
	// Brief is the brief written: "" for the world brief (12 charts, five
	// tables, four commentary blocks), BriefCharts for the 24-chart one.
	Brief string
}

func (o Options) or() Options {
	if o.Institutions <= 0 {
		o.Institutions = 21500
	}
	if o.Systems <= 0 {
		o.Systems = 120
	}
	if o.Systems > o.Institutions {
		o.Systems = o.Institutions
	}
	if o.FirstYear == 0 {
		o.FirstYear = 2016
	}
	if o.Years <= 0 {
		o.Years = 10
	}
	if o.Seed == 0 {
		o.Seed = 10
	}
	return o
}

// Focus is the register id of the focus institution of the brief.
const Focus = "I00007"

// indicator is one dictionary entry and how its values are drawn: a
// level from the institution's latent research and international scores,
// on a log scale (ratios, money, counts) or a logit scale (percents).
type indicator struct {
	key, label, short, unit, better string
	decimals                        int
	// base is the median level; research and intl weigh the latent
	// scores; noise is the yearly noise; trend the yearly drift (all on
	// the log or logit scale).
	base, research, intl, noise, trend float64
	logit                              bool
	size                               bool // scales with the institution's size
}

// Indicators are the 24 indicators of the world, dictionary order.
var indicators = []indicator{
	{"citation_impact", "Field-normalised citation impact", "Citation impact", "index", "higher", 2, 1.0, 0.35, 0.10, 0.06, 0.005, false, false},
	{"top10_share", "Share of papers in the top 10% most cited", "Top 10% papers", "percent", "higher", 1, 10, 0.30, 0.05, 0.05, 0.003, true, false},
	{"papers_per_academic", "Papers per academic", "Papers per academic", "ratio", "higher", 2, 1.2, 0.45, 0.05, 0.05, 0.02, false, false},
	{"research_income_per_academic", "Research income per academic", "Research income per academic", "currency", "higher", 0, 60000, 0.50, 0.05, 0.06, 0.02, false, false},
	{"intl_coauthorship", "Internationally co-authored papers", "Intl co-authored", "percent", "higher", 1, 45, 0.20, 0.45, 0.04, 0.02, true, false},
	{"industry_coauthorship", "Papers co-authored with industry", "Industry co-authored", "percent", "higher", 1, 4, 0.25, 0.05, 0.06, 0.01, true, false},
	{"intl_staff_share", "International academic staff", "Intl staff", "percent", "higher", 1, 18, 0.10, 0.50, 0.04, 0.01, true, false},
	{"intl_student_share", "International students", "Intl students", "percent", "higher", 1, 12, 0.05, 0.55, 0.05, 0.01, true, false},
	{"students_per_academic", "Students per academic", "Students per academic", "ratio", "lower", 1, 17, -0.15, 0, 0.03, -0.005, false, false},
	{"doctorates_per_academic", "Doctorates awarded per academic", "Doctorates per academic", "ratio", "higher", 2, 0.25, 0.50, 0.05, 0.08, 0.01, false, false},
	{"continuation_rate", "Students continuing after the first year", "Continuation", "percent", "higher", 1, 88, 0.15, 0, 0.05, 0.002, true, false},
	{"completion_rate", "Students completing within the expected time", "Completion", "percent", "higher", 1, 72, 0.15, 0, 0.05, 0.003, true, false},
	{"graduate_outcomes", "Graduates in work or further study", "Graduate outcomes", "percent", "higher", 1, 85, 0.10, 0.05, 0.05, 0.002, true, false},
	{"income_per_student", "Income per student", "Income per student", "currency", "higher", 0, 15000, 0.30, 0.05, 0.04, 0.015, false, false},
	{"operating_surplus", "Operating surplus", "Surplus", "percent", "higher", 1, 3, 0.05, 0, 0.25, 0, true, false},
	{"research_income_share", "Research income as a share of income", "Research income share", "percent", "higher", 1, 18, 0.40, 0.05, 0.05, 0.005, true, false},
	{"peer_esteem", "Peer esteem (most-voted = 100)", "Peer esteem", "score", "higher", 1, 8, 0.70, 0.10, 0.08, 0, false, false},
	{"exchange_income_per_academic", "Knowledge-exchange income per academic", "Exchange income per academic", "currency", "higher", 0, 6000, 0.30, 0.05, 0.10, 0.01, false, false},
	{"spinouts", "Spin-out companies formed", "Spin-outs", "count", "higher", 0, 2, 0.50, 0.05, 0.30, 0.01, false, true},
	{"academic_staff", "Academic staff (full-time equivalent)", "Academic staff", "count", "neutral", 0, 900, 0.10, 0, 0.02, 0.01, false, true},
	{"students", "Students (full-time equivalent)", "Students", "count", "neutral", 0, 15000, 0, 0, 0.02, 0.01, false, true},
	{"papers", "Papers", "Papers", "count", "neutral", 0, 1100, 0.45, 0.05, 0.05, 0.03, false, true},
	{"total_income", "Total income", "Total income", "currency", "neutral", 0, 250e6, 0.30, 0.05, 0.03, 0.02, false, true},
	{"field_natural", "Natural sciences share of output", "Natural sciences", "percent", "neutral", 1, 30, 0.10, 0, 0.03, 0, true, false},
}

// Write writes institutions.csv, indicators.yaml, values.csv and brief.md
// into dir (which must exist).
func Write(dir string, o Options) error {
	o = o.or()
	rng := rand.New(rand.NewPCG(o.Seed, 21500))
	sys := systemSizes(o.Institutions, o.Systems)
	type inst struct {
		id, system, region string
		research, intl     float64 // latent scores
		size               float64 // log-scale size factor
	}
	sysResearch := make([]float64, o.Systems)
	sysIntl := make([]float64, o.Systems)
	for s := range sysResearch {
		sysResearch[s] = rng.NormFloat64() * 0.4
		sysIntl[s] = rng.NormFloat64() * 0.5
	}
	insts := make([]inst, 0, o.Institutions)
	for s, n := range sys {
		for k := 0; k < n; k++ {
			i := len(insts)
			insts = append(insts, inst{
				id:       fmt.Sprintf("I%05d", i),
				system:   fmt.Sprintf("System %03d", s+1),
				region:   fmt.Sprintf("Region %d", s%6+1),
				research: sysResearch[s] + rng.NormFloat64(),
				intl:     sysIntl[s] + rng.NormFloat64(),
				size:     rng.NormFloat64() * 0.6,
			})
		}
	}
	// The focus: a research-strong institution of the first system.
	if len(insts) > 7 {
		insts[7].research, insts[7].intl = 1.1, 0.3
	}

	err := writeFile(dir, "institutions.csv", func(w *bufio.Writer) {
		w.WriteString("id,name,short_name,country,region\n")
		for _, in := range insts {
			fmt.Fprintf(w, "%s,Institution %s,%s,%s,%s\n", in.id, in.id[1:], in.id, in.system, in.region)
		}
	})
	if err != nil {
		return err
	}
	err = writeFile(dir, "indicators.yaml", func(w *bufio.Writer) {
		w.WriteString("# The benchmark world's dictionary: invented data, indicators named after the\n# usual conventions of the trade.\nindicators:\n")
		for _, ind := range indicators {
			fmt.Fprintf(w, "  - {key: %s, label: %q, short: %q, unit: %s, better: %s, decimals: %d}\n",
				ind.key, ind.label, ind.short, ind.unit, ind.better, ind.decimals)
		}
	})
	if err != nil {
		return err
	}
	err = writeFile(dir, "values.csv", func(w *bufio.Writer) {
		w.WriteString("institution,year,indicator,value\n")
		buf := make([]byte, 0, 64)
		for _, in := range insts {
			// Each institution's own level of each indicator, then small
			// yearly moves around its trend: a unit slip is rare, as in
			// real returns.
			level := make([]float64, len(indicators))
			for k, ind := range indicators {
				level[k] = ind.research*in.research + ind.intl*in.intl + rng.NormFloat64()*0.25
				if ind.size {
					level[k] += in.size
				}
			}
			for y := 0; y < o.Years; y++ {
				year := o.FirstYear + y
				for k, ind := range indicators {
					if rng.IntN(100) < 3 {
						continue // about 3% missing
					}
					z := level[k] + ind.trend*float64(y) + rng.NormFloat64()*ind.noise
					var v float64
					if ind.logit {
						b := ind.base / 100
						l := math.Log(b/(1-b)) + z
						v = 100 / (1 + math.Exp(-l))
					} else {
						v = ind.base * math.Exp(z)
					}
					buf = buf[:0]
					buf = append(buf, in.id...)
					buf = append(buf, ',')
					buf = strconv.AppendInt(buf, int64(year), 10)
					buf = append(buf, ',')
					buf = append(buf, ind.key...)
					buf = append(buf, ',')
					buf = strconv.AppendFloat(buf, v, 'f', ind.decimals+2, 64)
					buf = append(buf, '\n')
					w.Write(buf)
				}
			}
		}
	})
	if err != nil {
		return err
	}
	return writeFile(dir, "brief.md", func(w *bufio.Writer) {
		last := o.FirstYear + o.Years - 1
		if o.Brief == BriefCharts {
			w.WriteString(chartsBrief(Focus, last, o.FirstYear, last))
			return
		}
		fmt.Fprintf(w, briefText, Focus, last, o.FirstYear, last)
	})
}

// systemSizes shares n institutions among k systems, a few large and many
// small (sizes falling as 1/rank^0.8), each with at least five when
// there are enough.
func systemSizes(n, k int) []int {
	w := make([]float64, k)
	sum := 0.0
	for i := range w {
		w[i] = 1 / math.Pow(float64(i+1), 0.8)
		sum += w[i]
	}
	least := min(5, n/k)
	sizes := make([]int, k)
	left := n
	for i := range sizes {
		sizes[i] = max(least, int(float64(n)*w[i]/sum))
		left -= sizes[i]
	}
	for i := 0; left != 0; i = (i + 1) % k {
		switch {
		case left > 0:
			sizes[i]++
			left--
		case sizes[i] > least:
			sizes[i]--
			left++
		}
	}
	return sizes
}

func writeFile(dir, name string, fill func(*bufio.Writer)) error {
	f, err := os.Create(filepath.Join(dir, name))
	if err != nil {
		return err
	}
	w := bufio.NewWriterSize(f, 1<<20)
	fill(w)
	if err := w.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}
