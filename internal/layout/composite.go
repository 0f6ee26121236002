package layout

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"peerpack/charts"
	"peerpack/internal/brief"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/narrative"
	"peerpack/internal/pdf"
)

// compositeBlock sets the composite section: its parts in the order the
// block gives (text, intervals, weights, flow, contributions, headroom,
// cautions). Everything comes from the figures model and the commentary.
func (w *writer) compositeBlock(cb *brief.CompositeBlock) {
	m := w.m
	cy, ok := m.Composite(m.Year)
	if !ok || m.CompositeSpec == nil {
		w.noteBox(fmt.Sprintf("No composite score could be computed for %d: none of its indicators has a value that year.", m.Year))
		return
	}
	for _, part := range cb.Show {
		switch part {
		case "text":
			if w.com == nil {
				w.noteBox("Commentary not available: this pack was built without the commentary stage, so the composite's text is missing. Its charts and table are complete.")
			} else {
				w.paragraphs(w.com.Composite)
			}
		case "intervals":
			w.compositeIntervals(cy, cb.Neighbours)
		case "weights":
			w.compositeWeights(cy)
		case "flow":
			w.compositeChart(&charts.FlowChart{Indicators: flowIndicators(cy), Pillars: flowPillars(m, cy), Overall: "Composite score", Theme: w.chartTheme()},
				"How the composite is built", "Each band is as wide as the share of the score it carries: the weights are the brief's value judgements, scaled to sum to one.")
		case "contributions":
			w.compositeContributions(cy)
		case "headroom":
			w.compositeHeadroom(cy)
		case "cautions":
			w.compositeCautions()
		}
	}
}

// compositeChart sets one composite chart at full width with its title and
// caption, through the same path as chart blocks.
func (w *writer) compositeChart(ch charts.Chart, title, caption string) {
	spec := &brief.ChartBlock{Title: title, Caption: caption}
	spec.Type = "composite"
	w.setCharts([]placed{{spec: spec, ch: ch}}, false)
}

func (w *writer) compositeIntervals(cy *figures.CompositeYear, neighbours int) {
	m := w.m
	r := cy.Result
	if r.RankLow == nil || !cy.Scored(m.Focus) {
		return
	}
	var rows []charts.IntervalRow
	for _, inst := range cy.Neighbours(m.Focus, neighbours) {
		a := cy.Of(inst)
		rows = append(rows, charts.IntervalRow{Name: m.Data.Register.Institutions[inst].Name, Focus: inst == m.Focus,
			Rank: r.Rank[a], Low: r.RankLow[a], Median: r.RankMedian[a], High: r.RankHigh[a]})
	}
	spec := m.CompositeSpec
	w.compositeChart(&charts.RankIntervalChart{Rows: rows, Theme: w.chartTheme()},
		fmt.Sprintf("Composite rank with its uncertainty, %d", m.Year),
		fmt.Sprintf("The focus and the institutions ranked nearest it. Each line spans the middle %d %% of %s runs that vary the weights by up to %s %% (and the methods the brief lists); the mark is the rank under the stated weights. Institutions whose lines overlap cannot be told apart by this composite.",
			narrative.IntervalShare, format.Int(spec.Runs), format.Number(100*spec.WeightSpread, 0)))
}

// compositeWeights states the weights as the value judgements they are.
func (w *writer) compositeWeights(cy *figures.CompositeYear) {
	m := w.m
	spec := m.CompositeSpec
	r := cy.Result
	g := grid{
		head:    []string{"Pillar", "Indicator", "Better", "Weight in pillar", "Share of score"},
		align:   []byte{'L', 'L', 'L', 'R', 'R'},
		caption: "Weights of the composite, as stated in the brief and scaled to sum to one. They are value judgements: other, equally defensible weights give other ranks.",
	}
	for j, ind := range cy.Indicators {
		q := cy.Pillar[j]
		pl := ""
		if j == 0 || cy.Pillar[j-1] != q {
			pl = fmt.Sprintf("%s (%s %%)", spec.Pillars[q].Label, format.Number(100*r.PillarWeight[q], 0))
		}
		g.rows = append(g.rows, []cell{{text: pl, bold: pl != ""}, {text: ind.Label}, {text: string(ind.Better)},
			{text: format.Number(100*r.IndicatorWeight[j], 0) + " %"}, {text: format.Number(100*r.EffectiveWeight[j], 1) + " %"}})
	}
	g.notes = append(g.notes, compositeMethodNote(m, cy))
	w.setTable(g)
}

// compositeMethodNote says how the composite was computed, in words.
func compositeMethodNote(m *figures.Model, cy *figures.CompositeYear) string {
	spec := m.CompositeSpec
	scaling := narrative.ScalingWords[spec.Normalise]
	if spec.Normalise == "distance" {
		scaling = "distance to the median of " + spec.DistanceGroup
	}
	agg := "weighted arithmetic mean of the pillars, so a strong pillar can make up for a weak one"
	if spec.Aggregate == "geometric" {
		agg = "weighted geometric mean of the pillars, so a strong pillar makes up for a weak one only in part"
	}
	imp := map[string]string{"none": "left out (the pillar is the mean of the values present)", "group-median": "replaced by the median", "pillar-mean": "replaced by the mean of the pillar's other indicators"}[spec.Impute]
	var skewed []string
	for j, s := range cy.Result.Skew {
		if s.Treated != "" {
			skewed = append(skewed, cy.Indicators[j].Label+" ("+figures.SkewTreatmentText(s.Treated, s.Winsorised)+")")
		}
	}
	skew := "No indicator was treated for skew."
	if len(skewed) > 0 {
		skew = "Treated for skew (skewness beyond 2 and kurtosis beyond 3.5): " + strings.Join(skewed, "; ") + "."
	} else if spec.Skew == "none" {
		n := 0
		for _, s := range cy.Result.Skew {
			if s.Skewed {
				n++
			}
		}
		if n > 0 {
			skew = fmt.Sprintf("%s strongly skewed (skewness beyond 2 and kurtosis beyond 3.5) and left as %s; the brief asks for no treatment.", format.Plural(n, "One indicator is", format.Int(n)+" indicators are"), format.Plural(n, "it is", "they are"))
		}
	}
	return fmt.Sprintf("Method: indicators put on a common scale by %s over the ranked population, lower-is-better ones turned round first; within a pillar a weighted mean; overall a %s. An institution needs %s %% of the indicators to be scored; missing values are %s. %s Method after the OECD/JRC Handbook on Constructing Composite Indicators (Nardo et al. 2008); uncertainty after Saisana, Saltelli and Tarantola (2005).",
		scaling, agg, format.Number(100*spec.MinShare, 0), imp, skew)
}

func flowIndicators(cy *figures.CompositeYear) []charts.FlowIndicator {
	out := make([]charts.FlowIndicator, len(cy.Indicators))
	for j, ind := range cy.Indicators {
		label := ind.Short
		if label == "" {
			label = ind.Label
		}
		out[j] = charts.FlowIndicator{Label: label, Pillar: cy.Pillar[j], Weight: cy.Result.EffectiveWeight[j]}
	}
	return out
}

func flowPillars(m *figures.Model, cy *figures.CompositeYear) []charts.FlowPillar {
	out := make([]charts.FlowPillar, len(m.CompositeSpec.Pillars))
	for q, p := range m.CompositeSpec.Pillars {
		out[q] = charts.FlowPillar{Label: p.Label, Weight: cy.Result.PillarWeight[q]}
	}
	return out
}

func (w *writer) compositeContributions(cy *figures.CompositeYear) {
	m := w.m
	a := cy.Of(m.Focus)
	if a < 0 || !cy.Result.Scored[a] {
		return
	}
	spec := m.CompositeSpec
	r := cy.Result
	var rows []charts.ContributionRow
	axis := "Pillar weight × pillar score"
	caption := "What each pillar adds to the focus's composite score: its weight times its score on the common scale. "
	if spec.Aggregate == "geometric" {
		axis = "Pillar score"
		caption = "The focus's score on each pillar, on the common scale; the geometric mean combines them with the weights. "
	}
	for q, p := range spec.Pillars {
		v := r.PillarScore[q][a]
		if math.IsNaN(v) {
			continue
		}
		if spec.Aggregate != "geometric" {
			v *= r.PillarWeight[q]
		}
		rows = append(rows, charts.ContributionRow{Label: p.Label, Value: v})
	}
	if spec.Normalise == "zscore" {
		caption += "On z-scores zero is the population's mean, so a bar to the left is below it."
	}
	w.compositeChart(&charts.ContributionChart{Rows: rows, Decimals: 2, Axis: axis, Theme: w.chartTheme()},
		fmt.Sprintf("Pillar contributions, %s, %d", m.Data.Register.Institutions[m.Focus].Name, m.Year), caption)
}

func (w *writer) compositeHeadroom(cy *figures.CompositeYear) {
	m := w.m
	if cy.Target == 0 || len(cy.Headroom) == 0 {
		return
	}
	var rows []charts.HeadroomRow
	for j, h := range cy.Headroom {
		if !cy.HasRoom[j] {
			continue
		}
		label := cy.Indicators[j].Short
		if label == "" {
			label = cy.Indicators[j].Label
		}
		rows = append(rows, charts.HeadroomRow{Label: label, Pct: math.Abs(h.ChangePct), Reachable: h.Reachable && !math.IsNaN(h.ChangePct)})
	}
	sort.SliceStable(rows, func(i, j int) bool {
		if rows[i].Reachable != rows[j].Reachable {
			return rows[i].Reachable
		}
		return rows[i].Pct < rows[j].Pct
	})
	a := cy.Of(m.Focus)
	w.compositeChart(&charts.HeadroomChart{Rows: rows, Axis: "Change needed, % of the present value", Theme: w.chartTheme()},
		fmt.Sprintf("Headroom: what one indicator alone would take to reach %s", format.Ordinal(cy.Target)),
		fmt.Sprintf("The smallest change in each indicator, every other value held, that would move the focus from %s to %s or better under the stated weights; a planning aid, not a forecast, and the rank interval still applies. Lower-is-better indicators would have to fall by this much.",
			format.Rank(cy.Result.Rank[a], w.b.RankBands), format.Rank(cy.Target, w.b.RankBands)))
}

// compositeCautions are the composite's own cautions; the pack's closing
// keeps the general ones.
func (w *writer) compositeCautions() {
	spec := w.m.CompositeSpec
	var sp []span
	sp = append(sp, span{text: "Reading the composite. ", font: w.st.font(pdf.Bold, w.st.size), color: w.st.text})
	sp = append(sp, span{text: fmt.Sprintf("A composite score folds %s into one number, and which indicators enter and how they are weighted are value judgements made in the brief, not facts about the institutions. Its rank is uncertain: the interval shows how far reasonable changes to the weights and methods move it, and a change of a few places inside the interval is not news. Institutions missing indicators are scored on fewer of them or with imputed values, which the figures file flags. The composite measures only what its indicators measure; it says nothing of what they leave out, and should not be the sole basis for decisions about people or money.",
		format.Plural(countIndicators(spec), "one indicator", format.Int(countIndicators(spec))+" indicators")), font: w.st.font(pdf.Regular, w.st.size), color: w.st.text})
	w.para(sp, w.indent, nil, w.st.size, paraGap)
}

func countIndicators(spec *brief.CompositeSpec) int {
	n := 0
	for _, p := range spec.Pillars {
		n += len(p.Indicators)
	}
	return n
}
