// Package brief reads a peerpack brief: a Markdown file whose YAML front
// matter says what to compare (focus, year, groups, data files, theme) and
// whose body is the pack's text with fenced peerpack blocks (chart, table,
// commentary, pagebreak, columns) in it.
//
// Content (the brief), data (the files it names) and layout (templates and
// theme) are kept apart: this package only reads and checks the brief; it
// never opens a data file.
package brief

import (
	"fmt"
	"strings"

	"gopkg.in/yaml.v3"
)

// Brief is a decoded brief.
type Brief struct {
	// File is the path the brief was read from, used in messages.
	File string `yaml:"-"`
	// Dir is the folder data paths are relative to.
	Dir string `yaml:"-"`

	Title    string `yaml:"title"`
	Subtitle string `yaml:"subtitle"`
	Audience string `yaml:"audience"`
	Author   string `yaml:"author"`
	// Contact says whom to ask about the pack (a name, an office, an
	// address); it closes "About these figures".
	Contact  string   `yaml:"contact"`
	Date     string   `yaml:"date"`
	Keywords []string `yaml:"keywords"`
	// Focus is the register id of the institution the pack is about.
	Focus string `yaml:"focus"`
	// Year is the year positions are reported for.
	Year int `yaml:"year"`
	// Years is the span [first, last] for trends.
	Years Span      `yaml:"years"`
	Data  DataPaths `yaml:"data"`
	// Groups are the comparison groups, in pack order.
	Groups     []GroupSpec     `yaml:"groups"`
	Population *PopulationSpec `yaml:"population"`
	// Peers asks for data-driven peer groups (clusters of profiles).
	Peers *PeersSpec `yaml:"peers"`
	// Named lists further institutions whose positions the figures record
	// and charts may label.
	Named []string `yaml:"named"`
	Theme Theme    `yaml:"theme"`
	// Language is en-GB (default) or en-US.
	Language string `yaml:"language"`
	// RankBands, when positive, reports ranks beyond this number as bands
	// ("201-300") rather than exact places.
	RankBands int `yaml:"rank_bands"`
	// Sources adds a sources appendix listing the figure keys behind each
	// sentence of commentary.
	Sources bool `yaml:"sources"`
	// Quantiles selects the quantile definition: type7 (default), type6 or
	// hinges.
	Quantiles string `yaml:"quantiles"`
	// Noise is the noise rule in percentile points (default DefaultNoise):
	// a difference inside it is "level with", a position within it of a
	// quarter boundary "at the edge" of the quarter, a change inside it
	// "broadly unchanged". SmallGroup is the floor (default
	// DefaultSmallGroup members reporting) below which quarters and
	// percentiles are not printed, only ranks "of n". Read them with
	// NoiseRule and SmallGroupFloor.
	Noise      *float64 `yaml:"noise"`
	SmallGroup *int     `yaml:"small_group"`
	// Composite, when given, builds a composite score (see composite.go).
	Composite *CompositeSpec `yaml:"composite"`
	// SizeWeight names the indicator (an institution's size, such as its
	// students) by which group medians are also taken weighted, for the
	// systems table and the systems commentary topic.
	SizeWeight string `yaml:"size_weight"`

	// Body is the Markdown after the front matter; BodyLine is the line
	// of the brief on which it starts (1-based).
	Body     []byte `yaml:"-"`
	BodyLine int    `yaml:"-"`
	// Blocks are the peerpack fenced blocks of the body in order.
	Blocks []Block `yaml:"-"`
	// Lines records where each front-matter key was written, for messages
	// from later stages ("groups[2].where").
	Lines map[string]Pos `yaml:"-"`
}

// Span is a [first, last] pair of years.
type Span struct {
	First, Last int
}

// UnmarshalYAML accepts [2021, 2025].
func (s *Span) UnmarshalYAML(n *yaml.Node) error {
	var v []int
	if n.Kind != yaml.SequenceNode || n.Decode(&v) != nil || len(v) != 2 {
		return fmt.Errorf("line %d: years must be a list of two years, first and last, e.g. [2021, 2025]", n.Line)
	}
	if v[1] < v[0] {
		return fmt.Errorf("line %d: years [%d, %d] run backwards; write the first year first", n.Line, v[0], v[1])
	}
	s.First, s.Last = v[0], v[1]
	return nil
}

// DataPaths names the data files, relative to the brief.
type DataPaths struct {
	Register   string   `yaml:"register"`
	Values     PathList `yaml:"values"`
	Dictionary string   `yaml:"dictionary"`
	PPP        string   `yaml:"ppp"`
	// Papers and Votes are record-level files whose indicators are
	// computed at load time (internal/records); see records.go.
	Papers PaperSource `yaml:"papers"`
	Votes  VoteSource  `yaml:"votes"`
}

// PathList is one path or a list of paths.
type PathList []string

// UnmarshalYAML accepts a single string or a list of strings.
func (p *PathList) UnmarshalYAML(n *yaml.Node) error {
	switch n.Kind {
	case yaml.ScalarNode:
		*p = PathList{n.Value}
		return nil
	case yaml.SequenceNode:
		var v []string
		if err := n.Decode(&v); err != nil {
			return fmt.Errorf("line %d: values must be a path or a list of paths", n.Line)
		}
		*p = v
		return nil
	}
	return fmt.Errorf("line %d: values must be a path or a list of paths", n.Line)
}

// GroupSpec defines one comparison group. Exactly one of Where, Members,
// Nearest, Each and Cluster defines it (Each may carry a Where to restrict
// it).
type GroupSpec struct {
	Name    string       `yaml:"name"`
	Where   *Filter      `yaml:"where"`
	Members []string     `yaml:"members"`
	Nearest *NearestSpec `yaml:"nearest"`
	// Cluster is one of the clusters of the peers: section.
	Cluster *ClusterRef `yaml:"cluster"`
	// Each expands into one group per distinct value of a register field,
	// named "<Name>: <value>" or just the value when Name is empty.
	Each string `yaml:"each"`
	// Over is "ranked" (default: the ranked population) or "all".
	Over string `yaml:"over"`
	// Phrase is how running text names the group ("the Kestrian sector",
	// "our chosen peers"); empty means the commentary derives one from Name.
	// For an each group it may hold {value}: "the {value} system".
	Phrase string `yaml:"phrase"`
	Pos    Pos    `yaml:"-"`
}

// NearestSpec picks the Count institutions nearest the focus by
// standardised Euclidean distance over Indicators in the brief's year.
type NearestSpec struct {
	Count      int      `yaml:"count"`
	Indicators []string `yaml:"indicators"`
	Where      *Filter  `yaml:"where"`
}

// Filter is a conjunction of register attribute conditions:
// {country: Kestria, mission: [technical, research], region: {not: North}}.
type Filter struct {
	Conds []Cond
}

// Cond is one attribute condition.
type Cond struct {
	Attr   string
	Values []string
	Not    bool
	Pos    Pos
}

// UnmarshalYAML reads the attribute map form.
func (f *Filter) UnmarshalYAML(n *yaml.Node) error {
	if n.Kind != yaml.MappingNode {
		return fmt.Errorf("line %d: where must be a mapping of register fields to values, e.g. {country: Kestria}", n.Line)
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		c := Cond{Attr: k.Value, Pos: Pos{Line: k.Line, Column: k.Column}}
		if v.Kind == yaml.MappingNode {
			if len(v.Content) != 2 || v.Content[0].Value != "not" {
				return fmt.Errorf("line %d: a condition mapping takes only \"not\", e.g. {not: Kestria}", v.Line)
			}
			c.Not = true
			v = v.Content[1]
		}
		vals, err := scalarList(v)
		if err != nil {
			return fmt.Errorf("line %d: %s", v.Line, err)
		}
		c.Values = vals
		f.Conds = append(f.Conds, c)
	}
	return nil
}

func scalarList(v *yaml.Node) ([]string, error) {
	switch v.Kind {
	case yaml.ScalarNode:
		return []string{v.Value}, nil
	case yaml.SequenceNode:
		out := make([]string, 0, len(v.Content))
		for _, c := range v.Content {
			if c.Kind != yaml.ScalarNode {
				return nil, fmt.Errorf("expected a value or a list of values")
			}
			out = append(out, c.Value)
		}
		return out, nil
	}
	return nil, fmt.Errorf("expected a value or a list of values")
}

// PopulationSpec holds the rules that decide the ranked population.
type PopulationSpec struct {
	// MinTotal requires an indicator summed over the last Years years to
	// reach AtLeast: a minimum output below which per-paper indicators are
	// too noisy to compare (the threshold is the user's choice; the demo
	// asks for 600 papers over three years).
	MinTotal []MinTotalRule `yaml:"min_total"`
	// MaxValue caps an indicator, for example the largest share of output
	// in a single subject.
	MaxValue []MaxValueRule `yaml:"max_value"`
	// Require lists register attributes that must be present and non-empty.
	Require []string `yaml:"require"`
	// EarlierYears says who is ranked in the span's earlier years:
	// "rolling" (the default) applies the rules as of each year, windows
	// ending that year; "fixed" keeps the reporting year's ranked
	// population in every year (a fixed panel).
	EarlierYears string `yaml:"earlier_years"`
}

// Values of PopulationSpec.EarlierYears.
const (
	EarlierRolling = "rolling"
	EarlierFixed   = "fixed"
)

// MinTotalRule: sum of Indicator over the Years years ending at the brief
// year must be at least AtLeast.
type MinTotalRule struct {
	Indicator string  `yaml:"indicator"`
	Years     int     `yaml:"years"`
	AtLeast   float64 `yaml:"at_least"`
	Pos       Pos     `yaml:"-"`
}

// MaxValueRule: Indicator in the brief year must be at most AtMost.
type MaxValueRule struct {
	Indicator string  `yaml:"indicator"`
	AtMost    float64 `yaml:"at_most"`
	Pos       Pos     `yaml:"-"`
}

// Theme is the pack's look.
type Theme struct {
	// Paper is a4 (default) or letter.
	Paper string `yaml:"paper"`
	// Margins in millimetres.
	Margins *Margins `yaml:"margins"`
	// Logo is a PNG or JPEG path relative to the brief.
	Logo string `yaml:"logo"`
	// Accent is the house colour as #rrggbb, used for headings and rules.
	Accent string `yaml:"accent"`
	// Font is sans (default) or serif, both Liberation.
	Font string `yaml:"font"`
	// Organisation appears in the footer.
	Organisation string `yaml:"organisation"`
}

// Margins of the page in millimetres.
type Margins struct {
	Top    float64 `yaml:"top"`
	Bottom float64 `yaml:"bottom"`
	Left   float64 `yaml:"left"`
	Right  float64 `yaml:"right"`
}

// Pos is a 1-based line and column in the brief.
type Pos struct {
	Line, Column int
}

func (p Pos) String() string { return fmt.Sprintf("%d:%d", p.Line, p.Column) }

// Block is a peerpack fenced block of the body.
type Block interface {
	// Position is where the block's fence opens in the brief.
	Position() Pos
	// Kind is the fence's info string: chart, table, commentary, pagebreak
	// or columns.
	Kind() string
}

// BlockBase carries what every block has.
type BlockBase struct {
	At Pos `yaml:"-"`
}

// Position implements Block.
func (b BlockBase) Position() Pos { return b.At }

// ChartBlock draws one chart.
type ChartBlock struct {
	BlockBase `yaml:",inline"`
	// Type is box, radar, trend, scatter, heatmap or bars.
	Type       string   `yaml:"kind"`
	Indicators []string `yaml:"indicators"`
	Groups     []string `yaml:"groups"`
	Year       int      `yaml:"year"`
	Caption    string   `yaml:"caption"`
	Title      string   `yaml:"title"`
	// Label names institutions to mark and label besides the focus.
	Label []string `yaml:"label"`
	// Size is full (default) or half.
	Size string `yaml:"size"`
	// Orientation is horizontal (default for box) or vertical.
	Orientation string `yaml:"orientation"`
	// Scale, for radar axes: percentile (default), range (each spoke over
	// the values shown) or common (one scale from zero for every spoke,
	// for shares of one whole).
	Scale string `yaml:"scale"`
	// Fit adds a least-squares line to a scatter.
	Fit bool `yaml:"fit"`
	// Limit caps the rows of a heatmap or bars chart.
	Limit int `yaml:"limit"`
}

// Kind implements Block.
func (*ChartBlock) Kind() string { return "chart" }

// TableBlock lays out one table.
type TableBlock struct {
	BlockBase `yaml:",inline"`
	// Type is position (default: indicators x value, rank, percentile,
	// median, quartiles, change), peers (institutions x indicators),
	// groups (group medians side by side) or population (who passed the
	// rules).
	Type       string   `yaml:"kind"`
	Indicators []string `yaml:"indicators"`
	Groups     []string `yaml:"groups"`
	Year       int      `yaml:"year"`
	Caption    string   `yaml:"caption"`
	Columns    []string `yaml:"columns"`
	Limit      int      `yaml:"limit"`
}

// Kind implements Block.
func (*TableBlock) Kind() string { return "table" }

// CommentaryBlock asks for written commentary over a scope.
type CommentaryBlock struct {
	BlockBase `yaml:",inline"`
	// Style is summary, detail or bullets.
	Style      string   `yaml:"style"`
	Indicators []string `yaml:"indicators"`
	Groups     []string `yaml:"groups"`
	// Topics restricts what is written: position, change, strengths,
	// competition, gaps, caveats, association, and (never by default)
	// standouts, moves, questions, peerchoice. Empty means all that apply
	// to the style.
	Topics []string `yaml:"topics"`
	Years  *Span    `yaml:"years"`
}

// Kind implements Block.
func (*CommentaryBlock) Kind() string { return "commentary" }

// PageBreakBlock starts a new page.
type PageBreakBlock struct {
	BlockBase `yaml:",inline"`
}

// Kind implements Block.
func (*PageBreakBlock) Kind() string { return "pagebreak" }

// ColumnsBlock switches the following text to Count columns until the next
// heading of level 1 or 2 (Count 1 switches back).
type ColumnsBlock struct {
	BlockBase `yaml:",inline"`
	Count     int `yaml:"count"`
}

// Kind implements Block.
func (*ColumnsBlock) Kind() string { return "columns" }

// AppendixBlock writes a section of the pack from the brief and the
// figures themselves, so it never goes stale: methodology (sources,
// definitions, groups, population rules, PPP, quantile method, coverage,
// cautions) or data (every value the pack uses for the focus and the
// named institutions, with group medians).
type AppendixBlock struct {
	BlockBase `yaml:",inline"`
	// Type is methodology or data.
	Type       string   `yaml:"kind"`
	Indicators []string `yaml:"indicators"`
	Groups     []string `yaml:"groups"`
}

// Kind implements Block.
func (*AppendixBlock) Kind() string { return "appendix" }

// AppendixKinds are the appendix kinds.
var AppendixKinds = []string{"methodology", "data"}

// BlockKinds are the fence info strings peerpack recognises.
var BlockKinds = []string{"chart", "table", "commentary", "appendix", "pagebreak", "columns", "clusters", "composite"}

// ChartKinds are the chart kinds.
var ChartKinds = []string{"box", "radar", "trend", "scatter", "heatmap", "bars", "esteem", "vote-profile"}

// MaxScaleIndicators is the most size measures a scale table shows, so its
// rows of institutions stay readable on a portrait page.
const MaxScaleIndicators = 6

// TableKinds are the table kinds.
var TableKinds = []string{"position", "peers", "groups", "population", "systems", "standing", "scale", "definitions"}

// CommentaryStyles are the commentary styles.
var CommentaryStyles = []string{"summary", "detail", "bullets"}

// CommentaryTopics are the commentary topics.
var CommentaryTopics = []string{"position", "change", "strengths", "competition", "gaps", "caveats", "association", "systems", "standouts", "moves", "questions", "peerchoice", "profile"}

func oneOf(v string, set []string) bool {
	for _, s := range set {
		if v == s {
			return true
		}
	}
	return false
}

func quoteList(set []string) string {
	return strings.Join(set, ", ")
}

// Defaults of the brief's noise and small_group settings (common practice,
// no source): five percentile points is four or five places in a group of
// a hundred, which a revision or one institution entering can shift;
// quartiles of fewer than ten values move a lot when one member changes.
const (
	DefaultNoise      = 5.0
	DefaultSmallGroup = 10
)

// NoiseRule is the brief's noise setting in percentile points, or the
// default.
func (b *Brief) NoiseRule() float64 {
	if b == nil || b.Noise == nil {
		return DefaultNoise
	}
	return *b.Noise
}

// SmallGroupFloor is the brief's small_group setting, or the default.
func (b *Brief) SmallGroupFloor() int {
	if b == nil || b.SmallGroup == nil {
		return DefaultSmallGroup
	}
	return *b.SmallGroup
}
