package build

import (
	"bufio"
	"io"
	"os"
	"path/filepath"
	"runtime"
	"testing"
	"time"

	"peerpack/internal/benchworld"
	"peerpack/internal/figures"
)

// worldDir writes the world-sized benchmark scenario (21,500 institutions,
// 24 indicators, 10 years, one group per system) once per run, or uses
// PEERPACK_WORLD_DIR when it names a folder already written by
// examples/bench/worldgen.
func worldDir(b *testing.B) string {
	b.Helper()
	if d := os.Getenv("PEERPACK_WORLD_DIR"); d != "" {
		if _, err := os.Stat(filepath.Join(d, "brief.md")); err == nil {
			return d
		}
	}
	dir := b.TempDir()
	if err := benchworld.Write(dir, benchworld.Options{}); err != nil {
		b.Fatal(err)
	}
	return dir
}

// BenchmarkWorldStages times each stage of a world-sized build on its own:
// load (brief, data, validation, figures model), pack (commentary and
// layout, in memory) and the figures file (streamed to a discarding
// writer). The README's performance table quotes them; the whole build is
// timed from outside by examples/bench/run.sh.
func BenchmarkWorldStages(b *testing.B) {
	src, err := OpenSource(filepath.Join(worldDir(b), "brief.md"), "")
	if err != nil {
		b.Fatal(err)
	}
	created := time.Unix(0, 0).UTC()
	b.Run("load", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			if _, err := Load(src, nil); err != nil {
				b.Fatal(err)
			}
		}
	})
	in, err := Load(src, nil)
	if err != nil {
		b.Fatal(err)
	}
	b.Run("pack", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			// Pack composes into the model once: refocus for a fresh one
			// (the figures are recomputed, outside the timer).
			b.StopTimer()
			fresh, err := Refocus(in, nil)
			if err != nil {
				b.Fatal(err)
			}
			runtime.GC()
			b.StartTimer()
			if _, err := Pack(fresh, created, "bench"); err != nil {
				b.Fatal(err)
			}
		}
	})
	if _, err := Pack(in, created, "bench"); err != nil {
		b.Fatal(err)
	}
	b.Run("figures-file", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			w := bufio.NewWriter(io.Discard)
			if err := figures.WriteCSV(w, in.Figures); err != nil {
				b.Fatal(err)
			}
			w.Flush()
		}
	})
}
