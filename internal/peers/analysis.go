package peers

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sort"
	"sync"
)

// Methods of clustering.
const (
	MethodKMeans = "kmeans"
	MethodWard   = "ward"
)

// Range of k tried when the brief says k: auto.
const (
	AutoKMin = 2
	AutoKMax = 12
)

// Options choose the method and its settings.
type Options struct {
	// K is the number of clusters; 0 chooses it by the largest average
	// silhouette width over AutoKMin..AutoKMax (Rousseeuw 1987).
	K      int
	Method string
	// Restarts of k-means (each from its own k-means++ seeding).
	Restarts int
	Seed     uint64
	// Resamples is the number of bootstrap resamples for stability; 0
	// leaves stability out.
	Resamples int
	// SilhouetteLimit overrides SilhouetteSample (tests).
	SilhouetteLimit int
}

// KScore is one point of the silhouette curve.
type KScore struct {
	K          int
	Silhouette float64
	WithinSS   float64
}

// Analysis is the clustering of one population.
type Analysis struct {
	Options Options
	X       *Matrix
	K       int
	// Labels are 0..K-1, numbered largest cluster first, ties broken by
	// the centroids compared coordinate by coordinate (smaller first), so
	// the numbering does not depend on the order of the starts or rows.
	Labels  []int
	Sizes   []int
	Centres []float64 // K x P, in the units of X
	// WithinSS is the total within-cluster sum of squares at K.
	WithinSS float64
	// Curve is the silhouette at every k tried (for a fixed k, at the
	// same range, so the reader sees whether the choice is supported).
	Curve      []KScore
	Silhouette Silhouette
	// Typical is each cluster's member nearest its centroid.
	Typical []int
	PCA     *PCA
	// Stability, when resamples were asked for.
	Stability *Stability
	// Converged is false when a k-means start stopped at MaxIterations.
	Converged bool
}

// Analyse clusters the rows of x (already standardised and weighted as
// the brief asks) and computes everything the pack reports about the
// clusters.
func Analyse(x *Matrix, o Options) (*Analysis, error) {
	if o.Method == "" {
		o.Method = MethodKMeans
	}
	if o.Restarts < 1 {
		o.Restarts = 1
	}
	if x.N < 3 {
		return nil, fmt.Errorf("clustering needs at least three institutions with every indicator, found %d", x.N)
	}
	kmax := min(AutoKMax, x.N-1)
	if o.K > x.N {
		return nil, fmt.Errorf("k = %d asks for more clusters than the %d institutions with every indicator", o.K, x.N)
	}
	a := &Analysis{Options: o, X: x, Converged: true}
	var dend *Dendrogram
	if o.Method == MethodWard {
		var err error
		if dend, err = Ward(x); err != nil {
			return nil, err
		}
	}
	cluster := func(k int) ([]int, bool) {
		if dend != nil {
			return dend.Cut(k), true
		}
		r := KMeans(x, k, o.Restarts, o.Seed)
		return r.Labels, r.Converged
	}
	// The values of k are independent: they run side by side, as many at
	// once as there are processors, each writing only its own slot, so
	// the curve is the same on any number of processors. This also keeps
	// both processors busy while one k refines its best start on all rows.
	nk := max(kmax-AutoKMin+1, 0)
	curve := make([]KScore, nk)
	labelsOf := make([][]int, nk)
	convOf := make([]bool, nk)
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < min(runtime.GOMAXPROCS(0), nk); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				k := AutoKMin + i
				labels, conv := cluster(k)
				c, _ := Centres(x, labels, k)
				s := SilhouetteOf(x, labels, k, o.SilhouetteLimit, o.Seed)
				curve[i] = KScore{K: k, Silhouette: s.Mean, WithinSS: WithinSS(x, labels, c)}
				labelsOf[i], convOf[i] = labels, conv
			}
		}()
	}
	for i := 0; i < nk; i++ {
		next <- i
	}
	close(next)
	wg.Wait()
	labelsAt := map[int][]int{}
	for i := 0; i < nk; i++ {
		a.Converged = a.Converged && convOf[i]
		a.Curve = append(a.Curve, curve[i])
		labelsAt[AutoKMin+i] = labelsOf[i]
	}
	k := o.K
	if k == 0 {
		best := 0
		for i, sc := range a.Curve {
			if sc.Silhouette > a.Curve[best].Silhouette {
				best = i
			}
		}
		k = a.Curve[best].K
	}
	labels, ok := labelsAt[k]
	if !ok {
		var conv bool
		labels, conv = cluster(k)
		a.Converged = a.Converged && conv
	}
	a.K = k
	a.Labels, a.Centres, a.Sizes = Order(x, labels, k)
	a.WithinSS = WithinSS(x, a.Labels, a.Centres)
	a.Silhouette = SilhouetteOf(x, a.Labels, k, o.SilhouetteLimit, o.Seed)
	a.Typical = typical(x, a.Labels, a.Centres, k)
	pc, err := PrincipalComponents(x, 2)
	if err != nil {
		return nil, err
	}
	a.PCA = pc
	if o.Resamples > 0 {
		a.Stability = stability(x, a, o, dend != nil)
	}
	return a, nil
}

// Order renumbers clusters largest first, ties by centroid (compared
// coordinate by coordinate, smaller first), and returns the new labels,
// centroids and sizes.
func Order(x *Matrix, labels []int, k int) ([]int, []float64, []int) {
	c, n := Centres(x, labels, k)
	idx := make([]int, k)
	for i := range idx {
		idx[i] = i
	}
	p := x.P
	sort.SliceStable(idx, func(a, b int) bool {
		ia, ib := idx[a], idx[b]
		if n[ia] != n[ib] {
			return n[ia] > n[ib]
		}
		for j := 0; j < p; j++ {
			if va, vb := c[ia*p+j], c[ib*p+j]; va != vb {
				return va < vb
			}
		}
		return ia < ib
	})
	newOf := make([]int, k)
	for newL, old := range idx {
		newOf[old] = newL
	}
	out := make([]int, len(labels))
	for i, l := range labels {
		out[i] = newOf[l]
	}
	cc := make([]float64, k*p)
	nn := make([]int, k)
	for newL, old := range idx {
		copy(cc[newL*p:(newL+1)*p], c[old*p:(old+1)*p])
		nn[newL] = n[old]
	}
	return out, cc, nn
}

// typical finds each cluster's member nearest its centroid (ties: the
// earlier row), the member that best stands for the cluster.
func typical(x *Matrix, labels []int, centres []float64, k int) []int {
	best := make([]int, k)
	bd := make([]float64, k)
	for c := range best {
		best[c], bd[c] = -1, math.Inf(1)
	}
	for i := 0; i < x.N; i++ {
		l := labels[i]
		if d := sqDist(x.Row(i), centres[l*x.P:(l+1)*x.P]); d < bd[l] {
			best[l], bd[l] = i, d
		}
	}
	return best
}

// Stability is how well each cluster survives resampling (Hennig 2007,
// "Cluster-wise assessment of cluster stability", Computational
// Statistics and Data Analysis 52: the clusterwise Jaccard bootstrap, from
// memory): the method is run again on a bootstrap resample of the rows,
// every row is then given the resample's cluster with the nearest
// centroid, and each original cluster is matched with the resample
// cluster most like it by the Jaccard coefficient |A and B| / |A or B|.
type Stability struct {
	Resamples int
	// Jaccard is each cluster's mean best Jaccard over the resamples;
	// Recovered the share of resamples in which it was found again
	// (best Jaccard at least StableJaccard).
	Jaccard, Recovered []float64
	// labels[b] are every row's labels under resample b.
	labels [][]int
}

// Jaccard thresholds after Hennig (2007, from memory): a cluster whose
// mean Jaccard is under 0.6 should not be trusted, one above 0.75 is
// stable.
const (
	StableJaccard  = 0.75
	FragileJaccard = 0.6
)

// stabilityRestarts caps k-means starts per resample: the resamples vary
// the data, and many starts would only spend time.
const stabilityRestarts = 5

func stability(x *Matrix, a *Analysis, o Options, ward bool) *Stability {
	B := o.Resamples
	st := &Stability{Resamples: B, Jaccard: make([]float64, a.K), Recovered: make([]float64, a.K), labels: make([][]int, B)}
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for b := range next {
				st.labels[b] = resampleLabels(x, a.K, o, b, ward)
			}
		}()
	}
	for b := 0; b < B; b++ {
		next <- b
	}
	close(next)
	wg.Wait()
	hits := make([]int, a.K)
	for b := 0; b < B; b++ {
		best := bestJaccard(a.Labels, st.labels[b], a.K)
		for c := 0; c < a.K; c++ {
			st.Jaccard[c] += best[c]
			if best[c] >= StableJaccard {
				hits[c]++
			}
		}
	}
	for c := 0; c < a.K; c++ {
		st.Jaccard[c] /= float64(B)
		st.Recovered[c] = float64(hits[c]) / float64(B)
	}
	return st
}

// resampleLabels clusters bootstrap resample b and labels every row by
// the nearest centroid of the resample's clusters.
func resampleLabels(x *Matrix, k int, o Options, b int, ward bool) []int {
	rng := rand.New(rand.NewPCG(o.Seed, 0xb007<<32|uint64(b)))
	n, p := x.N, x.P
	rs := &Matrix{N: n, P: p, Data: make([]float64, n*p)}
	for i := 0; i < n; i++ {
		copy(rs.Row(i), x.Row(rng.IntN(n)))
	}
	var labels []int
	if ward {
		d, err := Ward(rs)
		if err != nil {
			return make([]int, n)
		}
		labels = d.Cut(k)
	} else {
		labels = KMeans(rs, k, min(o.Restarts, stabilityRestarts), o.Seed^uint64(b+1)).Labels
	}
	c, _ := Centres(rs, labels, k)
	out := make([]int, n)
	for i := 0; i < n; i++ {
		out[i], _, _ = closestTwo(x.Row(i), c, k, p)
	}
	return out
}

// bestJaccard returns, for each cluster of a, the largest Jaccard
// coefficient with any cluster of b.
func bestJaccard(a, b []int, k int) []float64 {
	inter := make([]int, k*k)
	na := make([]int, k)
	nb := make([]int, k)
	for i := range a {
		inter[a[i]*k+b[i]]++
		na[a[i]]++
		nb[b[i]]++
	}
	out := make([]float64, k)
	for c := 0; c < k; c++ {
		for d := 0; d < k; d++ {
			if u := na[c] + nb[d] - inter[c*k+d]; u > 0 {
				out[c] = math.Max(out[c], float64(inter[c*k+d])/float64(u))
			}
		}
	}
	return out
}

// Companions is the share of resamples in which row i stays with the
// same companions: the Jaccard coefficient between its own cluster and
// the cluster it falls in under the resample is at least StableJaccard.
func (st *Stability) Companions(labels []int, i int) float64 {
	if st == nil || st.Resamples == 0 {
		return math.NaN()
	}
	hits := 0
	for _, lb := range st.labels {
		inter, na, nb := 0, 0, 0
		for j := range labels {
			inA, inB := labels[j] == labels[i], lb[j] == lb[i]
			if inA {
				na++
			}
			if inB {
				nb++
			}
			if inA && inB {
				inter++
			}
		}
		if u := na + nb - inter; u > 0 && float64(inter)/float64(u) >= StableJaccard {
			hits++
		}
	}
	return float64(hits) / float64(st.Resamples)
}

// Neighbour is one nearest profile with the indicators on which it
// differs most.
type Neighbour struct {
	Row      int
	Distance float64
	// Differs lists column indices by the absolute difference from the
	// focus row, largest first (at most two).
	Differs []int
}

// NearestProfiles returns the count rows nearest row focus in x
// (Euclidean distance; ties by row), each with the two columns on which it
// differs most.
func NearestProfiles(x *Matrix, focus, count int) []Neighbour {
	type cand struct {
		row int
		d   float64
	}
	f := x.Row(focus)
	cands := make([]cand, 0, x.N)
	for i := 0; i < x.N; i++ {
		if i != focus {
			cands = append(cands, cand{i, sqDist(x.Row(i), f)})
		}
	}
	sort.Slice(cands, func(a, b int) bool {
		if cands[a].d != cands[b].d {
			return cands[a].d < cands[b].d
		}
		return cands[a].row < cands[b].row
	})
	if len(cands) > count {
		cands = cands[:count]
	}
	out := make([]Neighbour, len(cands))
	for i, c := range cands {
		r := x.Row(c.row)
		cols := make([]int, x.P)
		for j := range cols {
			cols[j] = j
		}
		sort.SliceStable(cols, func(a, b int) bool {
			return math.Abs(r[cols[a]]-f[cols[a]]) > math.Abs(r[cols[b]]-f[cols[b]])
		})
		out[i] = Neighbour{Row: c.row, Distance: math.Sqrt(c.d), Differs: cols[:min(2, len(cols))]}
	}
	return out
}
