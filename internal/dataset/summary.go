package dataset

import (
	"fmt"
	"math"
	"sort"
	"strconv"

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
		listed := map[string]int{}
		note := func(s Suspicion) {
			r.SuspiciousCount[s.Kind]++
			if listed[s.Kind] < MaxSuspicious {
				listed[s.Kind]++
				r.Suspicious = append(r.Suspicious, s)
			}
		}
		for y, year := range d.Years {
			col := d.cols[ind*len(d.Years)+y]
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
					s := Suspicion{Kind: SuspectFarOut, Indicator: in.Key, Institution: id, Year: year, Value: v,
						Msg: fmt.Sprintf("%s %d of %s is %s, %.0f interquartile ranges from the median %s; check the unit and the digits", in.Key, year, id, fmtVal(v, in.Decimals), math.Abs(v-med)/iqr, fmtVal(med, in.Decimals))}
					if l.st != nil {
						if f, line, col := l.st.placeOf(year, ind, inst); f != "" {
							s.Where = fmt.Sprintf("%s:%d:%d", f, line, col)
						}
					}
					note(s)
				}
				if in.Derive != "" {
					if msg := unitViolation(&d.Dictionary.Indicators[ind], v); msg != "" {
						note(Suspicion{Kind: SuspectOutOfRange, Indicator: in.Key, Institution: id, Year: year, Value: v,
							Msg: fmt.Sprintf("derived %s %d of %s: %s; check the inputs of %s", in.Key, year, id, msg, in.Derive)})
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
						Msg: fmt.Sprintf("%s has %d values in %d against a usual %.0f; is a file or a year missing?", in.Key, c, d.Years[y], usual)})
				}
			}
		}
		r.Indicators = append(r.Indicators, ic)
	}
}

func fmtVal(v float64, decimals int) string {
	return strconv.FormatFloat(v, 'f', decimals, 64)
}
