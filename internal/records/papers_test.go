package records

import (
	"bytes"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
	"testing/fstest"

	"github.com/parquet-go/parquet-go"

	"peerpack/internal/limits"
)

// handPapers is the hand-worked example: three fine fields (1.1 natural
// sciences, 3.2 clinical medicine, 6.1 history; Frascati 2015 codes), two
// years, one document type, three institutions A, B, C in countries X, Y,
// Z. P8 has two fields; health 2024 has no citations at all.
const handPapers = `paper,year,type,field,citations,institutions,countries
P1,2023,article,1.1,4,A;B,X;Y
P2,2023,article,1.1,2,A,X
P3,2023,article,1.1,0,B,Y
P4,2023,article,3.2,10,A;C,X;X
P5,2023,article,3.2,6,C,Z
P6,2024,article,1.1,3,A,X
P7,2024,article,1.1,1,C,Z
P8,2024,article,6.1;1.1,2,B,Y
P9,2024,article,6.1,0,A,X
P10,2024,article,3.2,0,B,Y
P11,2024,article,3.2,0,C,Z
`

func run(t *testing.T, files map[string]string, name string, opt PaperOptions) *PaperResult {
	t.Helper()
	fsys := fstest.MapFS{}
	for n, s := range files {
		fsys[n] = &fstest.MapFile{Data: []byte(s)}
	}
	res, err := Papers(OpenFile(fsys, name, limits.Default()), opt)
	if err != nil {
		t.Fatal(err)
	}
	return res
}

func valueOf(res *PaperResult, inst string, year int, key string) (float64, bool) {
	for _, v := range res.Values {
		if v.Institution == inst && v.Year == year && v.Indicator == key {
			return v.Value, true
		}
	}
	return 0, false
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-12*math.Max(1, math.Abs(b)) }

// TestHandWorkedPapers checks every indicator of the example against
// values computed by hand from the definitions (item-oriented MNCS,
// Waltman et al. 2011; top 10 % with fractional ties, Waltman and
// Schreiber 2013; Frascati 2015 broad fields). Computed by hand:
//
// Step 1, baselines (a paper in k fields counts 1/k in each):
//
//	1.1/2023: P1 4, P2 2, P3 0           W 3    C 6   expected 2
//	3.2/2023: P4 10, P5 6                W 2    C 16  expected 8
//	1.1/2024: P6 3, P7 1, P8 2 (x1/2)    W 2.5  C 5   expected 2
//	6.1/2024: P8 2 (x1/2), P9 0          W 1.5  C 1   expected 2/3
//	3.2/2024: P10 0, P11 0               W 2    C 0   expected 0: no ratio
//
// Step 2, top 10 % thresholds (room = W/10; from the most cited down, the
// level that fills the room is the threshold, tie share = (room - weight
// above) / weight at the level):
//
//	1.1/2023 room 0.3:  level 4 (weight 1)   threshold 4, tie share 0.3
//	3.2/2023 room 0.2:  level 10 (1)         threshold 10, 0.2
//	1.1/2024 room 0.25: level 3 (1)          threshold 3, 0.25
//	6.1/2024 room 0.15: level 2 (0.5)        threshold 2, 0.3
//	3.2/2024 room 0.2:  level 0 (2)          threshold 0, 0.1
//
// Step 3, papers: score = mean over fields of citations / expected; top =
// mean over fields of the top 10 % weight:
//
//	P1 4/2 = 2, top 0.3      P2 1, 0         P3 0, 0
//	P4 10/8 = 1.25, 0.2      P5 0.75, 0      P6 1.5, 0.25
//	P7 0.5, 0               P8 (2/2 + 2/(2/3))/2 = 2, (0 + 0.3)/2 = 0.15
//	P9 0, 0                 P10, P11 no score, top 0.1 each
//
// The world mean of the nine scores is 9/9 = 1.
//
// Step 4, institutions over 2023-2024 (full counting):
//
//	A: P1 P2 P4 P6 P9  papers 5, impact (2+1+1.25+1.5+0)/5 = 1.15,
//	   top 10 % (0.3+0.2+0.25)/5 = 15 %, international 1/5 = 20 % (P4 is
//	   X;X, one country), natural 60 %, health 20 %, humanities 20 %
//	B: P1 P3 P8 P10    papers 4, impact (2+0+2)/3 = 4/3 (P10 has none),
//	   top (0.3+0.15+0.1)/4 = 13.75 %, international 25 %,
//	   natural (1+1+0.5)/4 = 62.5 %, health 25 %, humanities 12.5 %
//	C: P4 P5 P7 P11    papers 4, impact (1.25+0.75+0.5)/3 = 5/6,
//	   top (0.2+0.1)/4 = 7.5 %, international 0 %
func TestHandWorkedPapers(t *testing.T) {
	res := run(t, map[string]string{"p.csv": handPapers}, "p.csv", PaperOptions{})
	want := []struct {
		inst, key string
		v         float64
	}{
		{"A", KeyPapers, 5}, {"A", KeyCitationImpact, 1.15}, {"A", KeyTop10Share, 15}, {"A", KeyIntlCoauthorship, 20},
		{"A", "field_natural", 60}, {"A", "field_health", 20}, {"A", "field_humanities", 20}, {"A", "field_social", 0},
		{"B", KeyPapers, 4}, {"B", KeyCitationImpact, 4.0 / 3}, {"B", KeyTop10Share, 13.75}, {"B", KeyIntlCoauthorship, 25},
		{"B", "field_natural", 62.5}, {"B", "field_health", 25}, {"B", "field_humanities", 12.5},
		{"C", KeyPapers, 4}, {"C", KeyCitationImpact, 5.0 / 6}, {"C", KeyTop10Share, 7.5}, {"C", KeyIntlCoauthorship, 0},
	}
	for _, w := range want {
		got, ok := valueOf(res, w.inst, 2024, w.key)
		if !ok || !near(got, w.v) {
			t.Errorf("%s %s = %v (present %v), want %v (computed by hand)", w.inst, w.key, got, ok, w.v)
		}
	}
	if _, ok := valueOf(res, "A", 2023, KeyPapers); ok {
		t.Error("the default window is the whole span: one value under the last year only")
	}
	if _, ok := valueOf(res, "A", 2024, KeyIndustryCoauthorship); ok {
		t.Error("no affiliation type column: no industry co-authorship")
	}
	if res.Papers != 11 || res.NoRatio != 2 || res.NoBaseline != 0 {
		t.Errorf("papers %d, no ratio %d, no baseline %d; want 11, 2, 0", res.Papers, res.NoRatio, res.NoBaseline)
	}
	// The baselines table, step 1 and 2 above.
	wantB := map[string][4]float64{ // papers, expected, threshold, tie share
		"1.1/2023": {3, 2, 4, 0.3}, "3.2/2023": {2, 8, 10, 0.2}, "1.1/2024": {2.5, 2, 3, 0.25},
		"6.1/2024": {1.5, 2.0 / 3, 2, 0.3}, "3.2/2024": {2, 0, 0, 0.1},
	}
	if len(res.Baselines.Rows) != len(wantB) {
		t.Fatalf("%d baselines, want %d", len(res.Baselines.Rows), len(wantB))
	}
	for _, b := range res.Baselines.Rows {
		w := wantB[b.Field+"/"+itoa(b.Year)]
		if !near(b.Papers, w[0]) || !near(b.Expected, w[1]) || float64(b.Threshold) != w[2] || !near(b.TieShare, w[3]) {
			t.Errorf("baseline %s %d: %+v, want papers, expected, threshold, tie share %v (computed by hand)", b.Field, b.Year, b, w)
		}
	}
}

func itoa(i int) string { return FormatValue(float64(i)) }

// TestHandWorkedFractionalAndWindow: fractional counting and one-year
// windows on the same example, computed by hand. Fractional, A over
// 2023-2024: P1 and P4 count 1/2 (two institutions each), so papers =
// 0.5+1+0.5+1+1 = 4, impact = (0.5x2 + 1 + 0.5x1.25 + 1.5 + 0)/4 =
// 1.03125, top 10 % = (0.5x0.3 + 0.5x0.2 + 0.25)/4 = 12.5 %. One-year
// windows, full counting, A in 2023: P1 P2 P4, impact 4.25/3, top 0.5/3;
// in 2024: P6 P9, impact 0.75, top 12.5 %.
func TestHandWorkedFractionalAndWindow(t *testing.T) {
	frac := run(t, map[string]string{"p.csv": handPapers}, "p.csv", PaperOptions{Fractional: true})
	for key, want := range map[string]float64{KeyPapers: 4, KeyCitationImpact: 1.03125, KeyTop10Share: 12.5} {
		if got, _ := valueOf(frac, "A", 2024, key); !near(got, want) {
			t.Errorf("fractional A %s = %v, want %v (computed by hand)", key, got, want)
		}
	}
	win := run(t, map[string]string{"p.csv": handPapers}, "p.csv", PaperOptions{Window: 1})
	for _, c := range []struct {
		year int
		key  string
		want float64
	}{{2023, KeyPapers, 3}, {2023, KeyCitationImpact, 4.25 / 3}, {2023, KeyTop10Share, 50.0 / 3},
		{2024, KeyPapers, 2}, {2024, KeyCitationImpact, 0.75}, {2024, KeyTop10Share, 12.5}} {
		if got, _ := valueOf(win, "A", c.year, c.key); !near(got, c.want) {
			t.Errorf("window 1, A %d %s = %v, want %v (computed by hand)", c.year, c.key, got, c.want)
		}
	}
}

// TestTop10Ties: twelve papers cited 10, 8, 8, 8, 5, 5, 3, 2, 1, 0, 0, 0.
// The top 10 % holds 1.2 papers: the paper cited 10 and 0.2 of the three
// tied at 8, i.e. each of them counts 0.2/3 (Waltman and Schreiber 2013,
// fractional assignment at the threshold; computed by hand). Total 1.2.
func TestTop10Ties(t *testing.T) {
	hist := map[int64]float64{}
	for _, c := range []int64{10, 8, 8, 8, 5, 5, 3, 2, 1, 0, 0, 0} {
		hist[c]++
	}
	th, share := top10Threshold(hist, 12)
	if th != 8 || !near(share, 0.2/3) {
		t.Fatalf("threshold %d, tie share %v; want 8 and %v", th, share, 0.2/3)
	}
	var csv strings.Builder
	csv.WriteString("paper,year,type,field,citations,institutions,countries\n")
	for i, c := range []int{10, 8, 8, 8, 5, 5, 3, 2, 1, 0, 0, 0} {
		inst := "Q"
		if c == 8 && i == 1 {
			inst = "T" // one of the tied papers alone
		}
		csv.WriteString("W" + itoa(i) + ",2024,review,5.2," + itoa(c) + "," + inst + ",K\n")
	}
	res := run(t, map[string]string{"p.csv": csv.String()}, "p.csv", PaperOptions{})
	if got, _ := valueOf(res, "T", 2024, KeyTop10Share); !near(got, 100*0.2/3) {
		t.Errorf("the tied paper's top 10 %% share = %v, want %v", got, 100*0.2/3)
	}
	q, _ := valueOf(res, "Q", 2024, KeyTop10Share)
	// Q holds 11 papers: the one cited 10 and two of the tied: (1 + 2x0.2/3)/11.
	if !near(q, 100*(1+0.4/3)/11) {
		t.Errorf("Q's top 10 %% share = %v, want %v", q, 100*(1+0.4/3)/11)
	}
}

// TestWorldAverageIsOne: with fractional field weights the mean score of
// every paper with a ratio is exactly 1 (the definition's normalisation,
// Waltman et al. 2011), checked on a generated world.
func TestWorldAverageIsOne(t *testing.T) {
	var buf bytes.Buffer
	if err := SamplePapers(&buf, SampleOptions{Papers: 8000, Fields: 4, Institutions: 60, Seed: 7}); err != nil {
		t.Fatal(err)
	}
	res := run(t, map[string]string{"p.csv": buf.String()}, "p.csv", PaperOptions{})
	// The identity needs every baseline to have a ratio (a zero baseline
	// leaves its papers out by definition).
	for _, b := range res.Baselines.Rows {
		if b.Expected == 0 {
			t.Fatalf("the sample has a baseline without citations (%+v); choose another seed", b)
		}
	}
	// One institution holding every paper: a second file with one
	// institution column rewritten is simpler as a direct sum over
	// baselines: sum of W x expected = sum of C, and sum of papers' top
	// weights = a tenth of W per baseline.
	var w, c float64
	for _, b := range res.Baselines.Rows {
		w += b.Papers
		c += b.Citations
		if !near(b.Expected*b.Papers, b.Citations) {
			t.Fatalf("baseline %+v: expected x papers != citations", b)
		}
	}
	if !near(w, float64(res.Papers)) {
		t.Errorf("baseline weights add to %v, want the %d papers", w, res.Papers)
	}
	lines := strings.Split(strings.TrimSpace(buf.String()), "\n")
	var one strings.Builder
	one.WriteString(lines[0] + "\n")
	for _, l := range lines[1:] {
		f := strings.Split(l, ",")
		f[5] = "ALL"
		one.WriteString(strings.Join(f, ",") + "\n")
	}
	all := run(t, map[string]string{"p.csv": one.String()}, "p.csv", PaperOptions{})
	last := all.Last
	if v, _ := valueOf(all, "ALL", last, KeyCitationImpact); !near(v, 1) {
		t.Errorf("world citation impact = %v, want 1 (definition)", v)
	}
	if v, _ := valueOf(all, "ALL", last, KeyTop10Share); !near(v, 10) {
		t.Errorf("world top 10 %% share = %v, want 10 (definition)", v)
	}
}

// TestOwnPapersWithBaselines: an institution's own papers with the world's
// baselines table (written and read back) give exactly the values of the
// full run for that institution.
func TestOwnPapersWithBaselines(t *testing.T) {
	var buf bytes.Buffer
	if err := SamplePapers(&buf, SampleOptions{Papers: 3000, Fields: 30, Institutions: 40, Seed: 11}); err != nil {
		t.Fatal(err)
	}
	for _, fractional := range []bool{false, true} {
		for _, window := range []int{0, 2} {
			full := run(t, map[string]string{"p.csv": buf.String()}, "p.csv", PaperOptions{Fractional: fractional, Window: window})
			var table bytes.Buffer
			if err := full.Baselines.WriteCSV(&table); err != nil {
				t.Fatal(err)
			}
			fsys := fstest.MapFS{"b.csv": {Data: table.Bytes()}}
			base, err := ReadBaselines(OpenFile(fsys, "b.csv", limits.Default()), limits.Default())
			if err != nil {
				t.Fatal(err)
			}
			inst := full.Values[0].Institution
			lines := strings.Split(strings.TrimSpace(buf.String()), "\n")
			own := lines[0] + "\n"
			for _, l := range lines[1:] {
				f := strings.Split(l, ",")
				for _, i := range strings.Split(f[5], ";") {
					if i == inst {
						own += l + "\n"
					}
				}
			}
			mine := run(t, map[string]string{"own.csv": own}, "own.csv", PaperOptions{Fractional: fractional, Window: window, Baselines: base})
			var want []Value
			for _, v := range full.Values {
				if v.Institution == inst {
					want = append(want, v)
				}
			}
			var got []Value
			for _, v := range mine.Values {
				if v.Institution == inst {
					got = append(got, v)
				}
			}
			if len(got) != len(want) || len(want) == 0 {
				t.Fatalf("fractional %v window %d: %d values, want %d", fractional, window, len(got), len(want))
			}
			for i := range want {
				if got[i] != want[i] {
					t.Errorf("fractional %v window %d: %+v, want %+v (identical to the full run)", fractional, window, got[i], want[i])
				}
			}
		}
	}
}

// pairsOf rewrites a per-paper CSV (no quoting) as one row per paper and
// affiliation.
func pairsOf(perPaper string) string {
	lines := strings.Split(strings.TrimSpace(perPaper), "\n")
	out := "paper,year,type,field,citations,institution,country\n"
	for _, l := range lines[1:] {
		f := strings.Split(l, ",")
		insts, countries := strings.Split(f[5], ";"), strings.Split(f[6], ";")
		for i := range insts {
			c := countries[min(i, len(countries)-1)]
			out += strings.Join(append(f[:5:5], insts[i], c), ",") + "\n"
		}
	}
	return out
}

// TestBothShapesAgree: one row per paper and one row per affiliation give
// identical values.
func TestBothShapesAgree(t *testing.T) {
	a := run(t, map[string]string{"p.csv": handPapers}, "p.csv", PaperOptions{})
	b := run(t, map[string]string{"p.csv": pairsOf(handPapers)}, "p.csv", PaperOptions{})
	if len(a.Values) != len(b.Values) {
		t.Fatalf("%d values against %d", len(a.Values), len(b.Values))
	}
	for i := range a.Values {
		if a.Values[i] != b.Values[i] {
			t.Errorf("%+v against %+v", a.Values[i], b.Values[i])
		}
	}
}

// TestParquetEqualsCSV: the same records as Parquet and as CSV give
// identical values and baselines.
func TestParquetEqualsCSV(t *testing.T) {
	var buf bytes.Buffer
	if err := SamplePapers(&buf, SampleOptions{Papers: 2000, Fields: 25, Institutions: 30, Seed: 3, Industry: true}); err != nil {
		t.Fatal(err)
	}
	type row struct {
		Paper     string `parquet:"paper"`
		Year      int32  `parquet:"year"`
		Type      string `parquet:"type"`
		Field     string `parquet:"field"`
		Citations int64  `parquet:"citations"`
		Insts     string `parquet:"institutions"`
		Countries string `parquet:"countries"`
		AffTypes  string `parquet:"affiliation_types"`
	}
	var rows []row
	lines := strings.Split(strings.TrimSpace(buf.String()), "\n")
	for _, l := range lines[1:] {
		f := strings.Split(l, ",")
		y, _ := parseInt([]byte(f[1]))
		c, _ := parseInt([]byte(f[4]))
		rows = append(rows, row{f[0], int32(y), f[2], f[3], c, f[5], f[6], f[7]})
	}
	var pq bytes.Buffer
	w := parquet.NewGenericWriter[row](&pq)
	if _, err := w.Write(rows); err != nil {
		t.Fatal(err)
	}
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	a := run(t, map[string]string{"p.csv": buf.String()}, "p.csv", PaperOptions{})
	b := run(t, map[string]string{"p.parquet": pq.String()}, "p.parquet", PaperOptions{})
	if len(a.Values) != len(b.Values) || len(a.Values) == 0 {
		t.Fatalf("%d values against %d", len(a.Values), len(b.Values))
	}
	for i := range a.Values {
		if a.Values[i] != b.Values[i] {
			t.Fatalf("CSV %+v against Parquet %+v", a.Values[i], b.Values[i])
		}
	}
	if _, ok := valueOf(a, a.Values[0].Institution, a.Last, KeyIndustryCoauthorship); !ok {
		t.Error("an affiliation type column gives industry co-authorship")
	}
}

func TestPaperErrors(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"paper,year,field,citations,institutions\n", "p.csv:1:1: a papers file needs the columns paper,year,type,field,citations and institutions,countries (one row per paper, lists separated by ;) or institution,country (one row per paper and affiliation); missing: type"},
		{"paper,year,type,field,citations,institutions\nP1,2024,article,1.1,-3,A\n", `p.csv:2:5: citations "-3" is not a whole number of zero or more`},
		{"paper,year,type,field,citations,institutions\nP1,20x4,article,1.1,3,A\n", `p.csv:2:2: year "20x4" is not a year between 1900 and 2100`},
		{"paper,year,type,field,citations,institutions\nP1,2024,article,,3,A\n", "p.csv:2:4: the field is empty; every paper has at least one field (several separated by ;)"},
		{"paper,year,type,field,citations,institutions\nP1,2024,article,1.1,3\n", "p.csv:2:1: this row has 5 fields but the header has 6; quote fields that contain commas"},
		{"paper;year;type\n", "p.csv:1:1: the header has no commas but has semicolons or tabs; record files are comma-separated (lists inside a field are separated by semicolons)"},
		{"paper,year,type,field,citations,institution\nP1,2024,article,1.1,3,A\nP1,2023,article,1.1,3,B\n", "p.csv:3:1: paper P1 has another year, type or citation count here than on line 2; the rows of one paper must agree"},
		{"paper,year,type,field,citations,institutions\n\"P1,2024,article,1.1,3,A\n", "p.csv:2:1: a quoted field opened on this line is never closed; add the closing quote"},
	} {
		fsys := fstest.MapFS{"p.csv": {Data: []byte(c.in)}}
		_, err := Papers(OpenFile(fsys, "p.csv", limits.Default()), PaperOptions{})
		if err == nil || err.Error() != c.want {
			t.Errorf("%q:\n got %v\nwant %s", c.in, err, c.want)
		}
	}
	// The row limit (common practice: refuse rather than exhaust memory).
	lim := limits.Default()
	lim.RecordRows = 1
	fsys := fstest.MapFS{"p.csv": {Data: []byte(handPapers)}}
	_, err := Papers(OpenFile(fsys, "p.csv", lim), PaperOptions{Limits: lim})
	if err == nil || !strings.Contains(err.Error(), "more than the limit of 1 rows; split the file, or raise the limit with --limit record-rows=2") {
		t.Errorf("row limit: %v", err)
	}
}

func TestBroadOf(t *testing.T) {
	// OECD Frascati Manual 2015, table 2.2 (from memory): 1 natural, 2
	// engineering and technology, 3 medical and health, 4 agricultural and
	// veterinary, 5 social sciences, 6 humanities and the arts.
	for code, want := range map[string]int{"1": 0, "1.1": 0, "2.11": 1, "3.02.07": 2, "4.5": 3, "5.9": 4, "6.5": 5, "7.1": -1, "12": -1, "": -1, "x": -1} {
		if got := BroadOf(code); got != want {
			t.Errorf("BroadOf(%q) = %d, want %d", code, got, want)
		}
	}
}

// TestAgainstPandas compares every value with the same computation written
// independently in pandas 1.5.3 (Debian's python3-pandas):
// testdata/papers_pandas.csv was written by
//
//	peerpack sample papers -o ref.csv --papers 3000 --institutions 100 --fields 30 --seed 21
//	python3 examples/records-bench/papers_pandas.py ref.csv internal/records/testdata/papers_pandas.csv
//
// Agreement to 1e-12 (relative above 1).
func TestAgainstPandas(t *testing.T) {
	var buf bytes.Buffer
	if err := SamplePapers(&buf, SampleOptions{Papers: 3000, Institutions: 100, Fields: 30, Seed: 21}); err != nil {
		t.Fatal(err)
	}
	res := run(t, map[string]string{"p.csv": buf.String()}, "p.csv", PaperOptions{})
	ref, err := os.ReadFile("testdata/papers_pandas.csv")
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, line := range strings.Split(strings.TrimSpace(string(ref)), "\n")[1:] {
		f := strings.Split(line, ",")
		if f[2] == "" {
			continue // pandas: no value (no paper with a ratio)
		}
		want, err := strconv.ParseFloat(f[2], 64)
		if err != nil {
			t.Fatal(err)
		}
		got, ok := valueOf(res, f[0], res.Last, f[1])
		if !ok || !near(got, want) {
			t.Errorf("%s %s = %v (present %v), pandas %v", f[0], f[1], got, ok, want)
		}
		n++
	}
	if n < 900 {
		t.Errorf("only %d reference values compared", n)
	}
}

// TestPairsNotAdjacent: in the shape with one row per paper and
// affiliation, a paper whose rows are split by another paper is an error
// naming the file, both lines and the paper, in the full run and in a run
// over own papers with supplied baselines (common practice, no source:
// counting it twice would double its weight in the baselines).
func TestPairsNotAdjacent(t *testing.T) {
	const split = "paper,year,type,field,citations,institution,country\n" +
		"P1,2024,article,1.1,3,A,X\n" +
		"P1,2024,article,1.1,3,B,Y\n" +
		"P2,2024,article,1.1,1,B,Y\n" +
		"P1,2024,article,1.1,3,C,Z\n"
	want := "p.csv:5:1: paper P1 has rows on line 2 and again here, with other papers between; in the shape with one row per paper and affiliation the rows of a paper must be adjacent: sort the file by its paper column and run again"
	fsys := fstest.MapFS{"p.csv": {Data: []byte(split)}}
	if _, err := Papers(OpenFile(fsys, "p.csv", limits.Default()), PaperOptions{}); err == nil || err.Error() != want {
		t.Errorf("full run:\n got %v\nwant %s", err, want)
	}
	base, err := baselinePass(OpenFile(fstest.MapFS{"p.csv": {Data: []byte(split[:strings.LastIndex(split[:len(split)-1], "\n")+1])}}, "p.csv", limits.Default()), PaperOptions{Limits: limits.Default()}, &PaperResult{})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Papers(OpenFile(fsys, "p.csv", limits.Default()), PaperOptions{Baselines: base}); err == nil || err.Error() != want {
		t.Errorf("with supplied baselines:\n got %v\nwant %s", err, want)
	}
	// Sorted, the same rows are accepted.
	sorted := "paper,year,type,field,citations,institution,country\n" +
		"P1,2024,article,1.1,3,A,X\nP1,2024,article,1.1,3,B,Y\nP1,2024,article,1.1,3,C,Z\nP2,2024,article,1.1,1,B,Y\n"
	if res := run(t, map[string]string{"p.csv": sorted}, "p.csv", PaperOptions{}); res.Papers != 2 {
		t.Errorf("sorted: %d papers, want 2", res.Papers)
	}
}

// TestSeenPapers: the fingerprint table finds every id again after growing,
// and a fingerprint that matches no earlier row (a collision) is not an
// error: firstLineOf finds no earlier line.
func TestSeenPapers(t *testing.T) {
	var s seenPapers
	for i := range 5000 {
		if s.add([]byte("W" + strconv.Itoa(i))) {
			t.Fatalf("W%d reported as seen on first sight", i)
		}
	}
	for i := range 5000 {
		if !s.add([]byte("W" + strconv.Itoa(i))) {
			t.Fatalf("W%d not found again", i)
		}
	}
	fsys := fstest.MapFS{"p.csv": {Data: []byte("paper,year\nP1,2024\nP2,2024\nP3,2024\n")}}
	for _, c := range []struct {
		id           string
		before, want int
	}{{"P2", 4, 3}, {"P3", 4, 0}, {"P9", 4, 0}, {"P1", 2, 0}} {
		got, err := firstLineOf(OpenFile(fsys, "p.csv", limits.Default()), 0, []byte(c.id), c.before)
		if err != nil || got != c.want {
			t.Errorf("firstLineOf(%s, before %d) = %d, %v; want %d", c.id, c.before, got, err, c.want)
		}
	}
}

// TestPairsOrder: runs of rows need not be sorted, only adjacent. A file
// sorted by paper keeps no table of ids (a new id above the last cannot
// repeat one); an unsorted file fills the table from the lines before the
// first id out of order and still finds a split paper behind it.
func TestPairsOrder(t *testing.T) {
	const head = "paper,year,type,field,citations,institution,country\n"
	read := func(body string) (*paperReader, error) {
		fsys := fstest.MapFS{"p.csv": {Data: []byte(head + body)}}
		open := OpenFile(fsys, "p.csv", limits.Default())
		src, closer, err := open()
		if err != nil {
			t.Fatal(err)
		}
		defer closer.Close()
		c, err := findPaperColumns(src)
		if err != nil {
			t.Fatal(err)
		}
		r := &paperReader{src: src, c: c, lim: limits.Default(), lastType: -1, open: open,
			fields: newNames("field", 100), types: newNames("type", 100)}
		for {
			if err := r.next(); err == io.EOF {
				return r, nil
			} else if err != nil {
				return r, err
			}
		}
	}
	r, err := read("P1,2024,article,1.1,3,A,X\nP1,2024,article,1.1,3,B,Y\nP2,2024,article,1.1,1,B,Y\nP3,2024,article,1.1,0,C,Z\n")
	if err != nil || r.seen.slots != nil || r.seen.unsorted {
		t.Errorf("sorted file: error %v, table of %d slots, unsorted %v; want no error and no table", err, len(r.seen.slots), r.seen.unsorted)
	}
	r, err = read("P2,2024,article,1.1,1,B,Y\nP2,2024,article,1.1,1,C,Z\nP1,2024,article,1.1,3,A,X\nP3,2024,article,1.1,0,C,Z\n")
	if err != nil || !r.seen.unsorted || r.seen.n != 3 {
		t.Errorf("unsorted, adjacent: error %v, unsorted %v, %d ids held; want no error and all three ids", err, r.seen.unsorted, r.seen.n)
	}
	_, err = read("P2,2024,article,1.1,1,B,Y\nP1,2024,article,1.1,3,A,X\nP3,2024,article,1.1,0,C,Z\nP1,2024,article,1.1,3,C,Z\n")
	want := "p.csv:5:1: paper P1 has rows on line 3 and again here"
	if err == nil || !strings.HasPrefix(err.Error(), want) {
		t.Errorf("unsorted, split:\n got %v\nwant %s...", err, want)
	}
}
