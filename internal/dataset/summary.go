package dataset

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"peerpack/internal/stats"
)

// summarise fills the report's coverage table and suspicious values.
func (l *loader) summarise(d *Dataset) {
	r := l.rep
	r.Years = append([]int(nil), d.Years...)
	if r.SuspiciousCount == nil {
		r.SuspiciousCount = map[string]int{}
	}
	n := d.Register.Len()
	buf := make([]float64, 0, n)
	for ind, in := range d.Dictionary.Indicators {
		ic := IndicatorCoverage{Key: in.Key, Label: in.Label, Unit: in.Unit, Derived: in.Derive != "", Currency: in.Currency && in.Derive == ""}
		// Findings of this indicator, kept with a score so that the most
		// extreme MaxSuspicious of each kind are listed.
		var found []scored
		note := func(s Suspicion, score float64) {
			r.SuspiciousCount[s.Kind]++
			found = append(found, scored{s, score})
		}
		far := map[int]*farOut{}
		var farOrder []int
		withValue := make([]int, n) // years with a value, per institution
		for y, year := range d.Years {
			col := d.cols[ind*len(d.Years)+y]
			for inst, v := range col {
				if !math.IsNaN(v) {
					withValue[inst]++
				}
			}
			buf = buf[:0]
			for _, v := range col {
				if !math.IsNaN(v) {
					buf = append(buf, v)
				}
			}
			ic.Values = append(ic.Values, len(buf))
			cov := 0.0
			if n > 0 {
				cov = float64(len(buf)) / float64(n)
			}
			ic.Coverage = append(ic.Coverage, cov)
			if len(buf) < 4 {
				continue
			}
			sort.Float64s(buf)
			// Hyndman and Fan (1996) type 7 quartiles, the stats package's
			// default definition.
			q1 := stats.Quantile(buf, 0.25, stats.Type7)
			med := stats.Quantile(buf, 0.5, stats.Type7)
			q3 := stats.Quantile(buf, 0.75, stats.Type7)
			iqr := q3 - q1
			for inst, v := range col {
				if math.IsNaN(v) {
					continue
				}
				id := d.Register.Institutions[inst].ID
				if iqr > 0 && math.Abs(v-med) > FarOutIQRs*iqr {
					a := far[inst]
					if a == nil {
						a = &farOut{first: year, firstValue: v}
						far[inst] = a
						farOrder = append(farOrder, inst)
						if l.st != nil {
							if f, line, col := l.st.placeOf(year, ind, inst); f != "" {
								a.where = fmt.Sprintf("%s:%d:%d", f, line, col)
							}
						}
					}
					a.years = append(a.years, year)
					a.lo, a.hi = min(a.lo, v), max(a.hi, v)
					if a.years[0] == year {
						a.lo, a.hi = v, v
					}
					iqrs := math.Abs(v-med) / iqr
					if iqrs > a.score {
						a.score, a.worstYear, a.worstValue, a.worstMedian = iqrs, year, v, med
					}
				}
				if in.Derive != "" {
					if msg := unitViolation(&d.Dictionary.Indicators[ind], v); msg != "" {
						note(Suspicion{Kind: SuspectOutOfRange, Indicator: in.Key, Institution: id, Year: year, Value: v,
							Msg: fmt.Sprintf("derived %s %d of %s: %s; check the inputs of %s", in.Key, year, id, msg, in.Derive)}, math.Abs(v))
					}
				}
			}
		}
		// A year with under half the usual (median) coverage.
		if len(ic.Values) >= 3 {
			counts := append([]int(nil), ic.Values...)
			sort.Ints(counts)
			usual := float64(counts[len(counts)/2])
			if len(counts)%2 == 0 {
				usual = float64(counts[len(counts)/2-1]+counts[len(counts)/2]) / 2
			}
			for y, c := range ic.Values {
				if usual > 0 && float64(c) < LowCoverageFraction*usual {
					note(Suspicion{Kind: SuspectLowCoverage, Indicator: in.Key, Year: d.Years[y], Value: float64(c),
						Msg: fmt.Sprintf("%s has %d values in %d against a usual %.0f; is a file or a year missing?", in.Key, c, d.Years[y], usual)}, usual-float64(c))
				}
			}
		}
		// One finding per institution: a value far out in every year is
		// more likely a large institution than a slip, and says so.
		for _, inst := range farOrder {
			a := far[inst]
			id := d.Register.Institutions[inst].ID
			worst := fmt.Sprintf("at most %.0f: %s in %d against %s", a.score, fmtVal(a.worstValue, in.Decimals), a.worstYear, fmtVal(a.worstMedian, in.Decimals))
			score := a.score
			var msg string
			switch {
			case len(a.years) == 1:
				msg = fmt.Sprintf("%s of %s is over %.0f interquartile ranges from the median in %d (%s); check the unit and the digits", in.Key, id, FarOutIQRs, a.worstYear, worst)
			case len(a.years) == withValue[inst]:
				// Far out in every year: more likely a large institution
				// than a slip, so listed after the isolated cases.
				score /= 1000
				msg = fmt.Sprintf("%s of %s is over %.0f interquartile ranges from the median in all %d years (%s); consistent, so more likely a large institution than a slip", in.Key, id, FarOutIQRs, len(a.years), worst)
			default:
				msg = fmt.Sprintf("%s of %s is over %.0f interquartile ranges from the median in %d of its %d years, %s (%s); check the unit and the digits", in.Key, id, FarOutIQRs, len(a.years), withValue[inst], yearList(a.years), worst)
			}
			note(Suspicion{Kind: SuspectFarOut, Indicator: in.Key, Institution: id, Year: a.worstYear, Value: a.worstValue, Where: a.where, Msg: msg}, score)
		}
		if in.Derive == "" {
			l.jumps(d, ind, note)
		}
		sort.SliceStable(found, func(i, j int) bool { return found[i].score > found[j].score })
		listed := map[string]int{}
		for _, f := range found {
			if listed[f.Kind] < MaxSuspicious {
				listed[f.Kind]++
				r.Suspicious = append(r.Suspicious, f.Suspicion)
			}
		}
		r.Indicators = append(r.Indicators, ic)
	}
}

type farOut struct {
	years                   []int
	first                   int
	firstValue, lo, hi      float64
	score                   float64
	worstYear               int
	worstValue, worstMedian float64
	where                   string
}

func yearList(ys []int) string {
	parts := make([]string, len(ys))
	for i, y := range ys {
		parts[i] = strconv.Itoa(y)
	}
	return strings.Join(parts, ", ")
}

type scored struct {
	Suspicion
	score float64
}

// jumps flags a value more than JumpFactor times, or less than
// 1/JumpFactor of, the median of the same institution's values in the
// other years (at least two other years): the mark of a unit slip or a
// mistyped digit, which the cross-sectional rule misses in skewed
// indicators where large institutions are legitimately far from the median
// (common practice, no source).
func (l *loader) jumps(d *Dataset, ind int, note func(Suspicion, float64)) {
	if len(d.Years) < 3 {
		return
	}
	in := d.Dictionary.Indicators[ind]
	series := make([]float64, 0, len(d.Years))
	others := make([]float64, 0, len(d.Years))
	for inst := range d.Register.Institutions {
		series = series[:0]
		for y := range d.Years {
			series = append(series, d.cols[ind*len(d.Years)+y][inst])
		}
		for y, v := range series {
			if math.IsNaN(v) || v <= 0 {
				continue
			}
			others = others[:0]
			for k, w := range series {
				if k != y && !math.IsNaN(w) && w > 0 {
					others = append(others, w)
				}
			}
			if len(others) < 2 {
				continue
			}
			sort.Float64s(others)
			med := stats.Quantile(others, 0.5, stats.Type7)
			ratio := v / med
			if ratio < 1 {
				ratio = 1 / ratio
			}
			if ratio <= JumpFactor {
				continue
			}
			year := d.Years[y]
			id := d.Register.Institutions[inst].ID
			s := Suspicion{Kind: SuspectJump, Indicator: in.Key, Institution: id, Year: year, Value: v,
				Msg: fmt.Sprintf("%s %d of %s is %s, %.0f times %s its median %s in the other years; check the unit and the digits", in.Key, year, id, fmtVal(v, in.Decimals), ratio, map[bool]string{true: "above", false: "below"}[v > med], fmtVal(med, in.Decimals))}
			if f, line, col := l.st.placeOf(year, ind, inst); f != "" {
				s.Where = fmt.Sprintf("%s:%d:%d", f, line, col)
			}
			note(s, ratio)
		}
	}
}

func fmtVal(v float64, decimals int) string {
	return strconv.FormatFloat(v, 'f', decimals, 64)
}
