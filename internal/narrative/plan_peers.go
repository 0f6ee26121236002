package narrative

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/peers"
)

// The peer-group text of a clusters block: how the clusters were made,
// how clear the structure is (silhouette, Kaufman and Rousseeuw 1990),
// which cluster the focus falls in and what marks it, how stable that is
// (bootstrap Jaccard, Hennig 2007), the nearest profiles, and what the
// clusters do not say. Each sentence cites the peers rows it prints.

// pct prints a share (0..1) as a whole percentage, as Verify reads the
// shares of section peers.
func pct(v float64) string { return format.Int(int(math.Round(v*100))) + "%" }

// peersParagraphs writes the text of one clusters block.
func (c *composer) peersParagraphs(part string) []Paragraph {
	pm := c.m.Peers
	if pm == nil {
		return nil
	}
	a := pm.Analysis
	key := func(group, ind, inst, measure string) figures.Key { return pm.Key(group, ind, inst, measure) }
	top := func(measure string) figures.Key { return key("", "", "", measure) }
	say := func(text string, cites ...figures.Key) Sentence {
		return Sentence{Text: text, Cites: cites, Part: part}
	}
	var method []Sentence
	how := "k-means over standardised profiles"
	if pm.Spec.Method == peers.MethodWard {
		how = "Ward's hierarchical clustering of standardised profiles"
	}
	if !pm.Standardised {
		how = strings.Replace(how, "standardised", "raw", 1)
	}
	labels := make([]string, len(pm.Indicators))
	for j, ind := range pm.Indicators {
		labels[j] = ind.RunningLabel()
	}
	s := say(fmt.Sprintf("Institutions were grouped by %s on %s in %d: %s institutions in %s clusters, numbered from the largest.",
		how, joinAnd(labels), pm.Year, format.Int(len(pm.Rows)), format.Int(a.K)), top("n_clustered"), top("k"))
	// "numbered from the largest": each cluster at least as large as the next.
	for i := 1; i < len(pm.Clusters); i++ {
		s = s.claim(Claimed(Fig(key(figures.ClusterGroup(pm.Clusters[i-1].Number), "", "", "size")), OpGreaterEq, Fig(key(figures.ClusterGroup(pm.Clusters[i].Number), "", "", "size"))))
	}
	if pm.LeftOut > 0 {
		s.Text = strings.TrimSuffix(s.Text, ".") + fmt.Sprintf("; %s of the ranked population lacked a value and were left out.", format.Int(pm.LeftOut))
		s.Cites = append(s.Cites, top("n_left_out"))
	}
	method = append(method, s)
	var weighted []string
	for j, w := range pm.Weights {
		if w != 1 {
			weighted = append(weighted, fmt.Sprintf("%s counts %s times", labels[j], strconv.FormatFloat(w, 'f', -1, 64)))
		}
	}
	if len(weighted) > 0 {
		ws := say("Weights are a value judgement of the brief: " + joinAnd(weighted) + ".")
		for j, w := range pm.Weights {
			if w != 1 {
				ws.Cites = append(ws.Cites, key("", pm.Indicators[j].Key, "", "weight"))
			}
		}
		method = append(method, ws)
	}
	// The structure's word claims the silhouette against the levels of
	// Kaufman and Rousseeuw (1990, from memory).
	sil := Fig(top("silhouette"))
	structure := "a reasonable structure"
	structClaims := []Claim{Claimed(sil, OpGreaterEq, Num(figures.ReasonableSilhouette))}
	switch {
	case a.Silhouette.Mean < figures.WeakSilhouette:
		structure = "no substantial structure: the clusters cut a continuum into parts rather than find separate groups"
		structClaims = []Claim{Claimed(sil, OpLess, Num(figures.WeakSilhouette))}
	case a.Silhouette.Mean < figures.ReasonableSilhouette:
		structure = "a weak structure, which the method may partly have imposed"
		structClaims = []Claim{Claimed(sil, OpGreaterEq, Num(figures.WeakSilhouette)), Claimed(sil, OpLess, Num(figures.ReasonableSilhouette))}
	}
	if pm.Spec.K.Auto() {
		// "the widest of those tried": one claim per other k on the curve.
		chosen := top(figures.CurveMeasure(a.K))
		widest := say(fmt.Sprintf("The number of clusters gives the widest average silhouette width of those tried (%s), which indicates %s.",
			format.Number(a.Silhouette.Mean, 2), structure), top("silhouette")).claim(structClaims...)
		for _, sc := range a.Curve {
			if sc.K != a.K && !math.IsNaN(sc.Silhouette) {
				widest = widest.claim(Claimed(Fig(chosen), OpGreaterEq, Fig(top(figures.CurveMeasure(sc.K)))))
			}
		}
		method = append(method, widest)
	} else {
		method = append(method, say(fmt.Sprintf("The brief sets the number of clusters; their average silhouette width is %s, which indicates %s.",
			format.Number(a.Silhouette.Mean, 2), structure), top("silhouette")).claim(structClaims...))
	}
	if a.Silhouette.Sampled {
		method = append(method, say(fmt.Sprintf("Silhouette widths are estimated from a random sample of %s institutions.", format.Int(len(a.Silhouette.Rows))), top("silhouette_rows")))
	}
	out := []Paragraph{{Sentences: method}}

	var focus []Sentence
	fid := c.m.FocusID
	if pm.FocusCluster < 0 {
		focus = append(focus, say(fmt.Sprintf("%s is not in any cluster: it is outside the ranked population or lacks a value of one of these indicators in %d.", c.focus, pm.Year), top("n_clustered")))
	} else {
		k := pm.Clusters[pm.FocusCluster]
		g := figures.ClusterGroup(k.Number)
		typ := c.m.Data.Register.Institutions[k.Typical].Name
		s := say(fmt.Sprintf("%s falls in cluster %s, \u201c%s\u201d, with %s members; the member whose profile is nearest the cluster's centre is %s.",
			c.focus, format.Int(k.Number), k.Name, format.Int(k.Size), typ),
			key("", "", fid, "focus_cluster"), key(g, "", "", "name"), key(g, "", "", "size"), key(g, "", c.m.InstitutionID(k.Typical), "typical"))
		if k.Typical == c.m.Focus {
			s.Text = fmt.Sprintf("%s falls in cluster %s, \u201c%s\u201d, with %s members, and is itself the member nearest the cluster's centre.", c.focus, format.Int(k.Number), k.Name, format.Int(k.Size))
		}
		focus = append(focus, s)
		if d := c.traitSentence(pm, k, part); d.Text != "" {
			focus = append(focus, d)
		}
		if len(k.Countries) > 0 {
			var cs []string
			var cites []figures.Key
			for _, cc := range k.Countries {
				cs = append(cs, fmt.Sprintf("%s (%s)", cc.Country, format.Int(cc.N)))
				cites = append(cites, key(g, "", "", figures.CountryMeasure(cc.Country)))
			}
			// Listed largest first: each count at least the next, none
			// above the cluster's size (the countries left unlisted have
			// fewer members by construction, figures.Cluster.Countries).
			lead := "Most of its members come from "
			if len(cs) > 1 {
				lead = "The countries with most of its members are "
			}
			cs0 := say(lead+joinAnd(cs)+".", cites...)
			for i := range cites {
				if i > 0 {
					cs0 = cs0.claim(Claimed(Fig(cites[i-1]), OpGreaterEq, Fig(cites[i])))
				}
				cs0 = cs0.claim(Claimed(Fig(cites[i]), OpLessEq, Fig(key(g, "", "", "size"))))
			}
			if len(cites) == 1 {
				// "most": more than half of the members.
				cs0 = cs0.claim(Claimed(Fig(cites[0]), OpGreater, Num(float64(k.Size)/2)))
			}
			focus = append(focus, cs0)
		}
		if st := a.Stability; st != nil {
			comp := pm.FocusCompanions
			// The word claims the cluster's Jaccard against the levels
			// of Hennig (2007, from memory).
			jk := Fig(key(g, "", "", "jaccard"))
			word := "a stable grouping"
			stab := []Claim{Claimed(jk, OpGreaterEq, Fig(top("jaccard_stable")))}
			if k.Fragile() {
				word = "a fragile grouping: read membership of this cluster as tentative"
				stab = []Claim{Claimed(jk, OpLess, Fig(top("jaccard_fragile")))}
			} else if k.Jaccard < peers.StableJaccard {
				word = "a grouping of middling stability"
				stab = []Claim{Claimed(jk, OpGreaterEq, Fig(top("jaccard_fragile"))), Claimed(jk, OpLess, Fig(top("jaccard_stable")))}
			}
			focus = append(focus, say(fmt.Sprintf("Clustered again on %s bootstrap resamples, %s kept most of the same companions (at least three quarters in common) in %s of them; the cluster itself has a mean Jaccard similarity of %s across resamples, %s.",
				format.Int(st.Resamples), c.focus, pct(comp), format.Number(k.Jaccard, 2), word),
				top("resamples"), key("", "", fid, "companions"), key(g, "", "", "jaccard")).claim(stab...))
		}
	}
	if len(focus) > 0 {
		out = append(out, Paragraph{Sentences: focus})
	}
	if st := a.Stability; st != nil {
		var fragile []string
		var cites []figures.Key
		var fc []Claim
		for _, k := range pm.Clusters {
			if k.Fragile() {
				fragile = append(fragile, fmt.Sprintf("%s (%s)", format.Int(k.Number), format.Number(k.Jaccard, 2)))
				jk := key(figures.ClusterGroup(k.Number), "", "", "jaccard")
				cites = append(cites, jk)
				fc = append(fc, Claimed(Fig(jk), OpLess, Fig(top("jaccard_fragile"))))
			}
		}
		if len(fragile) > 0 {
			word := "Cluster " + fragile[0] + " is"
			if len(fragile) > 1 {
				word = "Clusters " + joinAnd(fragile) + " are"
			}
			cites = append(cites, top("jaccard_fragile"))
			out = append(out, Paragraph{Sentences: []Sentence{say(word+fmt.Sprintf(" fragile: mean Jaccard similarity under %s across resamples (in brackets), so they may not exist as groups at all.", format.Number(peers.FragileJaccard, 2)), cites...).claim(fc...)}})
		}
	}
	if len(pm.Nearest) > 0 {
		var items []string
		var cites []figures.Key
		var nc []Claim
		for i, nb := range pm.Nearest {
			if i > 0 {
				// "nearest first"
				nc = append(nc, Claimed(Fig(key(figures.NearestGroup, "", c.m.InstitutionID(pm.Nearest[i-1].Institution), "distance")), OpLessEq, Fig(key(figures.NearestGroup, "", c.m.InstitutionID(nb.Institution), "distance"))))
			}
			id := c.m.InstitutionID(nb.Institution)
			name := c.m.Data.Register.Institutions[nb.Institution].Name
			var diffs []string
			for _, j := range nb.Differs {
				ind := pm.Indicators[j]
				r, _ := c.m.Lookup(key(figures.NearestGroup, ind.Key, id, "difference"))
				dk := key(figures.NearestGroup, ind.Key, id, "difference")
				dir, dc := "higher", Claimed(Fig(dk), OpGreater, Num(0))
				if r.Value < 0 {
					dir, dc = "lower", Claimed(Fig(dk), OpLess, Num(0))
				}
				if format.Round(r.Value, ind.Decimals) == 0 {
					continue
				}
				nc = append(nc, dc)
				diffs = append(diffs, fmt.Sprintf("%s %s on %s", format.Difference(ind, r.Value), dir, ind.RunningLabel()))
				cites = append(cites, key(figures.NearestGroup, ind.Key, id, "difference"))
			}
			item := name
			if len(diffs) > 0 {
				item += " (" + strings.Join(diffs, ", ") + ")"
			}
			items = append(items, item)
			cites = append(cites, key(figures.NearestGroup, "", id, "order"))
		}
		out = append(out, Paragraph{Sentences: []Sentence{say(fmt.Sprintf("The profiles nearest %s's, nearest first, with where each differs most: %s.", c.focus, strings.Join(items, "; ")), cites...).claim(nc...)}})
	}
	out = append(out, Paragraph{Sentences: []Sentence{say("Clusters describe resemblance on the chosen indicators and weights, not quality; other indicators, weights or another number of clusters would draw other groups, and the names are generated from the figures, not given by anyone.")}})
	return out
}

// traitSentence says on which indicators the cluster's centre stands
// furthest above and below the population, in standard deviations.
func (c *composer) traitSentence(pm *figures.Peers, k figures.Cluster, part string) Sentence {
	g := figures.ClusterGroup(k.Number)
	var cites []figures.Key
	var cl []Claim
	z := func(j int) Operand { return Fig(pm.Key(g, pm.Indicators[j].Key, "", "centroid_z")) }
	for _, j := range k.Above {
		cl = append(cl, Claimed(z(j), OpGreaterEq, Num(figures.DistinctZ)))
	}
	for _, j := range k.Below {
		cl = append(cl, Claimed(z(j), OpLessEq, Num(-figures.DistinctZ)))
	}
	side := func(js []int) string {
		var items []string
		for _, j := range js {
			ind := pm.Indicators[j]
			items = append(items, fmt.Sprintf("%s (centre %s against %s overall)", ind.RunningLabel(), format.Value(ind, k.Centroid[j]), format.Value(ind, pm.Means[j])))
			cites = append(cites, pm.Key(g, ind.Key, "", "centroid"), pm.Key("", ind.Key, "", "mean"))
		}
		return joinAnd(items)
	}
	var parts []string
	if len(k.Above) > 0 {
		parts = append(parts, "high on "+side(k.Above))
	}
	if len(k.Below) > 0 {
		parts = append(parts, "low on "+side(k.Below))
	}
	if len(parts) == 0 {
		// "within half a standard deviation on every indicator": two claims per indicator.
		for j := range pm.Indicators {
			if math.IsNaN(k.CentroidZ[j]) { // a constant indicator has no z
				continue
			}
			cl = append(cl, Claimed(z(j), OpLess, Num(figures.DistinctZ)), Claimed(z(j), OpGreater, Num(-figures.DistinctZ)))
		}
		return Sentence{Text: "Its centre lies within half a standard deviation of the population mean on every indicator.", Part: part, Cites: []figures.Key{pm.Key(g, "", "", "size")}, Claims: cl}
	}
	return Sentence{Text: "What sets the cluster apart is that it is " + strings.Join(parts, ", and ") + ".", Cites: cites, Part: part, Claims: cl}
}

// joinAnd joins items as running text: "a, b and c".
func joinAnd(items []string) string {
	switch len(items) {
	case 0:
		return ""
	case 1:
		return items[0]
	}
	return strings.Join(items[:len(items)-1], ", ") + " and " + items[len(items)-1]
}

// peersRenderings are the printed forms of a peers row Verify accepts.
func peersRenderings(m *figures.Model, r figures.Row) []string {
	out := clusterNumber(r)
	v := r.Value
	whole := int(math.Round(v))
	ind, hasInd := m.Indicator(r.Indicator)
	return append(out, peersValueRenderings(m, r, v, whole, ind, hasInd)...)
}

// clusterNumber: a figure of a cluster ("cluster 5") may be named by the
// cluster's number alone, as a list of clusters does ("Clusters 2 (0.40)
// and 5 (0.41) are fragile").
func clusterNumber(r figures.Row) []string {
	if n, ok := strings.CutPrefix(r.Group, "cluster "); ok {
		if _, err := strconv.Atoi(n); err == nil {
			return []string{n}
		}
	}
	return nil
}

func peersValueRenderings(m *figures.Model, r figures.Row, v float64, whole int, ind dataset.Indicator, hasInd bool) []string {
	switch {
	case r.Measure == "companions" || r.Measure == "recovered" || strings.HasSuffix(r.Measure, "_explained"):
		return []string{pct(v), format.Int(int(math.Round(v * 100)))}
	case r.Measure == "silhouette" || strings.HasPrefix(r.Measure, "jaccard") || strings.HasPrefix(r.Measure, "silhouette_k"):
		return []string{format.Number(v, 2)}
	case r.Measure == "difference" && hasInd:
		return []string{format.Difference(ind, v), format.Number(math.Abs(v), ind.Decimals), format.Value(ind, math.Abs(v))}
	case (r.Measure == "centroid" || r.Measure == "mean" || r.Measure == "value") && hasInd:
		return []string{format.Value(ind, v), format.Number(v, ind.Decimals)}
	case r.Measure == "weight":
		return []string{strconv.FormatFloat(v, 'f', -1, 64)}
	case r.Measure == "distance":
		return []string{format.Number(v, 2)}
	}
	return []string{format.Int(whole)}
}
