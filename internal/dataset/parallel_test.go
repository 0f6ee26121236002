package dataset

import (
	"bytes"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"strings"
	"testing"

	"peerpack/internal/tabular"
)

// The parallel reading of a long values file, whole or streamed in chunks
// (and a stream read row by row), must give exactly what reading it whole
// row by row gives (the reference here: the row-by-row reader,
// whose messages and positions the catalogue tests pin down): the same
// values bit for bit, the same report and the same problems in the same
// order, over rows the workers settle and rows with every kind of
// problem, whatever the line ends.
func TestParallelLongReadingMatchesRowByRow(t *testing.T) {
	defer func(p, b int) { parallelBytes, partBytes = p, b }(parallelBytes, partBytes)
	parallelBytes, partBytes = 1, 2000 // parallel even for a small file, in many parts

	for _, end := range []string{"\n", "\r\n"} {
		for _, withProblems := range []bool{false, true} {
			files := parallelWorld(end, withProblems)
			brief := strings.ReplaceAll(parallelBrief, "\n", "\n")
			prev := runtime.GOMAXPROCS(1)
			d1, r1, err1 := load(t, brief, files)
			for _, way := range []string{"parallel", "streamed", "streamed row by row"} {
				runtime.GOMAXPROCS(4)
				if way == "streamed row by row" {
					runtime.GOMAXPROCS(1)
				}
				sb, sc := tabular.StreamBytes, tabular.StreamChunkBytes
				if way != "parallel" {
					// a stream of chunks of about 3,000 bytes
					tabular.StreamBytes, tabular.StreamChunkBytes = 1, 3000
				}
				d4, r4, err4 := load(t, brief, files)
				tabular.StreamBytes, tabular.StreamChunkBytes = sb, sc
				runtime.GOMAXPROCS(prev)
				name := fmt.Sprintf("line end %q, problems %v, %s", end, withProblems, way)
				if fmt.Sprint(err1) != fmt.Sprint(err4) {
					t.Fatalf("%s: problems differ\nrow by row: %v\nparallel:   %v", name, err1, err4)
				}
				if withProblems && err1 == nil {
					t.Fatalf("%s: the problems were not found", name)
				}
				if d1 == nil || d4 == nil {
					if (d1 == nil) != (d4 == nil) {
						t.Fatalf("%s: one reading gave no dataset", name)
					}
					continue
				}
				for k := range d1.Dictionary.Indicators {
					for _, y := range d1.Years {
						a, b := d1.Column(k, y), d4.Column(k, y)
						for i := range a {
							if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
								t.Fatalf("%s: indicator %d, %d, institution %d: %v row by row, %v in parallel", name, k, y, i, a[i], b[i])
							}
						}
					}
				}
				var w1, w4 bytes.Buffer
				r1.Write(&w1)
				r4.Write(&w4)
				if w1.String() != w4.String() {
					t.Fatalf("%s: reports differ\n%s\n---\n%s", name, w1.String(), w4.String())
				}
			}
		}
	}
}

const parallelBrief = `---
title: T
focus: P0001
year: 2024
years: [2020, 2024]
data: {register: reg.csv, values: long.csv, dictionary: dict.yaml}
---
`

// parallelWorld writes 400 institutions x 4 read indicators x 5 years,
// and with problems: unknown ids and keys, a derived key, bad and
// out-of-range years, words and percent signs for numbers, values out of
// their unit's range, duplicates, ragged rows, empty lines.
func parallelWorld(end string, problems bool) map[string]string {
	rng := rand.New(rand.NewPCG(7, 7))
	var reg strings.Builder
	reg.WriteString("id,name,country,region\n")
	for i := range 400 {
		fmt.Fprintf(&reg, "P%04d,Institution %d,Country %d,Region %d\n", i, i, i%7, i%3)
	}
	dict := `indicators:
  - {key: share, label: Share, unit: percent, better: higher, decimals: 1}
  - {key: ratio, label: Ratio, unit: ratio, better: lower, decimals: 2}
  - {key: count, label: Count, unit: count, better: neutral, decimals: 0}
  - {key: score, label: Score, unit: score, better: higher, decimals: 1}
  - {key: derived, label: Derived, unit: ratio, better: higher, decimals: 2, derive: ratio of count to ratio}
`
	var v strings.Builder
	v.WriteString("institution,year,indicator,value" + end)
	keys := []string{"share", "ratio", "count", "score"}
	for i := range 400 {
		for y := 2020; y <= 2024; y++ {
			for _, k := range keys {
				val := fmt.Sprintf("%.3f", rng.Float64()*90)
				if rng.IntN(30) == 0 {
					val = ""
				}
				row := fmt.Sprintf("P%04d,%d,%s,%s", i, y, k, val)
				if problems {
					switch rng.IntN(200) {
					case 0:
						row = fmt.Sprintf("Q%04d,%d,%s,1", i, y, k)
					case 1:
						row = fmt.Sprintf("P%04d,%d,sahre,1", i, y)
					case 2:
						row = fmt.Sprintf("P%04d,%d,derived,1", i, y)
					case 3:
						row = fmt.Sprintf("P%04d,20x4,%s,1", i, k)
					case 4:
						row = fmt.Sprintf("P%04d,1850,%s,1", i, k)
					case 5:
						row = fmt.Sprintf("P%04d,%d,%s,n/a", i, y, k)
					case 6:
						row = fmt.Sprintf("P%04d,%d,share,150", i, y)
					case 7:
						row = fmt.Sprintf("P%04d,%d,ratio,-2", i, y)
					case 8:
						row = fmt.Sprintf("P%04d,%d,%s,12%%", i, y, k)
					case 9:
						row += end + row // a duplicate
					case 10:
						row = fmt.Sprintf("P%04d,%d", i, y) // ragged
					case 11:
						row += end // an empty line after it
					case 12:
						row = fmt.Sprintf("P%04d,%d.0,%s, 7.5 ", i, y, k)
					}
				}
				v.WriteString(row + end)
			}
		}
	}
	return map[string]string{"reg.csv": reg.String(), "dict.yaml": dict, "long.csv": v.String()}
}
