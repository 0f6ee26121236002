package peers

import (
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// PCA is a principal component analysis of a (centred) matrix.
type PCA struct {
	// SD is the standard deviation of each component (R prcomp's sdev),
	// largest first; Variance its square and Explained its share of the
	// total variance.
	SD, Variance, Explained []float64
	// Loadings is P x P, column c the unit direction of component c
	// (prcomp's rotation), signed so that its largest entry in absolute
	// value is positive (prcomp leaves the sign to LAPACK).
	Loadings *mat.Dense
	// Scores is N x Keep: each row's coordinates on the first components.
	Scores []float64
	Keep   int
}

// PrincipalComponents computes the components of x from the
// eigen-decomposition of its sample covariance matrix (n - 1 denominator,
// so SD matches R's prcomp, which uses the singular values of the centred
// matrix divided by sqrt(n - 1)); x is centred here, not scaled: pass a
// standardised matrix for prcomp(scale. = TRUE). Scores are kept for the
// first keep components.
func PrincipalComponents(x *Matrix, keep int) (*PCA, error) {
	n, p := x.N, x.P
	if n < 2 {
		return nil, fmt.Errorf("principal components need at least two rows, found %d", n)
	}
	if keep > p {
		keep = p
	}
	means := make([]float64, p)
	for i := 0; i < n; i++ {
		for j, v := range x.Row(i) {
			means[j] += v
		}
	}
	for j := range means {
		means[j] /= float64(n)
	}
	cov := mat.NewSymDense(p, nil)
	row := make([]float64, p)
	acc := make([]float64, p*p)
	for i := 0; i < n; i++ {
		for j, v := range x.Row(i) {
			row[j] = v - means[j]
		}
		for a := 0; a < p; a++ {
			ra := row[a]
			for b := a; b < p; b++ {
				acc[a*p+b] += ra * row[b]
			}
		}
	}
	for a := 0; a < p; a++ {
		for b := a; b < p; b++ {
			cov.SetSym(a, b, acc[a*p+b]/float64(n-1))
		}
	}
	var eig mat.EigenSym
	if !eig.Factorize(cov, true) {
		return nil, fmt.Errorf("the principal components could not be computed (eigen-decomposition failed)")
	}
	vals := eig.Values(nil)
	var vecs mat.Dense
	eig.VectorsTo(&vecs)
	order := make([]int, p)
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return vals[order[a]] > vals[order[b]] })
	out := &PCA{SD: make([]float64, p), Variance: make([]float64, p), Explained: make([]float64, p), Loadings: mat.NewDense(p, p, nil), Keep: keep}
	total := 0.0
	for _, v := range vals {
		total += math.Max(v, 0)
	}
	for c, src := range order {
		v := math.Max(vals[src], 0) // rounding can leave a tiny negative
		out.Variance[c] = v
		out.SD[c] = math.Sqrt(v)
		if total > 0 {
			out.Explained[c] = v / total
		}
		big, sign := 0.0, 1.0
		for j := 0; j < p; j++ {
			if a := math.Abs(vecs.At(j, src)); a > big+1e-12 {
				big, sign = a, math.Copysign(1, vecs.At(j, src))
			}
		}
		for j := 0; j < p; j++ {
			out.Loadings.Set(j, c, sign*vecs.At(j, src))
		}
	}
	out.Scores = make([]float64, n*keep)
	for i := 0; i < n; i++ {
		r := x.Row(i)
		for c := 0; c < keep; c++ {
			s := 0.0
			for j := 0; j < p; j++ {
				s += (r[j] - means[j]) * out.Loadings.At(j, c)
			}
			out.Scores[i*keep+c] = s
		}
	}
	return out, nil
}
