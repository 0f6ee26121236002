package narrative

import (
	"bytes"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// systemsWorld is an invented world for the systems topic, drawn from a
// seed: 1 to 7 countries of 1 to 400 institutions (some with one), three
// judged indicators of every polarity and decimals with ties and missing
// values, a size indicator with zeros and gaps, three to five years
// (some indicators starting late), and a population rule that leaves out
// a random share of each country.
func systemsWorld(seed uint64) (*figures.Model, *brief.Brief, error) {
	rng := rand.New(rand.NewPCG(seed, 2026))
	nc := 1 + rng.IntN(7)
	var insts []dataset.Institution
	for c := range nc {
		n := 1 + rng.IntN(400)
		if rng.IntN(5) == 0 {
			n = 1 + rng.IntN(3)
		}
		for i := range n {
			insts = append(insts, dataset.Institution{ID: fmt.Sprintf("C%d%04d", c, i), Name: fmt.Sprintf("Institute %d-%d", c, i), Country: fmt.Sprintf("Land%c", 'A'+c), Region: "North", Attrs: map[string]string{}})
		}
	}
	polar := []dataset.Polarity{dataset.HigherIsBetter, dataset.LowerIsBetter, dataset.Neutral}
	inds := []dataset.Indicator{{Key: "size", Label: "Students", Short: "students", Unit: dataset.UnitCount, Better: dataset.Neutral}}
	for k := range 3 {
		inds = append(inds, dataset.Indicator{Key: fmt.Sprintf("x%d", k), Label: fmt.Sprintf("Measure %c", 'P'+k), Unit: dataset.UnitRatio, Better: polar[rng.IntN(3)], Decimals: rng.IntN(3)})
	}
	ny := 3 + rng.IntN(3)
	var years []int
	for y := range ny {
		years = append(years, 2021+y)
	}
	d := dataset.New(dataset.NewRegister("register.csv", insts, nil), dataset.NewDictionary("indicators.yaml", inds), years)
	late := rng.IntN(3) // this indicator starts a year late
	for i := range insts {
		base := make([]float64, len(inds))
		for k := range inds {
			base[k] = rng.Float64() * 10
		}
		for y := range years {
			for k := range inds {
				switch {
				case rng.IntN(12) == 0:
					continue // missing
				case k == 1+late && y == 0:
					continue
				case k == 0:
					v := math.Round(rng.Float64() * 5000)
					if rng.IntN(10) == 0 {
						v = 0
					}
					d.Set(k, i, years[y], v)
				case rng.IntN(5) == 0:
					d.Set(k, i, years[y], float64(rng.IntN(3))) // ties
				default:
					d.Set(k, i, years[y], base[k]+float64(y)*(rng.Float64()-0.4))
				}
			}
		}
	}
	if rng.IntN(4) > 0 {
		p := &dataset.Population{Included: make([]bool, len(insts)), Excluded: map[int][]string{}, Rules: []string{"an invented rule"}, RuleExcluded: []int{0}}
		for i := range insts {
			p.Included[i] = rng.IntN(3) > 0 || i == 0
			if !p.Included[i] {
				p.Excluded[i] = []string{"left out"}
				p.RuleExcluded[0]++
			}
		}
		d.Population = p
	}
	style := []string{"summary", "detail"}[rng.IntN(2)]
	src := "---\ntitle: Systems\nfocus: C00000\n" + fmt.Sprintf("year: %d\nyears: [%d, %d]\n", years[ny-1], years[0], years[ny-1]) +
		"data: {register: register.csv, values: values.csv, dictionary: indicators.yaml}\n" +
		"size_weight: size\ngroups:\n  - each: country\n    over: all\n---\n\n# Systems\n\n" +
		"```commentary\nstyle: " + style + "\nindicators: [x0, x1, x2]\ntopics: [systems]\n```\n"
	b, err := brief.Parse("brief.md", []byte(src))
	if err != nil {
		return nil, nil, err
	}
	m, err := figures.Compute(d, b)
	return m, b, err
}

// TestSystemsTopicClaimsHold composes the systems topic over 200 random
// worlds: nothing panics, Verify finds every printed number among the
// cited figures, and every claim holds; the draw must reach every kind of
// sentence the topic writes.
func TestSystemsTopicClaimsHold(t *testing.T) {
	n := 200
	if testing.Short() {
		n = 30
	}
	kinds := map[string]int{"the largest share": 0, "level with it as printed": 0, "is the highest of": 0, "the median runs from": 0,
		"rose in": 0, "fell in": 0, "broadly unchanged": 0, "lifts": 0, "lowers": 0, "Of the": 0}
	claims := 0
	for seed := range uint64(n) {
		m, b, err := systemsWorld(seed)
		if err != nil {
			t.Fatalf("world %d: %v", seed, err)
		}
		c, err := Compose(m, b)
		if err != nil {
			t.Fatalf("world %d: Compose: %v", seed, err)
		}
		if err := Verify(m, c); err != nil {
			t.Fatalf("world %d: %v", seed, err)
		}
		for _, s := range c.Sentences {
			claims += len(s.Claims)
			for k := range kinds {
				if strings.Contains(s.Text, k) {
					kinds[k]++
				}
			}
		}
	}
	if testing.Short() {
		return
	}
	for k, v := range kinds {
		if v == 0 {
			t.Errorf("no world wrote a sentence with %q", k)
		}
	}
	if claims < 2000 {
		t.Errorf("only %d claims checked", claims)
	}
}

// TestSystemsClaimsTurnedRoundFail: every claim of the systems topic,
// turned round, makes Verify fail, so the claims say what the words say.
func TestSystemsClaimsTurnedRoundFail(t *testing.T) {
	turned := 0
	for seed := range uint64(5) {
		m, b, err := systemsWorld(seed)
		if err != nil {
			t.Fatal(err)
		}
		c, err := Compose(m, b)
		if err != nil {
			t.Fatal(err)
		}
		for i := range c.Sentences {
			for j, cl := range c.Sentences[i].Claims {
				orig := cl
				c.Sentences[i].Claims[j].Op = opposite(cl.Op)
				if Verify(m, c) == nil {
					t.Errorf("world %d: %q still verifies with %v turned round", seed, c.Sentences[i].Text, cl)
				}
				c.Sentences[i].Claims[j] = orig
				turned++
			}
		}
	}
	if turned == 0 {
		t.Fatal("no claim to turn round")
	}
}

// opposite is the comparison that fails exactly where op holds.
func opposite(op string) string {
	switch op {
	case OpLess:
		return OpGreaterEq
	case OpLessEq:
		return OpGreater
	case OpGreater:
		return OpLessEq
	case OpGreaterEq:
		return OpLess
	case OpEqual:
		return OpNotEqual
	}
	return OpEqual
}

// TestSystemsClaimsOutsideGo re-evaluates the systems topic's claim rows
// of a few worlds' figures files with testdata/check_claims.py (Python's
// csv module only), which shares no code with Verify.
func TestSystemsClaimsOutsideGo(t *testing.T) {
	py, err := exec.LookPath("python3")
	if err != nil {
		t.Skip("python3 is not installed")
	}
	script, _ := filepath.Abs(filepath.Join("testdata", "check_claims.py"))
	dir := t.TempDir()
	var files []string
	for seed := range uint64(6) {
		m, b, err := systemsWorld(seed)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := Compose(m, b); err != nil {
			t.Fatal(err)
		}
		var buf bytes.Buffer
		if err := figures.WriteCSV(&buf, m); err != nil {
			t.Fatal(err)
		}
		p := filepath.Join(dir, fmt.Sprintf("world%d.csv", seed))
		if err := os.WriteFile(p, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		files = append(files, p)
	}
	out, err := exec.Command(py, append([]string{script}, files...)...).CombinedOutput()
	if err != nil {
		t.Fatalf("check_claims.py: %v\n%s", err, out)
	}
	t.Logf("%s", out)
}
