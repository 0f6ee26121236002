// Package composite builds composite scores from indicator values by the
// steps of the OECD/JRC Handbook on Constructing Composite Indicators
// (Nardo, Saisana, Saltelli, Tarantola, Hoffman and Giovannini, 2008):
// skew treatment, polarity, normalisation, imputation, weighting and
// aggregation; then the uncertainty of the resulting ranks by Monte Carlo
// over the modeller's choices (Saisana, Saltelli and Tarantola 2005, JRSS A
// 168(2)), first-order sensitivity of a unit's rank to each choice, and the
// headroom of one unit on each indicator.
//
// The package knows nothing of briefs or datasets: it takes columns of
// values over one population (NaN = missing) and a Spec, so that it can be
// tested against published composites on their own data.
package composite

import (
	"errors"
	"fmt"
	"math"
)

// Method is a normalisation (Handbook section 1.5, Table 3).
type Method string

// The normalisations.
const (
	// ZScore: (x - mean) / sd, sample SD.
	ZScore Method = "zscore"
	// MinMax: 100 (x - min) / (max - min).
	MinMax Method = "minmax"
	// Percentile: the percentile rank 100 (below + ties/2) / n.
	Percentile Method = "percentile"
	// Distance: 100 (1 + (x - ref) / |ref|), ref the median of a reference
	// group, so the reference sits at 100.
	Distance Method = "distance"
	// ZScoreCDF: the z-score through the standard normal CDF, 100 Phi(z).
	ZScoreCDF Method = "zscore-cdf"
)

// Methods lists the normalisations in documentation order.
var Methods = []Method{ZScore, MinMax, Percentile, Distance, ZScoreCDF}

// Positive reports whether the method's values are always above zero, as
// geometric aggregation needs. Min-max gives 0 to the lowest value and
// z-scores go negative; a distance can fall to zero or below for values
// far under the reference, which Compute checks on the data.
func (m Method) Positive() bool { return m == Percentile || m == ZScoreCDF || m == Distance }

// Impute is the rule for a missing value of an institution that has
// enough values to be scored.
type Impute string

// The imputation rules.
const (
	// ImputeNone leaves the value out: the pillar is the weighted mean of
	// the values present, its weights renormalised (which amounts to
	// imputing that mean; Handbook section 1.4 calls this implicit).
	ImputeNone Impute = "none"
	// ImputeMedian puts the population median of the normalised indicator
	// in its place (unconditional median imputation, Handbook 1.4).
	ImputeMedian Impute = "group-median"
	// ImputePillarMean puts the institution's weighted mean of the other
	// normalised indicators of the same pillar in its place, or the median
	// when the pillar has none (a hot-deck of its own profile).
	ImputePillarMean Impute = "pillar-mean"
)

// Imputes lists the imputation rules in documentation order.
var Imputes = []Impute{ImputeNone, ImputeMedian, ImputePillarMean}

// Indicator is one column of the composite.
type Indicator struct {
	Key string
	// Pillar is the index into Spec.Pillars.
	Pillar int
	// Weight within the pillar as the brief states it; weights are
	// normalised to sum to one within each pillar.
	Weight float64
	// Lower marks a lower-is-better indicator, flipped before
	// normalisation so that higher always means better.
	Lower bool
}

// Pillar is one group of indicators with its weight in the overall score.
type Pillar struct {
	Key    string
	Weight float64
}

// Skew says how strongly skewed indicators are treated.
type Skew struct {
	// Treat is "none", "log" or "winsorise".
	Treat string
	// N is the most values winsorised per indicator.
	N int
}

// Skew criterion: an indicator is treated when |skewness| > SkewLimit and
// excess kurtosis > KurtosisLimit (the JRC's rule of thumb for composite
// indicators, from memory: absolute skewness above 2 and kurtosis above
// 3.5).
const (
	SkewLimit     = 2.0
	KurtosisLimit = 3.5
)

// Spec is a composite: its indicators, pillars and method choices.
type Spec struct {
	Indicators []Indicator
	Pillars    []Pillar
	Normalise  Method
	// Reference marks the members of the distance normalisation's
	// reference group, by institution (column position); needed only for
	// Distance.
	Reference []bool
	// Geometric aggregates pillars by the weighted geometric mean; else
	// the weighted arithmetic mean. Within a pillar the mean is
	// arithmetic.
	Geometric bool
	// MinShare is the share of indicators an institution must have to be
	// scored (0 = any one).
	MinShare float64
	Impute   Impute
	Skew     Skew

	// Runs is the number of Monte Carlo runs (0 = none).
	Runs int
	// WeightSpread perturbs every weight by a factor drawn uniformly in
	// [1 - spread, 1 + spread], weights renormalised after.
	WeightSpread float64
	// Normalisations and Imputations are drawn from uniformly in each run;
	// empty means the base choice only.
	Normalisations []Method
	Imputations    []Impute
	Seed           uint64
	// Focus is the institution whose rank the sensitivity analysis
	// explains (-1 for none).
	Focus int
}

// SkewInfo is the skew diagnosis of one indicator.
type SkewInfo struct {
	Skewness, Kurtosis float64
	// Treated is "" when the criterion did not hold or treatment is none,
	// else "log" or "winsorise".
	Treated string
	// Winsorised counts the values replaced.
	Winsorised int
	// Skewed says whether the criterion held.
	Skewed bool
}

// Result is a composite over one population.
type Result struct {
	// Scored marks the institutions with enough values.
	Scored   []bool
	Excluded int
	// Imputed counts, per institution, the values imputed in the base
	// composite.
	Imputed []int
	// Score and Rank are the overall composite (NaN and 0 when not scored).
	Score []float64
	Rank  []int
	// PillarScore and PillarRank are [pillar][institution].
	PillarScore [][]float64
	PillarRank  [][]int
	Skew        []SkewInfo
	// IndicatorWeight (within its pillar) and PillarWeight are the
	// normalised weights; EffectiveWeight is each indicator's share of
	// the overall score under arithmetic aggregation (pillar weight times
	// weight within the pillar).
	IndicatorWeight, PillarWeight, EffectiveWeight []float64
	// Monte Carlo ranks per institution: median, 5th and 95th percentiles
	// (0 when not scored or no runs).
	RankMedian, RankLow, RankHigh []int
	// Sensitivity of the focus's rank, one entry per uncertain choice.
	Sensitivity []Factor
	// FocusRankVariance is the variance of the focus's Monte Carlo ranks.
	FocusRankVariance float64

	prep *prepared
}

// Factor is one uncertain choice and the first-order share of the variance
// of the focus's rank due to it.
type Factor struct {
	// Kind is "indicator-weight", "pillar-weight", "normalisation" or
	// "imputation"; Key names the indicator or pillar.
	Kind, Key string
	First     float64
}

// Error is a problem with the spec or the data, for the brief's author.
type Error struct{ Msg string }

func (e *Error) Error() string { return e.Msg }

func errf(format string, args ...any) error { return &Error{Msg: fmt.Sprintf(format, args...)} }

// Validate checks a spec for problems the author must fix.
func (s *Spec) Validate() error {
	var errs []error
	if len(s.Pillars) == 0 {
		errs = append(errs, errf("a composite needs at least one pillar"))
	}
	used := make([]int, len(s.Pillars))
	for _, ind := range s.Indicators {
		if ind.Pillar < 0 || ind.Pillar >= len(s.Pillars) {
			errs = append(errs, errf("indicator %s belongs to no pillar", ind.Key))
			continue
		}
		if !(ind.Weight > 0) || math.IsInf(ind.Weight, 0) {
			errs = append(errs, errf("indicator %s: weight must be a positive number", ind.Key))
		}
		used[ind.Pillar]++
	}
	for i, p := range s.Pillars {
		if !(p.Weight > 0) || math.IsInf(p.Weight, 0) {
			errs = append(errs, errf("pillar %s: weight must be a positive number", p.Key))
		}
		if used[i] == 0 {
			errs = append(errs, errf("pillar %s has no indicators", p.Key))
		}
	}
	methods := append([]Method{s.Normalise}, s.Normalisations...)
	for _, m := range methods {
		if !known(Methods, m) {
			errs = append(errs, errf("normalisation %q is not known", m))
		} else if s.Geometric && !m.Positive() {
			errs = append(errs, errf("geometric aggregation needs positive values, which %s does not give; use percentile, zscore-cdf or distance, or aggregate arithmetically", m))
		}
	}
	for _, im := range append([]Impute{s.Impute}, s.Imputations...) {
		if !known(Imputes, im) {
			errs = append(errs, errf("imputation %q is not known", im))
		}
	}
	if s.MinShare < 0 || s.MinShare > 1 || math.IsNaN(s.MinShare) {
		errs = append(errs, errf("min_share must lie between 0 and 1"))
	}
	if s.WeightSpread < 0 || s.WeightSpread >= 1 || math.IsNaN(s.WeightSpread) {
		errs = append(errs, errf("the weight spread must lie in [0, 1)"))
	}
	switch s.Skew.Treat {
	case "", "none", "log":
	case "winsorise":
		if s.Skew.N < 1 {
			errs = append(errs, errf("winsorise needs a number of values of at least 1"))
		}
	default:
		errs = append(errs, errf("skew treatment %q is not known", s.Skew.Treat))
	}
	if s.Runs < 0 {
		errs = append(errs, errf("runs cannot be negative"))
	}
	return errors.Join(errs...)
}

func known[T comparable](list []T, v T) bool {
	for _, x := range list {
		if x == v {
			return true
		}
	}
	return false
}
