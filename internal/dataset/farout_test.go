package dataset

import (
	"io/fs"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/brief"
	"peerpack/internal/demo"
)

// loadDemo loads the demo scenario, optionally changing its long values
// file first.
func loadDemo(t *testing.T, edit func(values string) string) *Report {
	t.Helper()
	src := demo.FS()
	raw, err := fs.ReadFile(src, demo.BriefName)
	if err != nil {
		t.Fatal(err)
	}
	b, err := brief.Parse(demo.BriefName, raw)
	if err != nil {
		t.Fatal(err)
	}
	fsys := fstest.MapFS{}
	for name, data := range demo.Files() {
		fsys[name] = &fstest.MapFile{Data: data}
	}
	if edit != nil {
		v := string(fsys[demo.ValuesName].Data)
		fsys[demo.ValuesName] = &fstest.MapFile{Data: []byte(edit(v))}
	}
	_, rep, err := Load(fsys, b)
	if err != nil {
		t.Fatal(err)
	}
	return rep
}

// TestFarOutIgnoresSize: in the demo, large institutions are large in
// every count and money indicator; on a log scale none of them is far from
// the median, where on the raw scale 180-odd were.
func TestFarOutIgnoresSize(t *testing.T) {
	rep := loadDemo(t, nil)
	for _, s := range rep.Suspicious {
		if s.Kind != SuspectFarOut {
			continue
		}
		for _, in := range rep.Indicators {
			if in.Key == s.Indicator && farOutOnLogScale(in.Unit) {
				t.Errorf("a %s indicator flagged for size: %s", in.Unit, s.Msg)
			}
		}
	}
}

// TestFarOutFindsUnitSlip: a research income written in units of 1,000
// too large (a typical slip: thousands typed as units) for one
// institution in every year is far out on the log scale; the jump rule
// cannot see it, since every year is wrong alike.
func TestFarOutFindsUnitSlip(t *testing.T) {
	var victim string
	rep := loadDemo(t, func(v string) string {
		lines := strings.Split(v, "\n")
		for i, line := range lines {
			f := strings.Split(line, ",")
			if len(f) < 4 || f[2] != "research_income" || f[3] == "" {
				continue
			}
			if victim == "" {
				victim = f[0]
			}
			if f[0] == victim {
				f[3] += "000"
				lines[i] = strings.Join(f, ",")
			}
		}
		return strings.Join(lines, "\n")
	})
	found := false
	for _, s := range rep.Suspicious {
		if s.Kind == SuspectFarOut && s.Indicator == "research_income" && s.Institution == victim {
			found = true
			t.Log(s.Msg)
			if !strings.Contains(s.Msg, "on a log scale") || !strings.Contains(s.Msg, "times the median") {
				t.Errorf("message: %s", s.Msg)
			}
		}
	}
	if !found {
		t.Errorf("the thousandfold research income of %s was not flagged; findings: %+v", victim, rep.Suspicious)
	}
}
