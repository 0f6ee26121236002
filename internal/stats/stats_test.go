package stats

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sort"
	"testing"

	"gonum.org/v1/gonum/stat"
)

func near(t *testing.T, name string, got, want, tol float64) {
	t.Helper()
	if math.IsNaN(want) != math.IsNaN(got) || math.Abs(got-want) > tol {
		t.Errorf("%s = %.17g, want %.17g (tolerance %g)", name, got, want, tol)
	}
}

func sorted(x []float64) []float64 {
	s := slices.Clone(x)
	sort.Float64s(s)
	return s
}

func TestQuantileType7OneToTen(t *testing.T) {
	// R: quantile(1:10) gives 3.25, 5.5, 7.75 for the quartiles (from memory).
	s := []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10}
	for _, c := range []struct{ p, want float64 }{{0.25, 3.25}, {0.5, 5.5}, {0.75, 7.75}, {0, 1}, {1, 10}} {
		near(t, fmt.Sprintf("type7 p=%g", c.p), Quantile(s, c.p, Type7), c.want, 1e-12)
	}
}

func TestQuantileType6NIST(t *testing.T) {
	// NIST/SEMATECH e-Handbook of Statistical Methods, section 7.2.6.2
	// "Percentiles": the 90th percentile of these 12 measurements is 95.1981
	// (from memory, printed to 4 decimals; R 4.2.2 quantile(type = 6) gives
	// 95.19807, in testdata/reference/sample200_r.csv).
	data := []float64{95.1772, 95.1567, 95.1937, 95.1959, 95.1442, 95.0610,
		95.1591, 95.1195, 95.1065, 95.0925, 95.1990, 95.1682}
	got := Quantile(sorted(data), 0.9, Type6)
	near(t, "NIST 90th percentile", got, 95.1981, 0.00005)
	near(t, "NIST 90th percentile against R", got, loadReference(t)["nist_quantile6_0.9"], 1e-9)
}

func TestHingesFivenum(t *testing.T) {
	// R: fivenum(1:10) = 1, 3, 5.5, 8, 10 and fivenum(1:9) = 1, 3, 5, 7, 9
	// (from memory).
	cases := []struct {
		n           int
		lo, med, hi float64
	}{{10, 3, 5.5, 8}, {9, 3, 5, 7}, {4, 1.5, 2.5, 3.5}, {5, 2, 3, 4}}
	for _, c := range cases {
		s := make([]float64, c.n)
		for i := range s {
			s[i] = float64(i + 1)
		}
		near(t, fmt.Sprintf("hinge low 1..%d", c.n), Quantile(s, 0.25, Hinges), c.lo, 0)
		near(t, fmt.Sprintf("median 1..%d", c.n), Quantile(s, 0.5, Hinges), c.med, 0)
		near(t, fmt.Sprintf("hinge high 1..%d", c.n), Quantile(s, 0.75, Hinges), c.hi, 0)
	}
}

func TestBoxLaneWomensTimes(t *testing.T) {
	// Lane, D. M. (ed.), Online Statistics Education: A Multimedia Course of
	// Study, Rice University, chapter "Graphing Distributions", section
	// "Box Plots", Tables 1 and 2: women's colour-naming times. Hinges 17
	// and 20, H-spread 3, step 4.5, adjacent values 14 and 24, one outside
	// value, 29. R's boxplot.stats() agrees (sample200_r.csv, lane_*).
	times := []float64{14, 17, 18, 19, 20, 21, 29, 15, 17, 18, 19, 20, 21, 16, 17, 18, 19, 20, 23,
		16, 17, 18, 20, 20, 24, 17, 18, 18, 20, 21, 24}
	for _, m := range []QuantileMethod{Hinges, Type7} {
		b := BoxOf(append(slices.Clone(times), math.NaN()), m)
		if b.N != 31 || b.Missing != 1 {
			t.Errorf("%v: n=%d missing=%d, want 31 and 1", m, b.N, b.Missing)
		}
		near(t, m.String()+" Q1", b.Q1, 17, 0)
		near(t, m.String()+" median", b.Median, 19, 0)
		near(t, m.String()+" Q3", b.Q3, 20, 0)
		near(t, m.String()+" IQR", b.IQR, 3, 0)
		near(t, m.String()+" lower whisker", b.WhiskerLow, 14, 0)
		near(t, m.String()+" upper whisker", b.WhiskerHigh, 24, 0)
		if !slices.Equal(b.OutlierValues, []float64{29}) {
			t.Errorf("%v: outliers %v, want [29]", m, b.OutlierValues)
		}
	}
	ref := loadReference(t)
	near(t, "R lower whisker", 14, ref["lane_whisker_low"], 0)
	near(t, "R upper whisker", 24, ref["lane_whisker_high"], 0)
}

func TestBoxEdgeCases(t *testing.T) {
	// Common practice, no source: an empty group has no statistics; a single
	// value is its own box.
	b := BoxOf([]float64{math.NaN(), math.NaN()}, Type7)
	if b.N != 0 || b.Missing != 2 || !math.IsNaN(b.Median) || !math.IsNaN(b.WhiskerLow) {
		t.Errorf("empty box: %+v", b)
	}
	b = BoxOf([]float64{4}, Type7)
	if b.Q1 != 4 || b.Q3 != 4 || b.WhiskerLow != 4 || b.WhiskerHigh != 4 || len(b.OutlierValues) != 0 {
		t.Errorf("single-value box: %+v", b)
	}
}

func TestMomentsAgainstGonum(t *testing.T) {
	// gonum/stat (Mean, StdDev with n-1, Correlation) as the reference
	// library; large offsets test the two-pass accuracy.
	rng := rand.New(rand.NewPCG(7, 11))
	for _, n := range []int{2, 3, 10, 257, 5000} {
		for _, off := range []float64{0, 1e6, -3e9} {
			x := make([]float64, n)
			y := make([]float64, n)
			for i := range x {
				x[i] = off + rng.NormFloat64()*3
				y[i] = 0.4*x[i] + rng.NormFloat64()
			}
			m, sd := MeanSD(x)
			tol := 1e-9 * math.Max(1, math.Abs(off))
			near(t, fmt.Sprintf("mean n=%d off=%g", n, off), m, stat.Mean(x, nil), tol)
			near(t, fmt.Sprintf("sd n=%d off=%g", n, off), sd, stat.StdDev(x, nil), 1e-6)
			near(t, fmt.Sprintf("pearson n=%d off=%g", n, off), Pearson(x, y), stat.Correlation(x, y, nil), 1e-9)
		}
	}
	if !math.IsNaN(SD([]float64{3})) || !math.IsNaN(Mean(nil)) {
		t.Error("SD of one value and mean of none must be NaN")
	}
	if !math.IsNaN(Pearson([]float64{1, 1, 1}, []float64{1, 2, 3})) {
		t.Error("Pearson with a constant variable must be NaN")
	}
}

func TestZ(t *testing.T) {
	// Definition: z = (v - mean) / sd (common practice, no source).
	near(t, "z", Z(13, 10, 2), 1.5, 0)
	if !math.IsNaN(Z(1, 1, 0)) || !math.IsNaN(Z(1, 1, math.NaN())) {
		t.Error("z with zero or undefined SD must be NaN")
	}
}

func TestSpearmanWorkedExample(t *testing.T) {
	// Wikipedia, "Spearman's rank correlation coefficient", Example: IQ
	// against hours of television a week for ten people, rho = -29/165 =
	// -0.175757... (from memory).
	iq := []float64{106, 100, 86, 101, 99, 103, 97, 113, 112, 110}
	tv := []float64{7, 27, 2, 50, 28, 29, 20, 12, 6, 17}
	near(t, "spearman", Spearman(iq, tv), -29.0/165, 1e-12)
}

func TestAverageRanks(t *testing.T) {
	// R: rank(c(10, 20, 20, 5, 20)) = 2, 4, 4, 1, 4 (ties.method "average",
	// from memory).
	got := AverageRanks([]float64{10, 20, 20, 5, 20})
	if !slices.Equal(got, []float64{2, 4, 4, 1, 4}) {
		t.Errorf("AverageRanks = %v", got)
	}
}

func TestPlaceCompetitionRanks(t *testing.T) {
	// Standard competition ranking: ties share the best rank, "1, 2, 2, 4"
	// (common practice, no source). Percentile rank = 100 x (below + ties/2)
	// / n, the value counted among its ties (SciPy percentileofscore
	// kind="mean" definition, from memory).
	vals := []float64{9, 7, 7, 3}
	s := sorted(vals)
	wantRank := []int{1, 2, 2, 4}
	wantPct := []float64{87.5, 50, 50, 12.5}
	for i, v := range vals {
		p := Place(s, v, HigherFirst, true)
		if p.Rank != wantRank[i] || p.Of != 4 || p.Percentile != wantPct[i] {
			t.Errorf("higher first, %g: rank %d of %d, pct %g; want %d of 4, %g", v, p.Rank, p.Of, p.Percentile, wantRank[i], wantPct[i])
		}
	}
	// Lower is better reverses both.
	p := Place(s, 3, LowerFirst, true)
	if p.Rank != 1 || p.Percentile != 87.5 {
		t.Errorf("lower first, 3: rank %d pct %g, want 1 and 87.5", p.Rank, p.Percentile)
	}
	p = Place(s, 7, LowerFirst, true)
	if p.Rank != 2 || p.Percentile != 50 {
		t.Errorf("lower first, 7: rank %d pct %g, want 2 and 50", p.Rank, p.Percentile)
	}
	// Placed among the group without belonging to it: counted once more.
	p = Place(s, 8, HigherFirst, false)
	if p.Rank != 2 || p.Of != 5 || p.Percentile != 70 {
		t.Errorf("outside, 8: rank %d of %d pct %g, want 2 of 5 and 70", p.Rank, p.Of, p.Percentile)
	}
	p = Place(s, 7, HigherFirst, false)
	if p.Rank != 2 || p.Of != 5 || p.Ties != 3 || p.Percentile != 50 {
		t.Errorf("outside, 7: %+v", p)
	}
}

func TestPlaceUnsortedAgreesWithPlace(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	x := make([]float64, 300)
	for i := range x {
		x[i] = float64(rng.IntN(40))
	}
	s := sorted(x)
	for _, dir := range []Direction{HigherFirst, LowerFirst} {
		for v := -1.0; v <= 41; v += 0.5 {
			for _, member := range []bool{true, false} {
				if member && !slices.Contains(s, v) {
					continue
				}
				a, b := Place(s, v, dir, member), PlaceUnsorted(append(slices.Clone(x), math.NaN()), v, dir, member)
				if a != b {
					t.Fatalf("v=%g dir=%d member=%v: sorted %+v, unsorted %+v", v, dir, member, a, b)
				}
			}
		}
	}
}

func TestQuartileOfBoundaries(t *testing.T) {
	// Boundary rule documented at QuartileOf (common practice, no source).
	cases := map[float64]int{100: 1, 75.01: 1, 75: 2, 50.5: 2, 50: 3, 25.01: 3, 25: 4, 0: 4}
	for p, want := range cases {
		if got := QuartileOf(p); got != want {
			t.Errorf("QuartileOf(%g) = %d, want %d", p, got, want)
		}
	}
	if QuartileOf(math.NaN()) != 0 {
		t.Error("QuartileOf(NaN) must be 0")
	}
}

func TestTrendMeasures(t *testing.T) {
	// Arithmetic by hand (common practice, no source): 100 -> 121 over two
	// years is +21, +21%, a compound 10% a year.
	near(t, "change", Change(100, 121), 21, 0)
	near(t, "change pct", ChangePct(100, 121), 21, 1e-12)
	// No percentage change from, across or below zero.
	for _, se := range [][2]float64{{-10, -5}, {-2, 3}, {4, -1}, {0, 3}} {
		if !math.IsNaN(ChangePct(se[0], se[1])) {
			t.Errorf("ChangePct(%v, %v) = %v, want NaN", se[0], se[1], ChangePct(se[0], se[1]))
		}
	}
	near(t, "change pct to zero", ChangePct(8, 0), -100, 1e-12)
	near(t, "cagr", CAGR(100, 121, 2), 10, 1e-12)
	if !math.IsNaN(CAGR(0, 5, 3)) || !math.IsNaN(CAGR(-1, 5, 3)) || !math.IsNaN(ChangePct(0, 3)) {
		t.Error("CAGR and change pct need a positive / non-zero start")
	}
	near(t, "slope", Slope([]float64{2021, 2022, 2023, 2025}, []float64{1, 3, 5, 9}), 2, 1e-12)
}

func TestSample200AgainstR(t *testing.T) {
	// Reference values from R 4.2.2 (Debian package r-base-core), computed
	// by testdata/reference/sample200.R; agreement to 1e-9.
	x, y := loadSample(t)
	ref := loadReference(t)
	want := func(name string) float64 {
		v, ok := ref[name]
		if !ok {
			t.Fatalf("reference value %q missing", name)
		}
		return v
	}
	sx := sorted(x)
	for _, p := range []float64{0, 0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95, 1} {
		near(t, fmt.Sprintf("type7 %g", p), Quantile(sx, p, Type7), want(fmt.Sprintf("quantile7_x_%g", p)), 1e-9)
		near(t, fmt.Sprintf("type6 %g", p), Quantile(sx, p, Type6), want(fmt.Sprintf("quantile6_x_%g", p)), 1e-9)
	}
	near(t, "fivenum min", sx[0], want("fivenum_x_min"), 0)
	near(t, "fivenum lower hinge", Quantile(sx, 0.25, Hinges), want("fivenum_x_lower_hinge"), 1e-9)
	near(t, "fivenum median", Quantile(sx, 0.5, Hinges), want("fivenum_x_median"), 1e-9)
	near(t, "fivenum upper hinge", Quantile(sx, 0.75, Hinges), want("fivenum_x_upper_hinge"), 1e-9)
	near(t, "fivenum max", sx[len(sx)-1], want("fivenum_x_max"), 0)
	s199 := sorted(x[:199])
	near(t, "fivenum(199) lower hinge", Quantile(s199, 0.25, Hinges), want("fivenum_x199_lower_hinge"), 1e-9)
	near(t, "fivenum(199) upper hinge", Quantile(s199, 0.75, Hinges), want("fivenum_x199_upper_hinge"), 1e-9)

	mx, sdx := MeanSD(x)
	my, sdy := MeanSD(y)
	near(t, "mean x", mx, want("mean_x"), 1e-9)
	near(t, "sd x", sdx, want("sd_x"), 1e-9)
	near(t, "mean y", my, want("mean_y"), 1e-9)
	near(t, "sd y", sdy, want("sd_y"), 1e-9)
	near(t, "pearson", Pearson(x, y), want("pearson_xy"), 1e-9)
	near(t, "spearman", Spearman(x, y), want("spearman_xy"), 1e-9)
	near(t, "slope", Slope(x, y), want("slope_y_on_x"), 1e-9)

	b := BoxOfSorted(sx, 0, Hinges)
	near(t, "box whisker low (boxplot.stats)", b.WhiskerLow, want("box_hinges_whisker_low"), 1e-9)
	near(t, "box whisker high (boxplot.stats)", b.WhiskerHigh, want("box_hinges_whisker_high"), 1e-9)
	near(t, "box outliers (boxplot.stats)", float64(len(b.OutlierValues)), want("box_hinges_n_out"), 0)

	for _, i := range []int{1, 2, 3, 17, 50, 99, 128, 200} {
		v := x[i-1]
		hi := Place(sx, v, HigherFirst, true)
		lo := Place(sx, v, LowerFirst, true)
		near(t, fmt.Sprintf("percentile higher %d", i), hi.Percentile, want(fmt.Sprintf("percentile_higher_%d", i)), 1e-9)
		near(t, fmt.Sprintf("percentile lower %d", i), lo.Percentile, want(fmt.Sprintf("percentile_lower_%d", i)), 1e-9)
		near(t, fmt.Sprintf("rank higher %d", i), float64(hi.Rank), want(fmt.Sprintf("rank_higher_%d", i)), 0)
		near(t, fmt.Sprintf("rank lower %d", i), float64(lo.Rank), want(fmt.Sprintf("rank_lower_%d", i)), 0)
	}
	for _, v := range []float64{50, 61.3, 10} {
		p := Place(sx, v, HigherFirst, false)
		near(t, fmt.Sprintf("outside percentile %g", v), p.Percentile, want(fmt.Sprintf("outside_percentile_higher_%g", v)), 1e-9)
		near(t, fmt.Sprintf("outside rank %g", v), float64(p.Rank), want(fmt.Sprintf("outside_rank_higher_%g", v)), 0)
	}
}

func TestWhiskerInsideTheBox(t *testing.T) {
	// Type 7 on 1, 2, 3, 100: Q3 = 3 + 0.25 x 97 = 27.25, IQR = 25.5, upper
	// fence 65.5, so the adjacent value is 3, inside the box; 100 is an
	// outlier (arithmetic by hand, Tukey's 1.5 x IQR rule).
	b := BoxOf([]float64{1, 2, 3, 100}, Type7)
	near(t, "Q3", b.Q3, 27.25, 1e-12)
	near(t, "upper whisker (adjacent value)", b.WhiskerHigh, 3, 0)
	if lo, hi := b.DrawnWhiskers(); lo != 1 || hi != 27.25 {
		t.Errorf("DrawnWhiskers = %v, %v; want 1 and 27.25", lo, hi)
	}
	if len(b.OutlierValues) != 1 || b.OutlierValues[0] != 100 {
		t.Errorf("outliers %v", b.OutlierValues)
	}
}

// Adjusted Fisher-Pearson skewness, worked by hand: 1, 2, 3, 4, 10 have
// mean 4, m2 = 50/5 = 10, m3 = 180/5 = 36, g1 = 36 / 10^1.5 and
// G1 = sqrt(5 x 4) / 3 x g1 = 1.2 x sqrt(2) (SciPy skew(bias=False) gives
// the same, from memory); symmetric data give 0; under three values or no
// spread, NaN.
func TestSkewness(t *testing.T) {
	if got, want := Skewness([]float64{1, 2, 3, 4, 10}), 1.2*math.Sqrt(2); math.Abs(got-want) > 1e-12 {
		t.Errorf("Skewness = %v, want %v", got, want)
	}
	if got := Skewness([]float64{1, 2, 3, 4, 5}); math.Abs(got) > 1e-12 {
		t.Errorf("symmetric: %v", got)
	}
	for _, x := range [][]float64{{1, 2}, {3, 3, 3}} {
		if got := Skewness(x); !math.IsNaN(got) {
			t.Errorf("Skewness(%v) = %v, want NaN", x, got)
		}
	}
}
