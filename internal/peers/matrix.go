// Package peers finds data-driven peer groups: k-means (k-means++ seeding,
// restarts, Elkan's bounds) or Ward's hierarchical clustering over
// standardised indicator profiles, the number of groups chosen by average
// silhouette width, a principal-component map of the sector, bootstrap
// stability of each group and the nearest profiles to one institution.
//
// The package works on plain matrices: it knows nothing of briefs,
// dictionaries or registers, so every method can be checked against
// reference libraries on published data (testdata/iris.csv,
// testdata/usarrests.csv). The figures model builds the matrix and turns
// the results into figures.
package peers

import (
	"fmt"
	"math"

	"peerpack/internal/stats"
)

// Matrix is n rows (institutions) by p columns (indicators), row-major.
type Matrix struct {
	N, P int
	Data []float64
}

// NewMatrix wraps row-major data.
func NewMatrix(n, p int, data []float64) (*Matrix, error) {
	if n < 0 || p < 1 || len(data) != n*p {
		return nil, fmt.Errorf("matrix of %d x %d needs %d values, got %d", n, p, n*p, len(data))
	}
	return &Matrix{N: n, P: p, Data: data}, nil
}

// Row returns row i (shared with the matrix).
func (x *Matrix) Row(i int) []float64 { return x.Data[i*x.P : (i+1)*x.P] }

// Standardise returns a copy of x with each column centred on its mean and
// divided by its sample standard deviation (n - 1 denominator, as R's
// scale() and prcomp(scale. = TRUE); stats.MeanSD), then multiplied by the column's
// weight. A column with no spread becomes zero: it cannot separate
// anyone. Means and SDs are returned so centroids can be read back in the
// indicators' own units.
func Standardise(x *Matrix, weights []float64) (z *Matrix, means, sds []float64) {
	means = make([]float64, x.P)
	sds = make([]float64, x.P)
	col := make([]float64, x.N)
	for j := 0; j < x.P; j++ {
		for i := 0; i < x.N; i++ {
			col[i] = x.Data[i*x.P+j]
		}
		// The one definition of mean and sample SD, shared with the
		// nearest-peer groups of the figures model.
		means[j], sds[j] = stats.MeanSD(col)
		if math.IsNaN(sds[j]) {
			sds[j] = 0
		}
	}
	z = &Matrix{N: x.N, P: x.P, Data: make([]float64, len(x.Data))}
	for i := 0; i < x.N; i++ {
		for j := 0; j < x.P; j++ {
			if sds[j] > 0 {
				w := 1.0
				if weights != nil {
					w = weights[j]
				}
				z.Data[i*x.P+j] = (x.Data[i*x.P+j] - means[j]) / sds[j] * w
			}
		}
	}
	return z, means, sds
}

// Weighted returns a copy of x with each column multiplied by its weight
// (raw values, no standardisation).
func Weighted(x *Matrix, weights []float64) *Matrix {
	z := &Matrix{N: x.N, P: x.P, Data: append([]float64(nil), x.Data...)}
	if weights == nil {
		return z
	}
	for i := 0; i < x.N; i++ {
		for j := 0; j < x.P; j++ {
			z.Data[i*x.P+j] *= weights[j]
		}
	}
	return z
}

// sqDist is the squared Euclidean distance between two rows, summed in
// four running sums so the loop keeps four independent additions in
// flight (the k-means benchmark spends most of its time here).
func sqDist(a, b []float64) float64 {
	b = b[:len(a)]
	var s0, s1, s2, s3 float64
	i := 0
	for ; i+4 <= len(a); i += 4 {
		d0, d1, d2, d3 := a[i]-b[i], a[i+1]-b[i+1], a[i+2]-b[i+2], a[i+3]-b[i+3]
		s0 += d0 * d0
		s1 += d1 * d1
		s2 += d2 * d2
		s3 += d3 * d3
	}
	for ; i < len(a); i++ {
		d := a[i] - b[i]
		s0 += d * d
	}
	return (s0 + s1) + (s2 + s3)
}
