package figures

import (
	"math"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/stats"
)

const peersFront = "focus: KE02\nyear: 2025\npeers:\n  indicators: [fnci, students_per_academic, intl_share]\n  k: 3\n  resamples: 10\n  nearest: 3\ngroups:\n  - name: Our cluster\n    cluster: focus\n  - name: Second\n    cluster: 2\n"

// The cluster groups hold exactly the institutions the peers rows place
// in that cluster; clusters are numbered largest first; the standardising
// mean and SD are the population's (stats.MeanSD, tested against gonum);
// every clustered institution has a cluster row.
func TestClusterGroupsMatchPeersRows(t *testing.T) {
	d, _ := loadFixture(t)
	b := briefWith(t, peersFront, "")
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	pm := m.Peers
	if pm == nil || pm.Analysis.K != 3 {
		t.Fatalf("peers %+v", pm)
	}
	for i := 1; i < len(pm.Clusters); i++ {
		if pm.Clusters[i].Size > pm.Clusters[i-1].Size {
			t.Errorf("cluster %d larger than cluster %d", i+1, i)
		}
	}
	own, _ := m.Group("Our cluster")
	second, _ := m.Group("Second")
	if !own.FocusIn || own.Kind != "cluster" || own.Cluster != pm.FocusCluster+1 {
		t.Errorf("focus cluster group: %+v", own)
	}
	for _, g := range []*Group{own, second} {
		n := 0
		for _, inst := range pm.Rows {
			r, ok := m.Lookup(pm.Key("", "", m.InstitutionID(inst), "cluster"))
			if !ok {
				t.Fatalf("no cluster row for %s", m.InstitutionID(inst))
			}
			if int(r.Value) == g.Cluster {
				n++
				if !g.Has(inst) {
					t.Errorf("%s is in cluster %d but not in group %q", m.InstitutionID(inst), g.Cluster, g.Name)
				}
			}
		}
		if n != len(g.Members) {
			t.Errorf("group %q has %d members, rows say %d", g.Name, len(g.Members), n)
		}
		if !strings.Contains(g.Defined, "cluster") || !strings.Contains(g.Defined, "\u201c") {
			t.Errorf("definition %q", g.Defined)
		}
	}
	for j, ind := range pm.Indicators {
		var vals []float64
		for _, inst := range pm.Rows {
			v, _ := d.Value(d.Dictionary.Index(ind.Key), inst, 2025)
			vals = append(vals, v)
		}
		mean, sd := stats.MeanSD(vals)
		if math.Abs(mean-pm.Means[j]) > 1e-12 || math.Abs(sd-pm.SDs[j]) > 1e-12 {
			t.Errorf("%s: mean %v sd %v, stats says %v %v", ind.Key, pm.Means[j], pm.SDs[j], mean, sd)
		}
	}
	if len(pm.Nearest) != 3 {
		t.Errorf("%d nearest profiles", len(pm.Nearest))
	}
	for i := 1; i < len(pm.Nearest); i++ {
		if pm.Nearest[i].Distance < pm.Nearest[i-1].Distance {
			t.Error("nearest profiles out of order")
		}
	}
	if math.IsNaN(pm.FocusCompanions) {
		t.Error("no stability for the focus")
	}
	for _, k := range pm.Clusters {
		if k.Name == "" || !own.Has(pm.Clusters[pm.FocusCluster].Typical) && k.Number == own.Cluster {
			t.Errorf("cluster %d: name %q, typical %d", k.Number, k.Name, k.Typical)
		}
	}
}

// A batch refocuses one dataset many times: the clusters are computed
// once and shared; only the focus's part differs.
func TestClustersComputedOncePerDataset(t *testing.T) {
	d, _ := loadFixture(t)
	m1, err := Compute(d, briefWith(t, peersFront, ""))
	if err != nil {
		t.Fatal(err)
	}
	b2 := briefWith(t, strings.Replace(peersFront, "focus: KE02", "focus: AL01", 1), "")
	m2, err := Compute(d, b2)
	if err != nil {
		t.Fatal(err)
	}
	if m1.Peers.Clustering != m2.Peers.Clustering {
		t.Error("the second pack clustered again")
	}
	if m1.Peers.ClusterOf(m1.Focus) != m1.Peers.FocusCluster || m2.Peers.ClusterOf(m2.Focus) != m2.Peers.FocusCluster {
		t.Error("focus clusters disagree with ClusterOf")
	}
	b3 := briefWith(t, strings.Replace(peersFront, "k: 3", "k: 2", 1), "")
	m3, err := Compute(d, b3)
	if err != nil {
		t.Fatal(err)
	}
	if m3.Peers.Clustering == m1.Peers.Clustering || m3.Peers.Analysis.K != 2 {
		t.Error("another k must cluster afresh")
	}
}

// Problems with the peers: section or a cluster group, at their lines.
func TestPeersProblems(t *testing.T) {
	d, _ := loadFixture(t)
	cases := []struct{ name, front, want string }{
		{"unknown indicator", "focus: KE02\nyear: 2025\npeers:\n  indicators: [fnci, intl_shar]\n",
			`b.md:10:3: peers: indicator "intl_shar" is not in the dictionary indicators.yaml; did you mean "intl_share"?`},
		{"cluster out of range", strings.Replace(peersFront, "cluster: 2", "cluster: 7", 1),
			`group "Second": cluster 7 does not exist; the peers section found 3 clusters (1 to 3, largest first)`},
	}
	for _, c := range cases {
		_, err := Compute(d, briefWith(t, c.front, ""))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v\nwant %s", c.name, err, c.want)
		}
	}
	src := "---\ntitle: T\nfocus: KE02\nyear: 2025\ndata: {register: r.csv, values: v.csv, dictionary: d.yaml}\ngroups:\n  - name: Ours\n    cluster: focus\n---\n"
	_, err := brief.Parse("b.md", []byte(src))
	if err == nil || !strings.Contains(err.Error(), `b.md:7:5: group "Ours": cluster groups come from the peers: section`) {
		t.Errorf("cluster without peers: %v", err)
	}
	src = "---\ntitle: T\nfocus: KE02\nyear: 2025\ndata: {register: r.csv, values: v.csv, dictionary: d.yaml}\npeers:\n  indicators: [a, b]\n  k: many\n---\n"
	_, err = brief.Parse("b.md", []byte(src))
	if err == nil || !strings.Contains(err.Error(), "k must be a number of clusters (2 or more) or auto") {
		t.Errorf("bad k: %v", err)
	}
	src = strings.Replace(src, "k: many", "k: 1\n  method: kmedoids\n  colour: red", 1)
	_, err = brief.Parse("b.md", []byte(src))
	if err == nil || !strings.Contains(err.Error(), "colour") {
		t.Errorf("unknown key: %v", err)
	}
}
