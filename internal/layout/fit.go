package layout

import (
	"math"
	"sort"
)

// fitPlan holds the decisions that keep a section from ending on a runt
// page: a last page holding only a few lines before the next section opens
// a fresh page. Such a page reads as a mistake in a printed pack and wastes
// paper; a typesetter would set the section a little tighter so that its
// tail moves back. The plan shortens the section's charts and starts its
// tables at a smaller size. Both layout passes read the same plan, so they
// make the same decisions.
type fitPlan struct {
	scale map[int]float64 // chart height factor per section
	table map[int]int     // first entry of tableSizes per section
	// join holds the sections whose opening heading continues on the
	// page the section before them ended on, when tightening could not
	// pull that page's few lines back: the page is given enough to carry
	// rather than left nearly empty.
	join map[int]bool
}

// Runt pages and how far a section may be tightened (common practice, no
// source): a page holding less than a third of the type area ends a
// section badly; charts go down to 80 % of their height at most.
const (
	runtShare     = 1.0 / 3
	minFitScale   = 0.8
	fitHeadroom   = 4.0  // mm more than the runt's content, for rounding
	fitChartSlack = 1.15 // charts give back less than their lost height

	// joinedSectionGap is the space above a section heading that opens
	// part-way down a page, enough to read as a new section.
	joinedSectionGap = 12.0 // mm
	// joinShare is the fill under which a section's last page takes the
	// next section: a little over runtShare, since a reader judges a page
	// by its ink, not by the layout's own measure of it.
	joinShare     = 0.4
	maxJoinRounds = 4
)

func (p *fitPlan) chartScale(section int) float64 {
	if p == nil {
		return 1
	}
	if s, ok := p.scale[section]; ok {
		return s
	}
	return 1
}

// joins reports whether the section opens on the page the previous one
// ended on instead of a fresh page.
func (p *fitPlan) joins(section int) bool {
	return p != nil && p.join[section]
}

func (p *fitPlan) tableStep(section int) int {
	if p == nil {
		return 0
	}
	return p.table[section]
}

// pageRecord is what a measuring pass notes about each page: the section
// set last on it and how far down its content reached.
type pageRecord struct {
	section int
	fill    float64
}

// notePage records the current page before the flow leaves it.
func (w *writer) notePage() {
	n := w.doc.PageNo()
	if n <= 0 {
		return
	}
	for len(w.pages) < n {
		w.pages = append(w.pages, pageRecord{section: -1})
	}
	w.pages[n-1] = pageRecord{section: w.section, fill: math.Max(w.y, w.colMax)}
}

// runtPlan finds the sections of a measured pass that end on a runt page
// and plans to tighten them; nil when there are none or nothing in them
// can give.
func (w *writer) runtPlan() *fitPlan {
	top := w.doc.ContentTop()
	area := w.doc.ContentBottom() - top
	var plan *fitPlan
	for i, pg := range w.pages {
		if i == 0 || pg.section < 0 || w.pages[i-1].section != pg.section {
			continue // the first page of its section
		}
		if i+1 < len(w.pages) && w.pages[i+1].section == pg.section {
			continue // not the section's last page
		}
		used := pg.fill - top
		if used <= 0 || used > area*runtShare {
			continue
		}
		charts, tables := w.chartHeight[pg.section], w.tableCount[pg.section]
		if charts <= 0 && tables == 0 {
			continue
		}
		if plan == nil {
			plan = &fitPlan{scale: map[int]float64{}, table: map[int]int{}}
		}
		if charts > 0 {
			plan.scale[pg.section] = math.Max(minFitScale, 1-(used+fitHeadroom)*fitChartSlack/charts)
		}
		if tables > 0 && (charts <= 0 || 1-(used+fitHeadroom)*fitChartSlack/charts < minFitScale) {
			plan.table[pg.section] = 1
		}
	}
	return plan
}

// sectionPages counts the pages each section of a measured pass takes.
func (w *writer) sectionPages() map[int]int {
	n := map[int]int{}
	for _, pg := range w.pages {
		n[pg.section]++
	}
	return n
}

// keepSaving drops from the plan every section whose tightening did not
// save it a page (before and after are sectionPages of the passes without
// and with the plan) and reports whether the plan is unchanged.
func (p *fitPlan) keepSaving(before, after map[int]int) bool {
	same := true
	for _, sec := range p.sections() {
		if after[sec] < before[sec] {
			continue
		}
		delete(p.scale, sec)
		delete(p.table, sec)
		same = false
	}
	return same
}

// sections lists the sections the plan tightens, in order.
func (p *fitPlan) sections() []int {
	seen := map[int]bool{}
	for s := range p.scale {
		seen[s] = true
	}
	for s := range p.table {
		seen[s] = true
	}
	out := make([]int, 0, len(seen))
	for s := range seen {
		out = append(out, s)
	}
	sort.Ints(out)
	return out
}

func (p *fitPlan) empty() bool {
	return len(p.scale) == 0 && len(p.table) == 0 && len(p.join) == 0
}

// runtEnds lists the runt pages of a measured pass that end a section and
// are followed by a section opening with a level-1 heading on a fresh page,
// as spans of sections: the runt's section and the headed one after it
// (with any empty page-break section between, a break that only made
// room for the heading). The pack's last page is left as it is: a pack
// may end short.
func (w *writer) runtEnds() [][2]int {
	top := w.doc.ContentTop()
	area := w.doc.ContentBottom() - top
	var out [][2]int
	for i, pg := range w.pages {
		if i == 0 || i+1 >= len(w.pages) || pg.section < 0 {
			continue
		}
		next := w.pages[i+1].section
		if next <= pg.section || !w.headed[next] {
			continue
		}
		if used := pg.fill - top; used > 0 && used <= area*joinShare {
			out = append(out, [2]int{pg.section, next})
		}
	}
	return out
}

// withJoins returns a copy of the plan that also lets the section after
// each of the given ones open on the same page.
func (p *fitPlan) withJoins(ends [][2]int) *fitPlan {
	q := &fitPlan{scale: map[int]float64{}, table: map[int]int{}, join: map[int]bool{}}
	if p != nil {
		for k, v := range p.scale {
			q.scale[k] = v
		}
		for k, v := range p.table {
			q.table[k] = v
		}
		for k, v := range p.join {
			q.join[k] = v
		}
	}
	for _, e := range ends {
		for s := e[0] + 1; s <= e[1]; s++ {
			q.join[s] = true
		}
	}
	return q
}
