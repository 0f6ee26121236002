package narrative

import (
	"fmt"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// Wording turns planned facts into sentences of one language. Every word
// a reader sees comes from a Wording; the planner only decides what to
// say and hands over figures already printed by package format. To add a
// language, implement Wording in a new wording_xx.go and register it in
// WordingFor.
//
// Each method returns one sentence, starting with a capital letter and
// ending with a full stop. Facts carry a Seed: the figure key a sentence
// is about, from which the wording picks one of its phrasings.
type Wording interface {
	// Indicator is the indicator's label as it reads inside a sentence.
	Indicator(ind dataset.Indicator) string
	// List joins items: "a, b and c".
	List(items []string) string
	// Heading is a run-in heading for a topic ("Strengths").
	Heading(topic string) string
	// GroupPhrase is how running text names a group: the brief's phrase
	// (figures.Group.Phrase) when it has one, else a default made from
	// the group's name ("the Kestrian sector", "Aldmere").
	GroupPhrase(g *figures.Group) string
	// SystemsWording words the systems topic (wording_en_systems.go).
	SystemsWording

	Position(f PositionFact) string
	Distance(f PositionFact) string
	// SharedRank: one first or last place on several indicators, said
	// once ("last of 8 on six of the eleven indicators here: ...").
	SharedRank(f SharedRankFact) string
	// OneYear: a movement that came mostly in one year-to-year step.
	OneYear(f StepFact) string
	// Profile: the focus's values against a group's median across a
	// radar's indicators.
	Profile(f ProfileFact) string
	FocusMissing(f MissingFact) string
	// LeftOut: the indicators (f.Indicator, a list) a summary cannot
	// place because the focus reports no value for the year.
	LeftOut(f MissingFact) string
	GroupMissing(f MissingFact) string
	AllMissing(f MissingFact) string
	Alone(f PositionFact) string

	Change(f ChangeFact) string
	ChangeMedian(f ChangeFact) string
	ChangePercentile(f ChangeFact) string
	ChangeMissing(f MissingFact) string

	Overview(f OverviewFact) string
	Strengths(f RankedFact) string
	Risks(f RankedFact) string
	// AboveBelow follows the overview: the indicators above and below the
	// group's middle that it has not named (either list may be empty).
	AboveBelow(up, down RankedFact) string
	Headline(f ChangeFact) string

	CompetitionPlace(f CompetitionFact) string
	CompetitionAhead(f CompetitionFact) string
	CompetitionBehind(f CompetitionFact) string
	// CompetitionShared: the indicators on which every system's median
	// leads, said once before the systems.
	CompetitionShared(f CompetitionFact) string

	Gap(f GapFact) string
	GapList(fs []GapFact) string

	SmallGroup(f CaveatFact) string
	LowCoverage(f CaveatFact) string
	LowCoverageList(f CaveatFact) string
	Imputed(f CaveatFact) string
	PPP(f CaveatFact) string
	Judgement(f CaveatFact) string
	OneCountry(f CaveatFact) string
	// Skewed: the values are strongly skewed (f.N is the printed
	// skewness), so z-scores and means describe positions poorly.
	Skewed(f CaveatFact) string
	// ByConstruction: a nearest-peers group chosen on this indicator, so
	// the focus's similarity to it there is by construction.
	ByConstruction(f CaveatFact) string
	// SmallGroupBrief, PPPBrief and Direction are the executive
	// summary's short caveats: a group too small for stable quartiles,
	// the indicators in international dollars, and which indicators
	// count lower as better (and whether a direction is a value
	// judgement).
	SmallGroupBrief(f CaveatFact) string
	PPPBrief(f CaveatFact) string
	Direction(f DirectionFact) string
	// Association says how two indicators move together across a group;
	// AssociationTooFew names the pairs with too few members reporting
	// both to say.
	Association(f AssociationFact) string
	AssociationTooFew(f AssociationFact) string
}

// WordingFor returns the wording for a brief's language (en-GB, the
// default, or en-US).
func WordingFor(lang string) (Wording, error) {
	switch lang {
	case "", "en-GB":
		return english{us: false}, nil
	case "en-US":
		return english{us: true}, nil
	}
	return nil, fmt.Errorf("language %q has no commentary wording; use en-GB or en-US", lang)
}

// Relation of a value to a reference, judged on the printed digits so
// that "above" is never said of a value that prints equal.
const (
	Below = -1
	Level = 0
	Above = 1
)

// PositionFact is where the focus stands in one group on one indicator.
type PositionFact struct {
	Seed      string
	Focus     string
	Indicator string
	Group     string
	Better    dataset.Polarity
	Year      string
	Value     string
	// Rank is "6th" or a band "201–250" (Banded); Joint marks a shared
	// rank.
	Rank   string
	Banded bool
	Joint  bool
	// Last marks the last place of several (not shared), First the first;
	// the quarter goes without saying then.
	Last  bool
	First bool
	Of    string
	// Quartile is 1 (best quarter) to 4, 0 when the group is below the
	// small-group floor (no quarter is printed). Edge is 1 or 4 when the
	// percentile lies within the noise rule of the top or bottom
	// quarter's boundary: "at the edge of the top quarter".
	Quartile int
	Edge     int
	InGroup  bool
	// Members is the number of members with a value (outside groups).
	Members string
	Median  string
	// VsMedian is the value against the median by printed digits.
	VsMedian int
	// MedianDiff is the printed distance to the median on whichever side
	// (VsMedian says which), "" when level or when the distance would
	// contradict the printed values.
	MedianDiff string
	// Others is how many other members share the rank when Joint.
	Others int
	// Target is the top-quarter threshold (Q3, or Q1 when lower is better)
	// and GapTarget the printed distance still to go ("" once reached);
	// TargetDiff is the printed distance beyond it once reached ("" when
	// level or contradicting the printed values).
	Target     string
	GapTarget  string
	TargetDiff string
	Reached    bool
	// TargetLevel: reached, and the value prints equal to the threshold.
	TargetLevel bool
	// YearSaid: the part has already given the year; ValueSaid: the
	// sentence before placed the same value in another group.
	YearSaid, ValueSaid bool
	// Turn is the sentence's place in its part's series (see rotate).
	Turn int
	// Introduced is set once the sentences of a part have said that the
	// focus is not a member of this group.
	Introduced bool
	// RankSaid: a shared-rank sentence of the part has given this rank
	// already, so the position gives the value only and the distance
	// names the group.
	RankSaid bool
}

// SharedRankFact is one first or last place of the same number on
// several indicators of a block.
type SharedRankFact struct {
	Seed    string
	Focus   string
	Group   string
	Last    bool
	Of      string
	InGroup bool
	// Indicators are the names, in the block's order; Count is how many,
	// Total how many indicators the block covers.
	Indicators   []string
	Count, Total int
}

// MissingFact describes a value that is not there.
type MissingFact struct {
	Seed      string
	Focus     string
	Indicator string
	Group     string
	Year      string
	Median    string
}

// ChangeFact is the focus's movement over the span in a group.
type ChangeFact struct {
	Seed      string
	Focus     string
	Indicator string
	Group     string
	Better    dataset.Polarity
	FromYear  string
	ToYear    string
	// EndsEarly is set when ToYear is earlier than the reporting year
	// (the focus's last value is older): the sentence then names both
	// years rather than reading as a change up to now.
	EndsEarly bool
	// Later is set when FromYear is later than the years asked for
	// because no member of the group has a value before it.
	Later    bool
	From, To string
	// Direction is Above (rose), Below (fell) or Level (broadly
	// unchanged: within the noise threshold).
	Direction int
	Diff      string
	// NoiseIQR is the printed interquartile range when a change was called
	// broadly unchanged for being small beside it.
	NoiseIQR string
	// MedianFrom and MedianTo are the group median at both ends;
	// MedianDirection as Direction.
	MedianFrom, MedianTo string
	MedianDirection      int
	// PctFrom and PctTo are percentile ranks at both ends ("60th").
	PctFrom, PctTo string
	// Resized is set when the number of members reporting changed by
	// more than figures.SizeChangeLimit; SizeFrom and SizeTo are those
	// numbers. The comparison is then by percentile and within the
	// constant panel (the members reporting in both years), not by raw
	// rank.
	Resized          bool
	Shrank           bool
	SizeFrom, SizeTo string
	// Percentiles is set when percentiles are printed (the group is at or
	// above the small-group floor at both ends).
	Percentiles bool
	// PanelOf is the constant panel's size ("" without one), PanelFrom
	// and PanelTo the focus's ranks in it ("40th"), PanelDirection Above
	// when the rank improved, Below when it worsened, Level when equal;
	// PanelMember is set when the focus is one of the panel.
	PanelOf, PanelFrom, PanelTo string
	PanelDirection              int
	PanelMember                 bool
	// PctDirection is Above when the percentile rose, Below when it fell.
	PctDirection int
	// GroupNamed is set when an earlier sentence of the paragraph has
	// named the group.
	GroupNamed bool
	// Turn is the sentence's place in its part's series (see rotate).
	Turn int
}

// OverviewFact lists the indicators in the best and worst quarter of the
// reference group.
type OverviewFact struct {
	Seed   string
	Focus  string
	Group  string
	Top    []RankedItem
	Bottom []RankedItem
	// EdgeTop and EdgeBottom are the indicators within the noise rule of
	// the top or bottom quarter's boundary, whichever side: "at the edge
	// of" the quarter, not in or out of it.
	EdgeTop, EdgeBottom []RankedItem
	// Middle counts the indicators in neither quarter nor at an edge.
	Middle int
	// Small is set when the group is below the small-group floor: First
	// and Last list the indicators where the focus ranks first or last
	// ("1st of 5"), and no quarters are named; Floor is the printed floor.
	Small       bool
	First, Last []RankedItem
	Floor       string
	// MoreTop and MoreBottom count the indicators of each quarter left
	// out of lists cut to OverviewItems.
	MoreTop, MoreBottom int
	// named holds the keys of the indicators the lists name.
	named map[string]bool
}

// RankedItem is one strength or risk: an indicator and its percentile,
// or, in a group below the small-group floor, its rank "of n" (Rank, with
// Percentile empty).
type RankedItem struct {
	Indicator  string
	Percentile string
	Rank       string
	Value      string
}

// RankedFact lists strengths or risks in a group.
type RankedFact struct {
	Seed  string
	Focus string
	Group string
	Items []RankedItem
	// GroupNamed is set when the sentence before has just named the
	// group, so this one need not; Also when it has named other
	// indicators in the same direction, so this list adds to it.
	GroupNamed bool
	Also       bool
	// More counts the indicators left out of Items (AboveBelow says
	// "and two other indicators").
	More int
}

// CompetitionFact describes the focus placed inside a competitor system.
type CompetitionFact struct {
	Seed   string
	Focus  string
	System string
	// InSystem is set when the focus belongs to the system.
	InSystem bool
	Top      []string
	Bottom   []string
	// MoreTop and MoreBottom count indicators left out of Top and Bottom.
	MoreTop, MoreBottom int
	// EdgeTop and EdgeBottom name the indicators within the noise rule
	// of the top or bottom quarter's boundary (see OverviewFact).
	EdgeTop, EdgeBottom []string
	// Small: the system is below the small-group floor; First and Last
	// then list first and last places "of n" (see OverviewFact).
	Small       bool
	First, Last []RankedItem
	Floor       string
	// Systems and Shared, for CompetitionShared: how many systems, and
	// the indicators on which every one of their medians leads.
	Systems int
	Shared  []string
	// Others: for CompetitionBehind, the shared leads were said before,
	// so "not ahead" is of the other indicators; for CompetitionShared,
	// no system's median leads on any other indicator.
	Others bool
	// Ahead lists the indicators where the system's median is better
	// than the focus, with both printed values.
	Ahead []AheadItem
	// Level lists the indicators where the system's median is ahead by
	// less than the data carries (the noise rule): level, not a lead.
	Level []AheadItem
}

// AheadItem is one indicator where a competitor median leads.
type AheadItem struct {
	Indicator string
	Median    string
	Value     string
}

// GapFact is the distance to the top-quarter threshold of a group.
type GapFact struct {
	Seed      string
	Focus     string
	Indicator string
	Group     string
	Better    dataset.Polarity
	Target    string
	// Amount is the printed distance, "" when it would contradict the
	// printed values; Value is the focus's printed value.
	Amount string
	Value  string
	// Rank, when set, is the place the target reaches ("2nd of 8"): the
	// group is below the small-group floor, so the target is a rank, not
	// the top quarter, and the wording must not speak of quarters.
	Rank string
	// GroupNamed (on the first fact of a list) is set when an earlier
	// sentence of the paragraph has named the group.
	GroupNamed bool
	// Turn is the sentence's place in its part's series (see rotate).
	Turn int
}

// CaveatFact carries what a caveat names.
type CaveatFact struct {
	Seed      string
	Focus     string
	Indicator string
	Group     string
	Better    dataset.Polarity
	Year      string
	N         string
	Missing   string
	Threshold string
	Note      string
	Judgement string
	Country   string
	// Indicators lists indicators a caveat covers together; for PPP, the
	// converted ones, and Derived those computed from converted amounts.
	Indicators []string
	Derived    []string
	// RanksOnly: the group is below the brief's small-group floor, so the
	// pack gives its ranks and no quarters.
	RanksOnly bool
}

// DirectionFact lists, for the executive summary, the indicators on which
// lower counts as better (LowerJudged: those of them whose direction the
// dictionary calls a value judgement) and the higher-is-better indicators
// whose direction is one.
type DirectionFact struct {
	Lower        []string
	LowerJudged  []string
	HigherJudged []string
}

// AssociationFact is how two indicators move together across a group's
// members in a year (Spearman's rank correlation).
type AssociationFact struct {
	Seed  string
	Group string
	X, Y  string
	N     string
	Year  string
	Rho   string
	// R is Pearson's r printed, the measure the chart's least-squares line
	// follows ("" when the model has none).
	R string
	// Strength is Above (clear, |rho| >= AssociationClear), Level (loose)
	// or Below (little association); Negative when higher X goes with
	// lower Y.
	Strength int
	Negative bool
	// Threshold, for AssociationTooFew, is the printed minimum number of
	// members reporting both; Constant says there were enough, but one of
	// the two takes a single value among them.
	Threshold string
	Constant  bool
}
