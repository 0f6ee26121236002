package peers

import (
	"fmt"
	"math"
	"sort"
)

// MaxWardRows caps Ward's method: the nearest-neighbour chain needs
// O(n^2 p) time, about a second at this size on one core; above it k-means
// is the method to use.
const MaxWardRows = 6000

// Merge is one step of a dendrogram: clusters A and B (ids below n are
// rows; n + m is the cluster made by merge m) joined at Height.
type Merge struct {
	A, B   int
	Height float64
	Size   int
}

// Dendrogram is Ward's hierarchy, merges in increasing height.
type Dendrogram struct {
	N      int
	Merges []Merge
}

// Ward builds Ward's minimum-variance hierarchy (Ward 1963) on Euclidean
// distances, with heights on the scale of R's hclust(method = "ward.D2")
// (Murtagh and Legendre 2014): the Lance-Williams update for Ward on
// squared distances, d(k, i+j) = ((ni+nk) d(k,i) + (nj+nk) d(k,j) - nk
// d(i,j)) / (ni+nj+nk), is the same as 2 ni nj / (ni+nj) times the squared
// distance between the two clusters' centroids, which is what is computed
// here (O(n p) memory instead of an n x n table); a height is the square
// root. Merges are found with the nearest-neighbour chain (Murtagh 1983),
// exact for Ward because the method is reducible, then put in height
// order.
func Ward(x *Matrix) (*Dendrogram, error) {
	n, p := x.N, x.P
	if n > MaxWardRows {
		return nil, fmt.Errorf("the Ward method is limited to %d institutions (this population has %d); use method: kmeans", MaxWardRows, n)
	}
	if n < 2 {
		return &Dendrogram{N: n}, nil
	}
	cent := make([]float64, 2*n*p)
	copy(cent, x.Data)
	size := make([]int, 2*n)
	active := make([]bool, 2*n)
	for i := 0; i < n; i++ {
		size[i] = 1
		active[i] = true
	}
	dist := func(a, b int) float64 {
		na, nb := float64(size[a]), float64(size[b])
		return 2 * na * nb / (na + nb) * sqDist(cent[a*p:(a+1)*p], cent[b*p:(b+1)*p])
	}
	type made struct {
		m     Merge
		order int
	}
	var merges []made
	next := n
	chain := make([]int, 0, n)
	for len(merges) < n-1 {
		if len(chain) == 0 {
			for c := 0; c < next; c++ {
				if active[c] {
					chain = append(chain, c)
					break
				}
			}
		}
		a := chain[len(chain)-1]
		prev := -1
		if len(chain) >= 2 {
			prev = chain[len(chain)-2]
		}
		b, bd := -1, math.Inf(1)
		if prev >= 0 {
			b, bd = prev, dist(a, prev) // ties go to the previous link, so the chain ends
		}
		for c := 0; c < next; c++ {
			if !active[c] || c == a || c == prev {
				continue
			}
			if d := dist(a, c); d < bd {
				b, bd = c, d
			}
		}
		if b != prev {
			chain = append(chain, b)
			continue
		}
		chain = chain[:len(chain)-2]
		na, nb := float64(size[a]), float64(size[b])
		nc := cent[next*p : (next+1)*p]
		for j := 0; j < p; j++ {
			nc[j] = (na*cent[a*p+j] + nb*cent[b*p+j]) / (na + nb)
		}
		size[next] = size[a] + size[b]
		active[a], active[b], active[next] = false, false, true
		lo, hi := min(a, b), max(a, b)
		merges = append(merges, made{Merge{A: lo, B: hi, Height: math.Sqrt(bd), Size: size[next]}, next})
		next++
	}
	// Height order; a cluster is made before any merge that uses it, and
	// Ward's heights never decrease along the tree, so sorting by (height,
	// making order) keeps children before parents. Ids are renumbered to
	// the sorted order, as hclust numbers its merges.
	sort.SliceStable(merges, func(i, j int) bool {
		if merges[i].m.Height != merges[j].m.Height {
			return merges[i].m.Height < merges[j].m.Height
		}
		return merges[i].order < merges[j].order
	})
	renum := make([]int, 2*n)
	for i := 0; i < n; i++ {
		renum[i] = i
	}
	d := &Dendrogram{N: n, Merges: make([]Merge, len(merges))}
	for s, mm := range merges {
		renum[mm.order] = n + s
	}
	for s, mm := range merges {
		m := mm.m
		m.A, m.B = renum[m.A], renum[m.B]
		if m.A > m.B {
			m.A, m.B = m.B, m.A
		}
		d.Merges[s] = m
	}
	return d, nil
}

// Cut trims the dendrogram to k clusters (undoing its last k - 1 merges)
// and labels every row 0..k-1 in order of each cluster's first row.
func (d *Dendrogram) Cut(k int) []int {
	n := d.N
	parent := make([]int, n+len(d.Merges))
	for i := range parent {
		parent[i] = i
	}
	find := func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	upto := n - k
	if upto < 0 {
		upto = 0
	}
	for s := 0; s < upto && s < len(d.Merges); s++ {
		m := d.Merges[s]
		id := n + s
		parent[find(m.A)] = id
		parent[find(m.B)] = id
	}
	labels := make([]int, n)
	seen := map[int]int{}
	for i := 0; i < n; i++ {
		r := find(i)
		l, ok := seen[r]
		if !ok {
			l = len(seen)
			seen[r] = l
		}
		labels[i] = l
	}
	return labels
}
