package peers

import (
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"strconv"
	"testing"
)

// The silhouette curve on the raw Iris measurements: R's kmeans
// (nstart = 50) partitions scored with cluster::silhouette give 0.6810 at
// k = 2, 0.5528 at 3 and 0.4981 at 4, so k: auto picks 2 (the silhouette
// is known to prefer two groups on Iris; from memory as well).
func TestAutoKOnIris(t *testing.T) {
	x := readMatrix(t, "testdata/iris.csv", 0)
	r := readRef(t, "testdata/reference_r.csv")
	a, err := Analyse(x, Options{Restarts: 25, Seed: 11})
	if err != nil {
		t.Fatal(err)
	}
	if a.K != 2 {
		t.Errorf("k: auto chose %d, want 2", a.K)
	}
	for _, sc := range a.Curve[:3] {
		want := r["iris_kmeans_k"+strconv.Itoa(sc.K)+"_silhouette"]
		if !near(sc.Silhouette, want, 1e-9) {
			t.Errorf("k = %d: silhouette %.12f, R %.12f", sc.K, sc.Silhouette, want)
		}
		if w := r["iris_kmeans_k"+strconv.Itoa(sc.K)+"_withinss"]; !near(sc.WithinSS, w, 1e-9) {
			t.Errorf("k = %d: within SS %.10f, R %.10f", sc.K, sc.WithinSS, w)
		}
	}
	if len(a.Curve) != AutoKMax-AutoKMin+1 {
		t.Errorf("curve has %d points", len(a.Curve))
	}
	// numbered largest first: R's sizes at k = 2 are 97 and 53
	if a.Sizes[0] != 97 || a.Sizes[1] != 53 {
		t.Errorf("sizes %v, want [97 53]", a.Sizes)
	}
}

// Clusters are numbered largest first, ties by centroid, whatever order
// the algorithm found them in (common practice, no source).
func TestOrderLargestFirstTiesByCentroid(t *testing.T) {
	x, _ := NewMatrix(6, 1, []float64{5, 5.2, 1, 1.2, 9, 9.4})
	labels := []int{2, 2, 0, 0, 1, 1} // three pairs: tie on size
	got, c, n := Order(x, labels, 3)
	want := []int{1, 1, 0, 0, 2, 2}
	for i := range want {
		if got[i] != want[i] {
			t.Fatalf("labels %v, want %v", got, want)
		}
	}
	if n[0] != 2 || math.Abs(c[0]-1.1) > 1e-12 || math.Abs(c[2]-9.2) > 1e-12 {
		t.Errorf("centres %v sizes %v", c, n)
	}
	labels = []int{0, 0, 1, 1, 1, 1}
	got, _, n = Order(x, labels, 2)
	if got[0] != 1 || n[0] != 4 {
		t.Errorf("largest not first: %v %v", got, n)
	}
}

// blobs draws well-separated Gaussian clusters (common practice, no
// source: a standard synthetic check of clustering).
func blobs(n, p, k int, spread float64, seed uint64) *Matrix {
	rng := rand.New(rand.NewPCG(seed, 1))
	data := make([]float64, n*p)
	for i := 0; i < n; i++ {
		c := i % k
		for j := 0; j < p; j++ {
			centre := 0.0
			if j == c%p {
				centre = 10 * float64(1+c/p)
			}
			data[i*p+j] = centre + spread*rng.NormFloat64()
		}
	}
	return &Matrix{N: n, P: p, Data: data}
}

// Well-separated clusters come back whole under every resample (Jaccard
// 1, every institution keeps its companions); clusters cut out of one
// round cloud do not (Hennig 2007's point, from memory).
func TestStabilitySeparatedVersusOneCloud(t *testing.T) {
	x := blobs(300, 4, 3, 1, 7)
	a, err := Analyse(x, Options{K: 3, Restarts: 5, Seed: 3, Resamples: 20})
	if err != nil {
		t.Fatal(err)
	}
	for c, j := range a.Stability.Jaccard {
		if j < 0.99 || a.Stability.Recovered[c] != 1 {
			t.Errorf("separated cluster %d: Jaccard %.3f, recovered %.2f", c+1, j, a.Stability.Recovered[c])
		}
	}
	if s := a.Stability.Companions(a.Labels, 0); s != 1 {
		t.Errorf("row 0 keeps its companions in %.2f of resamples, want 1", s)
	}
	cloud := blobs(300, 4, 1, 1, 9)
	b, err := Analyse(cloud, Options{K: 6, Restarts: 5, Seed: 3, Resamples: 20})
	if err != nil {
		t.Fatal(err)
	}
	low := 0
	for _, j := range b.Stability.Jaccard {
		if j < StableJaccard {
			low++
		}
	}
	if low == 0 {
		t.Errorf("six clusters cut from one cloud all look stable: %v", b.Stability.Jaccard)
	}
	if b.Silhouette.Mean > 0.35 {
		t.Errorf("one cloud in six clusters has silhouette %.3f, want a weak structure", b.Silhouette.Mean)
	}
}

// Above the sample size the silhouette is estimated on a sample and says
// so; on well-separated clusters the estimate is close to the exact value
// (sampling, common practice, no source).
func TestSilhouetteSampled(t *testing.T) {
	x := blobs(1200, 3, 3, 2, 5)
	r := KMeans(x, 3, 3, 1)
	exact := SilhouetteOf(x, r.Labels, 3, 5000, 1)
	est := SilhouetteOf(x, r.Labels, 3, 400, 1)
	if exact.Sampled || !est.Sampled || len(est.Rows) != 400 {
		t.Fatalf("sampled flags %v %v, %d rows", exact.Sampled, est.Sampled, len(est.Rows))
	}
	if math.Abs(exact.Mean-est.Mean) > 0.03 {
		t.Errorf("sampled %.4f vs exact %.4f", est.Mean, exact.Mean)
	}
	again := SilhouetteOf(x, r.Labels, 3, 400, 1)
	if again.Mean != est.Mean {
		t.Error("the sample is not reproducible")
	}
}

// Nearest profiles by hand: the focus at the origin, rows at distances 1,
// 2 and 3, the indicators that differ most first (worked by hand).
func TestNearestProfiles(t *testing.T) {
	x, _ := NewMatrix(4, 3, []float64{
		0, 0, 0,
		0, 2, 0, // distance 2, differs on column 1
		3, 0, 0, // distance 3
		0.6, 0, -0.8, // distance 1, differs most on column 2 then 0
	})
	nb := NearestProfiles(x, 0, 2)
	if len(nb) != 2 || nb[0].Row != 3 || nb[1].Row != 1 {
		t.Fatalf("%+v", nb)
	}
	if math.Abs(nb[0].Distance-1) > 1e-12 || nb[0].Differs[0] != 2 || nb[0].Differs[1] != 0 {
		t.Errorf("%+v", nb[0])
	}
}

// Ward's method through Analyse: the same sizes as cutree on USArrests
// (R hclust ward.D2, reference_r.csv).
func TestAnalyseWard(t *testing.T) {
	x := readMatrix(t, "testdata/usarrests.csv", 1)
	z, _, _ := Standardise(x, nil)
	a, err := Analyse(z, Options{K: 4, Method: MethodWard, Seed: 1, Resamples: 10})
	if err != nil {
		t.Fatal(err)
	}
	r := readRef(t, "testdata/reference_r.csv")
	for i, s := range a.Sizes {
		if float64(s) != r["usarrests_ward_k4_size"+strconv.Itoa(i+1)] {
			t.Errorf("sizes %v", a.Sizes)
		}
	}
	if _, err := Ward(&Matrix{N: MaxWardRows + 1, P: 1, Data: make([]float64, MaxWardRows+1)}); err == nil {
		t.Error("Ward above its limit should say to use k-means")
	}
}

// Above StartSample the starts run on samples and the best is refined on
// all rows. On overlapping clusters (the benchmark's spread) the result
// must match running every start on all rows: a within-cluster sum of
// squares no more than 0.2 % above it (sample-then-refine, Bradley and
// Fayyad 1998, from memory; the tolerance is a judgement, common
// practice, no source: at k = 8 the two land on neighbouring local optima
// 0.1 % apart), and recover the generating clusters when they are
// separated.
func TestKMeansSampledStartsMatchFull(t *testing.T) {
	x := blobs(6000, 8, 5, 6, 42)
	z, _, _ := Standardise(x, nil)
	for _, k := range []int{3, 5, 8} {
		full := kmeans(z, k, 10, 11, 0)
		fast := kmeans(z, k, 10, 11, StartSample)
		if rel := (fast.WithinSS - full.WithinSS) / full.WithinSS; rel > 2e-3 {
			t.Errorf("k = %d: sampled starts %.4f, all-row starts %.4f (%.3f %% worse)", k, fast.WithinSS, full.WithinSS, 100*rel)
		}
		if !fast.Converged {
			t.Errorf("k = %d: refinement did not converge", k)
		}
		if got := WithinSS(z, fast.Labels, fast.Centres); math.Abs(got-fast.WithinSS) > 1e-9*got {
			t.Errorf("k = %d: reported %.6f, labels and centres give %.6f", k, fast.WithinSS, got)
		}
	}
	sep := blobs(6000, 4, 3, 1, 7)
	r := KMeans(sep, 3, 5, 1)
	for i := 3; i < sep.N; i++ {
		if r.Labels[i] != r.Labels[i%3] {
			t.Fatalf("row %d not with its generating cluster", i)
		}
	}
}

// The result does not depend on how many processors run the starts
// (common practice, no source: reproducible builds).
func TestKMeansIndependentOfProcessors(t *testing.T) {
	x := blobs(5000, 6, 4, 6, 3)
	prev := runtime.GOMAXPROCS(1)
	one := KMeans(x, 4, 8, 5)
	runtime.GOMAXPROCS(2)
	two := KMeans(x, 4, 8, 5)
	runtime.GOMAXPROCS(prev)
	if one.WithinSS != two.WithinSS || one.Restart != two.Restart || !slices.Equal(one.Labels, two.Labels) {
		t.Errorf("one processor: %.9f (start %d); two: %.9f (start %d)", one.WithinSS, one.Restart, two.WithinSS, two.Restart)
	}
}
