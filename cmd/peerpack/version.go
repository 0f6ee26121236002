package main

import (
	"runtime/debug"
	"strings"
)

// version is peerpack's version as the Go toolchain recorded it in the
// binary: the main module's version (a tag or pseudo-version when built
// from a module or a tagged checkout, "devel" otherwise) and the VCS
// revision when the build recorded one. It goes into each pack's Producer
// field, so it comes from the build, never from a string to keep in step.
var version = versionOf(debug.ReadBuildInfo())

// versionOf reads a version from build information; ok is false when the
// binary carries none.
func versionOf(bi *debug.BuildInfo, ok bool) string {
	if !ok || bi == nil {
		return "devel"
	}
	v := bi.Main.Version
	if v == "" || v == "(devel)" {
		v = "devel"
	}
	rev, modified := "", false
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			rev = s.Value
		case "vcs.modified":
			modified = s.Value == "true"
		}
	}
	// A pseudo-version already ends in the revision's first 12 digits.
	if rev != "" && !strings.HasSuffix(v, rev[:min(12, len(rev))]) {
		v += " (" + rev[:min(12, len(rev))]
		if modified {
			v += ", modified"
		}
		v += ")"
	} else if modified && !strings.Contains(v, "+dirty") {
		v += " (modified)"
	}
	return v
}

// versionReport is what `peerpack version` prints: the version line, then
// the revision, its time and the Go toolchain when recorded.
func versionReport(bi *debug.BuildInfo, ok bool) string {
	var b strings.Builder
	b.WriteString("peerpack " + versionOf(bi, ok) + "\n")
	if !ok || bi == nil {
		return b.String()
	}
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			b.WriteString("revision " + s.Value + "\n")
		case "vcs.time":
			b.WriteString("committed " + s.Value + "\n")
		}
	}
	if bi.GoVersion != "" {
		b.WriteString("built with " + bi.GoVersion + "\n")
	}
	return b.String()
}
