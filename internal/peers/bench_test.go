package peers

import "testing"

// BenchmarkChooseKWorld: k from 2 to 12 with 25 k-means restarts each,
// silhouette on the stated sample, over 21,500 institutions and 16
// indicators (the target: under 5 s on 2 cores). Command:
//
//	go test ./internal/peers -run X -bench ChooseKWorld -benchtime 1x -count 3
func BenchmarkChooseKWorld(b *testing.B) {
	x := blobs(21500, 16, 7, 6, 42)
	z, _, _ := Standardise(x, nil)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		a, err := Analyse(z, Options{Restarts: 25, Seed: 11})
		if err != nil {
			b.Fatal(err)
		}
		b.ReportMetric(float64(a.K), "k")
	}
}

// BenchmarkStabilityWorld: 20 bootstrap resamples at k = 7 over the same
// population.
func BenchmarkStabilityWorld(b *testing.B) {
	x := blobs(21500, 16, 7, 6, 42)
	z, _, _ := Standardise(x, nil)
	for i := 0; i < b.N; i++ {
		if _, err := Analyse(z, Options{K: 7, Restarts: 25, Seed: 11, Resamples: 20}); err != nil {
			b.Fatal(err)
		}
	}
}
