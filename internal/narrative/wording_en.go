package narrative

import (
	"strings"
	"unicode"
	"unicode/utf8"

	"peerpack/internal/dataset"
	"peerpack/internal/format"
)

// english is the commentary's English wording; us selects American
// spelling and the serial comma. Templates name their slots in braces
// ({focus}); spelling is applied to the template only, never to names
// filled in from the data (an institution called "Centre for ..." keeps
// its name).
type english struct{ us bool }

// usSpelling maps the British spellings the templates use to American
// ones. Every British spelling in this file must have its pair here.
var usSpelling = strings.NewReplacer(
	"judgement", "judgment",
	"unfavourable", "unfavorable",
	"favourable", "favorable",
	"analysed", "analyzed",
)

// fill applies spelling to the template's own words (not its slot
// names), then puts the values in its slots (given as slot, value pairs),
// and capitalises the first letter.
func (e english) fill(tmpl string, kv ...string) string {
	if e.us {
		tmpl = spellOutsideSlots(tmpl)
	}
	pairs := make([]string, 0, len(kv))
	for i := 0; i+1 < len(kv); i += 2 {
		pairs = append(pairs, "{"+kv[i]+"}", kv[i+1])
	}
	return capitalise(strings.NewReplacer(pairs...).Replace(tmpl))
}

// spellOutsideSlots applies American spelling to the text between slots.
func spellOutsideSlots(tmpl string) string {
	var b strings.Builder
	for tmpl != "" {
		i := strings.IndexByte(tmpl, '{')
		if i < 0 {
			b.WriteString(usSpelling.Replace(tmpl))
			break
		}
		j := strings.IndexByte(tmpl[i:], '}')
		if j < 0 {
			b.WriteString(usSpelling.Replace(tmpl))
			break
		}
		b.WriteString(usSpelling.Replace(tmpl[:i]))
		b.WriteString(tmpl[i : i+j+1])
		tmpl = tmpl[i+j+1:]
	}
	return b.String()
}

// capitalise upper-cases a sentence's first letter; see format.Capitalise.
func capitalise(s string) string { return format.Capitalise(s) }

// Indicator lowers the first letter of a label for use inside a sentence,
// unless the label starts with an abbreviation ("FNCI", "PhD share").
func (english) Indicator(ind dataset.Indicator) string {
	label := ind.Label
	if label == "" {
		label = ind.Key
	}
	return lowerFirst(label)
}

// List joins items as "a, b and c" (British) or "a, b, and c" (American).
func (e english) List(items []string) string {
	switch len(items) {
	case 0:
		return ""
	case 1:
		return items[0]
	case 2:
		return items[0] + " and " + items[1]
	}
	last := " and "
	if e.us {
		last = ", and "
	}
	return strings.Join(items[:len(items)-1], ", ") + last + items[len(items)-1]
}

var englishHeadings = map[string]string{
	"summary":     "Summary",
	"position":    "Position",
	"change":      "Change",
	"strengths":   "Strengths and risks",
	"competition": "Competitor systems",
	"gaps":        "Gaps",
	"caveats":     "Caveats",
	"association": "How indicators move together",
	"ranks":       "Places held on several indicators",
	"profile":     "Profile against the median",
}

// Heading names a topic.
func (english) Heading(topic string) string {
	if h, ok := englishHeadings[topic]; ok {
		return h
	}
	return capitalise(topic)
}

// possessive: "Veldra's", "Arnholt Studies'".
func possessive(name string) string {
	if strings.HasSuffix(name, "s") {
		return name + "'"
	}
	return name + "'s"
}

func (english) rank(f PositionFact) string {
	if f.Banded {
		return "in the " + f.Rank + " band of " + f.Of
	}
	if f.Last {
		if f.Better == dataset.Neutral {
			return "lowest of " + f.Of
		}
		return "last of " + f.Of
	}
	r := f.Rank
	if f.Joint {
		r = "joint " + r
	}
	if f.Better == dataset.Neutral {
		r += " highest"
	}
	r += " of " + f.Of
	if f.Joint && f.Others > 0 {
		r += " with " + countWords(f.Others, "other", "others")
	}
	return r
}

var smallNumbers = [...]string{"no", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine"}

// countWords writes a small count in words and a larger one in digits,
// as house styles do ("two others", "12 others"; common practice, no
// source).
func countWords(n int, one, many string) string {
	word := many
	if n == 1 {
		word = one
	}
	if n >= 0 && n < len(smallNumbers) {
		return smallNumbers[n] + " " + word
	}
	return printCount(n) + " " + word
}

var judgedQuarter = [5]string{"", "in the top quarter", "in the second quarter", "in the third quarter", "in the bottom quarter"}
var neutralQuarter = [5]string{"", "among the highest quarter of values", "in the second-highest quarter of values", "in the second-lowest quarter of values", "among the lowest quarter of values"}

func (english) quarter(better dataset.Polarity, q int) string {
	if q < 1 || q > 4 {
		return ""
	}
	return quarterWord(better, q)
}

// edgeWord: a position within the noise rule of a quarter boundary.
func edgeWord(better dataset.Polarity, edge int) string {
	switch {
	case better == dataset.Neutral && edge == 1:
		return "at the edge of the highest quarter of values"
	case better == dataset.Neutral && edge == 4:
		return "at the edge of the lowest quarter of values"
	case edge == 1:
		return "at the edge of the top quarter"
	case edge == 4:
		return "at the edge of the bottom quarter"
	}
	return ""
}

func quarterWord(better dataset.Polarity, q int) string {
	if better == dataset.Neutral {
		return neutralQuarter[q]
	}
	return judgedQuarter[q]
}

// Position: value, rank of n and quartile in a group. The sentence always
// follows the indicator's run-in heading, so it does not name the indicator
// again; it gives the year only the first time in a part, the value only
// the first time for an indicator, and no quarter for a first or last
// place, which says it already.
func (e english) Position(f PositionFact) string {
	q := ""
	if !f.Last && !f.First {
		if w := e.quarter(f.Better, f.Quartile); w != "" {
			q = ", " + w
		}
		if f.Quartile != 0 && f.Edge != 0 {
			q = ", " + edgeWord(f.Better, f.Edge)
		}
	}
	inYear := " in " + f.Year
	if f.YearSaid {
		inYear = ""
	}
	kv := []string{"focus", f.Focus, "focus's", possessive(f.Focus), "ind", f.Indicator, "group", f.Group, "in", e.in(f.Group),
		"value", f.Value, "inYear", inYear, "rank", e.rank(f), "q", q, "members", f.Members}
	switch {
	case f.RankSaid:
		return e.fill("{focus's} figure is {value}{inYear}.", kv...)
	case !f.InGroup && !f.Introduced:
		its := "its {value}{inYear}"
		if f.ValueSaid {
			its = "it"
		}
		if f.Members == "1" {
			return e.fill("{focus} is not a member of {group}; placed beside its one member that reports {ind}, "+its+" would rank {rank}{q}.", kv...)
		}
		return e.fill("{focus} is not a member of {group}; placed among the {members} members that report {ind}, "+its+" would rank {rank}{q}.", kv...)
	case !f.InGroup && f.ValueSaid:
		return e.fill("Set against {group}, it would rank {rank}{q}.", kv...)
	case !f.InGroup:
		return e.fill("Set against {group}, {focus} would rank {rank} at {value}{inYear}{q}.", kv...)
	case f.ValueSaid:
		return e.fill("{in} it ranks {rank}{q}.", kv...)
	}
	tmpl := [...]string{
		"At {value}{inYear}, {focus} ranks {rank} {in}{q}.",
		"{focus} ranks {rank} {in} ({value}{inYear}){q}.",
		"{focus} stands {rank} {in} at {value}{inYear}{q}.",
	}
	return e.fill(tmpl[rotate(f.Seed, f.Turn, len(tmpl))], kv...)
}

// Distance: how far from the median and from the top-quarter threshold
// (the upper quartile, or the lower one when lower is better), joined by
// "but" when the two point different ways.
func (e english) Distance(f PositionFact) string {
	rel := "level with"
	switch {
	case f.VsMedian == Above && f.MedianDiff != "":
		rel = f.MedianDiff + " above"
	case f.VsMedian == Above:
		rel = "above"
	case f.VsMedian == Below && f.MedianDiff != "":
		rel = f.MedianDiff + " below"
	case f.VsMedian == Below:
		rel = "below"
	}
	lower := f.Better == dataset.LowerIsBetter
	favourable := (f.VsMedian == Above && !lower) || (f.VsMedian == Below && lower)
	tail := ""
	if lower && f.VsMedian != Level {
		if favourable {
			tail = " (favourable, as lower is better here)"
		} else {
			tail = " (unfavourable, as lower is better here)"
		}
	}
	target := ""
	if f.Better != dataset.Neutral && f.Target != "" {
		q, beyond := "upper quartile", "above"
		if lower {
			q, beyond = "lower quartile", "below"
		}
		switch {
		case f.Reached && f.TargetLevel:
			target = "level with the " + q + " ({target})"
		case f.Reached && f.TargetDiff != "":
			target = f.TargetDiff + " " + beyond + " the " + q + " ({target})"
		case f.Reached:
			target = beyond + " the " + q + " ({target})"
		case lower && f.GapTarget != "":
			target = f.GapTarget + " above the " + q + " ({target})"
		case lower:
			target = "above the " + q + " ({target})"
		case f.GapTarget != "":
			target = f.GapTarget + " short of the " + q + " ({target})"
		default:
			target = "short of the " + q + " ({target})"
		}
		conj := ", and "
		if f.VsMedian != Level && favourable != f.Reached {
			conj = ", but "
		}
		target = conj + target
	}
	kv := []string{"focus", f.Focus, "group", f.Group, "median", f.Median, "target", f.Target, "rel", rel}
	if f.VsMedian == Level && f.TargetLevel && f.Median == f.Target {
		q := "upper quartile"
		if lower {
			q = "lower quartile"
		}
		return e.fill("That is level with both the group median and the "+q+" ({median}).", kv...)
	}
	tmpl := [...]string{
		"That is {rel} the group median of {median}" + tail + target + ".",
		"The median of {group} is {median}; {focus} is {rel} it" + tail + target + ".",
	}
	if f.RankSaid {
		// After a bare value the group must be named.
		return e.fill(tmpl[1], kv...)
	}
	return e.fill(tmpl[rotate(f.Seed, f.Turn, len(tmpl))], kv...)
}

// FocusMissing: the focus reports no value.
func (e english) FocusMissing(f MissingFact) string {
	kv := []string{"focus", f.Focus, "ind", f.Indicator, "group", f.Group, "in", e.in(f.Group), "year", f.Year, "median", f.Median}
	if f.Median == "" {
		return e.fill("{focus} reports no {ind} for {year}, so it cannot be placed {in}.", kv...)
	}
	tmpl := [...]string{
		"{focus} reports no {ind} for {year}, so it cannot be placed {in}, where the median is {median}.",
		"With no {ind} reported for {year}, {focus} has no place {in}; the group median is {median}.",
	}
	return e.fill(tmpl[variant(f.Seed, len(tmpl))], kv...)
}

// LeftOut: what a summary cannot place, and why.
func (e english) LeftOut(f MissingFact) string {
	return e.fill("The positions above leave out {ind}, for which {focus} reports no {year} figure.",
		"focus", f.Focus, "year", f.Year, "ind", f.Indicator)
}

// GroupMissing: no member of the group reports the indicator.
func (e english) GroupMissing(f MissingFact) string {
	return e.fill("No member of {group} reports {ind} for {year}, so {focus} cannot be compared there.",
		"focus", f.Focus, "ind", f.Indicator, "group", f.Group, "year", f.Year)
}

// AllMissing: no comparison group has the indicator at all.
func (e english) AllMissing(f MissingFact) string {
	return e.fill("No institution in any comparison group reports {ind} for {year}, so the pack makes no comparison on it.",
		"ind", f.Indicator, "year", f.Year)
}

// Alone: the focus is the only member with a value.
func (e english) Alone(f PositionFact) string {
	return e.fill("{focus} is the only member of {group} that reports {ind} ({value} in {year}), so there is nothing to compare it with.",
		"focus", f.Focus, "ind", f.Indicator, "group", f.Group, "value", f.Value, "year", f.Year)
}

// Change: the focus's own movement over the span. Like Position and Gap it
// follows the indicator's run-in heading and does not name it again.
func (e english) Change(f ChangeFact) string {
	fromYear := f.FromYear
	if f.Later {
		fromYear += " (the first year with figures)"
	}
	kv := []string{"focus", f.Focus, "focus's", possessive(f.Focus), "ind", f.Indicator, "from", f.From, "to", f.To,
		"fromYear", fromYear, "toYear", f.ToYear, "diff", f.Diff, "iqr", f.NoiseIQR}
	if f.Direction == Level {
		switch {
		case f.From == f.To:
			return e.fill("{focus's} figure was broadly unchanged at {to} between {fromYear} and {toYear}.", kv...)
		case f.NoiseIQR != "":
			// "a twentieth" is NoiseIQRShare in words.
			return e.fill("{focus's} figure was broadly unchanged between {fromYear} and {toYear} ({from}, then {to}), a movement of less than a twentieth of the group's interquartile range ({iqr}).", kv...)
		}
		return e.fill("{focus's} figure was broadly unchanged between {fromYear} and {toYear} ({from}, then {to}), a movement smaller than the last decimal the data reports.", kv...)
	}
	verb, verbed, noun := "risen", "rose", "a rise"
	if f.Direction == Below {
		verb, verbed, noun = "fallen", "fell", "a fall"
	}
	// Where lower is better, a reader should not have to work out that a
	// fall is good news.
	judge := ""
	if f.Better == dataset.LowerIsBetter {
		if f.Direction == Below {
			judge = " (favourable, as lower is better here)"
		} else {
			judge = " (unfavourable, as lower is better here)"
		}
	}
	if f.Diff == "" {
		if f.EndsEarly {
			return e.fill("Between {fromYear} and {toYear}, {focus's} figure "+verbed+" from {from} to {to}"+judge+".", kv...)
		}
		return e.fill("Since {fromYear}, {focus's} figure has "+verb+" from {from} to {to}"+judge+".", kv...)
	}
	tmpl := [...]string{
		"Since {fromYear}, {focus's} figure has " + verb + " from {from} to {to}, " + noun + " of {diff}" + judge + ".",
		"{focus's} figure " + verbed + " by {diff} between {fromYear} and {toYear}, from {from} to {to}" + judge + ".",
		"Between {fromYear} and {toYear}, {focus} went from {from} to {to}, " + noun + " of {diff}" + judge + ".",
	}
	i := rotate(f.Seed, f.Turn, len(tmpl))
	if f.EndsEarly && i == 0 {
		// "Since 2020" reads as "up to now"; the last value is older.
		i = 1
	}
	return e.fill(tmpl[i], kv...)
}

// ChangeMedian: the group median's movement and what it meant for the
// focus's standing.
func (e english) ChangeMedian(f ChangeFact) string {
	kv := []string{"focus", f.Focus, "focus's", possessive(f.Focus), "group", f.Group, "group's", possessive(f.Group), "mf", f.MedianFrom, "mt", f.MedianTo, "pf", f.PctFrom, "pt", f.PctTo}
	moved := "moved from {mf} to {mt}"
	switch f.MedianDirection {
	case Above:
		moved = "rose from {mf} to {mt}"
	case Below:
		moved = "fell from {mf} to {mt}"
	case Level:
		moved = "was broadly unchanged ({mf}, then {mt})"
		if f.MedianFrom == f.MedianTo {
			moved = "stayed at {mt}"
		}
	}
	tail := ""
	switch {
	case f.Resized || f.PctFrom == "":
		// The percentile sentence that follows says what it meant, or
		// there are no percentiles to compare.
	case f.Better == dataset.Neutral && f.PctDirection != Level:
		tail = ", taking {focus} from the {pf} to the {pt} percentile"
	case f.Better == dataset.Neutral:
		tail = ", leaving {focus} at the {pt} percentile"
	case f.PctDirection == Above:
		verbs := [...]string{"gained ground, from", "moved up from", "climbed from"}
		tail = ", and {focus} " + verbs[rotate(f.Seed+"/tail", f.Turn, len(verbs))] + " the {pf} to the {pt} percentile"
	case f.PctDirection == Below:
		verbs := [...]string{"lost ground, from", "slipped from", "dropped from"}
		tail = ", and {focus} " + verbs[rotate(f.Seed+"/tail", f.Turn, len(verbs))] + " the {pf} to the {pt} percentile"
	case f.PctFrom == f.PctTo:
		tail = ", and {focus} held its place at the {pt} percentile"
	default:
		// PctDirection Level: a move under PercentileNoise points.
		tail = ", and {focus's} standing barely moved (from the {pf} to the {pt} percentile)"
	}
	tmpl := [...]string{
		"Over the same years the median of {group} " + moved + tail + ".",
		"{group's} median " + moved + " over the period" + tail + ".",
	}
	return e.fill(tmpl[rotate(f.Seed, f.Turn, len(tmpl))], kv...)
}

// ChangeMissing: no value at the start, so no change.
func (e english) ChangeMissing(f MissingFact) string {
	return e.fill("{focus} reports no {ind} for {year}, so its movement since then cannot be given.",
		"focus", f.Focus, "ind", f.Indicator, "year", f.Year)
}

// ChangePercentile: membership changed a lot, so the standing is
// compared by percentile and among the members reporting in both years
// (the constant panel), not by raw rank.
func (e english) ChangePercentile(f ChangeFact) string {
	grew := "grew"
	if f.Shrank {
		grew = "fell"
	}
	kv := []string{"focus", f.Focus, "group", f.Group, "sf", f.SizeFrom, "st", f.SizeTo, "pf", f.PctFrom, "pt", f.PctTo,
		"po", f.PanelOf, "rf", f.PanelFrom, "rt", f.PanelTo}
	moved := ""
	if f.Percentiles {
		switch {
		case f.PctDirection == Above:
			moved = "rose from the {pf} to the {pt} percentile"
		case f.PctDirection == Below:
			moved = "fell from the {pf} to the {pt} percentile"
		case f.PctFrom == f.PctTo:
			moved = "stayed at the {pt} percentile"
		default:
			moved = "barely moved, from the {pf} to the {pt} percentile"
		}
		if f.Better == dataset.Neutral && f.PctDirection != Level {
			moved = "went from the {pf} to the {pt} percentile"
		}
	}
	// The focus's rank within the constant panel; "of {po}" when it is
	// placed among the panel without being one of it.
	ranked := ""
	if f.PanelOf != "" {
		switch f.PanelDirection {
		case Above:
			ranked = "moved up from {rf} to {rt}"
		case Below:
			ranked = "went down from {rf} to {rt}"
		default:
			ranked = "stayed {rt}"
		}
		if f.Better == dataset.Neutral {
			ranked = "placed {rf}, then {rt}"
			if f.PanelDirection == Level {
				ranked = "placed {rt} both times"
			}
		}
		if !f.PanelMember {
			ranked += " of {po}"
		}
	}
	among := "among the {po} members that reported in both years"
	if !f.PanelMember {
		among = "placed among the members that reported in both years"
	}
	lead := "Because the number of members of {group} reporting " + grew + " from {sf} to {st}, "
	switch {
	case moved != "" && ranked != "":
		return e.fill(lead+"the comparison is by percentile rather than raw rank: {focus} "+moved+"; "+among+" it "+ranked+".", kv...)
	case moved != "":
		return e.fill(lead+"the comparison is by percentile rather than rank: {focus} "+moved+".", kv...)
	}
	if f.PanelMember {
		return e.fill(lead+"ranks are compared only among the {po} members that reported in both years: {focus} "+ranked+".", kv...)
	}
	return e.fill(lead+"ranks are compared only among the members that reported in both years: placed among them, {focus} "+ranked+".", kv...)
}

// Overview: which indicators are in the best and worst quarter, with
// their percentiles; a list cut short ends "and two other indicators".
func (e english) Overview(f OverviewFact) string {
	if f.Small {
		return e.smallOverview(f)
	}
	top := e.rankedMore(f.Top, f.MoreTop, true)
	bottom := e.rankedMore(f.Bottom, f.MoreBottom, len(f.Top) == 0)
	kv := []string{"focus", f.Focus, "group", f.Group, "top", top, "bottom", bottom}
	edge := ""
	if len(f.EdgeTop) > 0 || len(f.EdgeBottom) > 0 {
		var parts []string
		word := len(f.Top) == 0 && len(f.Bottom) == 0
		if len(f.EdgeTop) > 0 {
			parts = append(parts, "of the top quarter on "+e.rankedMore(f.EdgeTop, 0, word))
			word = false
		}
		if len(f.EdgeBottom) > 0 {
			parts = append(parts, "of the bottom quarter on "+e.rankedMore(f.EdgeBottom, 0, word))
		}
		edge = "; it is at the edge " + strings.Join(parts, " and at the edge ") + ", within the noise of the data"
	}
	noTop, noBottom := len(f.EdgeTop) == 0, len(f.EdgeBottom) == 0
	switch {
	case len(f.Top) > 0 && len(f.Bottom) > 0:
		return e.fill("Within {group}, {focus} is in the top quarter on {top}, and in the bottom quarter on {bottom}"+edge+".", kv...)
	case len(f.Top) > 0 && noBottom:
		return e.fill("Within {group}, {focus} is in the top quarter on {top}, with no indicator in the bottom quarter"+edge+".", kv...)
	case len(f.Top) > 0:
		return e.fill("Within {group}, {focus} is in the top quarter on {top}"+edge+".", kv...)
	case len(f.Bottom) > 0 && noTop:
		return e.fill("Within {group}, {focus} is in the bottom quarter on {bottom}, with no indicator in the top quarter"+edge+".", kv...)
	case len(f.Bottom) > 0:
		return e.fill("Within {group}, {focus} is in the bottom quarter on {bottom}"+edge+".", kv...)
	case edge != "" && f.Middle > 0:
		return e.fill("Within {group}, {focus} is"+strings.TrimPrefix(edge, "; it is")+", and in the middle half on every other indicator.", kv...)
	case edge != "":
		return e.fill("Within {group}, {focus} is"+strings.TrimPrefix(edge, "; it is")+".", kv...)
	}
	return e.fill("Within {group}, {focus} sits in the middle half on every indicator, in neither the top nor the bottom quarter.", kv...)
}

// smallOverview: a group below the small-group floor gets first and last
// places "of n", no quarters.
func (e english) smallOverview(f OverviewFact) string {
	kv := []string{"focus", f.Focus, "group", f.Group, "in", e.in(f.Group), "first", e.rankedMore(f.First, 0, false),
		"last", e.rankedMore(f.Last, 0, false), "floor", f.Floor}
	switch {
	case len(f.First) > 0 && len(f.Last) > 0:
		return e.fill("{in}, {focus} ranks first on {first}, and last on {last}; with fewer than {floor} members reporting, no quarters or percentiles are given.", kv...)
	case len(f.First) > 0:
		return e.fill("{in}, {focus} ranks first on {first}, and last on none; with fewer than {floor} members reporting, no quarters or percentiles are given.", kv...)
	case len(f.Last) > 0:
		return e.fill("{in}, {focus} ranks last on {last}, and first on none; with fewer than {floor} members reporting, no quarters or percentiles are given.", kv...)
	}
	return e.fill("{in}, {focus} ranks neither first nor last on any indicator; with fewer than {floor} members reporting, no quarters or percentiles are given.", kv...)
}

// listMore lists items and, when a list was cut, how many it left out:
// "a, b, c and two other indicators".
func (e english) listMore(items []string, more int) string {
	if more > 0 {
		items = append(append([]string(nil), items...), countWords(more, "other indicator", "other indicators"))
	}
	return e.List(items)
}

// ranked lists indicators with their percentiles, the first with the word
// "percentile" when word is set: "a (88th percentile), b (80th) and c (76th)".
func (e english) rankedMore(items []RankedItem, more int, word bool) string {
	parts := make([]string, len(items))
	for i, it := range items {
		if it.Rank != "" {
			parts[i] = it.Indicator + " (" + it.Rank + ")"
			continue
		}
		if i == 0 && word {
			parts[i] = it.Indicator + " (" + it.Percentile + " percentile)"
		} else {
			parts[i] = it.Indicator + " (" + it.Percentile + ")"
		}
	}
	return e.listMore(parts, more)
}

func (e english) ranked(items []RankedItem) string { return e.rankedMore(items, 0, true) }

// Strengths: the indicators furthest above the group.
func (e english) Strengths(f RankedFact) string {
	tmpl := [...]string{
		"Its strongest positions {in} are on {items}.",
		"Measured against {group}, the strengths are {items}.",
	}
	if len(f.Items) == 1 {
		tmpl = [...]string{"Its strongest position {in} is on {items}.", "Measured against {group}, the clearest strength is {items}."}
	}
	if f.GroupNamed {
		// The same phrasing picked, without the group again.
		tmpl = [...]string{"Its strongest positions are on {items}.", "The clearest strengths are {items}."}
		if len(f.Items) == 1 {
			tmpl = [...]string{"Its strongest position is on {items}.", "The clearest strength is {items}."}
		}
	}
	return e.fill(tmpl[variant(f.Seed, len(tmpl))], "group", f.Group, "in", e.in(f.Group), "items", e.ranked(f.Items))
}

// Risks: the indicators furthest below the group.
func (e english) Risks(f RankedFact) string {
	if len(f.Items) == 1 {
		tmpl := [...]string{"Its weakest position is on {items}.", "The main risk is {items}."}
		return e.fill(tmpl[variant(f.Seed, len(tmpl))], "items", e.ranked(f.Items))
	}
	tmpl := [...]string{
		"Its weakest positions are on {items}.",
		"The main risks are {items}.",
	}
	return e.fill(tmpl[variant(f.Seed, len(tmpl))], "items", e.ranked(f.Items))
}

// AboveBelow: after the overview, the rest of the indicators above and
// below the middle of the group, in one sentence.
func (e english) AboveBelow(up, down RankedFact) string {
	also := func(f RankedFact) string {
		if f.Also {
			return "also "
		}
		return ""
	}
	kv := []string{"up", e.rankedMore(up.Items, up.More, true), "down", e.rankedMore(down.Items, down.More, len(up.Items) == 0)}
	switch {
	case len(up.Items) > 0 && len(down.Items) > 0:
		return e.fill("It is "+also(up)+"above the middle of the group on {up}, and below it on {down}.", kv...)
	case len(up.Items) > 0:
		return e.fill("It is "+also(up)+"above the middle of the group on {up}.", kv...)
	}
	return e.fill("It is "+also(down)+"below the middle of the group on {down}.", kv...)
}

// Headline: the largest movement of the span.
func (e english) Headline(f ChangeFact) string {
	verb := "moved"
	if f.Better != dataset.Neutral {
		verb = "rose"
		if f.PctDirection == Below {
			verb = "fell"
		}
	}
	of := " of {group}"
	if f.GroupNamed {
		of = ""
	}
	return e.fill("The largest movement between {fromYear} and {toYear} was in {ind}, where {focus} "+verb+" from the {pf} to the {pt} percentile"+of+".",
		"focus", f.Focus, "ind", f.Indicator, "group", f.Group, "fromYear", f.FromYear, "toYear", f.ToYear, "pf", f.PctFrom, "pt", f.PctTo)
}

// CompetitionPlace: where the focus would sit inside a competitor system.
func (e english) CompetitionPlace(f CompetitionFact) string {
	kv := []string{"focus", f.Focus, "system", f.System, "top", e.listMore(f.Top, f.MoreTop), "bottom", e.listMore(f.Bottom, f.MoreBottom)}
	// Several systems follow one another in a pack: the opening varies
	// with the system so five paragraphs do not start alike.
	leads := [...]string{"Placed among the institutions of {system}, {focus} would", "Were it one of the institutions of {system}, {focus} would", "Set among the institutions of {system}, {focus} would"}
	lead, be, sit := leads[variant(f.Seed, len(leads))], " be", " sit"
	if f.InSystem {
		lead, be, sit = "Among the institutions of {system}, {focus}", " is", " sits"
	}
	if f.Small {
		rank := " rank"
		if f.InSystem {
			rank = " ranks"
		}
		kv = append(kv, "first", e.rankedMore(f.First, 0, false), "last", e.rankedMore(f.Last, 0, false), "floor", f.Floor)
		tail := "; with fewer than {floor} members reporting, no quarters are given."
		switch {
		case len(f.First) > 0 && len(f.Last) > 0:
			return e.fill(lead+rank+" first on {first}, and last on {last}"+tail, kv...)
		case len(f.First) > 0:
			return e.fill(lead+rank+" first on {first}, and last on none"+tail, kv...)
		case len(f.Last) > 0:
			return e.fill(lead+rank+" last on {last}, and first on none"+tail, kv...)
		}
		return e.fill(lead+rank+" neither first nor last on any indicator here"+tail, kv...)
	}
	if len(f.EdgeTop) > 0 || len(f.EdgeBottom) > 0 {
		// Positions within the noise rule of a boundary are named as
		// such, and no quarter is said to be empty while one may hold them.
		var parts []string
		if len(f.Top) > 0 {
			parts = append(parts, "in the top quarter on {top}")
		}
		if len(f.Bottom) > 0 {
			parts = append(parts, "in the bottom quarter on {bottom}")
		}
		if len(f.EdgeTop) > 0 {
			parts = append(parts, "at the edge of the top quarter on "+e.List(f.EdgeTop))
		}
		if len(f.EdgeBottom) > 0 {
			parts = append(parts, "at the edge of the bottom quarter on "+e.List(f.EdgeBottom))
		}
		return e.fill(lead+be+" "+strings.Join(parts, ", ")+".", kv...)
	}
	switch {
	case len(f.Top) > 0 && len(f.Bottom) > 0:
		return e.fill(lead+be+" in the top quarter on {top}, and in the bottom quarter on {bottom}.", kv...)
	case len(f.Top) > 0:
		return e.fill(lead+be+" in the top quarter on {top}, with none of these indicators in the bottom quarter.", kv...)
	case len(f.Bottom) > 0:
		return e.fill(lead+be+" in the bottom quarter on {bottom}, with none of these indicators in the top quarter.", kv...)
	}
	return e.fill(lead+sit+" in the middle half on every indicator here.", kv...)
}

// CompetitionAhead: where the competitor's median leads.
func (e english) CompetitionAhead(f CompetitionFact) string {
	parts := make([]string, len(f.Ahead))
	for i, a := range f.Ahead {
		parts[i] = a.Indicator + " (" + a.Median + " against " + a.Value + ")"
	}
	tmpl := [...]string{
		"{system's} median is ahead of {focus} on {items}.",
		"The median of {system} is ahead on {items}.",
		"{system's} median leads {focus} on {items}.",
	}
	level := ""
	if len(f.Level) > 0 {
		level = ", and level with it, within year-to-year noise, on " + e.aheadItems(f.Level)
	}
	return e.fill(strings.TrimSuffix(tmpl[variant(f.Seed+"/ahead", len(tmpl))], ".")+level+".",
		"system", f.System, "system's", possessive(f.System), "focus", f.Focus, "items", e.List(parts))
}

// aheadItems lists indicators with the median and the focus's value.
func (e english) aheadItems(items []AheadItem) string {
	parts := make([]string, len(items))
	for i, a := range items {
		parts[i] = a.Indicator + " (" + a.Median + " against " + a.Value + ")"
	}
	return e.List(parts)
}

// CompetitionShared: a lead every system shares, said once.
func (e english) CompetitionShared(f CompetitionFact) string {
	tail := "."
	if f.Others {
		tail = ", and none is ahead on any other indicator here."
	}
	return e.fill("The median of every one of these {n} systems is ahead of {focus} on {list}"+tail,
		"n", smallNumberWord(f.Systems), "focus", f.Focus, "list", e.List(f.Shared))
}

// CompetitionBehind: the competitor's median leads nowhere.
func (e english) CompetitionBehind(f CompetitionFact) string {
	if len(f.Level) > 0 {
		rest := "any other indicator here"
		if f.Others {
			rest = "any of the remaining indicators here"
		}
		return e.fill("{system's} median is level with {focus}, within year-to-year noise, on {items}, and not ahead on "+rest+".",
			"system's", possessive(f.System), "focus", f.Focus, "items", e.aheadItems(f.Level))
	}
	if f.Others {
		return e.fill("{system's} median is not ahead of {focus} on any other indicator here.",
			"system's", possessive(f.System), "focus", f.Focus)
	}
	return e.fill("{system's} median is not ahead of {focus} on any of these indicators.",
		"system's", possessive(f.System), "focus", f.Focus)
}

// Gap: what it takes to reach the top-quarter threshold.
func (e english) Gap(f GapFact) string {
	q, change := "upper quartile", "an increase"
	if f.Better == dataset.LowerIsBetter {
		q, change = "lower quartile", "a reduction"
	}
	kv := []string{"focus", f.Focus, "focus's", possessive(f.Focus), "ind", f.Indicator, "group", f.Group, "target", f.Target, "amount", f.Amount, "value", f.Value,
		"rank", f.Rank, "in", e.in(f.Group)}
	if f.Rank != "" {
		// Below the small-group floor: a rank to reach, never a quarter.
		if f.Amount == "" {
			return e.fill("Reaching {rank} {in} would take {focus's} figure from {value} to {target}.", kv...)
		}
		tmpl := [...]string{
			"Reaching {rank} {in} would take " + change + " of {amount}, to {target}.",
			"{focus} would need " + change + " of {amount} (to {target}) to rank {rank} {in}.",
		}
		return e.fill(tmpl[rotate(f.Seed, f.Turn, len(tmpl))], kv...)
	}
	if f.Amount == "" {
		return e.fill("Reaching the "+q+" of {group} would take {focus's} figure from {value} to {target}.", kv...)
	}
	tmpl := [...]string{
		"Reaching the " + q + " of {group} ({target}) would take " + change + " of {amount}.",
		"{focus} would need " + change + " of {amount} to reach the " + q + " of {group} ({target}).",
		"The top quarter of {group} starts at {target}, " + change + " of {amount} from {focus's} {value}.",
	}
	return e.fill(tmpl[rotate(f.Seed, f.Turn, len(tmpl))], kv...)
}

// GapList: the gaps of the summary's weakest indicators (one or more) in
// one sentence that names each indicator.
func (e english) GapList(fs []GapFact) string {
	// Below the small-group floor the targets are ranks ("2nd of 8"):
	// one rank for every item is said once, otherwise each item says its
	// own; no quarter is named then.
	ranks, same := 0, true
	for _, f := range fs {
		if f.Rank != "" {
			ranks++
		}
		same = same && f.Rank == fs[0].Rank
	}
	parts := make([]string, len(fs))
	for i, f := range fs {
		change := "an increase"
		if f.Better == dataset.LowerIsBetter {
			change = "a reduction"
		}
		to := "to " + f.Target
		if ranks > 0 && !same {
			if f.Rank != "" {
				to += ", which would rank " + f.Rank
			} else {
				to += ", the top quarter's threshold"
			}
		}
		if f.Amount == "" {
			parts[i] = "a move in " + f.Indicator + " from " + f.Value + " " + to
		} else {
			parts[i] = change + " of " + f.Amount + " in " + f.Indicator + " (" + to + ")"
		}
	}
	aim := "the top quarter"
	if ranks > 0 && same {
		aim = fs[0].Rank
	}
	tmpl := "Reaching {aim} {in} on {focus's} {n} weakest indicators would take {items}."
	if ranks == 0 {
		tmpl = "Reaching {aim} of {group} on {focus's} {n} weakest indicators would take {items}."
	}
	if fs[0].GroupNamed {
		tmpl = "Reaching {aim} on its {n} weakest indicators would take {items}."
	}
	if len(fs) == 1 {
		tmpl = strings.Replace(tmpl, "{n} weakest indicators", "weakest indicator", 1)
	}
	if ranks > 0 && !same {
		tmpl = strings.Replace(tmpl, "Reaching {aim}", "Moving up", 1)
	}
	return e.fill(tmpl, "aim", aim, "in", e.in(fs[0].Group), "group", fs[0].Group, "focus's", possessive(fs[0].Focus), "n", smallNumberWord(len(fs)), "items", e.List(parts))
}

// ByConstruction: peers chosen for closeness on an indicator.
func (e english) ByConstruction(f CaveatFact) string {
	return e.fill("{group} were chosen as the institutions closest to {focus} on {ind}, among other indicators, so {focus's} likeness to them there is by construction, not a finding.",
		"group", f.Group, "focus", f.Focus, "focus's", possessive(f.Focus), "ind", f.Indicator)
}

// Skewed: z-scores assume a roughly symmetric spread.
func (e english) Skewed(f CaveatFact) string {
	return e.fill("Values of {ind} {in} are strongly skewed (sample skewness {skew}, beyond 2 either way), so a z-score or a mean describes positions there poorly; ranks, percentiles and the median are the safer reading.",
		"ind", f.Indicator, "in", e.in(f.Group), "skew", f.N)
}

// SmallGroup: fewer members than quartiles can bear.
func (e english) SmallGroup(f CaveatFact) string {
	only := "so those ranks are indicative only"
	if f.RanksOnly {
		only = "so the pack gives ranks only there, and they are indicative"
	}
	return e.fill("The comparison {in} rests on {n} {members}, fewer than the {threshold} that common practice asks for before quartiles are read as stable, "+only+".",
		"in", e.in(f.Group), "n", f.N, "members", pluralMembers(f.N), "threshold", f.Threshold)
}

func pluralMembers(n string) string {
	if n == "1" {
		return "member"
	}
	return "members"
}

// LowCoverage: too few members report.
func (e english) LowCoverage(f CaveatFact) string {
	return e.fill("Only {n} {members} of {group} report {ind} for {year} and {missing} do not, under the {threshold}% coverage that common practice asks for; those not reporting may differ from those that do.",
		"group", f.Group, "n", f.N, "members", pluralMembers(f.N), "ind", f.Indicator, "year", f.Year, "missing", f.Missing, "threshold", f.Threshold)
}

// Imputed: the focus's value was estimated.
func (e english) Imputed(f CaveatFact) string {
	return e.fill("{focus's} figure for {ind} in {year} is an estimate, not a reported value ({note}).",
		"focus's", possessive(f.Focus), "ind", f.Indicator, "year", f.Year, "note", strings.TrimRight(f.Note, ". "))
}

// PPP: currency converted with purchasing-power parities, and amounts
// computed from converted ones.
func (e english) PPP(f CaveatFact) string {
	const why = "so they compare what the money buys rather than exchange-rate amounts."
	conv, der := e.List(f.Indicators), e.List(f.Derived)
	switch {
	case len(f.Derived) == 0:
		return e.fill("Figures for {conv} are converted from each country's currency with purchasing-power parity factors for each year, "+why, "conv", conv)
	case len(f.Indicators) == 0:
		return e.fill("Figures for {der} are computed from amounts converted from each country's currency with purchasing-power parity factors for each year, "+why, "der", der)
	}
	if len(f.Derived) > 2 {
		// A long list of derived amounts would bury the point.
		return e.fill("Figures for {conv} are converted from each country's currency with purchasing-power parity factors for each year, and the {n} indicators computed from them inherit the conversion, so all compare what the money buys rather than exchange-rate amounts.",
			"conv", conv, "n", smallNumberWord(len(f.Derived)))
	}
	return e.fill("Figures for {conv} are converted from each country's currency with purchasing-power parity factors for each year, and those for {der} are computed from the converted amounts, "+why, "conv", conv, "der", der)
}

// LowCoverageList: several indicators of one group under the coverage
// floor, in one sentence.
func (e english) LowCoverageList(f CaveatFact) string {
	return e.fill("Fewer than {threshold}% of the members of {group} report {list} for {year}; those not reporting may differ from those that do.",
		"threshold", f.Threshold, "group", f.Group, "list", e.List(f.Indicators), "year", f.Year)
}

// Judgement: the indicator's direction is a value judgement.
func (e english) Judgement(f CaveatFact) string {
	dir := "higher"
	if f.Better == dataset.LowerIsBetter {
		dir = "lower"
	}
	j := strings.TrimSpace(f.Judgement)
	if j != "" && !strings.HasSuffix(j, ".") {
		j += "."
	}
	return e.fill("Treating "+dir+" values of {ind} as better is a value judgement: {reason}", "ind", f.Indicator, "reason", lowerFirst(j))
}

// lowerFirst lowers the first letter of a text that goes inside a
// sentence, unless its first word has another capital (an abbreviation
// such as "FNCI" or "PhD") or its capital is joined to what follows
// ("A-level").
func lowerFirst(s string) string {
	r, n := utf8.DecodeRuneInString(s)
	if r == utf8.RuneError || !unicode.IsUpper(r) {
		return s
	}
	word := s[n:]
	if r2, _ := utf8.DecodeRuneInString(word); word != "" && !unicode.IsLower(r2) && !unicode.IsSpace(r2) {
		return s // "A-level", "X2 share"
	}
	if i := strings.IndexFunc(word, unicode.IsSpace); i >= 0 {
		word = word[:i]
	}
	if strings.IndexFunc(word, unicode.IsUpper) >= 0 {
		return s
	}
	return string(unicode.ToLower(r)) + s[n:]
}

// OneCountry: every member is in one country.
func (e english) OneCountry(f CaveatFact) string {
	return e.fill("Every member of {group} is in {country}, so this comparison sets {focus} against one national system only.",
		"group", f.Group, "country", f.Country, "focus", f.Focus)
}

// SmallGroupBrief: the summary's short small-group caveat.
func (e english) SmallGroupBrief(f CaveatFact) string {
	if f.RanksOnly {
		return e.fill("{In} there are only {n} {members}, too few for stable quartiles (common practice asks for at least {threshold}), so the pack gives ranks there, not quarters.",
			"In", e.in(f.Group), "n", f.N, "members", pluralMembers(f.N), "threshold", f.Threshold)
	}
	return e.fill("Quartiles {in} rest on only {n} {members}, too few to be stable (common practice asks for at least {threshold}).",
		"in", e.in(f.Group), "n", f.N, "members", pluralMembers(f.N), "threshold", f.Threshold)
}

// PPPBrief: the summary's short PPP caveat.
func (e english) PPPBrief(f CaveatFact) string {
	verb := "are"
	if len(f.Indicators) == 1 {
		verb = "is"
	}
	if len(f.Indicators) > 3 {
		return e.fill("The {n} money indicators ({list}) are in international dollars at purchasing-power parity.",
			"n", smallNumberWord(len(f.Indicators)), "list", e.List(f.Indicators))
	}
	return e.fill("{list} "+verb+" in international dollars at purchasing-power parity.", "list", e.List(f.Indicators))
}

// Direction: where lower counts as better, and which directions are value
// judgements, in one sentence.
func (e english) Direction(f DirectionFact) string {
	var parts []string
	judgementSaid := false
	if len(f.Lower) > 0 {
		s := "on {lower}, lower counts as better"
		if len(f.LowerJudged) == len(f.Lower) {
			s += " (itself a value judgement)"
			judgementSaid = true
		}
		parts = append(parts, s+", so a high percentile there means a low figure")
		if n := len(f.LowerJudged); n > 0 && n < len(f.Lower) {
			parts = append(parts, "for {lowerJudged} that direction is a value judgement")
			judgementSaid = true
		}
	}
	if len(f.HigherJudged) > 0 {
		if judgementSaid {
			parts = append(parts, "counting higher values of {higher} as better is one too")
		} else {
			parts = append(parts, "counting higher values of {higher} as better is a value judgement")
		}
	}
	return e.fill(strings.Join(parts, "; ")+".", "lower", e.List(f.Lower), "lowerJudged", e.List(f.LowerJudged), "higher", e.List(f.HigherJudged))
}

// smallNumberWord writes one to nine in words, larger counts in digits.
func smallNumberWord(n int) string {
	if n > 0 && n < len(smallNumbers) {
		return smallNumbers[n]
	}
	return printCount(n)
}

// Association: two indicators across a group's members, never as cause.
func (e english) Association(f AssociationFact) string {
	kv := []string{"x", f.X, "y", f.Y, "n", f.N, "group", f.Group, "year", f.Year, "rho", f.Rho, "r", f.R}
	coef := "Spearman's rank correlation {rho}"
	if f.R != "" {
		coef += "; Pearson's r {r}"
	}
	if f.Strength == Below {
		return e.fill("Across the {n} members of {group} reporting both in {year}, {x} and {y} show little association ("+coef+").", kv...)
	}
	how := "clearly"
	if f.Strength == Level {
		how = "loosely"
	}
	with := "higher"
	if f.Negative {
		with = "lower"
	}
	return e.fill("Across the {n} members of {group} reporting both in {year}, higher {x} goes "+how+" with "+with+" {y} ("+coef+"); that is an association, not evidence that one causes the other.", kv...)
}

// AssociationTooFew: pairs with too few members reporting both.
func (e english) AssociationTooFew(f AssociationFact) string {
	if f.Constant {
		return e.fill("Across the {n} members of {group} reporting both {x} and {y} in {year}, one of the two takes a single value, so no correlation can be read.",
			"n", f.N, "group", f.Group, "x", f.X, "y", f.Y, "year", f.Year)
	}
	lead := "Only {n} members of {group} report"
	switch f.N {
	case "0":
		lead = "No member of {group} reports"
	case "1":
		lead = "Only one member of {group} reports"
	}
	return e.fill(lead+" both {x} and {y} in {year}, fewer than the {threshold} a rank correlation needs, so the pack does not say whether they move together.",
		"n", f.N, "group", f.Group, "x", f.X, "y", f.Y, "year", f.Year, "threshold", f.Threshold)
}
