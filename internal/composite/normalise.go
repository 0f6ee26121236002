package composite

import (
	"math"
	"slices"

	"peerpack/internal/stats"
)

// Normalise returns x normalised by the method over its non-missing values
// (NaN stays NaN); ref marks the reference group for Distance (nil = all).
// Higher stays higher: flip lower-is-better values (negate them) first.
// Definitions after Nardo et al. (2008), section 1.5 and Table 3.
func Normalise(x []float64, m Method, ref []bool) []float64 {
	out := make([]float64, len(x))
	present := presentValues(x, nil)
	switch m {
	case ZScore, ZScoreCDF:
		mean, sd := stats.MeanSD(present)
		for i, v := range x {
			z := stats.Z(v, mean, sd)
			if math.IsNaN(v) {
				z = math.NaN()
			} else if math.IsNaN(z) {
				z = 0 // every value equal: all at the mean
			}
			if m == ZScoreCDF && !math.IsNaN(z) {
				z = 100 * normalCDF(z)
			}
			out[i] = z
		}
	case MinMax:
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, v := range present {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
		for i, v := range x {
			switch {
			case math.IsNaN(v):
				out[i] = math.NaN()
			case hi > lo:
				out[i] = 100 * (v - lo) / (hi - lo)
			default:
				out[i] = 50
			}
		}
	case Percentile:
		sorted := slices.Clone(present)
		slices.Sort(sorted)
		for i, v := range x {
			if math.IsNaN(v) {
				out[i] = math.NaN()
				continue
			}
			out[i] = stats.Place(sorted, v, stats.HigherFirst, true).Percentile
		}
	case Distance:
		r := presentValues(x, ref)
		slices.Sort(r)
		med := stats.Quantile(r, 0.5, stats.Type7)
		for i, v := range x {
			if math.IsNaN(v) || math.IsNaN(med) || med == 0 {
				out[i] = math.NaN()
				continue
			}
			out[i] = 100 * (1 + (v-med)/math.Abs(med))
		}
	default:
		for i := range out {
			out[i] = math.NaN()
		}
	}
	return out
}

// Rescale maps x to [0, 1] between fixed goalposts, (x - lo) / (hi - lo),
// as the UNDP's dimension indices do (Human Development Report technical
// notes); values beyond the goalposts are capped.
func Rescale(x, lo, hi float64) float64 {
	v := (x - lo) / (hi - lo)
	return math.Max(0, math.Min(1, v))
}

// normalCDF is the standard normal distribution function.
func normalCDF(z float64) float64 { return 0.5 * math.Erfc(-z/math.Sqrt2) }

func presentValues(x []float64, ref []bool) []float64 {
	out := make([]float64, 0, len(x))
	for i, v := range x {
		if !math.IsNaN(v) && (ref == nil || (i < len(ref) && ref[i])) {
			out = append(out, v)
		}
	}
	return out
}
