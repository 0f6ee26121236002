// Package figures holds the figures model: every number a pack shows,
// computed once from the dataset and the brief. Charts, tables and
// commentary read this model and nothing else; the figures file
// (`--figures FILE`) is this model written out row by row.
package figures

import (
	"strconv"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/stats"
)

// Sections of the model, as they appear in the figures file.
const (
	SectionDistribution = "distribution"
	SectionPosition     = "position"
	SectionTrend        = "trend"
	SectionCorrelation  = "correlation"
	SectionGroup        = "group"
	SectionPopulation   = "population"
	SectionComposite    = "composite"
	SectionPeers        = "peers"
	SectionRecords      = "records"
	SectionCommentary   = "commentary"
)

// Key names one figure. It is the figures file's first six columns and is
// what a sentence of commentary cites.
type Key struct {
	Section     string
	Group       string
	Indicator   string
	Institution string
	Year        int // 0 when the figure has no year
	Measure     string
}

// String renders the key as section/group/indicator/institution/year/measure
// with empty parts kept, for citing in text and tests.
func (k Key) String() string {
	y := ""
	if k.Year != 0 {
		y = strconv.Itoa(k.Year)
	}
	return strings.Join([]string{k.Section, k.Group, k.Indicator, k.Institution, y, k.Measure}, "/")
}

// Row is one line of the figures file: a number, or a text for commentary
// and labels.
type Row struct {
	Key
	Value float64
	Text  string
	// IsText marks rows whose value is Text.
	IsText bool
}

// Model is the figures model for one brief.
type Model struct {
	Data *dataset.Dataset
	// Focus is the register position of the focus institution; FocusID its id.
	Focus   int
	FocusID string
	// Named are the register positions of the institutions whose positions
	// and trends are recorded: the focus first, then the brief's named:
	// list, then chart label: institutions, each once.
	Named []int
	Year  int
	// Span is the trend span [First, Last]; Years lists every year in it
	// present in the data.
	First, Last int
	Years       []int
	// Method is the quantile definition used.
	Method stats.QuantileMethod
	// Floor is the brief's small-group floor (brief.SmallGroupFloor):
	// a distribution with fewer values than this is flagged
	// (below_floor = 1) and packs print no quarters or percentiles for it.
	Floor int

	// Groups are the resolved comparison groups in brief order ("each"
	// groups expanded in place).
	Groups []*Group
	// Peers is the data-driven peer grouping of the brief's peers:
	// section, nil without one.
	Peers *Peers

	dist   map[distKey]*Distribution
	pos    map[posKey]*Position
	trend  map[trendKey]*Trend
	gtrend map[gtrendKey]*GroupTrend
	// Correlations between indicator pairs over a group in the brief year,
	// in group order then dictionary order of the pair (X before Y).
	Correlations []Correlation
	corr         map[corrKey]int
	// corrNeed marks, per group, the indicators whose correlations the
	// brief reads (nil: none).
	corrNeed [][]bool
	// yearOrder holds, while computing, each indicator's register
	// positions sorted by value in the brief year.
	yearOrder [][]int32
	// Extra holds rows from later stages (composite, peers, records,
	// commentary), appended through Add; extraIndex finds the last row
	// added with a key.
	extra      []Row
	extraIndex map[Key]int
	// groupIndex finds a group by name (the first with it).
	groupIndex map[string]int
	// composites holds the brief's composite, one per span year with data;
	// CompositeSpec is the brief's composite: section (nil without one).
	// placed caches the data columns rounded to the declared decimals
	// that ranks and orders compare (placedColumn).
	placed        *placedColumns
	composites    []*CompositeYear
	CompositeSpec *brief.CompositeSpec
}

// Group is a resolved comparison group.
type Group struct {
	Name string
	// Kind says how the group was defined: where, members, nearest or each.
	Kind string
	// Members are register positions, ascending.
	Members []int
	// FocusIn says whether the focus institution belongs to the group.
	FocusIn bool
	// Defined restates the definition in words for the pack ("country is
	// Kestria"), and Over is "ranked" or "all".
	Defined string
	Over    string
	// Values of Each groups: the attribute value that defines them.
	EachField, EachValue string
	// Phrase is how running text names the group, from the brief's
	// phrase: with {value} replaced by EachValue; empty when the brief
	// gives none (the commentary's wording then derives one from Name).
	Phrase string
	// Spec is the name of the brief's group definition this group came
	// from; it differs from Name only for groups expanded from "each".
	Spec string
	// Cluster is the cluster number (1-based) of a "cluster" group.
	Cluster int
	// Nearest lists, for a "nearest" group, the chosen institutions from
	// the nearest outwards with their standardised distances.
	Nearest []Neighbour
	// Dropped lists institutions named in a members list that the group
	// left out because they are outside the ranked population.
	Dropped []Dropped

	member []bool // by register position
	// byYear holds the members of span years whose members differ from
	// the reporting year's (see MembersIn).
	byYear map[int][]int
}

// Neighbour is one institution of a nearest-profile group.
type Neighbour struct {
	Institution int
	// Distance is the standardised Euclidean distance to the focus.
	Distance float64
}

// Dropped is a listed member left out of a group, with the reason.
type Dropped struct {
	Institution int
	Reason      string
}

// Has reports whether register position inst is a member.
func (g *Group) Has(inst int) bool {
	return inst >= 0 && inst < len(g.member) && g.member[inst]
}

// Distribution describes one group's values of one indicator in one year.
type Distribution struct {
	Group     string
	Indicator string
	Year      int
	stats.Box
	// Mean and SD (sample) of the members with a value; Skewness their
	// adjusted sample skewness (stats.Skewness), NaN under three values.
	Mean, SD float64
	Skewness float64
	// Outliers are register positions of members beyond the whiskers.
	Outliers []int
	// printed holds N and the quartiles as printed (placedBox), which a
	// value is placed in a quarter by; computed once with the box.
	printed stats.Box
}

// Position is where one institution stands within a group on one
// indicator in one year. For a group the institution is not in, it is
// where it would sit among the members, itself not counted in the
// distribution but placed by its value.
type Position struct {
	Group       string
	Indicator   string
	Institution int
	Year        int
	Value       float64
	HasValue    bool
	// Rank in the better direction, ties sharing the best rank, of Of.
	Rank, Of int
	// Percentile rank: 100 x (below + half of ties, itself counted among
	// the ties) / n, "below" meaning worse.
	Percentile float64
	// Z is the z-score against the group's mean and sample SD.
	Z float64
	// Quartile is 1 for the best quarter .. 4 for the worst.
	Quartile int
	// InGroup reports whether the institution is a member.
	InGroup bool
	// GapMedian and GapQ3 are the distances from the value to the group's
	// median and to its better quartile, signed so that a positive gap is
	// the amount still to gain (0 once reached).
	GapMedian, GapQ3 float64
	// VsMedian and VsBetterQuartile are the signed differences to the
	// group's median and to its better quartile (Q3, or Q1 when lower is
	// better), positive meaning better by the indicator's polarity: for
	// higher is better value - median, for lower is better median - value.
	// A neutral indicator has VsMedian = value - median and no better
	// quartile (NaN). Unlike the gaps they keep their sign once ahead, so
	// the commentary can say "3.1 points above the median".
	VsMedian, VsBetterQuartile float64
	// Ties is how many members share the value, the institution itself
	// included (1 when no one else has it); for an institution outside the
	// group, the members with its value plus itself.
	Ties int
}

// Trend is one institution's movement over the span in a group.
type Trend struct {
	Group       string
	Indicator   string
	Institution int
	StartYear   int
	EndYear     int
	StartValue  float64
	EndValue    float64
	Change      float64
	ChangePct   float64
	CAGR        float64
	Slope       float64
	// RankChange is positive when the rank improved (moved towards 1).
	RankChange       int
	PercentileChange float64
	// PercentileMove is |PercentileChange|, so "the largest movement" can
	// be checked figure against figure; ChangePerIQR is |Change| over the
	// group's interquartile range in the last year (NaN when that is 0),
	// so "broadly unchanged" can be checked against the noise share.
	PercentileMove float64
	ChangePerIQR   float64
	// Points is the number of years with a value between StartYear and
	// EndYear: two points give a change, not a trend, and the slope and
	// CAGR of two points are no more than that change.
	Points int
	// StartOf and EndOf are the group sizes with a value in the first and
	// last year; when they differ a lot, statements compare percentiles.
	StartOf, EndOf int
	// Valid is false when either end lacks a value.
	Valid bool
	// MedianChange is the movement of the group's median between the same
	// two years (StartYear to EndYear), so the two changes compare.
	MedianChange float64
	// PreferPercentiles is set when the group's size changed so much
	// between the two years that a raw rank change would mislead; see
	// SizeChanged.
	PreferPercentiles bool
	// PanelOf is the size of the constant panel (the members in both
	// years with a value in both; the institution counted once, as one
	// more value when it is not among them), PanelStartRank and
	// PanelEndRank its ranks within it at both ends, PanelRankChange
	// their difference (positive = moved up); all 0 without a panel.
	// See panel.go.
	PanelOf, PanelStartRank, PanelEndRank, PanelRankChange int
}

// GroupTrend is the movement of a group's median over the span, for trend
// lines drawn with the yearly distributions.
type GroupTrend struct {
	Group     string
	Indicator string
	// StartYear and EndYear are the first and last years of the span in
	// which the group has at least one value.
	StartYear, EndYear int
	MedianStart        float64
	MedianEnd          float64
	Change             float64
	ChangePct          float64
	// Slope is the least-squares slope of the yearly medians.
	Slope float64
	// ChangePerIQR is abs(Change) / the group's IQR in EndYear (NaN when
	// that year has fewer than two values or no spread).
	ChangePerIQR float64
	StartN, EndN int
	Valid        bool
}

// Correlation between two indicators over a group's members with both
// values in a year.
type Correlation struct {
	Group      string
	IndicatorX string
	IndicatorY string
	Year       int
	N          int
	Pearson    float64
	Spearman   float64
}

type distKey struct {
	group, ind string
	year       int
}

type posKey struct {
	group, ind string
	inst, year int
}

type trendKey struct {
	group, ind string
	inst       int
}

type gtrendKey struct {
	group, ind string
}

type corrKey struct {
	group, x, y string
}

// Distribution returns the distribution of a group's indicator in a year.
func (m *Model) Distribution(group, indicator string, year int) (*Distribution, bool) {
	d, ok := m.dist[distKey{group, indicator, year}]
	return d, ok
}

// Position returns an institution's position in a group.
func (m *Model) Position(group, indicator string, inst, year int) (*Position, bool) {
	p, ok := m.pos[posKey{group, indicator, inst, year}]
	return p, ok
}

// Trend returns an institution's trend in a group over the span.
func (m *Model) Trend(group, indicator string, inst int) (*Trend, bool) {
	t, ok := m.trend[trendKey{group, indicator, inst}]
	return t, ok
}

// Group returns the resolved group with the name.
func (m *Model) Group(name string) (*Group, bool) {
	if m.groupIndex != nil {
		if i, ok := m.groupIndex[name]; ok {
			return m.Groups[i], true
		}
		return nil, false
	}
	for _, g := range m.Groups {
		if g.Name == name {
			return g, true
		}
	}
	return nil, false
}

// Indicator returns a dictionary entry by key.
func (m *Model) Indicator(key string) (dataset.Indicator, bool) {
	return m.Data.Dictionary.Lookup(key)
}

// InstitutionID returns the register id of a register position.
func (m *Model) InstitutionID(inst int) string {
	return m.Data.Register.Institutions[inst].ID
}

// BelowFloor reports whether a distribution has fewer values than the
// small-group floor (and at least one).
func (m *Model) BelowFloor(d *Distribution) bool { return d != nil && d.N > 0 && d.N < m.Floor }

// Add appends rows from a later stage (commentary, composite, ...).
func (m *Model) Add(rows ...Row) {
	if m.extraIndex == nil {
		m.extraIndex = make(map[Key]int, len(rows))
	}
	for _, r := range rows {
		m.extraIndex[r.Key] = len(m.extra)
		m.extra = append(m.extra, r)
	}
}
