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
	if f.Percentile || f.Amount == "" {
		return e.fill("Most of that movement came in one year, between {from} and {to}, so it may reflect one event or revision rather than a trend.", kv...)
	}
	move := "a rise"
	if !f.Rise {
		move = "a fall"
	}
	return e.fill("Most of that change came in one year, "+move+" of {amount} between {from} and {to}, so it may reflect one event or revision rather than a trend.", kv...)
}
