package layout

import (
	"fmt"
	"math"
	"strings"

	"peerpack/charts"
	"peerpack/internal/brief"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/peers"
)

// clustersBlock lays out the peer-group section of the brief's peers:
// front matter, part by part in the block's show: order: the commentary,
// the cluster table with generated descriptions, the sector map, the
// silhouette curve, the stability table and the focus's nearest profiles.
func (w *writer) clustersBlock(cb *brief.ClustersBlock) {
	pm := w.m.Peers
	if pm == nil {
		w.noteBox("No peer clusters: the brief has no peers: section.")
		return
	}
	for _, part := range cb.Show {
		switch part {
		case "text":
			if w.com == nil {
				w.noteBox("Commentary not available: this pack was built without the commentary stage, so the text on the peer clusters is missing. The tables and charts are complete.")
				continue
			}
			w.paragraphs(w.com.Clusters[cb])
		case "table":
			w.clusterTable(pm)
		case "map":
			w.sectorMap(cb, pm)
		case "silhouette":
			ch, err := charts.NewSilhouetteCurve(w.m, w.chartTheme())
			if err != nil {
				w.failAt(cb.At, "clusters block: %v", err)
				continue
			}
			spec := &brief.ChartBlock{BlockBase: cb.BlockBase, Type: "scatter", Size: "full", Title: "How clearly the institutions fall into clusters",
				Caption: "Average silhouette width (Rousseeuw 1987) at each number of clusters; higher means members sit closer to their own cluster than to the next."}
			w.setCharts([]placed{{spec: spec, ch: ch}}, false)
		case "stability":
			w.stabilityTable(pm)
		case "nearest":
			w.nearestProfilesTable(pm)
		}
	}
}

func (w *writer) sectorMap(cb *brief.ClustersBlock, pm *figures.Peers) {
	var label []int
	for _, id := range cb.Label {
		i := w.m.Data.Register.Index(id)
		if i < 0 {
			w.failAt(cb.At, "clusters block: label %q is not in the register", id)
			return
		}
		label = append(label, i)
	}
	ch, err := charts.NewSectorMap(w.m, cb.Loadings, label, w.chartTheme())
	if err != nil {
		w.failAt(cb.At, "clusters block: %v", err)
		return
	}
	caption := cb.Caption
	if caption == "" {
		caption = fmt.Sprintf("Each point is one institution, placed by the first two principal components of its standardised profile in %d; the map keeps %s of the variation, so institutions close on it may still differ on what it leaves out.",
			pm.Year, format.Int(int(math.Round((pm.Analysis.PCA.Explained[0]+pm.Analysis.PCA.Explained[1])*100)))+"%")
	}
	spec := &brief.ChartBlock{BlockBase: cb.BlockBase, Type: "scatter", Size: "full", Title: "A map of the sector by profile", Caption: caption}
	w.setCharts([]placed{{spec: spec, ch: ch}}, false)
}

// traitText describes a cluster's centre in a table cell: the
// indicators it stands furthest above and below the population on.
func traitText(pm *figures.Peers, k figures.Cluster) string {
	name := func(js []int) string {
		var s []string
		for _, j := range js {
			ind := pm.Indicators[j]
			if ind.Short != "" {
				s = append(s, ind.Short)
			} else {
				s = append(s, ind.RunningLabel())
			}
		}
		return strings.Join(s, ", ")
	}
	var parts []string
	if len(k.Above) > 0 {
		parts = append(parts, "above: "+name(k.Above))
	}
	if len(k.Below) > 0 {
		parts = append(parts, "below: "+name(k.Below))
	}
	if len(parts) == 0 {
		return "near the population on every indicator"
	}
	return strings.Join(parts, "; ")
}

func (w *writer) clusterTable(pm *figures.Peers) {
	reg := w.m.Data.Register
	g := grid{head: []string{"No.", "Generated name", "Members", "Stands out (centre vs population)", "Main countries", "Most typical member"},
		align: []byte{'R', 'L', 'R', 'L', 'L', 'L'}, caption: "Peer clusters, largest first", maxLines: 14}
	for c, k := range pm.Clusters {
		var cs []string
		for _, cc := range k.Countries {
			cs = append(cs, fmt.Sprintf("%s %s", cc.Country, format.Int(cc.N)))
		}
		row := []cell{{text: format.Int(k.Number)}, {text: k.Name}, {text: format.Int(k.Size)}, {text: traitText(pm, k)}, {text: strings.Join(cs, ", ")}, {text: reg.Institutions[k.Typical].Name}}
		g.rows = append(g.rows, row)
		g.focus = append(g.focus, c == pm.FocusCluster)
	}
	g.notes = append(g.notes, fmt.Sprintf("\u201cStands out\u201d lists the indicators on which a cluster's centre lies at least half a standard deviation above or below the mean of the %s clustered institutions (at most three each, furthest first); names are generated from the first of them and describe values, not merit.", format.Int(len(pm.Rows))))
	if pm.FocusCluster >= 0 {
		g.notes = append(g.notes, "The highlighted row is the cluster of "+reg.Institutions[w.m.Focus].Name+".")
	}
	w.setTable(g)
}

func (w *writer) stabilityTable(pm *figures.Peers) {
	a := pm.Analysis
	st := a.Stability
	head := []string{"No.", "Generated name", "Members", "Mean silhouette"}
	align := []byte{'R', 'L', 'R', 'R'}
	if st != nil {
		head = append(head, "Mean Jaccard", "Resamples recovering it", "Reading")
		align = append(align, 'R', 'R', 'L')
	}
	g := grid{head: head, align: align, caption: "How stable the clusters are"}
	for c, k := range pm.Clusters {
		row := []cell{{text: format.Int(k.Number)}, {text: k.Name}, {text: format.Int(k.Size)}, {text: format.Number(k.Silhouette, 2)}}
		if st != nil {
			reading := "stable"
			switch {
			case k.Fragile():
				reading = "fragile"
			case k.Jaccard < peers.StableJaccard:
				reading = "middling"
			}
			row = append(row, cell{text: format.Number(k.Jaccard, 2)}, cell{text: format.Int(int(math.Round(k.Recovered*100))) + "%"}, cell{text: reading, bold: reading == "fragile"})
		}
		g.rows = append(g.rows, row)
		g.focus = append(g.focus, c == pm.FocusCluster)
	}
	g.notes = append(g.notes, fmt.Sprintf("Silhouette width (Rousseeuw 1987): above 0.5 a member sits clearly in its cluster, below 0.25 it could as well belong to the next. The average over all clustered institutions is %s.", format.Number(a.Silhouette.Mean, 2)))
	if st != nil {
		g.notes = append(g.notes, fmt.Sprintf("Stability (Hennig 2007): the clustering was repeated on %s bootstrap resamples; a cluster is recovered when a resample cluster shares at least %s of their combined members with it (Jaccard), fragile when its mean Jaccard is under %s.",
			format.Int(st.Resamples), format.Number(peers.StableJaccard, 2), format.Number(peers.FragileJaccard, 2)))
	}
	w.setTable(g)
}

func (w *writer) nearestProfilesTable(pm *figures.Peers) {
	if len(pm.Nearest) == 0 {
		return
	}
	reg := w.m.Data.Register
	g := grid{head: []string{"Institution", "Country", "Cluster", "Distance", "Differs most on (its value vs " + reg.Institutions[w.m.Focus].Name + ")"},
		align: []byte{'L', 'L', 'R', 'R', 'L'}, caption: "Nearest profiles to " + reg.Institutions[w.m.Focus].Name, maxLines: 4}
	for _, nb := range pm.Nearest {
		in := reg.Institutions[nb.Institution]
		var diffs []string
		for _, j := range nb.Differs {
			ind := pm.Indicators[j]
			k := w.m.Data.Dictionary.Index(ind.Key)
			v, _ := w.m.Data.Value(k, nb.Institution, pm.Year)
			f, _ := w.m.Data.Value(k, w.m.Focus, pm.Year)
			diffs = append(diffs, fmt.Sprintf("%s %s vs %s", ind.RunningLabel(), format.Value(ind, v), format.Value(ind, f)))
		}
		g.rows = append(g.rows, []cell{{text: in.Name}, {text: in.Country}, {text: format.Int(nb.Cluster + 1)}, {text: format.Number(nb.Distance, 2)}, {text: strings.Join(diffs, "; ")}})
	}
	g.notes = append(g.notes, "Distance: Euclidean, over the standardised (and weighted) profile the clusters use; the indicators listed are those with the largest standardised differences.")
	w.setTable(g)
}
