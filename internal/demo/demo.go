// Package demo generates peerpack's demo scenario: an invented
// higher-education world of six invented countries and about 900 invented
// institutions, with an indicator dictionary of the scenario's own framework,
// six years of values in both the long and the wide shape,
// purchasing-power-parity factors, paper and survey-vote records with the
// survey's target shares, a client logo and the demo brief.
//
// Everything is generated from Seed with math/rand/v2's PCG generator, whose
// output sequence is specified and so stable across Go releases; the
// conversions from its raw 64-bit output to uniform and normal draws are
// written here rather than taken from the library so that they cannot change
// under us either. Numbers are written with strconv at fixed decimals.
// Files therefore returns the same bytes on every call, on every machine.
//
// Every name is assembled from invented syllables (see names.go) and every
// figure is drawn from the model below; nothing describes a real
// institution or a real country.
package demo

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync"

	"peerpack/internal/atomicfile"
)

// Seed fixes the scenario. Changing it changes every number, and the demo
// brief's chosen peers were picked for this seed.
const Seed uint64 = 20260601

// File names inside the scenario. The templates use the same names so that
// `peerpack new` can write a template beside the demo data and build it at
// once.
const (
	BriefName      = "brief.md"
	RegisterName   = "institutions.csv"
	DictionaryName = "indicators.yaml"
	ValuesName     = "values.csv"      // long: institution,year,indicator,value,note
	WideValuesName = "values-wide.csv" // wide: institution,year,<key>,...
	PPPName        = "ppp.csv"
	PapersName     = "papers.csv"
	VotesName      = "votes.csv"
	TargetsName    = "survey-targets.csv" // country,share: whom the survey should represent
	LogoName       = "logo.png"
)

// FocusID is the demo's focus university, a mid-sized research university
// in Kestria.
const FocusID = "KE007"

// FirstYear and LastYear bound the scenario's six years of values.
const (
	FirstYear = 2020
	LastYear  = 2025
)

var generated = sync.OnceValue(func() map[string][]byte { return generate(Seed) })

// Files returns every scenario file by name. The map and its byte slices
// are fresh copies; the content is identical on every call.
func Files() map[string][]byte {
	src := generated()
	out := make(map[string][]byte, len(src))
	for k, v := range src {
		out[k] = bytes.Clone(v)
	}
	return out
}

// Names returns the scenario's file names in sorted order.
func Names() []string {
	src := generated()
	out := make([]string, 0, len(src))
	for k := range src {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// FS returns the scenario as a read-only in-memory file system: a flat
// folder holding the brief and its data, ready for the build's fs.FS root.
func FS() fs.FS { return newMemFS(generated()) }

// ErrWouldOverwrite is matched (errors.Is) by Write's error when files
// with other content already exist in the target folder.
var ErrWouldOverwrite = errors.New("would overwrite existing files")

// Write writes the scenario's files into dir, creating it when needed.
//
// It never overwrites a file whose content differs: it first checks every
// target, and if any exists with other content it writes nothing and
// returns an error naming each such file. A file that already holds exactly
// the scenario's bytes is left as it is, so writing twice is harmless.
func Write(dir string) error {
	return WriteFiles(dir, generated())
}

// WriteFiles writes files into dir with Write's rules: all or nothing,
// no file with different content overwritten, identical files left alone.
// The templates package uses it to write a template with the demo data.
func WriteFiles(dir string, files map[string][]byte) error {
	names := make([]string, 0, len(files))
	for n := range files {
		if !flatName(n) {
			return fmt.Errorf("demo file name %q is not a plain file name", n)
		}
		names = append(names, n)
	}
	sort.Strings(names)
	if fi, err := os.Stat(dir); err == nil && !fi.IsDir() {
		return fmt.Errorf("%s: exists and is not a folder; choose a folder to write the files into", dir)
	}
	var clash, todo []string
	for _, n := range names {
		p := filepath.Join(dir, n)
		old, err := os.ReadFile(p)
		switch {
		case err == nil && bytes.Equal(old, files[n]):
			// already there, identical
		case err == nil:
			clash = append(clash, p)
		case errors.Is(err, fs.ErrNotExist):
			todo = append(todo, n)
		default:
			return fmt.Errorf("%s: cannot check the existing file: %v", p, unwrapPath(err))
		}
	}
	if len(clash) > 0 {
		verb, these := "exists", "this file"
		if len(clash) > 1 {
			verb, these = "exist", "these files"
		}
		return fmt.Errorf("%w: %s already %s with different content, so nothing was written; choose an empty folder, or move %s away first", ErrWouldOverwrite, strings.Join(clash, ", "), verb, these)
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("%s: cannot create the folder: %v", dir, unwrapPath(err))
	}
	for _, n := range todo {
		p := filepath.Join(dir, n)
		if err := atomicfile.WriteFile(context.Background(), p, files[n], 0o644); err != nil {
			return fmt.Errorf("%s: cannot write: %v", p, unwrapPath(err))
		}
	}
	return nil
}

func unwrapPath(err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}
