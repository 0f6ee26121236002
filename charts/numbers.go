package charts

import (
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"

	"peerpack/internal/dataset"
	"peerpack/internal/format"
)

// valueText prints an indicator value exactly as tables and sentences do.
func valueText(ind dataset.Indicator, v float64) string { return format.Value(ind, v) }

// axisValueText prints a value beside an axis whose title already names
// the unit: money as bare digits (the title says "(PPP$)", as a table
// states the currency once in its header), other units as valueText.
func axisValueText(ind dataset.Indicator, v float64) string {
	if ind.Unit == dataset.UnitCurrency {
		return format.Number(v, ind.Decimals)
	}
	return valueText(ind, v)
}

// unitWords names an indicator's unit for an axis title.
func unitWords(ind dataset.Indicator) string {
	switch ind.Unit {
	case dataset.UnitPercent:
		return "%"
	case dataset.UnitShare:
		return "share"
	case dataset.UnitRatio:
		return "ratio"
	case dataset.UnitCount:
		return "count"
	case dataset.UnitCurrency:
		// International dollars whether converted here or derived from
		// converted amounts: the same test the tables use for "PPP$".
		if format.InDollars(ind) {
			return "PPP$"
		}
		return "local currency"
	case dataset.UnitIndex:
		return "index"
	case dataset.UnitScore:
		return "score"
	}
	return string(ind.Unit)
}

// shortName is the dictionary's short label, else its label, else its key.
func shortName(ind dataset.Indicator) string {
	switch {
	case ind.Short != "":
		return ind.Short
	case ind.Label != "":
		return ind.Label
	}
	return ind.Key
}

// axisPhrases are an axis title's phrases, which a line break may fall
// between but never inside: "Short (unit)" and the better direction, so a
// reader of a printed page need not look up which way is good. The
// direction is "" for a neutral indicator.
func axisPhrases(ind dataset.Indicator) (name, unit, direction string) {
	name = shortName(ind)
	if u := unitWords(ind); u != "" {
		unit = "(" + u + ")"
	}
	switch ind.Better {
	case dataset.HigherIsBetter:
		direction = "higher is better"
	case dataset.LowerIsBetter:
		direction = "lower is better"
	}
	return name, unit, direction
}

// axisTitle is the whole axis title on one line.
func axisTitle(ind dataset.Indicator) string {
	name, unit, dir := axisPhrases(ind)
	s := joinNonEmpty(" ", name, unit)
	if dir != "" {
		s += ", " + dir
	}
	return s
}

func joinNonEmpty(sep string, parts ...string) string {
	var out []string
	for _, p := range parts {
		if p != "" {
			out = append(out, p)
		}
	}
	return strings.Join(out, sep)
}

// valueTicks labels a value axis at "nice" steps (1, 2 or 5 times a power
// of ten; Heckbert 1990, "Nice numbers for graph labels", Graphics Gems),
// aiming at about five labels, printed with the format package (thousands
// separators, true minus sign); the unit is in the axis title.
type valueTicks struct {
	// n is the number of labels aimed at; 0 means 5.
	n int
}

// ticksFor is the label count an axis of the given length can carry
// without crowding: about one label per 55 pt, 3 to 6 of them.
func ticksFor(length vg.Length) valueTicks {
	return valueTicks{n: max(3, min(6, int(length/vg.Points(55))))}
}

// Ticks implements plot.Ticker.
func (vt valueTicks) Ticks(lo, hi float64) []plot.Tick {
	n := vt.n
	if n == 0 {
		n = 5
	}
	ts := niceTicks(lo, hi, n)
	// A short axis may leave fewer than three labels inside the range:
	// ask for a finer step then.
	for k := n + 1; len(ts) < 3 && k <= n+4; k++ {
		ts = niceTicks(lo, hi, k)
	}
	return ts
}

// niceTicks labels [lo, hi] at Heckbert's step for about n labels.
func niceTicks(lo, hi float64, n int) []plot.Tick {
	step := niceStep(lo, hi, n)
	if step <= 0 || math.IsNaN(step) || math.IsInf(step, 0) {
		return nil
	}
	var ts []plot.Tick
	for v := math.Ceil(lo/step) * step; v <= hi+step*1e-9; v += step {
		// Snap to the step so 0.1+0.2 prints as 0.3.
		v = math.Round(v/step) * step
		if math.Abs(v) < step*1e-9 {
			v = 0
		}
		ts = append(ts, plot.Tick{Value: v})
	}
	d := max(0, -int(math.Floor(math.Log10(step)+1e-9)))
	for i := range ts {
		ts[i].Label = format.Number(ts[i].Value, d)
	}
	return ts
}

// niceStep is Heckbert's nice tick spacing for about n labels over
// [lo, hi].
func niceStep(lo, hi float64, n int) float64 {
	span := hi - lo
	if span <= 0 {
		return 0
	}
	raw := span / float64(max(n-1, 1))
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	f := raw / mag
	switch {
	case f < 1.5:
		f = 1
	case f < 3:
		f = 2
	case f < 7:
		f = 5
	default:
		f = 10
	}
	return f * mag
}

// yearTicks labels whole years only, along an axis of length room.
type yearTicks struct {
	years []int
	room  vg.Length
}

// Ticks implements plot.Ticker: every year when they fit (about 30 pt a
// label), else every second or third counting back from the latest.
func (y yearTicks) Ticks(lo, hi float64) []plot.Tick {
	step := 1
	if y.room > 0 {
		for step < 5 && vg.Length(len(y.years))/vg.Length(step)*vg.Points(30) > y.room {
			step++
		}
	} else if len(y.years) > 8 {
		step = 2
	}
	var ts []plot.Tick
	for i, yr := range y.years {
		// Count back from the latest year, which is always labelled.
		if (len(y.years)-1-i)%step == 0 {
			ts = append(ts, plot.Tick{Value: float64(yr), Label: strconv.Itoa(yr)})
		}
	}
	return ts
}

// fitAxisTitle is the axis title on one line when it fits, else on two
// lines broken between phrases ("Short (unit)" over "higher is better",
// or "Short" over "(unit), higher is better"), else "Short (unit)" alone,
// else the name wrapped at a space with the unit kept whole on the last
// line, shortened with an ellipsis only as a last resort.
func fitAxisTitle(ind dataset.Indicator, th Theme, length vg.Length) string {
	sty := th.axisStyle()
	fits := func(lines ...string) bool {
		for _, l := range lines {
			if sty.Width(l) > length {
				return false
			}
		}
		return true
	}
	name, unit, dir := axisPhrases(ind)
	full := axisTitle(ind)
	if fits(full) {
		return full
	}
	head := joinNonEmpty(" ", name, unit)
	if dir != "" {
		if fits(head, dir) {
			return head + "\n" + dir
		}
		if unit != "" && fits(name, unit+", "+dir) {
			return name + "\n" + unit + ", " + dir
		}
	}
	if fits(head) {
		return head
	}
	if unit != "" && fits(name, unit) {
		return name + "\n" + unit
	}
	// The name itself is too long for a line: wrap it at a space, the unit
	// glued (non-breaking) to its last word so it is never split.
	words := strings.Fields(name)
	if unit != "" && len(words) > 0 {
		words[len(words)-1] += " " + unit
	}
	return strings.Join(wrapWords(words, sty, length, 2), "\n")
}
