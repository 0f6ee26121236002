package demo

import (
	"math"
	"math/rand/v2"
)

// rng wraps a PCG stream with the few draws the scenario needs. The
// conversions from raw 64-bit output are written here so that the numbers
// depend only on the PCG sequence, which math/rand/v2 specifies (O'Neill
// 2014, PCG-DXSM as in NumPy), and not on library conveniences that a
// later Go release could reimplement.
type rng struct {
	src *rand.PCG
}

// stream returns an independent generator for one part of the scenario, so
// that adding draws to one part (say, more survey votes) leaves every other
// file unchanged.
func stream(seed uint64, part uint64) *rng {
	return &rng{src: rand.NewPCG(seed, 0x9e3779b97f4a7c15^part)}
}

// uniform returns a draw in [0, 1) with 53 random bits.
func (r *rng) uniform() float64 {
	return float64(r.src.Uint64()>>11) / (1 << 53)
}

// intn returns a draw in [0, n) for n > 0 (modulo bias is below 2^-50 for
// the small n used here).
func (r *rng) intn(n int) int {
	return int(r.src.Uint64() % uint64(n))
}

// normal returns a standard normal draw by the Box-Muller transform (Box and
// Muller 1958), using one pair of uniforms per call for simplicity.
func (r *rng) normal() float64 {
	u1 := r.uniform()
	for u1 == 0 {
		u1 = r.uniform()
	}
	u2 := r.uniform()
	return math.Sqrt(-2*math.Log(u1)) * math.Cos(2*math.Pi*u2)
}

// logNormal returns exp(mu + sigma*Z): the usual model for skewed money and
// size measures (mean above median).
func (r *rng) logNormal(mu, sigma float64) float64 {
	return math.Exp(mu + sigma*r.normal())
}

// gamma returns a Gamma(shape, 1) draw by Marsaglia and Tsang (2000), with
// the shape < 1 boost from the same paper; used for Dirichlet subject
// profiles.
func (r *rng) gamma(shape float64) float64 {
	if shape < 1 {
		u := r.uniform()
		for u == 0 {
			u = r.uniform()
		}
		return r.gamma(shape+1) * math.Pow(u, 1/shape)
	}
	d := shape - 1.0/3
	c := 1 / math.Sqrt(9*d)
	for {
		x := r.normal()
		v := 1 + c*x
		if v <= 0 {
			continue
		}
		v = v * v * v
		u := r.uniform()
		if u < 1-0.0331*x*x*x*x || math.Log(u) < 0.5*x*x+d*(1-v+math.Log(v)) {
			return d * v
		}
	}
}

// poisson returns a Poisson(lambda) draw: Knuth's multiplication method for
// small lambda, a rounded normal approximation above 30 (enough for counts
// of survey votes).
func (r *rng) poisson(lambda float64) int {
	if lambda <= 0 {
		return 0
	}
	if lambda > 30 {
		v := math.Round(lambda + math.Sqrt(lambda)*r.normal())
		if v < 0 {
			return 0
		}
		return int(v)
	}
	l := math.Exp(-lambda)
	k, p := 0, 1.0
	for {
		p *= r.uniform()
		if p <= l {
			return k
		}
		k++
	}
}

// chance reports true with probability p.
func (r *rng) chance(p float64) bool { return r.uniform() < p }

// pick returns one element of a non-empty list.
func pick[T any](r *rng, xs []T) T { return xs[r.intn(len(xs))] }

// logistic maps a latent score onto (0, 1).
func logistic(x float64) float64 { return 1 / (1 + math.Exp(-x)) }
