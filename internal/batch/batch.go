// Package batch builds many packs from one brief: one per row of a plan
// (a CSV of focus, output and overrides) or one per member of a group. The
// brief and its data are read once; each pack then computes its own
// figures, commentary and layout, in parallel over the cores. One failing
// pack never stops the others.
package batch

import (
	"context"
	"fmt"
	"hash/fnv"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"
	"time"

	"peerpack/internal/atomicfile"
	"peerpack/internal/brief"
	"peerpack/internal/build"
	"peerpack/internal/chartfiles"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/format"
	"peerpack/internal/tabular"
	"peerpack/internal/yamlx"
)

// Job is one pack to build.
type Job struct {
	// Line is the plan row it came from (0 for group members), and Plan
	// the plan's name as messages show it.
	Line   int
	Plan   string
	Focus  string
	Output string
	// Title, Subtitle, Audience and Accent override the brief when set.
	Title, Subtitle, Audience, Accent string
}

// Outcome is how one job ended.
type Outcome struct {
	Job     Job
	Err     error
	Bytes   int
	Elapsed time.Duration
}

// PlanColumns are the columns a plan CSV may have; focus and output are
// required.
var PlanColumns = []string{"focus", "output", "title", "subtitle", "audience", "accent"}

// ReadPlan reads a plan CSV from fsys.
// MaxPlanBytes bounds a batch plan: a million packs' rows fit well within
// it (common practice, no source).
const MaxPlanBytes = 64 << 20

func ReadPlan(fsys fs.FS, name, display string) ([]Job, error) {
	// Kind and size first, as for every input: opening a named pipe
	// blocks until a writer comes, and a device such as /dev/zero never
	// ends.
	if fi, err := fs.Stat(fsys, name); err == nil {
		if kind := dataset.NotAFile(fi.Mode()); kind != "" {
			return nil, diag.At(display, 0, 0, "the plan is %s, not a file; name a CSV file with focus and output columns", kind)
		}
		if fi.Size() > MaxPlanBytes {
			return nil, diag.At(display, 0, 0, "the plan is %s, over the limit of %s for a plan; a plan holds one row per pack", format.Bytes(int(min(fi.Size(), 1<<62))), format.Bytes(MaxPlanBytes))
		}
	}
	t, err := tabular.ReadTable(fsys, name)
	if err != nil {
		return nil, err
	}
	col := map[string]int{}
	var l diag.List
	for i, h := range t.Header {
		key := strings.ToLower(strings.TrimSpace(h.Text))
		known := false
		for _, c := range PlanColumns {
			if c == key {
				known = true
			}
		}
		if !known {
			l.Addf(display, h.Line, h.Col, "unknown plan column %q; plan columns are %s", h.Text, strings.Join(PlanColumns, ", "))
			continue
		}
		col[key] = i
	}
	for _, req := range []string{"focus", "output"} {
		if _, ok := col[req]; !ok {
			l.Addf(display, 1, 1, "the plan has no %q column; a plan needs focus and output columns, e.g. focus,output", req)
		}
	}
	if l.Len() > 0 {
		return nil, l.Err()
	}
	get := func(row []tabular.Cell, key string) string {
		i, ok := col[key]
		if !ok || i >= len(row) {
			return ""
		}
		return strings.TrimSpace(row[i].Text)
	}
	var jobs []Job
	outputs := map[string]int{}
	for _, row := range t.Rows {
		if len(row) == 0 {
			continue
		}
		j := Job{Line: row[0].Line, Plan: display, Focus: get(row, "focus"), Output: get(row, "output"),
			Title: get(row, "title"), Subtitle: get(row, "subtitle"), Audience: get(row, "audience"), Accent: get(row, "accent")}
		if j.Focus == "" || j.Output == "" {
			l.Addf(display, j.Line, 1, "a plan row needs both focus and output")
			continue
		}
		if filepath.IsAbs(j.Output) || strings.Contains(filepath.ToSlash(j.Output), "/") {
			l.Addf(display, j.Line, 1, "output %q must be a plain file name; packs are written into the --out folder", j.Output)
			continue
		}
		if !strings.HasSuffix(strings.ToLower(j.Output), ".pdf") {
			j.Output += ".pdf"
		}
		// Compared without case: on the case-insensitive file systems of
		// macOS and Windows A.pdf and a.pdf are one file.
		if prev, ok := outputs[strings.ToLower(j.Output)]; ok {
			l.Addf(display, j.Line, 1, "output %q is also written by line %d; give each pack its own file name", j.Output, prev)
			continue
		}
		outputs[strings.ToLower(j.Output)] = j.Line
		jobs = append(jobs, j)
	}
	return jobs, l.Err()
}

// GroupJobs makes one job per member of a resolved group of the brief.
func GroupJobs(in *build.Inputs, group string) ([]Job, error) {
	g, ok := in.Figures.Group(group)
	if !ok {
		names := make([]string, 0, len(in.Figures.Groups))
		for _, gg := range in.Figures.Groups {
			names = append(names, gg.Name)
		}
		return nil, fmt.Errorf("no group %q in the brief; groups are %s", group, strings.Join(names, ", "))
	}
	jobs := make([]Job, 0, len(g.Members))
	for _, inst := range g.Members {
		id := in.Figures.InstitutionID(inst)
		jobs = append(jobs, Job{Focus: id, Output: safeName(id) + ".pdf"})
	}
	return uniqueOutputs(jobs)
}

// uniqueOutputs gives every pack its own file: ids that make the same file
// name ("sub/x" and "sub_x" both become sub_x.pdf; KE001 and ke001 are one
// file where names ignore case) each get a suffix from a hash of the id
// (FNV-1a), so the names do not depend on the register's order. Should two
// suffixed names still meet, the collision is an error naming both ids.
func uniqueOutputs(jobs []Job) ([]Job, error) {
	count := map[string]int{}
	for _, j := range jobs {
		count[strings.ToLower(j.Output)]++
	}
	for i, j := range jobs {
		if count[strings.ToLower(j.Output)] > 1 {
			h := fnv.New32a()
			h.Write([]byte(j.Focus))
			jobs[i].Output = fmt.Sprintf("%s-%08x.pdf", strings.TrimSuffix(j.Output, ".pdf"), h.Sum32())
		}
	}
	seen := map[string]string{}
	for _, j := range jobs {
		key := strings.ToLower(j.Output)
		if other, ok := seen[key]; ok {
			return nil, fmt.Errorf("institutions %q and %q would both be written to %s; build them with a plan (--plan) that names each output", other, j.Focus, j.Output)
		}
		seen[key] = j.Focus
	}
	return jobs, nil
}

func safeName(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z', r >= '0' && r <= '9', r == '-', r == '_':
			b.WriteRune(r)
		default:
			b.WriteByte('_')
		}
	}
	return b.String()
}

// Options control a batch run.
type Options struct {
	OutDir  string
	Workers int // 0: one per core
	Created time.Time
	Version string
	// Charts, when set, is a folder that receives each pack's figures as
	// SVG and PNG in a sub-folder named after the pack's file.
	Charts string
	// Progress receives a line or a bar as packs finish; nil for none.
	Progress Progress
	// beforeCommit, when set, is called for each pack once its outputs are
	// written to their temporaries, before any is renamed; tests use it to
	// interrupt a pack part way.
	beforeCommit func(Job)
}

// Progress reports a batch's advance.
type Progress interface {
	Start(total int)
	Done(o Outcome, finished, total int)
	Finish()
}

// Run builds every job. base holds the brief and data read once; each job
// re-computes the figures for its own focus from the shared, read-only
// dataset.
func Run(ctx context.Context, base *build.Inputs, jobs []Job, opt Options) []Outcome {
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	out := make([]Outcome, len(jobs))
	if opt.Charts != "" {
		// Made once here, not by the workers: a pack that fails removes the
		// folders its charts needed only if it made them, and must not
		// remove this one from under another pack. A failure shows in each
		// pack's outcome.
		_ = os.MkdirAll(opt.Charts, 0o755)
	}
	if opt.Progress != nil {
		opt.Progress.Start(len(jobs))
	}
	var mu sync.Mutex
	finished := 0
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				o := runOne(ctx, base, jobs[i], opt)
				mu.Lock()
				out[i] = o
				finished++
				if opt.Progress != nil {
					opt.Progress.Done(o, finished, len(jobs))
				}
				mu.Unlock()
			}
		}()
	}
	for i := range jobs {
		if ctx.Err() != nil {
			out[i] = Outcome{Job: jobs[i], Err: fmt.Errorf("not built: interrupted")}
			continue
		}
		next <- i
	}
	close(next)
	wg.Wait()
	if opt.Progress != nil {
		opt.Progress.Finish()
	}
	return out
}

func runOne(ctx context.Context, base *build.Inputs, j Job, opt Options) (o Outcome) {
	start := time.Now()
	o.Job = j
	defer func() {
		if r := recover(); r != nil {
			o.Err = fmt.Errorf("internal error: %v", r)
		}
		o.Elapsed = time.Since(start)
	}()
	if j.Plan != "" && base.Data.Register.Index(j.Focus) < 0 {
		// Point at the plan's row, where the fix is, not at the brief.
		msg := fmt.Sprintf("focus %q is not in the register %s", j.Focus, base.Data.Register.File)
		if s := yamlx.Nearest(j.Focus, registerIDs(base)); s != "" {
			msg += fmt.Sprintf("; did you mean %q?", s)
		}
		o.Err = diag.At(j.Plan, j.Line, 1, "%s", msg)
		return o
	}
	in, err := build.Refocus(base, func(b *brief.Brief) {
		b.Focus = j.Focus
		if j.Title != "" {
			b.Title = j.Title
		}
		if j.Subtitle != "" {
			b.Subtitle = j.Subtitle
		}
		if j.Audience != "" {
			b.Audience = j.Audience
		}
		if j.Accent != "" {
			b.Theme.Accent = j.Accent
		}
	})
	if err != nil {
		o.Err = err
		return o
	}
	packed, err := build.Pack(in, opt.Created, opt.Version)
	if err != nil {
		o.Err = err
		return o
	}
	pdf := packed.PDF
	// The pack and its charts sub-folder are one outcome: neither replaces
	// the previous one unless both are complete.
	var set atomicfile.Set
	if err := set.Add(filepath.Join(opt.OutDir, j.Output), 0o644, func(w io.Writer) error {
		_, err := w.Write(pdf)
		return err
	}); err != nil {
		o.Err = err
		return o
	}
	if opt.Charts != "" {
		sub := strings.TrimSuffix(j.Output, filepath.Ext(j.Output))
		if _, err := chartfiles.Add(ctx, &set, filepath.Join(opt.Charts, sub), packed.Figures); err != nil {
			set.Discard()
			o.Err = err
			return o
		}
	}
	if opt.beforeCommit != nil {
		opt.beforeCommit(j)
	}
	if err := set.Commit(ctx); err != nil {
		o.Err = err
		return o
	}
	o.Bytes = len(pdf)
	return o
}

func registerIDs(in *build.Inputs) []string {
	ids := make([]string, len(in.Data.Register.Institutions))
	for i, inst := range in.Data.Register.Institutions {
		ids[i] = inst.ID
	}
	return ids
}

// WriteSummary prints a table of outcomes, failures first named with
// their reasons, and returns the number of failures.
func WriteSummary(w io.Writer, outs []Outcome) int {
	failed := 0
	sorted := append([]Outcome(nil), outs...)
	sort.SliceStable(sorted, func(a, b int) bool { return (sorted[a].Err != nil) && (sorted[b].Err == nil) })
	fmt.Fprintf(w, "%-8s %-12s %-32s %10s %8s\n", "status", "focus", "output", "size", "seconds")
	for _, o := range sorted {
		status := "ok"
		if o.Err != nil {
			status = "FAILED"
			failed++
		}
		fmt.Fprintf(w, "%-8s %-12s %-32s %10s %8.2f\n", status, o.Job.Focus, o.Job.Output, sizeText(o.Bytes), o.Elapsed.Seconds())
	}
	for _, o := range sorted {
		if o.Err != nil {
			first := strings.SplitN(o.Err.Error(), "\n", 2)[0]
			fmt.Fprintf(w, "%s (%s): %s\n", o.Job.Output, o.Job.Focus, first)
		}
	}
	fmt.Fprintf(w, "%d built, %d failed\n", len(outs)-failed, failed)
	return failed
}

func sizeText(n int) string {
	if n == 0 {
		return "-"
	}
	return format.Bytes(n)
}
