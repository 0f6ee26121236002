package dataset

import (
	"bufio"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"runtime"
	"testing"

	"peerpack/internal/brief"
)

// World-sized scale: 21,500 institutions x 20 indicators x 10 years in the
// long shape, 4.3 million value rows. The README's target is a load and
// validation in under 3 seconds and under 1 GiB on a 2-core machine.
const (
	worldInstitutions = 21500
	worldIndicators   = 20
	worldYears        = 10
)

// writeWorld writes an invented world-sized dataset (fixed seed) into dir.
func writeWorld(tb testing.TB, dir string, institutions int) {
	tb.Helper()
	rng := rand.New(rand.NewPCG(2026, 12))
	must := func(err error) {
		if err != nil {
			tb.Fatal(err)
		}
	}
	create := func(name string) (*os.File, *bufio.Writer) {
		f, err := os.Create(filepath.Join(dir, name))
		must(err)
		return f, bufio.NewWriterSize(f, 1<<20)
	}
	f, w := create("institutions.csv")
	fmt.Fprintln(w, "id,name,country,region,staff_fte")
	for i := 0; i < institutions; i++ {
		fmt.Fprintf(w, "W%05d,World Institution %d,Country %02d,Region %d,%d\n", i, i, i%90, i%7, 100+rng.IntN(5000))
	}
	must(w.Flush())
	must(f.Close())

	f, w = create("indicators.yaml")
	fmt.Fprintln(w, "indicators:")
	for k := 0; k < worldIndicators; k++ {
		fmt.Fprintf(w, "  - {key: ind%02d, label: Indicator %d, unit: ratio, better: higher, decimals: 2}\n", k, k)
	}
	must(w.Flush())
	must(f.Close())

	f, w = create("values.csv")
	fmt.Fprintln(w, "institution,year,indicator,value")
	for i := 0; i < institutions; i++ {
		for y := 0; y < worldYears; y++ {
			for k := 0; k < worldIndicators; k++ {
				fmt.Fprintf(w, "W%05d,%d,ind%02d,%.3f\n", i, 2015+y, k, rng.Float64()*100)
			}
		}
	}
	must(w.Flush())
	must(f.Close())

	f, w = create("brief.md")
	fmt.Fprintln(w, "---\ntitle: World\nfocus: W00001\nyear: 2024\nyears: [2015, 2024]\ndata: {register: institutions.csv, values: values.csv, dictionary: indicators.yaml}\n---\n\n# World")
	must(w.Flush())
	must(f.Close())
}

func loadWorld(b *testing.B, dir string) {
	br, err := brief.Load(filepath.Join(dir, "brief.md"))
	if err != nil {
		b.Fatal(err)
	}
	d, _, err := Load(os.DirFS(dir), br)
	if err != nil {
		b.Fatal(err)
	}
	if d.Register.Len() == 0 {
		b.Fatal("empty")
	}
}

// BenchmarkLoadWorld loads and validates the world-sized dataset; run with
// -benchmem for B/op. Peak memory is reported as peak-heap-MB from the
// runtime's heap statistics sampled after the load.
func BenchmarkLoadWorld(b *testing.B) {
	dir := b.TempDir()
	writeWorld(b, dir, worldInstitutions)
	runtime.GC()
	b.ReportAllocs()
	b.ResetTimer()
	var peak uint64
	for i := 0; i < b.N; i++ {
		loadWorld(b, dir)
		var ms runtime.MemStats
		runtime.ReadMemStats(&ms)
		peak = max(peak, ms.HeapSys)
	}
	b.ReportMetric(float64(peak)/(1<<20), "heap-sys-MB")
}

// BenchmarkLoadRows loads datasets of 1/20, 1/10 and 1/5 of the world's
// size; ns/op should grow in proportion to the rows (200 per institution).
func BenchmarkLoadRows(b *testing.B) {
	for _, n := range []int{worldInstitutions / 20, worldInstitutions / 10, worldInstitutions / 5} {
		b.Run(fmt.Sprintf("rows=%d", n*worldIndicators*worldYears), func(b *testing.B) {
			dir := b.TempDir()
			writeWorld(b, dir, n)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				loadWorld(b, dir)
			}
		})
	}
}
