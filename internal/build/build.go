// Package build runs peerpack's pipeline, in order and in one place:
//
//	read and validate inputs (brief, dataset)
//	  -> compute the figures model
//	  -> write the commentary from it
//	  -> lay out the pack
//	  -> write the PDF (and the figures file) atomically.
package build

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"runtime/debug"
	"strconv"
	"strings"
	"time"

	"peerpack/internal/atomicfile"
	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/layout"
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
	return Source{FS: r.FS(), Brief: filepath.ToSlash(rel), Display: briefPath}, nil
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
}

// Load reads the brief and everything it names, and computes the figures
// model. Every problem found is returned together as a *diag.List.
func Load(src Source, override func(*brief.Brief)) (*Inputs, error) {
	raw, err := fs.ReadFile(src.FS, src.Brief)
	if err != nil {
		return nil, diag.At(src.Display, 0, 0, "cannot read the brief: %v", unwrap(err))
	}
	if len(raw) > brief.MaxBriefBytes {
		return nil, diag.At(src.Display, 0, 0, "brief is %d bytes, over the limit of %d bytes", len(raw), brief.MaxBriefBytes)
	}
	var probs diag.List
	b, err := brief.Parse(src.Display, raw)
	if b == nil {
		return nil, err
	}
	probs.Add(err)
	if override != nil {
		override(b)
	}
	briefDir := path.Dir(src.Brief)
	b.Dir = briefDir
	if err := rebaseDataPaths(b, briefDir); err != nil {
		probs.Add(err)
		return nil, probs.Err()
	}
	if probs.Len() > 0 {
		// Front matter problems make loading the data pointless.
		return nil, probs.Err()
	}
	d, rep, err := dataset.Load(src.FS, b)
	if err != nil {
		probs.Add(err)
		return nil, probs.Err()
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		probs.Add(err)
		return nil, probs.Err()
	}
	return &Inputs{Brief: b, Data: d, Report: rep, Figures: m, FS: src.FS}, nil
}

// rebaseDataPaths makes the brief's data paths relative to the root, so a
// brief in a subfolder of --root may name ../shared/values.csv, while no
// path may leave the root.
func rebaseDataPaths(b *brief.Brief, dir string) error {
	var l diag.List
	fix := func(key string, p *string) {
		if *p == "" {
			return
		}
		orig := *p
		if strings.Contains(orig, "://") {
			pos := b.PosOf(key)
			l.Addf(b.File, pos.Line, pos.Column, "%s is %q, a URL; peerpack never reads from the network: download the file and name its path", key, orig)
			return
		}
		if path.IsAbs(filepath.ToSlash(orig)) || filepath.IsAbs(orig) {
			pos := b.PosOf(key)
			l.Addf(b.File, pos.Line, pos.Column, "%s is the absolute path %q; write it relative to the brief's folder", key, orig)
			return
		}
		joined := path.Clean(path.Join(dir, filepath.ToSlash(orig)))
		if !fs.ValidPath(joined) {
			pos := b.PosOf(key)
			l.Addf(b.File, pos.Line, pos.Column, "%s %q leads outside the brief's folder; keep data beside the brief or give a wider --root", key, orig)
			return
		}
		*p = joined
	}
	fix("data.register", &b.Data.Register)
	fix("data.dictionary", &b.Data.Dictionary)
	fix("data.ppp", &b.Data.PPP)
	fix("data.papers", &b.Data.Papers)
	fix("data.votes", &b.Data.Votes)
	for i := range b.Data.Values {
		fix("data.values", &b.Data.Values[i])
	}
	fix("theme.logo", &b.Theme.Logo)
	return l.Err()
}

// Options are the outputs and settings of one build.
type Options struct {
	Output   string // PDF path
	Figures  string // figures CSV path, optional
	Workbook string // figures XLSX path, optional
	Created  time.Time
	Version  string
	Override func(*brief.Brief)
}

// Result describes a finished build.
type Result struct {
	Output string
	Bytes  int
	Inputs *Inputs
}

// Pack renders the PDF bytes and the figures file of loaded inputs.
func Pack(in *Inputs, created time.Time, version string) (pdf []byte, figuresCSV []byte, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("internal error while laying out the pack (please report it with the brief): %v\n%s", r, debug.Stack())
		}
	}()
	com, err := narrative.Compose(in.Figures, in.Brief)
	if err != nil {
		return nil, nil, err
	}
	pdf, err = layout.Render(layout.Input{
		Brief: in.Brief, Model: in.Figures, Commentary: com, FS: in.FS,
		Created: created, Version: version,
	})
	if err != nil {
		return nil, nil, err
	}
	var buf bytes.Buffer
	if err := figures.WriteCSV(&buf, in.Figures); err != nil {
		return nil, nil, err
	}
	return pdf, buf.Bytes(), nil
}

// Build runs the whole pipeline for one brief and writes the outputs.
func Build(ctx context.Context, src Source, opt Options) (res *Result, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("internal error (please report it with the brief): %v\n%s", r, debug.Stack())
		}
	}()
	in, err := Load(src, opt.Override)
	if err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, interrupted(opt.Output)
	}
	pdf, figs, err := Pack(in, opt.Created, opt.Version)
	if err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, interrupted(opt.Output)
	}
	if err := atomicfile.WriteFile(ctx, opt.Output, pdf, 0o644); err != nil {
		return nil, err
	}
	if opt.Figures != "" {
		if err := atomicfile.WriteFile(ctx, opt.Figures, figs, 0o644); err != nil {
			return nil, err
		}
	}
	if opt.Workbook != "" {
		err := atomicfile.Write(ctx, opt.Workbook, 0o644, func(w io.Writer) error { return WriteWorkbook(w, in.Figures) })
		if err != nil {
			return nil, err
		}
	}
	return &Result{Output: opt.Output, Bytes: len(pdf), Inputs: in}, nil
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
	return &Inputs{Brief: &b, Data: base.Data, Report: base.Report, Figures: m, FS: base.FS}, nil
}
