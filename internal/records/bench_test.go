package records

import (
	"bytes"
	"testing"
	"testing/fstest"

	"peerpack/internal/limits"
)

// BenchmarkPapers computes every paper indicator over a generated world of
// 200,000 papers, 344 fine fields and 5,000 institutions (both passes).
// For the world-scale run (11.3 million papers) and the comparison with
// pandas, see the README's bench command (examples/bench/records.sh).
func BenchmarkPapers(b *testing.B) {
	var buf bytes.Buffer
	if err := SamplePapers(&buf, SampleOptions{Papers: 200_000, Fields: 344, Institutions: 5000, Seed: 1}); err != nil {
		b.Fatal(err)
	}
	fsys := fstest.MapFS{"p.csv": {Data: buf.Bytes()}}
	b.SetBytes(int64(buf.Len()))
	b.ResetTimer()
	for range b.N {
		if _, err := Papers(OpenFile(fsys, "p.csv", limits.Default()), PaperOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
