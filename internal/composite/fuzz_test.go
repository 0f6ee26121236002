package composite

import (
	"encoding/binary"
	"math"
	"testing"
)

// FuzzCompute builds composites from arbitrary values (missing, repeated,
// extreme) and method choices: Compute must return a result or an error,
// never panic, and every scored institution gets a rank within the
// population with an interval holding its median.
func FuzzCompute(f *testing.F) {
	f.Add([]byte{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20, 21, 22, 23, 24}, uint8(0), uint8(0), uint8(5))
	f.Add(make([]byte, 64), uint8(3), uint8(2), uint8(1))
	f.Fuzz(func(t *testing.T, raw []byte, method, impute, runs uint8) {
		const k = 3
		n := len(raw) / (8 * k)
		if n < 1 || n > 64 {
			return
		}
		cols := make([][]float64, k)
		for j := range cols {
			cols[j] = make([]float64, n)
			for i := range cols[j] {
				v := math.Float64frombits(binary.LittleEndian.Uint64(raw[8*(j*n+i):]))
				if math.IsInf(v, 0) {
					v = math.NaN() // the loader never passes infinities
				}
				cols[j][i] = v
			}
		}
		s := &Spec{
			Normalise: Methods[int(method)%len(Methods)], Impute: Imputes[int(impute)%len(Imputes)],
			MinShare: 0.5, Runs: int(runs % 8), WeightSpread: 0.3, Seed: 1, Focus: 0,
			Normalisations: []Method{ZScore, Percentile},
			Skew:           Skew{Treat: "winsorise", N: 2},
			Pillars:        []Pillar{{"a", 1}, {"b", 2}},
			Indicators:     []Indicator{{"x", 0, 1, false}, {"y", 0, 2, true}, {"z", 1, 1, false}},
		}
		res, err := Compute(s, cols)
		if err != nil {
			return
		}
		for i := range res.Rank {
			if !res.Scored[i] {
				continue
			}
			if res.Rank[i] < 0 || res.Rank[i] > n {
				t.Fatalf("rank %d of %d", res.Rank[i], n)
			}
			if res.RankLow != nil && res.RankLow[i] > 0 && (res.RankLow[i] > res.RankMedian[i] || res.RankMedian[i] > res.RankHigh[i]) {
				t.Fatalf("interval %d..%d median %d", res.RankLow[i], res.RankHigh[i], res.RankMedian[i])
			}
		}
		if res.Rank[0] > 0 {
			res.HeadroomOf(cols, 0, 0, 1)
		}
	})
}
