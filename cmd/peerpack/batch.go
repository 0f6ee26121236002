package main

import (
	"context"
	"fmt"
	"os"
	"path/filepath"

	"peerpack/internal/batch"
	"peerpack/internal/build"
	"peerpack/internal/demo"
)

func runBatch(ctx context.Context, e *env, args []string) int {
	c := findCommand("batch")
	fs := newFlags(c, e)
	plan := fs.String("plan", "", "CSV with one row per pack: focus,output[,title,subtitle,audience,accent]")
	group := fs.String("group", "", "build one pack per member of this group of the brief")
	out := fs.String("out", "", "folder to write the packs into (required)")
	jobs := fs.Int("jobs", 0, "packs built at once (default: one per core)")
	charts := fs.String("charts", "", "also write each pack's figures as SVG and 300-dpi PNG into a sub-folder of this folder named after the pack")
	useDemo := fs.Bool("demo", false, "use the embedded demo brief and data")
	root := fs.String("root", "", "folder that every input path must stay inside (default: the brief's folder)")
	pos, code, ok := parseArgs(c, e, fs, args)
	if !ok {
		return code
	}
	if *out == "" || (*plan == "") == (*group == "") || (len(pos) == 1) == *useDemo || len(pos) > 1 {
		e.errorf("batch needs a brief (or --demo), exactly one of --plan or --group, and --out DIR\n")
		fmt.Fprintf(e.stderr, "Example: peerpack batch brief.md --plan plan.csv --out packs\n")
		return exitUsage
	}
	var src build.Source
	if *useDemo {
		src = build.Source{FS: demo.FS(), Brief: demo.BriefName, Display: "demo/" + demo.BriefName}
	} else {
		s, err := build.OpenSource(pos[0], *root)
		if err != nil {
			return reportError(e, err)
		}
		src = s
	}
	created, err := build.CreatedTime()
	if err != nil {
		e.errorf("%v\n", err)
		return exitUsage
	}
	base, err := build.LoadWith(src, nil, e.limits)
	if err != nil {
		return reportError(e, err)
	}
	var list []batch.Job
	if *plan != "" {
		dir, name := filepath.Split(*plan)
		if dir == "" {
			dir = "."
		}
		list, err = batch.ReadPlan(os.DirFS(dir), name, *plan)
	} else {
		list, err = batch.GroupJobs(base, *group)
	}
	if err != nil {
		return reportError(e, err)
	}
	if err := os.MkdirAll(*out, 0o755); err != nil {
		return reportError(e, err)
	}
	var prog batch.Progress
	if !e.quiet {
		prog = batch.NewProgress(e.stderr)
	}
	outs := batch.Run(ctx, base, list, batch.Options{OutDir: *out, Workers: *jobs, Created: created, Version: version, Charts: *charts, Progress: prog})
	if failed := batch.WriteSummary(e.stdout, outs); failed > 0 {
		return exitInput
	}
	return exitOK
}
