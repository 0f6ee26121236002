package charts

import (
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"

	"peerpack/internal/dataset"
	"peerpack/internal/format"
)

// valueText prints an indicator value exactly as tables and sentences do.
func valueText(ind dataset.Indicator, v float64) string { return format.Value(ind, v) }

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
		if ind.Currency {
			return "PPP$"
		}
		return "currency"
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

// axisTitle is "Short (unit)" with the better direction, so a reader of a
// printed page need not look up which way is good.
func axisTitle(ind dataset.Indicator) string {
	s := shortName(ind)
	if u := unitWords(ind); u != "" {
		s += " (" + u + ")"
	}
	switch ind.Better {
	case dataset.HigherIsBetter:
		s += ", higher is better"
	case dataset.LowerIsBetter:
		s += ", lower is better"
	}
	return s
}

// valueTicks labels a value axis at "nice" steps (1, 2 or 5 times a power
// of ten; Heckbert 1990, "Nice numbers for graph labels", Graphics Gems),
// aiming at about five labels, printed with the format package (thousands
// separators, true minus sign); the unit is in the axis title.
type valueTicks struct{}

// Ticks implements plot.Ticker.
func (valueTicks) Ticks(lo, hi float64) []plot.Tick {
	step := niceStep(lo, hi, 5)
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

// yearTicks labels whole years only.
type yearTicks struct{ years []int }

// Ticks implements plot.Ticker: every year when few, else every other.
func (y yearTicks) Ticks(lo, hi float64) []plot.Tick {
	step := 1
	if len(y.years) > 8 {
		step = 2
	}
	var ts []plot.Tick
	for i, yr := range y.years {
		if i%step == 0 || i == len(y.years)-1 {
			ts = append(ts, plot.Tick{Value: float64(yr), Label: strconv.Itoa(yr)})
		}
	}
	return ts
}

// fitAxisTitle is the axis title, dropping the better-direction words and
// then shortening when the axis is too short for it.
func fitAxisTitle(ind dataset.Indicator, th Theme, length vg.Length) string {
	sty := th.axisStyle()
	if t := axisTitle(ind); sty.Width(t) <= length {
		return t
	}
	t := shortName(ind)
	if u := unitWords(ind); u != "" {
		t += " (" + u + ")"
	}
	return fitText(t, sty, length)
}
