package narrative

import (
	"fmt"
	"os"
	"sort"
	"strconv"
	"strings"
	"testing"

	"gopkg.in/yaml.v3"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// situation is a small invented comparison written by hand: a dictionary,
// a register with values, the groups and one commentary block. Tests and
// the review set (testdata/narrative/review) are written in this form.
type situation struct {
	// About says what the situation shows.
	About      string              `yaml:"about"`
	Indicators []dataset.Indicator `yaml:"indicators"`
	Focus      string              `yaml:"focus"`
	Year       int                 `yaml:"year"`
	Years      []int               `yaml:"years"`
	Language   string              `yaml:"language"`
	RankBands  int                 `yaml:"rank_bands"`
	// SmallGroup and Noise are the brief's small_group and noise settings
	// (unset: the brief's defaults).
	SmallGroup int     `yaml:"small_group"`
	Noise      float64 `yaml:"noise"`
	// Columns names the value columns as indicator@year.
	Columns []string `yaml:"columns"`
	// Institutions: id -> [country, name, values in column order]; a
	// value of ~ is missing.
	Institutions map[string][]any `yaml:"institutions"`
	// Generated adds Count institutions named Prefix1, Prefix2, ... in
	// Country whose value in every column is Start + i x Step (i from 0).
	Generated *struct {
		Prefix  string  `yaml:"prefix"`
		Count   int     `yaml:"count"`
		Country string  `yaml:"country"`
		Start   float64 `yaml:"start"`
		Step    float64 `yaml:"step"`
	} `yaml:"generated"`
	// Notes: "id indicator@year" -> note.
	Notes map[string]string `yaml:"notes"`
	PPP   bool              `yaml:"ppp"`
	// International lists indicators the loader would mark as
	// international dollars without converting them: currency amounts
	// derived from converted ones (dataset.Indicator.InternationalDollars
	// is never read from a dictionary).
	International []string  `yaml:"international"`
	Groups        yaml.Node `yaml:"groups"`
	// Composite and Peers are the brief's composite: and peers: sections,
	// written as given; with Peers a clusters block follows the
	// commentary.
	Composite yaml.Node `yaml:"composite"`
	Peers     yaml.Node `yaml:"peers"`
	Block     yaml.Node `yaml:"block"`
	// Repeat writes the block this many times (default once), as a brief
	// asking twice for the same commentary would.
	Repeat int `yaml:"repeat"`
	// Expect is the block's text as render prints it; Summary the
	// executive summary's.
	Expect  *string `yaml:"expect"`
	Summary *string `yaml:"summary"`
}

func loadSituation(t *testing.T, path string) *situation {
	t.Helper()
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var s situation
	if err := yaml.Unmarshal(src, &s); err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return &s
}

func parseSituation(t *testing.T, src string) *situation {
	t.Helper()
	var s situation
	if err := yaml.Unmarshal([]byte(src), &s); err != nil {
		t.Fatalf("situation: %v", err)
	}
	return &s
}

func nodeYAML(t *testing.T, n *yaml.Node) string {
	t.Helper()
	if n.Kind == 0 {
		return ""
	}
	out, err := yaml.Marshal(n)
	if err != nil {
		t.Fatal(err)
	}
	return string(out)
}

// build turns a situation into a dataset, a brief and a computed model.
func (s *situation) build(t *testing.T) (*figures.Model, *brief.Brief) {
	t.Helper()
	years := s.Years
	if len(years) == 0 {
		years = []int{s.Year}
	}
	if g := s.Generated; g != nil {
		for i := 0; i < g.Count; i++ {
			row := []any{g.Country, fmt.Sprintf("%s%d", g.Prefix, i+1)}
			for range s.Columns {
				row = append(row, g.Start+float64(i)*g.Step)
			}
			s.Institutions[fmt.Sprintf("%s%03d", g.Prefix, i+1)] = row
		}
		s.Generated = nil
	}
	ids := make([]string, 0, len(s.Institutions))
	for id := range s.Institutions {
		ids = append(ids, id)
	}
	sort.Strings(ids)
	var insts []dataset.Institution
	for _, id := range ids {
		row := s.Institutions[id]
		insts = append(insts, dataset.Institution{ID: id, Country: fmt.Sprint(row[0]), Name: fmt.Sprint(row[1]), Region: "North", Attrs: map[string]string{}})
	}
	reg := dataset.NewRegister("register.csv", insts, nil)
	for i := range s.Indicators {
		if s.Indicators[i].Label == "" {
			s.Indicators[i].Label = s.Indicators[i].Key
		}
	}
	dict := dataset.NewDictionary("indicators.yaml", s.Indicators)
	d := dataset.New(reg, dict, years)
	for _, id := range ids {
		row := s.Institutions[id]
		if len(row) != 2+len(s.Columns) {
			t.Fatalf("institution %s has %d values for %d columns", id, len(row)-2, len(s.Columns))
		}
		for j, col := range s.Columns {
			ind, y := splitColumn(t, dict, col)
			if row[2+j] == nil {
				continue
			}
			v, err := strconv.ParseFloat(fmt.Sprint(row[2+j]), 64)
			if err != nil {
				t.Fatalf("institution %s column %s: %v", id, col, err)
			}
			d.Set(ind, reg.Index(id), y, v)
		}
	}
	for k, note := range s.Notes {
		id, col, _ := strings.Cut(k, " ")
		ind, y := splitColumn(t, dict, col)
		d.Notes[dataset.CellRef{Indicator: ind, Year: y, Institution: reg.Index(id)}] = note
	}
	if s.PPP {
		d.PPP = &dataset.PPPTable{File: "ppp.csv"}
		for _, ind := range s.Indicators {
			if ind.Currency {
				d.PPP.Converted = append(d.PPP.Converted, ind.Key)
			}
		}
	}
	for _, key := range s.International {
		k := dict.Index(key)
		if k < 0 {
			t.Fatalf("international: %q is not an indicator of the situation", key)
		}
		dict.Indicators[k].InternationalDollars = true
	}
	var fm strings.Builder
	fmt.Fprintf(&fm, "---\ntitle: Situation\nfocus: %s\nyear: %d\nyears: [%d, %d]\n", s.Focus, s.Year, years[0], years[len(years)-1])
	fm.WriteString("data: {register: register.csv, values: values.csv, dictionary: indicators.yaml}\n")
	if s.Language != "" {
		fmt.Fprintf(&fm, "language: %s\n", s.Language)
	}
	if s.SmallGroup > 0 {
		fmt.Fprintf(&fm, "small_group: %d\n", s.SmallGroup)
	}
	if s.Noise > 0 {
		fmt.Fprintf(&fm, "noise: %v\n", s.Noise)
	}
	if s.RankBands > 0 {
		fmt.Fprintf(&fm, "rank_bands: %d\n", s.RankBands)
	}
	fm.WriteString("groups:\n")
	for _, line := range strings.Split(strings.TrimRight(nodeYAML(t, &s.Groups), "\n"), "\n") {
		fm.WriteString("  " + line + "\n")
	}
	for _, sec := range []struct {
		name string
		node *yaml.Node
	}{{"composite", &s.Composite}, {"peers", &s.Peers}} {
		if sec.node.Kind == 0 {
			continue
		}
		fm.WriteString(sec.name + ":\n")
		for _, line := range strings.Split(strings.TrimRight(nodeYAML(t, sec.node), "\n"), "\n") {
			fm.WriteString("  " + line + "\n")
		}
	}
	fm.WriteString("---\n\n# Situation\n")
	for range max(s.Repeat, 1) {
		fm.WriteString("\n```commentary\n")
		fm.WriteString(nodeYAML(t, &s.Block))
		fm.WriteString("```\n")
	}
	if s.Peers.Kind != 0 {
		fm.WriteString("\n```clusters\n```\n")
	}
	b, err := brief.Parse("brief.md", []byte(fm.String()))
	if err != nil {
		t.Fatalf("brief: %v\n%s", err, fm.String())
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		t.Fatalf("figures: %v", err)
	}
	return m, b
}

func splitColumn(t *testing.T, dict *dataset.Dictionary, col string) (int, int) {
	t.Helper()
	key, ys, ok := strings.Cut(col, "@")
	y, err := strconv.Atoi(ys)
	if !ok || err != nil || dict.Index(key) < 0 {
		t.Fatalf("column %q: want indicator@year with a dictionary key", col)
	}
	return dict.Index(key), y
}

// render prints paragraphs as the review files write them: a paragraph per
// line, "Heading: " before run-in headings, "- " before bullets.
func render(ps []Paragraph) string {
	var b strings.Builder
	for _, p := range ps {
		if p.Bullet {
			b.WriteString("- ")
		}
		if p.Heading != "" {
			b.WriteString(p.Heading + ": ")
		}
		b.WriteString(p.Text())
		b.WriteString("\n")
	}
	return b.String()
}

// compose builds the situation and writes its commentary, checking it with
// Verify.
func (s *situation) compose(t *testing.T) (*Commentary, *figures.Model, *brief.Brief) {
	t.Helper()
	m, b := s.build(t)
	c, err := Compose(m, b)
	if err != nil {
		t.Fatalf("Compose: %v", err)
	}
	if err := Verify(m, c); err != nil {
		t.Errorf("Verify: %v", err)
	}
	return c, m, b
}

// blockText is the text of the situation's one commentary block.
func blockText(c *Commentary, b *brief.Brief) string {
	for _, blk := range b.Blocks {
		if cb, ok := blk.(*brief.CommentaryBlock); ok {
			return render(c.Blocks[cb])
		}
	}
	return ""
}
