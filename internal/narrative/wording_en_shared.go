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
