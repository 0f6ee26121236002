package dataset

import (
	"fmt"
	"math"
	"runtime"
	"slices"
	"sort"
	"strconv"
	"strings"
	"sync"

	"peerpack/internal/stats"
)

// summarise fills the report's coverage table and suspicious values. The
// indicators are independent, so they are summarised in parallel, one
// goroutine per processor; the results are merged in dictionary order.
func (l *loader) summarise(d *Dataset) {
	r := l.rep
	r.Years = append([]int(nil), d.Years...)
	if r.SuspiciousCount == nil {
		r.SuspiciousCount = map[string]int{}
	}
	results := make([]indicatorSummary, len(d.Dictionary.Indicators))
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for ind := range next {
				results[ind] = l.summariseIndicator(d, ind)
			}
		}()
	}
	for ind := range d.Dictionary.Indicators {
		next <- ind
	}
	close(next)
	wg.Wait()
	for _, res := range results {
		r.Indicators = append(r.Indicators, res.coverage)
		r.Suspicious = append(r.Suspicious, res.suspicious...)
		for k, n := range res.counts {
			r.SuspiciousCount[k] += n
		}
	}
}

// indicatorSummary is the part of the report about one indicator.
type indicatorSummary struct {
	coverage   IndicatorCoverage
	suspicious []Suspicion
	counts     map[string]int
}

func (l *loader) summariseIndicator(d *Dataset, ind int) indicatorSummary {
	in := d.Dictionary.Indicators[ind]
	n := d.Register.Len()
	buf := make([]float64, 0, n)
	counts := map[string]int{}
	ic := IndicatorCoverage{Key: in.Key, Label: in.Label, Unit: in.Unit, Derived: in.Derive != "", Currency: in.Currency && in.Derive == ""}
	// Findings of this indicator, kept with a score so that the most
	// extreme MaxSuspicious of each kind are listed.
	var found []scored
	note := func(s Suspicion, score float64) {
		counts[s.Kind]++
		found = append(found, scored{Suspicion: s, score: score})
	}
	// lazy records a finding whose message is built only if it is
	// listed: random or skewed data can yield many thousands.
	lazy := func(kind string, score float64, build func() Suspicion) {
		counts[kind]++
		found = append(found, scored{Suspicion: Suspicion{Kind: kind}, score: score, build: build})
	}
	far := map[int]*farOut{}
	var farOrder []int
	withValue := make([]int, n) // years with a value, per institution
	logScale := farOutOnLogScale(in.Unit)
	limit := FarOutIQRs
	if logScale {
		limit = FarOutLogIQRs
	}
	for y, year := range d.Years {
		col := d.cols[ind*len(d.Years)+y]
		for inst, v := range col {
			if !math.IsNaN(v) {
				withValue[inst]++
			}
		}
		buf = buf[:0]
		present := 0
		for _, v := range col {
			if math.IsNaN(v) {
				continue
			}
			present++
			if t, ok := farOutScale(v, logScale); ok {
				buf = append(buf, t)
			}
		}
		ic.Values = append(ic.Values, present)
		cov := 0.0
		if n > 0 {
			cov = float64(present) / float64(n)
		}
		ic.Coverage = append(ic.Coverage, cov)
		// Hyndman and Fan (1996) type 7 quartiles, the stats package's
		// default definition, by selection: only three order statistics
		// are needed, so the column is never sorted.
		var q1, med, q3 float64
		if len(buf) >= 4 {
			q1, med, q3 = stats.QuartilesOfUnsorted(buf, stats.Type7)
		}
		iqr := q3 - q1
		for inst, v := range col {
			if math.IsNaN(v) {
				continue
			}
			id := d.Register.Institutions[inst].ID
			if t, ok := farOutScale(v, logScale); ok && len(buf) >= 4 && iqr > 0 && math.Abs(t-med) > limit*iqr {
				a := far[inst]
				if a == nil {
					a = &farOut{}
					far[inst] = a
					farOrder = append(farOrder, inst)
					if l.st != nil {
						if f, line, col := l.st.placeOf(year, ind, inst); f != "" {
							a.where = fmt.Sprintf("%s:%d:%d", f, line, col)
						}
					}
				}
				a.years = append(a.years, year)
				iqrs := math.Abs(t-med) / iqr
				if iqrs > a.score {
					a.score, a.worstYear, a.worstValue, a.worstMedian = iqrs, year, v, farOutUnscale(med, logScale)
				}
			}
			if a := math.Abs(v); a >= ImplausibleMagnitude {
				note(Suspicion{Kind: SuspectMagnitude, Indicator: in.Key, Institution: id, Year: year, Value: v,
					Msg: magnitudeText(in.Key, year, id, v, in.Decimals), Where: l.placeText(year, ind, inst)}, a)
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
	rule := fmt.Sprintf("over %.0f interquartile ranges from the median", limit)
	if logScale {
		rule = fmt.Sprintf("over %.0f interquartile ranges from the median on a log scale", limit)
	}
	for _, inst := range farOrder {
		a := far[inst]
		id := d.Register.Institutions[inst].ID
		worst := fmt.Sprintf("at most %s: %s in %d against %s", wholeText(a.score), fmtVal(a.worstValue, in.Decimals), a.worstYear, fmtVal(a.worstMedian, in.Decimals))
		if logScale {
			worst = fmt.Sprintf("%s in %d, %s", fmtVal(a.worstValue, in.Decimals), a.worstYear, timesMedian(a.worstValue, a.worstMedian, in.Decimals))
		}
		if in.InternationalDollars {
			worst += ", in international dollars after PPP conversion"
		}
		score := a.score
		var msg string
		switch {
		case len(a.years) == 1:
			msg = fmt.Sprintf("%s of %s is %s in %d (%s); check the unit and the digits", in.Key, id, rule, a.worstYear, worst)
		case len(a.years) == withValue[inst]:
			// Far out in every year: more likely a large institution
			// than a slip, so listed after the isolated cases.
			score /= 1000
			msg = fmt.Sprintf("%s of %s is %s in all %d years (%s); consistent, so more likely a large institution than a slip", in.Key, id, rule, len(a.years), worst)
			if logScale {
				// Size alone rarely goes this far on a log scale, so
				// a whole series written in the wrong unit is as likely.
				msg = fmt.Sprintf("%s of %s is %s in all %d years (%s); unless the institution really is that different in size, the whole series is in the wrong unit (thousands or millions?)", in.Key, id, rule, len(a.years), worst)
			}
		default:
			msg = fmt.Sprintf("%s of %s is %s in %d of its %d years, %s (%s); check the unit and the digits", in.Key, id, rule, len(a.years), withValue[inst], yearList(a.years), worst)
		}
		note(Suspicion{Kind: SuspectFarOut, Indicator: in.Key, Institution: id, Year: a.worstYear, Value: a.worstValue, Where: a.where, Msg: msg}, score)
	}
	if in.Derive == "" {
		counts[SuspectJump] += l.jumps(d, ind, lazy)
	}
	var listed []Suspicion
	for _, f := range topScored(found, MaxSuspicious) {
		if f.build != nil {
			f.Suspicion = f.build()
		}
		listed = append(listed, f.Suspicion)
	}
	return indicatorSummary{coverage: ic, suspicious: listed, counts: counts}
}

// farOut gathers the years in which one institution is far from the
// median of one indicator.
type farOut struct {
	years                   []int
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

// topScored returns, for each kind in order of first appearance, the k
// findings with the highest scores, highest first (ties in input order).
// It keeps k per kind while scanning, so a long list costs no sort.
func topScored(found []scored, k int) []scored {
	var kinds []string
	top := map[string][]scored{}
	for _, f := range found {
		t, seen := top[f.Kind]
		if !seen {
			kinds = append(kinds, f.Kind)
		}
		if len(t) == k && f.score <= t[k-1].score {
			continue
		}
		i := len(t)
		for i > 0 && t[i-1].score < f.score {
			i--
		}
		t = append(t, scored{})
		copy(t[i+1:], t[i:])
		t[i] = f
		if len(t) > k {
			t = t[:k]
		}
		top[f.Kind] = t
	}
	var out []scored
	for _, kind := range kinds {
		out = append(out, top[kind]...)
	}
	return out
}

type scored struct {
	Suspicion
	score float64
	build func() Suspicion
}

// jumps flags a value more than JumpFactor times, or less than
// 1/JumpFactor of, the median of the same institution's values in the
// other years (at least two other years): the mark of a unit slip or a
// mistyped digit, which the cross-sectional rule misses in skewed
// indicators where large institutions are legitimately far from the median
// (common practice, no source).
func (l *loader) jumps(d *Dataset, ind int, note func(string, float64, func() Suspicion)) (unlisted int) {
	if len(d.Years) < 3 {
		return 0
	}
	in := d.Dictionary.Indicators[ind]
	// Only the MaxSuspicious largest jumps are listed, so only they are
	// kept (highest ratio first, ties in the order found, as topScored
	// orders them); the rest are counted. Skewed data can hold hundreds of
	// thousands of jumps, and a message for each would never be read.
	type jump struct {
		ratio, v, med float64
		year, inst    int
	}
	var top []jump
	found := 0
	series := make([]float64, 0, len(d.Years))
	sorted := make([]float64, 0, len(d.Years))
	for inst := range d.Register.Institutions {
		series = series[:0]
		sorted = sorted[:0]
		lo, hi := math.Inf(1), 0.0
		for y := range d.Years {
			v := d.cols[ind*len(d.Years)+y][inst]
			series = append(series, v)
			if !math.IsNaN(v) && v > 0 {
				sorted = append(sorted, v)
				lo, hi = min(lo, v), max(hi, v)
			}
		}
		if len(sorted) < 3 {
			continue
		}
		// Every median of the others lies between the smallest and the
		// largest value, so when those two are within JumpFactor every
		// ratio is (rounded division is monotonic; the mean of two
		// middle values cannot overflow below MaxFloat64/2): most
		// institutions need no sort.
		if hi <= math.MaxFloat64/2 && hi/lo <= JumpFactor && 1/(lo/hi) <= JumpFactor {
			continue
		}
		slices.Sort(sorted)
		if noJump(sorted) {
			continue
		}
		for y, v := range series {
			if math.IsNaN(v) || v <= 0 {
				continue
			}
			med := medianWithout(sorted, v)
			ratio := v / med
			if ratio < 1 {
				ratio = 1 / ratio
			}
			if ratio <= JumpFactor {
				continue
			}
			found++
			if len(top) == MaxSuspicious && ratio <= top[MaxSuspicious-1].ratio {
				continue
			}
			i := len(top)
			for i > 0 && top[i-1].ratio < ratio {
				i--
			}
			top = slices.Insert(top, i, jump{ratio, v, med, d.Years[y], inst})
			if len(top) > MaxSuspicious {
				top = top[:MaxSuspicious]
			}
		}
	}
	for _, j := range top {
		note(SuspectJump, j.ratio, func() Suspicion {
			id := d.Register.Institutions[j.inst].ID
			dir := "below"
			if j.v > j.med {
				dir = "above"
			}
			s := Suspicion{Kind: SuspectJump, Indicator: in.Key, Institution: id, Year: j.year, Value: j.v,
				Msg: fmt.Sprintf("%s %d of %s is %s, %s %s its median %s in the other years; check the unit and the digits", in.Key, j.year, id, fmtVal(j.v, in.Decimals), timesText(j.ratio), dir, fmtVal(j.med, in.Decimals))}
			if f, line, col := l.st.placeOf(j.year, ind, j.inst); f != "" {
				s.Where = fmt.Sprintf("%s:%d:%d", f, line, col)
			}
			return s
		})
	}
	return found - len(top)
}

// fmtVal prints a value for the check report: with its decimals up to
// ImplausibleMagnitude, beyond it in scientific form with four significant
// digits, so a slip of 1e308 reads as 1.000e+308, not as 309 digits.
func fmtVal(v float64, decimals int) string {
	switch {
	case math.IsNaN(v):
		return "missing"
	case math.IsInf(v, 0):
		return "infinite"
	case math.Abs(v) >= ImplausibleMagnitude:
		return strconv.FormatFloat(v, 'e', 3, 64)
	}
	return strconv.FormatFloat(v, 'f', decimals, 64)
}

// ImplausibleMagnitude is a size no institution's indicator reaches: a
// thousand million million (10^15) of anything, beyond the budget of any
// country in its own currency units (common practice, no source).
const ImplausibleMagnitude = 1e15

// MaxExactInteger is 2^53, beyond which an IEEE 754 double (the values'
// type) no longer holds every whole number: 2^53 + 1 reads as 2^53
// (IEEE 754-2008, binary64's 53-bit significand).
const MaxExactInteger = 1 << 53

// magnitudeText words an implausibly large value.
func magnitudeText(key string, year int, id string, v float64, decimals int) string {
	msg := fmt.Sprintf("%s %d of %s is %s, over a thousand million million (10^15), more than any institution's figure; check the unit and the digits", key, year, id, fmtVal(v, decimals))
	if math.Abs(v) >= MaxExactInteger {
		msg += " (whole numbers beyond 2^53, about 9.007e+15, are not even held exactly)"
	}
	return msg
}

// timesText says how many times larger one value is than another, in
// words once the ratio stops being a readable count.
func timesText(r float64) string {
	if math.IsInf(r, 0) || math.IsNaN(r) || r >= 1e6 {
		return "over a million times"
	}
	return wholeText(r) + " times"
}

// wholeText rounds to a whole number with thousands separators, or says
// "over a million" when larger.
func wholeText(v float64) string {
	if math.IsInf(v, 0) || math.IsNaN(v) || v >= 1e6 {
		return "over a million"
	}
	return thousands(int(math.Round(v)))
}

func (l *loader) placeText(year, ind, inst int) string {
	if l.st == nil {
		return ""
	}
	if f, line, col := l.st.placeOf(year, ind, inst); f != "" {
		return fmt.Sprintf("%s:%d:%d", f, line, col)
	}
	return ""
}

// noJump reports that no value of sorted (ascending, positive, at least
// three) is a jump from the median of the others, without computing each
// median. Leaving one value out of n, the median of the other n-1 lies
// between sorted[(n-1)/2-1] and sorted[(n-1)/2+1] (each order statistic of
// the rest is the same one of the whole or the next); so when the largest
// value over the lower bound, and the lower bound over the smallest value
// via the upper bound, are within JumpFactor (and no mean of two middle
// values overflows), every ratio is. The bounds
// are computed with the same divisions as the ratios, and correctly
// rounded division is monotonic, so the answer is the one the ratios give.
func noJump(sorted []float64) bool {
	m := len(sorted) - 1
	lo, hi := sorted[max(m/2-1, 0)], sorted[m/2+1]
	// Past MaxFloat64/2 the mean of two middle values can overflow to
	// infinity, outside the bounds: let the ratios decide.
	return sorted[m] <= math.MaxFloat64/2 && sorted[m]/lo <= JumpFactor && 1/(sorted[0]/hi) <= JumpFactor
}

// medianWithout is the median of sorted (ascending, at least two values)
// with one occurrence of v left out: the type 7 median of the others.
func medianWithout(sorted []float64, v float64) float64 {
	k, _ := slices.BinarySearch(sorted, v) // the first occurrence, as sort.SearchFloat64s
	m := len(sorted) - 1
	at := func(i int) float64 {
		if i >= k {
			i++
		}
		return sorted[i]
	}
	if m%2 == 1 {
		return at(m / 2)
	}
	return (at(m/2-1) + at(m/2)) / 2
}

// farOutOnLogScale says whether the far-from-the-median rule compares
// logarithms. Counts and money amounts of institutions are right-skewed
// over orders of magnitude (a large university has a hundred times the
// papers of a small college), so on the raw scale the rule flags size, not
// slips; on a log scale it compares ratios, and a unit slip (thousands for
// units, a missing or extra digit group) still stands out (common practice,
// no source).
func farOutOnLogScale(u Unit) bool { return u == UnitCount || u == UnitCurrency }

// farOutScale maps a value onto the scale the rule compares; on the log
// scale zero and negative values have no logarithm and are not judged.
func farOutScale(v float64, logScale bool) (float64, bool) {
	if !logScale {
		return v, true
	}
	if v <= 0 {
		return 0, false
	}
	return math.Log(v), true
}

func farOutUnscale(t float64, logScale bool) float64 {
	if logScale {
		return math.Exp(t)
	}
	return t
}

// timesMedian says how many times the median a value is ("1000 times the
// median 450", "a 1000th of the median 450").
func timesMedian(v, med float64, decimals int) string {
	if v >= med {
		return fmt.Sprintf("%s the median %s", timesText(v/med), fmtVal(med, decimals))
	}
	if r := med / v; math.IsInf(r, 0) || r >= 1e6 {
		return fmt.Sprintf("under a millionth of the median %s", fmtVal(med, decimals))
	}
	return fmt.Sprintf("1/%s of the median %s", wholeText(med/v), fmtVal(med, decimals))
}
