package stats

import (
	"math/bits"
	"slices"
	"sort"
)

// BoxOfUnsorted is BoxOfSorted on values in any order (no missing values),
// found by selection instead of sorting: the order statistics the
// quartiles need are placed with a multi-quickselect (Hoare 1961, "FIND"),
// expected O(n) rather than O(n log n). It reorders values. The result is
// bit-identical to BoxOfSorted on the sorted values.
func BoxOfUnsorted(values []float64, missing int, m QuantileMethod) Box {
	n := len(values)
	if n == 0 {
		return BoxOfSorted(nil, missing, m)
	}
	q1, med, q3 := QuartilesOfUnsorted(values, m)
	b := Box{N: n, Missing: missing}
	b.Min, b.Max = values[0], values[0]
	for _, v := range values {
		if v < b.Min {
			b.Min = v
		}
		if v > b.Max {
			b.Max = v
		}
	}
	b.Q1, b.Median, b.Q3 = q1, med, q3
	b.setWhiskers(values)
	return b
}

// QuartilesOfUnsorted returns the first quartile, the median and the
// third quartile of values (any order, no NaNs, at least one) by method
// m, placing only the order statistics they need (SelectOrder). It
// reorders values. The results are bit-identical to Quantile on the
// sorted values.
func QuartilesOfUnsorted(values []float64, m QuantileMethod) (q1, median, q3 float64) {
	n := len(values)
	plans := [3]quantilePlan{planQuantile(n, 0.25, m), planQuantile(n, 0.5, m), planQuantile(n, 0.75, m)}
	var buf [6]int
	ks := buf[:0]
	for _, q := range plans {
		ks = append(ks, q.lo, q.hi)
	}
	slices.Sort(ks)
	ks = slices.Compact(ks)
	SelectOrder(values, ks)
	return plans[0].value(values[plans[0].lo], values[plans[0].hi]),
		plans[1].value(values[plans[1].lo], values[plans[1].hi]),
		plans[2].value(values[plans[2].lo], values[plans[2].hi])
}

// SelectOrder rearranges a (no NaNs) so that for every 0-based k in ks
// (ascending, distinct) a[k] is the k-th smallest value, everything before
// it no larger and everything after it no smaller. It is Hoare's (1961)
// FIND with a median-of-three pivot and a branch-free partition (see
// partitionLess); past a depth limit the range is sorted instead, so the
// worst case stays O(n log n).
func SelectOrder(a []float64, ks []int) {
	depth := 2 * bits.Len(uint(len(a)))
	selectRange(a, 0, len(a), ks, depth)
}

// selectRange places the order statistics ks (all within [lo, hi)).
func selectRange(a []float64, lo, hi int, ks []int, depth int) {
	for len(ks) > 0 {
		if hi-lo <= 16 || depth == 0 {
			slices.Sort(a[lo:hi])
			return
		}
		depth--
		lt, ge := partitionLess(a, lo, hi)
		// a[lo:lt] < pivot, a[lt:ge] == pivot (final), a[ge:hi] >= pivot
		i := sort.SearchInts(ks, lt)
		j := sort.SearchInts(ks, ge)
		left, right := ks[:i], ks[j:]
		if len(left) > 0 && len(right) > 0 {
			selectRange(a, lo, lt, left, depth)
			lo, ks = ge, right
			continue
		}
		if len(left) > 0 {
			hi, ks = lt, left
			continue
		}
		lo, ks = ge, right
	}
}

// partitionLess partitions a[lo:hi] (at least 3 values) around the median
// of its first, middle and last values with a branch-free Lomuto pass
// (the branch-free form of Edelkamp and Weiss 2016, "BlockQuicksort"):
// a[lo:lt] < pivot, a[lt] == pivot. When the smaller side is thin, which
// runs of ties cause, a second pass gathers every value equal to the
// pivot into a[lt:ge], all in their final places, so ties cost linear
// time; otherwise ge = lt+1.
func partitionLess(a []float64, lo, hi int) (lt, ge int) {
	last := hi - 1
	mid := lo + (hi-lo)/2
	if a[mid] < a[lo] {
		a[mid], a[lo] = a[lo], a[mid]
	}
	if a[last] < a[lo] {
		a[last], a[lo] = a[lo], a[last]
	}
	if a[last] < a[mid] {
		a[last], a[mid] = a[mid], a[last]
	}
	a[mid], a[last] = a[last], a[mid] // the median becomes the pivot at the end
	pivot := a[last]
	j := lo
	for i := lo; i < last; i++ {
		v := a[i]
		a[i] = a[j]
		a[j] = v
		j += b2i(v < pivot)
	}
	a[j], a[last] = a[last], a[j]
	lt, ge = j, j+1
	if n := hi - lo; lt-lo < n/8 || hi-ge < n/8 {
		// gather the pivot's ties: a[ge:hi] >= pivot, so == means <=
		for i := ge; i < hi; i++ {
			v := a[i]
			a[i] = a[ge]
			a[ge] = v
			ge += b2i(v <= pivot)
		}
	}
	return lt, ge
}
