package templates

import (
	"bytes"
	"reflect"
	"slices"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/demo"
	"peerpack/internal/demo/demotest"
)

func TestNames(t *testing.T) {
	want := []string{"client-report", "country-competition", "governing-body"}
	if got := Names(); !reflect.DeepEqual(got, want) {
		t.Fatalf("Names() = %v, want %v", got, want)
	}
}

func TestUnknownNameListsTheNames(t *testing.T) {
	for _, name := range []string{"board", "", "../governing-body", "governing-body.md"} {
		_, err := Brief(name)
		if err == nil {
			t.Errorf("Brief(%q) succeeded", name)
			continue
		}
		for _, n := range Names() {
			if !strings.Contains(err.Error(), n) {
				t.Errorf("Brief(%q) error %q does not list %s", name, err, n)
			}
		}
	}
}

// Every template parses, refers only to what the demo scenario has (so
// `peerpack new` gives a brief that builds at once), and tells the user
// what to edit.
func TestTemplatesBuildOnTheDemoData(t *testing.T) {
	s, err := demotest.Load(demo.FS(), demo.RegisterName, demo.DictionaryName)
	if err != nil {
		t.Fatal(err)
	}
	for _, name := range Names() {
		src, err := Brief(name)
		if err != nil {
			t.Fatal(err)
		}
		b, err := brief.Parse(name+".md", src)
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		for _, p := range s.Check(b) {
			t.Errorf("%s: %s", name, p)
		}
		for _, p := range s.SizeRanked(b) {
			t.Errorf("%s: %s", name, p)
		}
		if n := bytes.Count(src, []byte(EditMarker)); n < 5 {
			t.Errorf("%s has %d %q comments; a template should say what to edit", name, n, EditMarker)
		}
		if !bytes.Contains(src, []byte("<!-- "+EditMarker)) || !bytes.Contains(src, []byte("# "+EditMarker)) {
			t.Errorf("%s should mark edits both in the front matter (# %s) and in the body (<!-- %s)", name, EditMarker, EditMarker)
		}
		if len(b.Blocks) == 0 {
			t.Errorf("%s has no blocks", name)
			continue
		}
		if c, ok := b.Blocks[0].(*brief.CommentaryBlock); !ok || c.Style != "summary" {
			t.Errorf("%s should open with a summary commentary", name)
		}
		for _, p := range demotest.Unscoped(b) {
			t.Errorf("%s: %s", name, p)
		}
		// The usual cautions of the trade, in every pack.
		for _, caution := range []string{"Coverage", "value judgement", "Uncertainty", "do not measure"} {
			if !bytes.Contains(src, []byte(caution)) && !bytes.Contains(src, []byte(strings.ToLower(caution))) {
				t.Errorf("%s lacks the %q caution", name, caution)
			}
		}
	}
}

func TestTemplateShapes(t *testing.T) {
	parse := func(name string) *brief.Brief {
		src, err := Brief(name)
		if err != nil {
			t.Fatal(err)
		}
		b, err := brief.Parse(name+".md", src)
		if err != nil {
			t.Fatal(err)
		}
		return b
	}
	count := func(b *brief.Brief, kind string) int {
		n := 0
		for _, blk := range b.Blocks {
			if blk.Kind() == kind {
				n++
			}
		}
		return n
	}
	// governing-body: the answer first (a summary leading with the
	// chosen peers and a standing table), the composite with its
	// interval, strengths and risks with evidence, movements beyond
	// noise, questions, the scale table, and a definitions table naming
	// every group any block of the pack names.
	gb := parse("governing-body")
	topics := map[string]bool{}
	named := map[string]bool{}
	defined := map[string]bool{}
	var kinds []string
	for _, blk := range gb.Blocks {
		switch v := blk.(type) {
		case *brief.CommentaryBlock:
			for _, tp := range v.Topics {
				topics[tp] = true
			}
			for _, g := range v.Groups {
				named[g] = true
			}
		case *brief.TableBlock:
			kinds = append(kinds, v.Type)
			for _, g := range v.Groups {
				named[g] = true
				if v.Type == "definitions" {
					defined[g] = true
				}
			}
		case *brief.ChartBlock:
			for _, g := range v.Groups {
				named[g] = true
			}
		}
	}
	for _, tp := range []string{"standouts", "moves", "questions"} {
		if !topics[tp] {
			t.Errorf("governing-body has no commentary with topic %s", tp)
		}
	}
	for _, k := range []string{"standing", "scale", "definitions"} {
		if !slices.Contains(kinds, k) {
			t.Errorf("governing-body has no %s table (tables: %v)", k, kinds)
		}
	}
	for g := range named {
		if !defined[g] {
			t.Errorf("governing-body names the group %q but its definitions table does not define it", g)
		}
	}
	if count(gb, "composite") == 0 {
		t.Error("governing-body has no composite block (the overall position with its interval)")
	}
	// It is the demo brief's shape: same focus, years, data and population.
	db, err := brief.Parse(demo.BriefName, demo.Files()[demo.BriefName])
	if err != nil {
		t.Fatal(err)
	}
	if gb.Focus != db.Focus || gb.Year != db.Year || gb.Years != db.Years ||
		!reflect.DeepEqual(gb.Data.Values, db.Data.Values) || gb.Data.Register != db.Data.Register ||
		!reflect.DeepEqual(gb.Population.MinTotal[0].AtLeast, db.Population.MinTotal[0].AtLeast) {
		t.Error("governing-body and the demo brief have drifted apart; keep focus, years, data and population the same")
	}
	// country-competition: one group per system and the population table.
	cc := parse("country-competition")
	hasEach, hasPop := false, false
	for _, g := range cc.Groups {
		hasEach = hasEach || g.Each == "country"
	}
	for _, blk := range cc.Blocks {
		if tb, ok := blk.(*brief.TableBlock); ok && tb.Type == "population" {
			hasPop = len(tb.Groups) >= 5
		}
	}
	if !hasEach || !hasPop {
		t.Errorf("country-competition needs each: country groups (%v) and a population table over the systems (%v)", hasEach, hasPop)
	}
	// client-report: the client's branding and a data appendix.
	cr := parse("client-report")
	if cr.Theme.Logo == "" || cr.Theme.Accent == "" || cr.Theme.Font == "" || cr.Theme.Paper == "" {
		t.Errorf("client-report should set logo, accent, font and paper; got %+v", cr.Theme)
	}
	csrc, _ := Brief("client-report")
	for _, h := range []string{"# Methodology", "# Data appendix", "# Recommendations"} {
		if !bytes.Contains(csrc, []byte(h)) {
			t.Errorf("client-report lacks %q", h)
		}
	}
	// The peer choice reads the agreed list against both sets the data
	// propose, in a table and in sentences; the recommendations are
	// written around inline figures; the evidence appendix is on.
	kindOf := map[string]string{}
	for _, g := range cr.Groups {
		switch {
		case len(g.Members) > 0:
			kindOf[g.Name] = "members"
		case g.Nearest != nil:
			kindOf[g.Name] = "nearest"
		case g.Cluster != nil:
			kindOf[g.Name] = "cluster"
		}
	}
	covers := func(groups []string) bool {
		seen := map[string]bool{}
		for _, g := range groups {
			seen[kindOf[g]] = true
		}
		return seen["members"] && seen["nearest"] && seen["cluster"]
	}
	var choiceTable, choiceText bool
	for _, blk := range cr.Blocks {
		switch v := blk.(type) {
		case *brief.TableBlock:
			choiceTable = choiceTable || (v.Type == "standing" && covers(v.Groups))
		case *brief.CommentaryBlock:
			choiceText = choiceText || (slices.Contains(v.Topics, "peerchoice") && covers(v.Groups))
		}
	}
	if !choiceTable || !choiceText {
		t.Errorf("client-report needs a standing table (%v) and peerchoice commentary (%v) over agreed, nearest and cluster peers", choiceTable, choiceText)
	}
	ps, err := brief.Placeholders(cr)
	if err != nil {
		t.Fatal(err)
	}
	recLine := bytes.Count(csrc[:bytes.Index(csrc, []byte("# Recommendations"))], []byte("\n")) + 1
	inRec := 0
	for _, p := range ps {
		if p.Pos.Line > recLine {
			inRec++
		}
	}
	if inRec < 6 {
		t.Errorf("client-report's recommendations hold %d inline figures; they are written around the figures", inRec)
	}
	if !cr.Sources {
		t.Error("client-report should print the evidence behind every sentence (sources: true)")
	}
}

func TestFilesPutTheTemplateBesideTheDemoData(t *testing.T) {
	files, err := Files("country-competition")
	if err != nil {
		t.Fatal(err)
	}
	want, _ := Brief("country-competition")
	if !bytes.Equal(files[demo.BriefName], want) {
		t.Error("Files does not hold the template as the brief")
	}
	data := demo.Files()
	for name, b := range data {
		if name != demo.BriefName && !bytes.Equal(files[name], b) {
			t.Errorf("Files lacks the demo's %s", name)
		}
	}
	dir := t.TempDir()
	if err := Write("client-report", dir); err != nil {
		t.Fatal(err)
	}
	// Writing a different template into the same folder would replace the
	// brief, so it is refused.
	if err := Write("governing-body", dir); err == nil {
		t.Error("a second template was written over the first")
	}
}
