// Package build runs peerpack's pipeline, in order and in one place:
//
//	read and validate inputs (brief, dataset)
//	  -> compute the figures model
//	  -> write the commentary from it
//	  -> lay out the pack
//	  -> write the PDF (and the figures file) atomically.
package build

import (
	"context"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"peerpack/internal/provenance"
	"runtime/debug"
	"strconv"
	"strings"
	"time"

	"peerpack/internal/atomicfile"
	"peerpack/internal/brief"
	"peerpack/internal/chartfiles"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/heaphint"
	"peerpack/internal/layout"
	"peerpack/internal/limits"
	"peerpack/internal/narrative"
)

// Source is where a brief and its data come from.
type Source struct {
	// FS is the root every path must stay inside.
	FS fs.FS
	// Brief is the brief's path inside FS.
	Brief string
	// Display is how messages name the brief (the path the user typed).
	Display string
	// Dir is the root folder on disk (absolute), empty for an in-memory
	// FS; builds use it to refuse an output that is one of their inputs.
	Dir string
	// Rebuild is the command a reader runs to build the pack again from
	// the same files, printed in its closing section; empty gives
	// "peerpack build" with the brief's name.
	Rebuild string
}

// OpenSource opens a brief on disk. Its data paths are confined to root,
// which defaults to the brief's folder; os.Root refuses any path, `..` or
// symbolic link that leads outside it.
func OpenSource(briefPath, root string) (Source, error) {
	if root == "" {
		root = filepath.Dir(briefPath)
	}
	absRoot, err := filepath.Abs(root)
	if err != nil {
		return Source{}, err
	}
	absBrief, err := filepath.Abs(briefPath)
	if err != nil {
		return Source{}, err
	}
	rel, err := filepath.Rel(absRoot, absBrief)
	if err != nil || rel == ".." || strings.HasPrefix(rel, ".."+string(filepath.Separator)) {
		return Source{}, diag.At(briefPath, 0, 0, "the brief lies outside the root folder %s; give a --root that contains it", root)
	}
	r, err := os.OpenRoot(absRoot)
	if err != nil {
		return Source{}, diag.At(root, 0, 0, "cannot open the folder: %v", unwrap(err))
	}
	return Source{FS: r.FS(), Brief: filepath.ToSlash(rel), Display: briefPath, Dir: absRoot}, nil
}

func unwrap(err error) error {
	if pe, ok := err.(*fs.PathError); ok {
		return pe.Err
	}
	return err
}

// Inputs are the validated inputs of one pack.
type Inputs struct {
	Brief   *brief.Brief
	Data    *dataset.Dataset
	Report  *dataset.Report
	Figures *figures.Model
	FS      fs.FS
	// Sources are the data files read, with sizes and checksums, for the
	// pack's closing section.
	Sources []provenance.File
	// Rebuild is the command that rebuilds the pack from the same files.
	Rebuild string
}

// Load reads the brief and everything it names, and computes the figures
// model. Every problem found is returned together as a *diag.List.
func Load(src Source, override func(*brief.Brief)) (*Inputs, error) {
	return LoadWith(src, override, limits.Default())
}

// LoadWith is Load with the given limits on every input.
func LoadWith(src Source, override func(*brief.Brief), lim limits.Limits) (*Inputs, error) {
	lim = lim.Or()
	raw, err := readBrief(src)
	if err != nil {
		return nil, err
	}
	var probs diag.List
	b, err := brief.ParseWith(src.Display, raw, lim.YAML())
	if b == nil {
		return nil, err
	}
	probs.Add(err)
	probs.Add(checkBlockCounts(b, lim))
	if override != nil {
		override(b)
	}
	briefDir := path.Dir(src.Brief)
	b.Dir = briefDir
	rebaseDataPaths(b, briefDir)
	if probs.Len() > 0 {
		// Front matter problems make loading the data pointless.
		return nil, probs.Err()
	}
	// Advise huge pages for the heap before it grows (heaphint): about
	// three times the values files' size, and at least what any pack
	// takes.
	heaphint.Reserve(3 * valuesBytes(src.FS, b))
	rec := provenance.New(src.FS)
	// The report's data summary is for check alone: CheckBuild computes
	// it beside the pack, a build never.
	d, rep, err := dataset.LoadUnsummarised(rec, b, lim)
	if err != nil {
		probs.Add(err)
		// The report says what loaded; check prints it above the problems.
		return &Inputs{Brief: b, Report: rep, FS: src.FS}, probs.Err()
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		probs.Add(err)
		return nil, probs.Err()
	}
	if err := lim.Check(b.File, 0, 0, limits.Groups, int64(len(m.Groups)), "the brief defines", "narrow each: or remove groups"); err != nil {
		probs.Add(err)
		return nil, probs.Err()
	}
	if err := checkNames(m); err != nil {
		probs.Add(err)
		return nil, probs.Err()
	}
	if err := layout.CheckPlaceholders(b, m); err != nil {
		probs.Add(err)
		return nil, probs.Err()
	}
	if err := layout.CheckTableSizes(b, m); err != nil {
		probs.Add(err)
		return nil, probs.Err()
	}
	return &Inputs{Brief: b, Data: d, Report: rep, Figures: m, FS: src.FS, Sources: rec.Files(), Rebuild: src.Rebuild}, nil
}

// valuesBytes is the size of the values files the brief names (0 for
// any it cannot see; loading reports those).
func valuesBytes(fsys fs.FS, b *brief.Brief) int64 {
	var n int64
	for _, v := range b.Data.Values {
		file, _, _ := strings.Cut(v, "#")
		if fi, err := fs.Stat(fsys, file); err == nil && fi.Mode().IsRegular() {
			n += fi.Size()
		}
	}
	return n
}

// readBrief checks the brief's kind and size before reading it (a named
// pipe would block the open, /dev/zero would never end, a 2 GB file would
// be read whole before its size was seen), then reads it through a limit
// in case it grows meanwhile.
func readBrief(src Source) ([]byte, error) {
	fi, err := fs.Stat(src.FS, src.Brief)
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) {
			return nil, diag.At(src.Display, 0, 0, "cannot read the brief: there is no such file; check the path")
		}
		return nil, diag.At(src.Display, 0, 0, "the brief %s", dataset.OpenProblem(err))
	}
	if kind := dataset.NotAFile(fi.Mode()); kind != "" {
		return nil, diag.At(src.Display, 0, 0, "the brief is %s, not a file; name a Markdown file, e.g. brief.md", kind)
	}
	tooBig := func(n int64) error {
		return diag.At(src.Display, 0, 0, "the brief is %s, over the limit of %s for a brief; keep data in the data files it names", format.Bytes(int(n)), format.Bytes(brief.MaxBriefBytes))
	}
	if fi.Size() > brief.MaxBriefBytes {
		return nil, tooBig(fi.Size())
	}
	f, err := src.FS.Open(src.Brief)
	if err != nil {
		return nil, diag.At(src.Display, 0, 0, "the brief %s", dataset.OpenProblem(err))
	}
	defer f.Close()
	raw, err := io.ReadAll(io.LimitReader(f, brief.MaxBriefBytes+1))
	if err != nil {
		return nil, diag.At(src.Display, 0, 0, "the brief %s", dataset.OpenProblem(err))
	}
	if len(raw) > brief.MaxBriefBytes {
		return nil, tooBig(int64(len(raw)))
	}
	return raw, nil
}

// checkBlockCounts refuses a brief with more charts or blocks than the
// limits allow, at the first block past the limit.
func checkBlockCounts(b *brief.Brief, lim limits.Limits) error {
	var l diag.List
	charts := 0
	for i, blk := range b.Blocks {
		if blk.Kind() == "chart" {
			charts++
			if lim.Exceeded(limits.Charts, int64(charts)) {
				p := blk.Position()
				l.Add(lim.Check(b.File, p.Line, p.Column, limits.Charts, int64(countKind(b, "chart")), "the brief has", "split it into several briefs"))
				break
			}
		}
		if lim.Exceeded(limits.Blocks, int64(i+1)) {
			p := blk.Position()
			l.Add(lim.Check(b.File, p.Line, p.Column, limits.Blocks, int64(len(b.Blocks)), "the brief has", "split it into several briefs"))
			break
		}
	}
	return l.Err()
}

func countKind(b *brief.Brief, kind string) int {
	n := 0
	for _, blk := range b.Blocks {
		if blk.Kind() == kind {
			n++
		}
	}
	return n
}

// rebaseDataPaths makes the brief's data paths relative to the root, so a
// brief in a subfolder of --root may name ../shared/values.csv. A path that
// is not a plain relative path, or that would leave the root, is left as
// written: the dataset stage refuses it with a message at the brief key.
func rebaseDataPaths(b *brief.Brief, dir string) {
	if dir == "." {
		return
	}
	fix := func(p *string) {
		orig := filepath.ToSlash(*p)
		if orig == "" || strings.Contains(orig, "://") || path.IsAbs(orig) || filepath.IsAbs(*p) {
			return
		}
		file, sheet, hasSheet := strings.Cut(orig, "#")
		joined := path.Clean(path.Join(dir, file))
		if !fs.ValidPath(joined) {
			return
		}
		if hasSheet {
			joined += "#" + sheet
		}
		*p = joined
	}
	fix(&b.Data.Register)
	fix(&b.Data.Dictionary)
	fix(&b.Data.PPP)
	fix(&b.Data.Papers.File)
	fix(&b.Data.Papers.Baselines)
	fix(&b.Data.Votes.File)
	fix(&b.Data.Votes.Targets)
	for i := range b.Data.Values {
		fix(&b.Data.Values[i])
	}
	fix(&b.Theme.Logo)
}

// Options are the outputs and settings of one build.
type Options struct {
	Output   string // PDF path
	Figures  string // figures CSV path, optional
	Workbook string // figures XLSX path, optional
	// Charts, when set, is a folder that receives every figure of the
	// pack as SVG and 300-dpi PNG (internal/chartfiles).
	Charts   string
	Created  time.Time
	Version  string
	Override func(*brief.Brief)
	// Limits cap every input; the zero value means the defaults.
	Limits limits.Limits
	// AfterStage, when set, is called after each stage ("load", "pack",
	// "written": every output in its temporary, the charts in their
	// staging folder, none renamed yet)
	// with the stage's name; tests use it to interrupt a build part way.
	AfterStage func(stage string)
}

// Result describes a finished build.
type Result struct {
	Output string
	Bytes  int
	Inputs *Inputs
}

// Packed is a laid-out pack: the PDF and the commentary written for it.
// The figures file is not part of it: it is written from the figures
// model (figures.WriteCSV, WriteWorkbook) only when one is asked for,
// streamed to the file.
type Packed struct {
	PDF        []byte
	Commentary *narrative.Commentary
	// Figures are the charts as set in the pack, in figure order.
	Figures []layout.Figure
}

// Pack writes the commentary and lays out the PDF of loaded inputs. It
// composes the commentary into in.Figures, so it runs once per figures
// model; the figures file written afterwards carries the commentary rows.
func Pack(in *Inputs, created time.Time, version string) (p *Packed, err error) {
	return pack(in, created, version, nil, false)
}

// pack is Pack that runs alongside, when given, on another goroutine
// while the pack is laid out: from the moment the commentary is in the
// model, which nothing changes after, so a writer of the figures model
// reads what the pack shows. pack returns after alongside has.
//
// draft lays the pack out without writing its PDF (Packed.PDF is nil):
// for check, which lays the pack out only to prove that it builds.
func pack(in *Inputs, created time.Time, version string, alongside func(), draft bool) (p *Packed, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("internal error while laying out the pack (please report it with the brief): %v\n%s", r, debug.Stack())
		}
	}()
	com, err := narrative.Compose(in.Figures, in.Brief)
	if err != nil {
		return nil, err
	}
	// Every sentence is re-read against the figures before anything is
	// laid out: a printed number that no cited figure gives, or a recorded
	// claim that does not hold, fails the build rather than reaching a
	// council (wording is chosen from claims that hold, so this is a
	// safety net for the wording code, not a check of the data).
	if err := verifyCommentary(in.Figures, com); err != nil {
		return nil, fmt.Errorf("the commentary did not pass its own check, so no pack was written; this is a fault in peerpack, not in the brief or data: please report it with the brief\n%w", err)
	}
	if alongside != nil {
		done := make(chan struct{})
		go func() {
			defer close(done)
			alongside()
		}()
		defer func() { <-done }()
	}
	pdf, figs, err := layout.RenderFigures(layout.Input{
		Brief: in.Brief, Model: in.Figures, Commentary: com, FS: in.FS,
		Created: created, Version: version, Sources: in.Sources, Rebuild: in.Rebuild,
		Draft: draft,
	})
	if err != nil {
		return nil, err
	}
	return &Packed{PDF: pdf, Commentary: com, Figures: figs}, nil
}

// writeModelFiles writes the figures file and the workbook asked for into
// set's temporaries, streamed from the model; a panic becomes an error.
func writeModelFiles(set *atomicfile.Set, opt Options, m *figures.Model) (err error) {
	defer func() {
		if r := recover(); r != nil {
			set.Discard()
			err = fmt.Errorf("internal error while writing the figures (please report it with the brief): %v\n%s", r, debug.Stack())
		}
	}()
	if opt.Figures != "" {
		if err := set.Add(opt.Figures, 0o644, func(w io.Writer) error { return figures.WriteCSV(w, m) }); err != nil {
			return err
		}
	}
	if opt.Workbook != "" {
		if err := set.Add(opt.Workbook, 0o644, func(w io.Writer) error { return WriteWorkbook(w, m) }); err != nil {
			return err
		}
	}
	return nil
}

// Build runs the whole pipeline for one brief and writes the outputs.
func Build(ctx context.Context, src Source, opt Options) (res *Result, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("internal error (please report it with the brief): %v\n%s", r, debug.Stack())
		}
	}()
	after := func(stage string) {
		if opt.AfterStage != nil {
			opt.AfterStage(stage)
		}
	}
	if err := checkOutputKinds(opt); err != nil {
		return nil, err
	}
	in, err := LoadWith(src, opt.Override, opt.Limits)
	if err != nil {
		return nil, err
	}
	if err := checkOutputsAgainstInputs(opt, src, in.Brief); err != nil {
		return nil, err
	}
	after("load")
	if err := ctx.Err(); err != nil {
		return nil, interrupted(opt.Output)
	}
	// The figures file and workbook are written to their temporaries while
	// the pack is laid out (the model no longer changes by then).
	var modelSet atomicfile.Set
	var modelErr error
	var alongside func()
	if opt.Figures != "" || opt.Workbook != "" {
		alongside = func() { modelErr = writeModelFiles(&modelSet, opt, in.Figures) }
	}
	packed, err := pack(in, opt.Created, opt.Version, alongside, false)
	if err != nil {
		modelSet.Discard()
		return nil, err
	}
	if modelErr != nil {
		modelSet.Discard()
		return nil, modelErr
	}
	pdf := packed.PDF
	after("pack")
	if err := ctx.Err(); err != nil {
		modelSet.Discard()
		return nil, interrupted(opt.Output)
	}
	// One build, one outcome: every output is written in full to a
	// temporary first, and the targets are replaced only when all are.
	var set atomicfile.Set
	if err := set.Add(opt.Output, 0o644, writeBytes(pdf)); err != nil {
		modelSet.Discard()
		return nil, err
	}
	set.Join(&modelSet)
	// The charts folder is part of the same outcome: its files are drawn
	// into a staging folder and reach it only when the pack does.
	if opt.Charts != "" {
		if _, err := chartfiles.Add(ctx, &set, opt.Charts, packed.Figures); err != nil {
			set.Discard()
			if ctx.Err() != nil {
				return nil, interrupted(opt.Output)
			}
			return nil, err
		}
	}
	after("written")
	if err := set.Commit(ctx); err != nil {
		return nil, err
	}
	return &Result{Output: opt.Output, Bytes: len(pdf), Inputs: in}, nil
}

// verifyCommentary is narrative.Verify; a test replaces it to prove that a
// failed check stops the build.
var verifyCommentary = narrative.Verify

func writeBytes(b []byte) func(io.Writer) error {
	return func(w io.Writer) error {
		_, err := w.Write(b)
		return err
	}
}

func interrupted(out string) error {
	return fmt.Errorf("interrupted; %s was not written and the previous file, if any, is untouched", out)
}

// CreatedTime returns the build time: SOURCE_DATE_EPOCH when set
// (reproducible-builds.org convention: seconds since the Unix epoch, UTC),
// otherwise now.
func CreatedTime() (time.Time, error) {
	s := os.Getenv("SOURCE_DATE_EPOCH")
	if s == "" {
		return time.Now().UTC(), nil
	}
	n, err := strconv.ParseInt(s, 10, 64)
	if err != nil || n < 0 {
		return time.Time{}, fmt.Errorf("SOURCE_DATE_EPOCH=%q is not a whole number of seconds since 1970-01-01; unset it or fix it", s)
	}
	return time.Unix(n, 0).UTC(), nil
}

// Refocus derives the inputs of another pack from loaded ones: the same
// data, the brief changed by override (another focus, title or accent),
// and the figures computed afresh. The dataset is shared read-only, so
// many packs can be refocused at once.
func Refocus(base *Inputs, override func(*brief.Brief)) (*Inputs, error) {
	b := *base.Brief
	if override != nil {
		override(&b)
	}
	m, err := figures.Compute(base.Data, &b)
	if err != nil {
		return nil, err
	}
	return &Inputs{Brief: &b, Data: base.Data, Report: base.Report, Figures: m, FS: base.FS, Sources: base.Sources}, nil
}
