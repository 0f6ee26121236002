package peers

import (
	"math"
	"math/rand/v2"
	"runtime"
	"sort"
	"sync"
)

// MaxIterations caps Lloyd's iterations for one start (scikit-learn's
// default max_iter is also 300); a start that reaches it is reported, not
// hidden.
const MaxIterations = 300

// Tolerance stops Lloyd's iterations once the centres, all together, move
// less than this share of the data's mean variance per indicator (the sum
// of the centres' squared shifts; scikit-learn's KMeans default, tol =
// 1e-4). On overlapping profiles the last hundreds of iterations move a
// handful of borderline rows and change the centres by less than the data
// can carry; on Iris it changes nothing (the reference test).
const Tolerance = 1e-4

// KMeansResult is the best of several k-means starts.
type KMeansResult struct {
	K int
	// Labels holds each row's cluster, 0..K-1, in the order the best start
	// found them (Order renumbers them).
	Labels []int
	// Centres is K x P, row-major.
	Centres []float64
	// WithinSS is the total within-cluster sum of squared Euclidean
	// distances to the centres, the quantity k-means minimises.
	WithinSS float64
	// Iterations of the best start; Converged is false when it stopped at
	// MaxIterations (true when no row changed cluster, or the centres
	// moved less than Tolerance allows).
	Iterations int
	Converged  bool
	// Restart is the index of the best start.
	Restart int
}

// rngFor gives the random stream of one start: the brief's seed and the
// (k, start) pair, so each start is reproducible however the starts are
// spread over processors.
func rngFor(seed uint64, stream, start int) *rand.Rand {
	return rand.New(rand.NewPCG(seed, uint64(stream)<<32|uint64(start)))
}

// StartSample is the population above which each start runs on a
// sample of this many rows rather than on all of them. Above it a start
// is k-means++ seeding and Lloyd's iterations on its own simple random
// sample (drawn from the start's stream), its centres are scored by the
// within-cluster sum of squares over all rows (one assignment pass), and
// only the best start is refined by Elkan iterations on all rows to
// convergence. This is the sample-then-refine scheme of Bradley and
// Fayyad (1998, "Refining initial points for k-means clustering") cut
// to its simplest form; 2,000 rows carry a cluster of 1 % of the
// population with about 20 members. At or below it every start runs on
// all rows, so the reference checks (Iris, USArrests) are untouched.
const StartSample = 2000

// KMeans runs k-means with k-means++ seeding (Arthur and Vassilvitskii
// 2007) from restarts starts and keeps the one with the lowest total
// within-cluster sum of squares (ties: the earlier start). Each start
// runs Lloyd's iterations to convergence (no row changes cluster),
// accelerated with Elkan's bounds (Elkan 2003, "Using the triangle
// inequality to accelerate k-means"): one lower bound per row and centre,
// which on 16 overlapping standardised indicators skips far more distance
// computations than Hamerly's single bound (Hamerly 2010) and gives the
// assignments of plain Lloyd. Above StartSample rows the starts run on
// samples and the best is refined on all rows (see StartSample). Starts
// run in parallel; the result depends only on x, k, restarts and seed,
// not on the number of processors.
func KMeans(x *Matrix, k, restarts int, seed uint64) KMeansResult {
	return kmeans(x, k, restarts, seed, StartSample)
}

// kmeans is KMeans with the start sample as a parameter (0: every start
// on all rows), so tests can compare the two schemes.
func kmeans(x *Matrix, k, restarts int, seed uint64, sample int) KMeansResult {
	if restarts < 1 {
		restarts = 1
	}
	if k > x.N {
		k = x.N
	}
	sampled := sample > 0 && x.N > sample
	results := make([]KMeansResult, restarts)
	var wg sync.WaitGroup
	next := make(chan int)
	workers := min(runtime.GOMAXPROCS(0), restarts)
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			if !sampled {
				ws := newWorkspace(x.N, k, x.P)
				for r := range next {
					results[r] = ws.run(x, k, rngFor(seed, k, r))
					results[r].Restart = r
				}
				return
			}
			ws := newWorkspace(sample, k, x.P)
			sub := &Matrix{N: sample, P: x.P, Data: make([]float64, sample*x.P)}
			idx := make([]int, x.N)
			for r := range next {
				rng := rngFor(seed, k, r)
				drawSample(x, sub, idx, rng)
				res := ws.run(sub, k, rng)
				// Scored on all rows: the centres as they stand, each row
				// to its nearest (the same criterion the full run minimises).
				results[r] = KMeansResult{K: k, Centres: res.Centres, WithinSS: nearestSS(x, res.Centres, k), Restart: r}
			}
		}()
	}
	for r := 0; r < restarts; r++ {
		next <- r
	}
	close(next)
	wg.Wait()
	best := 0
	for r := 1; r < restarts; r++ {
		if results[r].WithinSS < results[best].WithinSS {
			best = r
		}
	}
	if !sampled {
		return results[best]
	}
	ws := newWorkspace(x.N, k, x.P)
	copy(ws.centres, results[best].Centres)
	res := ws.iterate(x, k)
	res.Restart = best
	return res
}

// drawSample fills sub with a simple random sample of x's rows without
// replacement (a partial Fisher-Yates shuffle of idx), in row order.
func drawSample(x *Matrix, sub *Matrix, idx []int, rng *rand.Rand) {
	for i := range idx {
		idx[i] = i
	}
	m := sub.N
	for i := 0; i < m; i++ {
		j := i + rng.IntN(len(idx)-i)
		idx[i], idx[j] = idx[j], idx[i]
	}
	pick := idx[:m]
	sort.Ints(pick)
	for i, r := range pick {
		copy(sub.Data[i*x.P:(i+1)*x.P], x.Row(r))
	}
}

// nearestSS is the within-cluster sum of squares when every row joins
// its nearest centre.
func nearestSS(x *Matrix, centres []float64, k int) float64 {
	var s float64
	for i := 0; i < x.N; i++ {
		_, d, _ := closestTwo(x.Row(i), centres, k, x.P)
		s += d * d
	}
	return s
}

// workspace holds one start's buffers, reused over starts.
type workspace struct {
	upper, lb    []float64
	cc           []float64
	assign       []int
	centres, old []float64
	sums         []float64
	counts       []int
	half, moved  []float64
	d2           []float64
}

func newWorkspace(n, k, p int) *workspace {
	return &workspace{
		upper: make([]float64, n), lb: make([]float64, n*k), cc: make([]float64, k*k), assign: make([]int, n),
		centres: make([]float64, k*p), old: make([]float64, k*p), sums: make([]float64, k*p),
		counts: make([]int, k), half: make([]float64, k), moved: make([]float64, k),
		d2: make([]float64, n),
	}
}

// seedPlusPlus picks k starting centres: the first uniformly, each next
// one with probability proportional to its squared distance to the
// nearest centre already chosen (k-means++).
func (ws *workspace) seedPlusPlus(x *Matrix, k int, rng *rand.Rand) {
	p := x.P
	first := rng.IntN(x.N)
	copy(ws.centres[:p], x.Row(first))
	var total float64
	for i := 0; i < x.N; i++ {
		ws.d2[i] = sqDist(x.Row(i), ws.centres[:p])
		total += ws.d2[i]
	}
	for c := 1; c < k; c++ {
		pick := -1
		if total > 0 {
			t := rng.Float64() * total
			for i := 0; i < x.N; i++ {
				t -= ws.d2[i]
				if t < 0 && ws.d2[i] > 0 {
					pick = i
					break
				}
			}
		}
		if pick < 0 { // every row already sits on a centre, or rounding ran past the end
			pick = rng.IntN(x.N)
			for i := x.N - 1; i >= 0 && total > 0; i-- {
				if ws.d2[i] > 0 {
					pick = i
					break
				}
			}
		}
		cc := ws.centres[c*p : (c+1)*p]
		copy(cc, x.Row(pick))
		total = 0
		for i := 0; i < x.N; i++ {
			if d := sqDist(x.Row(i), cc); d < ws.d2[i] {
				ws.d2[i] = d
			}
			total += ws.d2[i]
		}
	}
}

// closestTwo returns the closest centre to row and the distances to the
// closest and second closest.
func closestTwo(row, centres []float64, k, p int) (int, float64, float64) {
	best, d1, d2 := 0, math.Inf(1), math.Inf(1)
	for c := 0; c < k; c++ {
		d := sqDist(row, centres[c*p:(c+1)*p])
		if d < d1 {
			best, d2, d1 = c, d1, d
		} else if d < d2 {
			d2 = d
		}
	}
	return best, math.Sqrt(d1), math.Sqrt(d2)
}

func (ws *workspace) run(x *Matrix, k int, rng *rand.Rand) KMeansResult {
	ws.seedPlusPlus(x, k, rng)
	return ws.iterate(x, k)
}

// iterate runs Elkan-accelerated Lloyd iterations from the centres in
// ws.centres to convergence.
func (ws *workspace) iterate(x *Matrix, k int) KMeansResult {
	n, p := x.N, x.P
	lb := ws.lb[:n*k]
	for i := 0; i < n; i++ {
		row, l := x.Row(i), lb[i*k:(i+1)*k]
		best := 0
		for c := 0; c < k; c++ {
			l[c] = math.Sqrt(sqDist(row, ws.centres[c*p:(c+1)*p]))
			if l[c] < l[best] {
				best = c
			}
		}
		ws.assign[i], ws.upper[i] = best, l[best]
	}
	tol := Tolerance * meanVariance(x)
	converged := false
	iter := 0
	ws.exactSums(x, k)
	for iter = 1; iter <= MaxIterations; iter++ {
		ws.moveCentres(x, k)
		shift := 0.0
		for c := 0; c < k; c++ {
			shift += ws.moved[c] * ws.moved[c]
		}
		if shift <= tol {
			// A last assignment pass against the final centres, as
			// scikit-learn ends, so labels and centres agree.
			for i := 0; i < n; i++ {
				ws.assign[i], _, _ = closestTwo(x.Row(i), ws.centres, k, p)
			}
			converged = true
			break
		}
		// Bounds after the move (Elkan 2003, steps 5 and 6): each lower
		// bound shrinks by its centre's movement, the upper bound grows by
		// its own centre's.
		for i := 0; i < n; i++ {
			l := lb[i*k : (i+1)*k]
			for c, m := range ws.moved {
				l[c] -= m
			}
			ws.upper[i] += ws.moved[ws.assign[i]]
		}
		// Centre-to-centre distances and s(c), half the distance from
		// each centre to its nearest other (Elkan 2003, step 1).
		for c := 0; c < k; c++ {
			ws.half[c] = math.Inf(1)
		}
		for c := 0; c < k; c++ {
			for e := c + 1; e < k; e++ {
				d := 0.5 * math.Sqrt(sqDist(ws.centres[c*p:(c+1)*p], ws.centres[e*p:(e+1)*p]))
				ws.cc[c*k+e], ws.cc[e*k+c] = d, d
				ws.half[c] = math.Min(ws.half[c], d)
				ws.half[e] = math.Min(ws.half[e], d)
			}
		}
		changed := 0
		for i := 0; i < n; i++ {
			a := ws.assign[i]
			u := ws.upper[i]
			if u <= ws.half[a] {
				continue // no other centre can be nearer (Elkan's lemma 1)
			}
			row, l := x.Row(i), lb[i*k:(i+1)*k]
			stale := true
			for c := 0; c < k; c++ {
				if c == a || u <= l[c] || u <= ws.cc[a*k+c] {
					continue
				}
				if stale {
					u = math.Sqrt(sqDist(row, ws.centres[a*p:(a+1)*p]))
					l[a] = u
					stale = false
					if u <= l[c] || u <= ws.cc[a*k+c] {
						continue
					}
				}
				d := math.Sqrt(sqDist(row, ws.centres[c*p:(c+1)*p]))
				l[c] = d
				if d < u {
					a, u = c, d
				}
			}
			ws.upper[i] = u
			if old := ws.assign[i]; a != old {
				ws.assign[i] = a
				changed++
				// running sums, so moving the centres costs O(k p)
				sa, sb := ws.sums[old*p:(old+1)*p], ws.sums[a*p:(a+1)*p]
				for j, v := range row {
					sa[j] -= v
					sb[j] += v
				}
				ws.counts[old]--
				ws.counts[a]++
			}
		}
		if changed == 0 {
			converged = true
			break
		}
	}
	if iter > MaxIterations {
		iter = MaxIterations
	}
	res := KMeansResult{K: k, Labels: append([]int(nil), ws.assign...), Iterations: iter, Converged: converged}
	// The centres are the means of the final assignment, summed afresh.
	ws.exactSums(x, k)
	ws.moveCentres(x, k)
	res.Centres = append([]float64(nil), ws.centres...)
	res.WithinSS = WithinSS(x, res.Labels, res.Centres)
	return res
}

// moveCentres sets every centre to the mean of its rows and records how
// far it moved. A centre left without rows is moved onto the row farthest
// from its own centre (as scikit-learn relocates empty clusters), and every
// bound is reset, so the next pass recomputes all distances.
func (ws *workspace) moveCentres(x *Matrix, k int) {
	n, p := x.N, x.P
	copy(ws.old, ws.centres)
	reset := false
	for c := 0; c < k; c++ {
		cc := ws.centres[c*p : (c+1)*p]
		if ws.counts[c] == 0 {
			far, fd := -1, -1.0
			for i := 0; i < n; i++ {
				a := ws.assign[i]
				if ws.counts[a] < 2 {
					continue
				}
				if d := sqDist(x.Row(i), ws.old[a*p:(a+1)*p]); d > fd {
					far, fd = i, d
				}
			}
			if far >= 0 {
				copy(cc, x.Row(far))
				ws.counts[ws.assign[far]]--
				ws.assign[far] = c
				ws.counts[c] = 1
				reset = true
			}
			continue
		}
		inv := 1 / float64(ws.counts[c])
		for j := range cc {
			cc[j] = ws.sums[c*p+j] * inv
		}
	}
	if reset {
		// recompute the means without the relocated rows
		ws.exactSums(x, k)
		for c := 0; c < k; c++ {
			if ws.counts[c] > 0 {
				for j := 0; j < p; j++ {
					ws.centres[c*p+j] = ws.sums[c*p+j] / float64(ws.counts[c])
				}
			}
		}
	}
	for c := 0; c < k; c++ {
		ws.moved[c] = math.Sqrt(sqDist(ws.centres[c*p:(c+1)*p], ws.old[c*p:(c+1)*p]))
		if reset {
			ws.moved[c] = math.Inf(1)
		}
	}
}

// exactSums recomputes every cluster's sum and count from the
// assignment.
func (ws *workspace) exactSums(x *Matrix, k int) {
	p := x.P
	clear(ws.sums)
	clear(ws.counts)
	for i := 0; i < x.N; i++ {
		a := ws.assign[i]
		ws.counts[a]++
		s := ws.sums[a*p : (a+1)*p]
		for j, v := range x.Row(i) {
			s[j] += v
		}
	}
}

// meanVariance is the mean over columns of the population variance.
func meanVariance(x *Matrix) float64 {
	tot := 0.0
	for j := 0; j < x.P; j++ {
		var s, ss float64
		for i := 0; i < x.N; i++ {
			v := x.Data[i*x.P+j]
			s += v
			ss += v * v
		}
		mu := s / float64(x.N)
		tot += ss/float64(x.N) - mu*mu
	}
	return tot / float64(x.P)
}

// WithinSS is the total within-cluster sum of squared distances of rows
// to their cluster's centre.
func WithinSS(x *Matrix, labels []int, centres []float64) float64 {
	var s float64
	for i := 0; i < x.N; i++ {
		a := labels[i]
		s += sqDist(x.Row(i), centres[a*x.P:(a+1)*x.P])
	}
	return s
}

// Centres returns the mean of each cluster's rows (K x P) and the sizes.
func Centres(x *Matrix, labels []int, k int) ([]float64, []int) {
	c := make([]float64, k*x.P)
	n := make([]int, k)
	for i := 0; i < x.N; i++ {
		a := labels[i]
		n[a]++
		for j, v := range x.Row(i) {
			c[a*x.P+j] += v
		}
	}
	for a := 0; a < k; a++ {
		if n[a] > 0 {
			for j := 0; j < x.P; j++ {
				c[a*x.P+j] /= float64(n[a])
			}
		}
	}
	return c, n
}
