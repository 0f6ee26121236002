package main

import (
	"context"
	"fmt"
	"io/fs"
	"strings"
	"time"

	"peerpack/internal/brief"
	"peerpack/internal/build"
)

// watchInterval is how often --watch looks at the inputs. Polling file
// sizes and modification times needs no platform-specific notification
// API and costs nothing noticeable at this rate.
const watchInterval = time.Second

// watchFiles lists the brief and every data file it names, as paths
// inside the source's root.
func watchFiles(src build.Source, b *brief.Brief) []string {
	var files []string
	for _, f := range build.InputFiles(src, b) {
		files = append(files, f.Path)
	}
	return files
}

func fingerprint(fsys fs.FS, files []string) string {
	var b strings.Builder
	for _, f := range files {
		fi, err := fs.Stat(fsys, f)
		if err != nil {
			fmt.Fprintf(&b, "%s:missing;", f)
			continue
		}
		fmt.Fprintf(&b, "%s:%d:%d;", f, fi.Size(), fi.ModTime().UnixNano())
	}
	return b.String()
}

// watch rebuilds whenever the brief or one of its data files changes,
// until interrupted. A failed rebuild prints why and keeps the last good
// pack, then waits for the next change. The files watched are those the
// last successful build read (res), so nothing is loaded twice.
func watch(ctx context.Context, e *env, src build.Source, res *build.Result, out, figs, wb string) int {
	files := watchedBy(src, res, nil)
	last := fingerprint(src.FS, files)
	e.infof("watching %d files; press Ctrl-C to stop\n", len(files))
	tick := time.NewTicker(watchInterval)
	defer tick.Stop()
	for {
		select {
		case <-ctx.Done():
			e.infof("stopped watching\n")
			return exitOK
		case <-tick.C:
		}
		now := fingerprint(src.FS, files)
		if now == last {
			continue
		}
		e.infof("%s changed; rebuilding\n", time.Now().Format("15:04:05"))
		_, res := buildOnce(ctx, e, src, out, figs, wb)
		files = watchedBy(src, res, files)
		last = fingerprint(src.FS, files)
	}
}

// watchedBy is the file list of a build's brief, or keep when the build
// failed (its brief may not even parse).
func watchedBy(src build.Source, res *build.Result, keep []string) []string {
	if res == nil || res.Inputs == nil {
		if keep != nil {
			return keep
		}
		return watchFiles(src, nil)
	}
	return watchFiles(src, res.Inputs.Brief)
}
