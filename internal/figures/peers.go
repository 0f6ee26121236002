package figures

import (
	"fmt"
	"math"
	"runtime"
	"sort"
	"strings"
	"sync"
	"weak"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/peers"
)

// Peers is the data-driven peer grouping of the brief's peers: section:
// the clusters of the ranked population (computed once per dataset and
// spec, see clustersFor) and what concerns the focus.
type Peers struct {
	Spec *brief.PeersSpec
	Year int
	// Indicators are the profile's indicators, in the brief's order;
	// Weights their weights (1 unless the brief says otherwise).
	Indicators []dataset.Indicator
	Weights    []float64
	// Standardised says whether profiles were standardised (mean and
	// sample SD over the clustered institutions) or taken raw.
	Standardised bool
	*Clustering
	// FocusCluster is the focus's cluster (0-based), -1 when the focus was
	// not clustered (outside the ranked population or lacking a value).
	FocusCluster int
	// FocusCompanions is the share of bootstrap resamples in which the
	// focus stays with the same companions (NaN without resamples).
	FocusCompanions float64
	// Nearest are the focus's nearest profiles among the clustered.
	Nearest []ProfileNeighbour
}

// Clustering is what does not depend on the focus: shared by every pack
// a batch builds over one dataset.
type Clustering struct {
	// Rows are the register positions clustered, ascending: the ranked
	// population with a value of every indicator in the year.
	Rows []int
	// LeftOut counts the ranked institutions lacking a value.
	LeftOut int
	// Means and SDs of each indicator over Rows, in its own units.
	Means, SDs []float64
	Analysis   *peers.Analysis
	Clusters   []Cluster
	rowOf      []int // register position -> row, or -1
}

// Cluster describes one cluster.
type Cluster struct {
	// Number is 1-based: clusters are numbered largest first.
	Number int
	Size   int
	// Centroid is the members' mean of each indicator in its own units;
	// CentroidZ the same in standard deviations from the population mean
	// (unweighted), which is what the description reads.
	Centroid, CentroidZ []float64
	// Above and Below list indicator positions on which the cluster
	// stands furthest above and below the population, at least
	// DistinctZ apart, at most three each, furthest first.
	Above, Below []int
	// Name is generated from Above and Below; it is never typed in.
	Name string
	// Countries are the most frequent countries, largest first (at most
	// three), with their number of members.
	Countries []CountryCount
	// Typical is the register position of the member nearest the
	// centroid.
	Typical int
	// Silhouette is the members' mean silhouette width; Jaccard and
	// Recovered the bootstrap stability (NaN without resamples).
	Silhouette, Jaccard, Recovered float64
}

// CountryCount is a country and how many members come from it.
type CountryCount struct {
	Country string
	N       int
}

// ProfileNeighbour is one of the focus's nearest profiles.
type ProfileNeighbour struct {
	Institution int
	// Distance in the clustering's space (standardised and weighted).
	Distance float64
	// Differs lists the indicator positions on which it differs most from
	// the focus (two), with its values and the focus's.
	Differs []int
	Cluster int
}

// DistinctZ is how far (in standard deviations of the population) a
// cluster's centroid must stand from the population mean on an indicator
// for the description to name it: half a standard deviation (common
// practice, no source; Cohen's "medium" standardised difference is the
// same size, from memory).
const DistinctZ = 0.5

// peersFor computes (or takes from the cache) the clustering and adds the
// focus's part. Problems go to the resolver's list.
func (r *resolver) peersFor() *Peers {
	spec := r.b.Peers
	if spec == nil {
		return nil
	}
	pos := r.b.PosOf("peers")
	var inds []dataset.Indicator
	ok := true
	for _, key := range spec.Indicators {
		ind, found := r.d.Dictionary.Lookup(key)
		if !found {
			p := r.b.PosOf("peers.indicators")
			r.errAt(p, "%s", unknownIndicator(r.d, "peers", key))
			ok = false
			continue
		}
		inds = append(inds, ind)
	}
	if !ok {
		return nil
	}
	if r.d.YearIndex(spec.Year) < 0 {
		p := r.b.PosOf("peers.year")
		if _, set := r.b.Lines["peers.year"]; !set {
			p = pos
		}
		r.errAt(p, "peers: the data have no values for %d; choose a year the values files cover", spec.Year)
		return nil
	}
	weights := make([]float64, len(inds))
	for j, ind := range inds {
		weights[j] = 1
		if w, ok := spec.Weights[ind.Key]; ok {
			weights[j] = w
		}
	}
	cl, err := clustersFor(r.d, spec, inds, weights)
	if err != nil {
		r.errAt(pos, "peers: %v", err)
		return nil
	}
	pm := &Peers{Spec: spec, Year: spec.Year, Indicators: inds, Weights: weights, Standardised: spec.Standardise != "none", Clustering: cl, FocusCluster: -1, FocusCompanions: math.NaN()}
	if r.focus >= 0 && cl.rowOf[r.focus] >= 0 {
		fr := cl.rowOf[r.focus]
		a := cl.Analysis
		pm.FocusCluster = a.Labels[fr]
		if a.Stability != nil {
			pm.FocusCompanions = a.Stability.Companions(a.Labels, fr)
		}
		for _, nb := range peers.NearestProfiles(a.X, fr, spec.Nearest) {
			pm.Nearest = append(pm.Nearest, ProfileNeighbour{Institution: cl.Rows[nb.Row], Distance: nb.Distance, Differs: nb.Differs, Cluster: a.Labels[nb.Row]})
		}
	}
	return pm
}

// cacheKey identifies one clustering: the dataset (held weakly, so a
// dataset no longer used is not kept alive by the cache) and the spec.
type cacheKey struct {
	d    weak.Pointer[dataset.Dataset]
	spec string
}

type cacheEntry struct {
	once sync.Once
	cl   *Clustering
	err  error
}

var (
	cacheMu sync.Mutex
	cache   = map[cacheKey]*cacheEntry{}
)

// clustersFor clusters the ranked population once per dataset and spec:
// a batch refocusing one dataset for many institutions (build.Refocus)
// computes the clusters, the map and the stability once and shares them
// read-only; only the focus's part is computed per pack.
func clustersFor(d *dataset.Dataset, spec *brief.PeersSpec, inds []dataset.Indicator, weights []float64) (*Clustering, error) {
	key := cacheKey{weak.Make(d), spec.Fingerprint(spec.Year)}
	cacheMu.Lock()
	e, ok := cache[key]
	if !ok {
		e = &cacheEntry{}
		cache[key] = e
		runtime.AddCleanup(d, func(k cacheKey) {
			cacheMu.Lock()
			delete(cache, k)
			cacheMu.Unlock()
		}, key)
	}
	cacheMu.Unlock()
	e.once.Do(func() { e.cl, e.err = cluster(d, spec, inds, weights) })
	return e.cl, e.err
}

func cluster(d *dataset.Dataset, spec *brief.PeersSpec, inds []dataset.Indicator, weights []float64) (cl *Clustering, err error) {
	defer func() {
		if p := recover(); p != nil {
			cl, err = nil, fmt.Errorf("internal error while clustering (%v); please report it with the brief and data", p)
		}
	}()
	n := d.Register.Len()
	cols := make([][]float64, len(inds))
	for j, ind := range inds {
		cols[j] = d.Column(d.Dictionary.Index(ind.Key), spec.Year)
	}
	cl = &Clustering{rowOf: make([]int, n)}
	var data []float64
	for i := 0; i < n; i++ {
		cl.rowOf[i] = -1
		if !d.InPopulation(i) {
			continue
		}
		complete := true
		for j := range inds {
			if math.IsNaN(cols[j][i]) {
				complete = false
				break
			}
		}
		if !complete {
			cl.LeftOut++
			continue
		}
		cl.rowOf[i] = len(cl.Rows)
		cl.Rows = append(cl.Rows, i)
		for j := range inds {
			data = append(data, cols[j][i])
		}
	}
	raw, err := peers.NewMatrix(len(cl.Rows), len(inds), data)
	if err != nil {
		return nil, err
	}
	if raw.N < 3 {
		return nil, fmt.Errorf("only %d institutions of the ranked population have a value of every peers indicator in %d; clustering needs at least three (choose indicators more of them report)", raw.N, spec.Year)
	}
	z, means, sds := peers.Standardise(raw, weights)
	if spec.Standardise == "none" {
		z = peers.Weighted(raw, weights)
	}
	cl.Means, cl.SDs = means, sds
	a, err := peers.Analyse(z, peers.Options{K: spec.K.N, Method: spec.Method, Restarts: spec.Restarts, Seed: spec.SeedValue(), Resamples: spec.ResampleCount()})
	if err != nil {
		return nil, err
	}
	cl.Analysis = a
	cl.describe(d, raw, inds)
	return cl, nil
}

// describe fills each cluster's centroid, traits, countries, typical
// member, silhouette, stability and generated name.
func (cl *Clustering) describe(d *dataset.Dataset, raw *peers.Matrix, inds []dataset.Indicator) {
	a := cl.Analysis
	p := len(inds)
	cent, _ := peers.Centres(raw, a.Labels, a.K)
	for c := 0; c < a.K; c++ {
		k := Cluster{Number: c + 1, Size: a.Sizes[c], Centroid: cent[c*p : (c+1)*p], CentroidZ: make([]float64, p), Typical: cl.Rows[a.Typical[c]], Silhouette: a.Silhouette.ByCluster[c], Jaccard: math.NaN(), Recovered: math.NaN()}
		for j := 0; j < p; j++ {
			if cl.SDs[j] > 0 {
				k.CentroidZ[j] = (k.Centroid[j] - cl.Means[j]) / cl.SDs[j]
			}
		}
		order := make([]int, p)
		for j := range order {
			order[j] = j
		}
		sort.SliceStable(order, func(x, y int) bool { return k.CentroidZ[order[x]] > k.CentroidZ[order[y]] })
		for _, j := range order {
			if z := k.CentroidZ[j]; z >= DistinctZ && len(k.Above) < 3 {
				k.Above = append(k.Above, j)
			}
		}
		for i := p - 1; i >= 0; i-- {
			if j := order[i]; k.CentroidZ[j] <= -DistinctZ && len(k.Below) < 3 {
				k.Below = append(k.Below, j)
			}
		}
		if st := a.Stability; st != nil {
			k.Jaccard, k.Recovered = st.Jaccard[c], st.Recovered[c]
		}
		counts := map[string]int{}
		for r, l := range a.Labels {
			if l == c {
				counts[d.Register.Institutions[cl.Rows[r]].Country]++
			}
		}
		for country, nn := range counts {
			k.Countries = append(k.Countries, CountryCount{country, nn})
		}
		sort.Slice(k.Countries, func(x, y int) bool {
			if k.Countries[x].N != k.Countries[y].N {
				return k.Countries[x].N > k.Countries[y].N
			}
			return k.Countries[x].Country < k.Countries[y].Country
		})
		if len(k.Countries) > 3 {
			k.Countries = k.Countries[:3]
		}
		k.Name = clusterName(k, inds)
		cl.Clusters = append(cl.Clusters, k)
	}
	// Two clusters may earn the same name from the same leading traits:
	// the second and later carry their number, so names stay unique.
	seen := map[string]int{}
	for i := range cl.Clusters {
		seen[cl.Clusters[i].Name]++
	}
	for i := range cl.Clusters {
		if seen[cl.Clusters[i].Name] > 1 {
			cl.Clusters[i].Name += fmt.Sprintf(" (%d)", cl.Clusters[i].Number)
		}
	}
}

// traitLabel is the short form of an indicator for a generated name.
func traitLabel(ind dataset.Indicator) string {
	s := runningLabel(ind)
	if ind.Short != "" {
		s = strings.ToLower(ind.Short[:1]) + ind.Short[1:]
	}
	// A comma inside a trait would read as the name's own separator.
	return strings.ReplaceAll(s, ", ", " and ")
}

// clusterName generates a cluster's name from its leading traits: the
// indicator furthest above the population and the one furthest below
// ("High citation impact, low students per academic"); with traits on one
// side only, the first two of them; with none, a profile close to the
// population's. The words describe values, not merit: a high value of a
// lower-is-better indicator is still "high".
func clusterName(k Cluster, inds []dataset.Indicator) string {
	var parts []string
	switch {
	case len(k.Above) > 0 && len(k.Below) > 0:
		parts = []string{"high " + traitLabel(inds[k.Above[0]]), "low " + traitLabel(inds[k.Below[0]])}
	case len(k.Above) > 0:
		parts = []string{"high " + traitLabel(inds[k.Above[0]])}
		if len(k.Above) > 1 {
			parts[0] += " and " + traitLabel(inds[k.Above[1]])
		}
	case len(k.Below) > 0:
		parts = []string{"low " + traitLabel(inds[k.Below[0]])}
		if len(k.Below) > 1 {
			parts[0] += " and " + traitLabel(inds[k.Below[1]])
		}
	default:
		return "Close to the overall profile"
	}
	s := strings.Join(parts, ", ")
	return strings.ToUpper(s[:1]) + s[1:]
}

// ClusterOf returns the cluster (0-based) of a register position, or -1.
func (pm *Peers) ClusterOf(inst int) int {
	if pm == nil || inst < 0 || inst >= len(pm.rowOf) || pm.rowOf[inst] < 0 {
		return -1
	}
	return pm.Analysis.Labels[pm.rowOf[inst]]
}

// MapPoint returns a register position's coordinates on the first two
// principal components, and whether it was clustered.
func (pm *Peers) MapPoint(inst int) (x, y float64, ok bool) {
	if pm == nil || inst < 0 || inst >= len(pm.rowOf) || pm.rowOf[inst] < 0 {
		return 0, 0, false
	}
	r := pm.rowOf[inst]
	s := pm.Analysis.PCA.Scores
	return s[r*2], s[r*2+1], true
}

// Fragile reports whether a cluster's grouping should not be leaned on:
// a mean bootstrap Jaccard under peers.FragileJaccard (Hennig 2007, from
// memory), or, without resamples, a mean silhouette under 0.25, the
// level below which Kaufman and Rousseeuw (1990) find no substantial
// structure (from memory).
func (k Cluster) Fragile() bool {
	if !math.IsNaN(k.Jaccard) {
		return k.Jaccard < peers.FragileJaccard
	}
	return k.Silhouette < WeakSilhouette
}

// Silhouette levels of Kaufman and Rousseeuw (1990, Finding Groups in
// Data, from memory): above 0.5 a reasonable structure, 0.25 to 0.5 weak
// and possibly artificial, below 0.25 none substantial.
const (
	WeakSilhouette       = 0.25
	ReasonableSilhouette = 0.5
)

// cluster resolves a cluster: group.
func (r *resolver) clusterGroup(spec *brief.GroupSpec) []*Group {
	pm := r.pm
	if pm == nil {
		return nil // the peers: problem is already reported
	}
	c := spec.Cluster.N - 1
	if spec.Cluster.Focus {
		c = pm.FocusCluster
		if c < 0 {
			r.errAt(spec.Pos, "group %q: the focus %s was not clustered (it is outside the ranked population or lacks a value of a peers indicator in %d), so it has no cluster; use cluster: N or another group kind", spec.Name, r.b.Focus, pm.Year)
			return nil
		}
	} else if c >= pm.Analysis.K {
		r.errAt(spec.Pos, "group %q: cluster %d does not exist; the peers section found %d clusters (1 to %d, largest first)", spec.Name, c+1, pm.Analysis.K, pm.Analysis.K)
		return nil
	}
	g := newGroup(spec.Name, "cluster", r.d.Register.Len())
	k := pm.Clusters[c]
	g.Defined = fmt.Sprintf("cluster %d of %d, \u201c%s\u201d: institutions with similar profiles on %s in %d (%s)", k.Number, pm.Analysis.K, k.Name, peersIndicatorText(pm), pm.Year, methodText(pm))
	g.Cluster = k.Number
	for r2, l := range pm.Analysis.Labels {
		if l == c {
			g.add(pm.Rows[r2])
		}
	}
	g.sortMembers()
	return []*Group{g}
}

func peersIndicatorText(pm *Peers) string {
	labels := make([]string, len(pm.Indicators))
	for j, ind := range pm.Indicators {
		labels[j] = runningLabel(ind)
	}
	return listText(labels)
}

// methodText names the method as a definition reads it.
func methodText(pm *Peers) string {
	s := fmt.Sprintf("k-means with %d restarts", pm.Spec.Restarts)
	if pm.Spec.Method == peers.MethodWard {
		s = "Ward's hierarchical clustering"
	}
	if pm.Spec.K.Auto() {
		s += ", the number of clusters chosen by average silhouette width"
	}
	return s
}
