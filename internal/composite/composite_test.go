package composite

import (
	"bufio"
	"math"
	"math/rand/v2"
	"os"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// The sample of testdata/reference_scipy.py.
var scipySample = []float64{3.1, 4.7, 4.7, 5.2, 6.0, 6.8, 7.3, 8.8, 9.1, 10.4,
	11.0, 12.5, 13.9, 15.2, 18.7, 21.3, 26.0, 31.8, 44.1, 120.0}

func readReference(t *testing.T) map[string][]float64 {
	t.Helper()
	f, err := os.Open("testdata/reference_scipy.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	out := map[string][]float64{}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || strings.HasPrefix(line, "measure,") {
			continue
		}
		p := strings.Split(line, ",")
		v, err := strconv.ParseFloat(p[2], 64)
		if err != nil {
			t.Fatal(err)
		}
		out[p[0]] = append(out[p[0]], v)
	}
	return out
}

// Normalisations against SciPy 1.10.1 / NumPy 1.24.2 (Debian's
// python3-scipy; testdata/reference_scipy.py writes the file):
// scipy.stats.zscore(ddof=1), min-max by NumPy, percentileofscore(kind=
// "mean"), scipy.stats.norm.cdf of the z-scores, distance to np.median.
func TestNormalisationsAgainstSciPy(t *testing.T) {
	ref := readReference(t)
	x := append([]float64{math.NaN()}, scipySample...) // a missing value stays missing
	for _, m := range Methods {
		got := Normalise(x, m, nil)
		if !math.IsNaN(got[0]) {
			t.Errorf("%s: missing value normalised to %g", m, got[0])
		}
		want := ref[string(m)]
		if len(want) != len(scipySample) {
			t.Fatalf("%s: %d reference values", m, len(want))
		}
		for i, w := range want {
			if math.Abs(got[i+1]-w) > 1e-9*math.Max(1, math.Abs(w)) {
				t.Errorf("%s[%d] = %.12g, SciPy %.12g", m, i, got[i+1], w)
			}
		}
	}
}

// Skewness and excess kurtosis against scipy.stats.skew(bias=False) and
// kurtosis(fisher=True, bias=False), raw and logged (SciPy 1.10.1).
func TestSkewKurtosisAgainstSciPy(t *testing.T) {
	ref := readReference(t)
	logged := make([]float64, len(scipySample))
	for i, v := range scipySample {
		logged[i] = math.Log(v)
	}
	for _, c := range []struct {
		name string
		got  float64
	}{
		{"skewness", Skewness(scipySample)},
		{"kurtosis", Kurtosis(scipySample)},
		{"skewness_log", Skewness(logged)},
		{"kurtosis_log", Kurtosis(logged)},
	} {
		if w := ref[c.name][0]; math.Abs(c.got-w) > 1e-9 {
			t.Errorf("%s = %.12g, SciPy %.12g", c.name, c.got, w)
		}
	}
}

// The skew rule: the sample has skewness 3.44 and kurtosis 13.2 (SciPy), so
// it is treated; logged it falls to 0.89 and 1.04 (SciPy), below the
// thresholds. Winsorising stops as soon as the criterion fails.
func TestSkewTreatment(t *testing.T) {
	scored := make([]bool, len(scipySample))
	for i := range scored {
		scored[i] = true
	}
	x := slices.Clone(scipySample)
	info := treatSkew(x, scored, Skew{Treat: "log"}, nil)
	if !info.Skewed || info.Treated != "log" || math.Abs(x[0]-math.Log(3.1)) > 1e-15 {
		t.Fatalf("log: %+v, x[0] = %g", info, x[0])
	}
	x = slices.Clone(scipySample)
	info = treatSkew(x, scored, Skew{Treat: "winsorise", N: 5}, nil)
	if info.Treated != "winsorise" || info.Winsorised < 1 || info.Winsorised > 5 {
		t.Fatalf("winsorise: %+v", info)
	}
	// the far value 120 took the next value in, 44.1 (by hand)
	if x[19] != 44.1 && info.Winsorised == 1 {
		t.Errorf("winsorised top = %g, want 44.1", x[19])
	}
	if info.Winsorised < 5 && skewed(Skewness(x), Kurtosis(x)) {
		t.Errorf("stopped at %d values with the criterion still holding", info.Winsorised)
	}
	if info.Winsorised > 1 {
		y := slices.Clone(scipySample)
		treatSkew(y, scored, Skew{Treat: "winsorise", N: info.Winsorised - 1}, nil)
		if !skewed(Skewness(y), Kurtosis(y)) {
			t.Errorf("one value fewer already meets the criterion")
		}
	}
	x = slices.Clone(scipySample)
	info = treatSkew(x, scored, Skew{Treat: "none"}, nil)
	if !info.Skewed || info.Treated != "" || !slices.Equal(x, scipySample) {
		t.Errorf("none changed values or lost the diagnosis: %+v", info)
	}
}

// Human Development Index, Human Development Report 2020 (values for 2019),
// from memory: life expectancy, expected and mean years of schooling, GNI
// per capita (2017 PPP$) and the published HDI. Method of the report's
// technical notes (from memory): goalposts 20-85 years, 0-18 and 0-15
// years, ln(100)-ln(75,000); education the arithmetic mean of its two
// indices; HDI the geometric mean of the three dimension indices. The
// report prints its inputs rounded to one decimal, so values computed from
// them can differ from the published HDI by one unit in the third decimal;
// the tolerance is that unit.
func TestHumanDevelopmentIndex(t *testing.T) {
	cases := []struct {
		country           string
		le, eys, mys, gni float64
		hdi               float64
	}{
		{"Norway", 82.4, 18.1, 12.9, 66494, 0.957},
		{"Ireland", 82.3, 18.7, 12.7, 68371, 0.955},
		{"Switzerland", 83.8, 16.3, 13.4, 69394, 0.955},
		{"Germany", 81.3, 17.0, 14.2, 55314, 0.947},
		{"Australia", 83.4, 22.0, 12.7, 48085, 0.944},
		{"Niger", 62.4, 6.5, 2.1, 1201, 0.394},
	}
	mat := make([]float64, 0, 4*len(cases))
	for _, c := range cases {
		mat = append(mat,
			Rescale(c.le, 20, 85),
			Rescale(c.eys, 0, 18),
			Rescale(c.mys, 0, 15),
			Rescale(math.Log(c.gni), math.Log(100), math.Log(75000)))
	}
	pillar := []int{0, 1, 1, 2}
	indW := []float64{1, 0.5, 0.5, 1}
	pilW := []float64{1.0 / 3, 1.0 / 3, 1.0 / 3}
	overall := make([]float64, len(cases))
	aggregate(mat, 4, pillar, indW, pilW, true, overall, nil, make([]float64, 3), make([]float64, 3))
	for i, c := range cases {
		if math.Abs(overall[i]-c.hdi) > 0.001+1e-9 {
			t.Errorf("%s: HDI %.4f, published %.3f", c.country, overall[i], c.hdi)
		}
	}
	// Exact to three decimals where the rounding of the inputs does not
	// reach the third decimal.
	for _, i := range []int{0, 4, 5} {
		if got := math.Round(overall[i]*1000) / 1000; got != cases[i].hdi {
			t.Errorf("%s: HDI rounds to %.3f, published %.3f", cases[i].country, got, cases[i].hdi)
		}
	}
}

// Ranks: standard competition ranking, ties sharing the best rank
// ("1, 2, 2, 4"; common practice, no source), missing scores unranked.
func TestRanks(t *testing.T) {
	scores := []float64{5, 9, 7, 7, math.NaN(), 1}
	got := make([]int, len(scores))
	Ranks(scores, got, nil)
	if want := []int{4, 1, 2, 2, 0, 5}; !slices.Equal(got, want) {
		t.Errorf("ranks %v, want %v", got, want)
	}
}

// Quantiles of ranks: R's quantile(type = 1) on 1 1 2 3 3 3 4 5 9 10 gives
// 1, 3 and 10 at 0.05, 0.5 and 0.95 (Hyndman and Fan 1996, worked by hand
// from the definition x_(ceil(np))).
func TestHistQuantileType1(t *testing.T) {
	sample := []int{1, 1, 2, 3, 3, 3, 4, 5, 9, 10}
	counts := make([]int32, 10)
	for _, r := range sample {
		counts[r-1]++
	}
	for _, c := range []struct {
		p    float64
		want int
	}{{0.05, 1}, {0.1, 1}, {0.2, 1}, {0.21, 2}, {0.5, 3}, {0.95, 10}, {0.9, 9}} {
		if got := histQuantile(counts, len(sample), c.p); got != c.want {
			t.Errorf("p = %g: %d, want %d", c.p, got, c.want)
		}
	}
}

// fixture draws an invented population of n institutions on k indicators
// with a few missing values.
func fixture(n, k int, seed uint64) [][]float64 {
	rng := rand.New(rand.NewPCG(seed, 1))
	cols := make([][]float64, k)
	latent := make([]float64, n)
	for i := range latent {
		latent[i] = rng.NormFloat64()
	}
	for j := range cols {
		cols[j] = make([]float64, n)
		for i := range cols[j] {
			cols[j][i] = 50 + 10*(0.6*latent[i]+0.8*rng.NormFloat64())
			if rng.Float64() < 0.03 {
				cols[j][i] = math.NaN()
			}
		}
	}
	return cols
}

func fixtureSpec(k, pillars int) *Spec {
	s := &Spec{Normalise: ZScore, Impute: ImputeNone, MinShare: 0.6, Focus: 7}
	for q := 0; q < pillars; q++ {
		s.Pillars = append(s.Pillars, Pillar{Key: "p" + strconv.Itoa(q), Weight: float64(q + 1)})
	}
	for j := 0; j < k; j++ {
		s.Indicators = append(s.Indicators, Indicator{Key: "i" + strconv.Itoa(j), Pillar: j % pillars, Weight: 1 + float64(j%3), Lower: j%4 == 3})
	}
	return s
}

// With no perturbation every run is the base composite, so every interval
// collapses to the base rank (Saisana et al. 2005: the uncertainty comes
// only from the choices perturbed).
func TestZeroPerturbationCollapses(t *testing.T) {
	cols := fixture(120, 6, 3)
	s := fixtureSpec(6, 2)
	s.Runs = 50
	res, err := Compute(s, cols)
	if err != nil {
		t.Fatal(err)
	}
	for i := range res.Score {
		if !res.Scored[i] {
			continue
		}
		if res.RankLow[i] != res.Rank[i] || res.RankMedian[i] != res.Rank[i] || res.RankHigh[i] != res.Rank[i] {
			t.Fatalf("institution %d: base rank %d, interval %d..%d median %d", i, res.Rank[i], res.RankLow[i], res.RankHigh[i], res.RankMedian[i])
		}
	}
	if res.FocusRankVariance != 0 || len(res.Sensitivity) != 0 {
		t.Errorf("variance %g, sensitivity %v", res.FocusRankVariance, res.Sensitivity)
	}
}

// Monte Carlo is reproducible by seed, whatever the number of workers, and
// another seed draws other runs (common practice, no source).
func TestMonteCarloReproducible(t *testing.T) {
	cols := fixture(150, 8, 5)
	s := fixtureSpec(8, 3)
	s.Runs, s.WeightSpread, s.Seed = 400, 0.3, 7
	s.Normalisations = []Method{ZScore, MinMax, Percentile}
	s.Imputations = []Impute{ImputeNone, ImputeMedian}
	a, err := Compute(s, cols)
	if err != nil {
		t.Fatal(err)
	}
	prev := runtime.GOMAXPROCS(1)
	b, err := Compute(s, cols)
	runtime.GOMAXPROCS(prev)
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(a.RankLow, b.RankLow) || !slices.Equal(a.RankHigh, b.RankHigh) || !slices.Equal(a.RankMedian, b.RankMedian) {
		t.Fatal("same seed, different intervals")
	}
	if !slices.EqualFunc(a.Sensitivity, b.Sensitivity, func(x, y Factor) bool { return x == y }) {
		t.Fatal("same seed, different sensitivity")
	}
	s.Seed = 8
	c, err := Compute(s, cols)
	if err != nil {
		t.Fatal(err)
	}
	if slices.Equal(a.RankLow, c.RankLow) && slices.Equal(a.RankHigh, c.RankHigh) {
		t.Error("another seed gave the same intervals")
	}
	// The intervals hold the median, and most hold the base rank.
	holds := 0
	for i := range a.Rank {
		if !a.Scored[i] {
			continue
		}
		if a.RankLow[i] > a.RankMedian[i] || a.RankMedian[i] > a.RankHigh[i] {
			t.Fatalf("institution %d: %d..%d median %d", i, a.RankLow[i], a.RankHigh[i], a.RankMedian[i])
		}
		if a.RankLow[i] <= a.Rank[i] && a.Rank[i] <= a.RankHigh[i] {
			holds++
		}
	}
	if holds < a.NScored()*8/10 {
		t.Errorf("only %d of %d intervals hold the base rank", holds, a.NScored())
	}
}

// First-order indices on the Ishigami function f = sin x1 + a sin^2 x2 +
// b x3^4 sin x1, x uniform on [-pi, pi]^3, a = 7, b = 0.1 (Ishigami and
// Homma 1990): V1 = (1 + b pi^4/5)^2 / 2, V2 = a^2/8, V3 = 0 and the x1-x3
// interaction V13 = b^2 pi^8 (1/18 - 1/50), so S1 = 0.3139, S2 = 0.4424,
// S3 = 0 (Saltelli et al. 2008, Global Sensitivity Analysis: The Primer,
// from memory; the formulas below give the same).
func TestFirstOrderIshigami(t *testing.T) {
	const a, b = 7.0, 0.1
	pi4 := math.Pow(math.Pi, 4)
	pi8 := pi4 * pi4
	v1 := 0.5 * (1 + b*pi4/5) * (1 + b*pi4/5)
	v2 := a * a / 8
	v13 := b * b * pi8 * (1.0/18 - 1.0/50)
	v := v1 + v2 + v13
	want := []float64{v1 / v, v2 / v, 0}
	if math.Abs(want[0]-0.3139) > 5e-5 || math.Abs(want[1]-0.4424) > 5e-5 {
		t.Fatalf("analytic indices %v disagree with the Primer's 0.3139, 0.4424", want)
	}
	n := 40000
	rng := rand.New(rand.NewPCG(11, 13))
	x := make([][]float64, 3)
	for i := range x {
		x[i] = make([]float64, n)
	}
	y := make([]float64, n)
	for r := 0; r < n; r++ {
		for i := range x {
			x[i][r] = math.Pi * (2*rng.Float64() - 1)
		}
		s1 := math.Sin(x[0][r])
		s2 := math.Sin(x[1][r])
		y[r] = s1 + a*s2*s2 + b*math.Pow(x[2][r], 4)*s1
	}
	for i := range x {
		got := FirstOrder(x[i], y, 50)
		if math.Abs(got-want[i]) > 0.02 {
			t.Errorf("S%d = %.4f, analytic %.4f", i+1, got, want[i])
		}
	}
	// a two-level factor explaining a known share: y = level + noise with
	// equal variances gives S = 1/2 (common practice, no source)
	lv := make([]float64, n)
	z := make([]float64, n)
	for r := range z {
		if r%2 == 0 {
			lv[r] = 1
		}
		z[r] = 2*lv[r] + rng.NormFloat64()
	}
	if s := FirstOrderDiscrete(lv, z); math.Abs(s-0.5) > 0.02 {
		t.Errorf("discrete S = %.4f, want 0.5", s)
	}
}

// Headroom: the value found reaches the target rank, and one a hair less
// does not (common practice, no source: the definition itself).
func TestHeadroom(t *testing.T) {
	cols := fixture(80, 4, 9)
	s := fixtureSpec(4, 2)
	s.Normalise = Percentile
	res, err := Compute(s, cols)
	if err != nil {
		t.Fatal(err)
	}
	// an institution in the middle with every value present
	inst := -1
	for i, r := range res.Rank {
		if r > 30 && r < 50 && res.Missing(i) == 0 {
			inst = i
			break
		}
	}
	if inst < 0 {
		t.Fatal("no middle institution")
	}
	target := res.Rank[inst] - 5
	for j := range cols {
		h, ok := res.HeadroomOf(cols, inst, j, target)
		if !ok {
			t.Fatalf("indicator %d: no headroom", j)
		}
		if !h.Reachable {
			continue
		}
		if h.Rank > target {
			t.Errorf("indicator %d: reaches rank %d, target %d", j, h.Rank, target)
		}
		if s.Indicators[j].Lower != (h.Change < 0) {
			t.Errorf("indicator %d: change %g in the wrong direction", j, h.Change)
		}
		short := h.From + 0.999*h.Change
		rk := rankWith(t, s, cols, inst, j, short)
		if rk <= target {
			t.Errorf("indicator %d: 99.9%% of the change already reaches rank %d", j, rk)
		}
		if rk := rankWith(t, s, cols, inst, j, h.To); rk != h.Rank {
			t.Errorf("indicator %d: recomputed rank %d, headroom says %d", j, rk, h.Rank)
		}
	}
}

func rankWith(t *testing.T, s *Spec, cols [][]float64, inst, j int, v float64) int {
	t.Helper()
	c := slices.Clone(cols)
	c[j] = slices.Clone(cols[j])
	c[j][inst] = v
	res, err := Compute(s, c)
	if err != nil {
		t.Fatal(err)
	}
	return res.Rank[inst]
}

// Polarity: flipping an indicator's direction and negating its values
// gives the same composite (common practice, no source).
func TestPolarityFlip(t *testing.T) {
	cols := fixture(60, 4, 21)
	s := fixtureSpec(4, 2)
	for _, m := range Methods {
		s.Normalise = m
		a, err := Compute(s, cols)
		if err != nil {
			t.Fatal(m, err)
		}
		s2 := *s
		s2.Indicators = slices.Clone(s.Indicators)
		s2.Indicators[1].Lower = !s2.Indicators[1].Lower
		c2 := slices.Clone(cols)
		c2[1] = make([]float64, len(cols[1]))
		for i, v := range cols[1] {
			c2[1][i] = -v
		}
		if m == Distance {
			continue // a ratio to the median is not symmetric under negation of the median's sign
		}
		b, err := Compute(&s2, c2)
		if err != nil {
			t.Fatal(m, err)
		}
		if !slices.Equal(a.Rank, b.Rank) {
			t.Errorf("%s: ranks change when the polarity is written the other way", m)
		}
	}
}

// Problems for the author: geometric means with negative values, a pillar
// without indicators, weights that are not positive.
func TestValidate(t *testing.T) {
	s := fixtureSpec(4, 2)
	s.Geometric = true
	if err := s.Validate(); err == nil || !strings.Contains(err.Error(), "geometric aggregation needs positive values") {
		t.Errorf("geometric zscore: %v", err)
	}
	s = fixtureSpec(4, 3)
	s.Indicators = s.Indicators[:2]
	if err := s.Validate(); err == nil || !strings.Contains(err.Error(), "pillar p2 has no indicators") {
		t.Errorf("empty pillar: %v", err)
	}
	s = fixtureSpec(4, 2)
	s.Indicators[0].Weight = 0
	if err := s.Validate(); err == nil || !strings.Contains(err.Error(), "weight must be a positive number") {
		t.Errorf("zero weight: %v", err)
	}
}

// Imputation flags and the coverage rule: institutions under min_share are
// excluded; group-median fills every remaining gap and counts it.
func TestMissingRule(t *testing.T) {
	cols := [][]float64{
		{1, 2, math.NaN(), 4, math.NaN()},
		{5, math.NaN(), math.NaN(), 8, 9},
		{2, 3, 4, math.NaN(), 6},
	}
	s := &Spec{Normalise: MinMax, Impute: ImputeMedian, MinShare: 0.67, Focus: -1,
		Pillars:    []Pillar{{"a", 1}},
		Indicators: []Indicator{{"x", 0, 1, false}, {"y", 0, 1, false}, {"z", 0, 1, false}}}
	res, err := Compute(s, cols)
	if err != nil {
		t.Fatal(err)
	}
	// 2 of 3 = 0.667 is under 0.67: only institution 0, with all three, is scored
	if want := []bool{true, false, false, false, false}; !slices.Equal(res.Scored, want) {
		t.Errorf("scored %v, want %v", res.Scored, want)
	}
	s.MinShare = 0.6
	res, err = Compute(s, cols)
	if err != nil {
		t.Fatal(err)
	}
	if want := []int{0, 1, 0, 1, 1}; !slices.Equal(res.Imputed, want) || res.Excluded != 1 {
		t.Errorf("imputed %v excluded %d", res.Imputed, res.Excluded)
	}
}

// The radix sort agrees with the standard library's sort on random keys,
// keys sharing high bytes and duplicates (common practice, no source).
func TestRadixSort(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 300, 5000} {
		for _, mask := range []uint64{^uint64(0), 0xffff, 0x0f0f00} {
			a := make([]uint64, n)
			for i := range a {
				a[i] = 0xabcd000000000000 | rng.Uint64()&mask
			}
			want := slices.Clone(a)
			slices.Sort(want)
			radixSort(a, make([]uint64, n))
			if !slices.Equal(a, want) {
				t.Fatalf("n %d mask %x: radix sort differs", n, mask)
			}
		}
	}
}

// Ranks agree between the comparison and the radix paths: 300 scores with
// ties ranked by Ranks and by counting strictly higher scores.
func TestRanksLarge(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	scores := make([]float64, 300)
	for i := range scores {
		scores[i] = math.Round(rng.NormFloat64()*20) / 4
	}
	scores[7] = math.NaN()
	got := make([]int, len(scores))
	Ranks(scores, got, nil)
	for i, s := range scores {
		want := 0
		if !math.IsNaN(s) {
			want = 1
			for _, o := range scores {
				if o > s {
					want++
				}
			}
		}
		if got[i] != want {
			t.Fatalf("score %g: rank %d, want %d", s, got[i], want)
		}
	}
}
