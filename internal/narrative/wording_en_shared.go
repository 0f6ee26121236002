package narrative

// countWordsUpTo are the counts the shared-rank sentence writes in words;
// beyond them it names the indicators without counting them (a count in
// digits would be a number no figure gives).
var countWordsUpTo = [...]string{"no", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine", "ten",
	"eleven", "twelve", "thirteen", "fourteen", "fifteen", "sixteen", "seventeen", "eighteen", "nineteen", "twenty"}

// SharedRank: "Among the chosen peers, Wendholm ranks last of 8 on six of
// the eleven indicators here: A, B, ...".
func (e english) SharedRank(f SharedRankFact) string {
	place := "first"
	if f.Last {
		place = "last"
	}
	on := "on these indicators: {list}"
	switch {
	case f.Count == f.Total && f.Count < len(countWordsUpTo):
		on = "on all " + countWordsUpTo[f.Count] + " indicators here: {list}"
	case f.Total < len(countWordsUpTo):
		on = "on " + countWordsUpTo[f.Count] + " of the " + countWordsUpTo[f.Total] + " indicators here: {list}"
	}
	kv := []string{"focus", f.Focus, "group", f.Group, "in", e.in(f.Group), "of", f.Of, "list", e.List(f.Indicators)}
	if !f.InGroup {
		return e.fill("{focus} is not a member of {group}; placed among its members, it would rank "+place+" of {of} "+on+".", kv...)
	}
	return e.fill("{in}, {focus} ranks "+place+" of {of} "+on+".", kv...)
}

// OneYear: "Most of that change came in one year, a rise of 0.12 between
// 2022 and 2023."; for a percentile, "Most of that movement came in one
// year, between 2022 and 2023."
func (e english) OneYear(f StepFact) string {
	kv := []string{"from", f.FromYear, "to", f.ToYear, "amount", f.Amount}
	tail := ", so it may reflect one event or revision rather than a trend."
	what := "change"
	if f.Percentile || f.Amount == "" {
		what = "movement"
	}
	lead := "Most of that " + what + " came in one year"
	if f.All {
		lead = "All of that " + what + " came in one year"
	}
	if f.Overshoot {
		lead = "All of that " + what + ", and more, came in one year"
		tail = "; the other years took some of it back" + tail
	}
	if what == "movement" {
		return e.fill(lead+", between {from} and {to}"+tail, kv...)
	}
	move := "a rise"
	if !f.Rise {
		move = "a fall"
	}
	return e.fill(lead+", "+move+" of {amount} between {from} and {to}"+tail, kv...)
}

// Profile: "Against the median of the profile peers in 2025, Wendholm
// stands higher on A (38.2% against 30.1%, 8.1 percentage points more)
// and B (...); lower on C (...); and level with the median on D (12.0%)."
func (e english) Profile(f ProfileFact) string {
	items := func(xs []ProfileItem, more string) string {
		parts := make([]string, len(xs))
		for i, x := range xs {
			in := x.Value + " against " + x.Median
			if x.Diff != "" {
				in += ", " + x.Diff + " " + more
			}
			if x.LowerBetter {
				in += "; lower is better here"
			}
			parts[i] = x.Indicator + " (" + in + ")"
		}
		return e.List(parts)
	}
	var sides []string
	if len(f.Higher) > 0 {
		sides = append(sides, "higher on "+items(f.Higher, "more"))
	}
	if len(f.Lower) > 0 {
		sides = append(sides, "lower on "+items(f.Lower, "less"))
	}
	if len(f.Level) > 0 {
		parts := make([]string, len(f.Level))
		for i, x := range f.Level {
			parts[i] = x.Indicator + " (" + x.Value + ")"
		}
		sides = append(sides, "level with the median on "+e.List(parts))
	}
	kv := []string{"focus", f.Focus, "focus's", possessive(f.Focus), "group", f.Group, "year", f.Year, "missing", capitalise(e.List(f.Missing))}
	text := ""
	if len(sides) > 0 {
		joined := sides[0]
		switch len(sides) {
		case 2:
			joined = sides[0] + "; and " + sides[1]
		case 3:
			joined = sides[0] + "; " + sides[1] + "; and " + sides[2]
		}
		text = "Against the median of {group} in {year}, {focus} stands " + joined + "."
	}
	if len(f.Missing) > 0 {
		if text != "" {
			text += " "
		}
		text += "{missing} " + map[bool]string{true: "is", false: "are"}[len(f.Missing) == 1] + " left out, as {focus} reports no value there for {year} or the group has none."
	}
	return e.fill(text, kv...)
}
