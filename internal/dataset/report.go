package dataset

import (
	"fmt"
	"io"
	"strconv"
	"strings"
	"sync"

	"peerpack/internal/diag"
)

// Report is what `peerpack check` prints about the data: what was read,
// how complete it is, what looks wrong without being an error, and what
// the conversions, derivations and population rules did.
type Report struct {
	Brief        string
	Files        []FileSummary
	Institutions int
	Countries    int
	Years        []int
	// Indicators has one entry per dictionary indicator, in dictionary
	// order.
	Indicators []IndicatorCoverage
	// Suspicious lists findings that are legal but worth a look, the most
	// extreme MaxSuspicious per kind and indicator; SuspiciousCount has the
	// totals by kind. A far-from-the-median finding covers one institution
	// and indicator over all the years it is far out.
	Suspicious      []Suspicion
	SuspiciousCount map[string]int
	Derived         []DerivedOutcome
	PPP             *PPPSummary
	Population      *PopulationOutcome
	// Groups is filled by the figures stage (group membership is decided
	// there) and printed by Write when present.
	Groups []GroupCoverage
	// Problems is the number of problems Load found.
	Problems int
	// Notes are things done to the inputs that a reader should know of
	// (a spreadsheet cell read in another unit, say); not problems.
	Notes []string

	// summary fills Years, Indicators, Suspicious and SuspiciousCount;
	// see Summarise.
	summary     func()
	summaryOnce sync.Once
	summaryErr  error
}

// Summarise completes the data summary: Years, Indicators (coverage) and
// the suspicious values. Load has done it already; after LoadUnsummarised
// it runs on the first call, and later calls (from any goroutine) wait for
// it and return the same result. Write calls it. The error is an internal
// fault of the summary, as a message for the user.
func (r *Report) Summarise() error {
	r.summaryOnce.Do(func() {
		if r.summary == nil {
			return
		}
		defer func() {
			if e := recover(); e != nil {
				r.summaryErr = diag.At(r.Brief, 0, 0, "internal error while summarising the data (please report it with the brief and its files): %v", e)
			}
		}()
		r.summary()
		r.summary = nil
	})
	return r.summaryErr
}

// MaxSuspicious caps the suspicious values listed per kind and indicator.
const MaxSuspicious = 5

// FileSummary is one file read.
type FileSummary struct {
	Role string // register, dictionary, values (long), values (wide), PPP factors
	Path string
	// Rows counts data rows, or indicators for the dictionary.
	Rows int
}

// IndicatorCoverage is the coverage of one indicator by year: Values[i]
// institutions have a value in Years[i], a Coverage[i] share of the
// register (0..1).
type IndicatorCoverage struct {
	Key, Label string
	Unit       Unit
	Derived    bool
	Currency   bool
	Values     []int
	Coverage   []float64
}

// Kinds of suspicious value.
const (
	SuspectFarOut      = "far from the median"
	SuspectLowCoverage = "low coverage year"
	SuspectOutOfRange  = "derived value out of range"
	SuspectJump        = "jump from the institution's other years"
	SuspectMagnitude   = "implausible magnitude"
	JumpFactor         = 10.0 // a value this many times its own other years' median (or a tenth of it)
	FarOutIQRs         = 10.0 // how many interquartile ranges from the median is "far"
	// FarOutLogIQRs is the same distance on a log scale, for counts and
	// money (see farOutOnLogScale): 3 IQRs of the logarithms, the width
	// of Tukey's (1977) "far out" fences, flags no institution of the demo
	// but a thousandfold slip of a typical one in every indicator whose
	// middle half spans less than a factor of 8 (common practice, no
	// source).
	FarOutLogIQRs       = 3.0
	LowCoverageFraction = 0.5 // a year below this fraction of the usual coverage is flagged
)

// Suspicion is one value (or year) worth checking.
type Suspicion struct {
	Kind        string
	Indicator   string
	Institution string // id; empty for a year-level finding
	Year        int
	Value       float64
	// Where is file:line of a value read from a file; empty when derived.
	Where string
	Msg   string
}

// DerivedOutcome counts what a derivation produced over all institutions
// and years.
type DerivedOutcome struct {
	Key, Expr    string
	Computed     int
	MissingInput int
	DivideByZero int
}

// PPPSummary says how currency indicators were converted.
type PPPSummary struct {
	File      string
	Factors   int
	Countries int
	Converted []string
	Values    int
}

// PopulationOutcome is the result of the brief's population rules.
type PopulationOutcome struct {
	Rules    []string
	Included int
	Excluded []Exclusion
	// Unchecked counts institutions a max_value rule could not check for
	// want of a value in the brief's year; they stay in.
	Unchecked     int
	FocusExcluded bool
}

// Exclusion is one institution left out of the ranked population.
type Exclusion struct {
	ID, Name string
	Reasons  []string
}

// GroupCoverage is the coverage of one comparison group, by indicator
// (rows, in Indicators order) and year (columns, in Years order), as a
// share of the group's members (0..1).
type GroupCoverage struct {
	Name       string
	Members    int
	Indicators []string
	Years      []int
	Coverage   [][]float64
}

// MaxListed caps how many excluded institutions Write lists by name.
const MaxListed = 25

// Write prints the report as plain text for a person.
func (r *Report) Write(w io.Writer) {
	p := func(format string, args ...any) { fmt.Fprintf(w, format, args...) }
	if err := r.Summarise(); err != nil {
		p("%v\n", err)
	}
	p("Data for %s\n", r.Brief)
	for _, f := range r.Files {
		what := plural(f.Rows, "row", "rows")
		switch f.Role {
		case "dictionary":
			what = plural(f.Rows, "indicator", "indicators")
		case "register":
			what = plural(f.Rows, "institution", "institutions")
		}
		p("  %-15s %s (%s %s)\n", f.Role, f.Path, thousands(f.Rows), what)
	}
	p("\n%s institutions in %s countries", thousands(r.Institutions), thousands(r.Countries))
	if len(r.Years) > 0 {
		p(", years %d-%d", r.Years[0], r.Years[len(r.Years)-1])
	}
	p(", %d indicators\n", len(r.Indicators))

	if len(r.Indicators) > 0 && len(r.Years) > 0 {
		p("\nCoverage (share of institutions with a value)\n")
		keyW := len("indicator")
		for _, ic := range r.Indicators {
			keyW = max(keyW, len(ic.Key)+2)
		}
		p("  %-*s", keyW, "indicator")
		for _, y := range r.Years {
			p(" %5d", y)
		}
		p("\n")
		for _, ic := range r.Indicators {
			mark := ""
			if ic.Derived {
				mark = " ="
			}
			if ic.Currency {
				mark = " $"
			}
			p("  %-*s", keyW, ic.Key+mark)
			for _, c := range ic.Coverage {
				p(" %4.0f%%", 100*c)
			}
			p("\n")
		}
		p("  (= derived, $ converted at purchasing-power parity)\n")
	}

	for _, g := range r.Groups {
		p("\nCoverage in group %s (%s members)\n", g.Name, thousands(g.Members))
		p("  %-30s", "indicator")
		for _, y := range g.Years {
			p(" %5d", y)
		}
		p("\n")
		for i, key := range g.Indicators {
			p("  %-30s", key)
			for j := range g.Years {
				if i < len(g.Coverage) && j < len(g.Coverage[i]) {
					p(" %4.0f%%", 100*g.Coverage[i][j])
				}
			}
			p("\n")
		}
	}

	if r.PPP != nil {
		p("\nPurchasing-power parity: %s converted to international dollars with %s factors for %s countries from %s (%s values)\n",
			strings.Join(r.PPP.Converted, ", "), thousands(r.PPP.Factors), thousands(r.PPP.Countries), r.PPP.File, thousands(r.PPP.Values))
	}

	if len(r.Derived) > 0 {
		p("\nDerived indicators\n")
		for _, dv := range r.Derived {
			p("  %s = %s: %s computed", dv.Key, dv.Expr, thousands(dv.Computed))
			if dv.MissingInput > 0 {
				p(", %s missing for want of an input", thousands(dv.MissingInput))
			}
			if dv.DivideByZero > 0 {
				p(", %s missing because the divisor is zero", thousands(dv.DivideByZero))
			}
			p("\n")
		}
	}

	if r.Population != nil {
		po := r.Population
		p("\nRanked population: %s included, %s excluded\n", thousands(po.Included), thousands(len(po.Excluded)))
		for _, rule := range po.Rules {
			p("  rule: %s\n", rule)
		}
		if po.Unchecked > 0 {
			p("  %s %s no value to check against a maximum and %s included\n", thousands(po.Unchecked), plural(po.Unchecked, "institution has", "institutions have"), plural(po.Unchecked, "is", "are"))
		}
		if po.FocusExcluded {
			p("  note: the focus institution fails the rules; it is shown but not ranked among the population\n")
		}
		for i, ex := range po.Excluded {
			if i == MaxListed {
				p("  ... and %s more excluded\n", thousands(len(po.Excluded)-MaxListed))
				break
			}
			p("  excluded %s (%s): %s\n", ex.ID, ex.Name, strings.Join(ex.Reasons, "; "))
		}
	}

	total := 0
	for _, n := range r.SuspiciousCount {
		total += n
	}
	if total > 0 {
		p("\nWorth a look (%s %s; not errors)\n", thousands(total), plural(total, "finding", "findings"))
		for _, s := range r.Suspicious {
			where := ""
			if s.Where != "" {
				where = s.Where + ": "
			}
			p("  %s%s\n", where, s.Msg)
		}
		listed := map[string]int{}
		for _, s := range r.Suspicious {
			listed[s.Kind]++
		}
		for _, k := range []string{SuspectMagnitude, SuspectFarOut, SuspectJump, SuspectOutOfRange, SuspectLowCoverage} {
			if n := r.SuspiciousCount[k] - listed[k]; n > 0 {
				p("  ... and %s more %s\n", thousands(n), k)
			}
		}
	}
	if len(r.Notes) > 0 {
		p("\nNotes\n")
		for _, n := range r.Notes {
			p("  %s\n", n)
		}
	}
	if r.Problems == 0 {
		p("\nNo problems found.\n")
	} else {
		p("\n%s %s found (listed above).\n", thousands(r.Problems), plural(r.Problems, "problem", "problems"))
	}
}

// thousands groups digits by three with commas for the summary. The pack
// itself formats numbers through internal/format, which imports this
// package and so cannot be used here.
func thousands(n int) string {
	s := strconv.Itoa(n)
	neg := strings.HasPrefix(s, "-")
	s = strings.TrimPrefix(s, "-")
	var b strings.Builder
	for i, c := range s {
		if i > 0 && (len(s)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(c)
	}
	if neg {
		return "-" + b.String()
	}
	return b.String()
}
