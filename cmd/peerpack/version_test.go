package main

import (
	"os/exec"
	"path/filepath"
	"runtime/debug"
	"strings"
	"testing"
)

// The build settings keys (vcs.revision, vcs.time, vcs.modified) and the
// "(devel)" main version are those documented for runtime/debug.BuildInfo
// and `go version -m` (Go documentation, from memory).
func TestVersionOf(t *testing.T) {
	rev := "0123456789abcdef0123456789abcdef01234567"
	for _, c := range []struct {
		name string
		bi   *debug.BuildInfo
		ok   bool
		want string
	}{
		{"no build info", nil, false, "devel"},
		{"devel, no vcs", &debug.BuildInfo{Main: debug.Module{Version: "(devel)"}}, true, "devel"},
		{"tag", &debug.BuildInfo{Main: debug.Module{Version: "v1.2.3"}}, true, "v1.2.3"},
		{"devel with revision", &debug.BuildInfo{Main: debug.Module{Version: "(devel)"}, Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: rev}, {Key: "vcs.modified", Value: "false"}}}, true, "devel (0123456789ab)"},
		{"modified", &debug.BuildInfo{Main: debug.Module{Version: "(devel)"}, Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: rev}, {Key: "vcs.modified", Value: "true"}}}, true, "devel (0123456789ab, modified)"},
		{"pseudo-version names the revision already", &debug.BuildInfo{Main: debug.Module{Version: "v0.0.0-20261202054400-0123456789ab"}, Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: rev}}}, true, "v0.0.0-20261202054400-0123456789ab"},
		{"dirty pseudo-version", &debug.BuildInfo{Main: debug.Module{Version: "v0.0.0-20261202054400-0123456789ab+dirty"}, Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: rev}, {Key: "vcs.modified", Value: "true"}}}, true, "v0.0.0-20261202054400-0123456789ab+dirty (0123456789ab, modified)"},
	} {
		if got := versionOf(c.bi, c.ok); got != c.want {
			t.Errorf("%s: versionOf = %q, want %q", c.name, got, c.want)
		}
	}
	bi := &debug.BuildInfo{GoVersion: "go1.26.8", Main: debug.Module{Version: "v1.2.3"}, Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: rev}, {Key: "vcs.time", Value: "2026-12-02T05:44:00Z"}}}
	want := "peerpack v1.2.3 (0123456789ab)\nrevision " + rev + "\ncommitted 2026-12-02T05:44:00Z\nbuilt with go1.26.8\n"
	if got := versionReport(bi, true); got != want {
		t.Errorf("versionReport:\n%s\nwant\n%s", got, want)
	}
}

// A binary built by the Go toolchain reports what `go version -m` reads
// from it: the same Go version, and "devel" for a local build.
func TestVersionFromBuiltBinary(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the binary")
	}
	bin := filepath.Join(t.TempDir(), "peerpack")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	out, err := exec.Command(bin, "version").Output()
	if err != nil {
		t.Fatal(err)
	}
	meta, err := exec.Command("go", "version", bin).Output()
	if err != nil {
		t.Fatal(err)
	}
	// `go version FILE` prints "FILE: goX.Y.Z".
	gover := strings.TrimSpace(string(meta[strings.LastIndex(string(meta), " ")+1:]))
	if !strings.HasPrefix(string(out), "peerpack ") || !strings.Contains(string(out), "built with "+gover+"\n") {
		t.Errorf("peerpack version printed %q; go version says %s", out, gover)
	}
}
