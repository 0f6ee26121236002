package narrative_test

import (
	"strings"
	"testing"

	"peerpack/internal/figures"
	"peerpack/internal/narrative"
)

// Every composite and cluster sentence that compares, ranks or qualifies
// carries claims, and the claims are not decoration: turning one round
// makes Verify fail. The qualifying words are checked against the rules of
// the method recomputed here from the figures rows: "matters most" is the
// largest first-order index of the focus (Saltelli et al. 2008, from
// memory), a movement "not distinguishable" has overlapping rank
// intervals (Saisana et al. 2005, from memory), the cluster words follow
// the silhouette levels of Kaufman and Rousseeuw (1990, from memory) and
// the Jaccard levels of Hennig (2007, from memory).
var qualifying = []string{
	"On the composite score", "cannot tell apart", "matters most", "did not move", "would lift",
	"could not do it alone", "intervals overlap", "intervals do not overlap",
	"numbered from the largest", "widest average silhouette", "indicates ",
	"grouping", "fragile:", "nearest first", "sets the cluster apart", "within half a standard deviation",
}

func checkQualifyingClaimed(t *testing.T, label string, ps []narrative.Paragraph) int {
	t.Helper()
	n := 0
	for _, p := range ps {
		for _, s := range p.Sentences {
			for _, q := range qualifying {
				if strings.Contains(s.Text, q) {
					n++
					if len(s.Claims) == 0 {
						t.Errorf("%s: %q says %q but records no claim", label, s.Text, q)
					}
					break
				}
			}
		}
	}
	return n
}

// flipped returns a copy of the commentary with the first claim of the
// first sentence containing want turned round (< for >=, and so on).
func flipped(com *narrative.Commentary, want string) (*narrative.Commentary, bool) {
	turn := map[string]string{"<": ">=", "<=": ">", "=": "!=", ">=": "<", ">": "<=", "!=": "="}
	bad := *com
	bad.Sentences = append([]narrative.Sentence(nil), com.Sentences...)
	for i := range bad.Sentences {
		s := &bad.Sentences[i]
		if strings.Contains(s.Text, want) && len(s.Claims) > 0 {
			cl := append([]narrative.Claim(nil), s.Claims...)
			cl[0].Op = turn[cl[0].Op]
			s.Claims = cl
			return &bad, true
		}
	}
	return nil, false
}

func TestCompositeSentencesClaim(t *testing.T) {
	for _, unc := range []string{
		"{runs: 200, weights: 0.3, normalise: [zscore, percentile], seed: 4}",
		"{runs: 300, weights: 0.5, impute: [group-median, pillar-mean], seed: 9}",
		"{runs: 50, weights: 0}",
		"{runs: 0}",
	} {
		m, b := demoComposite(t, unc)
		com, err := narrative.Compose(m, b)
		if err != nil {
			t.Fatal(err)
		}
		if err := narrative.Verify(m, com); err != nil {
			t.Fatalf("%s: %v", unc, err)
		}
		if n := checkQualifyingClaimed(t, unc, com.Composite); n == 0 {
			t.Fatalf("%s: no qualifying composite sentence found", unc)
		}
		// "matters most": recompute the largest first-order index of the
		// focus from the figures rows.
		for _, p := range com.Composite {
			for _, s := range p.Sentences {
				if !strings.Contains(s.Text, "matters most") {
					continue
				}
				best, bestV := figures.Key{}, -1.0
				for r := range m.Rows() {
					if r.Section == figures.SectionComposite && r.Institution == m.FocusID && r.Year == m.Year && strings.HasPrefix(r.Measure, "first_order_") && !r.IsText && r.Value > bestV {
						best, bestV = r.Key, r.Value
					}
				}
				if len(s.Cites) != 1 || s.Cites[0] != best {
					t.Errorf("%s: %q cites %v; the largest first-order index is %s (%g)", unc, s.Text, s.Cites, best, bestV)
				}
			}
		}
		for _, want := range []string{"On the composite score", "matters most", "would lift"} {
			bad, ok := flipped(com, want)
			if !ok {
				continue
			}
			if err := narrative.Verify(m, bad); err == nil || !strings.Contains(err.Error(), "which is false") {
				t.Errorf("%s: a turned-round claim on %q passed Verify (%v)", unc, want, err)
			}
		}
	}
}

func TestClusterSentencesClaim(t *testing.T) {
	m, b := demoModel(t)
	com, err := narrative.Compose(m, b)
	if err != nil {
		t.Fatal(err)
	}
	if len(com.Clusters) == 0 {
		t.Skip("the demo brief has no clusters block")
	}
	for _, ps := range com.Clusters {
		if n := checkQualifyingClaimed(t, "clusters", ps); n == 0 {
			t.Fatal("no qualifying cluster sentence found")
		}
		// The silhouette word against Kaufman and Rousseeuw's levels,
		// recomputed from the figures row.
		r, ok := m.Lookup(m.Peers.Key("", "", "", "silhouette"))
		if !ok {
			t.Fatal("no silhouette row")
		}
		word := "a reasonable structure"
		switch {
		case r.Value < 0.25:
			word = "no substantial structure"
		case r.Value < 0.5:
			word = "a weak structure"
		}
		found := false
		for _, p := range ps {
			if strings.Contains(p.Text(), "which indicates "+word) {
				found = true
			}
		}
		if !found {
			t.Errorf("silhouette %g: no sentence says %q", r.Value, word)
		}
		for _, want := range []string{"numbered from the largest", "indicates ", "nearest first"} {
			bad, ok := flipped(com, want)
			if !ok {
				t.Errorf("no claimed sentence says %q", want)
				continue
			}
			if err := narrative.Verify(m, bad); err == nil || !strings.Contains(err.Error(), "which is false") {
				t.Errorf("a turned-round claim on %q passed Verify (%v)", want, err)
			}
		}
	}
}
