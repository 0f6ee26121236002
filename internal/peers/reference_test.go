package peers

import (
	"encoding/csv"
	"math"
	"os"
	"sort"
	"strconv"
	"testing"
)

// readRef reads a check,value reference file written by
// testdata/reference.R (R 4.2.2, cluster 2.1.4) or
// testdata/reference_sklearn.py (scikit-learn 1.2.1 from Debian).
func readRef(t *testing.T, file string) map[string]float64 {
	t.Helper()
	f, err := os.Open(file)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]float64{}
	for _, r := range recs[1:] {
		v, err := strconv.ParseFloat(r[1], 64)
		if err != nil {
			t.Fatal(err)
		}
		out[r[0]] = v
	}
	return out
}

// readMatrix reads a numeric CSV with a header, skipping the first skip
// columns.
func readMatrix(t *testing.T, file string, skip int) *Matrix {
	t.Helper()
	f, err := os.Open(file)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	p := len(recs[0]) - skip
	var data []float64
	for _, r := range recs[1:] {
		for _, c := range r[skip:] {
			v, err := strconv.ParseFloat(c, 64)
			if err != nil {
				t.Fatal(err)
			}
			data = append(data, v)
		}
	}
	m, err := NewMatrix(len(recs)-1, p, data)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

func near(a, b, tol float64) bool { return math.Abs(a-b) <= tol*math.Max(1, math.Abs(b)) }

func sizesDesc(labels []int, k int) []int {
	s := make([]int, k)
	for _, l := range labels {
		s[l]++
	}
	sort.Sort(sort.Reverse(sort.IntSlice(s)))
	return s
}

// Iris k-means: the best within-cluster sum of squares for k = 2, 3, 4 on
// the four raw measurements, against R's kmeans(nstart = 50) and
// scikit-learn's KMeans(n_init = 25); the two agree to 1e-12. The issue's
// five-digit values (78.85144, sizes 50/62/38; 152.34795; 57.22847) are
// the same numbers.
func TestIrisKMeansAgainstRAndScikitLearn(t *testing.T) {
	x := readMatrix(t, "testdata/iris.csv", 0)
	r := readRef(t, "testdata/reference_r.csv")
	sk := readRef(t, "testdata/reference_sklearn.csv")
	for _, k := range []int{2, 3, 4} {
		res := KMeans(x, k, 25, 11)
		wantR := r["iris_kmeans_k"+strconv.Itoa(k)+"_withinss"]
		wantSK := sk["iris_kmeans_k"+strconv.Itoa(k)+"_inertia"]
		if !near(res.WithinSS, wantR, 1e-9) || !near(res.WithinSS, wantSK, 1e-9) {
			t.Errorf("k = %d: within SS %.10f, R %.10f, scikit-learn %.10f", k, res.WithinSS, wantR, wantSK)
		}
		if !res.Converged {
			t.Errorf("k = %d: did not converge", k)
		}
		got := sizesDesc(res.Labels, k)
		for i, s := range got {
			want := r["iris_kmeans_k"+strconv.Itoa(k)+"_size"+strconv.Itoa(i+1)]
			if float64(s) != want {
				t.Errorf("k = %d: sizes %v, R's size %d is %v", k, got, i+1, want)
			}
		}
	}
	// The figures, from scikit-learn 1.2 (from the issue; the
	// files above reproduce them).
	if res := KMeans(x, 3, 25, 11); math.Abs(res.WithinSS-78.85144) > 5e-6 {
		t.Errorf("k = 3 within SS %.6f, want 78.85144", res.WithinSS)
	}
}

// Elkan's bounds only skip distance computations: from the same seeding
// a plain Lloyd run must end in the same assignment and sum of squares.
func TestBoundsMatchPlainLloyd(t *testing.T) {
	x := readMatrix(t, "testdata/iris.csv", 0)
	z, _, _ := Standardise(x, nil)
	for _, k := range []int{2, 3, 5, 8} {
		for start := 0; start < 6; start++ {
			ws := newWorkspace(z.N, k, z.P)
			got := ws.run(z, k, rngFor(3, k, start))
			ws2 := newWorkspace(z.N, k, z.P)
			ws2.seedPlusPlus(z, k, rngFor(3, k, start))
			want := plainLloyd(z, k, ws2.centres)
			for i := range want {
				if got.Labels[i] != want[i] {
					t.Fatalf("k = %d start %d: row %d in %d with bounds, %d with plain Lloyd", k, start, i, got.Labels[i], want[i])
				}
			}
		}
	}
}

// plainLloyd is the textbook algorithm (common practice, no source):
// assign each row to its nearest centre, move centres to the means, until
// nothing moves.
func plainLloyd(x *Matrix, k int, centres []float64) []int {
	c := append([]float64(nil), centres...)
	labels := make([]int, x.N)
	for i := range labels {
		labels[i] = -1
	}
	for it := 0; it < MaxIterations; it++ {
		changed := false
		for i := 0; i < x.N; i++ {
			b, _, _ := closestTwo(x.Row(i), c, k, x.P)
			if b != labels[i] {
				labels[i], changed = b, true
			}
		}
		if !changed {
			break
		}
		c, _ = Centres(x, labels, k)
	}
	return labels
}

// Silhouette of a fixed labelling of Iris against R's
// cluster::silhouette and scikit-learn's silhouette_samples.
func TestSilhouetteAgainstRAndScikitLearn(t *testing.T) {
	x := readMatrix(t, "testdata/iris.csv", 0)
	lab := readMatrix(t, "testdata/iris_k3_labels.csv", 0)
	labels := make([]int, x.N)
	for i := range labels {
		labels[i] = int(lab.Data[i]) - 1
	}
	r := readRef(t, "testdata/reference_r.csv")
	sk := readRef(t, "testdata/reference_sklearn.csv")
	s := SilhouetteOf(x, labels, 3, 0, 1)
	if s.Sampled {
		t.Fatal("150 rows should not be sampled")
	}
	if !near(s.Mean, r["iris_k3_silhouette_mean"], 1e-9) || !near(s.Mean, sk["iris_k3_silhouette_mean"], 1e-9) {
		t.Errorf("mean width %.12f, R %.12f", s.Mean, r["iris_k3_silhouette_mean"])
	}
	for c := 0; c < 3; c++ {
		want := r["iris_k3_silhouette_cluster"+strconv.Itoa(c+1)]
		if !near(s.ByCluster[c], want, 1e-9) {
			t.Errorf("cluster %d width %.12f, R %.12f", c+1, s.ByCluster[c], want)
		}
	}
	for _, row := range []int{1, 51, 78, 101, 150} {
		key := "iris_k3_silhouette_row" + strconv.Itoa(row)
		if got := s.Width[row-1]; !near(got, r[key], 1e-9) || !near(got, sk[key], 1e-9) {
			t.Errorf("row %d width %.12f, R %.12f, scikit-learn %.12f", row, got, r[key], sk[key])
		}
	}
}

// Principal components of the standardised USArrests against R's
// prcomp(USArrests, scale. = TRUE) and scikit-learn's PCA: component SDs
// and explained variance to 1e-9, loadings up to sign.
func TestPCAAgainstPrcomp(t *testing.T) {
	x := readMatrix(t, "testdata/usarrests.csv", 1)
	z, _, _ := Standardise(x, nil)
	pc, err := PrincipalComponents(z, 2)
	if err != nil {
		t.Fatal(err)
	}
	r := readRef(t, "testdata/reference_r.csv")
	sk := readRef(t, "testdata/reference_sklearn.csv")
	for c := 0; c < 4; c++ {
		ks := "usarrests_pc" + strconv.Itoa(c+1)
		if !near(pc.SD[c], r[ks+"_sdev"], 1e-9) || !near(pc.SD[c], sk[ks+"_sdev"], 1e-9) {
			t.Errorf("PC%d sd %.12f, R %.12f", c+1, pc.SD[c], r[ks+"_sdev"])
		}
		if !near(pc.Explained[c], r[ks+"_explained"], 1e-9) || !near(pc.Explained[c], sk[ks+"_explained"], 1e-9) {
			t.Errorf("PC%d explained %.12f, R %.12f", c+1, pc.Explained[c], r[ks+"_explained"])
		}
	}
	// From memory as well: prcomp's summary of USArrests gives 62.0 % and
	// 24.7 % for the first two components.
	if math.Round(pc.Explained[0]*1000) != 620 || math.Round(pc.Explained[1]*1000) != 247 {
		t.Errorf("explained %v", pc.Explained[:2])
	}
	for c := 0; c < 2; c++ {
		for j := 0; j < 4; j++ {
			want := r["usarrests_pc"+strconv.Itoa(c+1)+"_loading"+strconv.Itoa(j+1)+"_abs"]
			if got := math.Abs(pc.Loadings.At(j, c)); !near(got, want, 1e-9) {
				t.Errorf("PC%d loading %d: %.12f, R %.12f", c+1, j+1, got, want)
			}
		}
	}
	// Scores are the centred rows projected on the loadings: their SD is
	// the component's SD (common practice, no source).
	var s1, s2 float64
	for i := 0; i < z.N; i++ {
		v := pc.Scores[i*2]
		s1 += v
		s2 += v * v
	}
	sd := math.Sqrt((s2 - s1*s1/float64(z.N)) / float64(z.N-1))
	if !near(sd, pc.SD[0], 1e-9) {
		t.Errorf("score SD %.12f, component SD %.12f", sd, pc.SD[0])
	}
}

// Ward's merge heights on the standardised USArrests against R's
// hclust(dist(scale(USArrests)), method = "ward.D2"), all 49, and the
// cluster sizes of cutree at k = 2 and 4.
func TestWardAgainstHclust(t *testing.T) {
	x := readMatrix(t, "testdata/usarrests.csv", 1)
	z, _, _ := Standardise(x, nil)
	d, err := Ward(z)
	if err != nil {
		t.Fatal(err)
	}
	r := readRef(t, "testdata/reference_r.csv")
	if len(d.Merges) != 49 {
		t.Fatalf("%d merges, want 49", len(d.Merges))
	}
	for i, m := range d.Merges {
		want := r["usarrests_ward_height"+pad2(i+1)]
		if !near(m.Height, want, 1e-9) {
			t.Errorf("merge %d height %.12f, hclust %.12f", i+1, m.Height, want)
		}
	}
	if last := d.Merges[48]; last.Size != 50 {
		t.Errorf("last merge joins %d rows, want 50", last.Size)
	}
	for _, k := range []int{2, 4} {
		got := sizesDesc(d.Cut(k), k)
		for i, s := range got {
			want := r["usarrests_ward_k"+strconv.Itoa(k)+"_size"+strconv.Itoa(i+1)]
			if float64(s) != want {
				t.Errorf("cut at %d: sizes %v, cutree's size %d is %v", k, got, i+1, want)
			}
		}
	}
}

func pad2(i int) string {
	if i < 10 {
		return "0" + strconv.Itoa(i)
	}
	return strconv.Itoa(i)
}
