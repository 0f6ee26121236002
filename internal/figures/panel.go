package figures

import (
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"peerpack/internal/stats"
)

// The constant panel of a trend: the members of the group in both its
// first and its last year with a value in both. When a group's size
// changes between the two years (members joining or leaving the ranked
// population, or reporting in one year only), a raw rank change mixes the
// institution's own movement with the change of company; ranks within the
// panel compare like with like (common practice, no source). The trend's
// percentile change is the other fair comparison; the figures hold both.

// panelKey names one panel: a group's indicator between two years.
type panelKey struct {
	group, ind string
	y0, y1     int
}

// computePanels places every tracked institution's valid trend within its
// constant panel (Trend.PanelOf, PanelStartRank, PanelEndRank,
// PanelRankChange). The trends of one group, indicator and pair of years
// share a panel, which is gathered once into reused buffers and counted
// against all of them in one pass (stats.PlaceAll), so the cost is
// O(members x tracked) per panel and nothing is kept.
func (m *Model) computePanels() error {
	byPanel := map[panelKey][]*Trend{}
	var keys []panelKey
	for _, t := range m.trend {
		if !t.Valid || t.StartOf == 0 || t.EndOf == 0 {
			continue
		}
		k := panelKey{t.Group, t.Indicator, t.StartYear, t.EndYear}
		if _, ok := byPanel[k]; !ok {
			keys = append(keys, k)
		}
		byPanel[k] = append(byPanel[k], t)
	}
	// Panels are independent and each writes only its own trends, so
	// workers share them out without changing the outcome.
	workers := min(runtime.GOMAXPROCS(0), len(keys))
	var wg sync.WaitGroup
	var next atomic.Int64
	var failMu sync.Mutex
	var failure error
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			// A panic here is a defect; it becomes an error, as in
			// compute, so it cannot reach the user as a crash.
			defer func() {
				if r := recover(); r != nil {
					failMu.Lock()
					if failure == nil {
						failure = fmt.Errorf("internal error while placing trends in their constant panels (%v); please report it with the brief and data", r)
					}
					failMu.Unlock()
					next.Store(int64(len(keys)))
				}
			}()
			var pb panelBuffers
			for {
				j := int(next.Add(1)) - 1
				if j >= len(keys) {
					return
				}
				m.placeInPanel(keys[j], byPanel[keys[j]], &pb)
			}
		}()
	}
	wg.Wait()
	return failure
}

// panelBuffers are one worker's reused slices.
type panelBuffers struct {
	at0, at1, t0, t1 []float64
	member           []bool
	p0, p1           []stats.Placement
}

// placeInPanel gathers one panel and places its trends' institutions in
// it at both ends.
func (m *Model) placeInPanel(k panelKey, ts []*Trend, b *panelBuffers) {
	g, ok := m.Group(k.group)
	ind := m.Data.Dictionary.Index(k.ind)
	// the values as printed, which ranks compare (placed.go)
	c0, c1 := m.placedColumn(ind, k.y0), m.placedColumn(ind, k.y1)
	if !ok || c0 == nil || c1 == nil {
		return
	}
	b.at0, b.at1 = b.at0[:0], b.at1[:0]
	for _, i := range g.MembersIn(k.y0) {
		if g.HasIn(i, k.y1) && !math.IsNaN(c0[i]) && !math.IsNaN(c1[i]) {
			b.at0 = append(b.at0, c0[i])
			b.at1 = append(b.at1, c1[i])
		}
	}
	b.t0, b.t1, b.member = b.t0[:0], b.t1[:0], b.member[:0]
	for _, t := range ts {
		b.t0 = append(b.t0, c0[t.Institution])
		b.t1 = append(b.t1, c1[t.Institution])
		// In the panel: a member at both ends (its values are there, as
		// its trend is valid).
		b.member = append(b.member, g.HasIn(t.Institution, k.y0) && g.HasIn(t.Institution, k.y1))
	}
	b.p0 = slices.Grow(b.p0[:0], len(ts))[:len(ts)]
	b.p1 = slices.Grow(b.p1[:0], len(ts))[:len(ts)]
	dir := RankDirection(m.Data.Dictionary.Indicators[ind].Better)
	stats.PlaceAll(b.at0, b.t0, b.member, dir, b.p0)
	stats.PlaceAll(b.at1, b.t1, b.member, dir, b.p1)
	for j, t := range ts {
		t.PanelOf = b.p0[j].Of
		t.PanelStartRank, t.PanelEndRank = b.p0[j].Rank, b.p1[j].Rank
		t.PanelRankChange = b.p0[j].Rank - b.p1[j].Rank
	}
}
