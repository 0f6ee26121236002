package figures

import (
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/stats"
)

// Compute builds the figures model of a brief over a dataset: it resolves
// the comparison groups, checks every block of the brief against the data,
// and computes distributions, positions, trends and correlations. Every
// problem found is returned together as a *diag.List.
//
// Cost: each (group, indicator, year) column is sorted once, O(n log n);
// every tracked institution is then placed by binary search, and the
// correlations walk presorted orders, O(n) per indicator pair.
func Compute(d *dataset.Dataset, b *brief.Brief) (*Model, error) {
	probs := &diag.List{}
	if d == nil || b == nil || d.Register == nil || d.Dictionary == nil {
		probs.Addf("", 0, 0, "internal error: figures need a loaded dataset and brief")
		return nil, probs
	}
	focus, tracked := checkFront(d, b, probs)
	first, last := b.Years.First, b.Years.Last
	if first == 0 && last == 0 {
		first, last = b.Year, b.Year // a brief built without a span
	}
	r := &resolver{d: d, b: b, focus: focus, probs: probs, years: spanYears(d.Years, first, last)}
	r.pm = r.peersFor()
	groups := r.resolveGroups()
	checkBlocks(d, b, groups, r.emptied, probs)
	checkComposite(d, b, groups, probs)
	checkSizeWeight(d, b, probs)
	if err := probs.Err(); err != nil {
		return nil, err
	}

	m := &Model{
		Data:    d,
		Focus:   focus,
		FocusID: b.Focus,
		Named:   tracked,
		Year:    b.Year,
		First:   first,
		Last:    last,
		Method:  stats.ParseQuantileMethod(b.Quantiles),
		Floor:   b.SmallGroupFloor(),
		Groups:  groups,
		Peers:   r.pm,
		dist:    map[distKey]*Distribution{},
		pos:     map[posKey]*Position{},
		trend:   map[trendKey]*Trend{},
		gtrend:  map[gtrendKey]*GroupTrend{},
		corr:    map[corrKey]int{},
		placed:  &placedColumns{},
	}
	m.groupIndex = make(map[string]int, len(groups))
	for i, g := range groups {
		if _, dup := m.groupIndex[g.Name]; !dup {
			m.groupIndex[g.Name] = i
		}
	}
	m.Years = r.years
	m.corrNeed = m.correlationNeeds(b)
	if err := m.compute(); err != nil {
		probs.Add(err)
		return nil, probs
	}
	if err := m.computePanels(); err != nil {
		probs.Add(err)
		return nil, probs
	}
	// The rules' own figures (rank targets below the floor, largest
	// single steps of trends; steps.go) join them the same way.
	m.addRuleFigures()
	// The peers rows join the later stages' rows: the figures file and
	// Lookup read them from there.
	m.Add(m.peersRows(nil)...)
	if err := m.computeComposite(b); err != nil {
		probs.Add(err)
		return nil, probs
	}
	m.Add(m.systemRows(b)...)
	return m, nil
}

// RankDirection maps a dictionary polarity to a ranking direction;
// neutral indicators rank by value, highest first. Every rank and
// percentile of a pack uses it.
func RankDirection(p dataset.Polarity) stats.Direction {
	if p == dataset.LowerIsBetter {
		return stats.LowerFirst
	}
	return stats.HigherFirst
}

type columnResult struct {
	dists  []*Distribution
	poss   []*Position
	trends []*Trend
	gtrend *GroupTrend
}

// compute fills the model, spreading (group, indicator) jobs over the
// available processors; results land in fixed slots, so the outcome does
// not depend on scheduling. A panic in a worker (a defect, never expected)
// is turned into an error so that it cannot reach the user as a crash.
func (m *Model) compute() error {
	nInd := len(m.Data.Dictionary.Indicators)
	// Correlations only where the brief reads them (correlationNeeds).
	var corrGroups []int
	used := make([]bool, nInd)
	for gi, need := range m.corrNeed {
		if need == nil {
			continue
		}
		corrGroups = append(corrGroups, gi)
		for k, on := range need {
			used[k] = used[k] || on
		}
	}
	if len(corrGroups) > 0 {
		m.yearOrder = registerOrders(m.Data, m.Year, used)
	}
	results := make([]columnResult, len(m.Groups)*nInd)
	corrs := make([][]Correlation, len(m.Groups))
	jobs := make(chan int)
	workers := runtime.GOMAXPROCS(0)
	if workers > len(results)+len(corrGroups) {
		workers = len(results) + len(corrGroups)
	}
	var wg sync.WaitGroup
	var failMu sync.Mutex
	var failure error
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer func() {
				if r := recover(); r != nil {
					failMu.Lock()
					if failure == nil {
						failure = fmt.Errorf("internal error while computing the figures (%v); please report it with the brief and data", r)
					}
					failMu.Unlock()
					for range jobs { // drain, so the feeder is not blocked
					}
				}
			}()
			var buf, pbuf []float64
			for j := range jobs {
				if j < len(results) {
					g, k := m.Groups[j/nInd], j%nInd
					results[j], buf, pbuf = m.column(g, k, buf, pbuf)
				} else {
					gi := j - len(results)
					corrs[gi] = m.correlations(m.Groups[gi], m.corrNeed[gi])
				}
			}
		}()
	}
	// Correlation jobs are the longest; start them first.
	for _, gi := range corrGroups {
		jobs <- len(results) + gi
	}
	for j := range results {
		jobs <- j
	}
	close(jobs)
	wg.Wait()
	m.yearOrder = nil
	if failure != nil {
		return failure
	}

	// Sized once: growing maps of this many entries rehashes them over
	// and over.
	nd, np, nt := 0, 0, 0
	for _, res := range results {
		nd, np, nt = nd+len(res.dists), np+len(res.poss), nt+len(res.trends)
	}
	if len(m.dist)+len(m.pos)+len(m.trend)+len(m.gtrend) == 0 { // a fresh model, as Compute makes
		m.dist = make(map[distKey]*Distribution, nd)
		m.pos = make(map[posKey]*Position, np)
		m.trend = make(map[trendKey]*Trend, nt)
		m.gtrend = make(map[gtrendKey]*GroupTrend, len(results))
	}
	for _, res := range results {
		for _, d := range res.dists {
			m.dist[distKey{d.Group, d.Indicator, d.Year}] = d
		}
		for _, p := range res.poss {
			m.pos[posKey{p.Group, p.Indicator, p.Institution, p.Year}] = p
		}
		for _, t := range res.trends {
			m.trend[trendKey{t.Group, t.Indicator, t.Institution}] = t
		}
		if t := res.gtrend; t != nil {
			m.gtrend[gtrendKey{t.Group, t.Indicator}] = t
		}
	}
	for _, cs := range corrs {
		for _, c := range cs {
			m.corr[corrKey{c.Group, c.IndicatorX, c.IndicatorY}] = len(m.Correlations)
			m.Correlations = append(m.Correlations, c)
		}
	}
	return nil
}

// manyTracked is the number of tracked institutions above which placing
// them by one sort and binary searches (O(n log n + k log n)) beats one
// counting pass (O(n k)).
const manyTracked = 8

// column computes one group's indicator over every year of the span.
// Each year's values are gathered once; the quartiles come by selection
// (stats.BoxOfUnsorted, expected O(n)) and the tracked institutions are
// placed in one counting pass, so no column is ever fully sorted. Ranks
// compare the values rounded to the declared decimals (placed.go); the
// distribution keeps the unrounded values.
func (m *Model) column(g *Group, k int, buf, pbuf []float64) (columnResult, []float64, []float64) {
	ind := m.Data.Dictionary.Indicators[k]
	dir := RankDirection(ind.Better)
	nt := len(m.Named)
	targets := make([]float64, nt)
	member := make([]bool, nt)
	placed := make([]stats.Placement, nt)
	var sorted []float64
	var res columnResult
	for _, year := range m.Years {
		members := g.MembersIn(year)
		for j, inst := range m.Named {
			member[j] = g.HasIn(inst, year)
		}
		col := m.Data.Column(k, year)
		// pcol: the values as printed, which ranks compare (placed.go)
		pcol := m.placedColumn(k, year)
		vals := buf[:0]
		pvals := pbuf[:0]
		for _, i := range members {
			if v := col[i]; !math.IsNaN(v) {
				vals = append(vals, v)
				pvals = append(pvals, pcol[i])
			}
		}
		dist := &Distribution{Group: g.Name, Indicator: ind.Key, Year: year}
		// Mean and SD first, in register order, so their last digits do not
		// depend on how selection reorders the values.
		dist.Mean, dist.SD, dist.Skewness = stats.MeanSDSkewness(vals)
		for j, inst := range m.Named {
			targets[j] = pcol[inst]
		}
		if nt <= manyTracked {
			stats.PlaceAll(pvals, targets, member, dir, placed)
		} else {
			// many tracked institutions: one sort, then binary searches
			sorted = append(sorted[:0], pvals...)
			slices.Sort(sorted)
			for j, v := range targets {
				placed[j] = stats.Placement{}
				if !math.IsNaN(v) {
					placed[j] = stats.Place(sorted, v, dir, member[j])
				}
			}
		}
		dist.Box = stats.BoxOfUnsorted(vals, len(members)-len(vals), m.Method)
		dist.printed = placedBox(ind, dist.Box)
		if len(dist.Box.OutlierValues) > 0 {
			dist.Outliers = outlierMembers(members, col, dist.Box)
		}
		res.dists = append(res.dists, dist)
		for j, inst := range m.Named {
			res.poss = append(res.poss, position(g, ind, inst, year, col[inst], len(vals), placed[j], dist))
		}
		buf, pbuf = vals, pvals
	}
	for ti, inst := range m.Named {
		// Positions of inst were appended year by year, nt apart.
		series := make([]*Position, len(m.Years))
		for yi := range m.Years {
			series[yi] = res.poss[yi*nt+ti]
		}
		res.trends = append(res.trends, trendOf(g, ind, inst, series, res.dists))
	}
	res.gtrend = groupTrendOf(g, ind, res.dists)
	return res, buf, pbuf
}

// outlierMembers lists the members beyond the whiskers, ascending by value
// and then by register position, matching Box.OutlierValues.
func outlierMembers(members []int, col []float64, b stats.Box) []int {
	type ov struct {
		inst int
		v    float64
	}
	out := make([]ov, 0, len(b.OutlierValues))
	for _, i := range members {
		v := col[i]
		if !math.IsNaN(v) && (v < b.WhiskerLow || v > b.WhiskerHigh) {
			out = append(out, ov{i, v})
		}
	}
	// (value, position) is a total order (positions are distinct), so an
	// unstable sort gives the one result.
	slices.SortFunc(out, func(a, b ov) int {
		switch {
		case a.v < b.v:
			return -1
		case a.v > b.v:
			return 1
		}
		return a.inst - b.inst
	})
	ids := make([]int, len(out))
	for i, o := range out {
		ids[i] = o.inst
	}
	return ids
}

// position builds one institution's Position from its placement among
// the n member values of a group.
func position(g *Group, ind dataset.Indicator, inst, year int, v float64, n int, pl stats.Placement, dist *Distribution) *Position {
	p := &Position{Group: g.Name, Indicator: ind.Key, Institution: inst, Year: year, Value: v, InGroup: g.HasIn(inst, year)}
	nan := math.NaN()
	p.Percentile, p.Z, p.GapMedian, p.GapQ3 = nan, nan, nan, nan
	p.VsMedian, p.VsBetterQuartile = nan, nan
	if math.IsNaN(v) {
		return p
	}
	p.HasValue = true
	if n == 0 && !p.InGroup {
		return p // no member has a value: nothing to compare with
	}
	p.Rank, p.Of, p.Percentile, p.Ties = pl.Rank, pl.Of, pl.Percentile, pl.Ties
	// The quarter by the group's quartile values, ties and a value on a
	// quartile going to the better quarter (stats.QuartileByValue).
	p.Quartile = quarterOf(ind, v, dist)
	p.Z = stats.Z(v, dist.Mean, dist.SD)
	p.GapMedian, p.GapQ3 = gaps(ind.Better, v, dist.Box)
	p.VsMedian, p.VsBetterQuartile = signedDifferences(ind.Better, v, dist.Box)
	return p
}

// quarterOf is the quarter of a group a value falls in, 1 the best, by the
// group's quartile values, ties and a value on a quartile going to the
// better quarter: the one rule for positions and member placements.
//
// The value and the quartiles are compared as printed (placed.go), so
// values printed alike share a quarter as they share a rank, and a value
// printed as the quartile is on it.
func quarterOf(ind dataset.Indicator, v float64, dist *Distribution) int {
	return stats.QuartileByValue(placedValue(ind, v), dist.printed, RankDirection(ind.Better) == stats.LowerFirst)
}

// signedDifferences returns the value's difference to the group's median
// and to its better quartile, positive meaning better by polarity. A
// neutral indicator has no better side: its median difference is the
// plain value - median and it has no better quartile (NaN).
func signedDifferences(p dataset.Polarity, v float64, b stats.Box) (median, quartile float64) {
	switch p {
	case dataset.HigherIsBetter:
		return v - b.Median, v - b.Q3
	case dataset.LowerIsBetter:
		return b.Median - v, b.Q1 - v
	}
	return v - b.Median, math.NaN()
}

// gaps returns the distance still to gain to the group's median and to
// its better quartile (Q3 when higher is better, Q1 when lower is better),
// zero once reached. A neutral indicator has no direction to gain in, so
// both are NaN.
func gaps(p dataset.Polarity, v float64, b stats.Box) (median, quartile float64) {
	switch p {
	case dataset.HigherIsBetter:
		return math.Max(0, b.Median-v), math.Max(0, b.Q3-v)
	case dataset.LowerIsBetter:
		return math.Max(0, v-b.Median), math.Max(0, v-b.Q1)
	}
	return math.NaN(), math.NaN()
}
