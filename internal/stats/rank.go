package stats

import (
	"math"
	"sort"
)

// Direction says which end of a scale ranks first.
type Direction int

const (
	// HigherFirst ranks the highest value first: "higher is better"
	// indicators, and neutral ones (ranked by value, highest first, with no
	// judgement implied).
	HigherFirst Direction = iota
	// LowerFirst ranks the lowest value first: "lower is better".
	LowerFirst
)

// Placement is where one value sits among a group's values.
type Placement struct {
	// Rank is 1 + the number of strictly better values, so ties share the
	// best rank ("1, 2, 2, 4"; standard competition ranking).
	Rank int
	// Of is the number of values ranked, the placed value included.
	Of int
	// Better, Below and Ties count the values strictly better, strictly
	// worse, and equal (the placed value itself included in Ties).
	Better, Below, Ties int
	// Percentile is the percentile rank 100 x (Below + Ties/2) / Of: the
	// share of the group the value does at least as well as, counting half
	// of the ties (the "mean" definition of percentile rank; SciPy's
	// percentileofscore(kind="mean"), equal to 100 x (average rank - 0.5)
	// / n in the better direction). For HigherFirst "below" means lower
	// values, so for a neutral indicator the percentile is the share of
	// lower values, as on a plain distribution.
	Percentile float64
}

// Place locates v among sorted (ascending, no missing values). When member
// is true, v is itself one of the sorted values (the institution belongs
// to the group); otherwise v is placed among them as one more value, so Of
// is len(sorted)+1 and the group's values are not changed. Cost O(log n).
func Place(sorted []float64, v float64, dir Direction, member bool) Placement {
	lt := sort.SearchFloat64s(sorted, v) // values < v
	le := lt + sort.Search(len(sorted)-lt, func(i int) bool { return sorted[lt+i] > v })
	return placeCounts(lt, le-lt, len(sorted)-le, dir, member)
}

// PlaceUnsorted is Place on values in any order, skipping NaNs; it counts
// in one pass, O(n), for callers that place a single value once.
func PlaceUnsorted(values []float64, v float64, dir Direction, member bool) Placement {
	lt, eq, gt := 0, 0, 0
	for _, x := range values {
		switch {
		case math.IsNaN(x):
		case x < v:
			lt++
		case x > v:
			gt++
		default:
			eq++
		}
	}
	return placeCounts(lt, eq, gt, dir, member)
}

func placeCounts(lt, eq, gt int, dir Direction, member bool) Placement {
	if !member {
		eq++
	}
	p := Placement{Ties: eq, Of: lt + eq + gt}
	if dir == LowerFirst {
		p.Better, p.Below = lt, gt
	} else {
		p.Better, p.Below = gt, lt
	}
	p.Rank = p.Better + 1
	if p.Of > 0 {
		p.Percentile = 100 * (float64(p.Below) + float64(p.Ties)/2) / float64(p.Of)
	}
	return p
}

// QuartileOf maps a percentile rank to a quartile, 1 the best quarter:
// 1 when p > 75, 2 when 50 < p <= 75, 3 when 25 < p <= 50, 4 when p <= 25.
// A value exactly on a boundary goes to the less favourable quartile so
// that "in the top quarter" is never claimed for a value that is not
// strictly above three quarters of the group (common practice, no source).
func QuartileOf(p float64) int {
	switch {
	case math.IsNaN(p):
		return 0
	case p > 75:
		return 1
	case p > 50:
		return 2
	case p > 25:
		return 3
	}
	return 4
}

// QuartileByValue places a value in a quarter of a distribution by the
// distribution's own quartiles, 1 the best quarter. Higher first: 1 when
// v >= Q3, 2 when median <= v < Q3, 3 when Q1 <= v < median, else 4;
// lower first, mirrored (1 when v <= Q1). A value on a quartile belongs to
// the better quarter, so tied values share a quarter, a joint-best value
// (the maximum, never below Q3) is always in the top quarter, and "in the
// top quarter" always goes with "at or above the upper quartile": the one
// boundary rule for tables and text, whatever the quantile definition
// (common practice, no source). NaN values give 0.
func QuartileByValue(v float64, b Box, lowerFirst bool) int {
	if math.IsNaN(v) || b.N == 0 {
		return 0
	}
	if lowerFirst {
		switch {
		case v <= b.Q1:
			return 1
		case v <= b.Median:
			return 2
		case v <= b.Q3:
			return 3
		}
		return 4
	}
	switch {
	case v >= b.Q3:
		return 1
	case v >= b.Median:
		return 2
	case v >= b.Q1:
		return 3
	}
	return 4
}

// AverageRanks returns the ascending ranks of x (1 = smallest), tied values
// sharing the mean of the ranks they span (R's rank(ties.method =
// "average")). x must have no missing values.
func AverageRanks(x []float64) []float64 {
	idx := make([]int, len(x))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return x[idx[a]] < x[idx[b]] })
	r := make([]float64, len(x))
	for i := 0; i < len(idx); {
		j := i + 1
		for j < len(idx) && x[idx[j]] == x[idx[i]] {
			j++
		}
		avg := float64(i+j+1) / 2 // mean of ranks i+1..j
		for k := i; k < j; k++ {
			r[idx[k]] = avg
		}
		i = j
	}
	return r
}

// PlaceAll places several values among the same group at once: values in
// any order without NaNs, targets[j] placed with member[j] saying whether
// it is itself one of the values. One pass over the values, O(n k) for k
// targets; a NaN target gets a zero Placement. out must have len(targets).
func PlaceAll(values, targets []float64, member []bool, dir Direction, out []Placement) {
	k := len(targets)
	lt := make([]int, k)
	eq := make([]int, k)
	for _, v := range values {
		for j, t := range targets {
			lt[j] += b2i(v < t)
			eq[j] += b2i(v == t)
		}
	}
	for j, t := range targets {
		if math.IsNaN(t) {
			out[j] = Placement{}
			continue
		}
		out[j] = placeCounts(lt[j], eq[j], len(values)-lt[j]-eq[j], dir, member[j])
	}
}

// b2i is 1 for true; the compiler turns it into a flag move, keeping the
// counting loop free of unpredictable branches.
func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}
