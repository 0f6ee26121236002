package figures

import (
	"math"
	"math/bits"
	"slices"

	"peerpack/internal/dataset"
)

// correlations computes Pearson's and Spearman's coefficients between
// every pair of the indicators need marks (dictionary order) over the
// group's members that have both values in the brief year. Spearman's coefficient is Pearson's of the
// average ranks, as stats.Spearman defines it (and R's cor(method =
// "spearman")); to stay O(n) per pair, each indicator's members are sorted
// once and every pair walks those orders, ranking only the members that
// have the other value too. Average ranks of m values are half-integers
// with mean (m+1)/2, so their sums are exact in float64 for any register
// size peerpack accepts, and the rank correlation needs no second pass.
func (m *Model) correlations(g *Group, need []bool) []Correlation {
	d := m.Data
	nInd := len(d.Dictionary.Indicators)
	n := len(g.Members)
	vals := make([][]float64, nInd)
	order := make([][]int32, nInd)
	// Large groups take their orders from the register-wide orders (one
	// pass over the register each), small ones sort their own members.
	useGlobal := n > 0 && n*bits.Len(uint(n)) > d.Register.Len()
	var local []int32
	if useGlobal {
		local = make([]int32, d.Register.Len())
		for li, inst := range g.Members {
			local[inst] = int32(li)
		}
	}
	for k := 0; k < nInd; k++ {
		if !need[k] {
			continue
		}
		col := d.Column(k, m.Year)
		v := make([]float64, n)
		for li, inst := range g.Members {
			v[li] = col[inst]
		}
		o := make([]int32, 0, n)
		if useGlobal {
			for _, inst := range m.yearOrder[k] {
				if g.member[inst] {
					o = append(o, local[inst])
				}
			}
		} else {
			for li := range g.Members {
				if !math.IsNaN(v[li]) {
					o = append(o, int32(li))
				}
			}
			sortByValue(o, v)
		}
		vals[k], order[k] = v, o
	}
	rankX := make([]float64, n)
	rankY := make([]float64, n)
	keptX := make([]int32, 0, n)
	keptY := make([]int32, 0, n)
	out := make([]Correlation, 0, nInd*(nInd-1)/2)
	for a := 0; a < nInd; a++ {
		if !need[a] {
			continue
		}
		for b := a + 1; b < nInd; b++ {
			if !need[b] {
				continue
			}
			c := Correlation{Group: g.Name, IndicatorX: d.Dictionary.Indicators[a].Key, IndicatorY: d.Dictionary.Indicators[b].Key, Year: m.Year}
			x, y := vals[a], vals[b]
			var ssx, ssy float64
			keptX, ssx = rankAmong(order[a], x, y, rankX, keptX[:0])
			keptY, ssy = rankAmong(order[b], y, x, rankY, keptY[:0])
			c.N = len(keptX)
			c.Pearson, c.Spearman = math.NaN(), math.NaN()
			if c.N >= 2 {
				// One pass for the sums (and the rank cross-products), one
				// for the centred sums of Pearson's r.
				var sx, sy, srr float64
				for _, li := range keptX {
					sx += x[li]
					sy += y[li]
					srr += rankX[li] * rankY[li]
				}
				nf := float64(c.N)
				c.Pearson = centredPearson(keptX, x, y, sx/nf, sy/nf)
				mean := (nf + 1) / 2
				sxy := srr - nf*mean*mean
				sxx := ssx - nf*mean*mean
				syy := ssy - nf*mean*mean
				if sxx > 0 && syy > 0 {
					c.Spearman = math.Max(-1, math.Min(1, sxy/math.Sqrt(sxx*syy)))
				}
			}
			out = append(out, c)
		}
	}
	return out
}

// rankAmong assigns average ranks (ties sharing the mean rank) by own
// value to the members in order that also have a value of other, writing
// them into ranks by member index. It returns those members, in order,
// and the sum of their squared ranks.
func rankAmong(order []int32, own, other []float64, ranks []float64, kept []int32) ([]int32, float64) {
	for _, li := range order {
		if !math.IsNaN(other[li]) {
			kept = append(kept, li)
		}
	}
	ss := 0.0
	for i := 0; i < len(kept); {
		j := i + 1
		for j < len(kept) && own[kept[j]] == own[kept[i]] {
			j++
		}
		avg := float64(i+j+1) / 2
		for k := i; k < j; k++ {
			ranks[kept[k]] = avg
			ss += avg * avg
		}
		i = j
	}
	return kept, ss
}

// sortByValue sorts indices by their value, ties by index, so the order is
// the same whichever way it was obtained. It sorts (value, index) pairs,
// which keeps the comparisons on contiguous memory.
func sortByValue(o []int32, v []float64) {
	type pair struct {
		v float64
		i int32
	}
	ps := make([]pair, len(o))
	for j, i := range o {
		ps[j] = pair{v[i], i}
	}
	slices.SortFunc(ps, func(a, b pair) int {
		switch {
		case a.v < b.v:
			return -1
		case a.v > b.v:
			return 1
		}
		return int(a.i - b.i)
	})
	for j := range ps {
		o[j] = ps[j].i
	}
}

// registerOrders sorts, for every indicator used, the register positions
// with a value in the year by value (ties by position).
func registerOrders(d *dataset.Dataset, year int, used []bool) [][]int32 {
	out := make([][]int32, len(d.Dictionary.Indicators))
	for k := range out {
		if !used[k] {
			continue
		}
		col := d.Column(k, year)
		o := make([]int32, 0, len(col))
		for i, v := range col {
			if !math.IsNaN(v) {
				o = append(o, int32(i))
			}
		}
		sortByValue(o, col)
		out[k] = o
	}
	return out
}

// centredPearson is Pearson's r over the members idx of x and y from
// centred values, given their means.
func centredPearson(idx []int32, x, y []float64, mx, my float64) float64 {
	var sxy, sxx, syy float64
	for _, li := range idx {
		dx, dy := x[li]-mx, y[li]-my
		sxy += dx * dy
		sxx += dx * dx
		syy += dy * dy
	}
	if sxx == 0 || syy == 0 {
		return math.NaN()
	}
	return math.Max(-1, math.Min(1, sxy/math.Sqrt(sxx*syy)))
}
