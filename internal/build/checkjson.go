package build

import (
	"encoding/json"
	"errors"
	"io"
	"math"

	"peerpack/internal/diag"
	"peerpack/internal/layout"
)

// CheckFormatVersion is the "format_version" of `check --json` documents.
// It changes only when a field is removed or changes meaning; new fields
// may appear without a change (README: "check --json").
const CheckFormatVersion = 1

// CheckJSON is the document `peerpack check --json` writes. Field names
// are part of the command line's contract: keep them stable.
type CheckJSON struct {
	FormatVersion int    `json:"format_version"`
	Brief         string `json:"brief"`
	// WouldBuild is true when the inputs loaded and the pack was built in
	// memory without a problem.
	WouldBuild bool `json:"would_build"`
	// Problems are what stops a build, in the order found; the same as
	// the plain check prints on standard error.
	Problems []CheckProblem `json:"problems"`
	// ProblemsNotShown counts problems past the cap on listed problems.
	ProblemsNotShown int              `json:"problems_not_shown"`
	Files            []CheckFile      `json:"files"`
	Institutions     int              `json:"institutions"`
	Countries        int              `json:"countries"`
	Years            []int            `json:"years"`
	Coverage         []CheckCoverage  `json:"coverage"`
	Groups           []CheckGroup     `json:"groups"`
	Population       *CheckPopulation `json:"population"`
	Suspicious       []CheckSuspicion `json:"suspicious"`
	Notes            []string         `json:"notes"`
	IgnoredHTML      []CheckPosition  `json:"ignored_html"`
	StillToEdit      []CheckEditNote  `json:"still_to_edit"`
	Derived          []CheckDerived   `json:"derived"`
}

// CheckProblem is one problem; line and column are 1-based, 0 when not
// known, and file is empty for a problem not tied to a file.
type CheckProblem struct {
	File    string `json:"file"`
	Line    int    `json:"line"`
	Column  int    `json:"column"`
	Message string `json:"message"`
}

// CheckFile is one input file read.
type CheckFile struct {
	Role string `json:"role"`
	Path string `json:"path"`
	Rows int    `json:"rows"`
}

// CheckCoverage is one indicator's coverage of the register by year.
type CheckCoverage struct {
	Indicator string           `json:"indicator"`
	Label     string           `json:"label"`
	Unit      string           `json:"unit"`
	Derived   bool             `json:"derived"`
	PPP       bool             `json:"ppp"`
	Years     []CheckYearShare `json:"years"`
}

// CheckYearShare is a count of institutions with a value in a year and
// its share (0..1) of the register or group; share is null when there
// is no one to count.
type CheckYearShare struct {
	Year   int      `json:"year"`
	Values *int     `json:"values,omitempty"`
	Share  *float64 `json:"share"`
}

// CheckGroup is one comparison group's size and coverage by indicator
// and year.
type CheckGroup struct {
	Name     string               `json:"name"`
	Members  int                  `json:"members"`
	Defined  string               `json:"defined"`
	FocusIn  bool                 `json:"focus_is_member"`
	Coverage []CheckGroupCoverage `json:"coverage"`
}

// CheckGroupCoverage is a group's coverage of one indicator by year.
type CheckGroupCoverage struct {
	Indicator string           `json:"indicator"`
	Years     []CheckYearShare `json:"years"`
}

// CheckPopulation is what the brief's population rules left out.
type CheckPopulation struct {
	Rules         []string         `json:"rules"`
	Included      int              `json:"included"`
	Excluded      []CheckExclusion `json:"excluded"`
	Unchecked     int              `json:"unchecked"`
	FocusExcluded bool             `json:"focus_excluded"`
}

// CheckExclusion is one institution left out of the ranked population.
type CheckExclusion struct {
	Institution string   `json:"institution"`
	Name        string   `json:"name"`
	Reasons     []string `json:"reasons"`
}

// CheckSuspicion is a legal value worth a look.
type CheckSuspicion struct {
	Kind        string `json:"kind"`
	Indicator   string `json:"indicator"`
	Institution string `json:"institution"`
	Year        int    `json:"year"`
	Where       string `json:"where"`
	Message     string `json:"message"`
}

// CheckDerived counts what one derivation produced.
type CheckDerived struct {
	Indicator    string `json:"indicator"`
	Expr         string `json:"expression"`
	Computed     int    `json:"computed"`
	MissingInput int    `json:"missing_input"`
	DivideByZero int    `json:"divide_by_zero"`
}

// CheckPosition is a line and column in the brief.
type CheckPosition struct {
	Line   int `json:"line"`
	Column int `json:"column"`
}

// CheckEditNote is an "edit:" note a template left in the brief.
type CheckEditNote struct {
	Line int    `json:"line"`
	Text string `json:"text"`
}

// NewCheckJSON fills the document from what check found: in may be nil
// or partly loaded when err is not nil.
func NewCheckJSON(brief string, in *Inputs, err error) *CheckJSON {
	if in != nil && in.Report != nil {
		// The data summary, unless CheckBuild has made it already (and
		// returned its fault, if any, in err).
		if serr := in.Report.Summarise(); serr != nil && !errors.Is(err, serr) {
			var probs diag.List
			probs.Add(err)
			probs.Add(serr)
			err = probs.Err()
		}
	}
	doc := &CheckJSON{FormatVersion: CheckFormatVersion, Brief: brief, WouldBuild: err == nil && in != nil}
	doc.Problems, doc.ProblemsNotShown = checkProblems(err)
	if in != nil && in.Report != nil {
		r := in.Report
		if in.Figures != nil && in.Brief != nil {
			r.Groups = groupCoverage(in.Brief, in.Figures)
		}
		for _, f := range r.Files {
			doc.Files = append(doc.Files, CheckFile{Role: f.Role, Path: f.Path, Rows: f.Rows})
		}
		doc.Institutions, doc.Countries, doc.Years = r.Institutions, r.Countries, r.Years
		for _, ic := range r.Indicators {
			c := CheckCoverage{Indicator: ic.Key, Label: ic.Label, Unit: string(ic.Unit), Derived: ic.Derived, PPP: ic.Currency}
			for i, y := range r.Years {
				ys := CheckYearShare{Year: y}
				if i < len(ic.Values) {
					n := ic.Values[i]
					ys.Values = &n
				}
				if i < len(ic.Coverage) {
					ys.Share = share(ic.Coverage[i])
				}
				c.Years = append(c.Years, ys)
			}
			doc.Coverage = append(doc.Coverage, c)
		}
		groups := map[string]*CheckGroup{}
		if in.Figures != nil {
			for _, g := range in.Figures.Groups {
				doc.Groups = append(doc.Groups, CheckGroup{Name: g.Name, Members: len(g.Members), Defined: g.Defined, FocusIn: g.FocusIn})
			}
			for i := range doc.Groups {
				groups[doc.Groups[i].Name] = &doc.Groups[i]
			}
		}
		for _, gc := range r.Groups {
			g := groups[gc.Name]
			if g == nil {
				continue
			}
			for i, key := range gc.Indicators {
				row := CheckGroupCoverage{Indicator: key}
				for j, y := range gc.Years {
					ys := CheckYearShare{Year: y}
					if i < len(gc.Coverage) && j < len(gc.Coverage[i]) {
						ys.Share = share(gc.Coverage[i][j])
					}
					row.Years = append(row.Years, ys)
				}
				g.Coverage = append(g.Coverage, row)
			}
		}
		if po := r.Population; po != nil {
			p := &CheckPopulation{Rules: po.Rules, Included: po.Included, Unchecked: po.Unchecked, FocusExcluded: po.FocusExcluded}
			for _, ex := range po.Excluded {
				p.Excluded = append(p.Excluded, CheckExclusion{Institution: ex.ID, Name: ex.Name, Reasons: ex.Reasons})
			}
			doc.Population = p
		}
		for _, s := range r.Suspicious {
			doc.Suspicious = append(doc.Suspicious, CheckSuspicion{Kind: s.Kind, Indicator: s.Indicator, Institution: s.Institution, Year: s.Year, Where: s.Where, Message: s.Msg})
		}
		for _, d := range r.Derived {
			doc.Derived = append(doc.Derived, CheckDerived{Indicator: d.Key, Expr: d.Expr, Computed: d.Computed, MissingInput: d.MissingInput, DivideByZero: d.DivideByZero})
		}
		doc.Notes = append(doc.Notes, r.Notes...)
	}
	if in != nil && in.Brief != nil {
		for _, p := range layout.IgnoredHTML(in.Brief) {
			doc.IgnoredHTML = append(doc.IgnoredHTML, CheckPosition{Line: p.Line, Column: p.Column})
		}
	}
	return doc
}

// share is a coverage share for JSON, which has no NaN: null instead.
func share(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// checkProblems flattens err into positioned problems.
func checkProblems(err error) ([]CheckProblem, int) {
	if err == nil {
		return nil, 0
	}
	var items []error
	dropped := 0
	var l *diag.List
	if errors.As(err, &l) {
		items, dropped = l.Items, l.Dropped()
	} else {
		items = []error{err}
	}
	var out []CheckProblem
	for _, e := range items {
		var p *diag.Problem
		if errors.As(e, &p) {
			out = append(out, CheckProblem{File: p.File, Line: p.Line, Column: p.Column, Message: p.Msg})
		} else {
			out = append(out, CheckProblem{Message: e.Error()})
		}
	}
	return out, dropped
}

// Write writes the document as indented JSON with empty lists as [] (not
// null), so a reader can always range over them.
func (d *CheckJSON) Write(w io.Writer) error {
	if d.Problems == nil {
		d.Problems = []CheckProblem{}
	}
	for _, l := range []*[]string{&d.Notes} {
		if *l == nil {
			*l = []string{}
		}
	}
	if d.Files == nil {
		d.Files = []CheckFile{}
	}
	if d.Years == nil {
		d.Years = []int{}
	}
	if d.Coverage == nil {
		d.Coverage = []CheckCoverage{}
	}
	if d.Groups == nil {
		d.Groups = []CheckGroup{}
	}
	if d.Suspicious == nil {
		d.Suspicious = []CheckSuspicion{}
	}
	if d.IgnoredHTML == nil {
		d.IgnoredHTML = []CheckPosition{}
	}
	if d.StillToEdit == nil {
		d.StillToEdit = []CheckEditNote{}
	}
	if d.Derived == nil {
		d.Derived = []CheckDerived{}
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(d)
}
