package demo

import "testing"

// BenchmarkGenerate measures one full generation of the scenario (the
// first call to Files, FS or Write pays it once per process).
func BenchmarkGenerate(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		files := generate(Seed)
		if len(files) == 0 {
			b.Fatal("no files")
		}
	}
}
