package brief

import (
	"strings"
	"testing"
)

func TestRecordSources(t *testing.T) {
	head := "---\ntitle: T\nfocus: A\nyear: 2024\ndata:\n  register: r.csv\n  values: v.csv\n  dictionary: d.yaml\n"
	b, err := Parse("b.md", []byte(head+"  papers: {file: p.csv, window: 3, counting: fractional, indicators: [citation_impact]}\n  votes: v.csv\n---\n"))
	if err != nil {
		t.Fatal(err)
	}
	p := b.Data.Papers
	if p.File != "p.csv" || p.Window != 3 || p.Counting != "fractional" || len(p.Indicators) != 1 || b.Data.Votes.File != "v.csv" {
		t.Errorf("decoded %+v, %+v", p, b.Data.Votes)
	}
	for _, c := range []struct{ data, want string }{
		{"  papers: {file: p.csv, windw: 3}\n", `data.papers has no key "windw" (keys: file, window, counting, baselines, indicators); did you mean "window"?`},
		{"  papers: {file: p.csv, counting: half}\n", `data.papers counting is full or fractional, not "half"`},
		{"  votes: [a, b]\n", "data.votes is a path or a mapping"},
	} {
		_, err := Parse("b.md", []byte(head+c.data+"---\n"))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want %s", c.data, err, c.want)
		}
	}
}
