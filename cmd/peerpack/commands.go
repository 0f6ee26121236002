package main

import (
	"bufio"
	"context"
	"fmt"
	iofs "io/fs"
	"path/filepath"
	"runtime/debug"
	"strings"

	"peerpack/internal/build"
	"peerpack/internal/demo"
	"peerpack/internal/format"
	"peerpack/internal/limits"
	"peerpack/templates"
)

func init() {
	commands = []*command{
		{name: "build", summary: "build a pack from a brief", run: runBuild, usage: `Usage:
  peerpack build BRIEF.md -o pack.pdf [--figures figures.csv] [--charts DIR] [--root DIR]

Reads the brief and the data files it names (paths relative to the brief),
computes the figures, writes the commentary and lays out the PDF. The PDF is
written to a temporary file and renamed, so a failed build never replaces
the last good pack. With SOURCE_DATE_EPOCH set, two builds are
byte-identical.

Examples:
  peerpack build briefs/board-2025.md -o board-2025.pdf
  peerpack build client/brief.md -o client.pdf --figures client-figures.csv
  peerpack build brief.md -o pack.pdf --charts slides/charts
  peerpack build brief.md -o pack.pdf --watch
  SOURCE_DATE_EPOCH=1764547200 peerpack build brief.md -o pack.pdf`},
		{name: "check", summary: "validate a brief and its data, and summarise coverage", run: runCheck, usage: `Usage:
  peerpack check BRIEF.md [--root DIR] [--json]

Checks the brief (front matter and every block) and loads everything it
names, lays the pack out in memory (writing nothing), then prints
institutions, years, indicators, coverage per indicator,
year and group, and anything suspicious. Lists every problem, not just the
first. Exit 0 when the brief would build, 1 when it would not.
With --json the same report, problems included, is one JSON document on
standard output (its fields are listed in the README).

Examples:
  peerpack check brief.md
  peerpack check --json brief.md > check.json
  peerpack check --root ../shared briefs/brief.md`},
		{name: "demo", summary: "build the demo pack from the embedded demo scenario", run: runDemo, usage: `Usage:
  peerpack demo [-o demo.pdf] [--figures figures.csv] [--charts DIR]
  peerpack demo --write DIR

Builds the full demo pack from an invented higher-education scenario
shipped in the binary (generated from a fixed seed), or writes the
scenario's files to DIR as a starting point.

Examples:
  peerpack demo -o demo.pdf
  peerpack demo --write my-pack && peerpack build my-pack/brief.md -o my.pdf`},
		{name: "new", summary: "start a brief from a template", run: runNew, usage: `Usage:
  peerpack new --template NAME DIR

Writes the template's brief and the demo data into DIR (which must not hold
those files already), so that 'peerpack build DIR/brief.md' works at once.
Then replace the data and edit the brief; 'peerpack check' explains what to
replace.

Examples:
  peerpack new --template governing-body board
  peerpack new --template country-competition intl-office`},
		{name: "batch", summary: "build one pack per row of a plan or per member of a group", run: runBatch, usage: `Usage:
  peerpack batch BRIEF.md --plan plan.csv --out DIR [--jobs N] [--charts DIR]
  peerpack batch BRIEF.md --group "Home sector" --out DIR [--jobs N] [--charts DIR]
  peerpack batch --demo --group "Home sector" --out DIR

Reads the brief and its data once, then builds one pack per plan row (CSV
columns focus,output and optionally title,subtitle,audience,accent) or per
member of a group of the brief, in parallel over the cores. A failing pack
never stops the others; the summary names each failure and the exit code
is 1 when any pack failed.

Examples:
  peerpack batch brief.md --plan clients.csv --out packs
  peerpack batch --demo --group "Kestrian sector" --out packs`},
		{name: "version", summary: "print the version", run: runVersion, usage: "Usage:\n  peerpack version"},
		{name: "help", summary: "show help for a command", run: runHelp, usage: "Usage:\n  peerpack help [COMMAND]"},
	}
}

func runBuild(ctx context.Context, e *env, args []string) int {
	c := findCommand("build")
	fs := newFlags(c, e)
	out := fs.String("o", "", "the PDF to write (required)")
	figs := fs.String("figures", "", "also write the figures file (CSV) here")
	wb := fs.String("workbook", "", "also write the figures as an XLSX workbook here, one sheet per section")
	fs.StringVar(&e.charts, "charts", "", "also write every figure into this folder as SVG and 300-dpi PNG")
	root := fs.String("root", "", "folder that every input path must stay inside (default: the brief's folder)")
	watchFlag := fs.Bool("watch", false, "after building, rebuild whenever the brief or its data change")
	pos, code, ok := parseArgs(c, e, fs, args)
	if !ok {
		return code
	}
	if len(pos) != 1 || *out == "" {
		e.errorf("build needs one brief and -o OUTPUT.pdf\n")
		fmt.Fprintf(e.stderr, "Example: peerpack build brief.md -o pack.pdf\n")
		return exitUsage
	}
	src, err := build.OpenSource(pos[0], *root)
	if err != nil {
		return reportError(e, err)
	}
	code, res := buildOnce(ctx, e, src, *out, *figs, *wb)
	if *watchFlag {
		return watch(ctx, e, src, res, *out, *figs, *wb)
	}
	return code
}

func doBuild(ctx context.Context, e *env, src build.Source, out, figs, wb string) int {
	code, _ := buildOnce(ctx, e, src, out, figs, wb)
	return code
}

// buildOnce builds and reports; the result (nil on failure) tells --watch
// which files the brief now names.
func buildOnce(ctx context.Context, e *env, src build.Source, out, figs, wb string) (int, *build.Result) {
	created, err := build.CreatedTime()
	if err != nil {
		e.errorf("%v\n", err)
		return exitUsage, nil
	}
	e.debugf("reading %s\n", src.Display)
	res, err := build.Build(ctx, src, build.Options{Output: out, Figures: figs, Workbook: wb, Charts: e.charts, Created: created, Version: version, Limits: e.limits})
	if err != nil {
		return reportError(e, err), nil
	}
	e.infof("wrote %s (%s)\n", res.Output, format.Bytes(res.Bytes))
	for _, f := range []string{figs, wb} {
		if f != "" {
			e.infof("wrote %s\n", f)
		}
	}
	return exitOK, res
}

func runCheck(ctx context.Context, e *env, args []string) int {
	c := findCommand("check")
	fs := newFlags(c, e)
	root := fs.String("root", "", "folder that every input path must stay inside (default: the brief's folder)")
	asJSON := fs.Bool("json", false, "write the report as one JSON document on standard output (fields in the README)")
	pos, code, ok := parseArgs(c, e, fs, args)
	if !ok {
		return code
	}
	if len(pos) != 1 {
		e.errorf("check needs one brief\nExample: peerpack check brief.md\n")
		return exitUsage
	}
	if *asJSON {
		return runCheckJSON(e, pos[0], *root)
	}
	src, err := build.OpenSource(pos[0], *root)
	if err != nil {
		return reportError(e, err)
	}
	in, err := build.LoadWith(src, nil, e.limits)
	if err != nil {
		code := reportError(e, err)
		if in != nil && in.Report != nil {
			// What did load, below the problems it refers back to.
			bw := bufio.NewWriter(e.stderr) // many small writes
			fmt.Fprintln(bw)
			in.Report.Write(bw)
			bw.Flush()
		}
		return code
	}
	// "Would build" is proved by building: commentary and layout run in
	// memory, nothing is written.
	if err := build.CheckBuild(in, version); err != nil {
		return reportError(e, err)
	}
	build.WriteCheckReport(e.stdout, in)
	if raw, err := iofs.ReadFile(src.FS, src.Brief); err == nil {
		if notes := templates.EditNotes(raw); len(notes) > 0 {
			fmt.Fprintf(e.stdout, "\nStill marked for editing in %s:\n", src.Display)
			for _, n := range notes {
				fmt.Fprintf(e.stdout, "  line %d: %s\n", n.Line, n.Text)
			}
		}
	}
	return exitOK
}

func runDemo(ctx context.Context, e *env, args []string) int {
	c := findCommand("demo")
	fs := newFlags(c, e)
	out := fs.String("o", "demo.pdf", "the PDF to write")
	figs := fs.String("figures", "", "also write the figures file (CSV) here")
	wb := fs.String("workbook", "", "also write the figures as an XLSX workbook here")
	fs.StringVar(&e.charts, "charts", "", "also write every figure into this folder as SVG and 300-dpi PNG")
	write := fs.String("write", "", "write the demo scenario's files into this folder instead of building")
	pos, code, ok := parseArgs(c, e, fs, args)
	if !ok {
		return code
	}
	if len(pos) != 0 {
		e.errorf("demo takes no arguments, only flags\n")
		return exitUsage
	}
	if *write != "" {
		if err := demo.Write(*write); err != nil {
			return reportError(e, err)
		}
		e.infof("wrote the demo scenario to %s; build it with: peerpack build %s -o demo.pdf\n", *write, filepath.Join(*write, demo.BriefName))
		return exitOK
	}
	src := build.Source{FS: demo.FS(), Brief: demo.BriefName, Display: "demo/" + demo.BriefName, Rebuild: "peerpack demo -o demo.pdf"}
	return doBuild(ctx, e, src, *out, *figs, *wb)
}

func runNew(ctx context.Context, e *env, args []string) int {
	c := findCommand("new")
	fs := newFlags(c, e)
	tmpl := fs.String("template", "", "template name: "+strings.Join(templates.Names(), ", "))
	pos, code, ok := parseArgs(c, e, fs, args)
	if !ok {
		return code
	}
	if len(pos) != 1 || *tmpl == "" {
		e.errorf("new needs --template NAME and a folder\nTemplates: %s\nExample: peerpack new --template governing-body board\n", strings.Join(templates.Names(), ", "))
		return exitUsage
	}
	if _, err := templates.Brief(*tmpl); err != nil {
		e.errorf("%v\n", err)
		return exitUsage
	}
	dir := pos[0]
	if err := templates.Write(*tmpl, dir); err != nil {
		return reportError(e, err)
	}
	target := filepath.Join(dir, demo.BriefName)
	e.infof("wrote %s from the %s template with the demo data beside it\nNext: peerpack check %s shows what to edit; peerpack build %s -o pack.pdf builds it\n", target, *tmpl, target, target)
	return exitOK
}

func runVersion(ctx context.Context, e *env, args []string) int {
	fmt.Fprint(e.stdout, versionReport(debug.ReadBuildInfo()))
	return exitOK
}

func runHelp(ctx context.Context, e *env, args []string) int {
	if len(args) == 0 {
		usage(e.stdout)
		return exitOK
	}
	if args[0] == "limits" {
		fmt.Fprintf(e.stdout, "Input limits (override with --limit name=value; sizes take K, M, G):\n")
		for _, l := range limits.Describe() {
			fmt.Fprintf(e.stdout, "  %s\n", l)
		}
		return exitOK
	}
	c := findCommand(args[0])
	if c == nil {
		e.errorf("no command %q; run 'peerpack help'\n", args[0])
		return exitUsage
	}
	return c.run(ctx, e, []string{"-h"})
}

func findCommand(name string) *command {
	for _, c := range commands {
		if c.name == name {
			return c
		}
	}
	return nil
}

func reportError(e *env, err error) int {
	msg := err.Error()
	lines := strings.Split(msg, "\n")
	for _, l := range lines {
		fmt.Fprintln(e.stderr, l)
	}
	if len(lines) > 1 {
		fmt.Fprintf(e.stderr, "%d problems found.\n", len(lines))
	}
	return exitInput
}

// runCheckJSON is `check --json`: the same checks, reported as one JSON
// document on standard output whether or not the brief would build, so a
// pipeline always has something to parse; the exit code is as for check.
func runCheckJSON(e *env, path, root string) int {
	var doc *build.CheckJSON
	src, err := build.OpenSource(path, root)
	if err != nil {
		doc = build.NewCheckJSON(path, nil, err)
	} else {
		in, lerr := build.LoadWith(src, nil, e.limits)
		if lerr == nil {
			lerr = build.CheckBuild(in, version)
		}
		doc = build.NewCheckJSON(src.Display, in, lerr)
		if raw, rerr := iofs.ReadFile(src.FS, src.Brief); rerr == nil {
			for _, n := range templates.EditNotes(raw) {
				doc.StillToEdit = append(doc.StillToEdit, build.CheckEditNote{Line: n.Line, Text: n.Text})
			}
		}
	}
	if werr := doc.Write(e.stdout); werr != nil {
		e.errorf("cannot write the report: %v\n", werr)
		return exitInput
	}
	if !doc.WouldBuild {
		return exitInput
	}
	return exitOK
}
