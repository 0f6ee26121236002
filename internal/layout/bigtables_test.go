package layout

import (
	"fmt"
	"math/rand/v2"
	"os"
	"regexp"
	"strings"
	"testing"
	"time"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// bigDataset is an invented scenario of n institutions in n/2 towns (two
// each), with nInd indicators over 2024-2025, from a fixed seed: the sizes
// at which tables and heatmaps stop fitting a page.
func bigDataset(n, nInd int) *dataset.Dataset {
	rng := rand.New(rand.NewPCG(20260302, 40))
	var insts []dataset.Institution
	for i := range n {
		insts = append(insts, dataset.Institution{ID: fmt.Sprintf("T%04d", i), Name: fmt.Sprintf("Institute %04d of Applied Studies", i),
			Country: "Valmoria", Region: "North", Attrs: map[string]string{"town": fmt.Sprintf("Town%03d", i/2)}})
	}
	var inds []dataset.Indicator
	for k := range nInd {
		inds = append(inds, dataset.Indicator{Key: fmt.Sprintf("ind%02d", k), Label: fmt.Sprintf("Indicator number %d with a long descriptive label", k),
			Short: fmt.Sprintf("Ind %d", k), Unit: dataset.UnitPercent, Better: dataset.HigherIsBetter, Decimals: 1})
	}
	d := dataset.New(dataset.NewRegister("register.csv", insts, []string{"town"}), dataset.NewDictionary("indicators.yaml", inds), []int{2024, 2025})
	for i := range insts {
		for k := range inds {
			for _, y := range []int{2024, 2025} {
				d.Set(k, i, y, rng.Float64()*100)
			}
		}
	}
	return d
}

// bigInput computes the figures of a brief over bigDataset.
func bigInput(t *testing.T, d *dataset.Dataset, body string) (Input, error) {
	t.Helper()
	src := "---\ntitle: Large tables\nfocus: T0000\nyear: 2025\nyears: [2024, 2025]\n" +
		"data:\n  register: register.csv\n  values: values.csv\n  dictionary: indicators.yaml\n" +
		"groups:\n  - name: Towns\n    each: town\n  - name: All\n    where: {region: North}\n---\n\n" + body
	b, err := brief.Parse("brief.md", []byte(src))
	if err != nil {
		t.Fatalf("brief: %v", err)
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		return Input{}, err
	}
	return Input{Brief: b, Model: m, FS: os.DirFS(fixtureDir), Created: time.Date(2026, 3, 1, 0, 0, 0, 0, time.UTC), Version: "test"}, nil
}

func keys(prefix string, from, to int) string {
	var out []string
	for k := from; k < to; k++ {
		out = append(out, fmt.Sprintf("%s%02d", prefix, k))
	}
	return strings.Join(out, ", ")
}

func towns(n int) string {
	var out []string
	for k := range n {
		out = append(out, fmt.Sprintf("\"Towns: Town%03d\"", k))
	}
	return strings.Join(out, ", ")
}

// TestLargeTablesSplitOrRefused builds tables and heatmaps of 40
// indicators and of 500 groups: each is set in parts that keep every
// figure whole, with the header on every page, or refused at the block's
// line with what to change.
func TestLargeTablesSplitOrRefused(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out large tables")
	}
	d := bigDataset(1000, 40)
	refused := []struct{ name, body, want string }{
		{"groups table of 500 groups", "# T\n\n```table\nkind: groups\ngroups: [Towns]\n```\n",
			"brief.md:19:1: a groups table of 500 groups would be set as 84 tables of 6 groups side by side; name at most 48 groups in the block's groups:, or use kind: systems, which sets one row per group"},
		{"position table of 40 indicators in 500 groups", "# T\n\n```table\nkind: position\ngroups: [Towns]\n```\n",
			"brief.md:19:1: this position table would set 20,000 rows (40 indicators in 500 groups), over the 600 a table may have; name fewer groups or indicators in the block, or split it into several blocks"},
		{"heatmap of 40 indicators", "# T\n\n```chart\nkind: heatmap\ngroups: [All]\nindicators: [" + keys("ind", 0, 40) + "]\n```\n",
			"brief.md:19:1: chart \"heatmap\": a heatmap of 40 indicators is too wide to read: at this width at most 22 columns keep their percentiles legible; list at most 22 indicators in the block's indicators:, or split them over several heatmap blocks"},
	}
	for _, c := range refused {
		t.Run(c.name, func(t *testing.T) {
			in, err := bigInput(t, d, c.body)
			if err != nil {
				t.Fatal(err)
			}
			_, err = Render(in)
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("got %v\nwant %s", err, c.want)
			}
			// check reports the tables' refusals without laying out.
			err = CheckTableSizes(in.Brief, in.Model)
			if isTable := !strings.Contains(c.want, "heatmap"); isTable != (err != nil) || (err != nil && !strings.Contains(err.Error(), c.want)) {
				t.Errorf("CheckTableSizes: got %v, want %s", err, c.want)
			}
		})
	}

	// Set in parts: a groups table of 20 groups (four tables of five),
	// a peers table of 40 indicators (eight tables, each opening with the
	// indicator that orders the rows), a heatmap of 22 indicators, and the
	// 500 groups as rows of a systems table (header repeated on each page).
	body := "# Groups\n\n```table\nkind: groups\ngroups: [" + towns(20) + "]\nindicators: [" + keys("ind", 0, 12) + "]\n```\n\n" +
		"# Peers\n\n```table\nkind: peers\ngroups: [All]\nindicators: [" + keys("ind", 0, 40) + "]\nlimit: 12\n```\n\n" +
		"# Heatmap\n\n```chart\nkind: heatmap\ngroups: [All]\nindicators: [" + keys("ind", 0, 22) + "]\n```\n\n" +
		"# Systems\n\n```table\nkind: systems\ngroups: [Towns]\n```\n"
	in, err := bigInput(t, d, body)
	if err != nil {
		t.Fatal(err)
	}
	pdf, err := Render(in)
	if err != nil {
		t.Fatalf("render: %v", err)
	}
	text := runTool(t, pdf, "pdftotext", "-layout")
	flat := strings.Join(strings.Fields(text), " ")
	for _, want := range []string{
		"(groups 1–5 of 20)", "(groups 16–20 of 20)",
		"(indicators 2–6 of 40)", "(indicators 37–40 of 40)",
	} {
		if !strings.Contains(flat, want) {
			t.Errorf("the pack lacks %q", want)
		}
	}
	if strings.Contains(flat, "(groups 1–6") {
		t.Error("20 groups should be shared out as four parts of five, not 6, 6, 6 and 2")
	}
	// No figure is shortened: an ellipsis after a digit would be one.
	if m := regexp.MustCompile(`\d…`).FindString(text); m != "" {
		t.Errorf("a figure was shortened: %q", m)
	}
	// The systems table's 500 rows run over several pages, each page
	// with its header.
	pages := strings.Split(text, "\f")
	row := regexp.MustCompile(`(?m)^\s*Towns: Town\d{3}\s+2\s+2\s+100%`)
	rows, heads := 0, 0
	for _, p := range pages {
		n := len(row.FindAllString(p, -1))
		if n == 0 {
			continue
		}
		rows += n
		if !strings.Contains(p, "Share") {
			t.Errorf("a page of the systems table has no header:\n%.300s", p)
		}
		heads++
	}
	if rows < 500 || heads < 5 {
		t.Errorf("systems table: %d rows over %d pages, want 500 over several", rows, heads)
	}
}

// TestParts shares items out evenly.
func TestParts(t *testing.T) {
	cases := []struct {
		n, size int
		want    string
	}{
		{0, 6, "[]"}, {6, 6, "[[0 6]]"}, {7, 6, "[[0 4] [4 7]]"}, {20, 6, "[[0 5] [5 10] [10 15] [15 20]]"}, {39, 5, "[[0 5] [5 10] [10 15] [15 20] [20 25] [25 30] [30 35] [35 39]]"},
	}
	for _, c := range cases {
		if got := fmt.Sprint(parts(c.n, c.size)); got != c.want && !(c.want == "[]" && got == "[]") {
			t.Errorf("parts(%d, %d) = %s, want %s", c.n, c.size, got, c.want)
		}
	}
}
