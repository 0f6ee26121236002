package narrative

import (
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// OneYearShare is the "driven by one year" rule: a movement over at least
// three years with a value is said to come mostly from one year when a
// single year-to-year step, in the direction of the whole movement,
// carries at least this share of it (the model's largest_step_share or
// largest_percentile_step_share; figures.LargestStep). Common practice,
// no source: three quarters of a movement in one step is a jump, not a
// trend, and a reader should weigh it as one revision or one event.
const OneYearShare = 0.75

// StepFact is a movement that came mostly in one year.
type StepFact struct {
	Seed string
	// FromYear and ToYear are the ends of the one step; Amount its printed
	// size ("" for a percentile step, which is told by its years);
	// Percentile marks a step of percentile rank rather than value.
	FromYear, ToYear string
	Amount           string
	Percentile       bool
	Better           dataset.Polarity
	Rise             bool
	// All: the one step is the whole change or more; Overshoot: more (the
	// other years took some of it back).
	All, Overshoot bool
}

// oneYear writes, after a change or a headline movement over the trend's
// own years, that most of it came in one year, when the rule holds. pct
// chooses the percentile's step over the value's.
func (c *composer) oneYear(g *figures.Group, ind dataset.Indicator, pct bool) []Sentence {
	id := c.m.FocusID
	t, ok := c.m.Trend(g.Name, ind.Key, c.m.Focus)
	if !ok || !t.Valid || t.Points < 3 {
		return nil
	}
	stepM, yearM, shareM := figures.MeasureLargestStep, figures.MeasureLargestStepYear, figures.MeasureLargestStepShare
	if pct {
		stepM, yearM, shareM = figures.MeasureLargestPctStep, figures.MeasureLargestPctStepYear, figures.MeasureLargestPctStepShare
	}
	step, ok1 := c.m.Lookup(trendKey(g.Name, ind.Key, id, stepM))
	year, ok2 := c.m.Lookup(trendKey(g.Name, ind.Key, id, yearM))
	share, ok3 := c.m.Lookup(trendKey(g.Name, ind.Key, id, shareM))
	if !ok1 || !ok2 || !ok3 || share.Value < OneYearShare {
		return nil
	}
	// The step runs from the year with a value before its end year.
	to := int(year.Value)
	from := 0
	for _, p := range c.m.PositionSeries(g.Name, ind.Key, c.m.Focus) {
		if p.Year < to && p.HasValue && p.Year >= t.StartYear {
			from = p.Year
		}
	}
	if from == 0 {
		return nil
	}
	f := StepFact{Seed: trendKey(g.Name, ind.Key, id, shareM).String(), FromYear: printYear(from), ToYear: printYear(to),
		Percentile: pct, Better: ind.Better, Rise: step.Value > 0, All: share.Value >= 1, Overshoot: share.Value > 1}
	if f.Overshoot && !pct && printAmount(ind, step.Value) == printAmount(ind, t.Change) {
		// "and more ... the other years took some of it back" cannot be
		// read off a step that prints as the whole change: say "all".
		f.Overshoot = false
	}
	cites := []figures.Key{posKey(g.Name, ind.Key, id, from, mValue), posKey(g.Name, ind.Key, id, to, mValue)}
	if !pct {
		f.Amount = printAmount(ind, step.Value)
		cites = append(cites, trendKey(g.Name, ind.Key, id, stepM))
	}
	claims := []Claim{
		Claimed(Fig(trendKey(g.Name, ind.Key, id, "points")), OpGreaterEq, Num(3)),
		Claimed(Fig(trendKey(g.Name, ind.Key, id, shareM)), OpGreaterEq, Num(OneYearShare)),
		Claimed(Fig(trendKey(g.Name, ind.Key, id, yearM)), OpEqual, Num(float64(to))),
	}
	switch {
	case f.Overshoot:
		claims = append(claims, Claimed(Fig(trendKey(g.Name, ind.Key, id, shareM)), OpGreater, Num(1)))
	case f.All:
		claims = append(claims, Claimed(Fig(trendKey(g.Name, ind.Key, id, shareM)), OpGreaterEq, Num(1)))
	default:
		claims = append(claims, Claimed(Fig(trendKey(g.Name, ind.Key, id, shareM)), OpLess, Num(1)))
	}
	return []Sentence{c.say(ind.Key, c.w.OneYear(f), cites...).claim(claims...)}
}
