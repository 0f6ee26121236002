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
	// The three money indicators are converted at PPP before derivation.
	if d.PPP == nil || len(d.PPP.Converted) != 3 {
		t.Errorf("PPP conversion: %+v, want total_income, research_income and exchange_income converted", d.PPP)
	}
	// The population rule ranks some institutions and excludes others.
	if d.Population == nil || len(d.Population.Excluded) == 0 || len(d.Population.Excluded) == d.Register.Len() {
		t.Error("the population rule should exclude some institutions and keep others")
	}
	// Every derived indicator has values (a derive that silently yields
	// nothing would make the demo's charts empty).
	for _, ind := range d.Dictionary.Indicators {
		col := d.Column(d.Dictionary.Index(ind.Key), LastYear)
		n := 0
		for _, v := range col {
			if v == v { // not NaN
				n++
			}
		}
		if n < d.Register.Len()/2 {
			t.Errorf("%s has values for only %d institutions in %d", ind.Key, n, LastYear)
		}
	}
	var out strings.Builder
	rep.Write(&out)
	t.Log(out.String())
}
