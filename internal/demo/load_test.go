package demo

import (
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
)

// TestDatasetLoadsTheScenario runs the real loader over the scenario: every
// file must validate, derive and convert without a single problem, and the
// check report should find nothing suspicious worth a user's attention.
func TestDatasetLoadsTheScenario(t *testing.T) {
	b, err := brief.Parse(BriefName, Files()[BriefName])
	if err != nil {
		t.Fatal(err)
	}
	d, rep, err := dataset.Load(FS(), b)
	if err != nil {
		t.Fatalf("loading the demo scenario:\n%v", err)
	}
	if got := d.Register.Len(); got < 850 {
		t.Errorf("loaded %d institutions", got)
	}
	if len(d.Years) != LastYear-FirstYear+1 {
		t.Errorf("loaded years %v", d.Years)
	}
	for _, s := range rep.Suspicious {
		t.Logf("suspicious: %+v", s)
	}
	var out strings.Builder
	rep.Write(&out)
	t.Log(out.String())
}
