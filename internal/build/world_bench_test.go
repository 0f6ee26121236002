//go:build unix

package build

import (
	"bufio"
	"io"
	"os"
	"path/filepath"
	"runtime"
	"syscall"
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

// cpuSeconds is the process's user + system time so far: on a shared
// machine the CPU a stage takes says more than its wall time.
func cpuSeconds() float64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano()).Seconds()
}

// reportCPU reports the CPU seconds per run since start as cpu-s/op.
func reportCPU(b *testing.B, start float64) {
	b.ReportMetric((cpuSeconds()-start)/float64(b.N), "cpu-s/op")
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
		cpu := cpuSeconds()
		for i := 0; i < b.N; i++ {
			if _, err := Load(src, nil); err != nil {
				b.Fatal(err)
			}
		}
		reportCPU(b, cpu)
	})
	in, err := Load(src, nil)
	if err != nil {
		b.Fatal(err)
	}
	b.Run("pack", func(b *testing.B) {
		b.ReportAllocs()
		cpu := 0.0
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
			start := cpuSeconds()
			if _, err := Pack(fresh, created, "bench"); err != nil {
				b.Fatal(err)
			}
			cpu += cpuSeconds() - start
		}
		b.ReportMetric(cpu/float64(b.N), "cpu-s/op")
	})
	if _, err := Pack(in, created, "bench"); err != nil {
		b.Fatal(err)
	}
	b.Run("figures-file", func(b *testing.B) {
		b.ReportAllocs()
		cpu := cpuSeconds()
		for i := 0; i < b.N; i++ {
			w := bufio.NewWriter(io.Discard)
			if err := figures.WriteCSV(w, in.Figures); err != nil {
				b.Fatal(err)
			}
			w.Flush()
		}
		reportCPU(b, cpu)
	})
}

// BenchmarkChartsBrief builds the 24-chart brief over the small benchmark
// world (640 institutions in 12 systems; examples/bench/charts.sh times
// the same build from outside against matplotlib): load and pack, in
// memory.
func BenchmarkChartsBrief(b *testing.B) {
	dir := b.TempDir()
	if err := benchworld.Write(dir, benchworld.Options{Institutions: 640, Systems: 12, Brief: benchworld.BriefCharts}); err != nil {
		b.Fatal(err)
	}
	src, err := OpenSource(filepath.Join(dir, "brief.md"), "")
	if err != nil {
		b.Fatal(err)
	}
	created := time.Unix(0, 0).UTC()
	b.ReportAllocs()
	cpu := cpuSeconds()
	for i := 0; i < b.N; i++ {
		in, err := Load(src, nil)
		if err != nil {
			b.Fatal(err)
		}
		p, err := Pack(in, created, "bench")
		if err != nil {
			b.Fatal(err)
		}
		if len(p.Figures) != benchworld.ChartCount {
			b.Fatalf("%d charts set, want %d", len(p.Figures), benchworld.ChartCount)
		}
	}
	reportCPU(b, cpu)
}

// BenchmarkWorldCheck is what `peerpack check` does on the world: load
// (brief, data, validation, figures model), build the pack in memory to
// prove it would build, and write the report. The README's target is under
// 1 s wall on 2 cores. For a profile:
//
//	PEERPACK_WORLD_DIR=/tmp/world go test ./internal/build -run '^$' -bench WorldCheck -benchtime 3x -cpuprofile check.prof
func BenchmarkWorldCheck(b *testing.B) {
	src, err := OpenSource(filepath.Join(worldDir(b), "brief.md"), "")
	if err != nil {
		b.Fatal(err)
	}
	runtime.GC()
	b.ReportAllocs()
	b.ResetTimer()
	cpu := cpuSeconds()
	for i := 0; i < b.N; i++ {
		in, err := Load(src, nil)
		if err != nil {
			b.Fatal(err)
		}
		if err := CheckBuild(in, "bench"); err != nil {
			b.Fatal(err)
		}
		WriteCheckReport(io.Discard, in)
	}
	reportCPU(b, cpu)
}
