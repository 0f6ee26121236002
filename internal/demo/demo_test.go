package demo

import (
	"bytes"
	"encoding/csv"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/brief"
	"peerpack/internal/demo/demotest"
)

func TestFilesDeterministic(t *testing.T) {
	a := Files()
	// A second, independent generation must give the same bytes: the
	// cached copy could hide a dependence on map iteration order.
	b := generate(Seed)
	if len(a) != len(b) {
		t.Fatalf("file sets differ: %d and %d files", len(a), len(b))
	}
	for name, data := range a {
		if !bytes.Equal(data, b[name]) {
			t.Errorf("%s differs between two generations from the same seed", name)
		}
	}
	for _, name := range []string{BriefName, RegisterName, DictionaryName, ValuesName, WideValuesName, PPPName, PapersName, VotesName, TargetsName, LogoName} {
		if len(a[name]) == 0 {
			t.Errorf("scenario has no %s", name)
		}
	}
	// Files hands out copies: changing one must not change the next.
	a[RegisterName][0] = 'X'
	if Files()[RegisterName][0] == 'X' {
		t.Error("Files returned shared bytes; a caller's change leaked into the scenario")
	}
}

func TestOtherSeedDiffers(t *testing.T) {
	// Guards against a generator that ignores its seed.
	if bytes.Equal(generate(Seed)[ValuesName], generate(Seed + 1)[ValuesName]) {
		t.Error("values.csv is the same for two seeds")
	}
}

func TestFSConforms(t *testing.T) {
	// testing/fstest.TestFS is the standard library's conformance check
	// for fs.FS implementations.
	if err := fstest.TestFS(FS(), Names()...); err != nil {
		t.Fatal(err)
	}
}

func TestCSVHeaders(t *testing.T) {
	files := Files()
	want := map[string]string{
		RegisterName:   "id,name,country,region,short_name,founded,mission,status,staff_fte",
		ValuesName:     "institution,year,indicator,value,note",
		WideValuesName: "institution,year," + strings.Join(wideKeys, ","),
		PPPName:        "country,year,factor",
		PapersName:     "paper,year,type,field,citations,institutions,countries,affiliation_types",
		VotesName:      "respondent,respondent_country,field,institution",
		TargetsName:    "country,share",
	}
	for name, header := range want {
		// encoding/csv follows RFC 4180 and rejects ragged rows, so
		// ReadAll succeeding means every row has the header's width.
		rows, err := csv.NewReader(bytes.NewReader(files[name])).ReadAll()
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		if got := strings.Join(rows[0], ","); got != header {
			t.Errorf("%s header:\n got %s\nwant %s", name, got, header)
		}
		if len(rows) < 7 {
			t.Errorf("%s has only %d rows", name, len(rows))
		}
	}
}

func TestBriefParsesAndRefersToScenario(t *testing.T) {
	files := Files()
	b, err := brief.Parse(BriefName, files[BriefName])
	if err != nil {
		t.Fatalf("demo brief: %v", err)
	}
	s, err := demotest.Load(FS(), RegisterName, DictionaryName)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range s.Check(b) {
		t.Error(p)
	}
	// Size is context, never ranked as quality.
	if len(s.Size) < 4 {
		t.Errorf("the dictionary has %d size measures; want staff, students, papers and income at least", len(s.Size))
	}
	for _, p := range s.SizeRanked(b) {
		t.Error(p)
	}
	for _, p := range demotest.Unscoped(b) {
		t.Error(p)
	}
	if b.Focus != FocusID {
		t.Errorf("demo brief focus %s, want %s", b.Focus, FocusID)
	}
	kinds := map[string]bool{}
	for _, blk := range b.Blocks {
		k := blk.Kind()
		switch v := blk.(type) {
		case *brief.ChartBlock:
			k += ":" + v.Type
		case *brief.TableBlock:
			k += ":" + v.Type
		case *brief.CommentaryBlock:
			k += ":" + v.Style
		}
		kinds[k] = true
	}
	var want []string
	for _, c := range brief.ChartKinds {
		want = append(want, "chart:"+c)
	}
	for _, c := range brief.TableKinds {
		want = append(want, "table:"+c)
	}
	for _, c := range brief.CommentaryStyles {
		want = append(want, "commentary:"+c)
	}
	want = append(want, "pagebreak", "columns")
	for _, k := range want {
		if !kinds[k] {
			t.Errorf("demo brief uses no %s block; it should show every kind", k)
		}
	}
	if first, ok := b.Blocks[0].(*brief.CommentaryBlock); !ok || first.Style != "summary" {
		t.Error("the demo brief should open with a summary commentary")
	}
	for _, caution := range []string{"Coverage", "value judgements", "Uncertainty", "do not measure"} {
		if !bytes.Contains(b.Body, []byte(caution)) {
			t.Errorf("demo brief lacks the %q caution", caution)
		}
	}
}

func TestExampleBriefIsTheDemoBrief(t *testing.T) {
	ex, err := os.ReadFile(filepath.Join("..", "..", "examples", "demo", BriefName))
	if err != nil {
		t.Fatalf("examples/demo/%s: %v", BriefName, err)
	}
	if !bytes.Equal(ex, Files()[BriefName]) {
		t.Errorf("examples/demo/%s differs from the embedded demo brief; copy internal/demo/brief.md over it", BriefName)
	}
}

func TestWriteRefusesToOverwrite(t *testing.T) {
	dir := t.TempDir()
	if err := Write(dir); err != nil {
		t.Fatal(err)
	}
	for name, data := range Files() {
		got, err := os.ReadFile(filepath.Join(dir, name))
		if err != nil || !bytes.Equal(got, data) {
			t.Errorf("%s not written as generated (%v)", name, err)
		}
	}
	// Writing again over identical files is harmless.
	if err := Write(dir); err != nil {
		t.Fatalf("second write over identical files: %v", err)
	}
	// A changed file is never overwritten, and nothing else is written.
	changed := filepath.Join(dir, RegisterName)
	if err := os.WriteFile(changed, []byte("id,name,country,region\nX1,Mine,Here,There\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Remove(filepath.Join(dir, PPPName)); err != nil {
		t.Fatal(err)
	}
	err := Write(dir)
	if !errors.Is(err, ErrWouldOverwrite) || !strings.Contains(err.Error(), RegisterName) {
		t.Fatalf("Write over a changed file: got %v, want an error naming %s", err, RegisterName)
	}
	if got, _ := os.ReadFile(changed); !bytes.HasPrefix(got, []byte("id,name,country,region\nX1")) {
		t.Error("the changed file was overwritten")
	}
	if _, err := os.Stat(filepath.Join(dir, PPPName)); err == nil {
		t.Error("a refused Write still wrote other files")
	}
	// A path that is a file is refused with a message.
	if err := Write(changed); err == nil || !strings.Contains(err.Error(), "not a folder") {
		t.Errorf("Write into a file: got %v", err)
	}
}

func TestSizeRankedIsCaught(t *testing.T) {
	s, err := demotest.Load(FS(), RegisterName, DictionaryName)
	if err != nil {
		t.Fatal(err)
	}
	src := "---\ntitle: T\nfocus: KE007\nyear: 2025\ndata: {register: institutions.csv, values: values.csv, dictionary: indicators.yaml}\n---\n\n" +
		"```table\nkind: position\nindicators: [papers, citation_impact]\n```\n\n" +
		"```chart\nkind: box\nindicators: [total_income]\n```\n"
	b, err := brief.Parse("size.md", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	got := s.SizeRanked(b)
	if len(got) != 1 || !strings.Contains(got[0], "ranks papers") {
		t.Errorf("a position table on papers: got %q, want one finding on papers (a box of total income is context)", got)
	}
}
