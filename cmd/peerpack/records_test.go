package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestRecordCommands runs sample, papers and votes end to end: outputs
// written, an input never overwritten (exit 2), bad input exit 1, and the
// own-papers run with --baselines equal to the world run for one
// institution.
func TestRecordCommands(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "papers.csv")
	if code, _, errs := runArgs("sample", "papers", "-o", p, "--papers", "3000", "--institutions", "40", "--fields", "20"); code != 0 {
		t.Fatalf("sample papers: %d %s", code, errs)
	}
	vals, base := filepath.Join(dir, "values.csv"), filepath.Join(dir, "baselines.csv")
	if code, _, errs := runArgs("papers", p, "-o", vals, "--baselines-out", base); code != 0 {
		t.Fatalf("papers: %d %s", code, errs)
	}
	// Own papers of R00001 with the world's baselines.
	raw, _ := os.ReadFile(p)
	lines := strings.Split(strings.TrimSpace(string(raw)), "\n")
	own := lines[0] + "\n"
	for _, l := range lines[1:] {
		if strings.Contains(strings.Split(l, ",")[5], "R00001") {
			own += l + "\n"
		}
	}
	ownFile, ownVals := filepath.Join(dir, "own.csv"), filepath.Join(dir, "own-values.csv")
	os.WriteFile(ownFile, []byte(own), 0o644)
	if code, _, errs := runArgs("papers", ownFile, "--baselines", base, "-o", ownVals); code != 0 {
		t.Fatalf("papers --baselines: %d %s", code, errs)
	}
	pick := func(file string) string {
		b, _ := os.ReadFile(file)
		var out []string
		for _, l := range strings.Split(string(b), "\n") {
			if strings.HasPrefix(l, "R00001,") {
				out = append(out, l)
			}
		}
		return strings.Join(out, "\n")
	}
	if w, o := pick(vals), pick(ownVals); w == "" || w != o {
		t.Errorf("own papers with baselines:\n%s\nworld run:\n%s", o, w)
	}
	before, _ := os.ReadFile(p)
	if code, _, errs := runArgs("papers", p, "-o", p); code != 2 || !strings.Contains(errs, "is the input") {
		t.Errorf("overwriting the input: %d %s", code, errs)
	}
	if after, _ := os.ReadFile(p); string(after) != string(before) {
		t.Error("the input changed")
	}
	if code, _, errs := runArgs("papers", vals, "-o", filepath.Join(dir, "x.csv")); code != 1 || !strings.Contains(errs, "a papers file needs the columns") {
		t.Errorf("a values file as papers: %d %s", code, errs)
	}
	v, tg, e := filepath.Join(dir, "votes.csv"), filepath.Join(dir, "targets.csv"), filepath.Join(dir, "esteem.csv")
	if code, _, errs := runArgs("sample", "votes", "-o", v, "--targets-out", tg, "--respondents", "300", "--institutions", "40"); code != 0 {
		t.Fatalf("sample votes: %d %s", code, errs)
	}
	if code, _, errs := runArgs("votes", v, "--targets", tg, "--year", "2025", "-o", e); code != 0 || !strings.Contains(errs, "Kish effective sample size") {
		t.Fatalf("votes: %d %s", code, errs)
	}
	if b, _ := os.ReadFile(e); !strings.Contains(string(b), ",2025,peer_esteem,100\n") {
		t.Error("no institution at 100")
	}
	if code, _, _ := runArgs("votes", v, "-o", e); code != 2 {
		t.Errorf("votes without --year: %d, want 2", code)
	}
	if code, _, _ := runArgs("sample", "things", "-o", e); code != 2 {
		t.Errorf("sample things: %d, want 2", code)
	}
}
