package demo

import (
	"math"
	"sort"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// moments returns the sample mean and variance of n draws.
func moments(n int, draw func() float64) (mean, variance float64) {
	var sum, sum2 float64
	for i := 0; i < n; i++ {
		x := draw()
		sum += x
		sum2 += x * x
	}
	mean = sum / float64(n)
	return mean, (sum2 - float64(n)*mean*mean) / float64(n-1)
}

// The draws must follow their distributions, or the scenario's shapes
// (skew, bounds, over-dispersion) are not what the comments claim. Each
// check allows five standard errors of the sample mean.
func TestDrawMoments(t *testing.T) {
	const n = 200000
	cases := []struct {
		name     string
		draw     func(r *rng) float64
		mean, vr float64 // textbook values, from memory
	}{
		// Uniform(0,1): mean 1/2, variance 1/12.
		{"uniform", func(r *rng) float64 { return r.uniform() }, 0.5, 1.0 / 12},
		// Standard normal: mean 0, variance 1.
		{"normal", func(r *rng) float64 { return r.normal() }, 0, 1},
		// Gamma(k, 1): mean k, variance k; below 1 uses the boost.
		{"gamma 2.5", func(r *rng) float64 { return r.gamma(2.5) }, 2.5, 2.5},
		{"gamma 0.35", func(r *rng) float64 { return r.gamma(0.35) }, 0.35, 0.35},
		// Poisson(lambda): mean and variance lambda (Knuth's method below
		// 30, the normal approximation above).
		{"poisson 4", func(r *rng) float64 { return float64(r.poisson(4)) }, 4, 4},
		{"poisson 80", func(r *rng) float64 { return float64(r.poisson(80)) }, 80, 80},
		// Log-normal(mu, sigma): mean exp(mu + sigma^2/2), variance
		// (exp(sigma^2) - 1) exp(2 mu + sigma^2).
		{"lognormal 0 0.5", func(r *rng) float64 { return r.logNormal(0, 0.5) }, math.Exp(0.125), (math.Exp(0.25) - 1) * math.Exp(0.25)},
	}
	for i, c := range cases {
		r := stream(Seed, 100+uint64(i))
		m, v := moments(n, func() float64 { return c.draw(r) })
		se := math.Sqrt(c.vr / n)
		if math.Abs(m-c.mean) > 5*se {
			t.Errorf("%s: mean %.4f, want %.4f (±%.4f)", c.name, m, c.mean, 5*se)
		}
		if math.Abs(v-c.vr)/c.vr > 0.05 {
			t.Errorf("%s: variance %.4f, want %.4f", c.name, v, c.vr)
		}
	}
}

func TestIntnAndDrawIndexInRange(t *testing.T) {
	r := stream(Seed, 200)
	counts := make([]int, 3)
	for i := 0; i < 30000; i++ {
		k := r.intn(3)
		if k < 0 || k >= 3 {
			t.Fatalf("intn(3) = %d", k)
		}
		counts[drawIndex(r, []float64{1, 0, 3})]++
	}
	if counts[1] != 0 {
		t.Errorf("drawIndex chose an index of weight zero %d times", counts[1])
	}
	// Weights 1 : 3 give a quarter to the first (binomial SE 0.0025).
	if share := float64(counts[0]) / 30000; math.Abs(share-0.25) > 0.0125 {
		t.Errorf("drawIndex share %.3f, want 0.25", share)
	}
}

func TestProfilesAreDirichlet(t *testing.T) {
	r := stream(Seed, 300)
	// Dirichlet(alpha) has mean alpha_i / sum(alpha) (textbook, from
	// memory); a specialist's dominant subject has 12 / (12 + 5 x 0.35).
	const n = 20000
	var dom float64
	for i := 0; i < n; i++ {
		p := drawProfile(r, missionSpecialist, specHealth)
		sum := 0.0
		for _, x := range p {
			if x < 0 || x > 1 {
				t.Fatalf("profile share %v", x)
			}
			sum += x
		}
		if math.Abs(sum-1) > 1e-12 {
			t.Fatalf("profile sums to %v", sum)
		}
		dom += p[specField[specHealth]]
	}
	if want := 12 / (12 + 5*0.35); math.Abs(dom/n-want) > 0.005 {
		t.Errorf("dominant subject mean %.4f, want %.4f", dom/n, want)
	}
}

// ksStatistic is the Kolmogorov-Smirnov distance between the sample and a
// distribution function.
func ksStatistic(sample []float64, cdf func(float64) float64) float64 {
	s := append([]float64(nil), sample...)
	sort.Float64s(s)
	n := float64(len(s))
	d := 0.0
	for i, x := range s {
		f := cdf(x)
		d = math.Max(d, math.Max(float64(i+1)/n-f, f-float64(i)/n))
	}
	return d
}

// TestDrawsAgainstGonum compares whole distributions, not just moments,
// with gonum's distuv as the reference: the Kolmogorov-Smirnov distance
// must stay under the 1% critical value 1.63 / sqrt(n) (asymptotic
// Kolmogorov distribution, from memory).
func TestDrawsAgainstGonum(t *testing.T) {
	const n = 20000
	cases := []struct {
		name string
		draw func(r *rng) float64
		cdf  func(float64) float64
	}{
		{"normal", func(r *rng) float64 { return r.normal() }, distuv.UnitNormal.CDF},
		{"gamma 2.5", func(r *rng) float64 { return r.gamma(2.5) }, distuv.Gamma{Alpha: 2.5, Beta: 1}.CDF},
		{"gamma 0.35", func(r *rng) float64 { return r.gamma(0.35) }, distuv.Gamma{Alpha: 0.35, Beta: 1}.CDF},
		{"lognormal", func(r *rng) float64 { return r.logNormal(10.9, 0.35) }, distuv.LogNormal{Mu: 10.9, Sigma: 0.35}.CDF},
	}
	for i, c := range cases {
		r := stream(Seed, 400+uint64(i))
		sample := make([]float64, n)
		for j := range sample {
			sample[j] = c.draw(r)
		}
		if d, crit := ksStatistic(sample, c.cdf), 1.63/math.Sqrt(n); d > crit {
			t.Errorf("%s: Kolmogorov-Smirnov distance %.4f above the 1%% critical value %.4f", c.name, d, crit)
		}
	}
}
