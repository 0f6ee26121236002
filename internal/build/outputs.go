package build

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"peerpack/internal/atomicfile"
	"peerpack/internal/brief"
)

// output is one file a build writes, with the flag that named it so
// messages speak the command line's language.
type output struct {
	flag, path, example string
}

func (o Options) outputs() []output {
	var outs []output
	for _, c := range []output{
		{"-o", o.Output, "pack.pdf"},
		{"--figures", o.Figures, "figures.csv"},
		{"--workbook", o.Workbook, "figures.xlsx"},
	} {
		if c.path != "" {
			outs = append(outs, c)
		}
	}
	return outs
}

// checkOutputKinds refuses, before anything is read, an output that is not
// a regular file or a new name, and two outputs naming the same file (the
// second would silently replace the first, and both be reported written).
func checkOutputKinds(opt Options) error {
	outs := opt.outputs()
	for _, o := range outs {
		var te *atomicfile.TargetError
		if err := atomicfile.CheckTarget(o.path); errors.As(err, &te) {
			return fmt.Errorf("%s: %s names %s, not a file; %s", o.path, o.flag, te.Kind, te.Fix)
		} else if err != nil {
			return err
		}
	}
	if opt.Charts != "" {
		if fi, err := os.Stat(opt.Charts); err == nil && !fi.IsDir() {
			return fmt.Errorf("%s: --charts names a file, not a folder; give a folder (made if missing), e.g. --charts charts", opt.Charts)
		}
	}
	for i, a := range outs {
		for _, b := range outs[:i] {
			if samePath(a.path, b.path) {
				return fmt.Errorf("%s: %s and %s name the same file; give each output its own name, e.g. %s %s", a.path, b.flag, a.flag, a.flag, a.example)
			}
		}
	}
	return nil
}

// checkOutputsAgainstInputs refuses an output that is one of the build's
// own inputs (the brief, a data file, the logo): the build would destroy
// what it reads. Inputs in memory (the demo) cannot clash.
func checkOutputsAgainstInputs(opt Options, src Source, b *brief.Brief) error {
	if src.Dir == "" {
		return nil
	}
	for _, o := range opt.outputs() {
		for _, in := range InputFiles(src, b) {
			if samePath(o.path, filepath.Join(src.Dir, filepath.FromSlash(in.Path))) {
				return fmt.Errorf("%s: %s names %s of this build, which would be overwritten; write the output elsewhere, e.g. %s %s", o.path, o.flag, in.What, o.flag, o.example)
			}
		}
	}
	return nil
}

// samePath reports whether two paths name one file: equal once made
// absolute and clean, or the same file on disk (a hard link, or a path
// through a symbolic link to a folder).
func samePath(a, b string) bool {
	aa, err1 := filepath.Abs(a)
	bb, err2 := filepath.Abs(b)
	if err1 == nil && err2 == nil && aa == bb {
		return true
	}
	fa, err1 := os.Stat(a)
	fb, err2 := os.Stat(b)
	return err1 == nil && err2 == nil && os.SameFile(fa, fb)
}

// InputFile is one file a brief reads, as a path inside the source's root.
type InputFile struct {
	Path string
	What string // "the brief", "the register (data.register)", ...
}

// InputFiles lists the brief and every file it names (sheet suffixes
// removed), as paths inside the source's root. b may be nil.
func InputFiles(src Source, b *brief.Brief) []InputFile {
	files := []InputFile{{src.Brief, "the brief"}}
	if b == nil {
		return files
	}
	d := b.Data
	add := func(p, what string) {
		if p != "" {
			files = append(files, InputFile{strings.SplitN(p, "#", 2)[0], what})
		}
	}
	add(d.Register, "the register (data.register)")
	add(d.Dictionary, "the dictionary (data.dictionary)")
	for _, v := range d.Values {
		add(v, "a values file (data.values)")
	}
	add(d.PPP, "the PPP file (data.ppp)")
	add(d.Papers.File, "the paper records (data.papers)")
	add(d.Papers.Baselines, "the baselines table (data.papers.baselines)")
	add(d.Votes.File, "the vote records (data.votes)")
	add(d.Votes.Targets, "the survey targets (data.votes.targets)")
	add(b.Theme.Logo, "the logo (theme.logo)")
	return files
}
