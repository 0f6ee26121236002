package narrative

import (
	"fmt"
	"math/rand"
	"strings"
	"testing"

	"gopkg.in/yaml.v3"

	"peerpack/internal/dataset"
)

// TestRandomSituationsAreTraceable composes commentary for many invented
// worlds drawn from a fixed seed (units, every polarity, decimals, missing
// values, ties, groups from one member to thousands, populations that
// change size between years, competitor systems, rank bands, noise and
// floor settings, every style and topic, composites and peer clusters)
// and checks that nothing panics,
// that Verify finds every printed number among the cited figures, and
// that every claim recorded holds: zero false claims over 200 worlds.
func TestRandomSituationsAreTraceable(t *testing.T) {
	rng := rand.New(rand.NewSource(20251202))
	n := 200
	claims := 0
	if testing.Short() {
		n = 30
	}
	// The draw must reach the sentence kinds it is meant to exercise.
	kinds := map[string]int{"broadly unchanged": 0, " band of ": 0, "joint ": 0, "is not a member of": 0,
		"Placed among the institutions of": 0, "coverage": 0, "value judgement": 0, "purchasing-power": 0,
		"percentile": 0, "would take": 0, "has no place": 0, "highest of": 0,
		"at the edge of": 0, "ranks first on": 0, "no quarters or percentiles": 0, "largest movement": 0,
		"composite": 0, "cluster": 0, "Against the median of": 0, "in one year": 0, "association": 0,
		"indicators here:": 0}
	defer func() {
		if testing.Short() || t.Failed() {
			return
		}
		for k, v := range kinds {
			if v == 0 {
				t.Errorf("no random situation wrote a sentence with %q", k)
			}
		}
		if claims < 1000 {
			t.Errorf("only %d claims checked over %d worlds", claims, n)
		}
	}()
	for i := 0; i < n; i++ {
		src := randomSituation(rng)
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
			for _, s := range c.Sentences {
				claims += len(s.Claims)
				for k := range kinds {
					if strings.Contains(s.Text, k) {
						kinds[k]++
					}
				}
				if strings.Contains(s.Text, "{") || strings.Contains(s.Text, "  ") || !strings.HasSuffix(s.Text, ".") {
					t.Errorf("malformed sentence %q", s.Text)
				}
			}
		})
	}
}

func randomSituation(rng *rand.Rand) string {
	units := []struct {
		unit     dataset.Unit
		lo, hi   float64
		decimals int
		currency bool
	}{
		{dataset.UnitPercent, 0, 100, 1, false},
		{dataset.UnitRatio, 5, 30, 1, false},
		{dataset.UnitCount, 0, 50000, 0, false},
		{dataset.UnitIndex, 0.3, 2.5, 2, false},
		{dataset.UnitCurrency, 1000, 400000, 0, true},
		{dataset.UnitShare, 0, 1, 3, false},
	}
	pol := []dataset.Polarity{dataset.HigherIsBetter, dataset.LowerIsBetter, dataset.Neutral}
	nInd := 1 + rng.Intn(5)
	var inds []map[string]any
	type col struct {
		key      string
		lo, hi   float64
		decimals int
	}
	var cols []col
	for k := 0; k < nInd; k++ {
		u := units[rng.Intn(len(units))]
		key := fmt.Sprintf("i%d", k)
		ind := map[string]any{"key": key, "label": fmt.Sprintf("Indicator %c", 'A'+k), "unit": string(u.unit),
			"better": string(pol[rng.Intn(3)]), "decimals": u.decimals}
		if u.currency {
			ind["currency"] = true
		}
		if rng.Intn(4) == 0 {
			ind["judgement"] = "the direction is a choice"
		}
		inds = append(inds, ind)
		cols = append(cols, col{key, u.lo, u.hi, u.decimals})
	}
	years := []int{2021, 2025}
	if rng.Intn(2) == 0 {
		years = []int{2021, 2023, 2025}
	}
	var columns []string
	for _, c := range cols {
		for _, y := range years {
			columns = append(columns, fmt.Sprintf("%s@%d", c.key, y))
		}
	}
	countries := []string{"Kestria", "Veldra", "Orsk"}[:1+rng.Intn(3)]
	nInst := 1 + rng.Intn(40)
	switch rng.Intn(20) {
	case 0, 1:
		nInst = 100 + rng.Intn(150)
	case 2:
		nInst = 1000 + rng.Intn(2000)
	}
	// A population that changes size: in some worlds most institutions
	// report nothing in the first year.
	thin := rng.Intn(5) == 0
	// A focus beyond every other value on every indicator: first or last
	// everywhere, so shared places are said once.
	extreme := rng.Intn(6) == 0
	insts := map[string][]any{}
	ids := []string{"F"}
	for j := 0; j < nInst; j++ {
		ids = append(ids, fmt.Sprintf("N%03d", j))
	}
	for j, id := range ids {
		country := countries[rng.Intn(len(countries))]
		if id == "F" {
			country = "Kestria"
		}
		row := []any{country, fmt.Sprintf("Institution %d", j)}
		for _, c := range cols {
			base := c.lo + rng.Float64()*(c.hi-c.lo)
			for yi := range years {
				switch {
				case extreme && id == "F":
					row = append(row, c.hi+(c.hi-c.lo)/10)
				case thin && yi == 0 && rng.Intn(3) > 0:
					row = append(row, nil)
				case rng.Intn(8) == 0:
					row = append(row, nil)
				case rng.Intn(6) == 0:
					row = append(row, c.lo+float64(rng.Intn(3))*(c.hi-c.lo)/4) // ties
				default:
					v := base + (rng.Float64()-0.5)*(c.hi-c.lo)/10
					v = min(max(v, c.lo), c.hi)
					row = append(row, v)
				}
			}
		}
		insts[id] = row
	}
	members := []string{}
	for _, id := range ids {
		if rng.Intn(3) == 0 {
			members = append(members, id)
		}
	}
	if len(members) == 0 {
		members = []string{ids[len(ids)-1]}
	}
	groups := []map[string]any{{"name": "Home", "where": map[string]any{"country": "Kestria"}}}
	if rng.Intn(2) == 0 {
		groups = append(groups, map[string]any{"name": "Systems", "each": "country"})
	}
	if rng.Intn(2) == 0 {
		groups = append(groups, map[string]any{"name": "Chosen", "members": members})
	}
	styles := []string{"summary", "detail", "bullets"}
	block := map[string]any{"style": styles[rng.Intn(3)]}
	if rng.Intn(4) == 0 {
		block["years"] = []int{years[len(years)-2], years[len(years)-1]}
	}
	if rng.Intn(3) == 0 {
		var topics []string
		for _, tp := range []string{"position", "strengths", "change", "gaps", "competition", "caveats", "profile", "association"} {
			if rng.Intn(2) == 0 {
				topics = append(topics, tp)
			}
		}
		if len(topics) > 0 {
			block["topics"] = topics
		}
	}
	doc := map[string]any{
		"indicators": inds, "focus": "F", "year": 2025, "years": years, "columns": columns,
		"institutions": insts, "groups": groups, "block": block, "ppp": true,
	}
	if rng.Intn(3) == 0 {
		doc["rank_bands"] = 10 + rng.Intn(40)
	}
	if rng.Intn(3) == 0 {
		doc["small_group"] = 2 + rng.Intn(12)
	}
	if rng.Intn(4) == 0 {
		doc["noise"] = float64(rng.Intn(21)) / 2
	}
	if rng.Intn(2) == 0 {
		doc["language"] = "en-US"
	}
	// A composite over the judged indicators (neutral ones are refused),
	// in one or two pillars, sometimes with Monte Carlo runs; peer
	// clusters over every indicator in worlds large enough to cluster.
	var judged []string
	for _, ind := range inds {
		if ind["better"] != string(dataset.Neutral) {
			judged = append(judged, ind["key"].(string))
		}
	}
	if len(judged) > 0 && rng.Intn(3) == 0 {
		pillars := []map[string]any{}
		split := 1 + rng.Intn(len(judged))
		for i, part := range [][]string{judged[:split], judged[split:]} {
			if len(part) == 0 {
				continue
			}
			w := map[string]any{}
			for _, k := range part {
				w[k] = 1 + rng.Intn(3)
			}
			pillars = append(pillars, map[string]any{"key": fmt.Sprintf("p%d", i), "label": fmt.Sprintf("Pillar %d", i+1), "weight": 1 + rng.Intn(3), "indicators": w})
		}
		comp := map[string]any{
			"normalise": []string{"zscore", "minmax", "percentile"}[rng.Intn(3)],
			"pillars":   pillars,
			"missing":   map[string]any{"min_share": 0.5, "impute": []string{"none", "group-median"}[rng.Intn(2)]},
		}
		if rng.Intn(2) == 0 {
			comp["uncertainty"] = map[string]any{"runs": 20 + rng.Intn(80), "weights": 0.25, "seed": rng.Intn(100)}
		}
		doc["composite"] = comp
	}
	if len(cols) >= 2 && nInst >= 30 && nInst < 1000 && rng.Intn(3) == 0 {
		var keys []string
		for _, c := range cols {
			keys = append(keys, c.key)
		}
		peers := map[string]any{"indicators": keys, "seed": rng.Intn(100), "restarts": 3, "resamples": rng.Intn(4)}
		if rng.Intn(2) == 0 {
			peers["k"] = 2 + rng.Intn(3)
		}
		doc["peers"] = peers
	}
	out, err := yaml.Marshal(doc)
	if err != nil {
		panic(err)
	}
	return string(out)
}
