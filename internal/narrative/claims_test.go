package narrative

import (
	"bytes"
	"errors"
	"fmt"
	"math/rand"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/figures"
)

// The six comparison operators mean what they mean in arithmetic
// (common practice, no source), and a claim on a figure the model lacks
// cannot be evaluated.
func TestClaimHolds(t *testing.T) {
	_, m, _ := parseSituation(t, traceSituation).compose(t)
	v := posKey("Kestria sector", "intl", "F", 2025, mValue) // 42 in the fixture
	cases := []struct {
		op    string
		right float64
		want  bool
	}{
		{OpLess, 42, false}, {OpLess, 42.5, true},
		{OpLessEq, 42, true}, {OpLessEq, 41.9, false},
		{OpEqual, 42, true}, {OpEqual, 42.0001, false},
		{OpGreaterEq, 42, true}, {OpGreaterEq, 42.1, false},
		{OpGreater, 41.99, true}, {OpGreater, 42, false},
		{OpNotEqual, 42, false}, {OpNotEqual, 0, true},
	}
	for _, tc := range cases {
		got, err := Claimed(Fig(v), tc.op, Num(tc.right)).Holds(m)
		if err != nil || got != tc.want {
			t.Errorf("42 %s %v = %v, %v; want %v", tc.op, tc.right, got, err, tc.want)
		}
	}
	missing := posKey("Kestria sector", "intl", "F", 2019, mValue)
	if _, err := Claimed(Fig(missing), OpEqual, Num(1)).Holds(m); err == nil {
		t.Error("a claim on a missing figure evaluated without error")
	}
}

// A false claim fails Verify, naming the sentence and the claim.
func TestVerifyCatchesAFalseClaim(t *testing.T) {
	c, m, _ := parseSituation(t, traceSituation).compose(t)
	for i, s := range c.Sentences {
		if len(s.Claims) == 0 {
			continue
		}
		cl := s.Claims[0]
		flipped := map[string]string{OpLess: OpGreaterEq, OpLessEq: OpGreater, OpEqual: OpNotEqual, OpGreaterEq: OpLess, OpGreater: OpLessEq, OpNotEqual: OpEqual}
		cl.Op = flipped[cl.Op]
		c.Sentences[i].Claims = append([]Claim{cl}, s.Claims[1:]...)
		err := Verify(m, c)
		if err == nil || !strings.Contains(err.Error(), "which is false") || !strings.Contains(err.Error(), s.Text) {
			t.Fatalf("Verify = %v, want the false claim %s of %q", err, cl, s.Text)
		}
		return
	}
	t.Fatal("no sentence records a claim")
}

// Every claim row of the figures file is re-evaluated by a short Python
// script (testdata/check_claims.py, Debian's python3 and its csv module
// only), which shares no code with Verify: the claims must hold there
// too, it must read as many as Go recorded, and it must catch one false
// claim planted in a file.
func TestClaimsReevaluatedOutsideGo(t *testing.T) {
	py, err := exec.LookPath("python3")
	if err != nil {
		t.Skip("python3 is not installed (Debian: apt-get install python3)")
	}
	script, _ := filepath.Abs(filepath.Join("testdata", "check_claims.py"))
	dir := t.TempDir()
	var files []string
	want := 0
	write := func(name string, m *figures.Model) string {
		var buf bytes.Buffer
		if err := figures.WriteCSV(&buf, m); err != nil {
			t.Fatal(err)
		}
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	srcs := []string{traceSituation}
	rng := rand.New(rand.NewSource(1202))
	for range 40 {
		srcs = append(srcs, randomSituation(rng))
	}
	var planted *figures.Model
	for i, src := range srcs {
		c, m, _ := parseSituation(t, src).compose(t)
		for _, s := range c.Sentences {
			want += len(s.Claims)
		}
		files = append(files, write(fmt.Sprintf("figures-%02d.csv", i), m))
		if i == 0 {
			planted = m
		}
	}
	out, err := exec.Command(py, append([]string{script}, files...)...).CombinedOutput()
	if err != nil {
		t.Fatalf("check_claims.py: %v\n%s", err, out)
	}
	if got := fmt.Sprintf("checked %d claims, 0 false", want); want == 0 || !strings.Contains(string(out), got) {
		t.Fatalf("check_claims.py printed %q, want %q (and more than none)", out, got)
	}

	// A false claim planted beside the first sentence must be found.
	k := figures.Key{Section: figures.SectionCommentary, Group: "block-01", Institution: sentenceID(9999), Measure: claimMeasure(1)}
	planted.Add(figures.Row{Key: k, Text: posKey("Kestria sector", "intl", "F", 2025, mValue).String() + " < 42", IsText: true})
	bad := write("planted.csv", planted)
	out, err = exec.Command(py, script, bad).CombinedOutput()
	var exit *exec.ExitError
	if !errors.As(err, &exit) || exit.ExitCode() != 1 || !strings.Contains(string(out), ", 1 false") || !strings.Contains(string(out), "is false (42.0 < 42.0)") {
		t.Fatalf("check_claims.py on a planted false claim: %v\n%s", err, out)
	}
}
