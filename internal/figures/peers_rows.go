package figures

import (
	"fmt"
	"math"
	"strings"

	"peerpack/internal/peers"
)

// ClusterGroup is the group column of a cluster's rows in section peers
// ("cluster 2").
func ClusterGroup(n int) string { return fmt.Sprintf("cluster %d", n) }

// CountryMeasure is the measure of a cluster's count of members from a
// country ("members_from Kestria").
func CountryMeasure(country string) string { return "members_from " + country }

// NearestGroup is the group column of the nearest-profile rows.
const NearestGroup = "nearest"

// PeersKey builds a key of section peers in the peers year.
func (pm *Peers) Key(group, indicator, inst, measure string) Key {
	return Key{Section: SectionPeers, Group: group, Indicator: indicator, Institution: inst, Year: pm.Year, Measure: measure}
}

// CurveMeasure is the measure of the silhouette curve's point at k.
func CurveMeasure(k int) string { return fmt.Sprintf("silhouette_k%02d", k) }

// peersRows appends the rows of section peers: the settings, every
// clustered institution's cluster, the silhouette curve, each cluster's
// size, centroid, silhouette, stability, countries, typical member and
// name, the map's loadings and variance, the focus's cluster and
// companions, and its nearest profiles with their largest differences.
func (m *Model) peersRows(rows []Row) []Row {
	pm := m.Peers
	if pm == nil {
		return rows
	}
	num := func(k Key, v float64) {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return
		}
		if v == 0 {
			v = 0
		}
		rows = append(rows, Row{Key: k, Value: v})
	}
	text := func(k Key, s string) { rows = append(rows, Row{Key: k, Text: s, IsText: true}) }
	a := pm.Analysis
	top := func(measure string) Key { return pm.Key("", "", "", measure) }
	num(top("k"), float64(a.K))
	num(top("n_clustered"), float64(len(pm.Rows)))
	num(top("n_left_out"), float64(pm.LeftOut))
	num(top("silhouette"), a.Silhouette.Mean)
	num(top("silhouette_rows"), float64(len(a.Silhouette.Rows)))
	num(top("within_ss"), a.WithinSS)
	text(top("method"), pm.Spec.Method)
	text(top("standardise"), pm.Spec.Standardise)
	num(top("restarts"), float64(pm.Spec.Restarts))
	num(top("seed"), float64(pm.Spec.SeedValue()))
	num(top("k_auto"), map[bool]float64{true: 1, false: 0}[pm.Spec.K.Auto()])
	num(top("converged"), map[bool]float64{true: 1, false: 0}[a.Converged])
	if a.Stability != nil {
		num(top("resamples"), float64(a.Stability.Resamples))
		num(top("jaccard_fragile"), peers.FragileJaccard)
		num(top("jaccard_stable"), peers.StableJaccard)
	}
	for _, sc := range a.Curve {
		num(top(CurveMeasure(sc.K)), sc.Silhouette)
		num(top(fmt.Sprintf("within_ss_k%02d", sc.K)), sc.WithinSS)
	}
	num(top("pc1_explained"), a.PCA.Explained[0])
	if len(a.PCA.Explained) > 1 {
		num(top("pc2_explained"), a.PCA.Explained[1])
	}
	for j, ind := range pm.Indicators {
		ik := func(measure string) Key { return pm.Key("", ind.Key, "", measure) }
		num(ik("mean"), pm.Means[j])
		num(ik("sd"), pm.SDs[j])
		num(ik("weight"), pm.Weights[j])
		num(ik("loading_pc1"), a.PCA.Loadings.At(j, 0))
		if a.PCA.Loadings.RawMatrix().Cols > 1 {
			num(ik("loading_pc2"), a.PCA.Loadings.At(j, 1))
		}
	}
	for r, inst := range pm.Rows {
		num(pm.Key("", "", m.InstitutionID(inst), "cluster"), float64(a.Labels[r]+1))
	}
	for _, k := range pm.Clusters {
		g := ClusterGroup(k.Number)
		ck := func(measure string) Key { return pm.Key(g, "", "", measure) }
		num(ck("size"), float64(k.Size))
		num(ck("silhouette"), k.Silhouette)
		num(ck("jaccard"), k.Jaccard)
		num(ck("recovered"), k.Recovered)
		text(ck("name"), k.Name)
		cs := make([]string, len(k.Countries))
		for i, c := range k.Countries {
			cs[i] = fmt.Sprintf("%s %d", c.Country, c.N)
		}
		text(ck("countries"), strings.Join(cs, "; "))
		for _, c := range k.Countries {
			num(ck(CountryMeasure(c.Country)), float64(c.N))
		}
		num(pm.Key(g, "", m.InstitutionID(k.Typical), "typical"), 1)
		for j, ind := range pm.Indicators {
			num(pm.Key(g, ind.Key, "", "centroid"), k.Centroid[j])
			num(pm.Key(g, ind.Key, "", "centroid_z"), k.CentroidZ[j])
		}
		for i, j := range k.Above {
			num(pm.Key(g, pm.Indicators[j].Key, "", "above"), float64(i+1))
		}
		for i, j := range k.Below {
			num(pm.Key(g, pm.Indicators[j].Key, "", "below"), float64(i+1))
		}
	}
	if pm.FocusCluster >= 0 {
		fid := m.InstitutionID(m.Focus)
		num(pm.Key("", "", fid, "focus_cluster"), float64(pm.FocusCluster+1))
		num(pm.Key("", "", fid, "companions"), pm.FocusCompanions)
	}
	// Map coordinates of the institutions a map labels: the tracked
	// institutions and each cluster's typical member.
	mapped := map[int]bool{}
	for _, inst := range m.Named {
		mapped[inst] = true
	}
	for _, k := range pm.Clusters {
		mapped[k.Typical] = true
	}
	for inst := range mapped {
		if x, y, ok := pm.MapPoint(inst); ok {
			num(pm.Key("", "", m.InstitutionID(inst), "pc1"), x)
			num(pm.Key("", "", m.InstitutionID(inst), "pc2"), y)
		}
	}
	for i, nb := range pm.Nearest {
		id := m.InstitutionID(nb.Institution)
		num(pm.Key(NearestGroup, "", id, "order"), float64(i+1))
		num(pm.Key(NearestGroup, "", id, "distance"), nb.Distance)
		num(pm.Key(NearestGroup, "", id, "cluster"), float64(nb.Cluster+1))
		for _, j := range nb.Differs {
			ind := pm.Indicators[j]
			k := m.Data.Dictionary.Index(ind.Key)
			v, _ := m.Data.Value(k, nb.Institution, pm.Year)
			f, _ := m.Data.Value(k, m.Focus, pm.Year)
			num(pm.Key(NearestGroup, ind.Key, id, "value"), v)
			num(pm.Key(NearestGroup, ind.Key, id, "difference"), v-f)
		}
	}
	return rows
}
