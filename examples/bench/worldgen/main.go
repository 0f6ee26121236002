// Command worldgen writes the world-sized benchmark scenario (see package
// benchworld) into a folder:
//
//	go run ./examples/bench/worldgen -o /tmp/world
//	go run ./cmd/peerpack build /tmp/world/brief.md -o /tmp/world/pack.pdf --figures /tmp/world/figures.csv
//	go run ./examples/bench/worldgen -o /tmp/charts -institutions 640 -systems 12 -brief charts
package main

import (
	"flag"
	"fmt"
	"os"

	"peerpack/internal/benchworld"
)

func main() {
	out := flag.String("o", "", "folder to write the scenario into (created if missing)")
	n := flag.Int("institutions", 21500, "institutions in the register")
	systems := flag.Int("systems", 120, "higher-education systems (the register's country column)")
	years := flag.Int("years", 10, "years of values")
	kind := flag.String("brief", "world", "brief to write: world (12 charts, tables, commentary) or charts (24 charts)")
	flag.Parse()
	if *out == "" || flag.NArg() > 0 || (*kind != "world" && *kind != benchworld.BriefCharts) {
		fmt.Fprintln(os.Stderr, "usage: worldgen -o DIR [-institutions N] [-systems N] [-years N] [-brief world|charts]")
		os.Exit(2)
	}
	if *kind == "world" {
		*kind = ""
	}
	if err := os.MkdirAll(*out, 0o755); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	if err := benchworld.Write(*out, benchworld.Options{Institutions: *n, Systems: *systems, Years: *years, Brief: *kind}); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
}
