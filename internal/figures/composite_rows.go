package figures

import (
	"strconv"

	"peerpack/internal/format"
)

// Composite measures of the figures file (section composite).
const (
	CompositeOverall = "overall"
)

// compositeRows writes the composite: per year and scored institution the
// overall score, rank and, where runs were made, the Monte Carlo
// rank_median, rank_low, rank_high (5th and 95th percentiles); in the
// brief year also the imputed and missing counts and each pillar's score
// and rank; per year the weights (as normalised), the skew
// diagnosis and treatment of each indicator, the method; for the focus the
// sensitivity of its rank, its headroom and its movement over the span.
//
// They are added once, as rows of a later stage (m.Add), so the streaming
// writers and Lookup find them with the rest.
func (m *Model) addCompositeRows() {
	if len(m.composites) == 0 {
		return
	}
	var rows []Row
	sink := func(r Row) bool { rows = append(rows, r); return true }
	num := func(k Key, v float64) { emitNum(sink, k, v) }
	text := func(k Key, s string) { emitText(sink, k, s) }
	defer func() { m.Add(rows...) }()
	k := func(ind, inst string, year int, measure string) Key {
		return Key{Section: SectionComposite, Indicator: ind, Institution: inst, Year: year, Measure: measure}
	}
	for _, cy := range m.composites {
		r := cy.Result
		y := cy.Year
		num(k(CompositeOverall, "", y, "n_scored"), float64(r.NScored()))
		num(k(CompositeOverall, "", y, "n_excluded"), float64(r.Excluded))
		if r.RankLow != nil {
			num(k(CompositeOverall, "", y, "runs"), float64(m.CompositeSpec.Runs))
			num(k(CompositeOverall, "", y, "weight_spread"), m.CompositeSpec.WeightSpread)
		}
		imputed := 0
		for a, i := range cy.Population {
			if !r.Scored[a] || r.Rank[a] == 0 {
				continue // no score (values no scale could place)
			}
			id := m.InstitutionID(i)
			imputed += r.Imputed[a]
			num(k(CompositeOverall, id, y, "score"), r.Score[a])
			num(k(CompositeOverall, id, y, "rank"), float64(r.Rank[a]))
			if r.RankLow != nil {
				num(k(CompositeOverall, id, y, "rank_median"), float64(r.RankMedian[a]))
				num(k(CompositeOverall, id, y, "rank_low"), float64(r.RankLow[a]))
				num(k(CompositeOverall, id, y, "rank_high"), float64(r.RankHigh[a]))
			}
			if y != m.Year {
				continue // other span years: the overall score and rank, for movement
			}
			num(k(CompositeOverall, id, y, "imputed"), float64(r.Imputed[a]))
			num(k(CompositeOverall, id, y, "missing"), float64(r.Missing(a)))
			for q, key := range m.compositePillarKeys() {
				num(k(key, id, y, "score"), r.PillarScore[q][a])
				num(k(key, id, y, "rank"), float64(r.PillarRank[q][a]))
			}
		}
		num(k(CompositeOverall, "", y, "n_imputed"), float64(imputed))
		for q, key := range m.compositePillarKeys() {
			num(k(key, "", y, "weight"), r.PillarWeight[q])
		}
		for j, ind := range cy.Indicators {
			num(k(ind.Key, "", y, "weight"), r.IndicatorWeight[j])
			num(k(ind.Key, "", y, "effective_weight"), r.EffectiveWeight[j])
			sk := r.Skew[j]
			num(k(ind.Key, "", y, "skewness"), sk.Skewness)
			num(k(ind.Key, "", y, "kurtosis"), sk.Kurtosis)
			num(k(ind.Key, "", y, "skewed"), oneIf(sk.Skewed))
			text(k(ind.Key, "", y, "skew_treatment"), SkewTreatmentText(sk.Treated, sk.Winsorised))
		}
		if cy.Scored(m.Focus) {
			fid := m.FocusID
			if r.RankLow != nil {
				num(k(CompositeOverall, fid, y, "rank_variance"), r.FocusRankVariance)
				num(k(CompositeOverall, fid, y, "n_overlapping"), float64(cy.Overlapping(m.Focus)))
			}
			for _, f := range r.Sensitivity {
				switch f.Kind {
				case "indicator-weight", "pillar-weight":
					num(k(f.Key, fid, y, "first_order_weight"), f.First)
				default:
					num(k(CompositeOverall, fid, y, "first_order_"+f.Kind), f.First)
				}
			}
			if cy.Target > 0 {
				num(k(CompositeOverall, fid, y, "headroom_target"), float64(cy.Target))
			}
			for j, h := range cy.Headroom {
				if !cy.HasRoom[j] {
					continue
				}
				key := cy.Indicators[j].Key
				num(k(key, fid, y, "headroom_from"), h.From)
				num(k(key, fid, y, "headroom_reachable"), oneIf(h.Reachable))
				if h.Reachable {
					num(k(key, fid, y, "headroom_to"), h.To)
					num(k(key, fid, y, "headroom_change"), h.Change)
					num(k(key, fid, y, "headroom_change_pct"), h.ChangePct)
					num(k(key, fid, y, "headroom_rank"), float64(h.Rank))
				}
			}
		}
	}
	if mv, ok := m.CompositeMovement(); ok {
		fid := m.FocusID
		num(k(CompositeOverall, fid, 0, "movement_start_year"), float64(mv.StartYear))
		num(k(CompositeOverall, fid, 0, "movement_end_year"), float64(mv.EndYear))
		num(k(CompositeOverall, fid, 0, "movement_rank_change"), float64(mv.StartRank-mv.EndRank))
		num(k(CompositeOverall, fid, 0, "movement_distinguishable"), oneIf(mv.Distinguishable))
	}
}

func (m *Model) compositePillarKeys() []string {
	if m.CompositeSpec == nil {
		return nil
	}
	out := make([]string, len(m.CompositeSpec.Pillars))
	for i, p := range m.CompositeSpec.Pillars {
		out[i] = p.Key
	}
	return out
}

// SkewTreatmentText says what was done to an indicator's skew.
func SkewTreatmentText(treated string, winsorised int) string {
	switch treated {
	case "log":
		return "logarithm"
	case "winsorise":
		return "winsorised " + strconv.Itoa(winsorised) + " " + format.Plural(winsorised, "value", "values")
	}
	return "none"
}
