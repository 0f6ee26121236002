package charts

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// FuzzCharts plans and draws one chart block of random kind and options
// over a random model (institution count, missing values, ties, zeros and
// extreme magnitudes), at a random width. Whatever the block, planning and
// drawing may refuse with a message but must never crash: a panic, or a
// recovered Go runtime error ("index out of range", "slice bounds out of
// range") reported as a drawing error, fails the target.
func FuzzCharts(f *testing.F) {
	f.Add(uint64(1), uint8(12), uint8(0), uint8(0b0001), uint8(0b01), uint8(0), uint8(0), int8(0), uint16(480), uint8(0))
	f.Add(uint64(2), uint8(40), uint8(2), uint8(0b1111), uint8(0b11), uint8(1), uint8(1), int8(0), uint16(230), uint8(1))
	f.Add(uint64(3), uint8(3), uint8(3), uint8(0b0011), uint8(0b10), uint8(2), uint8(0), int8(0), uint16(480), uint8(2))
	f.Add(uint64(4), uint8(30), uint8(4), uint8(0b1111), uint8(0b111), uint8(0), uint8(1), int8(12), uint16(300), uint8(3))
	f.Add(uint64(5), uint8(25), uint8(5), uint8(0b0100), uint8(0b01), uint8(3), uint8(0), int8(-5), uint16(480), uint8(4))
	f.Add(uint64(6), uint8(60), uint8(2), uint8(0b1111), uint8(0b111), uint8(0), uint8(0), int8(0), uint16(60), uint8(5))
	f.Fuzz(func(t *testing.T, seed uint64, n, kind, inds, groups, labels, opts uint8, limit int8, width uint16, values uint8) {
		m, spec, ok := fuzzChart(seed, int(n)%80+1, kind, inds, groups, labels, opts, int(limit), values)
		if !ok {
			return
		}
		ch, err := New(m, spec, Theme{Serif: opts&8 != 0})
		if err != nil {
			if strings.Contains(err.Error(), "runtime error") {
				t.Fatalf("planning crashed: %v", err)
			}
			return
		}
		w := vg.Points(float64(width%700) + 40)
		h := ch.Height(w)
		if math.IsNaN(float64(h)) || math.IsInf(float64(h), 0) || h <= 0 {
			t.Fatalf("height %v at width %v", h, w)
		}
		// The page's type area is at most 651 pt high; layout squashes a
		// taller chart into it.
		h = min(h, vg.Points(651))
		if err := ch.Draw(draw.NewCanvas(discard{w, h}, w, h)); err != nil && strings.Contains(err.Error(), "runtime error") {
			t.Fatalf("drawing crashed: %v", err)
		}
	})
}

// fuzzChart builds a model of n invented institutions from the seed and
// one chart block from the bits given; ok is false when the brief or the
// figures refuse the block (a refusal with a message is fine).
func fuzzChart(seed uint64, n int, kind, inds, groups, labels, opts uint8, limit int, values uint8) (*figures.Model, *brief.ChartBlock, bool) {
	r := rand.New(rand.NewPCG(seed, 13))
	insts := make([]dataset.Institution, n)
	for i := range insts {
		country, prefix := "Kestria", "KE"
		if i%3 == 1 {
			country, prefix = "Aldmere", "AL"
		}
		name := fmt.Sprintf("%s University %03d", country, i)
		if i < len(fixtureNames) && values&16 == 0 {
			name = fixtureNames[i]
		}
		insts[i] = dataset.Institution{ID: fmt.Sprintf("%s%03d", prefix, i), Name: name, Country: country, Region: "North",
			Attrs: map[string]string{"mission": []string{"research", "technical", "teaching"}[i%3]}}
	}
	reg := dataset.NewRegister("register.csv", insts, []string{"mission"})
	d := dataset.New(reg, dataset.NewDictionary("indicators.yaml", fixtureIndicators), fixtureYears)
	for k := range fixtureIndicators {
		for i := range insts {
			for _, year := range fixtureYears {
				var v float64
				switch values % 6 {
				case 0: // ordinary spread
					v = 10 + 5*r.NormFloat64()
				case 1: // heavy ties
					v = float64(r.IntN(3))
				case 2: // all equal
					v = 7
				case 3: // extreme magnitudes
					v = []float64{1e308, -1e308, 1e-300, 123456789012345678, 0}[r.IntN(5)]
				case 4: // wide spread
					v = math.Exp(r.NormFloat64() * 20)
				case 5: // sparse
					if r.IntN(4) != 0 {
						continue
					}
					v = r.Float64()
				}
				if values&32 != 0 && r.IntN(3) == 0 {
					continue // missing
				}
				d.Set(k, i, year, v)
			}
		}
	}
	pick := func(bits uint8, names []string) []string {
		var out []string
		for i, s := range names {
			if bits&(1<<i) != 0 {
				out = append(out, s)
			}
		}
		return out
	}
	keys := make([]string, len(fixtureIndicators))
	for i, ind := range fixtureIndicators {
		keys[i] = ind.Key
	}
	var block strings.Builder
	fmt.Fprintf(&block, "kind: %s\n", brief.ChartKinds[int(kind)%len(brief.ChartKinds)])
	fmt.Fprintf(&block, "indicators: [%s]\n", strings.Join(pick(inds, keys), ", "))
	if gs := pick(groups, []string{"Kestria national", "Aldmere national", "Research mission"}); len(gs) > 0 {
		fmt.Fprintf(&block, "groups: [%s]\n", strings.Join(gs, ", "))
	}
	var ls []string
	for i := 0; i < n && i < 8; i++ {
		if labels&(1<<i) != 0 {
			ls = append(ls, insts[i].ID)
		}
	}
	if len(ls) > 0 {
		fmt.Fprintf(&block, "label: [%s]\n", strings.Join(ls, ", "))
	}
	if opts&1 != 0 {
		block.WriteString("size: half\n")
	}
	if opts&2 != 0 {
		block.WriteString("orientation: vertical\n")
	}
	if opts&4 != 0 {
		block.WriteString("scale: range\n")
	}
	if opts&16 != 0 {
		block.WriteString("fit: true\n")
	}
	if limit != 0 {
		fmt.Fprintf(&block, "limit: %d\n", limit)
	}
	if opts&32 != 0 {
		fmt.Fprintf(&block, "year: %d\n", fixtureYears[int(opts>>6)%len(fixtureYears)])
	}
	src := `---
title: Chart fuzz
focus: ` + insts[int(seed%uint64(n))].ID + `
year: 2025
years: [2021, 2025]
data:
  register: register.csv
  values: values.csv
  dictionary: indicators.yaml
groups:
  - name: Kestria national
    where: {country: Kestria}
  - name: Aldmere national
    where: {country: Aldmere}
  - name: Research mission
    where: {mission: research}
---
# Chart

` + "```chart\n" + block.String() + "```\n"
	b, err := brief.Parse("brief.md", []byte(src))
	if err != nil {
		return nil, nil, false
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		return nil, nil, false
	}
	blocks := chartBlocks(b)
	if len(blocks) != 1 {
		return nil, nil, false
	}
	return m, blocks[0], true
}
