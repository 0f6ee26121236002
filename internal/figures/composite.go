package figures

import (
	"fmt"
	"math"
	"sort"

	"peerpack/internal/brief"
	"peerpack/internal/composite"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/format"
)

// CompositeYear is the brief's composite computed over the ranked
// population of one year.
type CompositeYear struct {
	Year int
	// Population lists the register positions the composite was computed
	// over (the ranked population), ascending; Result is indexed by
	// position in it.
	Population []int
	Result     *composite.Result
	// Indicators are the dictionary entries in composite order (pillar by
	// pillar, as the brief lists them); Pillar gives each one's pillar.
	Indicators []dataset.Indicator
	Pillar     []int
	// Headroom of the focus on each indicator (reporting year only),
	// aligned with Indicators; Target is the rank aimed at (0 = none).
	Headroom []composite.Headroom
	HasRoom  []bool
	Target   int
	cols     [][]float64
}

// CompositeMovement compares the focus's composite in the first and last
// span years it was scored in.
type CompositeMovement struct {
	StartYear, EndYear int
	StartRank, EndRank int
	// Distinguishable is false when the two years' rank intervals overlap:
	// the movement is then within the uncertainty of the composite.
	Distinguishable bool
}

// Composite returns the composite of a year.
func (m *Model) Composite(year int) (*CompositeYear, bool) {
	for _, c := range m.composites {
		if c.Year == year {
			return c, true
		}
	}
	return nil, false
}

// HasComposite reports whether the brief builds a composite.
func (m *Model) HasComposite() bool { return len(m.composites) > 0 }

// Of returns the position of register position inst in the composite's
// population, or -1.
func (c *CompositeYear) Of(inst int) int {
	i := sort.SearchInts(c.Population, inst)
	if i < len(c.Population) && c.Population[i] == inst {
		return i
	}
	return -1
}

// Scored reports whether inst has a composite score in the year.
func (c *CompositeYear) Scored(inst int) bool {
	a := c.Of(inst)
	return a >= 0 && c.Result.Scored[a] && c.Result.Rank[a] > 0
}

// Overlapping counts the other scored institutions whose Monte Carlo rank
// intervals overlap inst's: those the composite cannot tell apart from it.
func (c *CompositeYear) Overlapping(inst int) int {
	r := c.Result
	a := c.Of(inst)
	if a < 0 || !r.Scored[a] || r.RankLow == nil {
		return 0
	}
	n := 0
	for b := range c.Population {
		if b != a && r.Scored[b] && r.RankLow[b] <= r.RankHigh[a] && r.RankLow[a] <= r.RankHigh[b] {
			n++
		}
	}
	return n
}

// Neighbours returns inst and the scored institutions nearest it in base
// rank, up to n on each side, best first (for the rank-interval chart).
func (c *CompositeYear) Neighbours(inst, n int) []int {
	r := c.Result
	var scored []int
	for a := range c.Population {
		if r.Scored[a] {
			scored = append(scored, a)
		}
	}
	sort.SliceStable(scored, func(i, j int) bool { return r.Rank[scored[i]] < r.Rank[scored[j]] })
	at := -1
	for i, a := range scored {
		if c.Population[a] == inst {
			at = i
		}
	}
	if at < 0 {
		return nil
	}
	lo, hi := max(0, at-n), min(len(scored), at+n+1)
	out := make([]int, 0, hi-lo)
	for _, a := range scored[lo:hi] {
		out = append(out, c.Population[a])
	}
	return out
}

// CompositeMovement returns the focus's movement over the span, if it was
// scored in two different years.
func (m *Model) CompositeMovement() (CompositeMovement, bool) {
	var first, last *CompositeYear
	for _, c := range m.composites {
		if c.Scored(m.Focus) && c.Result.RankLow != nil {
			if first == nil {
				first = c
			}
			last = c
		}
	}
	if first == nil || first == last || last.Year != m.Year {
		return CompositeMovement{}, false
	}
	a, b := first.Of(m.Focus), last.Of(m.Focus)
	r1, r2 := first.Result, last.Result
	mv := CompositeMovement{StartYear: first.Year, EndYear: last.Year, StartRank: r1.Rank[a], EndRank: r2.Rank[b]}
	mv.Distinguishable = r1.RankHigh[a] < r2.RankLow[b] || r2.RankHigh[b] < r1.RankLow[a]
	return mv, true
}

// checkComposite checks the composite against the dictionary and groups:
// every indicator known and with a direction, the distance group defined,
// no pillar named like an indicator.
func checkComposite(d *dataset.Dataset, b *brief.Brief, groups []*Group, probs *diag.List) {
	c := b.Composite
	if c == nil {
		return
	}
	inds := map[string]bool{}
	for _, p := range c.Pillars {
		for _, wi := range p.Indicators {
			inds[wi.Key] = true
			ind, ok := d.Dictionary.Lookup(wi.Key)
			switch {
			case !ok:
				probs.Addf(b.File, wi.Pos.Line, wi.Pos.Column, "%s", unknownIndicator(d, "composite pillar "+p.Key, wi.Key))
			case ind.Better == dataset.Neutral:
				probs.Addf(b.File, wi.Pos.Line, wi.Pos.Column, "composite pillar %s: %s is neutral (neither higher nor lower is better), so it cannot count for or against an institution in a composite; leave it out, or give it better: higher or lower in the dictionary if that is a judgement you mean to make", p.Key, wi.Key)
			}
		}
	}
	for _, p := range c.Pillars {
		if inds[p.Key] {
			probs.Addf(b.File, p.Pos.Line, p.Pos.Column, "pillar key %q is also an indicator of the composite; give the pillar another key", p.Key)
		}
	}
	if c.DistanceGroup != "" {
		var names []string
		found := false
		for _, g := range groups {
			names = append(names, g.Name)
			found = found || g.Name == c.DistanceGroup
		}
		if !found {
			p := c.At["normalise"]
			msg := fmt.Sprintf("composite: the distance group %q is not defined under groups:", c.DistanceGroup)
			if s := nearestName(c.DistanceGroup, names); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			probs.Addf(b.File, p.Line, p.Column, "%s", msg)
		}
	}
}

// computeComposite builds the composite for every span year with data,
// with Monte Carlo intervals, and the focus's headroom in the brief year.
func (m *Model) computeComposite(b *brief.Brief) error {
	c := b.Composite
	if c == nil {
		return nil
	}
	m.CompositeSpec = c
	spec := &composite.Spec{
		Normalise:    composite.Method(c.Normalise),
		Geometric:    c.Aggregate == "geometric",
		MinShare:     c.MinShare,
		Impute:       composite.Impute(c.Impute),
		Skew:         composite.Skew{Treat: c.Skew, N: c.SkewValues},
		Runs:         c.Runs,
		WeightSpread: c.WeightSpread,
		Seed:         c.Seed,
	}
	for _, n := range c.Normalisations {
		spec.Normalisations = append(spec.Normalisations, composite.Method(n))
	}
	for _, n := range c.Imputations {
		spec.Imputations = append(spec.Imputations, composite.Impute(n))
	}
	var inds []dataset.Indicator
	var pillarOf []int
	for q, p := range c.Pillars {
		spec.Pillars = append(spec.Pillars, composite.Pillar{Key: p.Key, Weight: p.Weight})
		for _, wi := range p.Indicators {
			ind, _ := m.Data.Dictionary.Lookup(wi.Key)
			inds = append(inds, ind)
			pillarOf = append(pillarOf, q)
			spec.Indicators = append(spec.Indicators, composite.Indicator{Key: wi.Key, Pillar: q, Weight: wi.Weight, Lower: ind.Better == dataset.LowerIsBetter})
		}
	}
	started := false
	for _, year := range m.Years {
		// Each year scores that year's ranked population.
		var pop []int
		for i := range m.Data.Register.Institutions {
			if m.Data.InPopulationIn(i, year) {
				pop = append(pop, i)
			}
		}
		s := *spec
		cy := &CompositeYear{Year: year, Population: pop, Indicators: inds, Pillar: pillarOf}
		s.Focus = cy.Of(m.Focus)
		if c.DistanceGroup != "" {
			g, _ := m.Group(c.DistanceGroup)
			s.Reference = make([]bool, len(pop))
			for a, i := range pop {
				s.Reference[a] = g != nil && g.HasIn(i, year)
			}
		}
		cy.cols = make([][]float64, len(inds))
		any := false
		for j, ind := range inds {
			col := m.Data.Column(m.Data.Dictionary.Index(ind.Key), year)
			cy.cols[j] = make([]float64, len(pop))
			for a, i := range pop {
				cy.cols[j][a] = math.NaN()
				if col != nil {
					cy.cols[j][a] = col[i]
					any = any || !math.IsNaN(col[i])
				}
			}
		}
		if !any {
			continue
		}
		// Monte Carlo runs only where a rank is printed with its
		// interval: the brief year and the first year the focus is
		// scored in (the start of its movement); other years get the
		// base composite.
		runs := s.Runs
		s.Runs = 0
		res, err := composite.Compute(&s, cy.cols)
		if err == nil && runs > 0 && (year == m.Year || !started && s.Focus >= 0 && res.Scored[s.Focus]) {
			started = started || year != m.Year
			s.Runs = runs
			res, err = composite.Compute(&s, cy.cols)
		}
		if err != nil {
			p := c.Pos
			return diag.At(b.File, p.Line, p.Column, "composite, %d: %v", year, err)
		}
		cy.Result = res
		if year == m.Year && s.Focus >= 0 && res.Scored[s.Focus] && res.Rank[s.Focus] > 0 {
			cy.headroom(s.Focus, b)
		}
		m.composites = append(m.composites, cy)
	}
	m.addCompositeRows()
	return nil
}

// headroom finds, on each indicator alone, the change that would bring
// the focus's base rank to the target: the next band up when ranks are
// banded (rank_bands), else HeadroomPlaces places up.
func (cy *CompositeYear) headroom(focus int, b *brief.Brief) {
	rank := cy.Result.Rank[focus]
	if lo, _, banded := format.RankBand(rank, b.RankBands); banded {
		cy.Target = lo - 1
	} else {
		cy.Target = max(1, rank-b.Composite.HeadroomPlaces)
	}
	if rank <= 1 {
		cy.Target = 0
		return
	}
	cy.Headroom = make([]composite.Headroom, len(cy.Indicators))
	cy.HasRoom = make([]bool, len(cy.Indicators))
	for j := range cy.Indicators {
		cy.Headroom[j], cy.HasRoom[j] = cy.Result.HeadroomOf(cy.cols, focus, j, cy.Target)
	}
}
