package composite

import (
	"fmt"
	"math"
	"math/bits"
	"slices"

	"peerpack/internal/stats"
)

// option is one combination of the choices Monte Carlo draws from.
type option struct {
	method Method
	impute Impute
}

// prepared holds the normalised, imputed values of the scored institutions
// for every option, institution-major (vals[i*k+j]), so a run only weighs
// and aggregates.
type prepared struct {
	spec    *Spec
	k, p    int
	scored  []int // institution positions of the scored, ascending
	pillar  []int // pillar of each indicator
	indW    []float64
	pilW    []float64
	options []option
	mats    [][]float64
	imputed [][]int // per option, per scored institution
	missing []int   // per scored institution
}

// Compute builds the composite over the columns (one per spec indicator,
// each indexed by institution, NaN = missing), with Monte Carlo ranks and
// the focus's sensitivity when spec.Runs > 0.
func Compute(spec *Spec, cols [][]float64) (*Result, error) {
	if err := spec.Validate(); err != nil {
		return nil, err
	}
	if len(cols) != len(spec.Indicators) {
		return nil, errf("%d columns for %d indicators", len(cols), len(spec.Indicators))
	}
	res, err := prepare(spec, cols, nil, true)
	if err != nil {
		return nil, err
	}
	res.base()
	if spec.Runs > 0 {
		if err := res.monteCarlo(); err != nil {
			return nil, err
		}
	}
	return res, nil
}

// prepare treats skew, flips polarity, decides who is scored and
// normalises and imputes for every option. With frozen skew infos the same
// treatments are applied without testing the criterion again (headroom
// moves one value and must not change the method). all = false prepares
// the base option only.
func prepare(spec *Spec, cols [][]float64, frozen []SkewInfo, all bool) (*Result, error) {
	k := len(spec.Indicators)
	n := 0
	if k > 0 {
		n = len(cols[0])
	}
	for j, c := range cols {
		if len(c) != n {
			return nil, errf("indicator %s has %d values for %d institutions", spec.Indicators[j].Key, len(c), n)
		}
	}
	res := &Result{
		Scored:  make([]bool, n),
		Imputed: make([]int, n),
		Score:   make([]float64, n),
		Rank:    make([]int, n),
		Skew:    make([]SkewInfo, k),
	}
	need := int(math.Ceil(spec.MinShare*float64(k) - 1e-9))
	if need < 1 {
		need = 1
	}
	pr := &prepared{spec: spec, k: k, p: len(spec.Pillars)}
	for i := 0; i < n; i++ {
		have := 0
		for j := range cols {
			if !math.IsNaN(cols[j][i]) {
				have++
			}
		}
		if have >= need {
			res.Scored[i] = true
			pr.scored = append(pr.scored, i)
		} else {
			res.Excluded++
		}
	}
	m := len(pr.scored)
	// weights, normalised within each pillar and across pillars
	pr.pillar = make([]int, k)
	pr.indW = make([]float64, k)
	pr.pilW = make([]float64, pr.p)
	sums := make([]float64, pr.p)
	for j, ind := range spec.Indicators {
		pr.pillar[j] = ind.Pillar
		sums[ind.Pillar] += ind.Weight
	}
	total := 0.0
	for _, pl := range spec.Pillars {
		total += pl.Weight
	}
	for q, pl := range spec.Pillars {
		pr.pilW[q] = pl.Weight / total
	}
	res.EffectiveWeight = make([]float64, k)
	for j, ind := range spec.Indicators {
		pr.indW[j] = ind.Weight / sums[ind.Pillar]
		res.EffectiveWeight[j] = pr.indW[j] * pr.pilW[ind.Pillar]
	}
	res.IndicatorWeight, res.PillarWeight = pr.indW, pr.pilW

	// skew, then polarity: ready[j] holds scored institutions' values only
	ready := make([][]float64, k)
	for j := range cols {
		c := make([]float64, n)
		for i := range c {
			c[i] = math.NaN()
			if res.Scored[i] {
				c[i] = cols[j][i]
			}
		}
		var fz *SkewInfo
		if frozen != nil {
			fz = &frozen[j]
		}
		res.Skew[j] = treatSkew(c, res.Scored, spec.Skew, fz)
		if spec.Indicators[j].Lower {
			for i := range c {
				c[i] = -c[i]
			}
		}
		compact := make([]float64, m)
		for a, i := range pr.scored {
			compact[a] = c[i]
		}
		ready[j] = compact
	}
	var ref []bool
	if spec.Reference != nil {
		ref = make([]bool, m)
		for a, i := range pr.scored {
			ref[a] = i < len(spec.Reference) && spec.Reference[i]
		}
	}
	methods := []Method{spec.Normalise}
	imputes := []Impute{spec.Impute}
	if all {
		methods = uniq(append(methods, spec.Normalisations...))
		imputes = uniq(append(imputes, spec.Imputations...))
	}
	norm := map[Method][][]float64{}
	for _, me := range methods {
		cs := make([][]float64, k)
		for j := range ready {
			cs[j] = Normalise(ready[j], me, ref)
			if me == Distance && spec.Reference != nil && countTrue(ref) == 0 {
				return nil, errf("the distance normalisation's reference group has no member in the composite's population")
			}
		}
		norm[me] = cs
	}
	pr.missing = make([]int, m)
	for _, me := range methods {
		for _, im := range imputes {
			mat, imp := fill(norm[me], pr, im)
			if spec.Geometric {
				if bad := nonPositive(mat); bad > 0 {
					return nil, errf("geometric aggregation needs positive normalised values, but the %s normalisation gives zero or less for %d values; aggregate arithmetically or choose percentile or zscore-cdf", me, bad)
				}
			}
			pr.options = append(pr.options, option{me, im})
			pr.mats = append(pr.mats, mat)
			pr.imputed = append(pr.imputed, imp)
		}
	}
	for a := range pr.scored {
		for j := 0; j < k; j++ {
			if math.IsNaN(ready[j][a]) {
				pr.missing[a]++
			}
		}
	}
	for a, i := range pr.scored {
		res.Imputed[i] = pr.imputed[0][a]
	}
	res.prep = pr
	return res, nil
}

func uniq[T comparable](xs []T) []T {
	var out []T
	for _, x := range xs {
		if !known(out, x) {
			out = append(out, x)
		}
	}
	return out
}

func countTrue(b []bool) int {
	n := 0
	for _, v := range b {
		if v {
			n++
		}
	}
	return n
}

func nonPositive(mat []float64) int {
	n := 0
	for _, v := range mat {
		if v <= 0 {
			n++
		}
	}
	return n
}

// fill lays the normalised columns out institution-major and imputes.
func fill(cs [][]float64, pr *prepared, im Impute) ([]float64, []int) {
	k, m := pr.k, len(pr.scored)
	mat := make([]float64, m*k)
	imp := make([]int, m)
	medians := make([]float64, k)
	for j, c := range cs {
		v := presentValues(c, nil)
		slices.Sort(v)
		medians[j] = stats.Quantile(v, 0.5, stats.Type7)
	}
	for a := 0; a < m; a++ {
		row := mat[a*k : (a+1)*k]
		for j := range row {
			row[j] = cs[j][a]
		}
		if im == ImputeNone {
			continue
		}
		for j, v := range row {
			if !math.IsNaN(v) {
				continue
			}
			fillv := medians[j]
			if im == ImputePillarMean {
				s, w := 0.0, 0.0
				for q, u := range cs {
					if q != j && pr.pillar[q] == pr.pillar[j] && !math.IsNaN(u[a]) {
						s += pr.indW[q] * u[a]
						w += pr.indW[q]
					}
				}
				if w > 0 {
					fillv = s / w
				}
			}
			row[j] = fillv
			imp[a]++
		}
	}
	return mat, imp
}

// aggregate computes the pillar and overall scores of every scored
// institution from one option's matrix and one set of weights: within a
// pillar the weighted arithmetic mean of the values present, across
// pillars the weighted arithmetic or geometric mean of the pillars
// present, weights renormalised over what is present (Nardo et al. 2008,
// section 1.7).
func aggregate(mat []float64, k int, pillar []int, indW, pilW []float64, geometric bool, overall []float64, pillars [][]float64, ps, pw []float64) {
	m := len(overall)
	// A row with every value present and arithmetic pillars reduces to
	// one dot product with the effective weights (pillar weight times
	// weight within the pillar); the general path below handles the rest.
	var eff []float64
	if !geometric && pillars == nil {
		eff = make([]float64, k)
		for j := range eff {
			eff[j] = pilW[pillar[j]] * indW[j]
		}
	}
	for a := 0; a < m; a++ {
		row := mat[a*k : (a+1)*k]
		if eff != nil {
			s := 0.0
			for j, v := range row {
				s += eff[j] * v
			}
			if s == s {
				overall[a] = s
				continue
			}
		}
		for q := range ps {
			ps[q], pw[q] = 0, 0
		}
		for j, v := range row {
			if v == v { // not NaN
				q := pillar[j]
				ps[q] += indW[j] * v
				pw[q] += indW[j]
			}
		}
		s, w := 0.0, 0.0
		for q := range ps {
			if pw[q] == 0 {
				if pillars != nil {
					pillars[q][a] = math.NaN()
				}
				continue
			}
			v := ps[q] / pw[q]
			if pillars != nil {
				pillars[q][a] = v
			}
			if geometric {
				s += pilW[q] * math.Log(v)
			} else {
				s += pilW[q] * v
			}
			w += pilW[q]
		}
		switch {
		case w == 0:
			overall[a] = math.NaN()
		case geometric:
			overall[a] = math.Exp(s / w)
		default:
			overall[a] = s / w
		}
	}
}

// Ranks ranks scores highest first, ties sharing the best rank (1 + the
// number of strictly higher scores, "1, 2, 2, 4"; standard competition
// ranking); NaN gets 0. Scores that agree to about twelve significant
// digits (all but the last bits.Len(n) bits of the 52-bit mantissa) count
// as tied, so rounding noise in the last place never splits a tie and the
// sort runs on plain integers: each key is the score's order-preserving
// bit pattern, inverted so the highest comes first, with the institution's
// position in its low bits. keys is scratch space of 2 len(scores), or
// nil.
func Ranks(scores []float64, out []int, keys []uint64) {
	n := len(scores)
	if len(keys) != 2*n {
		keys = make([]uint64, 2*n)
	}
	shift := uint(bits.Len(uint(n)))
	mask := uint64(1)<<shift - 1
	valid := 0
	for i, s := range scores {
		if s != s {
			out[i] = 0
			continue
		}
		keys[valid] = ^orderedBits(s)&^mask | uint64(i)
		valid++
	}
	ks := keys[:valid]
	if valid < 256 {
		slices.Sort(ks)
	} else {
		radixSort(ks, keys[n:n+valid])
	}
	for a := 0; a < valid; {
		b := a + 1
		for b < valid && ks[b]&^mask == ks[a]&^mask {
			b++
		}
		for t := a; t < b; t++ {
			out[ks[t]&mask] = a + 1
		}
		a = b
	}
}

// radixSort sorts a ascending by least-significant-digit radix sort on
// bytes (Knuth, TAOCP vol. 3, 5.2.5), counting all eight digits in one
// pass and skipping the digits every key shares (the sign and exponent
// bytes of scores on one scale); tmp is scratch of len(a). It is several
// times faster than a comparison sort for the Monte Carlo's thousands of
// keys per run.
func radixSort(a, tmp []uint64) {
	var counts [8][256]int
	for _, k := range a {
		for d := 0; d < 8; d++ {
			counts[d][byte(k>>(8*d))]++
		}
	}
	src, dst := a, tmp
	for d := 0; d < 8; d++ {
		c := &counts[d]
		if c[byte(src[0]>>(8*d))] == len(src) {
			continue // every key has this digit
		}
		sum := 0
		for i := range c {
			c[i], sum = sum, sum+c[i]
		}
		shift := uint(8 * d)
		for _, k := range src {
			b := byte(k >> shift)
			dst[c[b]] = k
			c[b]++
		}
		src, dst = dst, src
	}
	if &src[0] != &a[0] {
		copy(a, src)
	}
}

// orderedBits maps a float64 to a uint64 with the same order (negative
// values with every bit flipped, positive ones with the sign bit set);
// -0 and +0 map alike.
func orderedBits(f float64) uint64 {
	if f == 0 {
		f = 0
	}
	u := math.Float64bits(f)
	if u>>63 == 1 {
		return ^u
	}
	return u | 1<<63
}

// base fills the base scores and ranks.
func (r *Result) base() {
	pr := r.prep
	m := len(pr.scored)
	overall := make([]float64, m)
	pillars := make([][]float64, pr.p)
	for q := range pillars {
		pillars[q] = make([]float64, m)
	}
	aggregate(pr.mats[0], pr.k, pr.pillar, pr.indW, pr.pilW, pr.spec.Geometric, overall, pillars, make([]float64, pr.p), make([]float64, pr.p))
	ranks := make([]int, m)
	Ranks(overall, ranks, nil)
	n := len(r.Score)
	for i := range r.Score {
		r.Score[i] = math.NaN()
	}
	for a, i := range pr.scored {
		r.Score[i] = overall[a]
		r.Rank[i] = ranks[a]
	}
	r.PillarScore = make([][]float64, pr.p)
	r.PillarRank = make([][]int, pr.p)
	for q := range pillars {
		r.PillarScore[q] = make([]float64, n)
		r.PillarRank[q] = make([]int, n)
		for i := range r.PillarScore[q] {
			r.PillarScore[q][i] = math.NaN()
		}
		Ranks(pillars[q], ranks, nil)
		for a, i := range pr.scored {
			r.PillarScore[q][i] = pillars[q][a]
			r.PillarRank[q][i] = ranks[a]
		}
	}
}

// Missing returns how many of an institution's indicator values were
// missing (imputed or left out); 0 for an unscored institution.
func (r *Result) Missing(inst int) int {
	a, ok := slices.BinarySearch(r.prep.scored, inst)
	if !ok {
		return 0
	}
	return r.prep.missing[a]
}

// NScored is the number of institutions scored.
func (r *Result) NScored() int { return len(r.prep.scored) }

func (o option) String() string { return fmt.Sprintf("%s/%s", o.method, o.impute) }
