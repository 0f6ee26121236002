package composite

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"sync"
)

// monteCarlo runs the uncertainty analysis of Saisana, Saltelli and
// Tarantola (2005): each run draws every weight's factor uniformly in
// [1 - spread, 1 + spread] (weights renormalised after), one of the listed
// normalisations and one of the listed imputations, recomputes every
// score and ranks them. Run r draws from its own PCG stream (seed, r), so
// the result does not depend on how runs are shared out between workers;
// ranks are counted into per-institution histograms, merged at the end.
// With a zero spread and one option, every run is the base composite and
// every interval is the base rank.
func (r *Result) monteCarlo() error {
	pr := r.prep
	spec := pr.spec
	m, k, p := len(pr.scored), pr.k, pr.p
	runs := spec.Runs
	if m == 0 {
		return nil
	}
	focus := -1
	if spec.Focus >= 0 {
		if a, ok := slices.BinarySearch(pr.scored, spec.Focus); ok {
			focus = a
		}
	}
	nf := k + p + 2 // weight factors, option indices
	factors := make([][]float64, nf)
	for f := range factors {
		factors[f] = make([]float64, runs)
	}
	focusRank := make([]float64, runs)
	workers := runtime.GOMAXPROCS(0)
	if workers > runs {
		workers = runs
	}
	// ranks[a*runs+run]: each run writes its own column, so workers never
	// share a cell; memory is runs x institutions x 4 bytes (80 MB at
	// 10,000 runs over 2,000 institutions), where a per-worker histogram
	// of every rank would grow with the square of the institutions.
	ranksOf := make([]uint32, m*runs)
	var wg sync.WaitGroup
	var failMu sync.Mutex
	var failure any
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			defer func() {
				if e := recover(); e != nil {
					failMu.Lock()
					failure = e
					failMu.Unlock()
				}
			}()
			indW := make([]float64, k)
			pilW := make([]float64, p)
			sums := make([]float64, p)
			overall := make([]float64, m)
			ranks := make([]int, m)
			order := make([]uint64, 2*m)
			ps, pw := make([]float64, p), make([]float64, p)
			nMethods := len(pr.options)
			for run := w; run < runs; run += workers {
				rng := rand.New(rand.NewPCG(spec.Seed, uint64(run)))
				for q := range sums {
					sums[q] = 0
				}
				for j := 0; j < k; j++ {
					u := 1 + spec.WeightSpread*(2*rng.Float64()-1)
					factors[j][run] = u
					indW[j] = pr.indW[j] * u
					sums[pr.pillar[j]] += indW[j]
				}
				for j := 0; j < k; j++ {
					indW[j] /= sums[pr.pillar[j]]
				}
				tot := 0.0
				for q := 0; q < p; q++ {
					u := 1 + spec.WeightSpread*(2*rng.Float64()-1)
					factors[k+q][run] = u
					pilW[q] = pr.pilW[q] * u
					tot += pilW[q]
				}
				for q := range pilW {
					pilW[q] /= tot
				}
				opt := 0
				if nMethods > 1 {
					opt = rng.IntN(nMethods)
				}
				factors[k+p][run] = float64(pr.methodIndex(opt))
				factors[k+p+1][run] = float64(pr.imputeIndex(opt))
				aggregate(pr.mats[opt], k, pr.pillar, indW, pilW, spec.Geometric, overall, nil, ps, pw)
				Ranks(overall, ranks, order)
				for a, rk := range ranks {
					ranksOf[a*runs+run] = uint32(rk)
				}
				if focus >= 0 {
					focusRank[run] = float64(ranks[focus])
				}
			}
		}(w)
	}
	wg.Wait()
	if failure != nil {
		return fmt.Errorf("internal error in the composite's Monte Carlo runs (%v); please report it with the brief and data", failure)
	}
	n := len(r.Score)
	r.RankMedian, r.RankLow, r.RankHigh = make([]int, n), make([]int, n), make([]int, n)
	counts := make([]int32, m)
	for a, i := range pr.scored {
		clear(counts)
		for _, rk := range ranksOf[a*runs : (a+1)*runs] {
			if rk > 0 {
				counts[rk-1]++
			}
		}
		// Runs in which the institution had no score (values that no
		// scale could place, such as overflowing extremes) are not
		// counted.
		valid := 0
		for _, c := range counts {
			valid += int(c)
		}
		r.RankLow[i] = histQuantile(counts, valid, 0.05)
		r.RankMedian[i] = histQuantile(counts, valid, 0.5)
		r.RankHigh[i] = histQuantile(counts, valid, 0.95)
	}
	if focus < 0 {
		return nil
	}
	r.FocusRankVariance = variance(focusRank)
	bins := runs / 50
	bins = max(2, min(50, bins))
	for j, ind := range spec.Indicators {
		if spec.WeightSpread > 0 && countInPillar(pr.pillar, pr.pillar[j]) > 1 {
			r.Sensitivity = append(r.Sensitivity, Factor{"indicator-weight", ind.Key, FirstOrder(factors[j], focusRank, bins)})
		}
	}
	for q, pl := range spec.Pillars {
		if spec.WeightSpread > 0 && p > 1 {
			r.Sensitivity = append(r.Sensitivity, Factor{"pillar-weight", pl.Key, FirstOrder(factors[k+q], focusRank, bins)})
		}
	}
	if len(uniq(append([]Method{spec.Normalise}, spec.Normalisations...))) > 1 {
		r.Sensitivity = append(r.Sensitivity, Factor{"normalisation", "", FirstOrderDiscrete(factors[k+p], focusRank)})
	}
	if len(uniq(append([]Impute{spec.Impute}, spec.Imputations...))) > 1 {
		r.Sensitivity = append(r.Sensitivity, Factor{"imputation", "", FirstOrderDiscrete(factors[k+p+1], focusRank)})
	}
	return nil
}

func countInPillar(pillar []int, q int) int {
	n := 0
	for _, x := range pillar {
		if x == q {
			n++
		}
	}
	return n
}

func (pr *prepared) methodIndex(opt int) int {
	ms := uniq(append([]Method{pr.spec.Normalise}, pr.spec.Normalisations...))
	return slices.Index(ms, pr.options[opt].method)
}

func (pr *prepared) imputeIndex(opt int) int {
	is := uniq(append([]Impute{pr.spec.Impute}, pr.spec.Imputations...))
	return slices.Index(is, pr.options[opt].impute)
}

// histQuantile is the p-quantile of ranks counted in a histogram by the
// inverse of the empirical distribution (Hyndman and Fan 1996, type 1; R's
// quantile(type = 1)): the smallest rank whose cumulative count reaches
// ceil(p n), so every bound is a rank that occurred.
func histQuantile(counts []int32, n int, p float64) int {
	if n == 0 {
		return 0
	}
	need := int64(math.Ceil(p*float64(n) - 1e-9))
	if need < 1 {
		need = 1
	}
	var cum int64
	for rk, c := range counts {
		cum += int64(c)
		if cum >= need {
			return rk + 1
		}
	}
	return 0
}

// variance is the population variance (divisor n).
func variance(y []float64) float64 {
	if len(y) == 0 {
		return math.NaN()
	}
	mean := 0.0
	for _, v := range y {
		mean += v
	}
	mean /= float64(len(y))
	s := 0.0
	for _, v := range y {
		s += (v - mean) * (v - mean)
	}
	return s / float64(len(y))
}
