package narrative_test

import (
	"io/fs"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/demo"
	"peerpack/internal/figures"
	"peerpack/internal/narrative"
)

// demoComposite is the demo with a composite section over indicators the
// demo dictionary has.
func demoComposite(t *testing.T, uncertainty string) (*figures.Model, *brief.Brief) {
	t.Helper()
	fsys := demo.FS()
	raw, err := fs.ReadFile(fsys, "brief.md")
	if err != nil {
		t.Fatal(err)
	}
	impact, collab := "citation_impact", "intl_coauthorship"
	section := "composite:\n" +
		"  pillars:\n" +
		"    - {key: research, label: Research, weight: 2, indicators: {" + impact + ": 2, papers_per_academic: 1}}\n" +
		"    - {key: reach, label: Reach, weight: 1, indicators: {" + collab + ": 1}}\n" +
		"    - {key: teaching, label: Teaching, weight: 1, indicators: {students_per_academic: 1}}\n" +
		"  uncertainty: " + uncertainty + "\n"
	src := strings.Replace(withoutComposite(string(raw)), "\ngroups:", "\n"+section+"groups:", 1)
	b, err := brief.Parse("brief.md", []byte(src))
	if err != nil {
		t.Fatalf("brief: %v", err)
	}
	b.Dir = "."
	d, _, err := dataset.Load(fsys, b)
	if err != nil {
		t.Fatal(err)
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	return m, b
}

// Every composite sentence is traceable to the figures it cites, the rank
// never comes without its interval, and a zero perturbation says the rank
// held in every run (common practice, no source; Saisana et al. 2005 for
// the interval).
func TestCompositeTextTraceable(t *testing.T) {
	for _, c := range []struct{ uncertainty, want string }{
		{"{runs: 200, weights: 0.3, normalise: [zscore, percentile], seed: 4}", "% of them (median"},
		{"{runs: 50, weights: 0}", "kept that rank in every one of 50 runs"},
		{"{runs: 0}", "no uncertainty analysis was run"},
	} {
		m, b := demoComposite(t, c.uncertainty)
		com, err := narrative.Compose(m, b)
		if err != nil {
			t.Fatal(err)
		}
		if err := narrative.Verify(m, com); err != nil {
			t.Fatalf("%s: %v", c.uncertainty, err)
		}
		if len(com.Composite) == 0 {
			t.Fatalf("%s: no composite text", c.uncertainty)
		}
		first := com.Composite[0].Text()
		if !strings.Contains(first, c.want) {
			t.Errorf("%s: first paragraph %q lacks %q", c.uncertainty, first, c.want)
		}
		var all []string
		for _, p := range com.Composite {
			all = append(all, p.Text())
		}
		t.Logf("%s:\n%s", c.uncertainty, strings.Join(all, "\n"))
	}
}

// withoutComposite drops a composite: section from a brief's front matter.
func withoutComposite(src string) string {
	var out []string
	skip := false
	for _, l := range strings.Split(src, "\n") {
		if strings.HasPrefix(l, "composite:") {
			skip = true
			continue
		}
		if skip && (strings.HasPrefix(l, " ") || l == "") {
			continue
		}
		skip = false
		out = append(out, l)
	}
	return strings.Join(out, "\n")
}
