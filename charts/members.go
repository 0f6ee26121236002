package charts

import (
	"math"
	"sort"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/stats"
)

// memberPlace is one group member's value and placement on an indicator.
type memberPlace struct {
	Inst  int
	Value float64
	stats.Placement
}

// direction is the ranking direction of an indicator's polarity, as the
// figures model ranks (neutral indicators by value, highest first).
func direction(ind dataset.Indicator) stats.Direction {
	if ind.Better == dataset.LowerIsBetter {
		return stats.LowerFirst
	}
	return stats.HigherFirst
}

// memberPlaces places every member of a group with a value, best first.
// The model records positions for the focus and named institutions only;
// a chart that shows every member (bars, heatmap) takes those from the
// model and places the others with the same stats.Place definition, so a
// rank printed on a chart equals the one in the tables.
func memberPlaces(m *figures.Model, g *figures.Group, ind dataset.Indicator, year int) []memberPlace {
	insts, values := m.Members(g.Name, ind.Key, year)
	sorted := append([]float64(nil), values...)
	sort.Float64s(sorted)
	dir := direction(ind)
	out := make([]memberPlace, len(insts))
	for i, inst := range insts {
		mp := memberPlace{Inst: inst, Value: values[i], Placement: stats.Place(sorted, values[i], dir, true)}
		if p, ok := m.Position(g.Name, ind.Key, inst, year); ok && p.HasValue {
			mp.Rank, mp.Of, mp.Percentile = p.Rank, p.Of, p.Percentile
		}
		out[i] = mp
	}
	sort.SliceStable(out, func(i, j int) bool {
		if out[i].Rank != out[j].Rank {
			return out[i].Rank < out[j].Rank
		}
		return out[i].Inst < out[j].Inst
	})
	return out
}

// percentileOf finds an institution's percentile among placements.
func percentileOf(ps []memberPlace, inst int) float64 {
	for _, p := range ps {
		if p.Inst == inst {
			return p.Percentile
		}
	}
	return math.NaN()
}
