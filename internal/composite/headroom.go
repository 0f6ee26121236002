package composite

import "math"

// Headroom is the smallest change in one indicator, the others held, that
// would bring an institution's base rank to a target.
type Headroom struct {
	Indicator int
	// From is the present value, To the value needed (raw scale), Change
	// = To - From and ChangePct = 100 Change / |From|.
	From, To, Change, ChangePct float64
	// Rank is the base rank reached at To.
	Rank int
	// Reachable is false when even the best value observed in the
	// population would not reach the target.
	Reachable bool
}

// HeadroomOf searches, for indicator j, the smallest move of inst's value
// towards the best value observed among the scored institutions that
// brings its base rank to target or better: bisection on the value, each
// step recomputing the whole base composite (normalisation included) with
// the skew treatment of the original data, since the rank can only
// improve as the value improves. ok is false when inst has no value or is
// not scored.
func (r *Result) HeadroomOf(cols [][]float64, inst, j, target int) (Headroom, bool) {
	spec := r.prep.spec
	if inst < 0 || inst >= len(r.Scored) || !r.Scored[inst] || math.IsNaN(cols[j][inst]) {
		return Headroom{}, false
	}
	v0 := cols[j][inst]
	h := Headroom{Indicator: j, From: v0, To: v0, Rank: r.Rank[inst]}
	if r.Rank[inst] <= target {
		h.Reachable = true
		return h, true
	}
	lower := spec.Indicators[j].Lower
	best := v0
	for i, v := range cols[j] {
		if r.Scored[i] && !math.IsNaN(v) && (lower && v < best || !lower && v > best) {
			best = v
		}
	}
	work := make([][]float64, len(cols))
	copy(work, cols)
	col := append([]float64(nil), cols[j]...)
	work[j] = col
	rankAt := func(v float64) int {
		col[inst] = v
		res, err := prepare(spec, work, r.Skew, false)
		if err != nil {
			return math.MaxInt
		}
		res.base()
		return res.Rank[inst]
	}
	if best == v0 {
		return h, true
	}
	top := rankAt(best)
	if top > target {
		h.To, h.Rank = best, top
		h.Change = best - v0
		h.ChangePct = pct(h.Change, v0)
		return h, true
	}
	lo, hi := v0, best // rank(lo) > target, rank(hi) <= target
	hiRank := top
	for it := 0; it < 60; it++ {
		mid := lo + (hi-lo)/2
		if mid == lo || mid == hi {
			break
		}
		if rk := rankAt(mid); rk <= target {
			hi, hiRank = mid, rk
		} else {
			lo = mid
		}
		if math.Abs(hi-lo) <= 1e-9*math.Max(1, math.Abs(hi)) {
			break
		}
	}
	h.To, h.Rank, h.Reachable = hi, hiRank, true
	h.Change = hi - v0
	h.ChangePct = pct(h.Change, v0)
	return h, true
}

func pct(change, from float64) float64 {
	if from == 0 {
		return math.NaN()
	}
	return 100 * change / math.Abs(from)
}
