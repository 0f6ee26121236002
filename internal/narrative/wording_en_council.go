package narrative

import "peerpack/internal/dataset"

// The wording of the topics written for a governing body and for a
// consultant's client (plan_standouts.go, plan_questions.go,
// plan_peerchoice.go). They live beside the Wording interface rather than
// in it, as councilWording: a language that has them implements it too,
// and the planners fall back to English wording otherwise.

// councilWording turns the facts of the standouts, moves, questions and
// peer-choice topics into sentences.
type councilWording interface {
	// TopicHeading is a run-in heading for these topics' paragraphs:
	// "strengths", "risks", "moves", "steady", "questions", "peerchoice".
	TopicHeading(kind string) string
	// StandoutLead opens the strengths (strong) or risks with the
	// indicators chosen and their percentiles or ranks; the evidence for
	// each follows under its own heading.
	StandoutLead(f RankedFact, strong bool) string
	// Steady names the indicators whose percentile moved by less than
	// the noise rule over the span.
	Steady(f SteadyFact) string
	// Unread names the indicators with no movement to read.
	Unread(f SteadyFact) string
	// Question is one question the figures put to the governing body.
	Question(f QuestionFact) string
	// NoQuestion: none of the situations the questions look for arose.
	NoQuestion(f QuestionFact) string
	// PeerSame: on these indicators every peer set reads the same way.
	PeerSame(f PeerChoiceFact) string
	// PeerDepends: on this indicator the reading depends on the peers.
	PeerDepends(f PeerChoiceFact) string
	// PeerUnread: the indicators on which the focus has no place in
	// every set, so no reading across them is given.
	PeerUnread(f PeerChoiceFact) string
}

// council returns the composer's wording of these topics.
func (c *composer) council() councilWording {
	if w, ok := c.w.(councilWording); ok {
		return w
	}
	return english{}
}

// SteadyFact lists indicators that did not move beyond the noise rule
// (Noise, printed) in a group over the span, or that have no movement to
// read.
type SteadyFact struct {
	Seed       string
	Focus      string
	Group      string
	Indicators []string
	Noise      string
	// Small: Unread's group is below the small-group floor (Floor,
	// printed), so no percentile movement is read.
	Small bool
	Floor string
}

// Kinds of question (QuestionFact.Kind), in the order a council should
// hear them.
const (
	// QuestionFalling: in the bottom quarter and losing ground.
	QuestionFalling = iota + 1
	// QuestionLast: last of a group too small for quarters.
	QuestionLast
	// QuestionSlipping: in the top quarter but losing ground.
	QuestionSlipping
	// QuestionBottom: in (or at the edge of) the bottom quarter.
	QuestionBottom
)

// QuestionFact is one question, with the figures it rests on printed.
type QuestionFact struct {
	// Seed and Turn pick the phrasing: questions of one kind in a block
	// rotate through theirs (vary.go).
	Seed      string
	Turn      int
	Kind      int
	Focus     string
	Indicator string
	Group     string
	Better    dataset.Polarity
	// Pct is the percentile in Year; PctFrom the one in FromYear.
	Pct, PctFrom   string
	Year, FromYear string
	// Edge is set when the position lies within the noise rule of the
	// bottom quarter's boundary.
	Edge bool
	Of   string
	// Groups names the groups a NoQuestion sentence covers.
	Groups []string
}

// PeerPlace is the focus's place in one peer set: a rank "3rd of 8" in a
// group below the small-group floor, else a percentile "82nd".
type PeerPlace struct {
	Group      string
	Rank       string
	Percentile string
}

// PeerChoiceFact: the focus's places across peer sets on one indicator
// (PeerDepends) or the indicators read alike by every set (PeerSame).
type PeerChoiceFact struct {
	Seed       string
	Focus      string
	Indicator  string
	Above      []PeerPlace
	Below      []PeerPlace
	Level      []PeerPlace
	Indicators []string
	Groups     []string
	// Up: PeerSame's indicators are above the middle of every set;
	// After: a PeerSame sentence has just named the sets.
	Up, After bool
}

var councilHeadings = map[string]string{
	"strengths":  "Strengths",
	"risks":      "Risks",
	"moves":      "Movements beyond noise",
	"steady":     "Within noise",
	"questions":  "Questions",
	"peerchoice": "Choice of peers",
}

func (english) TopicHeading(kind string) string {
	if h, ok := councilHeadings[kind]; ok {
		return h
	}
	return capitalise(kind)
}

func (e english) StandoutLead(f RankedFact, strong bool) string {
	kv := []string{"focus", f.Focus, "in", e.in(f.Group), "items", e.ranked(f.Items)}
	switch {
	case strong && len(f.Items) == 1:
		return e.fill("Only one indicator places {focus} above the middle {in}: {items}; the evidence follows.", kv...)
	case strong:
		return e.fill("The indicators on which {focus} stands furthest above the middle {in} are {items}; the evidence for each follows.", kv...)
	case len(f.Items) == 1:
		return e.fill("Only one indicator places {focus} below the middle {in}: {items}; the evidence follows.", kv...)
	}
	return e.fill("The indicators on which {focus} stands furthest below the middle {in} are {items}; the evidence for each follows.", kv...)
}

func (e english) Steady(f SteadyFact) string {
	if f.Noise == "" {
		return e.fill("On {list}, {focus}'s percentile {in} moved by less than the noise rule over the span, within the year-to-year noise of the data.",
			"list", e.List(f.Indicators), "focus", f.Focus, "in", e.in(f.Group))
	}
	return e.fill("On {list}, {focus}'s percentile {in} moved by less than {noise} points over the span, within the year-to-year noise of the data.",
		"list", e.List(f.Indicators), "focus", f.Focus, "in", e.in(f.Group), "noise", f.Noise)
}

func (e english) Unread(f SteadyFact) string {
	if f.Small {
		return e.fill("No percentile movement is read on {list}: fewer than {floor} members of {group} report it.",
			"list", e.List(f.Indicators), "group", f.Group, "floor", f.Floor)
	}
	return e.fill("No movement can be read on {list}: {focus} has no value to compare with at one end of the span.",
		"list", e.List(f.Indicators), "focus", f.Focus)
}

func (e english) Question(f QuestionFact) string {
	kv := []string{"focus", f.Focus, "ind", f.Indicator, "group", f.Group, "in", e.in(f.Group),
		"pct", f.Pct, "pf", f.PctFrom, "year", f.Year, "from", f.FromYear, "of", f.Of}
	switch f.Kind {
	case QuestionFalling:
		return e.fill("In the bottom quarter of {group} ({pct} percentile in {year}) and down from the {pf} percentile in {from}: what is being done to reverse the fall, and when should the council expect to see it move?", kv...)
	case QuestionLast:
		tmpl := [...]string{
			"Last of {of} {in}: is this the gap to close first, or do these peers differ from {focus} in a way that explains it?",
			"Last of {of} {in}: what would it take to reach the next place, and is that the right ambition?",
			"Last of {of} {in}: does the executive see this as a weakness to address or as a consequence of {focus}'s mission?",
		}
		return e.fill(tmpl[rotate(f.Seed, f.Turn, len(tmpl))], kv...)
	case QuestionSlipping:
		return e.fill("Still in the top quarter of {group} ({pct} percentile in {year}) but down from the {pf} percentile in {from}: is the lead at risk, and what sustains it?", kv...)
	case QuestionBottom:
		if f.Edge {
			return e.fill("At the edge of the bottom quarter of {group} ({pct} percentile in {year}): is this a position {focus} accepts by choice, or one it plans to change?", kv...)
		}
		tmpl := [...]string{
			"In the bottom quarter of {group} ({pct} percentile in {year}): is this a position {focus} accepts by choice, or one it plans to change?",
			"In the bottom quarter of {group} ({pct} percentile in {year}): which plan addresses it, and what would count as progress?",
		}
		return e.fill(tmpl[rotate(f.Seed, f.Turn, len(tmpl))], kv...)
	}
	return ""
}

func (e english) NoQuestion(f QuestionFact) string {
	return e.fill("The figures raise no question of the kinds this section asks: on these indicators {focus} is in the bottom quarter of none of {groups}, and last of none.",
		"focus", f.Focus, "groups", e.List(f.Groups))
}

func (e english) peerPlaces(ps []PeerPlace) string {
	items := make([]string, len(ps))
	for i, p := range ps {
		place := p.Rank
		if place == "" {
			place = p.Percentile + " percentile"
		}
		items[i] = p.Group + " (" + place + ")"
	}
	return e.List(items)
}

func (e english) PeerDepends(f PeerChoiceFact) string {
	var parts []string
	if len(f.Above) > 0 {
		parts = append(parts, "above the middle of "+e.peerPlaces(f.Above))
	}
	if len(f.Below) > 0 {
		w := "below the middle of "
		if len(parts) > 0 {
			w = "but " + w
		}
		parts = append(parts, w+e.peerPlaces(f.Below))
	}
	if len(f.Level) > 0 {
		parts = append(parts, "at the middle of "+e.peerPlaces(f.Level))
	}
	joined := parts[0]
	switch len(parts) {
	case 2:
		joined = parts[0] + " " + parts[1]
		if len(f.Below) == 0 {
			joined = parts[0] + " and " + parts[1]
		}
	case 3:
		joined = parts[0] + " " + parts[1] + ", and " + parts[2]
	}
	return e.fill("The reading depends on the peers chosen: {focus} is {parts}.", "focus", f.Focus, "parts", joined)
}

func (e english) PeerSame(f PeerChoiceFact) string {
	side := "below"
	if f.Up {
		side = "above"
	}
	if f.After {
		// The sets were named by the sentence before.
		return e.fill("Against every one of them it stands "+side+" the middle on {list}.", "list", e.List(f.Indicators))
	}
	return e.fill("Whichever of {groups} is taken, {focus} stands "+side+" the middle on {list}.",
		"groups", e.List(f.Groups), "focus", f.Focus, "list", e.List(f.Indicators))
}

func (e english) PeerUnread(f PeerChoiceFact) string {
	return e.fill("No reading across the sets is given for {list}: {focus} has no place in every one of them (no value, or too few members reporting).",
		"list", e.List(f.Indicators), "focus", f.Focus)
}
