package build

import (
	"bytes"
	"os/exec"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/brief"
	"peerpack/internal/demo"
	"peerpack/internal/narrative"
)

// peersDemo is the demo scenario, whose brief has a peers: section, a
// cluster group and a clusters block.
func peersDemo(t *testing.T) fstest.MapFS {
	t.Helper()
	fsys := fstest.MapFS{}
	for name, data := range demo.Files() {
		fsys[name] = &fstest.MapFile{Data: data}
	}
	src := string(fsys["brief.md"].Data)
	if !strings.Contains(src, "cluster: focus") || !strings.Contains(src, "```clusters") {
		t.Fatal("the demo brief no longer has its peer-group section")
	}
	return fsys
}

// The peer-group section end to end: every sentence traceable to the
// figures it cites (narrative.Verify), the focus in its own cluster group,
// the section's tables and charts in the PDF (pdftotext, poppler-utils),
// and a second pack over the same dataset reusing the clusters.
func TestPeersSectionEndToEnd(t *testing.T) {
	fsys := peersDemo(t)
	in, err := Load(Source{FS: fsys, Brief: "brief.md", Display: "brief.md"}, nil)
	if err != nil {
		t.Fatal(err)
	}
	pm := in.Figures.Peers
	if pm == nil || pm.FocusCluster < 0 {
		t.Fatalf("no peers or focus unclustered: %+v", pm)
	}
	g, ok := in.Figures.Group("Profile cluster")
	if !ok || !g.FocusIn || len(g.Members) != pm.Clusters[pm.FocusCluster].Size {
		t.Fatalf("the focus's cluster group: %+v", g)
	}
	p, err := Pack(in, demoCreated, "test")
	if err != nil {
		t.Fatal(err)
	}
	if err := narrative.Verify(in.Figures, p.Commentary); err != nil {
		t.Fatal(err)
	}
	n := 0
	for blk, paras := range p.Commentary.Clusters {
		if _, ok := any(blk).(*brief.ClustersBlock); ok && len(paras) > 0 {
			n++
		}
	}
	if n != 1 {
		t.Fatalf("%d clusters blocks with text", n)
	}
	if _, err := exec.LookPath("pdftotext"); err != nil {
		t.Skip("pdftotext not installed")
	}
	cmd := exec.Command("pdftotext", "-", "-")
	cmd.Stdin = bytes.NewReader(p.PDF)
	out, err := cmd.Output()
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Peer clusters, largest first", "A map of the sector by profile", "How clearly the institutions fall into clusters", "How stable the clusters are", "Nearest profiles to University of Wendholm", "Component 1 ("} {
		if !bytes.Contains(out, []byte(want)) {
			t.Errorf("the pack lacks %q", want)
		}
	}
	other, err := Refocus(in, func(b *brief.Brief) { b.Focus = "KE002" })
	if err != nil {
		t.Fatal(err)
	}
	if other.Figures.Peers.Clustering != pm.Clustering {
		t.Error("refocusing clustered the dataset again")
	}
}
