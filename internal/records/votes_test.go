package records

import (
	"bufio"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/limits"
)

const handVotes = `respondent,respondent_country,field,institution
r1,A,natural,U1
r1,A,natural,U2
r2,A,natural,U1
r3,B,social,U2
r3,B,social,U3
r4,C,social,U1
`

var handPlaces = map[string]Place{"U1": {"A", "North"}, "U2": {"B", "North"}, "U3": {"C", "South"}, "U4": {"C", "South"}}
var handRegions = map[string]string{"A": "North", "B": "North", "C": "South"}

func runVotes(t *testing.T, votes, targets string, opt VoteOptions) *VoteResult {
	t.Helper()
	fsys := fstest.MapFS{"v.csv": {Data: []byte(votes)}, "t.csv": {Data: []byte(targets)}}
	var tg *Targets
	if targets != "" {
		var err error
		if tg, err = ReadTargets(OpenFile(fsys, "t.csv", limits.Default())); err != nil {
			t.Fatal(err)
		}
	}
	res, err := Votes(OpenFile(fsys, "v.csv", limits.Default()), tg, opt)
	if err != nil {
		t.Fatal(err)
	}
	return res
}

func voteValue(res *VoteResult, inst, key string) (float64, bool) {
	for _, v := range res.Values {
		if v.Institution == inst && v.Indicator == key {
			return v.Value, true
		}
	}
	return 0, false
}

// TestHandWorkedVotes, computed by hand. Targets A 25 %, B 25 %, C 50 %;
// respondents r1, r2 (A), r3 (B), r4 (C), so N = 4 and the
// post-stratification weights are target x N / respondents of the country:
// A 0.25x4/2 = 0.5, B 0.25x4/1 = 1, C 0.5x4/1 = 2.
//
//	weighted votes: U1 = 0.5 + 0.5 + 2 = 3, U2 = 0.5 + 1 = 1.5, U3 = 1
//	esteem (most voted = 100): 100, 50, 33.3;  unweighted 3, 2, 1: 100, 66.7, 33.3
//	home share: U1 (A) 1/3, U2 (B) 1/1.5, U3 (C) 0
//	regions (A, B North; C South): U1 North 1, South 2: 1/((1/3)^2+(2/3)^2) = 1.8; U2, U3: 1
//	natural: U1 1, U2 0.5, U3 none: 100, 50, 0;  social: U1 2, U2 1, U3 1: 100, 50, 50
//	Kish: (0.5+0.5+1+2)^2 / (0.25+0.25+1+4) = 16/5.5
func TestHandWorkedVotes(t *testing.T) {
	res := runVotes(t, handVotes, "country,share\nA,25\nB,25\nC,50\n", VoteOptions{Year: 2025, Institutions: handPlaces, Regions: handRegions})
	want := []struct {
		inst, key string
		v         float64
	}{
		{"U1", KeyEsteem, 100}, {"U2", KeyEsteem, 50}, {"U3", KeyEsteem, 100.0 / 3},
		{"U1", KeyEsteemUnweighted, 100}, {"U2", KeyEsteemUnweighted, 200.0 / 3}, {"U3", KeyEsteemUnweighted, 100.0 / 3},
		{"U1", KeyVotes, 3}, {"U2", KeyVotes, 1.5}, {"U3", KeyVotes, 1}, {"U1", KeyVotesUnweighted, 3},
		{"U1", KeyHomeShare, 100.0 / 3}, {"U2", KeyHomeShare, 200.0 / 3}, {"U3", KeyHomeShare, 0},
		{"U1", KeyRegions, 1.8}, {"U2", KeyRegions, 1}, {"U3", KeyRegions, 1},
		{"U1", "peer_esteem_natural", 100}, {"U2", "peer_esteem_natural", 50},
		{"U1", "peer_esteem_social", 100}, {"U2", "peer_esteem_social", 50}, {"U3", "peer_esteem_social", 50},
	}
	for _, w := range want {
		if got, ok := voteValue(res, w.inst, w.key); !ok || !near(got, w.v) {
			t.Errorf("%s %s = %v (present %v), want %v (computed by hand)", w.inst, w.key, got, ok, w.v)
		}
	}
	if v, ok := voteValue(res, "U3", "peer_esteem_natural"); !ok || v != 0 {
		t.Errorf("U3 has votes but none in the natural sciences: 0, got %v (present %v)", v, ok)
	}
	// U4 is in the register but named by no one: the survey says nothing
	// about it, so it has no value at all (missing, not 0).
	for _, v := range res.Values {
		if v.Institution == "U4" {
			t.Errorf("U4 is named by no respondent, so it has no %s; got %v", v.Indicator, v.Value)
		}
	}
	if !near(res.Kish, 16/5.5) {
		t.Errorf("Kish = %v, want 16/5.5 (computed by hand)", res.Kish)
	}
	if res.Values[0].Year != 2025 {
		t.Errorf("year %d", res.Values[0].Year)
	}
}

// TestKishWorkedCase: weights 1, 1, 2, 4 give (8)^2 / (1+1+4+16) = 64/22
// (Kish 1965, effective sample size; computed by hand); equal weights give
// n.
func TestKishWorkedCase(t *testing.T) {
	if got := KishESS([]float64{1, 1, 2, 4}); !near(got, 64.0/22) {
		t.Errorf("Kish = %v, want 64/22", got)
	}
	if got := KishESS([]float64{3, 3, 3, 3, 3}); !near(got, 5) {
		t.Errorf("equal weights: %v, want 5", got)
	}
}

// TestPostStratifiedSharesEqualTargets: on a generated survey the weighted
// share of every country equals its target to 1e-12 (the definition of
// post-stratification).
func TestPostStratifiedSharesEqualTargets(t *testing.T) {
	var votes, targets strings.Builder
	if err := SampleVotes(&votes, &targets, SampleOptions{Institutions: 200, Respondents: 3000, VotesEach: 5, Seed: 5}); err != nil {
		t.Fatal(err)
	}
	res := runVotes(t, votes.String(), targets.String(), VoteOptions{Cap: -1})
	fsys := fstest.MapFS{"t.csv": {Data: []byte(targets.String())}}
	tg, err := ReadTargets(OpenFile(fsys, "t.csv", limits.Default()))
	if err != nil {
		t.Fatal(err)
	}
	total := 0.0
	for _, v := range tg.Country {
		total += v
	}
	sums := map[string]float64{}
	all := 0.0
	for i, w := range res.weights {
		sums[res.countryNames[res.respCountry[i]]] += w
		all += w
	}
	for c, v := range tg.Country {
		if got, want := sums[c]/all, v/total; math.Abs(got-want) > 1e-12 {
			t.Errorf("country %s: weighted share %v, target %v", c, got, want)
		}
	}
	if res.Raked || res.Iterations != 1 {
		t.Errorf("country targets only: post-stratification in one step, got raked %v, %d sweeps", res.Raked, res.Iterations)
	}
}

// TestRakingAgainstLoglin rakes respondents laid out as the 4 x 4 table of
// Wikipedia's "Iterative proportional fitting" worked example (from
// memory) to its margins and compares the weighted cell totals with R
// 4.2.2's stats::loglin fit (testdata/ipf_loglin.R writes
// testdata/ipf_loglin.txt). The margins must be met to the raking
// tolerance (1e-10 on shares); cells agree with R to 1e-6 on the table's
// scale of 1,000.
func TestRakingAgainstLoglin(t *testing.T) {
	table := [4][4]int{{40, 30, 20, 10}, {35, 50, 100, 75}, {30, 80, 70, 120}, {20, 30, 40, 50}}
	rows := []float64{150, 300, 400, 150}
	cols := []float64{200, 300, 400, 100}
	var votes strings.Builder
	votes.WriteString("respondent,respondent_country,field,institution\n")
	n := 0
	for i := range table {
		for j := range table[i] {
			for k := 0; k < table[i][j]; k++ {
				n++
				fmt.Fprintf(&votes, "r%d,C%d,F%d,U1\n", n, i+1, j+1)
			}
		}
	}
	var targets strings.Builder
	targets.WriteString("country,field,share\n")
	for i := range rows {
		for j := range cols {
			fmt.Fprintf(&targets, "C%d,F%d,%s\n", i+1, j+1, FormatValue(rows[i]*cols[j]/1000))
		}
	}
	res := runVotes(t, votes.String(), targets.String(), VoteOptions{Cap: -1})
	if !res.Raked || res.Iterations < 2 {
		t.Fatalf("raked %v in %d sweeps", res.Raked, res.Iterations)
	}
	cell := map[[2]int]float64{}
	total := 0.0
	for i, w := range res.weights {
		c, _ := strconv.Atoi(strings.TrimPrefix(res.countryNames[res.respCountry[i]], "C"))
		f, _ := strconv.Atoi(strings.TrimPrefix(res.fieldList[res.respField[i]], "F"))
		cell[[2]int{c - 1, f - 1}] += w
		total += w
	}
	ref := readTable(t, "testdata/ipf_loglin.txt")
	for i := range 4 {
		rowSum := 0.0
		for j := range 4 {
			got := 1000 * cell[[2]int{i, j}] / total
			rowSum += got
			if math.Abs(got-ref[i][j]) > 1e-6 {
				t.Errorf("cell %d,%d: %.12f, R loglin %.12f", i+1, j+1, got, ref[i][j])
			}
		}
		if math.Abs(rowSum/1000-rows[i]/1000) > 1e-10 {
			t.Errorf("row %d margin share %v, target %v", i+1, rowSum/1000, rows[i]/1000)
		}
	}
}

func readTable(t *testing.T, name string) [][]float64 {
	f, err := os.Open(name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var out [][]float64
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		var row []float64
		for _, s := range strings.Fields(sc.Text()) {
			v, err := strconv.ParseFloat(s, 64)
			if err != nil {
				t.Fatal(err)
			}
			row = append(row, v)
		}
		out = append(out, row)
	}
	return out
}

// TestWeightCap: a cap of 1.5 times the mean trims C's weight of 2 and
// says so.
func TestWeightCap(t *testing.T) {
	res := runVotes(t, handVotes, "country,share\nA,25\nB,25\nC,50\n", VoteOptions{Cap: 1.5, Institutions: handPlaces, Regions: handRegions})
	if res.Capped != 1 || len(res.Warnings) == 0 || !strings.Contains(res.Warnings[len(res.Warnings)-1], "capped at 1.5 times the mean weight") {
		t.Errorf("capped %d, warnings %q", res.Capped, res.Warnings)
	}
	// U1 = 0.5 + 0.5 + 1.5 = 2.5
	if got, _ := voteValue(res, "U1", KeyVotes); !near(got, 2.5) {
		t.Errorf("U1 weighted votes %v, want 2.5", got)
	}
}

func TestVoteErrors(t *testing.T) {
	for _, c := range []struct{ votes, targets, want string }{
		{"respondent,field,institution\n", "country,share\nA,1\n", "v.csv:1:1: a votes file has the columns respondent,respondent_country,field,institution (one row per vote); missing: respondent_country"},
		{"respondent,respondent_country,field,institution\nr1,A,x,U1\nr1,B,x,U2\n", "country,share\nA,1\n", "v.csv:3:2: respondent r1 is from A on line 2; a respondent has one country"},
		{"respondent,respondent_country,field,institution\nr1,A,x,\n", "country,share\nA,1\n", "v.csv:2:4: the institution is empty; every vote names its respondent, the respondent's country, the field and the institution voted for"},
		{"respondent,respondent_country,field,institution\nr1,A,x,U1\n", "country,share\nB,1\n", "v.csv: no respondent's country has a target share; the targets name the countries of the votes file"},
	} {
		fsys := fstest.MapFS{"v.csv": {Data: []byte(c.votes)}, "t.csv": {Data: []byte(c.targets)}}
		tg, err := ReadTargets(OpenFile(fsys, "t.csv", limits.Default()))
		if err != nil {
			t.Fatal(err)
		}
		_, err = Votes(OpenFile(fsys, "v.csv", limits.Default()), tg, VoteOptions{})
		if err == nil || err.Error() != c.want {
			t.Errorf("got  %v\nwant %s", err, c.want)
		}
	}
}
