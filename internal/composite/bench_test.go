package composite

import "testing"

var benchRuns = 10000

// BenchmarkMonteCarlo is the target: 10,000 runs over 2,000
// institutions, 15 indicators and 5 pillars, with weights perturbed by 25 %
// and two normalisations drawn from (the target is under 2 s on 2 cores).
//
//	go test ./internal/composite -run X -bench MonteCarlo -benchtime 3x -cpu 1,2
func BenchmarkMonteCarlo(b *testing.B) {
	cols := fixture(2000, 15, 1)
	s := fixtureSpec(15, 5)
	s.Runs, s.WeightSpread, s.Seed = benchRuns, 0.25, 7
	s.Normalisations = []Method{ZScore, MinMax}
	b.ResetTimer()
	for b.Loop() {
		if _, err := Compute(s, cols); err != nil {
			b.Fatal(err)
		}
	}
}
