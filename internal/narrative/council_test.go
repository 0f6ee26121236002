package narrative

import (
	"fmt"
	"math/rand"
	"strings"
	"testing"

	"gopkg.in/yaml.v3"
)

// A small world worked by hand for the standouts, moves, questions and
// peerchoice topics. Seven institutions hold 20, 30, ..., 80 on every
// indicator in both years; the focus F is the eighth. Percentile rank =
// 100 x (values worse + half the ties, itself counted) / n; type-7
// quartiles (all worked by hand):
//
//   - intl: F 45 in 2020 (3 worse of 8: 43.75, "44th"), 10 in 2025 (0
//     worse: 6.25, "6th"); 2025 values 10..80 give Q1 27.5, so F is in
//     the bottom quarter and fell by 37.5 points: the "falling" question.
//   - cit: F 90 in 2020 (7 worse: 93.75, "94th"), 75 in 2025 (6 worse:
//     81.25, "81st"); 2025 Q3 of 20..70, 75, 80 is 71.25, F is above it,
//     more than 5 points from 75: the "slipping" question.
//   - pap: F 55 in both years (4 worse: 56.25, "56th"): within noise.
//
// Chosen peers E, G, H (60, 70, 80), the focus outside: F is placed as a
// fourth value. pap 55: 0 worse of 4, 12.5 ("13th"), below the middle,
// while 56th in the sector is above it; intl 10: 12.5, below in both;
// cit 75: 2 worse of 4, 62.5, above in both.
const councilWorld = `
indicators:
  - {key: intl, label: International staff share, unit: percent, better: higher, decimals: 1}
  - {key: cit, label: Citation impact, unit: index, better: higher, decimals: 2}
  - {key: pap, label: Papers per academic, unit: ratio, better: higher, decimals: 2}
small_group: 2
focus: F
year: 2025
years: [2020, 2025]
columns: [intl@2020, intl@2025, cit@2020, cit@2025, pap@2020, pap@2025]
institutions:
  F: [Kestria, Arlen University, 45, 10, 90, 75, 55, 55]
  A: [Kestria, Bexmoor College, 20, 20, 20, 20, 20, 20]
  B: [Kestria, Corrin Institute, 30, 30, 30, 30, 30, 30]
  C: [Kestria, Dunmere University, 40, 40, 40, 40, 40, 40]
  D: [Kestria, Elswick Polytechnic, 50, 50, 50, 50, 50, 50]
  E: [Kestria, Fallow Bay University, 60, 60, 60, 60, 60, 60]
  G: [Kestria, Gorran College, 70, 70, 70, 70, 70, 70]
  H: [Kestria, Hessle University, 80, 80, 80, 80, 80, 80]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
  - {name: Chosen peers, members: [E, G, H]}
`

func councilText(t *testing.T, block string) string {
	t.Helper()
	s := parseSituation(t, councilWorld+"block: "+block+"\n")
	c, m, b := s.compose(t)
	if err := Verify(m, c); err != nil {
		t.Fatalf("Verify: %v", err)
	}
	return blockText(c, b)
}

func wantAll(t *testing.T, text string, want ...string) {
	t.Helper()
	for _, w := range want {
		if !strings.Contains(text, w) {
			t.Errorf("missing %q in:\n%s", w, text)
		}
	}
}

func TestQuestionsWorkedByHand(t *testing.T) {
	text := councilText(t, "{style: bullets, groups: [Kestria sector], topics: [questions]}")
	wantAll(t, text,
		"In the bottom quarter of the Kestria sector (6th percentile in 2025) and down from the 44th percentile in 2020: what is being done to reverse the fall",
		"Still in the top quarter of the Kestria sector (81st percentile in 2025) but down from the 94th percentile in 2020: is the lead at risk")
	// The falling question comes before the slipping one, and pap (56th,
	// steady) raises none.
	if i, j := strings.Index(text, "bottom quarter"), strings.Index(text, "top quarter"); i < 0 || j < 0 || i > j {
		t.Errorf("questions out of order:\n%s", text)
	}
	if strings.Contains(text, "Papers per academic") {
		t.Errorf("a question about a steady, above-the-middle position:\n%s", text)
	}
}

func TestMovesWorkedByHand(t *testing.T) {
	text := councilText(t, "{style: bullets, groups: [Kestria sector], topics: [moves]}")
	wantAll(t, text,
		"International staff share",
		"from the 44th to the 6th percentile",
		"Citation impact",
		"On papers per academic, Arlen University's percentile in the Kestria sector moved by less than 5 points over the span")
}

func TestStandoutsWorkedByHand(t *testing.T) {
	text := councilText(t, "{style: bullets, groups: [Kestria sector, Chosen peers], topics: [standouts]}")
	// Above the middle: cit (81st), pap (56th); below: intl (6th).
	wantAll(t, text,
		"stands furthest above the middle in the Kestria sector are citation impact (81st percentile) and papers per academic (56th)",
		"Only one indicator places Arlen University below the middle in the Kestria sector: international staff share (6th percentile)")
}

func TestPeerChoiceWorkedByHand(t *testing.T) {
	text := councilText(t, "{style: detail, groups: [Kestria sector, Chosen peers], topics: [peerchoice]}")
	wantAll(t, text,
		"stands above the middle on citation impact",
		"stands below the middle on international staff share",
		"Arlen University is above the middle of the Kestria sector (56th percentile) but below the middle of the chosen peers (13th percentile)")
}

// TestNoQuestionClaimsEveryIndicator: a focus at the top of every group
// is asked nothing, and the sentence saying so records one claim per
// indicator and group.
func TestNoQuestionClaimsEveryIndicator(t *testing.T) {
	src := strings.Replace(councilWorld, "F: [Kestria, Arlen University, 45, 10, 90, 75, 55, 55]", "F: [Kestria, Arlen University, 85, 85, 85, 85, 85, 85]", 1)
	s := parseSituation(t, src+"block: {style: bullets, groups: [Kestria sector, Chosen peers], topics: [questions]}\n")
	c, m, _ := s.compose(t)
	if err := Verify(m, c); err != nil {
		t.Fatal(err)
	}
	var found bool
	for _, se := range c.Sentences {
		if strings.Contains(se.Text, "raise no question") {
			found = true
			if len(se.Claims) != 6 {
				t.Errorf("%d claims, want one per indicator and group (6): %v", len(se.Claims), se.Claims)
			}
		}
	}
	if !found {
		t.Errorf("no sentence saying no question arose")
	}
}

// TestCouncilClaimsTurnedRoundFail: every claim these topics record is
// one Verify can catch: turned round, it fails.
func TestCouncilClaimsTurnedRoundFail(t *testing.T) {
	s := parseSituation(t, councilWorld+"block: {style: bullets, groups: [Kestria sector, Chosen peers], topics: [standouts, moves, questions, peerchoice]}\n")
	c, m, _ := s.compose(t)
	flip := map[string]string{OpLess: OpGreaterEq, OpLessEq: OpGreater, OpGreater: OpLessEq, OpGreaterEq: OpLess, OpEqual: OpNotEqual, OpNotEqual: OpEqual}
	n := 0
	for i := range c.Sentences {
		for j := range c.Sentences[i].Claims {
			cl := &c.Sentences[i].Claims[j]
			old := cl.Op
			cl.Op = flip[old]
			if Verify(m, c) == nil {
				t.Errorf("claim %s of %q turned round still passes", *cl, c.Sentences[i].Text)
			}
			cl.Op = old
			n++
		}
	}
	if n < 20 {
		t.Errorf("only %d claims recorded", n)
	}
	if err := Verify(m, c); err != nil {
		t.Fatal(err)
	}
}

// TestCouncilTopicsRandomWorlds composes the four topics over 200 random
// worlds (the generator of TestRandomSituationsAreTraceable, its own
// seed) with zero false claims and every printed number traceable.
func TestCouncilTopicsRandomWorlds(t *testing.T) {
	rng := rand.New(rand.NewSource(20261202))
	n := 200
	if testing.Short() {
		n = 30
	}
	kinds := map[string]int{"bottom quarter of": 0, "Last of": 0, "top quarter of": 0, "raise no question": 0,
		"moved by less than": 0, "No movement can be read": 0, "The reading depends": 0, "Whichever of": 0,
		"stands furthest above": 0, "stands furthest below": 0}
	claims := 0
	topics := []string{"standouts", "moves", "questions", "peerchoice"}
	for i := 0; i < n; i++ {
		var doc map[string]any
		if err := yaml.Unmarshal([]byte(randomSituation(rng)), &doc); err != nil {
			t.Fatal(err)
		}
		var tp []string
		for _, x := range topics {
			if rng.Intn(2) == 0 {
				tp = append(tp, x)
			}
		}
		if len(tp) == 0 {
			tp = topics
		}
		style := []string{"detail", "bullets"}[rng.Intn(2)]
		doc["block"] = map[string]any{"style": style, "topics": tp}
		out, _ := yaml.Marshal(doc)
		src := string(out)
		t.Run(fmt.Sprint(i), func(t *testing.T) {
			defer func() {
				if r := recover(); r != nil {
					t.Fatalf("panic: %v\n%s", r, src)
				}
			}()
			s := parseSituation(t, src)
			m, b := s.build(t)
			c, err := Compose(m, b)
			if err != nil {
				t.Fatalf("Compose: %v\n%s", err, src)
			}
			if err := Verify(m, c); err != nil {
				t.Fatalf("Verify: %v\n%s", err, src)
			}
			for _, se := range c.Sentences {
				claims += len(se.Claims)
				for k := range kinds {
					if strings.Contains(se.Text, k) {
						kinds[k]++
					}
				}
			}
		})
	}
	if testing.Short() || t.Failed() {
		return
	}
	for k, v := range kinds {
		if v == 0 {
			t.Errorf("no random world wrote a sentence with %q", k)
		}
	}
	if claims < 1000 {
		t.Errorf("only %d claims checked", claims)
	}
}
