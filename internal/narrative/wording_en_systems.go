package narrative

import "strings"

// The English wording of the systems topic (plan_systems.go).

var systemsHeadings = map[string]string{
	"counted": "Who is counted in each",
}

// SystemsHeading names a paragraph of the systems topic.
func (english) SystemsHeading(which string) string {
	if h, ok := systemsHeadings[which]; ok {
		return h
	}
	return capitalise(which)
}

// groupCount is "the six systems", "the 12 groups".
func groupCount(n int, kind string) string {
	return "the " + countWords(n, strings.TrimSuffix(kind, "s"), kind)
}

// numberWord is a count in words below ten, else in digits.
func numberWord(n int) string {
	if n >= 0 && n < len(smallNumbers) {
		return smallNumbers[n]
	}
	return printCount(n)
}

// SystemsCounts: the shares of each group's institutions that pass the
// population rules.
func (e english) SystemsCounts(f SystemsCountFact) string {
	share := func(s SystemShare) string {
		return s.System + " " + s.Ranked + " of " + s.Defined + " (" + s.Share + ")"
	}
	if len(f.HighLevel)+len(f.LowLevel) > 0 {
		share = func(s SystemShare) string {
			return s.System + " (" + s.Ranked + " of " + s.Defined + ", " + s.Share + ")"
		}
	}
	rest := make([]string, len(f.Rest))
	for i, r := range f.Rest {
		rest[i] = share(r)
	}
	if f.Groups == 1 {
		return e.fill("Of the {n} institutions of {g} in the register, {r} ({s}) pass the population rules.",
			"n", f.High.Defined, "g", f.High.System, "r", f.High.Ranked, "s", f.High.Share)
	}
	if f.Same {
		return e.fill("Every one of {all} has the same share of its institutions passing the population rules: {list}.",
			"all", groupCount(f.Groups, f.Kind), "list", e.List(rest))
	}
	tmpl := [...]string{
		"{hi} has the largest share of its institutions passing the population rules among {all}, {hr} of {hd} ({hs}){hl}, and {lo} the smallest, {lr} of {ld} ({ls}){ll}",
		"Of the {hd} institutions of {hi} in the register, {hr} ({hs}) pass the population rules, the largest share among {all}{hl}; of the {ld} of {lo}, {lr} ({ls}), the smallest{ll}",
	}
	level := func(ss []SystemShare) string {
		if len(ss) == 0 {
			return ""
		}
		return ", with " + e.List(levelShares(ss, share)) + " level with it as printed"
	}
	hi, lo := f.High.System, f.Low.System
	out := e.fill(tmpl[variant(f.Seed, len(tmpl))], "hl", level(f.HighLevel), "ll", level(f.LowLevel), "hi", hi, "hr", f.High.Ranked, "hd", f.High.Defined, "hs", f.High.Share,
		"lo", lo, "lr", f.Low.Ranked, "ld", f.Low.Defined, "ls", f.Low.Share, "all", groupCount(f.Groups, f.Kind))
	if len(rest) > 0 {
		out += "; in between, " + e.List(rest)
	}
	return out + "."
}

// SystemsStanding: which group's median is highest and lowest.
func (e english) SystemsStanding(f SystemsStandingFact) string {
	if f.Same {
		return e.fill("The medians of {all} print alike, at {v}.", "all", groupCount(f.Groups, f.Kind), "v", f.High.Value)
	}
	tmpl := [...]string{
		"{hi's} median is the highest of {all} ({hv}) and {lo's} the lowest ({lv}).",
		"Among {all}, the median runs from {lv} in {lo} to {hv} in {hi}.",
	}
	return e.fill(tmpl[variant(f.Seed, len(tmpl))], "hi's", possessive(f.High.System), "lo's", possessive(f.Low.System),
		"hi", f.High.System, "lo", f.Low.System, "hv", f.High.Value, "lv", f.Low.Value, "all", groupCount(f.Groups, f.Kind))
}

// SystemsMove: how the medians moved over the span.
func (e english) SystemsMove(f SystemsMoveFact) string {
	moved := func(ms []SystemMedian) []string {
		out := make([]string, len(ms))
		for i, m := range ms {
			out[i] = m.System + " (from " + m.From + " to " + m.Value + ")"
		}
		return out
	}
	var parts []string
	n := func(k int) string {
		switch {
		case k == f.Groups && k == 2:
			return "both " + f.Kind
		case k == f.Groups:
			return "all " + numberWord(k) + " " + f.Kind
		}
		return numberWord(k) + " of " + groupCount(f.Groups, f.Kind)
	}
	if len(f.Rose) > 0 {
		p := "the median rose in " + n(len(f.Rose))
		if len(f.Rose) > 1 {
			p += ", most in " + moved(f.Rose[:1])[0] + ", then in " + e.List(moved(f.Rose[1:]))
		} else {
			p += ", " + moved(f.Rose)[0]
		}
		parts = append(parts, p)
	}
	if len(f.Fell) > 0 {
		p := "it fell in " + n(len(f.Fell))
		if len(f.Rose) == 0 {
			p = "the median fell in " + n(len(f.Fell))
		}
		if len(f.Fell) > 1 {
			p += ", most in " + moved(f.Fell[:1])[0] + ", then in " + e.List(moved(f.Fell[1:]))
		} else {
			p += ", " + moved(f.Fell)[0]
		}
		parts = append(parts, p)
	}
	if len(f.Flat) > 0 {
		p := "it was broadly unchanged in " + e.List(f.Flat)
		if len(parts) == 0 {
			p = "the median was broadly unchanged in " + e.List(f.Flat)
		}
		parts = append(parts, p)
	}
	out := "From " + f.First + " to " + f.Last + ", " + strings.Join(parts, "; ") + "."
	if len(f.Short) > 0 {
		out += " " + e.List(f.Short) + " lack a median at one end of the span and are left out."
	}
	return e.fill(out)
}

// SystemsWeight: how counting by size moves the medians.
func (e english) SystemsWeight(f SystemsWeightFact) string {
	if f.Lift == nil && f.Drop == nil {
		return e.fill("Counting each institution by its {w} moves no median of {all} by as much as the last printed digit.",
			"w", f.Weight, "all", groupCount(f.Groups, f.Kind))
	}
	var parts []string
	if f.Lift != nil {
		parts = append(parts, "lifts "+possessive(f.Lift.System)+" median most, to "+f.Lift.Value+" from "+f.Lift.From)
	}
	if f.Drop != nil {
		what := "most"
		if f.Lift == nil {
			what = "median most"
		}
		parts = append(parts, "lowers "+possessive(f.Drop.System)+" "+what+", to "+f.Drop.Value+" from "+f.Drop.From)
	}
	tail := "."
	if f.Explain {
		tail = "; weighted, a median is that of the {w} rather than of the institutions."
	}
	return e.fill("Counting each institution by its {w} rather than as one "+strings.Join(parts, ", and ")+tail,
		"w", f.Weight)
}

func levelShares(ss []SystemShare, share func(SystemShare) string) []string {
	out := make([]string, len(ss))
	for i, s := range ss {
		out[i] = share(s)
	}
	return out
}
