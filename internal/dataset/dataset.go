// Package dataset holds the validated indicator data a pack is built from:
// the institution register, the indicator dictionary and the values of every
// indicator for every institution and year, after derivation and
// purchasing-power-parity conversion.
//
// Values are stored densely, one []float64 per (indicator, year) indexed by
// institution position in the register, with NaN meaning "missing". A
// world-sized dataset (21,500 institutions x 20 indicators x 10 years) is
// 4.3 million float64s, about 34 MB, and every statistic downstream can
// read a column without a map lookup.
package dataset

import (
	"math"
	"sort"
	"strings"
	"unicode"
	"unicode/utf8"

	"peerpack/internal/tabular"
)

// Unit is the kind of quantity an indicator measures; it decides range
// checks and how values are printed.
type Unit string

// The units a dictionary may declare.
const (
	UnitPercent  Unit = "percent"  // 0..100
	UnitShare    Unit = "share"    // 0..1
	UnitRatio    Unit = "ratio"    // any non-negative ratio
	UnitCount    Unit = "count"    // non-negative
	UnitCurrency Unit = "currency" // money amount; PPP converted when currency: true
	UnitIndex    Unit = "index"    // e.g. field-normalised citation impact, 1 = world average
	UnitScore    Unit = "score"    // a published or composite score
)

// Units lists every valid unit, in documentation order.
var Units = []Unit{UnitPercent, UnitShare, UnitRatio, UnitCount, UnitCurrency, UnitIndex, UnitScore}

// Polarity says which direction of an indicator is better. Ranks run in the
// better direction; for Neutral they run from the highest value down and the
// commentary uses no judgement words.
type Polarity string

// The polarities a dictionary may declare.
const (
	HigherIsBetter Polarity = "higher"
	LowerIsBetter  Polarity = "lower"
	Neutral        Polarity = "neutral"
)

// Indicator is one entry of the indicator dictionary.
type Indicator struct {
	Key        string   `yaml:"key"`
	Label      string   `yaml:"label"`
	Short      string   `yaml:"short"`
	Unit       Unit     `yaml:"unit"`
	Better     Polarity `yaml:"better"`
	Decimals   int      `yaml:"decimals"`
	Pillar     string   `yaml:"pillar,omitempty"`
	Source     string   `yaml:"source,omitempty"`
	Definition string   `yaml:"definition,omitempty"`
	// Currency marks a money amount in local currency; it is converted to
	// international dollars with the PPP factors before any use.
	Currency bool `yaml:"currency,omitempty"`
	// Derive is an expression over other indicator keys and register
	// attributes; see package derive for the grammar.
	Derive string `yaml:"derive,omitempty"`
	// Missing lists the cell tokens (for example "n/a", "-") that this
	// indicator accepts as "missing" rather than rejecting as bad input.
	Missing []string `yaml:"missing,omitempty"`
	// Judgement, when set, explains why the indicator's direction is a value
	// judgement (for example students per academic); the commentary then
	// carries a caution.
	Judgement string `yaml:"judgement,omitempty"`

	// InternationalDollars is set by the loader, never by the dictionary:
	// the values are in international dollars (PPP$), because the indicator
	// was converted with the PPP factors (currency: true) or is a derived
	// currency amount computed from converted ones. Printing uses it for
	// the PPP$ prefix.
	InternationalDollars bool `yaml:"-"`

	// Line and Column locate the entry in the dictionary file, for
	// messages.
	Line   int `yaml:"-"`
	Column int `yaml:"-"`
}

// RunningLabel is the indicator's label as running text reads it: the
// first letter lowered unless the first word is an abbreviation ("FNCI",
// "PhD share") or the capital is joined to what follows ("A-level"); the
// key when there is no label.
func (ind Indicator) RunningLabel() string {
	s := ind.Label
	if s == "" {
		return ind.Key
	}
	r, n := utf8.DecodeRuneInString(s)
	if !unicode.IsUpper(r) {
		return s
	}
	word := s[n:]
	if r2, _ := utf8.DecodeRuneInString(word); word != "" && !unicode.IsLower(r2) {
		return s
	}
	if i := strings.IndexFunc(word, unicode.IsSpace); i >= 0 {
		word = word[:i]
	}
	if strings.IndexFunc(word, unicode.IsUpper) >= 0 {
		return s
	}
	return string(unicode.ToLower(r)) + s[n:]
}

// Dictionary is the ordered list of indicators with a key index.
type Dictionary struct {
	File       string
	Indicators []Indicator
	index      map[string]int
}

// NewDictionary builds a dictionary from indicators in their given order.
// Duplicate keys are the caller's responsibility to reject first.
func NewDictionary(file string, inds []Indicator) *Dictionary {
	d := &Dictionary{File: file, Indicators: inds, index: make(map[string]int, len(inds))}
	for i, ind := range inds {
		d.index[ind.Key] = i
	}
	return d
}

// Lookup returns the indicator with the key and whether it exists.
func (d *Dictionary) Lookup(key string) (Indicator, bool) {
	i, ok := d.index[key]
	if !ok {
		return Indicator{}, false
	}
	return d.Indicators[i], true
}

// Index returns the position of key in the dictionary, or -1.
func (d *Dictionary) Index(key string) int {
	if i, ok := d.index[key]; ok {
		return i
	}
	return -1
}

// Keys returns the indicator keys in dictionary order.
func (d *Dictionary) Keys() []string {
	out := make([]string, len(d.Indicators))
	for i, ind := range d.Indicators {
		out[i] = ind.Key
	}
	return out
}

// Institution is one row of the register.
type Institution struct {
	ID      string
	Name    string
	Country string
	Region  string
	// Attrs holds every further register column by header name.
	Attrs map[string]string
	// Line is the record's line in the register file, for messages.
	Line int
}

// Attr returns a register field by name, including the four fixed columns.
func (in Institution) Attr(name string) (string, bool) {
	switch name {
	case "id":
		return in.ID, true
	case "name":
		return in.Name, true
	case "country":
		return in.Country, true
	case "region":
		return in.Region, true
	}
	v, ok := in.Attrs[name]
	return v, ok
}

// Register is the ordered list of institutions with an id index.
type Register struct {
	File         string
	Institutions []Institution
	// AttrNames lists the extra columns in header order.
	AttrNames []string
	index     map[string]int
	// attrCells keeps where each attribute value was written, by attribute
	// and register position, for messages about numeric attributes.
	attrCells map[string][]tabular.Cell
}

// NewRegister builds a register; ids must already be unique.
func NewRegister(file string, insts []Institution, attrNames []string) *Register {
	r := &Register{File: file, Institutions: insts, AttrNames: attrNames, index: make(map[string]int, len(insts))}
	for i, in := range insts {
		r.index[in.ID] = i
	}
	return r
}

// Index returns the position of the id in the register, or -1.
func (r *Register) Index(id string) int {
	if i, ok := r.index[id]; ok {
		return i
	}
	return -1
}

// Len is the number of institutions.
func (r *Register) Len() int { return len(r.Institutions) }

// HasAttr reports whether name is a register column.
func (r *Register) HasAttr(name string) bool {
	switch name {
	case "id", "name", "country", "region":
		return true
	}
	for _, a := range r.AttrNames {
		if a == name {
			return true
		}
	}
	return false
}

// Dataset is the validated, derived and PPP-converted data.
type Dataset struct {
	Register   *Register
	Dictionary *Dictionary
	// Years are the distinct years present in the values, ascending.
	Years []int
	// cols[ind*len(Years)+y][inst]; NaN marks missing.
	cols [][]float64
	// Notes holds footnotes from a long-format values file's note column.
	Notes map[CellRef]string
	// PPP records how currency indicators were converted, nil when no
	// currency indicator needed converting.
	PPP *PPPTable
	// Population is the ranked population after the brief's rules; nil means
	// every institution counts.
	Population *Population
	// DerivedMissing counts, per derived indicator key, the values left
	// missing because a divisor was zero or an input was missing.
	DerivedMissing map[string]int
}

// CellRef names one value.
type CellRef struct {
	Indicator   int
	Year        int // the calendar year
	Institution int
}

// New allocates an all-missing dataset over the given register, dictionary
// and years (which it sorts).
func New(reg *Register, dict *Dictionary, years []int) *Dataset {
	ys := append([]int(nil), years...)
	sort.Ints(ys)
	d := &Dataset{Register: reg, Dictionary: dict, Years: ys, Notes: map[CellRef]string{}, DerivedMissing: map[string]int{}}
	d.cols = make([][]float64, len(dict.Indicators)*len(ys))
	n := reg.Len()
	for i := range d.cols {
		c := make([]float64, n)
		for j := range c {
			c[j] = math.NaN()
		}
		d.cols[i] = c
	}
	return d
}

// YearIndex returns the position of a calendar year, or -1.
func (d *Dataset) YearIndex(year int) int {
	i := sort.SearchInts(d.Years, year)
	if i < len(d.Years) && d.Years[i] == year {
		return i
	}
	return -1
}

// Column returns the values of indicator ind (dictionary position) in the
// calendar year, indexed by register position; nil if the year is absent.
// The slice is shared: callers must not modify it.
func (d *Dataset) Column(ind, year int) []float64 {
	y := d.YearIndex(year)
	if y < 0 || ind < 0 || ind >= len(d.Dictionary.Indicators) {
		return nil
	}
	return d.cols[ind*len(d.Years)+y]
}

// Value returns one value and whether it is present.
func (d *Dataset) Value(ind, inst, year int) (float64, bool) {
	c := d.Column(ind, year)
	if c == nil || inst < 0 || inst >= len(c) {
		return math.NaN(), false
	}
	v := c[inst]
	return v, !math.IsNaN(v)
}

// Set stores one value; it is for loaders and derivation.
func (d *Dataset) Set(ind, inst, year int, v float64) {
	c := d.Column(ind, year)
	if c != nil {
		c[inst] = v
	}
}

// InPopulation reports whether institution inst counts in the ranked
// population.
func (d *Dataset) InPopulation(inst int) bool {
	if d.Population == nil {
		return true
	}
	return d.Population.Included[inst]
}

// InPopulationIn reports whether institution inst counts in the ranked
// population of a year: the rules applied as of that year, or the
// reporting year's population when the brief fixes the panel, when there
// are no rules, or for a year the data do not hold.
func (d *Dataset) InPopulationIn(inst, year int) bool {
	if d.Population == nil {
		return true
	}
	if in, ok := d.Population.ByYear[year]; ok {
		return in[inst]
	}
	return d.Population.Included[inst]
}

// RankedIn counts the ranked population of a year (see InPopulationIn).
func (d *Dataset) RankedIn(year int) int {
	n := 0
	for i := 0; i < d.Register.Len(); i++ {
		if d.InPopulationIn(i, year) {
			n++
		}
	}
	return n
}

// PopulationByYear reports whether earlier years have populations of
// their own (the rules applied as of each year).
func (d *Dataset) PopulationByYear() bool {
	return d.Population != nil && len(d.Population.ByYear) > 0
}

// Population is the outcome of the brief's population rules.
type Population struct {
	Included []bool
	// Excluded lists, for every excluded institution, the reasons in rule
	// order.
	Excluded map[int][]string
	Rules    []string // one plain description per rule, for the pack
	// RuleExcluded counts, aligned with Rules, how many institutions each
	// rule left out; an institution failing two rules counts under both.
	RuleExcluded []int
	// ByYear holds, for every other year of the data, who passes the
	// rules as of that year (windows ending that year), and YearRules
	// those years' rule texts, aligned with Rules. Both are nil when the
	// brief fixes the panel (Fixed: earlier_years: fixed), in which case
	// Included holds for every year.
	ByYear    map[int][]bool
	YearRules map[int][]string
	Fixed     bool
}

// PPPTable holds purchasing-power-parity conversion factors, local currency
// units per international dollar, by country and year.
type PPPTable struct {
	File    string
	Factors map[string]map[int]float64
	// Converted lists the indicator keys that were converted.
	Converted []string
}

// Factor returns the factor for a country and year.
func (p *PPPTable) Factor(country string, year int) (float64, bool) {
	if p == nil {
		return 0, false
	}
	f, ok := p.Factors[country][year]
	return f, ok
}
