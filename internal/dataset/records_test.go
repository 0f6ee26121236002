package dataset

import (
	"strings"
	"testing"
)

// The records of the hand-worked example in internal/records (three
// fields, two years); A and B are in the register, C is the rest of the
// world, needed for the baselines but not loaded.
const recPapers = `paper,year,type,field,citations,institutions,countries
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

const recRegister = "id,name,country,region\nA,Alder Institute,X,North\nB,Birch College,Y,North\n"

const recDict = `indicators:
  - {key: staff, label: Academic staff, unit: count, better: neutral, decimals: 0}
  - {key: citation_impact, label: Citation impact, unit: index, better: higher, decimals: 2}
  - {key: top10_share, label: Top 10 % share, unit: share, better: higher, decimals: 3}
  - {key: intl_coauthorship, label: International co-authorship, unit: percent, better: higher, decimals: 1}
  - {key: peer_esteem, label: Peer esteem, unit: score, better: higher, decimals: 1}
  - {key: impact_per_staff, label: Impact per staff, unit: ratio, better: higher, decimals: 4, derive: citation_impact / staff}
`

const recVotes = `respondent,respondent_country,field,institution
r1,X,natural,A
r1,X,natural,B
r2,X,natural,A
r3,Y,social,B
`

func recBrief(data string) string {
	return "---\ntitle: T\nfocus: A\nyear: 2024\ndata:\n  register: reg.csv\n  values: vals.csv\n  dictionary: dict.yaml\n" + data + "---\nBody.\n"
}

// TestRecordsFeedTheDataset: indicators computed from data.papers and
// data.votes arrive as ordinary columns before derivation (the values are
// those of internal/records' hand-worked example, computed by hand there:
// A's citation impact 1.15, top 10 % 15 % (0.15 on the dictionary's share
// scale), international co-authorship 20 %; votes unweighted: A 2, B 2).
func TestRecordsFeedTheDataset(t *testing.T) {
	files := map[string]string{"reg.csv": recRegister, "dict.yaml": recDict, "p.csv": recPapers, "v.csv": recVotes,
		"vals.csv": "institution,year,indicator,value\nA,2024,staff,50\nB,2024,staff,20\n"}
	d, _, err := load(t, recBrief("  papers: p.csv\n  votes: v.csv\n"), files)
	if err != nil {
		t.Fatal(err)
	}
	get := func(key, inst string) float64 {
		v, ok := d.Value(d.Dictionary.Index(key), d.Register.Index(inst), 2024)
		if !ok {
			t.Fatalf("%s of %s missing", key, inst)
		}
		return v
	}
	for _, c := range []struct {
		key, inst string
		want      float64
	}{
		{"citation_impact", "A", 1.15}, {"top10_share", "A", 0.15}, {"intl_coauthorship", "A", 20},
		{"citation_impact", "B", 4.0 / 3}, {"peer_esteem", "A", 100}, {"peer_esteem", "B", 100},
		{"impact_per_staff", "A", 1.15 / 50},
	} {
		if got := get(c.key, c.inst); !closeTo(got, c.want) {
			t.Errorf("%s of %s = %v, want %v", c.key, c.inst, got, c.want)
		}
	}
}

func closeTo(a, b float64) bool { d := a - b; return d < 1e-12 && d > -1e-12 }

func TestRecordsConflictWithValues(t *testing.T) {
	files := map[string]string{"reg.csv": recRegister, "dict.yaml": recDict, "p.csv": recPapers,
		"vals.csv": "institution,year,indicator,value\nA,2024,staff,50\nA,2024,citation_impact,1.2\n"}
	_, _, err := load(t, recBrief("  papers: {file: p.csv, indicators: [citation_impact, top10_share]}\n"), files)
	want := "brief.md:9:3: indicator citation_impact is computed from the records in p.csv (data.papers) and also given in vals.csv:3:24; drop it from the values file, or list the indicators to compute under data.papers.indicators"
	if err == nil || !strings.Contains(err.Error(), want) {
		t.Errorf("got  %v\nwant %s", err, want)
	}
}

func TestRecordsBriefErrors(t *testing.T) {
	files := map[string]string{"reg.csv": recRegister, "dict.yaml": recDict, "p.csv": recPapers,
		"vals.csv": "institution,year,indicator,value\nA,2024,staff,50\n"}
	for _, c := range []struct{ data, want string }{
		{"  papers: {file: p.csv, indicators: [spinouts]}\n", `data.papers.indicators: "spinouts" is not computed from these records`},
		{"  papers: {file: p.csv, indicators: [papers]}\n", `data.papers.indicators: "papers" is not in the dictionary`},
		{"  papers: q.csv\n", `data.papers "q.csv" does not exist in the brief's folder`},
	} {
		_, _, err := load(t, recBrief(c.data), files)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want %s", c.data, err, c.want)
		}
	}
}

// TestUnvotedInstitutionIsMissing: a register institution that no
// respondent names has no esteem value (missing, not 0), and the check
// report's coverage counts it as missing. C is in the register and named
// by nobody, so peer esteem covers two institutions of three in 2024.
func TestUnvotedInstitutionIsMissing(t *testing.T) {
	reg := recRegister + "C,Cedar University,X,North\n"
	files := map[string]string{"reg.csv": reg, "dict.yaml": recDict, "v.csv": recVotes,
		"vals.csv": "institution,year,indicator,value\nA,2024,staff,50\nB,2024,staff,20\nC,2024,staff,30\n"}
	d, rep, err := load(t, recBrief("  votes: v.csv\n"), files)
	if err != nil {
		t.Fatal(err)
	}
	ind := d.Dictionary.Index("peer_esteem")
	if v, ok := d.Value(ind, d.Register.Index("C"), 2024); ok {
		t.Errorf("C is named by no respondent: peer esteem should be missing, got %v", v)
	}
	if v, ok := d.Value(ind, d.Register.Index("B"), 2024); !ok || v != 100 {
		t.Errorf("B's peer esteem %v (present %v), want 100", v, ok)
	}
	var found bool
	for _, ic := range rep.Indicators {
		if ic.Key != "peer_esteem" {
			continue
		}
		found = true
		for i, y := range rep.Years {
			if y == 2024 && (ic.Values[i] != 2 || !closeTo(ic.Coverage[i], 2.0/3)) {
				t.Errorf("peer esteem coverage in 2024: %d institutions (%v), want 2 of 3", ic.Values[i], ic.Coverage[i])
			}
		}
	}
	if !found {
		t.Error("no coverage row for peer_esteem in the check report")
	}
}
